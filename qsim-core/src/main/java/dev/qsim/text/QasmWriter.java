package dev.qsim.text;

import java.util.HashSet;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Objects;
import java.util.Set;

import org.apache.commons.numbers.complex.Complex;

import dev.qsim.Circuit;
import dev.qsim.Expression;
import dev.qsim.Gate;
import dev.qsim.Gates;
import dev.qsim.Instruction;
import dev.qsim.Operator;
import dev.qsim.internal.Checks;

/**
 * Writes a {@link Circuit} as OpenQASM 3 text that {@link QasmReader} reads (Cross et al. 2022,
 * ACM Transactions on Quantum Computing 3(3), 12, doi:10.1145/3505636). Stateless and
 * thread-safe.
 *
 * <p>The qubits form one register ({@code q}), the classical bits another ({@code c}); another
 * name is chosen when a variable has that name. Variables are declared after the registers, in
 * the circuit's order, without a value; each assignment is written where it happens. Every
 * instruction kind is written: gates (with {@code ctrl(k) @} for added controls and
 * {@code inv @ sx} for {@code sqrtXDagger}), gates whose angles are expressions, measurements,
 * resets, delays (in seconds, {@code delay[1.0E-7s]}), assignments to variables and to bits,
 * {@code if} on one bit, {@code if ... else} on an expression, and {@code while} with its
 * bound as the annotation {@code @max_iterations n}. Angles are written exactly, as a multiple
 * of pi ({@code 3*pi/4}) when they are exactly that double, else with
 * {@link Double#toString(double)}, so they read back bitwise equal (see {@link #angle(double)}).
 *
 * <p>Round trip: {@code QasmReader.read(QasmWriter.write(c)).equals(c)} for every circuit the
 * reader produces, and for circuits built through the API except:
 * <ul>
 *   <li>{@code rzz(θ)}, which OpenQASM 3 does not name: written with a definition
 *       {@code gate rzz(θ) a, b { cx a, b; rz(θ) b; cx a, b; }} (Nielsen and Chuang 2010,
 *       §4.7.3 construction), read back as those three gates;</li>
 *   <li>an operator given as a matrix: the global phase {@code e^{iγ} I} on qubit 0 (what the
 *       reader makes of {@code gphase(γ)}) is written as {@code gphase(γ)} and reads back
 *       equal; another one-qubit operator is written as {@code U(θ, φ, λ)} and
 *       {@code gphase(γ)} (the Z-Y decomposition, Nielsen and Chuang 2010, Theorem 4.1; with
 *       controls, {@code ctrl @ U} and a phase on the controls), equal within
 *       {@value #TOLERANCE} per entry; operators on more qubits are refused;</li>
 *   <li>expressions are read back with their constant parts computed ({@code (x + (1 + 2))}
 *       reads as {@code (x + 3)}), and a condition that is a constant decides at reading time
 *       (an {@code if (true)} block reads as its instructions, a {@code while (false)} loop as
 *       nothing);</li>
 *   <li>variables whose names OpenQASM 3 cannot declare (not an identifier, a keyword, a
 *       built-in or a standard gate's name) are refused.</li>
 * </ul>
 *
 * @since 0.1
 */
public final class QasmWriter {
    /** The largest entry error allowed when a 1-qubit operator is written as U: {@value}. */
    public static final double TOLERANCE = 1e-10;

    private static final double EPS = 1e-12;
    private static final String RZZ = "gate %s(theta) a, b { cx a, b; rz(theta) b; cx a, b; }";

    /** The state of one write. */
    private static final class Writing {
        final Circuit circuit;
        final StringBuilder body = new StringBuilder();
        final Set<String> definitions = new LinkedHashSet<>();
        final Set<String> taken = new HashSet<>();
        final String q;
        final String c;
        String rzz;

        Writing(Circuit circuit) {
            this.circuit = circuit;
            for (Circuit.Variable v : circuit.variables()) {
                taken.add(v.name());
            }
            q = free("q");
            c = free("c");
        }

        String free(String base) {
            String n = base;
            for (int k = 1; taken.contains(n) || QasmGates.find(n) != null; k++) {
                n = base + "_" + k;
            }
            taken.add(n);
            return n;
        }
    }

    private QasmWriter() {
    }

    /**
     * Writes a circuit as OpenQASM 3.
     *
     * @param circuit the circuit
     * @return the program text, lines ending in {@code '\n'}
     * @throws IllegalArgumentException if an instruction applies an operator given as a matrix
     *     on more than one qubit, or one that is not within {@value #TOLERANCE} of its
     *     decomposition, or a variable's name cannot be declared in OpenQASM 3; the message
     *     names the instruction or variable
     */
    public static String write(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        for (Circuit.Variable v : circuit.variables()) {
            requireWritable(v.name());
        }
        Writing w = new Writing(circuit);
        List<Instruction> list = circuit.instructions();
        for (int i = 0; i < list.size(); i++) {
            instruction(w, list.get(i), i, "");
        }
        StringBuilder sb = new StringBuilder("OPENQASM 3.0;\ninclude \"stdgates.inc\";\n");
        for (String d : w.definitions) {
            sb.append(d).append('\n');
        }
        sb.append("qubit[").append(circuit.qubits()).append("] ").append(w.q).append(";\n");
        if (circuit.clbits() > 0) {
            sb.append("bit[").append(circuit.clbits()).append("] ").append(w.c).append(";\n");
        }
        for (Circuit.Variable v : circuit.variables()) {
            sb.append(declaration(v)).append(";\n");
        }
        return sb.append(w.body).toString();
    }

    private static void requireWritable(String name) {
        boolean identifier = !name.isEmpty() && Lexer.isIdentStart(name.charAt(0));
        for (int i = 1; i < name.length() && identifier; i++) {
            identifier = Lexer.isIdentPart(name.charAt(i));
        }
        if (!identifier) {
            throw new IllegalArgumentException("variable '" + Checks.excerpt(name) + "' cannot"
                    + " be written: it is not an OpenQASM 3 identifier (a letter or _, then"
                    + " letters, digits or _)");
        }
        if (Syntax.reserved(name) || QasmGates.find(name) != null) {
            throw new IllegalArgumentException("variable '" + Checks.excerpt(name) + "' cannot"
                    + " be written: OpenQASM 3 reserves the name for a keyword, a built-in or"
                    + " a standard gate");
        }
    }

    private static String declaration(Circuit.Variable v) {
        switch (v.type()) {
            case INT:
                return "int[" + v.width() + "] " + v.name();
            case UINT:
                return "uint[" + v.width() + "] " + v.name();
            case FLOAT:
                return "float[64] " + v.name();
            case ANGLE:
                return "angle " + v.name();
            default:
                return "bool " + v.name();
        }
    }

    private static void block(Writing w, List<Instruction> list, int index, String indent) {
        for (Instruction in : list) {
            instruction(w, in, index, indent + "  ");
        }
    }

    private static void instruction(Writing w, Instruction in, int index, String indent) {
        StringBuilder sb = w.body;
        int[] t = in.targets();
        switch (in.kind()) {
            case MEASURE:
                sb.append(indent).append(w.c).append('[').append(in.clbit()).append("] = measure ")
                        .append(w.q).append('[').append(t[0]).append("];\n");
                return;
            case RESET:
                sb.append(indent).append("reset ").append(w.q).append('[').append(t[0])
                        .append("];\n");
                return;
            case DELAY:
                sb.append(indent);
                line(w, "delay[" + Double.toString(in.duration()) + "s]", "", t);
                return;
            case IF_BIT:
                sb.append(indent).append("if (").append(w.c).append('[').append(in.clbit())
                        .append("] == ").append(in.value()).append(") {\n");
                block(w, in.body(), index, indent);
                sb.append(indent).append("}\n");
                return;
            case IF:
                sb.append(indent).append("if (").append(expression(w, in.condition()))
                        .append(") {\n");
                block(w, in.body(), index, indent);
                if (!in.otherwise().isEmpty()) {
                    sb.append(indent).append("} else {\n");
                    block(w, in.otherwise(), index, indent);
                }
                sb.append(indent).append("}\n");
                return;
            case WHILE:
                sb.append(indent).append('@').append(Parser.LOOP_ANNOTATION).append(' ')
                        .append(in.maxIterations()).append('\n');
                sb.append(indent).append("while (").append(expression(w, in.condition()))
                        .append(") {\n");
                block(w, in.body(), index, indent);
                sb.append(indent).append("}\n");
                return;
            case ASSIGN:
                sb.append(indent);
                if (in.variable() >= 0) {
                    sb.append(w.circuit.variables().get(in.variable()).name());
                } else {
                    sb.append(bits(w, in.assignedClbits()));
                }
                sb.append(" = ").append(expression(w, in.assignedValue())).append(";\n");
                return;
            default:
                gate(w, in, index, indent);
        }
    }

    private static void gate(Writing w, Instruction in, int index, String indent) {
        Gate g = in.gate();
        if (g == Gate.UNITARY) {
            operator(w, in, index, indent);
            return;
        }
        int extra = in.controls().length - g.controls();
        String prefix = extra == 0 ? "" : extra == 1 ? "ctrl @ " : "ctrl(" + extra + ") @ ";
        String name = g.qasmName();
        boolean inverted = false;
        if (name == null && g.inverse() != g && g.inverse().qasmName() != null) {
            name = "inv @ " + g.inverse().qasmName();
            inverted = true;
        } else if (name == null) {
            if (w.rzz == null) {
                w.rzz = w.free("rzz");
                w.definitions.add(String.format(java.util.Locale.ROOT, RZZ, w.rzz));
            }
            name = w.rzz;
        }
        String params;
        if (in.isDynamic()) {
            Expression[] e = in.angleExpressions();
            StringBuilder p = new StringBuilder("(");
            for (int i = 0; i < e.length; i++) {
                p.append(i == 0 ? "" : ", ").append(expression(w, e[i]));
            }
            params = e.length == 0 ? "" : p.append(')').toString();
        } else {
            double[] a = inverted ? g.inverseAngles(in.angles()) : in.angles();
            params = a.length == 0 ? "" : angles(a);
        }
        w.body.append(indent);
        line(w, prefix + name, params, in.qubits());
    }

    private static void operator(Writing w, Instruction in, int index, String indent) {
        Operator op = in.operator();
        int[] c = in.controls();
        int[] t = in.targets();
        StringBuilder sb = w.body;
        if (op.qubits() == 1) {
            if (c.length == 0 && t[0] == 0) {
                double gamma = exactPhase(op);
                if (!Double.isNaN(gamma)) {
                    sb.append(indent).append("gphase(").append(angle(gamma)).append(");\n");
                    return;
                }
            }
            double[] u = decompose(op);
            if (u == null) {
                throw new IllegalArgumentException("instruction " + index + " '"
                        + Checks.excerpt(in.toString()) + "' cannot be written as U(theta, phi,"
                        + " lambda) within " + TOLERANCE);
            }
            String prefix = c.length == 0 ? "" : c.length == 1 ? "ctrl @ " : "ctrl(" + c.length
                    + ") @ ";
            sb.append(indent);
            line(w, prefix + "U", angles(new double[] {u[0], u[1], u[2]}), in.qubits());
            if (u[3] != 0) {
                sb.append(indent);
                if (c.length == 0) {
                    sb.append("gphase(").append(angle(u[3])).append(");\n");
                } else {
                    String p = c.length == 1 ? "" : c.length == 2 ? "ctrl @ "
                            : "ctrl(" + (c.length - 1) + ") @ ";
                    line(w, p + "p", "(" + angle(u[3]) + ")", c);
                }
            }
            return;
        }
        throw new IllegalArgumentException("instruction " + index + " '"
                + Checks.excerpt(in.toString()) + "' applies a " + op.qubits() + "-qubit operator"
                + " that is no catalogue gate; only 1-qubit operators (as U and gphase) and"
                + " catalogue gates can be written");
    }

    /**
     * Returns γ when {@code op} is exactly {@code e^{iγ} I} as the reader makes it (the entries
     * {@link Complex#ofCis(double)} of γ, bitwise), else NaN.
     */
    static double exactPhase(Operator op) {
        Complex a = op.get(0, 0);
        Complex b = op.get(0, 1);
        Complex c = op.get(1, 0);
        if (!a.equals(op.get(1, 1)) || !b.equals(Complex.ZERO) || !c.equals(Complex.ZERO)) {
            return Double.NaN;
        }
        double g = Math.atan2(a.getImaginary(), a.getReal());
        for (int k = 0; k < 8; k++) {
            g = Math.nextDown(g);
        }
        for (int k = 0; k <= 16; k++, g = Math.nextUp(g)) {
            if (Complex.ofCis(g).equals(a)) {
                return g;
            }
        }
        return Double.NaN;
    }

    /**
     * Finds (θ, φ, λ, γ) with {@code op = e^{iγ} u(θ, φ, λ)} within {@link #TOLERANCE}, or null.
     */
    static double[] decompose(Operator op) {
        Complex a = op.get(0, 0);
        Complex b = op.get(0, 1);
        Complex c = op.get(1, 0);
        Complex d = op.get(1, 1);
        double theta = 2 * Math.atan2(c.abs(), a.abs());
        double gamma = a.abs() > EPS ? a.arg() : c.arg();
        Complex unphase = Complex.ofCis(-gamma);
        Complex c1 = c.multiply(unphase);
        Complex b1 = b.multiply(unphase);
        Complex d1 = d.multiply(unphase);
        double phi = c1.abs() > EPS ? c1.arg() : 0;
        double lambda = b1.abs() > EPS ? b1.negate().arg() : d1.arg() - phi;
        if (gamma == 0 || Math.abs(gamma) < 1e-15) {
            gamma = 0;
        }
        Operator u = Gates.u(theta, phi, lambda);
        Complex g = Complex.ofCis(gamma);
        for (int r = 0; r < 2; r++) {
            for (int col = 0; col < 2; col++) {
                Complex diff = u.get(r, col).multiply(g).subtract(op.get(r, col));
                if (!(diff.abs() <= TOLERANCE)) {
                    return null;
                }
            }
        }
        return new double[] {theta, phi, lambda, gamma};
    }

    private static void line(Writing w, String name, String params, int... qubits) {
        StringBuilder sb = w.body;
        sb.append(name).append(params);
        for (int i = 0; i < qubits.length; i++) {
            sb.append(i == 0 ? " " : ", ").append(w.q).append('[').append(qubits[i]).append(']');
        }
        sb.append(";\n");
    }

    private static String angles(double[] a) {
        StringBuilder sb = new StringBuilder("(");
        for (int i = 0; i < a.length; i++) {
            sb.append(i == 0 ? "" : ", ").append(angle(a[i]));
        }
        return sb.append(')').toString();
    }

    /** The largest denominator of a multiple of pi written as a fraction: {@value}. */
    static final int PI_DENOMINATOR = 16;
    /** The largest multiple of pi written as a fraction, in either sign: {@value}. */
    static final int PI_MULTIPLE = 4;

    /**
     * Writes an angle so that it reads back as the same double, in the shortest exact form:
     *
     * <ul>
     *   <li>{@code 0} for +0.0 and {@code -0.0} for -0.0 (so that even the sign of a zero reads
     *       back as written);</li>
     *   <li>a multiple of pi, {@code k*pi/d} with {@code d <= }{@value #PI_DENOMINATOR} and
     *       {@code |k/d| <= }{@value #PI_MULTIPLE} in lowest terms ({@code pi}, {@code -pi/2},
     *       {@code 3*pi/4}, {@code 2*pi}), when {@code x} is exactly the double the reader
     *       computes from that text (left to right: {@code 3*pi} first, then {@code /4});</li>
     *   <li>otherwise {@link Double#toString(double)}, which reads back as the same double.
     *       No shorter decimal is chosen when it would be a different double: an angle of
     *       {@code 0.39999999999999997} (as a decomposition into {@code U} can produce for an
     *       operator made with 0.4) is not 0.4, and writing 0.4 would change the circuit. The
     *       writer keeps every circuit exact and leaves rounding to the caller.</li>
     * </ul>
     */
    static String angle(double x) {
        if (x == 0) {
            return Double.doubleToRawLongBits(x) == 0 ? "0" : "-0.0";
        }
        for (int den = 1; den <= PI_DENOMINATOR; den++) {
            for (int num = 1; num <= PI_MULTIPLE * den; num++) {
                if (gcd(num, den) != 1) {
                    continue;
                }
                // The value the reader computes from the text, operations left to right.
                double v = num == 1 ? Math.PI : num * Math.PI;
                v = den == 1 ? v : v / den;
                if (Math.abs(x) == v) {
                    String text = (num == 1 ? "" : num + "*") + "pi" + (den == 1 ? "" : "/" + den);
                    return x < 0 ? "-" + text : text;
                }
            }
        }
        return Double.toString(x);
    }

    private static int gcd(int a, int b) {
        return b == 0 ? a : gcd(b, a % b);
    }

    /** Classical bits as an operand: {@code c[3]} or {@code c[{3, 1, 4}]}. */
    private static String bits(Writing w, int[] bits) {
        if (bits.length == 1) {
            return w.c + "[" + bits[0] + "]";
        }
        StringBuilder sb = new StringBuilder(w.c).append("[{");
        for (int i = 0; i < bits.length; i++) {
            sb.append(i == 0 ? "" : ", ").append(bits[i]);
        }
        return sb.append("}]").toString();
    }

    /**
     * An expression in OpenQASM 3 that reads back to the same tree: every operation in
     * parentheses, bit registers as {@code c[{i, j}]}, variables by name.
     */
    static String expression(Writing w, Expression e) {
        StringBuilder sb = new StringBuilder();
        expression(w, e, sb);
        return sb.toString();
    }

    private static void expression(Writing w, Expression e, StringBuilder sb) {
        Expression.Op op = e.op();
        if (op == null) {
            int slot = e.variableSlot();
            int[] bits = e.registerBits();
            if (slot >= 0) {
                sb.append(w.circuit.variables().get(slot).name());
            } else if (bits.length > 0) {
                sb.append(bits(w, bits));
            } else if (e.type() == Expression.Type.BOOL) {
                sb.append(e.evaluateInteger(null) != 0 ? "true" : "false");
            } else if (e.type() == Expression.Type.INT) {
                // A negative constant in parentheses: -2 ** x would be -(2 ** x).
                long v = e.evaluateInteger(null);
                sb.append(v == Long.MIN_VALUE ? "(-9223372036854775807 - 1)"
                        : v < 0 ? "(" + v + ")" : Long.toString(v));
            } else {
                double v = e.evaluateReal(null);
                boolean negative = Double.doubleToRawLongBits(v) < 0;
                sb.append(negative ? "(" : "").append(Double.toString(v))
                        .append(negative ? ")" : "");
            }
            return;
        }
        List<Expression> operands = e.operands();
        if (operands.size() == 1) {
            boolean function = op != Expression.Op.NEG && op != Expression.Op.NOT
                    && op != Expression.Op.COMPLEMENT;
            sb.append(function ? op.symbol() + "(" : "(" + op.symbol());
            expression(w, operands.get(0), sb);
            sb.append(')');
            return;
        }
        sb.append('(');
        expression(w, operands.get(0), sb);
        sb.append(' ').append(op.symbol()).append(' ');
        expression(w, operands.get(1), sb);
        sb.append(')');
    }
}
