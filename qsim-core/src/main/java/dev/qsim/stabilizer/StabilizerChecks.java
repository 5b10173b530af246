package dev.qsim.stabilizer;

/** Argument checks of this package. Each message names the value and what is allowed. */
final class StabilizerChecks {
    private StabilizerChecks() {
    }

    static void requireQubitCount(int n, int max) {
        if (n < 1 || n > max) {
            throw new IllegalArgumentException("qubit count must be in [1, " + max + "] but was "
                    + n);
        }
    }

    static void requireQubit(int qubit, int qubits) {
        if (qubit < 0 || qubit >= qubits) {
            throw new IndexOutOfBoundsException("qubit " + qubit + " is out of range [0, "
                    + (qubits - 1) + "] for a " + qubits + "-qubit register");
        }
    }

    static void requireDistinct(int a, int b, int qubits, String gate) {
        requireQubit(a, qubits);
        requireQubit(b, qubits);
        if (a == b) {
            throw new IllegalArgumentException("qubit " + a + " appears twice in the qubits of "
                    + gate + "; each qubit may appear once");
        }
    }

    static void requirePositiveShots(int shots) {
        if (shots < 1) {
            throw new IllegalArgumentException("shots must be at least 1 but was " + shots);
        }
    }
}
