package dev.qsim.noise;

/** Argument checks of this package; messages give the quantity, the value and what is allowed. */
final class Require {

    private Require() {
    }

    static double probability(double p, String what) {
        if (!(p >= 0 && p <= 1)) {
            throw new IllegalArgumentException(what + " " + p + " is outside [0, 1]");
        }
        return p;
    }

    static double positiveTime(double t, String what) {
        if (!(t > 0)) {
            throw new IllegalArgumentException(what + " " + t
                    + " is not allowed; it must be positive (infinity is allowed)");
        }
        return t;
    }

    static double nonNegativeFiniteTime(double t, String what) {
        if (!(t >= 0) || Double.isInfinite(t)) {
            throw new IllegalArgumentException(what + " " + t
                    + " is not allowed; it must be finite and at least 0");
        }
        return t;
    }

    static void qubit(int q, int qubits) {
        if (q < 0 || q >= qubits) {
            throw new IndexOutOfBoundsException("qubit " + q + " is out of range [0, "
                    + (qubits - 1) + "] for a " + qubits + "-qubit register");
        }
    }

    static void distinctQubits(int[] qs, int qubits, String what) {
        for (int i = 0; i < qs.length; i++) {
            qubit(qs[i], qubits);
            for (int j = 0; j < i; j++) {
                if (qs[i] == qs[j]) {
                    throw new IllegalArgumentException(what + " name qubit " + qs[i]
                            + " twice; they must be distinct");
                }
            }
        }
    }

    static void positiveShots(int shots) {
        if (shots < 1) {
            throw new IllegalArgumentException("shots " + shots + " is not allowed; at least 1");
        }
    }

    static void threads(int threads) {
        if (threads < 1 || threads > 256) {
            throw new IllegalArgumentException("thread count " + threads
                    + " is out of range [1, 256]");
        }
    }
}
