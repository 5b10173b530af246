package dev.qsim;

import java.util.Objects;

import dev.qsim.kernel.Args;

/** Argument checks shared by the public API. Each message names the value and what is allowed. */
final class Checks {
    private Checks() {
    }

    static void requireQubit(int qubit, int qubits) {
        Args.requireQubit(qubit, qubits);
    }

    static void requireClbit(int clbit, int clbits) {
        if (clbit < 0 || clbit >= clbits) {
            throw new IndexOutOfBoundsException(clbits == 0
                    ? "clbit " + clbit + " is out of range: the circuit has no classical bits"
                    : "clbit " + clbit + " is out of range [0, " + (clbits - 1) + "] for "
                            + clbits + " classical bit(s)");
        }
    }

    /** Checks each qubit is in range and no qubit appears twice. */
    static void requireDistinctQubits(int[] qubits, int register, String what) {
        Args.requireDistinctQubits(qubits, register, what);
    }

    static double requireFinite(double x, String name) {
        if (!Double.isFinite(x)) {
            throw new IllegalArgumentException(name + " must be finite but was " + x);
        }
        return x;
    }

    static void requirePositiveShots(int shots) {
        Args.requirePositiveShots(shots);
    }

    static void requireBit(int value, String name) {
        if (value != 0 && value != 1) {
            throw new IllegalArgumentException(name + " must be 0 or 1 but was " + value);
        }
    }

    static void requireInRange(int value, int min, int max, String name) {
        if (value < min || value > max) {
            throw new IllegalArgumentException(name + " must be in [" + min + ", " + max
                    + "] but was " + value);
        }
    }
}
