package dev.qsim;

import java.util.Arrays;
import java.util.List;
import java.util.Objects;

/**
 * One step of a {@link Circuit}: a gate, a measurement, a reset, or a block of instructions
 * conditioned on a classical bit. Immutable and thread-safe; arrays are copied in and out.
 *
 * <p>A gate is an operator on its {@linkplain #targets() targets} (bit {@code j} of the matrix
 * index is {@code targets()[j]}), applied only where every {@linkplain #controls() control}
 * qubit is 1 (Barenco et al. 1995, "Elementary gates for quantum computation", Phys. Rev. A 52,
 * 3457, doi:10.1103/PhysRevA.52.3457). Its {@linkplain #name() name} is the builder method that
 * recorded it ({@code "h"}, {@code "cnot"}, {@code "rz"}, {@code "apply"} ...), with the angles
 * in {@link #angles()}.
 *
 * @since 0.1
 */
public final class Instruction {
    /** What an instruction does. */
    public enum Kind {
        /** A unitary gate on target qubits, possibly controlled. */
        GATE,
        /** A measurement of one qubit in the computational basis into one classical bit. */
        MEASURE,
        /** A reset of one qubit to |0>. */
        RESET,
        /** A block of instructions run only when a classical bit has a given value. */
        IF_BIT
    }

    static final int SHAPE_DENSE = 0;
    static final int SHAPE_DIAGONAL = 1;
    static final int SHAPE_MONOMIAL = 2;

    private static final int[] NONE = new int[0];
    private static final double[] NO_ANGLES = new double[0];

    private final Kind kind;
    private final String name;
    private final double[] angles;
    private final Operator operator;
    private final int[] targets;
    private final int[] controls;
    private final int clbit;
    private final int value;
    private final List<Instruction> body;

    // Kernel plan, chosen once.
    final int shape;
    final double[] data;
    final int[] perm;

    private Instruction(Kind kind, String name, double[] angles, Operator operator, int[] targets,
            int[] controls, int clbit, int value, List<Instruction> body) {
        this.kind = kind;
        this.name = name;
        this.angles = angles;
        this.operator = operator;
        this.targets = targets;
        this.controls = controls;
        this.clbit = clbit;
        this.value = value;
        this.body = body;
        if (operator == null) {
            shape = SHAPE_DENSE;
            data = null;
            perm = null;
        } else {
            double[] m = operator.raw();
            int d = operator.dimension();
            if (operator.isDiagonal()) {
                shape = SHAPE_DIAGONAL;
                data = new double[2 * d];
                for (int i = 0; i < d; i++) {
                    data[2 * i] = m[2 * (i * d + i)];
                    data[2 * i + 1] = m[2 * (i * d + i) + 1];
                }
                perm = null;
            } else if (operator.isMonomial()) {
                shape = SHAPE_MONOMIAL;
                data = new double[2 * d];
                perm = new int[d];
                for (int c = 0; c < d; c++) {
                    for (int r = 0; r < d; r++) {
                        double re = m[2 * (r * d + c)];
                        double im = m[2 * (r * d + c) + 1];
                        if (re != 0 || im != 0) {
                            perm[c] = r;
                            data[2 * c] = re;
                            data[2 * c + 1] = im;
                        }
                    }
                }
            } else {
                shape = SHAPE_DENSE;
                data = m;
                perm = null;
            }
        }
    }

    static Instruction gate(String name, double[] angles, Operator op, int[] targets,
            int[] controls) {
        return new Instruction(Kind.GATE, name, angles, op, targets, controls, -1, -1, List.of());
    }

    static Instruction gate(String name, Operator op, int... targets) {
        return gate(name, NO_ANGLES, op, targets, NONE);
    }

    static Instruction measure(int qubit, int clbit) {
        return new Instruction(Kind.MEASURE, "measure", NO_ANGLES, null, new int[] {qubit}, NONE,
                clbit, -1, List.of());
    }

    static Instruction reset(int qubit) {
        return new Instruction(Kind.RESET, "reset", NO_ANGLES, null, new int[] {qubit}, NONE, -1,
                -1, List.of());
    }

    static Instruction ifBit(int clbit, int value, List<Instruction> body) {
        return new Instruction(Kind.IF_BIT, "if", NO_ANGLES, null, NONE, NONE, clbit, value,
                List.copyOf(body));
    }

    /**
     * Returns what this instruction does.
     *
     * @return the kind
     */
    public Kind kind() {
        return kind;
    }

    /**
     * Returns the name of the builder method that recorded this instruction, such as
     * {@code "h"}, {@code "cnot"}, {@code "rz"}, {@code "apply"}, {@code "measure"},
     * {@code "reset"} or {@code "if"}.
     *
     * @return the name
     */
    public String name() {
        return name;
    }

    /**
     * Returns the angles of a parameterised gate, in radians (empty for other instructions).
     *
     * @return a copy of the angles
     */
    public double[] angles() {
        return angles.clone();
    }

    /**
     * Returns the operator a gate applies to its targets, or {@code null} for other kinds.
     *
     * @return the target operator, without its controls
     */
    public Operator operator() {
        return operator;
    }

    /**
     * Returns the target qubits of a gate, or the one qubit of a measurement or reset.
     *
     * @return a copy of the qubits
     */
    public int[] targets() {
        return targets.clone();
    }

    /**
     * Returns the control qubits of a gate (empty if none).
     *
     * @return a copy of the controls
     */
    public int[] controls() {
        return controls.clone();
    }

    /**
     * Returns the classical bit a measurement writes or a condition reads, or -1.
     *
     * @return the clbit
     */
    public int clbit() {
        return clbit;
    }

    /**
     * Returns the value a condition requires (0 or 1), or -1 for other kinds.
     *
     * @return the value
     */
    public int value() {
        return value;
    }

    /**
     * Returns the instructions of a conditioned block (empty for other kinds).
     *
     * @return an unmodifiable list
     */
    public List<Instruction> body() {
        return body;
    }

    int[] targetsRaw() {
        return targets;
    }

    int[] controlsRaw() {
        return controls;
    }

    double[] anglesRaw() {
        return angles;
    }

    /** True if this instruction or its body measures, resets or is conditioned. */
    boolean isClassical() {
        return kind != Kind.GATE;
    }

    /**
     * Compares kind, name, angles (bitwise), operator, qubits, clbit, value and body.
     *
     * @param o another object
     * @return whether the instructions are equal
     */
    @Override
    public boolean equals(Object o) {
        if (this == o) {
            return true;
        }
        if (!(o instanceof Instruction)) {
            return false;
        }
        Instruction x = (Instruction) o;
        return kind == x.kind && name.equals(x.name) && Arrays.equals(angles, x.angles)
                && Objects.equals(operator, x.operator) && Arrays.equals(targets, x.targets)
                && Arrays.equals(controls, x.controls) && clbit == x.clbit && value == x.value
                && body.equals(x.body);
    }

    /**
     * Returns a hash code consistent with {@link #equals(Object)}.
     *
     * @return the hash code
     */
    @Override
    public int hashCode() {
        int h = Objects.hash(kind, name, operator, clbit, value, body);
        h = 31 * h + Arrays.hashCode(angles);
        h = 31 * h + Arrays.hashCode(targets);
        return 31 * h + Arrays.hashCode(controls);
    }

    /**
     * Returns a one-line description, such as {@code "cnot controls [0] targets [1]"}.
     *
     * @return the description
     */
    @Override
    public String toString() {
        switch (kind) {
            case MEASURE:
                return "measure q" + targets[0] + " -> c" + clbit;
            case RESET:
                return "reset q" + targets[0];
            case IF_BIT:
                return "if c" + clbit + " == " + value + " " + body;
            default:
                StringBuilder sb = new StringBuilder(name);
                if (angles.length > 0) {
                    sb.append(Arrays.toString(angles).replace('[', '(').replace(']', ')'));
                }
                if (controls.length > 0) {
                    sb.append(" controls ").append(Arrays.toString(controls));
                }
                return sb.append(" targets ").append(Arrays.toString(targets)).toString();
        }
    }
}
