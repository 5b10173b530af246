package dev.qsim;

import java.util.Objects;

/** Argument checks shared by the public API. Each message names the value and what is allowed. */
final class Checks {
    private Checks() {
    }

    static void requireQubit(int qubit, int qubits) {
        if (qubit < 0 || qubit >= qubits) {
            throw new IndexOutOfBoundsException("qubit " + qubit + " is out of range [0, "
                    + (qubits - 1) + "] for a " + qubits + "-qubit register");
        }
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
        Objects.requireNonNull(qubits, what);
        for (int i = 0; i < qubits.length; i++) {
            requireQubit(qubits[i], register);
            for (int j = 0; j < i; j++) {
                if (qubits[i] == qubits[j]) {
                    throw new IllegalArgumentException("qubit " + qubits[i] + " appears twice in "
                            + what + " " + java.util.Arrays.toString(qubits)
                            + "; each qubit may appear once");
                }
            }
        }
    }

    static double requireFinite(double x, String name) {
        if (!Double.isFinite(x)) {
            throw new IllegalArgumentException(name + " must be finite but was " + x);
        }
        return x;
    }

    static void requirePositiveShots(int shots) {
        if (shots < 1) {
            throw new IllegalArgumentException("shots must be at least 1 but was " + shots);
        }
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
