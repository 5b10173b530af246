package dev.qsim.examples;

/**
 * Reads the optional positional arguments of the examples ({@code [seed [shots]]}). Bad input
 * throws {@link UsageException} (an {@link IllegalArgumentException}) with a message naming the
 * value and what is allowed; {@link Main} turns it into a message on standard error and exit
 * code 2.
 */
final class Args {

    /** Largest shot count the examples accept, so that any run stays a few seconds at most. */
    static final int MAX_SHOTS = 1_000_000;

    private Args() {
    }

    /** Refuses more than {@code max} arguments, naming the first extra one and the usage. */
    static void requireAtMost(String[] args, int max, String usage) {
        if (args.length > max) {
            throw new UsageException("unexpected argument '" + args[max]
                    + "'; usage: " + usage);
        }
    }

    /** Returns {@code args[index]} read as a seed (any long), or {@code fallback} if absent. */
    static long seed(String[] args, int index, long fallback) {
        if (index >= args.length) {
            return fallback;
        }
        try {
            return Long.parseLong(args[index].trim());
        } catch (NumberFormatException e) {
            throw new UsageException("seed must be a whole number that fits a Java "
                    + "long (64-bit), got '" + args[index] + "'", e);
        }
    }

    /** Returns {@code args[index]} read as a shot count, or {@code fallback} if absent. */
    static int shots(String[] args, int index, int fallback) {
        if (index >= args.length) {
            return fallback;
        }
        String text = args[index].trim();
        long value;
        try {
            value = Long.parseLong(text);
        } catch (NumberFormatException e) {
            throw new UsageException(shotsRule() + ", got '" + args[index] + "'", e);
        }
        return requireShots(value);
    }

    /** Returns {@code shots} if it is in {@code [1, MAX_SHOTS]}, else throws. */
    static int requireShots(long shots) {
        if (shots < 1 || shots > MAX_SHOTS) {
            throw new UsageException(shotsRule() + ", got " + shots);
        }
        return (int) shots;
    }

    private static String shotsRule() {
        return "shots must be a whole number from 1 to " + MAX_SHOTS;
    }
}
