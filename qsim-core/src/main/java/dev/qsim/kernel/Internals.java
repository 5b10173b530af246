package dev.qsim.kernel;

import org.apache.commons.rng.UniformRandomProvider;

import dev.qsim.Instruction;
import dev.qsim.StateVector;

/**
 * Module-internal access to the engine for the packages of this module other than
 * {@code dev.qsim} (observables, noise, ...): the amplitudes behind a {@link StateVector}, and
 * the kernel choice of an {@link Instruction}. Not exported; not for users.
 */
public final class Internals {
    /** What {@code dev.qsim} lends to the rest of the module. */
    public interface Access {
        /**
         * Returns the amplitudes of a state in double precision: the live storage of a
         * double-precision state, or a widened copy of a single-precision one (so writes to
         * it reach the state only in the first case).
         *
         * @param state the state
         * @return its amplitudes, double storage
         */
        Amplitudes amplitudes(StateVector state);

        /**
         * Wraps storage as a state without copying.
         *
         * @param amplitudes the storage, normalised
         * @param threads the thread count of the new state
         * @return the state
         */
        StateVector wrap(Amplitudes amplitudes, int threads);

        /**
         * Applies one gate instruction with the kernel its shape calls for.
         *
         * @param amplitudes the storage. Modified.
         * @param gate an instruction of kind GATE
         * @param threads threads to use
         */
        void applyGate(Amplitudes amplitudes, Instruction gate, int threads);

        /**
         * Measures one qubit with collapse.
         *
         * @param amplitudes the storage, normalised. Modified.
         * @param qubit the qubit
         * @param rng randomness
         * @param threads threads to use
         * @return 0 or 1
         */
        int measure(Amplitudes amplitudes, int qubit, UniformRandomProvider rng, int threads);
    }

    private static volatile Access access;

    private Internals() {
    }

    /**
     * Registers the access object; called once by {@code dev.qsim}.
     *
     * @param a the access object
     */
    public static void register(Access a) {
        access = a;
    }

    /**
     * Returns the access object.
     *
     * @return the access object lent by {@code dev.qsim}
     */
    public static Access access() {
        Access a = access;
        if (a == null) {
            // Registration happens in StateVector's static initialiser.
            try {
                Class.forName(StateVector.class.getName(), true, StateVector.class.getClassLoader());
            } catch (ClassNotFoundException e) {
                throw new IllegalStateException(e);
            }
            a = access;
        }
        return a;
    }
}
