package dev.qsim;

import java.util.Arrays;
import java.util.List;
import java.util.Objects;

import dev.qsim.kernel.GateOp;

/**
 * One step of a {@link Circuit}: a gate, a measurement, a reset, or a block of instructions
 * conditioned on a classical bit. Immutable and thread-safe; arrays are copied in and out.
 *
 * <p>A gate is a {@linkplain #gate() catalogue entry} with its {@linkplain #angles() angles},
 * applied as its {@linkplain #operator() operator} on its {@linkplain #targets() targets} (bit
 * {@code j} of the matrix index is {@code targets()[j]}) only where every
 * {@linkplain #controls() control} qubit is 1 (Barenco et al. 1995, "Elementary gates for
 * quantum computation", Phys. Rev. A 52, 3457, doi:10.1103/PhysRevA.52.3457). The controls are
 * the entry's own ({@link Gate#CNOT} has one) followed by any added ones.
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

    private static final int[] NONE = new int[0];
    private static final double[] NO_ANGLES = new double[0];

    private final Kind kind;
    private final Gate gate;
    private final double[] angles;
    private final Operator operator;
    private final int[] targets;
    private final int[] controls;
    private final int clbit;
    private final int value;
    private final List<Instruction> body;
    /** The kernel's description of a gate, chosen once; null for other kinds. */
    private final GateOp plan;

    private Instruction(Kind kind, Gate gate, double[] angles, Operator operator, int[] targets,
            int[] controls, int clbit, int value, List<Instruction> body) {
        this.kind = kind;
        this.gate = gate;
        this.angles = angles;
        this.operator = operator;
        this.targets = targets;
        this.controls = controls;
        this.clbit = clbit;
        this.value = value;
        this.body = body;
        this.plan = operator == null ? null : GateOp.of(operator.raw(), targets, controls);
    }

    /** A gate; arrays are taken as they are (callers pass fresh ones). */
    static Instruction gate(Gate gate, double[] angles, Operator op, int[] targets,
            int[] controls) {
        return new Instruction(Kind.GATE, gate, angles, op, targets, controls, -1, -1,
                List.of());
    }

    static Instruction measure(int qubit, int clbit) {
        return new Instruction(Kind.MEASURE, null, NO_ANGLES, null, new int[] {qubit}, NONE,
                clbit, -1, List.of());
    }

    static Instruction reset(int qubit) {
        return new Instruction(Kind.RESET, null, NO_ANGLES, null, new int[] {qubit}, NONE, -1,
                -1, List.of());
    }

    static Instruction ifBit(int clbit, int value, List<Instruction> body) {
        return new Instruction(Kind.IF_BIT, null, NO_ANGLES, null, NONE, NONE, clbit, value,
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
     * Returns the catalogue entry of a gate ({@link Gate#UNITARY} for an operator given as a
     * matrix), or {@code null} for a measurement, reset or conditioned block.
     *
     * @return the entry or null
     */
    public Gate gate() {
        return gate;
    }

    /**
     * Returns a short name: the gate's {@linkplain Gate#id() identifier} ({@code "h"},
     * {@code "cnot"}, {@code "unitary"} ...), or {@code "measure"}, {@code "reset"} or
     * {@code "if"}. For display; to tell gates apart use {@link #gate()}.
     *
     * @return the name
     */
    public String name() {
        switch (kind) {
            case MEASURE:
                return "measure";
            case RESET:
                return "reset";
            case IF_BIT:
                return "if";
            default:
                return gate.id();
        }
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
     * Returns the control qubits of a gate (empty if none): the entry's own, then added ones.
     *
     * @return a copy of the controls
     */
    public int[] controls() {
        return controls.clone();
    }

    /**
     * Returns every qubit a gate, measurement or reset touches: controls first, then targets
     * (empty for a conditioned block).
     *
     * @return a new array
     */
    public int[] qubits() {
        int[] all = Arrays.copyOf(controls, controls.length + targets.length);
        System.arraycopy(targets, 0, all, controls.length, targets.length);
        return all;
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

    /**
     * Tells whether this is a gate the stabilizer engine can run: a Clifford catalogue gate
     * ({@link Gate#isClifford(double...)}) without added controls. Measurements and resets
     * are Clifford operations; a conditioned block is Clifford when its body is.
     *
     * @return whether the instruction is Clifford
     */
    public boolean isClifford() {
        switch (kind) {
            case GATE:
                return controls.length == gate.controls() && gate.isClifford(angles);
            case IF_BIT:
                for (Instruction in : body) {
                    if (!in.isClifford()) {
                        return false;
                    }
                }
                return true;
            default:
                return true;
        }
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

    GateOp plan() {
        return plan;
    }

    /** True if this instruction measures, resets or is conditioned. */
    boolean isClassical() {
        return kind != Kind.GATE;
    }

    /**
     * Compares kind, gate, angles (bitwise), operator, qubits, clbit, value and body.
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
        return kind == x.kind && gate == x.gate && Arrays.equals(angles, x.angles)
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
        int h = Objects.hash(kind, gate, operator, clbit, value, body);
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
                StringBuilder sb = new StringBuilder(gate.id());
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
