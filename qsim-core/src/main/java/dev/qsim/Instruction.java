package dev.qsim;

import java.util.Arrays;
import java.util.List;
import java.util.Objects;

import dev.qsim.kernel.GateOp;

/**
 * One step of a {@link Circuit}: a gate, a measurement, a reset, a delay, an assignment to a
 * classical variable or bits, or a block of instructions run on a condition or in a loop.
 * Immutable and thread-safe; arrays are copied in and out.
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
        IF_BIT,
        /**
         * A block run when a {@linkplain #condition() condition} holds, and optionally another
         * ({@linkplain #otherwise() otherwise}) when it does not.
         */
        IF,
        /**
         * A block run again and again while a {@linkplain #condition() condition} holds, at
         * most {@linkplain #maxIterations() a bound} of times.
         */
        WHILE,
        /** An assignment of an {@linkplain #value() expression} to a variable or to clbits. */
        ASSIGN,
        /** A wait of a {@linkplain #duration() duration} on some qubits (no gate). */
        DELAY
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
    private final Expression condition;
    private final List<Instruction> otherwise;
    private final int maxIterations;
    private final int slot;
    private final Circuit.VariableType variableType;
    private final int[] assignedClbits;
    private final Expression assigned;
    private final double duration;
    private final Expression[] angleExpressions;

    /** The classical parts of an instruction (all absent for gates, measurements, resets). */
    private record Extra(Expression condition, List<Instruction> otherwise, int maxIterations,
            int slot, Circuit.VariableType variableType, int[] assignedClbits,
            Expression assigned, double duration, Expression[] angleExpressions) {
        static final Extra NONE = new Extra(null, List.of(), 0, -1, null, new int[0], null, 0,
                null);
    }

    private Instruction(Kind kind, Gate gate, double[] angles, Operator operator, int[] targets,
            int[] controls, int clbit, int value, List<Instruction> body) {
        this(kind, gate, angles, operator, targets, controls, clbit, value, body, Extra.NONE);
    }

    private Instruction(Kind kind, Gate gate, double[] angles, Operator operator, int[] targets,
            int[] controls, int clbit, int value, List<Instruction> body, Extra extra) {
        this.condition = extra.condition();
        this.otherwise = extra.otherwise();
        this.maxIterations = extra.maxIterations();
        this.slot = extra.slot();
        this.variableType = extra.variableType();
        this.assignedClbits = extra.assignedClbits();
        this.assigned = extra.assigned();
        this.duration = extra.duration();
        this.angleExpressions = extra.angleExpressions();
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

    static Instruction ifThen(Expression condition, List<Instruction> then,
            List<Instruction> otherwise) {
        return new Instruction(Kind.IF, null, NO_ANGLES, null, NONE, NONE, -1, -1,
                List.copyOf(then), new Extra(condition, List.copyOf(otherwise), 0, -1, null,
                NONE, null, 0, null));
    }

    static Instruction whileLoop(Expression condition, int maxIterations,
            List<Instruction> body) {
        return new Instruction(Kind.WHILE, null, NO_ANGLES, null, NONE, NONE, -1, -1,
                List.copyOf(body), new Extra(condition, List.of(), maxIterations, -1, null,
                NONE, null, 0, null));
    }

    static Instruction assignVariable(int slot, Circuit.VariableType type, Expression value) {
        return new Instruction(Kind.ASSIGN, null, NO_ANGLES, null, NONE, NONE, -1, -1,
                List.of(), new Extra(null, List.of(), 0, slot, type, NONE, value, 0, null));
    }

    static Instruction assignClbits(int[] clbits, Expression value) {
        return new Instruction(Kind.ASSIGN, null, NO_ANGLES, null, NONE, NONE, -1, -1,
                List.of(), new Extra(null, List.of(), 0, -1, null, clbits, value, 0, null));
    }

    static Instruction delay(double duration, int[] qubits) {
        return new Instruction(Kind.DELAY, null, NO_ANGLES, null, qubits, NONE, -1, -1,
                List.of(), new Extra(null, List.of(), 0, -1, null, NONE, null, duration, null));
    }

    /** A gate whose angles are known only during the shot (no operator or plan yet). */
    static Instruction dynamicGate(Gate gate, Expression[] angles, int[] targets,
            int[] controls) {
        return new Instruction(Kind.GATE, gate, NO_ANGLES, null, targets, controls, -1, -1,
                List.of(), new Extra(null, List.of(), 0, -1, null, NONE, null, 0, angles));
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
            case IF:
                return "if";
            case WHILE:
                return "while";
            case ASSIGN:
                return "assign";
            case DELAY:
                return "delay";
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
     * Returns the condition of an {@link Kind#IF} or {@link Kind#WHILE} block, or {@code null}.
     *
     * @return the condition
     */
    public Expression condition() {
        return condition;
    }

    /**
     * Returns the block an {@link Kind#IF} runs when its condition does not hold (empty without
     * one, and for other kinds).
     *
     * @return an unmodifiable list
     */
    public List<Instruction> otherwise() {
        return otherwise;
    }

    /**
     * Returns the most times a {@link Kind#WHILE} block runs in one shot (0 for other kinds).
     *
     * @return the bound
     */
    public int maxIterations() {
        return maxIterations;
    }

    /**
     * Returns the variable slot an {@link Kind#ASSIGN} writes ({@link Circuit#variables()}
     * index), or -1 when it writes clbits or for other kinds.
     *
     * @return the slot
     */
    public int variable() {
        return slot;
    }

    /**
     * Returns the type of the variable an {@link Kind#ASSIGN} writes, or {@code null}.
     *
     * @return the type
     */
    public Circuit.VariableType variableType() {
        return variableType;
    }

    /**
     * Returns the clbits an {@link Kind#ASSIGN} writes (bit {@code j} of the value goes to
     * {@code assignedClbits()[j]}), empty when it writes a variable.
     *
     * @return a copy of the clbits
     */
    public int[] assignedClbits() {
        return assignedClbits.clone();
    }

    /**
     * Returns the expression an {@link Kind#ASSIGN} writes, or {@code null}.
     *
     * @return the value
     */
    public Expression assignedValue() {
        return assigned;
    }

    /**
     * Returns the duration of a {@link Kind#DELAY} (in the unit the circuit was given, seconds
     * when read from OpenQASM), 0 for other kinds.
     *
     * @return the duration
     */
    public double duration() {
        return duration;
    }

    /**
     * Tells whether this gate's angles are known only during the shot (they read classical bits
     * or variables); its {@link #operator()} is then {@code null} and {@link #angleExpressions()}
     * gives the angles.
     *
     * @return whether the angles are dynamic
     */
    public boolean isDynamic() {
        return angleExpressions != null;
    }

    /**
     * Returns the angle expressions of a {@linkplain #isDynamic() dynamic} gate (empty for
     * others).
     *
     * @return a copy of the expressions
     */
    public Expression[] angleExpressions() {
        return angleExpressions == null ? new Expression[0] : angleExpressions.clone();
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
                return !isDynamic() && controls.length == gate.controls()
                        && gate.isClifford(angles);
            case IF_BIT:
            case IF:
            case WHILE:
                for (Instruction in : body) {
                    if (!in.isClifford()) {
                        return false;
                    }
                }
                for (Instruction in : otherwise) {
                    if (!in.isClifford()) {
                        return false;
                    }
                }
                return true;
            default:
                return true;
        }
    }

    /** This instruction with every variable slot it reads or writes moved by {@code offset}. */
    Instruction withSlotOffset(int offset) {
        if (offset == 0 || (kind == Kind.GATE && !isDynamic()) || kind == Kind.MEASURE
                || kind == Kind.RESET || kind == Kind.DELAY) {
            return this;
        }
        Expression cond = condition == null ? null : condition.withSlotOffset(offset);
        Expression val = assigned == null ? null : assigned.withSlotOffset(offset);
        Expression[] ang = null;
        if (angleExpressions != null) {
            ang = new Expression[angleExpressions.length];
            for (int i = 0; i < ang.length; i++) {
                ang[i] = angleExpressions[i].withSlotOffset(offset);
            }
        }
        List<Instruction> b = shift(body, offset);
        List<Instruction> o = shift(otherwise, offset);
        return new Instruction(kind, gate, angles, operator, targets, controls, clbit, value, b,
                new Extra(cond, o, maxIterations, slot < 0 ? -1 : slot + offset, variableType,
                assignedClbits, val, duration, ang));
    }

    private static List<Instruction> shift(List<Instruction> list, int offset) {
        if (list.isEmpty()) {
            return list;
        }
        List<Instruction> out = new java.util.ArrayList<>(list.size());
        for (Instruction in : list) {
            out.add(in.withSlotOffset(offset));
        }
        return List.copyOf(out);
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

    /**
     * True unless this is a gate with angles known before the shot: measurements, resets,
     * delays, classical control and dynamic gates all stop a run of fusable gates.
     */
    boolean isClassical() {
        return kind != Kind.GATE || angleExpressions != null;
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
                && body.equals(x.body) && Objects.equals(condition, x.condition)
                && otherwise.equals(x.otherwise) && maxIterations == x.maxIterations
                && slot == x.slot && variableType == x.variableType
                && Arrays.equals(assignedClbits, x.assignedClbits)
                && Objects.equals(assigned, x.assigned)
                && Double.doubleToLongBits(duration) == Double.doubleToLongBits(x.duration)
                && Arrays.equals(angleExpressions, x.angleExpressions);
    }

    /**
     * Returns a hash code consistent with {@link #equals(Object)}.
     *
     * @return the hash code
     */
    @Override
    public int hashCode() {
        int h = Objects.hash(kind, gate, operator, clbit, value, body, condition, otherwise,
                maxIterations, slot, assigned, duration);
        h = 31 * h + Arrays.hashCode(angleExpressions);
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
            case IF:
                return "if " + condition + " " + body + (otherwise.isEmpty() ? ""
                        : " else " + otherwise);
            case WHILE:
                return "while " + condition + " (at most " + maxIterations + ") " + body;
            case ASSIGN:
                return (slot >= 0 ? "v" + slot : "c" + Arrays.toString(assignedClbits)) + " = "
                        + assigned;
            case DELAY:
                return "delay(" + duration + ") " + Arrays.toString(targets);
            default:
                StringBuilder sb = new StringBuilder(gate.id());
                if (angles.length > 0) {
                    sb.append(Arrays.toString(angles).replace('[', '(').replace(']', ')'));
                } else if (angleExpressions != null) {
                    sb.append(Arrays.toString(angleExpressions).replace('[', '(')
                            .replace(']', ')'));
                }
                if (controls.length > 0) {
                    sb.append(" controls ").append(Arrays.toString(controls));
                }
                return sb.append(" targets ").append(Arrays.toString(targets)).toString();
        }
    }
}
