package dev.qsim.text;

import java.util.List;
import java.util.Objects;

import org.apache.commons.numbers.complex.Complex;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Gates;
import dev.qsim.Instruction;
import dev.qsim.Operator;

/**
 * Writes a {@link Circuit} as OpenQASM 3 text in the subset that {@link QasmReader} reads
 * (Cross et al. 2022, ACM Transactions on Quantum Computing 3(3), 12, doi:10.1145/3505636).
 * Stateless and thread-safe.
 *
 * <p>The qubits form one register {@code q}, the classical bits one register {@code c}. Angles
 * are written exactly, as a multiple of pi ({@code 3*pi/4}) when they are exactly that double,
 * else with {@link Double#toString(double)}, so they read back bitwise equal; the one exception
 * is {@code -0.0}, written {@code 0} (see {@link #angle(double)}).
 *
 * <p>Round trip: for circuits of the builder's named gates ({@code h x y z s sDagger t tDagger
 * sqrtX sqrtXDagger rx ry rz phase cnot cz cphase swap toffoli fredkin}), measurements, resets,
 * conditioned blocks, and {@code controlled} gates whose operator is one of {@link Gates#X},
 * {@link Gates#Y}, {@link Gates#Z}, {@link Gates#H}, {@link Gates#S}, {@link Gates#S_DAGGER},
 * {@link Gates#T}, {@link Gates#T_DAGGER}, {@link Gates#SQRT_X} or {@link Gates#SWAP},
 * {@code QasmReader.read(QasmWriter.write(c)).equals(c)} (an angle of {@code -0.0} reads back
 * as {@code +0.0}). (A controlled gate whose operator
 * equals such a constant only in value, such as the adjoint of {@link Gates#H} with its signed
 * zeros, is written with the constant's name and so reads back equal in value.) Other instructions
 * are written as
 * equal operators but read back as different instructions:
 * <ul>
 *   <li>{@code rzz(θ)} as a {@code gate rzz} definition ({@code cx; rz(θ); cx}, Nielsen and
 *       Chuang 2010, Figure 4.19 construction), expanded when read;</li>
 *   <li>{@code apply} of a 1-qubit operator as the gate of that matrix if it is one of
 *       {@link Gates}' constants, else {@code U(θ, φ, λ)} followed by {@code gphase(γ)} when the
 *       global phase is not zero (the Z-Y decomposition, Nielsen and Chuang 2010, Theorem 4.1),
 *       equal within {@value #TOLERANCE} per entry;</li>
 *   <li>{@code apply} of {@link Gates#CNOT}, {@link Gates#CZ}, {@link Gates#SWAP},
 *       {@link Gates#TOFFOLI} or {@link Gates#FREDKIN} as {@code cx cz swap ccx cswap};</li>
 *   <li>{@code controlled} of another 1-qubit operator as {@code ctrl(k) @ U(θ, φ, λ)} plus
 *       {@code ctrl(k) @ gphase(γ)} on the controls when needed.</li>
 * </ul>
 * Other multi-qubit operators have no name in the subset and are refused.
 *
 * @since 0.1
 */
public final class QasmWriter {
    /** The largest entry error allowed when a 1-qubit operator is written as U: {@value}. */
    public static final double TOLERANCE = 1e-10;

    private static final double EPS = 1e-12;

    private QasmWriter() {
    }

    /**
     * Writes a circuit as OpenQASM 3.
     *
     * @param circuit the circuit
     * @return the program text, lines ending in {@code '\n'}
     * @throws IllegalArgumentException if an instruction applies a multi-qubit operator that has
     *     no name in the subset; the message names the instruction and its index
     */
    public static String write(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        StringBuilder body = new StringBuilder();
        java.util.Set<String> definitions = new java.util.LinkedHashSet<>();
        List<Instruction> list = circuit.instructions();
        for (int i = 0; i < list.size(); i++) {
            instruction(list.get(i), i, "", body, definitions);
        }
        StringBuilder sb = new StringBuilder("OPENQASM 3.0;\ninclude \"stdgates.inc\";\n");
        for (String d : definitions) {
            sb.append(d).append('\n');
        }
        sb.append("qubit[").append(circuit.qubits()).append("] q;\n");
        if (circuit.clbits() > 0) {
            sb.append("bit[").append(circuit.clbits()).append("] c;\n");
        }
        return sb.append(body).toString();
    }

    private static void instruction(Instruction in, int index, String indent, StringBuilder sb,
            java.util.Set<String> definitions) {
        int[] t = in.targets();
        int[] c = in.controls();
        double[] a = in.angles();
        switch (in.kind()) {
            case MEASURE:
                sb.append(indent).append("c[").append(in.clbit()).append("] = measure q[")
                        .append(t[0]).append("];\n");
                return;
            case RESET:
                sb.append(indent).append("reset q[").append(t[0]).append("];\n");
                return;
            case IF_BIT:
                sb.append(indent).append("if (c[").append(in.clbit()).append("] == ")
                        .append(in.value()).append(") {\n");
                List<Instruction> body = in.body();
                for (Instruction b : body) {
                    instruction(b, index, indent + "  ", sb, definitions);
                }
                sb.append(indent).append("}\n");
                return;
            default:
                break;
        }
        Gate g = in.gate();
        if (g == Gate.UNITARY) {
            sb.append(indent);
            operator(in, index, indent, sb, t, c);
            return;
        }
        int extra = c.length - g.controls();
        String prefix = extra == 0 ? "" : extra == 1 ? "ctrl @ " : "ctrl(" + extra + ") @ ";
        String name = g.qasmName();
        double[] angles = a;
        if (name == null && g.inverse() != g && g.inverse().qasmName() != null) {
            name = "inv @ " + g.inverse().qasmName();
            angles = g.inverseAngles(a);
        } else if (name == null) {
            definitions.add(g.qasmDefinition());
            name = g.id();
        }
        sb.append(indent);
        line(sb, prefix + name, angles.length == 0 ? "" : angles(angles), in.qubits());
    }

    private static void operator(Instruction in, int index, String indent, StringBuilder sb,
            int[] t, int[] c) {
        Operator op = in.operator();
        String prefix = c.length == 0 ? "" : c.length == 1 ? "ctrl @ " : "ctrl(" + c.length
                + ") @ ";
        if (op.qubits() == 1) {
            double[] u = decompose(op);
            if (u == null) {
                throw new IllegalArgumentException("instruction " + index + " '" + in
                        + "' cannot be written as U(theta, phi, lambda) within " + TOLERANCE);
            }
            line(sb, prefix + "U", angles(new double[] {u[0], u[1], u[2]}), in.qubits());
            if (u[3] != 0) {
                if (c.length == 0) {
                    sb.append(indent).append("gphase(").append(angle(u[3])).append(");\n");
                } else {
                    sb.append(indent);
                    line(sb, prefix + "gphase", "(" + angle(u[3]) + ")", c);
                }
            }
            return;
        }
        throw new IllegalArgumentException("instruction " + index + " '" + in + "' applies a "
                + op.qubits() + "-qubit operator that is no catalogue gate; only 1-qubit"
                + " operators (as U and gphase) and catalogue gates can be written");
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

    private static void line(StringBuilder sb, String name, String params, int... qubits) {
        sb.append(name).append(params);
        for (int i = 0; i < qubits.length; i++) {
            sb.append(i == 0 ? " q[" : ", q[").append(qubits[i]).append(']');
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
     *   <li>{@code 0} for both zeros. {@code -0.0} reads back as {@code +0.0}: the one change
     *       the writer makes, since the two give the same rotation and {@code -0.0} in a
     *       program only puzzles its reader;</li>
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
            return "0";
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
}
