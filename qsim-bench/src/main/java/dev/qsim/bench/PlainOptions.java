package dev.qsim.bench;

/**
 * The whole-number options of the plain report programs ({@link PrecisionReport},
 * {@link MatrixProductReport}): read and range-checked with messages that name the option.
 */
final class PlainOptions {
    private PlainOptions() {
    }

    /** The value of option {@code name} as a whole number, or a message naming both. */
    static long number(String name, String value) {
        try {
            return Long.parseLong(value);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("option " + name + " needs a whole number but"
                    + " got '" + value + "'", e);
        }
    }

    /** {@code v} if it lies in {@code [lo, hi]}, else a message naming the option and range. */
    static long within(String name, long v, long lo, long hi) {
        if (v < lo || v > hi) {
            throw new IllegalArgumentException("option " + name + " must be in [" + lo + ", " + hi
                    + "] but was " + v);
        }
        return v;
    }
}
