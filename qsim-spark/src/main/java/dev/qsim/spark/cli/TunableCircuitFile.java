package dev.qsim.spark.cli;

import java.util.Locale;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import dev.qsim.Gate;
import dev.qsim.observable.TunableCircuit;

/**
 * Reads a tunable circuit from text of our own, one gate per line, for the tool's {@code sweep}:
 * <pre>
 * # a two-parameter landscape
 * qubits 2
 * h 0
 * rzz 0 1 2*gamma
 * rx 0 beta
 * rx 1 beta
 * ry 1 pi/4
 * rz 0 -theta+pi/2
 * </pre>
 * <ul>
 *   <li>{@code #} starts a comment to the end of the line; blank lines are skipped;</li>
 *   <li>the first statement is {@code qubits N}, {@code N} from 1 to {@value #MAX_QUBITS};</li>
 *   <li>every other line is a gate: its name as {@link Gate#lookup(String)} knows it (the
 *       catalogue's names and the OpenQASM 3 names: {@code h}, {@code cnot} or {@code cx},
 *       {@code rzz} ...), its qubits (controls first), then its angles, separated by spaces;</li>
 *   <li>an angle is a number in radians ({@code 0.3}, {@code -1e-2}, {@code pi},
 *       {@code -pi/2}, {@code 3*pi/4}) or, for a gate with one angle that a parameter can drive
 *       (rx, ry, rz, phase, cphase, rzz), a parameter {@code [k*][-]name[+c|-c]}: the angle
 *       {@code k·name + c} ({@code gamma}, {@code 2*gamma}, {@code -beta},
 *       {@code 0.5*theta+pi/2}); a name is an identifier, not {@code pi}, and parameters are
 *       declared by first use.</li>
 * </ul>
 * Every problem is refused with the line number and what is allowed. At most
 * {@value #MAX_LINES} lines.
 */
final class TunableCircuitFile {
    /** The most qubits: {@value} (a state vector of 16 GiB). */
    static final int MAX_QUBITS = 30;
    /** The most lines: {@value}. */
    static final int MAX_LINES = 1_000_000;

    private static final String NUMBER = "[+-]?(?:" + ToolFiles.DECIMAL + "|(?:"
            + ToolFiles.DECIMAL + "\\*)?pi(?:/" + ToolFiles.DECIMAL + ")?)";
    private static final String UNSIGNED = "(?:" + ToolFiles.DECIMAL + "|(?:"
            + ToolFiles.DECIMAL + "\\*)?pi(?:/" + ToolFiles.DECIMAL + ")?)";
    private static final Pattern NUMBER_ONLY = Pattern.compile(NUMBER);
    private static final Pattern PARAMETER = Pattern.compile("(?:(" + NUMBER + ")\\*)?(-)?"
            + "([A-Za-z_][A-Za-z0-9_]*)(?:([+-])(" + UNSIGNED + "))?");

    private TunableCircuitFile() {
    }

    /**
     * Reads the text.
     *
     * @param text the circuit text
     * @return the circuit
     * @throws IllegalArgumentException if the text breaks a rule; the message gives the line
     */
    static TunableCircuit read(String text) {
        TunableCircuit.Builder b = null;
        String[] lines = text.split("\n", -1);
        if (lines.length > MAX_LINES) {
            throw new IllegalArgumentException("the circuit has " + lines.length + " lines, more"
                    + " than the " + MAX_LINES + " allowed");
        }
        for (int ln = 0; ln < lines.length; ln++) {
            String line = lines[ln];
            int hash = line.indexOf('#');
            if (hash >= 0) {
                line = line.substring(0, hash);
            }
            line = line.strip();
            if (line.isEmpty()) {
                continue;
            }
            String[] words = line.split("\\s+");
            try {
                if (b == null) {
                    b = TunableCircuit.builder(qubits(words));
                } else {
                    gate(b, words);
                }
            } catch (IllegalArgumentException | IndexOutOfBoundsException e) {
                throw new IllegalArgumentException("line " + (ln + 1) + ": " + e.getMessage(), e);
            }
        }
        if (b == null) {
            throw new IllegalArgumentException("the circuit is empty; it starts with 'qubits N'");
        }
        return b.build();
    }

    private static int qubits(String[] words) {
        if (words.length != 2 || !words[0].equals("qubits") || !words[1].matches("\\d{1,3}")
                || Integer.parseInt(words[1]) < 1
                || Integer.parseInt(words[1]) > MAX_QUBITS) {
            throw new IllegalArgumentException("the first statement must be 'qubits N' with N"
                    + " from 1 to " + MAX_QUBITS + ", not '" + ToolFiles.excerpt(String.join(" ",
                    words)) + "'");
        }
        return Integer.parseInt(words[1]);
    }

    private static void gate(TunableCircuit.Builder b, String[] words) {
        Optional<Gate> found = Gate.find(words[0]);
        if (found.isEmpty() || found.get() == Gate.UNITARY) {
            throw new IllegalArgumentException("unknown gate '" + ToolFiles.excerpt(words[0])
                    + "'; known gates: " + Gate.knownNames().replace("unitary, ", ""));
        }
        Gate g = found.get();
        int nq = g.qubits();
        int na = g.parameters();
        if (words.length != 1 + nq + na) {
            throw new IllegalArgumentException("gate " + g.id() + " takes " + nq + " qubit(s)"
                    + " and " + na + " angle(s), but the line has " + (words.length - 1)
                    + " value(s) after the name");
        }
        int[] qs = new int[nq];
        for (int j = 0; j < nq; j++) {
            String w = words[1 + j];
            if (!w.matches("\\d{1,9}")) {
                throw new IllegalArgumentException("qubit '" + ToolFiles.excerpt(w) + "' of gate "
                        + g.id() + " is not a whole number from 0");
            }
            qs[j] = Integer.parseInt(w);
        }
        double[] angles = new double[na];
        for (int j = 0; j < na; j++) {
            String w = words[1 + nq + j];
            if (NUMBER_ONLY.matcher(w).matches()) {
                angles[j] = number(w);
                continue;
            }
            Matcher m = PARAMETER.matcher(w);
            if (na != 1 || !m.matches() || m.group(3).equals("pi")) {
                throw new IllegalArgumentException("angle '" + ToolFiles.excerpt(w) + "' of gate "
                        + g.id() + " is neither a number (0.3, -pi/2, 3*pi/4) nor"
                        + (na == 1 ? " a parameter (theta, 2*theta, -theta+pi/2)"
                        : " allowed to be a parameter (only one-angle gates take one)"));
            }
            double scale = m.group(1) == null ? 1 : number(m.group(1));
            if (m.group(2) != null) {
                scale = -scale;
            }
            double offset = m.group(5) == null ? 0 : number(m.group(5));
            if ("-".equals(m.group(4))) {
                offset = -offset;
            }
            b.gate(g, m.group(3), scale, offset, qs);
            return;
        }
        b.gate(g, angles, qs);
    }

    /** The value of a number token: a decimal, or {@code [k*]pi[/m]} with a sign. */
    static double number(String token) {
        String t = token;
        double sign = 1;
        if (t.startsWith("+") || t.startsWith("-")) {
            sign = t.startsWith("-") ? -1 : 1;
            t = t.substring(1);
        }
        int pi = t.toLowerCase(Locale.ROOT).indexOf("pi");
        double v;
        if (pi < 0) {
            v = ToolFiles.number(t, "the number '" + ToolFiles.excerpt(token) + "'");
        } else {
            double k = pi == 0 ? 1 : ToolFiles.number(t.substring(0, pi - 1), "the factor of pi");
            double m = pi + 2 == t.length() ? 1 : ToolFiles.number(t.substring(pi + 3),
                    "the divisor of pi");
            v = k * Math.PI / m;
        }
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException("the angle '" + ToolFiles.excerpt(token)
                    + "' is not a finite number");
        }
        return sign * v;
    }
}
