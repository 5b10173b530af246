package dev.qsim.observable;

import java.util.Objects;

/** Argument checks of this package; each message names the value and what is allowed. */
final class Require {
    private Require() {
    }

    static double finite(double x, String name) {
        if (!Double.isFinite(x)) {
            throw new IllegalArgumentException(name + " must be finite but was " + x);
        }
        return x;
    }

    static int atLeast(int value, int min, String name) {
        if (value < min) {
            throw new IllegalArgumentException(name + " must be at least " + min + " but was "
                    + value);
        }
        return value;
    }

    /** Checks that an observable or Pauli product fits on a state of {@code qubits} qubits. */
    static void fits(int span, int qubits, Object what) {
        if (span > qubits) {
            throw new IllegalArgumentException("qubit " + (span - 1) + " of " + what
                    + " is out of range [0, " + (qubits - 1) + "] for a " + qubits
                    + "-qubit state");
        }
    }

    static String name(String name) {
        Objects.requireNonNull(name, "parameter name");
        if (name.isBlank()) {
            throw new IllegalArgumentException("a parameter name must not be blank but was '"
                    + name + "'");
        }
        for (int i = 0; i < name.length(); i++) {
            if (Character.isWhitespace(name.charAt(i))) {
                throw new IllegalArgumentException("a parameter name must not contain whitespace"
                        + " but was '" + name + "'");
            }
        }
        return name;
    }
}
