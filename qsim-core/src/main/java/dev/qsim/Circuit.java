package dev.qsim;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.BitSet;
import java.util.List;
import java.util.Objects;
import java.util.OptionalInt;
import java.util.function.Consumer;

import dev.qsim.internal.Checks;
import dev.qsim.kernel.GateOp;
import dev.qsim.kernel.Matrices;

/**
 * An immutable list of instructions on a fixed number of qubits and classical bits. Built with
 * {@link #builder(int)}; run with {@link Simulator} (any circuit) or
 * {@link StateVector#apply(Circuit)} (circuits of gates only). Thread-safe.
 *
 * <p>Example:
 * <pre>{@code
 * Circuit bell = Circuit.builder(2).h(0).cnot(0, 1).measure().build();
 * Tally tally = Simulator.seeded(7).run(bell, 1000);
 * }</pre>
 *
 * <p>Qubit and bit order follow the {@linkplain dev.qsim package conventions}. Gate matrices
 * are those of {@link Gates} (Nielsen and Chuang 2010, §4.2 and §4.3).
 *
 * @since 0.1
 */
public final class Circuit {
    /** The most qubits a circuit may have: {@value}. */
    public static final int MAX_QUBITS = 1 << 20;

    private final int qubits;
    private final int clbits;
    private final List<Instruction> instructions;
    private final List<Variable> variables;

    /**
     * The type of a classical variable, with OpenQASM 3's meaning (Cross et al. 2022,
     * "Classical types"): assignments convert to it.
     *
     * @since 0.1
     */
    public enum VariableType {
        /** true or false; a number is true when non-zero. */
        BOOL,
        /** A signed integer of {@code width} bits (two's complement; values wrap). */
        INT,
        /** An unsigned integer of {@code width} bits (values wrap modulo 2^width). */
        UINT,
        /** A double-precision float. */
        FLOAT,
        /** An angle in radians, reduced to [0, 2π) on assignment. */
        ANGLE;

        /** The expression type a variable of this type reads as. */
        Expression.Type expressionType() {
            switch (this) {
                case BOOL:
                    return Expression.Type.BOOL;
                case INT:
                case UINT:
                    return Expression.Type.INT;
                default:
                    return Expression.Type.FLOAT;
            }
        }
    }

    /**
     * A classical variable of a circuit: its name, type and width in bits ({@code 64} for
     * floats and angles, {@code 1} for bools). Variables start at 0 in every shot.
     *
     * @param name the name
     * @param type the type
     * @param width the width, 1 to 64
     * @since 0.1
     */
    public record Variable(String name, VariableType type, int width) {
        /**
         * Checks the fields.
         *
         * @param name the name
         * @param type the type
         * @param width the width
         */
        public Variable {
            Checks.requireName(name, "a variable name");
            Objects.requireNonNull(type, "type");
            Checks.requireInRange(width, 1, 64, "the width of variable " + Checks.excerpt(name));
        }

        /**
         * Converts a value to this variable's type, as an assignment does: a bool becomes 0
         * or 1, an integer wraps to the width, an angle is reduced to [0, 2π).
         *
         * @param value the assigned expression's value, as the expression's type gives it
         *     (integer bits, or a double's bits when {@code fromFloat})
         * @param fromFloat whether {@code value} holds a double's bits
         * @return the stored 64 bits
         */
        public long convert(long value, boolean fromFloat) {
            double real = fromFloat ? Double.longBitsToDouble(value) : value;
            long integer = fromFloat ? (long) real : value;
            switch (type) {
                case BOOL:
                    return (fromFloat ? real != 0 : value != 0) ? 1 : 0;
                case INT:
                    return width == 64 ? integer : (integer << (64 - width)) >> (64 - width);
                case UINT:
                    return width == 64 ? integer : integer & ((1L << width) - 1);
                case FLOAT:
                    return Double.doubleToRawLongBits(real);
                default: {
                    double a = real % (2 * Math.PI);
                    if (a < 0) {
                        a += 2 * Math.PI;
                    }
                    return Double.doubleToRawLongBits(a);
                }
            }
        }
    }

    private Circuit(int qubits, int clbits, List<Instruction> instructions) {
        this(qubits, clbits, instructions, List.of());
    }

    private Circuit(int qubits, int clbits, List<Instruction> instructions,
            List<Variable> variables) {
        this.qubits = qubits;
        this.clbits = clbits;
        this.instructions = List.copyOf(instructions);
        this.variables = List.copyOf(variables);
    }

    /**
     * Returns the classical variables, in declaration order; an expression's variable slot is
     * its index here.
     *
     * @return an unmodifiable list
     */
    public List<Variable> variables() {
        return variables;
    }

    /**
     * Starts a circuit on {@code qubits} qubits with as many classical bits.
     *
     * @param qubits the number of qubits, {@code 1 <= qubits <= }{@value #MAX_QUBITS}
     * @return a new builder
     * @throws IllegalArgumentException if {@code qubits} is out of range
     */
    public static Builder builder(int qubits) {
        Checks.requireInRange(qubits, 1, MAX_QUBITS, "qubit count");
        return new Builder(qubits, qubits);
    }

    /**
     * Starts a circuit on {@code qubits} qubits and {@code clbits} classical bits.
     *
     * @param qubits the number of qubits, {@code 1 <= qubits <= }{@value #MAX_QUBITS}
     * @param clbits the number of classical bits, {@code 0 <= clbits <= }{@value #MAX_QUBITS}
     * @return a new builder
     * @throws IllegalArgumentException if a count is out of range
     */
    public static Builder builder(int qubits, int clbits) {
        Checks.requireInRange(qubits, 1, MAX_QUBITS, "qubit count");
        Checks.requireInRange(clbits, 0, MAX_QUBITS, "clbit count");
        return new Builder(qubits, clbits);
    }

    /**
     * Returns the number of qubits.
     *
     * @return the qubit count
     */
    public int qubits() {
        return qubits;
    }

    /**
     * Returns the number of classical bits.
     *
     * @return the clbit count
     */
    public int clbits() {
        return clbits;
    }

    /**
     * Returns the number of instructions; a conditioned block counts as one.
     *
     * @return the instruction count
     */
    public int size() {
        return instructions.size();
    }

    /**
     * Returns the instructions in order.
     *
     * @return an unmodifiable list
     */
    public List<Instruction> instructions() {
        return instructions;
    }

    /**
     * Tells whether this circuit holds only gates with angles known before the shot, and
     * perhaps delays (no measurement, reset, classical control or assignment), so that
     * {@link StateVector#apply(Circuit)}, {@link #inverse()} and {@link #toOperator()} accept
     * it. A delay does nothing to an ideal state.
     *
     * @return whether the circuit is gates only
     */
    public boolean isGatesOnly() {
        for (Instruction in : instructions) {
            if (in.isClassical() && in.kind() != Instruction.Kind.DELAY) {
                return false;
            }
        }
        return true;
    }

    /**
     * Tells whether every measurement could be moved to the end without changing what the
     * circuit does: no reset, no condition, and no gate on a qubit after that qubit was measured
     * (the deferred-measurement principle, Nielsen and Chuang 2010, §4.4). Such a circuit's
     * shots can all be drawn from one final state; this is the one place that rule is decided.
     *
     * @return whether the measurements come last
     */
    public boolean measuresAtEnd() {
        return firstAfterMeasurement() < 0;
    }

    /**
     * Returns the index of the first instruction that stops the measurements from being moved
     * to the end (a reset, a condition, or a gate on a measured qubit), or -1 if there is none.
     */
    int firstAfterMeasurement() {
        BitSet measured = new BitSet();
        for (int i = 0; i < instructions.size(); i++) {
            Instruction in = instructions.get(i);
            switch (in.kind()) {
                case MEASURE:
                    measured.set(in.targetsRaw()[0]);
                    break;
                case DELAY:
                    break;
                case GATE:
                    if (in.isDynamic()) {
                        return i;
                    }
                    for (int q : in.targetsRaw()) {
                        if (measured.get(q)) {
                            return i;
                        }
                    }
                    for (int q : in.controlsRaw()) {
                        if (measured.get(q)) {
                            return i;
                        }
                    }
                    break;
                default:
                    return i;
            }
        }
        return -1;
    }

    /** Says why instruction {@code stop} keeps the measurements from moving to the end. */
    String whyNotAtEnd(int stop) {
        Instruction in = instructions.get(stop);
        switch (in.kind()) {
            case RESET:
                return "instruction " + stop + " is a reset (" + in + ")";
            case IF_BIT:
                return "instruction " + stop + " is a block conditioned on clbit " + in.clbit()
                        + " (" + Checks.excerpt(in.toString()) + ")";
            case IF:
            case WHILE:
                return "instruction " + stop + " is a block conditioned on "
                        + Checks.excerpt(in.condition().toString());
            case ASSIGN:
                return "instruction " + stop + " assigns a classical value ("
                        + Checks.excerpt(in.toString()) + ")";
            case GATE:
                if (in.isDynamic()) {
                    return "instruction " + stop + " is a gate whose angles are read during the"
                            + " shot (" + Checks.excerpt(in.toString()) + ")";
                }
                return "instruction " + stop + " (" + in + ") acts on a qubit after it was"
                        + " measured";
            default:
                return "instruction " + stop + " (" + in + ") acts on a qubit after it was"
                        + " measured";
        }
    }

    /**
     * Returns, for each classical bit, the qubit whose measurement last writes it, or -1 for a
     * bit no measurement writes (it reads 0). Conditioned blocks are not looked into: this is
     * the map of a circuit whose {@linkplain #measuresAtEnd() measurements come last}, where
     * each clbit's final value is its qubit's value in the final state.
     *
     * @return a new array of length {@link #clbits()}
     */
    public int[] clbitSources() {
        int[] source = new int[clbits];
        Arrays.fill(source, -1);
        for (Instruction in : instructions) {
            if (in.kind() == Instruction.Kind.MEASURE) {
                source[in.clbit()] = in.targetsRaw()[0];
            }
        }
        return source;
    }

    /**
     * Returns the gates of this circuit without its measurements, for a circuit whose
     * {@linkplain #measuresAtEnd() measurements come last}: the state those gates make is the
     * state the measurements read.
     *
     * @return a circuit of gates only, with the same qubits and clbits
     * @throws IllegalArgumentException if a reset, a condition or a gate after a measurement of
     *     one of its qubits stops the measurements from being moved to the end
     */
    public Circuit withoutMeasurements() {
        int stop = firstAfterMeasurement();
        if (stop >= 0) {
            throw new IllegalArgumentException(whyNotAtEnd(stop) + ", so the measurements"
                    + " cannot all be moved to the end; run such circuits shot by shot with"
                    + " Simulator");
        }
        List<Instruction> gates = new ArrayList<>(instructions.size());
        for (Instruction in : instructions) {
            if (in.kind() == Instruction.Kind.GATE) {
                gates.add(in);
            }
        }
        return new Circuit(qubits, clbits, gates, variables);
    }

    /**
     * Tells whether the stabilizer engine can run this circuit: every gate is a Clifford
     * catalogue gate for its angles ({@link Instruction#isClifford()}); measurements, resets
     * and conditions are allowed.
     *
     * @return whether the circuit is Clifford
     */
    public boolean isClifford() {
        return firstNonClifford().isEmpty();
    }

    /**
     * Returns the index of the first instruction that is not Clifford (a conditioned block
     * counts when its body holds a non-Clifford gate).
     *
     * @return the index, or empty if the circuit is Clifford
     */
    public OptionalInt firstNonClifford() {
        for (int i = 0; i < instructions.size(); i++) {
            if (!instructions.get(i).isClifford()) {
                return OptionalInt.of(i);
            }
        }
        return OptionalInt.empty();
    }

    /**
     * Returns the depth: the number of layers when each instruction is placed in the first layer
     * after every earlier instruction that shares a qubit or classical bit with it. A conditioned
     * block is one instruction touching its clbit and everything its body touches.
     *
     * @return the depth, 0 for an empty circuit
     */
    public int depth() {
        int[] qLevel = new int[qubits];
        int[] cLevel = new int[clbits];
        int depth = 0;
        for (Instruction in : instructions) {
            List<Integer> qs = new ArrayList<>();
            List<Integer> cs = new ArrayList<>();
            touched(in, qs, cs);
            int level = 0;
            for (int q : qs) {
                level = Math.max(level, qLevel[q]);
            }
            for (int c : cs) {
                level = Math.max(level, cLevel[c]);
            }
            level++;
            for (int q : qs) {
                qLevel[q] = level;
            }
            for (int c : cs) {
                cLevel[c] = level;
            }
            depth = Math.max(depth, level);
        }
        return depth;
    }

    static void touched(Instruction in, List<Integer> qs, List<Integer> cs) {
        for (int q : in.targetsRaw()) {
            qs.add(q);
        }
        for (int q : in.controlsRaw()) {
            qs.add(q);
        }
        if (in.clbit() >= 0) {
            cs.add(in.clbit());
        }
        BitSet read = new BitSet();
        if (in.condition() != null) {
            in.condition().collectClbits(read);
        }
        if (in.assignedValue() != null) {
            in.assignedValue().collectClbits(read);
        }
        for (Expression e : in.angleExpressions()) {
            e.collectClbits(read);
        }
        for (int c : in.assignedClbits()) {
            read.set(c);
        }
        for (int c = read.nextSetBit(0); c >= 0; c = read.nextSetBit(c + 1)) {
            cs.add(c);
        }
        for (Instruction b : in.body()) {
            touched(b, qs, cs);
        }
        for (Instruction b : in.otherwise()) {
            touched(b, qs, cs);
        }
    }

    /**
     * Returns the circuit that undoes this one: the gates in reverse order, each replaced by its
     * inverse ({@code s} by {@code sDagger}, {@code rz(θ)} by {@code rz(-θ)}, a general operator
     * by its adjoint).
     *
     * @return the inverse circuit
     * @throws IllegalArgumentException if the circuit measures, resets or has conditions
     */
    public Circuit inverse() {
        requireGatesOnly("inverse()");
        List<Instruction> out = new ArrayList<>(instructions.size());
        for (int i = instructions.size() - 1; i >= 0; i--) {
            out.add(inverseOf(instructions.get(i)));
        }
        return new Circuit(qubits, clbits, out, variables);
    }

    private static Instruction inverseOf(Instruction in) {
        if (in.kind() == Instruction.Kind.DELAY) {
            return in;
        }
        Gate g = in.gate();
        if (g == Gate.UNITARY) {
            Operator op = in.operator();
            Operator inv = op.dagger();
            return Instruction.gate(g, in.anglesRaw(), inv.equals(op) ? op : inv,
                    in.targetsRaw(), in.controlsRaw());
        }
        Gate inv = g.inverse();
        double[] a = g.inverseAngles(in.anglesRaw());
        if (inv == g && a.length == 0) {
            return in; // self-inverse (Nielsen and Chuang 2010, §4.2-4.3)
        }
        return Instruction.gate(inv, a, inv.operator(a), in.targetsRaw(), in.controlsRaw());
    }

    /**
     * Returns the dense {@code 2^n × 2^n} matrix of this circuit: column {@code j} is the state
     * the circuit makes from basis state {@code j}.
     *
     * @return the circuit's operator
     * @throws IllegalArgumentException if the circuit has more than {@value Operator#MAX_QUBITS}
     *     qubits, or measures, resets or has conditions
     */
    public Operator toOperator() {
        if (qubits > Operator.MAX_QUBITS) {
            throw new IllegalArgumentException("toOperator() handles at most " + Operator.MAX_QUBITS
                    + " qubits but the circuit has " + qubits);
        }
        requireGatesOnly("toOperator()");
        List<GateOp> plans = new ArrayList<>(instructions.size());
        for (Instruction in : instructions) {
            if (in.kind() == Instruction.Kind.GATE) {
                plans.add(in.plan());
            }
        }
        double[] m = Matrices.ofGates(qubits, plans);
        return Operator.ofRaw(qubits, m);
    }

    void requireGatesOnly(String what) {
        for (int i = 0; i < instructions.size(); i++) {
            Instruction in = instructions.get(i);
            if (in.isClassical() && in.kind() != Instruction.Kind.DELAY) {
                throw new IllegalArgumentException(what + " needs a circuit of gates only, but"
                        + " instruction " + i + " is '" + Checks.excerpt(in.toString())
                        + "'; run circuits with measurement, reset or classical control with"
                        + " Simulator");
            }
        }
    }

    /**
     * Draws the circuit as text: one line per qubit with time running left to right, and
     * connector lines between them, in the symbols of Nielsen and Chuang 2010, §4.3: a control
     * is a filled dot {@code ●}, a controlled NOT's target {@code ⊕}, the ends of a swap
     * {@code ×}; a measurement into clbit {@code c} is {@code M>c}, a reset is {@code |0>}, a
     * delay {@code wait(2us)}, a gate with angles computed during the shot carries its
     * expressions ({@code RX((c[0] * 1.5))}), and a conditioned gate carries its condition, as in
     * {@code X[c0=1]}, {@code Z[if c[0] == 1]}, {@code Z[if not c[0] == 1]} (an else block) or
     * {@code H[while c[0] == 0]}; assignments to classical values are not drawn. A circuit whose
     * drawing would pass about four million characters is summarised in one line instead. The
     * symbols are not ASCII: print the drawing to a UTF-8 terminal or file.
     *
     * @return the drawing, lines separated by {@code '\n'}
     */
    public String diagram() {
        return Diagram.draw(this);
    }

    /**
     * Compares qubit and clbit counts and the instructions.
     *
     * @param o another object
     * @return whether the circuits are equal
     */
    @Override
    public boolean equals(Object o) {
        if (this == o) {
            return true;
        }
        if (!(o instanceof Circuit)) {
            return false;
        }
        Circuit c = (Circuit) o;
        return qubits == c.qubits && clbits == c.clbits && instructions.equals(c.instructions)
                && variables.equals(c.variables);
    }

    /**
     * Returns a hash code consistent with {@link #equals(Object)}.
     *
     * @return the hash code
     */
    @Override
    public int hashCode() {
        return Objects.hash(qubits, clbits, instructions, variables);
    }

    /**
     * Returns a short summary, such as {@code "Circuit[3 qubits, 3 clbits, 6 instructions,
     * depth 4]"}; see {@link #diagram()} for a drawing.
     *
     * @return the summary
     */
    @Override
    public String toString() {
        return "Circuit[" + qubits + " qubits, " + clbits + " clbits, " + instructions.size()
                + " instructions, depth " + depth() + "]";
    }

    /**
     * Records instructions for a {@link Circuit}. Every method checks its arguments before it
     * records anything, so a refused call leaves the builder as it was. Mutable; not
     * thread-safe. {@link #build()} may be called more than once.
     *
     * <p>The named methods ({@link #h}, {@link #cnot}, {@link #rz} ...) and the general
     * {@link #gate(Gate, double[], int...)} record entries of the {@link Gate} catalogue; the
     * matrices are those of {@link Gates}.
     *
     * @since 0.1
     */
    public static final class Builder {
        private static final double[] NO_ANGLES = new double[0];
        private static final int[] NONE = new int[0];

        private final int qubits;
        private final int clbits;
        private final List<Instruction> list = new ArrayList<>();
        /** The circuit's variables, shared with the builders of its blocks. */
        private final Variables variables;

        /** The variable table of a circuit being built: declaration order and names. */
        private static final class Variables {
            final List<Variable> list = new ArrayList<>();
            final java.util.Map<String, Integer> index = new java.util.HashMap<>();

            void truncate(int size) {
                while (list.size() > size) {
                    index.remove(list.remove(list.size() - 1).name());
                }
            }
        }

        private Builder(int qubits, int clbits) {
            this(qubits, clbits, new Variables());
        }

        private Builder(int qubits, int clbits, Variables variables) {
            this.qubits = qubits;
            this.clbits = clbits;
            this.variables = variables;
        }

        /**
         * Records a block with a new builder sharing the variables; if the block's recorder
         * throws, variables it declared are forgotten and nothing is recorded.
         */
        private List<Instruction> block(Consumer<Circuit.Builder> recorder) {
            Objects.requireNonNull(recorder, "block");
            Builder body = new Builder(qubits, clbits, variables);
            int declared = variables.list.size();
            try {
                recorder.accept(body);
            } catch (RuntimeException | Error e) {
                variables.truncate(declared);
                throw e;
            }
            return body.list;
        }

        /** Checks that an expression reads only this circuit's clbits and variables. */
        private void requireExpression(Expression e, String what) {
            Objects.requireNonNull(e, what);
            int c = e.maxClbit();
            if (c >= clbits) {
                throw new IndexOutOfBoundsException("clbit " + c + " read by " + what + " is out"
                        + " of range [0, " + (clbits - 1) + "] for " + clbits
                        + " classical bit(s)");
            }
            if (e.maxSlot() >= variables.list.size()) {
                throw new IllegalArgumentException(what + " reads a variable of another circuit;"
                        + " use the expressions this builder's declare and variable return");
            }
        }

        private void requireCondition(Expression e, String what) {
            requireExpression(e, what);
            if (e.type() == Expression.Type.FLOAT) {
                throw new IllegalArgumentException(what + " " + Checks.excerpt(e.toString())
                        + " is a float; a condition is a bool or an integer (true when"
                        + " non-zero)");
            }
        }

        /**
         * Declares a classical variable and returns the expression that reads it. The variable
         * starts at 0 in every shot; with an {@code initial} value, an assignment is recorded
         * here. Variables belong to the whole circuit, also when declared inside a block.
         *
         * @param name a new name: not blank, no whitespace
         * @param type the type
         * @param width the width in bits for {@code INT} and {@code UINT}, 1 to 64 (ignored for
         *     the other types)
         * @param initial the value to assign now, or {@code null} to leave it 0
         * @return the expression of the variable
         * @throws IllegalArgumentException if the name is in use or bad, the width is out of
         *     range, or the initial value reads unknown clbits or variables
         */
        public Expression declare(String name, VariableType type, int width, Expression initial) {
            Objects.requireNonNull(type, "type");
            int w = type == VariableType.INT || type == VariableType.UINT ? width
                    : type == VariableType.BOOL ? 1 : 64;
            Variable v = new Variable(name, type, w);
            if (variables.index.containsKey(name)) {
                throw new IllegalArgumentException("variable '" + Checks.excerpt(name)
                        + "' is declared already");
            }
            if (initial != null) {
                requireExpression(initial, "the initial value of " + Checks.excerpt(name));
            }
            int slot = variables.list.size();
            variables.list.add(v);
            variables.index.put(name, slot);
            if (initial != null) {
                list.add(Instruction.assignVariable(slot, type, initial));
            }
            return Expression.variable(slot, name, type.expressionType());
        }

        /**
         * Returns the expression that reads a declared variable.
         *
         * @param name the variable's name
         * @return the expression
         * @throws IllegalArgumentException if no variable has this name
         */
        public Expression variable(String name) {
            Objects.requireNonNull(name, "name");
            Integer slot = variables.index.get(name);
            if (slot == null) {
                throw new IllegalArgumentException("no variable is named '"
                        + Checks.excerpt(name) + "'; declare it first");
            }
            Variable v = variables.list.get(slot);
            return Expression.variable(slot, name, v.type().expressionType());
        }

        /**
         * Assigns a value to a variable, converted to its type (see
         * {@link Variable#convert(long, boolean)}).
         *
         * @param name a declared variable
         * @param value the value
         * @return this builder
         * @throws IllegalArgumentException if the variable is unknown or the value reads unknown
         *     clbits or variables
         */
        public Builder assign(String name, Expression value) {
            Expression target = variable(name);
            requireExpression(value, "the value assigned to " + Checks.excerpt(name));
            int slot = target.maxSlot();
            list.add(Instruction.assignVariable(slot, variables.list.get(slot).type(), value));
            return this;
        }

        /**
         * Writes an integer value into classical bits: bit {@code j} of the value goes to
         * {@code clbits[j]} (the others of the value are dropped).
         *
         * @param clbits distinct classical bits, 1 to 63
         * @param value an integer or bool expression
         * @return this builder
         * @throws IndexOutOfBoundsException if a clbit is out of range
         * @throws IllegalArgumentException if a clbit repeats, there are none or too many, or
         *     the value is a float
         */
        public Builder assignClbits(int[] clbits, Expression value) {
            Objects.requireNonNull(clbits, "clbits");
            if (clbits.length < 1 || clbits.length > 63) {
                throw new IllegalArgumentException("an assignment writes 1 to 63 clbits but "
                        + clbits.length + " were given");
            }
            for (int c : clbits) {
                Checks.requireClbit(c, this.clbits);
            }
            Checks.requireDistinctQubits(clbits, this.clbits, "the assigned clbits");
            requireCondition(value, "the value assigned to clbits");
            list.add(Instruction.assignClbits(clbits.clone(), value));
            return this;
        }

        /**
         * Appends a block run only when {@code condition} holds at that point of a shot.
         *
         * @param condition a bool or integer expression (true when non-zero)
         * @param then records the block
         * @return this builder
         * @throws IllegalArgumentException if the condition is a float or reads unknown clbits
         *     or variables
         */
        public Builder ifThen(Expression condition, Consumer<Circuit.Builder> then) {
            return ifThenElse(condition, then, b -> { });
        }

        /**
         * Appends a choice between two blocks on a condition evaluated during the shot.
         *
         * @param condition a bool or integer expression (true when non-zero)
         * @param then records the block run when it holds
         * @param otherwise records the block run when it does not
         * @return this builder
         * @throws IllegalArgumentException if the condition is a float or reads unknown clbits
         *     or variables
         */
        public Builder ifThenElse(Expression condition, Consumer<Circuit.Builder> then,
                Consumer<Circuit.Builder> otherwise) {
            requireCondition(condition, "the condition");
            Objects.requireNonNull(then, "then");
            Objects.requireNonNull(otherwise, "otherwise");
            int declared = variables.list.size();
            List<Instruction> a = block(then);
            List<Instruction> b;
            try {
                b = block(otherwise);
            } catch (RuntimeException | Error e) {
                variables.truncate(declared);
                throw e;
            }
            list.add(Instruction.ifThen(condition, a, b));
            return this;
        }

        /** The most iterations a loop may be given: {@value}. */
        public static final int MAX_ITERATIONS = 1 << 20;

        /**
         * Appends a block run again and again while {@code condition} holds, checked before each
         * run, at most {@code maxIterations} times in one shot (the loop then stops, as a
         * device's control system would).
         *
         * @param condition a bool or integer expression (true when non-zero)
         * @param maxIterations 1 to {@value #MAX_ITERATIONS}
         * @param body records the block
         * @return this builder
         * @throws IllegalArgumentException if the condition is a float or reads unknown clbits
         *     or variables, or the bound is out of range
         */
        public Builder whileLoop(Expression condition, int maxIterations,
                Consumer<Circuit.Builder> body) {
            requireCondition(condition, "the loop condition");
            Checks.requireInRange(maxIterations, 1, MAX_ITERATIONS, "the loop's iteration bound");
            list.add(Instruction.whileLoop(condition, maxIterations, block(body)));
            return this;
        }

        /**
         * Appends a wait on some qubits: no gate, but its duration is kept for noise models
         * that make qubits decay while they wait.
         *
         * @param duration the duration, finite and at least 0 (seconds when read from
         *     OpenQASM)
         * @param qubits distinct qubits; none means all
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is out of range
         * @throws IllegalArgumentException if the duration is negative or not finite, or a qubit
         *     repeats
         */
        public Builder delay(double duration, int... qubits) {
            Checks.requireFiniteTime(duration, "the delay");
            Objects.requireNonNull(qubits, "qubits");
            int[] qs = qubits;
            if (qs.length == 0) {
                qs = new int[this.qubits];
                for (int q = 0; q < qs.length; q++) {
                    qs[q] = q;
                }
            }
            Checks.requireDistinctQubits(qs, this.qubits, "the qubits of the delay");
            list.add(Instruction.delay(duration, qs.clone()));
            return this;
        }

        /**
         * Appends a catalogue gate whose angles are expressions; angles that read clbits or
         * variables are evaluated during each shot (gates with constant angles are recorded as
         * with {@link #gate(Gate, double[], int...)}).
         *
         * @param gate the gate
         * @param angles {@code gate.parameters()} expressions, in radians
         * @param qubits the gate's qubits
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException as for {@link #gate(Gate, double[], int...)}, or if an
         *     angle reads unknown clbits or variables
         */
        public Builder gate(Gate gate, Expression[] angles, int... qubits) {
            return controlled(gate, angles, NONE, qubits);
        }

        /**
         * Appends a controlled catalogue gate whose angles are expressions (see
         * {@link #gate(Gate, Expression[], int...)} and
         * {@link #controlled(Gate, double[], int[], int...)}).
         *
         * @param gate the gate
         * @param angles {@code gate.parameters()} expressions, in radians
         * @param controls the added controls
         * @param qubits the gate's own qubits
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException as for the other forms
         */
        public Builder controlled(Gate gate, Expression[] angles, int[] controls,
                int... qubits) {
            Objects.requireNonNull(gate, "gate");
            Objects.requireNonNull(angles, "angles");
            boolean constant = true;
            double[] values = new double[angles.length];
            for (int i = 0; i < angles.length; i++) {
                requireExpression(angles[i], "angle " + i + " of " + gate.id());
                constant &= angles[i].isConstant();
                if (angles[i].isConstant()) {
                    values[i] = angles[i].constantValue();
                }
            }
            if (constant) {
                return record(gate, values, controls, qubits);
            }
            Objects.requireNonNull(controls, "controls");
            Objects.requireNonNull(qubits, "qubits");
            if (gate == Gate.UNITARY) {
                throw new IllegalArgumentException("unitary has no angles");
            }
            if (angles.length != gate.parameters()) {
                throw new IllegalArgumentException("gate " + gate.id() + " takes "
                        + gate.parameters() + " angle(s) but " + angles.length + " were given");
            }
            if (qubits.length != gate.qubits()) {
                throw new IllegalArgumentException("gate " + gate.id() + " acts on "
                        + gate.qubits() + " qubit(s) but " + qubits.length
                        + " qubit index(es) were given");
            }
            int[] all = concat(controls, qubits);
            Checks.requireDistinctQubits(all, this.qubits, "the qubits of " + gate.id());
            Gate named = gate.withControls(controls.length).orElse(null);
            Gate use = named != null ? named : gate;
            int own = named != null ? named.controls() : controls.length + gate.controls();
            list.add(Instruction.dynamicGate(use, angles.clone(),
                    Arrays.copyOfRange(all, own, all.length), Arrays.copyOf(all, own)));
            return this;
        }

        /**
         * Checks and records a catalogue gate with added controls, recording the controlled
         * form's own entry where it has one.
         */
        private Builder record(Gate gate, double[] angles, int[] extra, int[] qs) {
            Objects.requireNonNull(gate, "gate");
            Objects.requireNonNull(angles, "angles");
            Objects.requireNonNull(extra, "controls");
            Objects.requireNonNull(qs, "qubits");
            if (gate == Gate.UNITARY) {
                throw new IllegalArgumentException("unitary has no fixed matrix; record it with"
                        + " apply(Operator, int...) or controlled(Operator, int[], int...)");
            }
            if (qs.length != gate.qubits()) {
                throw new IllegalArgumentException("gate " + gate.id() + " acts on "
                        + gate.qubits() + " qubit(s) but " + qs.length
                        + " qubit index(es) were given");
            }
            int[] all = concat(extra, qs);
            Checks.requireDistinctQubits(all, qubits, "the qubits of " + gate.id());
            gate.requireAngles(angles);
            double[] a = angles.clone();
            Gate named = gate.withControls(extra.length).orElse(null);
            if (named != null) {
                list.add(Instruction.gate(named, a, named.operator(a),
                        Arrays.copyOfRange(all, named.controls(), all.length),
                        Arrays.copyOf(all, named.controls())));
            } else {
                int own = extra.length + gate.controls();
                list.add(Instruction.gate(gate, a, gate.operator(a),
                        Arrays.copyOfRange(all, own, all.length), Arrays.copyOf(all, own)));
            }
            return this;
        }

        private static int[] concat(int[] a, int[] b) {
            int[] all = Arrays.copyOf(a, a.length + b.length);
            System.arraycopy(b, 0, all, a.length, b.length);
            return all;
        }

        private Builder fixed(Gate gate, int... qs) {
            return record(gate, NO_ANGLES, NONE, qs);
        }

        private Builder turned(Gate gate, double angle, int... qs) {
            return record(gate, new double[] {angle}, NONE, qs);
        }

        /**
         * Appends a catalogue gate without angles, given its qubits (controls first, then
         * targets, as {@link Gate#qubits()} counts them).
         *
         * @param gate the gate, with {@link Gate#parameters()} 0
         * @param qubits distinct qubits, {@code gate.qubits()} of them
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the qubit count is wrong, a qubit repeats, the
         *     gate takes angles, or the gate is {@link Gate#UNITARY}
         */
        public Builder gate(Gate gate, int... qubits) {
            return record(gate, NO_ANGLES, NONE, qubits);
        }

        /**
         * Appends a catalogue gate with its angles, given its qubits (controls first, then
         * targets).
         *
         * @param gate the gate
         * @param angles {@code gate.parameters()} finite angles in radians
         * @param qubits distinct qubits, {@code gate.qubits()} of them
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if a count is wrong, a qubit repeats, an angle is
         *     not finite, or the gate is {@link Gate#UNITARY}
         */
        public Builder gate(Gate gate, double[] angles, int... qubits) {
            return record(gate, angles, NONE, qubits);
        }

        /**
         * Appends a catalogue gate applied only where every one of {@code controls} is 1. A
         * controlled form with an entry of its own is recorded as that entry
         * ({@link Gate#withControls(int)}: {@code X} with one control is {@link Gate#CNOT}).
         *
         * @param gate the gate
         * @param angles {@code gate.parameters()} finite angles in radians
         * @param controls the added control qubits (may be empty)
         * @param qubits the gate's own qubits, {@code gate.qubits()} of them
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if a count is wrong, a qubit repeats among controls
         *     and qubits, an angle is not finite, or the gate is {@link Gate#UNITARY}
         */
        public Builder controlled(Gate gate, double[] angles, int[] controls, int... qubits) {
            return record(gate, angles, controls, qubits);
        }

        /**
         * Appends a Hadamard gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder h(int q) {
            return fixed(Gate.H, q);
        }

        /**
         * Appends a Pauli X (NOT) gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder x(int q) {
            return fixed(Gate.X, q);
        }

        /**
         * Appends a Pauli Y gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder y(int q) {
            return fixed(Gate.Y, q);
        }

        /**
         * Appends a Pauli Z gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder z(int q) {
            return fixed(Gate.Z, q);
        }

        /**
         * Appends an S gate, {@code diag(1, i)}.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder s(int q) {
            return fixed(Gate.S, q);
        }

        /**
         * Appends an S† gate, {@code diag(1, -i)}.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder sDagger(int q) {
            return fixed(Gate.S_DAGGER, q);
        }

        /**
         * Appends a T gate, {@code diag(1, e^{iπ/4})}.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder t(int q) {
            return fixed(Gate.T, q);
        }

        /**
         * Appends a T† gate, {@code diag(1, e^{-iπ/4})}.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder tDagger(int q) {
            return fixed(Gate.T_DAGGER, q);
        }

        /**
         * Appends a square root of X, {@link Gates#SQRT_X}.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder sqrtX(int q) {
            return fixed(Gate.SQRT_X, q);
        }

        /**
         * Appends {@code rx(angle) = exp(-i angle X/2)}.
         *
         * @param q the qubit
         * @param angle radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if {@code angle} is not finite
         */
        public Builder rx(int q, double angle) {
            return turned(Gate.RX, angle, q);
        }

        /**
         * Appends {@code ry(angle) = exp(-i angle Y/2)}.
         *
         * @param q the qubit
         * @param angle radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if {@code angle} is not finite
         */
        public Builder ry(int q, double angle) {
            return turned(Gate.RY, angle, q);
        }

        /**
         * Appends {@code rz(angle) = exp(-i angle Z/2)}.
         *
         * @param q the qubit
         * @param angle radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if {@code angle} is not finite
         */
        public Builder rz(int q, double angle) {
            return turned(Gate.RZ, angle, q);
        }

        /**
         * Appends {@code phase(angle) = diag(1, e^{i angle})}.
         *
         * @param q the qubit
         * @param angle radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if {@code angle} is not finite
         */
        public Builder phase(int q, double angle) {
            return turned(Gate.PHASE, angle, q);
        }

        /**
         * Appends the general single-qubit gate {@code u(θ, φ, λ)},
         * {@link Gates#u(double, double, double)}.
         *
         * @param q the qubit
         * @param theta radians, finite
         * @param phi radians, finite
         * @param lambda radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if an angle is not finite
         */
        public Builder u(int q, double theta, double phi, double lambda) {
            return record(Gate.U, new double[] {theta, phi, lambda}, NONE, new int[] {q});
        }

        /**
         * Appends a controlled NOT.
         *
         * @param control the control qubit
         * @param target the target qubit, not the control
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if {@code control == target}
         */
        public Builder cnot(int control, int target) {
            return fixed(Gate.CNOT, control, target);
        }

        /**
         * Appends a controlled Z, {@link Gates#CZ}.
         *
         * @param a one qubit
         * @param b another qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if {@code a == b}
         */
        public Builder cz(int a, int b) {
            return fixed(Gate.CZ, a, b);
        }

        /**
         * Appends a controlled phase {@code cphase(angle) = diag(1, 1, 1, e^{i angle})} on
         * {@code (control, target)}; the gate is symmetric in its qubits.
         *
         * @param control the control qubit
         * @param target the target qubit
         * @param angle radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the qubits are equal or the angle is not finite
         */
        public Builder cphase(int control, int target, double angle) {
            return turned(Gate.CPHASE, angle, control, target);
        }

        /**
         * Swaps two qubits.
         *
         * @param a one qubit
         * @param b another qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if {@code a == b}
         */
        public Builder swap(int a, int b) {
            return fixed(Gate.SWAP, a, b);
        }

        /**
         * Appends the Ising coupling {@code rzz(angle) = exp(-i angle Z⊗Z/2)}.
         *
         * @param a one qubit
         * @param b another qubit
         * @param angle radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the qubits are equal or the angle is not finite
         */
        public Builder rzz(int a, int b, double angle) {
            return turned(Gate.RZZ, angle, a, b);
        }

        /**
         * Appends a Toffoli gate: flips {@code target} when both controls are 1.
         *
         * @param c1 first control
         * @param c2 second control
         * @param target the target
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if two of the qubits are equal
         */
        public Builder toffoli(int c1, int c2, int target) {
            return fixed(Gate.TOFFOLI, c1, c2, target);
        }

        /**
         * Appends a Fredkin gate: swaps {@code a} and {@code b} when {@code control} is 1.
         *
         * @param control the control
         * @param a one swapped qubit
         * @param b the other swapped qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if two of the qubits are equal
         */
        public Builder fredkin(int control, int a, int b) {
            return fixed(Gate.FREDKIN, control, a, b);
        }

        /**
         * Appends any unitary operator on the given qubits; bit {@code j} of the operator's
         * matrix index is {@code qubits[j]}. An operator equal, entry for entry, to a fixed
         * catalogue gate's matrix ({@link Gates#H}, {@link Gates#CNOT} on (control, target)
         * ...) is recorded as that gate; any other as a {@link Gate#UNITARY}.
         *
         * @param op a unitary operator (within {@value Operator#UNITARY_TOLERANCE})
         * @param qubits distinct qubits, as many as the operator acts on
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the count of qubits does not match the operator,
         *     a qubit repeats, or the operator is not unitary
         */
        public Builder apply(Operator op, int... qubits) {
            return controlled(op, NONE, qubits);
        }

        /**
         * Appends an operator applied to {@code targets} only where every control qubit is 1.
         * As for {@link #apply(Operator, int...)}, an operator equal to a fixed catalogue
         * gate's matrix is recorded as that gate (with the controls added, so {@link Gates#X}
         * with one control is a {@link Gate#CNOT}); any other as a {@link Gate#UNITARY}.
         *
         * @param op a unitary operator (within {@value Operator#UNITARY_TOLERANCE})
         * @param controls control qubits (may be empty)
         * @param targets target qubits, as many as the operator acts on
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the count of targets does not match the operator,
         *     a qubit repeats among controls and targets, or the operator is not unitary
         */
        public Builder controlled(Operator op, int[] controls, int... targets) {
            Objects.requireNonNull(op, "op");
            Objects.requireNonNull(controls, "controls");
            Objects.requireNonNull(targets, "qubits");
            if (targets.length != op.qubits()) {
                throw new IllegalArgumentException("the operator acts on " + op.qubits()
                        + " qubit(s) but " + targets.length + " qubit index(es) were given");
            }
            Checks.requireDistinctQubits(concat(controls, targets), qubits,
                    "the qubits of the operator");
            double err = op.unitarityError();
            if (!(err <= Operator.UNITARY_TOLERANCE)) {
                throw new IllegalArgumentException("the operator is not unitary: the largest entry"
                        + " of |U†U - I| is " + err + " but at most " + Operator.UNITARY_TOLERANCE
                        + " is allowed");
            }
            Gate known = Gate.matching(op).orElse(null);
            if (known != null) {
                return record(known, NO_ANGLES, controls, targets);
            }
            list.add(Instruction.gate(Gate.UNITARY, NO_ANGLES, op, targets.clone(),
                    controls.clone()));
            return this;
        }

        /**
         * Measures one qubit in the computational basis into one classical bit.
         *
         * @param qubit the qubit
         * @param clbit the classical bit that receives the outcome
         * @return this builder
         * @throws IndexOutOfBoundsException if the qubit or clbit is out of range
         */
        public Builder measure(int qubit, int clbit) {
            Checks.requireQubit(qubit, qubits);
            Checks.requireClbit(clbit, clbits);
            list.add(Instruction.measure(qubit, clbit));
            return this;
        }

        /**
         * Measures every qubit {@code k} into classical bit {@code k}.
         *
         * @return this builder
         * @throws IllegalArgumentException if there are fewer classical bits than qubits
         */
        public Builder measure() {
            if (clbits < qubits) {
                throw new IllegalArgumentException("measure() needs at least as many clbits as"
                        + " qubits, but the circuit has " + clbits + " clbit(s) for " + qubits
                        + " qubit(s)");
            }
            for (int q = 0; q < qubits; q++) {
                list.add(Instruction.measure(q, q));
            }
            return this;
        }

        /**
         * Resets a qubit to |0> (measure, then flip if the outcome was 1).
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder reset(int q) {
            Checks.requireQubit(q, qubits);
            list.add(Instruction.reset(q));
            return this;
        }

        /**
         * Appends a block that runs only when classical bit {@code clbit} equals {@code value}
         * at that point of a shot. The block is recorded by {@code then} on a builder with the
         * same qubits and clbits; it counts as one instruction. If {@code then} throws, nothing
         * is recorded.
         *
         * @param clbit the classical bit to test
         * @param value 0 or 1
         * @param then records the conditioned instructions
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code clbit} is out of range
         * @throws IllegalArgumentException if {@code value} is not 0 or 1
         */
        public Builder ifBit(int clbit, int value, Consumer<Circuit.Builder> then) {
            Checks.requireClbit(clbit, clbits);
            Checks.requireBit(value, "the condition value");
            Objects.requireNonNull(then, "then");
            list.add(Instruction.ifBit(clbit, value, block(then)));
            return this;
        }

        /**
         * Appends every instruction of another circuit, qubit {@code k} to qubit {@code k} and
         * clbit {@code k} to clbit {@code k}.
         *
         * @param other a circuit with no more qubits and clbits than this one
         * @return this builder
         * @throws IllegalArgumentException if {@code other} is larger
         */
        public Builder append(Circuit other) {
            Objects.requireNonNull(other, "other");
            if (other.qubits > qubits || other.clbits > clbits) {
                throw new IllegalArgumentException("cannot append a circuit of " + other.qubits
                        + " qubits and " + other.clbits + " clbits to one of " + qubits
                        + " qubits and " + clbits + " clbits");
            }
            if (other.variables.isEmpty()) {
                list.addAll(other.instructions);
                return this;
            }
            for (Variable v : other.variables) {
                if (variables.index.containsKey(v.name())) {
                    throw new IllegalArgumentException("cannot append: variable '"
                            + Checks.excerpt(v.name()) + "' is declared in both circuits");
                }
            }
            int offset = variables.list.size();
            for (Variable v : other.variables) {
                variables.index.put(v.name(), variables.list.size());
                variables.list.add(v);
            }
            for (Instruction in : other.instructions) {
                list.add(in.withSlotOffset(offset));
            }
            return this;
        }

        /**
         * Returns the circuit recorded so far. The builder may go on recording.
         *
         * @return an immutable circuit
         */
        public Circuit build() {
            return new Circuit(qubits, clbits, list, variables.list);
        }
    }
}
