package dev.qsim.stats;

/** Argument checks with messages naming the quantity, the rule and the value. */
final class Checks {
    private Checks() {
    }

    static void requireOpenUnit(double value, String what) {
        if (!(value > 0 && value < 1)) {
            throw new IllegalArgumentException(what + " must be in (0, 1) but was " + value);
        }
    }

    static void requireAtLeast(long value, long min, String what) {
        if (value < min) {
            throw new IllegalArgumentException(what + " must be at least " + min + " but was "
                    + value);
        }
    }
}
