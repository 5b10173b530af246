package dev.qsim.observable;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Operator;
import dev.qsim.internal.Checks;

/**
 * A circuit of gates whose rotation angles may depend on named parameters: each such angle is
 * {@code scale · θ + offset} for one parameter {@code θ}. Binding a value to every parameter
 * gives a plain {@link Circuit}, gate for gate. Immutable and thread-safe.
 *
 * <p>Parameters are declared by first use in the builder, and {@link #parameters()} lists them
 * in that order; {@link #bind(double...)} takes values in that order and
 * {@link #bind(Map)} by name. A parameter may appear in many gates (its gradient sums over
 * them). A parameter may drive any catalogue gate with a {@linkplain Gate#generator()
 * generator} (rx, ry, rz, phase, cphase, rzz), with the angle conventions of
 * {@link dev.qsim}; every other catalogue gate and any unitary may appear with fixed angles.
 *
 * @since 0.1
 */
public final class TunableCircuit {
    /** One recorded gate: fixed (param -1, angles or operator given) or driven by a parameter. */
    static final class Step {
        final Gate gate;
        final int[] qubits;
        final double[] angles;
        final Operator op;
        final int param;
        final double scale;
        final double offset;

        Step(Gate gate, int[] qubits, double[] angles, Operator op, int param, double scale,
                double offset) {
            this.gate = gate;
            this.qubits = qubits;
            this.angles = angles;
            this.op = op;
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
     * Returns the parameter names in order of declaration.
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
     * Returns the plain circuit for the given parameter values, in declared order.
     *
     * @param values one finite value per parameter
     * @return the circuit, gate for gate
     * @throws IllegalArgumentException if the count is wrong or a value is not finite
     */
    public Circuit bind(double... values) {
        Objects.requireNonNull(values, "values");
        if (values.length != parameters.size()) {
            throw new IllegalArgumentException("the circuit has " + parameters.size()
                    + " parameter(s) " + Checks.excerpt(parameters.toString()) + " but "
                    + values.length + " value(s) were given");
        }
        for (int j = 0; j < values.length; j++) {
            if (!Double.isFinite(values[j])) {
                throw new IllegalArgumentException("the value of parameter '"
                        + Checks.excerpt(parameters.get(j)) + "' must be finite but was "
                        + values[j]);
            }
        }
        return bind(values, -1, 0);
    }

    /**
     * Returns the plain circuit for parameter values given by name.
     *
     * @param values a value for every parameter, finite
     * @return the circuit
     * @throws IllegalArgumentException if a name is unknown or missing, or a value is not
     *     finite
     */
    public Circuit bind(Map<String, Double> values) {
        Objects.requireNonNull(values, "values");
        for (String name : values.keySet()) {
            if (!parameters.contains(name)) {
                throw new IllegalArgumentException("unknown parameter '" + Checks.excerpt(name)
                        + "'; the circuit's parameters are "
                        + Checks.excerpt(parameters.toString()));
            }
        }
        double[] v = new double[parameters.size()];
        for (int j = 0; j < v.length; j++) {
            Double d = values.get(parameters.get(j));
            if (d == null) {
                throw new IllegalArgumentException("parameter '" + Checks.excerpt(
                        parameters.get(j)) + "' has no value; every parameter must be bound");
            }
            v[j] = d;
        }
        return bind(v);
    }

    /** Binds values, adding {@code shift} to the angle of step {@code shifted} (-1: none). */
    Circuit bind(double[] values, int shifted, double shift) {
        Circuit.Builder b = Circuit.builder(qubits, 0);
        for (int k = 0; k < steps.size(); k++) {
            Step s = steps.get(k);
            double[] a = s.angles;
            if (s.param >= 0 || k == shifted) {
                a = a.clone();
                if (s.param >= 0) {
                    a[0] = s.scale * values[s.param] + s.offset;
                }
                if (k == shifted) {
                    a[0] += shift;
                }
            }
            record(b, s, a);
        }
        return b.build();
    }

    private static void record(Circuit.Builder b, Step s, double[] angles) {
        if (s.gate == Gate.UNITARY) {
            b.apply(s.op, s.qubits);
        } else {
            b.gate(s.gate, angles, s.qubits);
        }
    }

    /**
     * Returns a short description with the qubit and gate counts and the parameters.
     *
     * @return the description
     */
    @Override
    public String toString() {
        return "TunableCircuit[" + qubits + " qubits, " + steps.size() + " gates, parameters "
                + Checks.excerpt(parameters.toString()) + "]";
    }

    /**
     * Records the gates of a {@link TunableCircuit}; every call checks its arguments before it
     * records anything. Mutable; not thread-safe.
     *
     * @since 0.1
     */
    public static final class Builder {
        private static final double[] NO_ANGLES = new double[0];

        private final int qubits;
        private final Circuit.Builder check;
        private final Map<String, Integer> index = new LinkedHashMap<>();
        private final List<Step> steps = new ArrayList<>();

        private Builder(int qubits) {
            this.check = Circuit.builder(qubits, 0);
            this.qubits = qubits;
        }

        /**
         * Appends a catalogue gate with fixed angles (none for gates without), as
         * {@link Circuit.Builder#gate(Gate, double[], int...)}.
         *
         * @param gate the gate, not {@link Gate#UNITARY}
         * @param angles {@code gate.parameters()} finite angles in radians
         * @param qubits the gate's qubits, controls first
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the gate does not fit its qubits or angles
         */
        public Builder gate(Gate gate, double[] angles, int... qubits) {
            Objects.requireNonNull(gate, "gate");
            Objects.requireNonNull(angles, "angles");
            Objects.requireNonNull(qubits, "qubits");
            Step s = new Step(gate, qubits.clone(), angles.clone(), null, -1, 0, 0);
            record(check, s, s.angles); // validates qubits and angles
            steps.add(s);
            return this;
        }

        /**
         * Appends a one-angle catalogue gate driven by parameter {@code θ}: its angle is
         * {@code scale·θ + offset}. The gate needs a {@linkplain Gate#generator() generator}.
         *
         * @param gate the gate: rx, ry, rz, phase, cphase or rzz
         * @param name the parameter name, not blank, no whitespace
         * @param scale a finite factor
         * @param offset a finite angle in radians
         * @param qubits the gate's qubits
         * @return this builder
         * @throws IndexOutOfBoundsException if a qubit is not in the circuit
         * @throws IllegalArgumentException if the gate has no generator, the qubits do not fit,
         *     the name is bad, or the scale or offset is not finite
         */
        public Builder gate(Gate gate, String name, double scale, double offset,
                int... qubits) {
            Objects.requireNonNull(gate, "gate");
            Objects.requireNonNull(qubits, "qubits");
            if (gate.generator().isEmpty()) {
                throw new IllegalArgumentException("gate " + gate.id() + " cannot take a"
                        + " parameter; parameters drive rx, ry, rz, phase, cphase and rzz");
            }
            Checks.requireName(name, "a parameter name");
            Checks.requireFinite(scale, "the scale of parameter '" + Checks.excerpt(name) + "'");
            Checks.requireFinite(offset, "the offset of parameter '" + Checks.excerpt(name)
                    + "'");
            Step probe = new Step(gate, qubits.clone(), new double[] {0}, null, -1, 0, 0);
            record(check, probe, probe.angles);
            Integer j = index.get(name);
            if (j == null) {
                j = index.size();
                index.put(name, j);
            }
            steps.add(new Step(gate, probe.qubits, probe.angles, null, j, scale, offset));
            return this;
        }

        private Builder fixed(Gate gate, int... q) {
            return gate(gate, NO_ANGLES, q);
        }

        private Builder turned(Gate gate, double angle, int... q) {
            return gate(gate, new double[] {angle}, q);
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
         * Appends a Pauli X gate.
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
         * Appends an S gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder s(int q) {
            return fixed(Gate.S, q);
        }

        /**
         * Appends an S† gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder sDagger(int q) {
            return fixed(Gate.S_DAGGER, q);
        }

        /**
         * Appends a T gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder t(int q) {
            return fixed(Gate.T, q);
        }

        /**
         * Appends a T† gate.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder tDagger(int q) {
            return fixed(Gate.T_DAGGER, q);
        }

        /**
         * Appends a square root of X.
         *
         * @param q the qubit
         * @return this builder
         * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the circuit
         */
        public Builder sqrtX(int q) {
            return fixed(Gate.SQRT_X, q);
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
            return turned(Gate.RX, angle, q);
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
            return turned(Gate.RY, angle, q);
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
            return turned(Gate.RZ, angle, q);
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
            return turned(Gate.PHASE, angle, q);
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
            return gate(Gate.RX, name, scale, offset, q);
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
            return gate(Gate.RY, name, scale, offset, q);
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
            return gate(Gate.RZ, name, scale, offset, q);
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
            return gate(Gate.PHASE, name, scale, offset, q);
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
            return fixed(Gate.CNOT, control, target);
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
            return fixed(Gate.CZ, a, b);
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
            return fixed(Gate.SWAP, a, b);
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
            return fixed(Gate.TOFFOLI, c1, c2, target);
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
            return turned(Gate.CPHASE, angle, control, target);
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
            return gate(Gate.CPHASE, name, scale, offset, control, target);
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
            return turned(Gate.RZZ, angle, a, b);
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
            return gate(Gate.RZZ, name, scale, offset, a, b);
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
            Step s = new Step(Gate.UNITARY, qubits.clone(), NO_ANGLES, op, -1, 0, 0);
            record(check, s, NO_ANGLES);
            steps.add(s);
            return this;
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
