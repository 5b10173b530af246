package dev.qsim.kernel;

import java.util.Arrays;
import java.util.Objects;

/**
 * The argument checks that every package of the module shares (qubit indices, shots,
 * threads). Each message names the bad value and what is allowed. Module-internal; not
 * exported.
 */
public final class Args {
    private Args() {
    }

    /**
     * Checks a qubit index.
     *
     * @param qubit the index
     * @param qubits the register size
     * @throws IndexOutOfBoundsException if the index is outside {@code [0, qubits)}
     */
    public static void requireQubit(int qubit, int qubits) {
        if (qubit < 0 || qubit >= qubits) {
            throw new IndexOutOfBoundsException("qubit " + qubit + " is out of range [0, "
                    + (qubits - 1) + "] for a " + qubits + "-qubit register");
        }
    }

    /**
     * Checks that each qubit is in range and none appears twice.
     *
     * @param qubits the indices
     * @param register the register size
     * @param what what the qubits are for, for the message
     * @throws IndexOutOfBoundsException if an index is out of range
     * @throws IllegalArgumentException if an index repeats
     */
    public static void requireDistinctQubits(int[] qubits, int register, String what) {
        Objects.requireNonNull(qubits, what);
        for (int i = 0; i < qubits.length; i++) {
            requireQubit(qubits[i], register);
            for (int j = 0; j < i; j++) {
                if (qubits[i] == qubits[j]) {
                    throw new IllegalArgumentException("qubit " + qubits[i] + " appears twice in "
                            + what + " " + Arrays.toString(qubits) + "; each qubit may appear once");
                }
            }
        }
    }

    /**
     * Checks a shot count.
     *
     * @param shots the count
     * @throws IllegalArgumentException if it is below 1
     */
    public static void requirePositiveShots(int shots) {
        if (shots < 1) {
            throw new IllegalArgumentException("shots must be at least 1 but was " + shots);
        }
    }

    /**
     * Checks a thread count.
     *
     * @param threads the count
     * @throws IllegalArgumentException if it is outside {@code [1, }{@value Parallel#MAX_THREADS}]
     */
    public static void requireThreads(int threads) {
        if (threads < 1 || threads > Parallel.MAX_THREADS) {
            throw new IllegalArgumentException("thread count must be in [1, "
                    + Parallel.MAX_THREADS + "] but was " + threads);
        }
    }
}
