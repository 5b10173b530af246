package dev.qsim.stabilizer;

import dev.qsim.kernel.Args;

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

    static void requireDistinct(int a, int b, int qubits, String gate) {
        Args.requireQubit(a, qubits);
        Args.requireQubit(b, qubits);
        if (a == b) {
            throw new IllegalArgumentException("qubit " + a + " appears twice in the qubits of "
                    + gate + "; each qubit may appear once");
        }
    }

}
