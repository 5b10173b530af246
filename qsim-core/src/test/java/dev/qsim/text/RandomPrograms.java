package dev.qsim.text;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * Random OpenQASM 3 programs that use the constructs the reader supports, for the fuzz and
 * round-trip properties (test code). Programs are meant to be valid: indices are in range, the
 * qubits of a call distinct, names declared before use; a few may still be refused (an angle
 * that comes out as a power outside its principal range, say), which the properties allow.
 */
final class RandomPrograms {
    private static final String[] ONE = {"h", "x", "y", "z", "s", "sdg", "t", "tdg", "sx", "id"};
    private static final String[] ONE_ANGLE = {"rx", "ry", "rz", "p", "phase", "u1"};
    private static final String[] TWO = {"cx", "cy", "cz", "ch", "swap", "CX"};
    private static final String[] TWO_ANGLE = {"crx", "cry", "crz", "cp", "cphase"};
    private static final String[] THREE = {"ccx", "cswap"};

    private final UniformRandomProvider rng;
    private final StringBuilder sb = new StringBuilder();
    private final int qubits;
    private final int bits;
    private int gates;
    private boolean subroutine;
    private int loops;
    private int locals;
    private String indent = "";

    private RandomPrograms(UniformRandomProvider rng) {
        this.rng = rng;
        this.qubits = 2 + rng.nextInt(4);
        this.bits = 1 + rng.nextInt(5);
    }

    /** A random program. */
    static String program(UniformRandomProvider rng) {
        return new RandomPrograms(rng).build();
    }

    private String build() {
        sb.append(rng.nextBoolean() ? "OPENQASM 3.0;\n" : "OPENQASM 3;\n");
        sb.append("include \"stdgates.inc\";\n");
        if (rng.nextBoolean()) {
            sb.append("qubit[").append(qubits).append("] q;\n");
        } else {
            sb.append("qreg q[").append(qubits).append("];\n");
        }
        sb.append(rng.nextBoolean() ? "bit[" + bits + "] c;\n" : "creg c[" + bits + "];\n");
        sb.append("const int k = ").append(rng.nextInt(4)).append(";\n");
        sb.append("int[8] v = ").append(rng.nextInt(10)).append(";\n");
        sb.append("float f = ").append(angle()).append(";\n");
        sb.append("bool flag = false;\n");
        if (rng.nextBoolean()) {
            sb.append("let pair = q[0] ++ q[").append(qubits - 1).append("];\n");
        }
        gates = rng.nextInt(3);
        for (int g = 0; g < gates; g++) {
            gateDefinition(g);
        }
        if (rng.nextBoolean()) {
            subroutine = true;
            sb.append("def flip(qubit a, float t) -> bit {\n  rx(t) a;\n  return measure a;\n}\n");
        }
        int n = 1 + rng.nextInt(18);
        for (int i = 0; i < n; i++) {
            statement(0, null);
        }
        return sb.toString();
    }

    private void gateDefinition(int g) {
        sb.append("gate g").append(g).append("(theta) a, b {");
        int n = rng.nextInt(4);
        for (int i = 0; i < n; i++) {
            switch (rng.nextInt(6)) {
                case 0:
                    sb.append(" rx(theta) a;");
                    break;
                case 1:
                    sb.append(" cx a, b;");
                    break;
                case 2:
                    sb.append(" barrier a, b;");
                    break;
                case 3:
                    sb.append(" gphase(theta / 2);");
                    break;
                case 4:
                    sb.append(" ctrl @ rz(2 * theta) b, a;");
                    break;
                default:
                    if (g > 0) {
                        sb.append(" g").append(g - 1).append("(theta + 0.5) b, a;");
                    } else {
                        sb.append(" U(theta, 0.1, -0.2) b;");
                    }
            }
        }
        sb.append(" }\n");
    }

    private String angle() {
        switch (rng.nextInt(5)) {
            case 0:
                return "pi / " + (1 + rng.nextInt(8));
            case 1:
                return "-" + (rng.nextInt(300) / 100.0);
            case 2:
                return rng.nextInt(7) + " * pi / 7";
            case 3:
                return "0.25 + " + rng.nextInt(5);
            default:
                return Double.toString((rng.nextDouble() - 0.5) * 6);
        }
    }

    /** A dynamic angle: an expression over measured bits and variables. */
    private String dynamicAngle() {
        switch (rng.nextInt(4)) {
            case 0:
                return "f";
            case 1:
                return "v * 0.1";
            case 2:
                return "c[" + rng.nextInt(bits) + "] * pi / 2";
            default:
                return "f + c[0] - 0.5";
        }
    }

    /** Distinct qubit indices. */
    private int[] distinct(int k) {
        int[] all = new int[qubits];
        for (int i = 0; i < qubits; i++) {
            all[i] = i;
        }
        for (int i = 0; i < k; i++) {
            int j = i + rng.nextInt(qubits - i);
            int t = all[i];
            all[i] = all[j];
            all[j] = t;
        }
        return java.util.Arrays.copyOf(all, k);
    }

    private String operand(int index, String loopVar) {
        if (loopVar != null && index == 0 && rng.nextBoolean()) {
            return "q[" + loopVar + "]";
        }
        return "q[" + index + "]";
    }

    private String qubitList(int[] q, String loopVar) {
        StringBuilder s = new StringBuilder();
        for (int i = 0; i < q.length; i++) {
            s.append(i == 0 ? "" : ", ").append(operand(q[i], i == 0 ? loopVar : null));
        }
        return s.toString();
    }

    private String condition() {
        switch (rng.nextInt(6)) {
            case 0:
                return "c[" + rng.nextInt(bits) + "] == " + rng.nextInt(2);
            case 1:
                return "c == " + rng.nextInt(1 << Math.min(bits, 4));
            case 2:
                return "v > " + rng.nextInt(10);
            case 3:
                return "flag || c[0] != 0";
            case 4:
                return "(c[" + rng.nextInt(bits) + "] == 1)";
            default:
                return "k == " + rng.nextInt(3);
        }
    }

    private void statement(int depth, String loopVar) {
        sb.append(indent);
        int kind = rng.nextInt(depth < 2 ? 22 : 16);
        switch (kind) {
            case 0:
            case 1: {
                int[] q = distinct(1);
                sb.append(ONE[rng.nextInt(ONE.length)]).append(' ').append(qubitList(q, loopVar));
                break;
            }
            case 2: {
                int[] q = distinct(1);
                sb.append(ONE_ANGLE[rng.nextInt(ONE_ANGLE.length)]).append('(').append(angle())
                        .append(") ").append(qubitList(q, loopVar));
                break;
            }
            case 3: {
                int[] q = distinct(2);
                sb.append(TWO[rng.nextInt(TWO.length)]).append(' ').append(qubitList(q, null));
                break;
            }
            case 4: {
                int[] q = distinct(2);
                sb.append(TWO_ANGLE[rng.nextInt(TWO_ANGLE.length)]).append('(').append(angle())
                        .append(") ").append(qubitList(q, null));
                break;
            }
            case 5: {
                if (qubits < 3) {
                    sb.append("h q");
                    break;
                }
                int[] q = distinct(3);
                sb.append(THREE[rng.nextInt(THREE.length)]).append(' ').append(qubitList(q, null));
                break;
            }
            case 6: {
                // Modifiers, stacked, on standard gates.
                int[] q = distinct(Math.min(qubits, 3));
                String[] forms = {"ctrl @ cz", "inv @ ctrl @ sx", "negctrl @ x", "pow(2) @ t",
                    "pow(-3) @ rz(" + angle() + ")", "ctrl @ gphase(" + angle() + ")",
                    "ctrl @ ctrl @ x", "inv @ pow(0.5) @ rz(1.25)", "negctrl @ ctrl @ h",
                    "ctrl(2) @ U(0.1, 0.2, 0.3)"};
                int f = rng.nextInt(forms.length);
                int want = f == 0 || f == 6 || f == 8 || f == 9 ? 3 : f == 2 || f == 1 ? 2
                        : f == 5 ? 1 : 1;
                if (want > qubits) {
                    sb.append("x q[0]");
                    break;
                }
                int[] use = java.util.Arrays.copyOf(q, want);
                sb.append(forms[f]).append(' ').append(qubitList(use, null));
                break;
            }
            case 7: {
                if (gates == 0) {
                    sb.append("u3(").append(angle()).append(", 0.5, ").append(angle())
                            .append(") q[0]");
                    break;
                }
                int[] q = distinct(2);
                String[] mods = {"", "inv @ ", "ctrl @ ", "pow(2) @ "};
                String m = mods[rng.nextInt(mods.length)];
                int[] use = m.startsWith("ctrl") ? (qubits >= 3 ? distinct(3) : null) : q;
                if (use == null) {
                    m = "";
                    use = q;
                }
                sb.append(m).append('g').append(rng.nextInt(gates)).append('(').append(angle())
                        .append(") ").append(qubitList(use, null));
                break;
            }
            case 8:
                sb.append(rng.nextBoolean() ? "c[" + rng.nextInt(bits) + "] = measure q["
                        + rng.nextInt(qubits) + "]" : "measure q[" + rng.nextInt(qubits)
                        + "] -> c[" + rng.nextInt(bits) + "]");
                break;
            case 9:
                sb.append(rng.nextBoolean() ? "reset q[" + rng.nextInt(qubits) + "]"
                        : "barrier q");
                break;
            case 10:
                sb.append("delay[").append(1 + rng.nextInt(500))
                        .append(new String[] {"ns", "us", "ms", "s"}[rng.nextInt(4)])
                        .append("] q[").append(rng.nextInt(qubits)).append(']');
                break;
            case 11: {
                String[] a = {"v += 1", "v = v * 2 - c[0]", "f = f * 0.5 + v", "flag = c[0] == 1",
                    "c[" + rng.nextInt(bits) + "] = flag", "c[0] ^= 1", "v = v >> 1",
                    "f = " + angle()};
                sb.append(a[rng.nextInt(a.length)]);
                break;
            }
            case 12: {
                String[] g = {"rx", "ry", "rz", "p"};
                sb.append(g[rng.nextInt(g.length)]).append('(').append(dynamicAngle())
                        .append(") q[").append(rng.nextInt(qubits)).append(']');
                break;
            }
            case 13:
                sb.append(rng.nextBoolean() ? "h q[0:" + (qubits - 1) + "]"
                        : "x q[{" + (qubits - 1) + ", 0}]");
                break;
            case 14:
                if (subroutine) {
                    sb.append("c[").append(rng.nextInt(bits)).append("] = flip(q[")
                            .append(rng.nextInt(qubits)).append("], ").append(angle())
                            .append(')');
                } else {
                    sb.append("u2(").append(angle()).append(", ").append(angle())
                            .append(") q[1]");
                }
                break;
            case 15:
                if (depth > 0 && rng.nextBoolean()) {
                    // A local variable, or a local bit, of the enclosing block.
                    String t = "t" + locals++;
                    if (rng.nextBoolean()) {
                        sb.append("int[8] ").append(t).append(" = v + ").append(rng.nextInt(5))
                                .append(";\n").append(indent).append("rz(").append(t)
                                .append(" * 0.1) q[").append(rng.nextInt(qubits)).append(']');
                    } else {
                        sb.append("bit ").append(t).append(" = measure q[")
                                .append(rng.nextInt(qubits)).append("];\n").append(indent)
                                .append("if (").append(t).append(") x q[")
                                .append(rng.nextInt(qubits)).append(']');
                    }
                    break;
                }
                sb.append("cu(").append(angle()).append(", 0.2, 0.3, ").append(angle())
                        .append(") q[0], q[1]");
                break;
            case 16:
            case 17: {
                sb.append("if (").append(condition()).append(") {\n");
                block(depth, loopVar);
                if (rng.nextBoolean()) {
                    sb.append(indent).append("} else {\n");
                    block(depth, loopVar);
                }
                sb.append(indent).append('}').append('\n');
                return;
            }
            case 18:
            case 19: {
                String var = "i" + loops++;
                if (rng.nextBoolean()) {
                    sb.append("for int ").append(var).append(" in [0:").append(qubits - 1)
                            .append("] {\n");
                } else {
                    sb.append("for uint ").append(var).append(" in {").append(qubits - 1)
                            .append(", 0} {\n");
                }
                block(depth, var);
                sb.append(indent).append('}').append('\n');
                return;
            }
            default: {
                if (rng.nextBoolean()) {
                    sb.append("@max_iterations ").append(1 + rng.nextInt(20)).append('\n')
                            .append(indent);
                }
                sb.append("while (c[0] == 0) {\n");
                String saved = indent;
                indent = indent + "  ";
                sb.append(indent).append("h q[0];\n").append(indent)
                        .append("c[0] = measure q[0];\n");
                indent = saved;
                sb.append(indent).append('}').append('\n');
                return;
            }
        }
        sb.append(";\n");
    }

    private void block(int depth, String loopVar) {
        String saved = indent;
        indent = indent + "  ";
        int n = 1 + rng.nextInt(3);
        for (int i = 0; i < n; i++) {
            statement(depth + 1, loopVar);
        }
        indent = saved;
    }
}
