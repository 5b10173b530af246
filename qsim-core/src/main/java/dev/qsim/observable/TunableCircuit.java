package dev.qsim.observable;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

import dev.qsim.Circuit;
import dev.qsim.Operator;

/**
 * A circuit of gates whose rotation angles may depend on named parameters: each such angle is
 * {@code scale · θ + offset} for one parameter {@code θ}. Binding a value to every parameter
 * gives a plain {@link Circuit}, gate for gate. Immutable and thread-safe.
 *
 * <p>Parameters are declared by first use in the builder, and {@link #parameters()} lists them
 * in that order; {@link #bind(double...)} takes values in that order and
 * {@link #bind(Map)} by name. A parameter may appear in many gates (its gradient sums over
 * them). Parameterised gates are {@code rx, ry, rz, phase} on one qubit and {@code cphase, rzz}
 * on two, with the angle conventions of {@link dev.qsim}.
 *
 * @since 0.2
 */
public final class TunableCircuit {
    /** The gates whose angle may be a parameter. */
    enum Rotation {
        RX, RY, RZ, PHASE, CPHASE, RZZ
    }

    /** One recorded gate: fixed (param -1, angle or operator given) or parameterised. */
    static final class Step {
        final String gate;
        final int[] qubits;
        final double angle;
        final Operator op;
        final Rotation rotation;
        final int param;
        final double scale;
        final double offset;

        Step(String gate, int[] qubits, double angle, Operator op, Rotation rotation, int param,
                double scale, double offset) {
            this.gate = gate;
            this.qubits = qubits;
            this.angle = angle;
            this.op = op;
            this.rotation = rotation;
            this.param = param;
            this.scale = scale;
            this.offset = offset;
        }
    }

    private final int qubits;
    private final List<String> parameters;
    private final List<Step> steps;

    private TunableCircuit(int qubits, List<String> parameters, List<Step> steps) {
        this.qubits = qubits;
        this.parameters = List.copyOf(parameters);
        this.steps = List.copyOf(steps);
    }

    /**
     * Returns a builder for a circuit on {@code qubits} qubits (no classical bits).
     *
     * @param qubits the qubit count, as for {@link Circuit#builder(int)}
     * @return a new builder
     * @throws IllegalArgumentException if the qubit count is out of range
     */
    public static Builder builder(int qubits) {
        return new Builder(qubits);
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
     * Returns the parameter names in declared order (order of first use).
     *
     * @return an unmodifiable list
     */
    public List<String> parameters() {
        return parameters;
    }

    /**
     * Returns the number of gates.
     *
     * @return the gate count
     */
    public int size() {
        return steps.size();
    }

    List<Step> steps() {
        return steps;
    }

    /**
     * Returns the plain circuit with parameter {@code j} set to {@code values[j]}, in the order
     * of {@link #parameters()}.
     *
     * @param values one finite value per parameter
     * @return the bound circuit, one instruction per gate of this circuit
     * @throws IllegalArgumentException if the count of values differs from the parameter count
     *     or a value is not finite
     */
    public Circuit bind(double... values) {
        Objects.requireNonNull(values, "values");
        if (values.length != parameters.size()) {
            throw new IllegalArgumentException("the circuit has " + parameters.size()
                    + " parameter(s) " + parameters + " but " + values.length
                    + " value(s) were given");
        }
        for (int j = 0; j < values.length; j++) {
            if (!Double.isFinite(values[j])) {
                throw new IllegalArgumentException("the value of parameter '" + parameters.get(j)
                        + "' must be finite but was " + values[j]);
            }
        }
        return bind(values, -1, 0);
    }

    /**
     * Returns the plain circuit with each parameter set to the value of its name.
     *
     * @param values a finite value for every parameter, and no other names
     * @return the bound circuit
     * @throws IllegalArgumentException if a name is not a parameter of this circuit, a
     *     parameter has no value, or a value is null or not finite
     */
    public Circuit bind(Map<String, Double> values) {
        Objects.requireNonNull(values, "values");
        for (String name : values.keySet()) {
            if (!parameters.contains(name)) {
                throw new IllegalArgumentException("unknown parameter '" + name
                        + "'; the circuit's parameters are " + parameters);
            }
        }
        double[] v = new double[parameters.size()];
        for (int j = 0; j < v.length; j++) {
            Double d = values.get(parameters.get(j));
            if (d == null) {
                throw new IllegalArgumentException("parameter '" + parameters.get(j)
                        + "' has no value; every one of " + parameters + " must be bound");
            }
            v[j] = d;
        }
        return bind(v);
    }

    /** Binds with the angle of step {@code shifted} (if >= 0) moved by {@code shift}. */
    Circuit bind(double[] values, int shifted, double shift) {
        Circuit.Builder b = Circuit.builder(qubits, 0);
        for (int k = 0; k < steps.size(); k++) {
            Step s = steps.get(k);
            double a = s.param < 0 ? s.angle : s.scale * values[s.param] + s.offset;
            if (k == shifted) {
                a += shift;
            }
            record(b, s, a);
        }
        return b.build();
    }

    /** Records one step with its angle into a plain builder. */
    static void record(Circuit.Builder b, Step s, double a) {
        int[] q = s.qubits;
        switch (s.gate) {
            case "h" -> b.h(q[0]);
            case "x" -> b.x(q[0]);
            case "y" -> b.y(q[0]);
            case "z" -> b.z(q[0]);
            case "s" -> b.s(q[0]);
            case "sDagger" -> b.sDagger(q[0]);
            case "t" -> b.t(q[0]);
            case "tDagger" -> b.tDagger(q[0]);
            case "sqrtX" -> b.sqrtX(q[0]);
            case "rx" -> b.rx(q[0], a);
            case "ry" -> b.ry(q[0], a);
            case "rz" -> b.rz(q[0], a);
            case "phase" -> b.phase(q[0], a);
            case "cnot" -> b.cnot(q[0], q[1]);
            case "cz" -> b.cz(q[0], q[1]);
            case "swap" -> b.swap(q[0], q[1]);
            case "cphase" -> b.cphase(q[0], q[1], a);
            case "rzz" -> b.rzz(q[0], q[1], a);
            case "toffoli" -> b.toffoli(q[0], q[1], q[2]);
            default -> b.apply(s.op, q);
        }
    }

    /**
     * Returns a one-line summary, such as {@code "TunableCircuit[4 qubits, 12 gates,
     * parameters [a, b]]"}.
     *
     * @return the summary
     */
    @Override
    public String toString() {
        return "TunableCircuit[" + qubits + " qubits, " + steps.size() + " gates, parameters "
                + parameters + "]";
    }

    /**
     * Records gates of a {@link TunableCircuit}; the gate methods mirror
     * {@link Circuit.Builder} and check their arguments the same way. Mutable, not thread-safe.
     */
    public static final class Builder {
        private final int qubits;
        private final Circuit.Builder check;
        private final Map<String, Integer> index = new LinkedHashMap<>();
        private final List<Step> steps = new ArrayList<>();

        private Builder(int qubits) {
            this.check = Circuit.builder(qubits, 0);
            this.qubits = qubits;
        }

        private Builder fixed(String gate, double angle, Operator op, int... q) {
            Step s = new Step(gate, q.clone(), angle, op, null, -1, 0, 0);
            record(check, s, angle); // validates qubits, angle and operator
            steps.add(s);
            return this;
        }

        private Builder tunable(String gate, Rotation r, String name, double scale,
                double offset, int... q) {
            Require.name(name);
            Require.finite(scale, "the scale of parameter '" + name + "'");
            Require.finite(offset, "the offset of parameter '" + name + "'");
            Step s = new Step(gate, q.clone(), 0, null, r, -1, scale, offset);
            record(check, s, 0);
            Integer j = index.get(name);
            if (j == null) {
                j = index.size();
                index.put(name, j);
            }
            steps.add(new Step(gate, q.clone(), 0, null, r, j, scale, offset));
            return this;
        }

        /**
         * Appends a Hadamard gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder h(int q) {
            return fixed("h", 0, null, q);
        }

        /**
         * Appends a Pauli X gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder x(int q) {
            return fixed("x", 0, null, q);
        }

        /**
         * Appends a Pauli Y gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder y(int q) {
            return fixed("y", 0, null, q);
        }

        /**
         * Appends a Pauli Z gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder z(int q) {
            return fixed("z", 0, null, q);
        }

        /**
         * Appends an S gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder s(int q) {
            return fixed("s", 0, null, q);
        }

        /**
         * Appends an S† gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder sDagger(int q) {
            return fixed("sDagger", 0, null, q);
        }

        /**
         * Appends a T gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder t(int q) {
            return fixed("t", 0, null, q);
        }

        /**
         * Appends a T† gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder tDagger(int q) {
            return fixed("tDagger", 0, null, q);
        }

        /**
         * Appends a square root of X.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder sqrtX(int q) {
            return fixed("sqrtX", 0, null, q);
        }

        /**
         * Appends {@code rx(angle)} with a fixed angle.
         *
         * @param q the qubit
         * @param angle radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if the angle is not finite
         */
        public Builder rx(int q, double angle) {
            return fixed("rx", angle, null, q);
        }

        /**
         * Appends {@code ry(angle)} with a fixed angle.
         *
         * @param q the qubit
         * @param angle radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if the angle is not finite
         */
        public Builder ry(int q, double angle) {
            return fixed("ry", angle, null, q);
        }

        /**
         * Appends {@code rz(angle)} with a fixed angle.
         *
         * @param q the qubit
         * @param angle radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if the angle is not finite
         */
        public Builder rz(int q, double angle) {
            return fixed("rz", angle, null, q);
        }

        /**
         * Appends {@code phase(angle)} with a fixed angle.
         *
         * @param q the qubit
         * @param angle radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if the angle is not finite
         */
        public Builder phase(int q, double angle) {
            return fixed("phase", angle, null, q);
        }

        /**
         * Appends {@code rx(θ)} for parameter {@code θ}.
         *
         * @param q the qubit
         * @param name the parameter name, not blank, no whitespace
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if the name is blank or has whitespace
         */
        public Builder rx(int q, String name) {
            return rx(q, name, 1, 0);
        }

        /**
         * Appends {@code rx(scale·θ + offset)} for parameter {@code θ}.
         *
         * @param q the qubit
         * @param name the parameter name, not blank, no whitespace
         * @param scale a finite factor
         * @param offset a finite angle in radians
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if the name is blank or has whitespace, or the scale
         *     or offset is not finite
         */
        public Builder rx(int q, String name, double scale, double offset) {
            return tunable("rx", Rotation.RX, name, scale, offset, q);
        }

        /**
         * Appends {@code ry(θ)} for parameter {@code θ}.
         *
         * @param q the qubit
         * @param name the parameter name, not blank, no whitespace
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if the name is blank or has whitespace
         */
        public Builder ry(int q, String name) {
            return ry(q, name, 1, 0);
        }

        /**
         * Appends {@code ry(scale·θ + offset)} for parameter {@code θ}.
         *
         * @param q the qubit
         * @param name the parameter name, not blank, no whitespace
         * @param scale a finite factor
         * @param offset a finite angle in radians
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if the name is blank or has whitespace, or the scale
         *     or offset is not finite
         */
        public Builder ry(int q, String name, double scale, double offset) {
            return tunable("ry", Rotation.RY, name, scale, offset, q);
        }

        /**
         * Appends {@code rz(θ)} for parameter {@code θ}.
         *
         * @param q the qubit
         * @param name the parameter name, not blank, no whitespace
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if the name is blank or has whitespace
         */
        public Builder rz(int q, String name) {
            return rz(q, name, 1, 0);
        }

        /**
         * Appends {@code rz(scale·θ + offset)} for parameter {@code θ}.
         *
         * @param q the qubit
         * @param name the parameter name, not blank, no whitespace
         * @param scale a finite factor
         * @param offset a finite angle in radians
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if the name is blank or has whitespace, or the scale
         *     or offset is not finite
         */
        public Builder rz(int q, String name, double scale, double offset) {
            return tunable("rz", Rotation.RZ, name, scale, offset, q);
        }

        /**
         * Appends {@code phase(θ)} for parameter {@code θ}.
         *
         * @param q the qubit
         * @param name the parameter name, not blank, no whitespace
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if the name is blank or has whitespace
         */
        public Builder phase(int q, String name) {
            return phase(q, name, 1, 0);
        }

        /**
         * Appends {@code phase(scale·θ + offset)} for parameter {@code θ}.
         *
         * @param q the qubit
         * @param name the parameter name, not blank, no whitespace
         * @param scale a finite factor
         * @param offset a finite angle in radians
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         * @throws IllegalArgumentException if the name is blank or has whitespace, or the scale
         *     or offset is not finite
         */
        public Builder phase(int q, String name, double scale, double offset) {
            return tunable("phase", Rotation.PHASE, name, scale, offset, q);
        }

        /**
         * Appends a controlled NOT.
         *
         * @param control the control qubit
         * @param target the target qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if {@code control == target}
         */
        public Builder cnot(int control, int target) {
            return fixed("cnot", 0, null, control, target);
        }

        /**
         * Appends a controlled Z.
         *
         * @param a one qubit
         * @param b another qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if {@code a == b}
         */
        public Builder cz(int a, int b) {
            return fixed("cz", 0, null, a, b);
        }

        /**
         * Appends a swap.
         *
         * @param a one qubit
         * @param b another qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if {@code a == b}
         */
        public Builder swap(int a, int b) {
            return fixed("swap", 0, null, a, b);
        }

        /**
         * Appends a Toffoli gate.
         *
         * @param c1 first control
         * @param c2 second control
         * @param target the target
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if two of the qubits are equal
         */
        public Builder toffoli(int c1, int c2, int target) {
            return fixed("toffoli", 0, null, c1, c2, target);
        }

        /**
         * Appends {@code cphase(angle)} with a fixed angle.
         *
         * @param control the control qubit
         * @param target the target qubit
         * @param angle radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the qubits are equal or the angle is not finite
         */
        public Builder cphase(int control, int target, double angle) {
            return fixed("cphase", angle, null, control, target);
        }

        /**
         * Appends {@code cphase(θ)} for parameter {@code θ}.
         *
         * @param control the control qubit
         * @param target the target qubit
         * @param name the parameter name, not blank, no whitespace
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the qubits are equal or the name is bad
         */
        public Builder cphase(int control, int target, String name) {
            return cphase(control, target, name, 1, 0);
        }

        /**
         * Appends {@code cphase(scale·θ + offset)} for parameter {@code θ}.
         *
         * @param control the control qubit
         * @param target the target qubit
         * @param name the parameter name, not blank, no whitespace
         * @param scale a finite factor
         * @param offset a finite angle in radians
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the qubits are equal, the name is bad, or the
         *     scale or offset is not finite
         */
        public Builder cphase(int control, int target, String name, double scale,
                double offset) {
            return tunable("cphase", Rotation.CPHASE, name, scale, offset, control, target);
        }

        /**
         * Appends {@code rzz(angle)} with a fixed angle.
         *
         * @param a one qubit
         * @param b another qubit
         * @param angle radians, finite
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the qubits are equal or the angle is not finite
         */
        public Builder rzz(int a, int b, double angle) {
            return fixed("rzz", angle, null, a, b);
        }

        /**
         * Appends {@code rzz(θ)} for parameter {@code θ}.
         *
         * @param a one qubit
         * @param b another qubit
         * @param name the parameter name, not blank, no whitespace
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the qubits are equal or the name is bad
         */
        public Builder rzz(int a, int b, String name) {
            return rzz(a, b, name, 1, 0);
        }

        /**
         * Appends {@code rzz(scale·θ + offset)} for parameter {@code θ}.
         *
         * @param a one qubit
         * @param b another qubit
         * @param name the parameter name, not blank, no whitespace
         * @param scale a finite factor
         * @param offset a finite angle in radians
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the qubits are equal, the name is bad, or the
         *     scale or offset is not finite
         */
        public Builder rzz(int a, int b, String name, double scale, double offset) {
            return tunable("rzz", Rotation.RZZ, name, scale, offset, a, b);
        }

        /**
         * Appends any unitary operator, as {@link Circuit.Builder#apply(Operator, int...)}.
         *
         * @param op a unitary operator
         * @param qubits distinct qubits, as many as the operator acts on
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the operator does not fit or is not unitary
         */
        public Builder apply(Operator op, int... qubits) {
            Objects.requireNonNull(op, "op");
            Objects.requireNonNull(qubits, "qubits");
            return fixed("apply", 0, op, qubits);
        }

        /**
         * Returns the circuit recorded so far.
         *
         * @return the circuit
         */
        public TunableCircuit build() {
            return new TunableCircuit(qubits, new ArrayList<>(index.keySet()), steps);
        }
    }
}
