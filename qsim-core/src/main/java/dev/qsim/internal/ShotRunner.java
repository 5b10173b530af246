package dev.qsim.internal;

import java.util.List;

import dev.qsim.Circuit;
import dev.qsim.Expression;
import dev.qsim.Instruction;

/**
 * The one interpreter of a circuit's classical control for engines that run shot by shot: it
 * walks the instructions, keeps the shot's classical bits and variables, evaluates conditions,
 * assignments and gate angles known only during the shot, and hands the quantum work to the
 * engine's {@link Backend}. Runs of consecutive gates known before the shot go to the backend
 * together, so engines can batch them. Internal: this package is not exported.
 */
public final class ShotRunner {
    /** The quantum side of one engine, for one shot. */
    public interface Backend {
        /**
         * Applies gates {@code [from, to)} of a list, all with angles known before the shot.
         *
         * @param list the instructions
         * @param from the first gate
         * @param to one past the last gate
         */
        void gates(List<Instruction> list, int from, int to);

        /**
         * Applies one gate whose angles were evaluated during the shot.
         *
         * @param gate the gate instruction ({@link Instruction#isDynamic()})
         * @param angles its angles, in radians
         */
        void gate(Instruction gate, double[] angles);

        /**
         * Measures the instruction's qubit and returns the bit to record (after any readout
         * error).
         *
         * @param measure the measurement
         * @return the recorded bit
         */
        boolean measure(Instruction measure);

        /**
         * Resets the instruction's qubit to |0>.
         *
         * @param reset the reset
         */
        void reset(Instruction reset);

        /**
         * Lets the instruction's qubits wait (no-op unless the engine models decay).
         *
         * @param delay the delay
         */
        default void delay(Instruction delay) {
        }
    }

    private ShotRunner() {
    }

    /**
     * Runs instructions from index {@code from} on, for one shot.
     *
     * @param list the instructions
     * @param from the first to run
     * @param state the shot's classical state. Modified.
     * @param variables the circuit's variables ({@link Circuit#variables()})
     * @param backend the engine
     */
    public static void run(List<Instruction> list, int from, ClassicalState state,
            List<Circuit.Variable> variables, Backend backend) {
        int i = from;
        while (i < list.size()) {
            Instruction in = list.get(i);
            switch (in.kind()) {
                case GATE: {
                    if (in.isDynamic()) {
                        backend.gate(in, angles(in, state));
                        break;
                    }
                    int j = i + 1;
                    while (j < list.size() && list.get(j).kind() == Instruction.Kind.GATE
                            && !list.get(j).isDynamic()) {
                        j++;
                    }
                    backend.gates(list, i, j);
                    i = j;
                    continue;
                }
                case MEASURE:
                    state.setBit(in.clbit(), backend.measure(in));
                    break;
                case RESET:
                    backend.reset(in);
                    break;
                case DELAY:
                    backend.delay(in);
                    break;
                case IF_BIT:
                    if (state.bit(in.clbit()) == (in.value() == 1)) {
                        run(in.body(), 0, state, variables, backend);
                    }
                    break;
                case IF:
                    run(in.condition().test(state) ? in.body() : in.otherwise(), 0, state,
                            variables, backend);
                    break;
                case WHILE: {
                    int max = in.maxIterations();
                    for (int k = 0; k < max && in.condition().test(state); k++) {
                        run(in.body(), 0, state, variables, backend);
                    }
                    break;
                }
                default:
                    assign(in, state, variables);
                    break;
            }
            i++;
        }
    }

    /**
     * Evaluates the angles of a gate known only during the shot.
     *
     * @param gate a dynamic gate
     * @param state the shot's classical state
     * @return the angles
     * @throws IllegalArgumentException if an angle is not finite
     */
    public static double[] angles(Instruction gate, ClassicalState state) {
        Expression[] e = gate.angleExpressions();
        double[] out = new double[e.length];
        for (int k = 0; k < e.length; k++) {
            out[k] = e[k].evaluateReal(state);
            if (!Double.isFinite(out[k])) {
                throw new IllegalArgumentException("the angle " + e[k] + " of gate '"
                        + gate.name() + "' on qubits " + java.util.Arrays.toString(
                        gate.qubits()) + " came to " + out[k] + " during a shot; angles must"
                        + " be finite");
            }
        }
        return out;
    }

    /**
     * Performs an assignment on a classical state.
     *
     * @param assign an {@link Instruction.Kind#ASSIGN}
     * @param state the state. Modified.
     * @param variables the circuit's variables
     */
    public static void assign(Instruction assign, ClassicalState state,
            List<Circuit.Variable> variables) {
        Expression value = assign.assignedValue();
        if (assign.variable() >= 0) {
            boolean real = value.type() == Expression.Type.FLOAT;
            long raw = real ? Double.doubleToRawLongBits(value.evaluateReal(state))
                    : value.evaluateInteger(state);
            state.setVariable(assign.variable(),
                    variables.get(assign.variable()).convert(raw, real));
            return;
        }
        long v = value.evaluateInteger(state);
        int[] bits = assign.assignedClbits();
        for (int j = 0; j < bits.length; j++) {
            state.setBit(bits[j], ((v >>> j) & 1L) != 0);
        }
    }
}
