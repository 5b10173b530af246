package dev.qsim.examples;

import java.io.PrintStream;
import java.util.Locale;

import org.apache.commons.numbers.complex.Complex;

/**
 * Small text helpers shared by the examples: bars, bitstrings and number formats, all plain
 * ASCII. (Circuit drawings, {@code Circuit.diagram()}, use the textbook symbols ●, ⊕ and ×;
 * {@link Main#main} writes UTF-8 unless the console can show them in its own encoding.)
 */
final class Text {

    /** Width, in characters, of the longest bar in a chart. */
    static final int BAR_WIDTH = 40;

    private Text() {
    }

    /**
     * Returns a bar of '#' whose length is {@code value / max} of {@link #BAR_WIDTH}, rounded,
     * and at least one character for any positive value.
     */
    static String bar(double value, double max) {
        if (!(value > 0) || !(max > 0)) {
            return "";
        }
        int length = (int) Math.round(BAR_WIDTH * value / max);
        return "#".repeat(Math.max(1, Math.min(BAR_WIDTH, length)));
    }

    /** Returns {@code value} as a bitstring of {@code width} characters, highest bit leftmost. */
    static String bits(long value, int width) {
        char[] chars = new char[width];
        for (int i = 0; i < width; i++) {
            chars[width - 1 - i] = ((value >>> i) & 1L) == 0 ? '0' : '1';
        }
        return new String(chars);
    }

    /** Formats a complex number as {@code +0.707107 -0.000000i}, fixed width. */
    static String complex(Complex z) {
        return String.format(Locale.ROOT, "%+.6f %+.6fi", z.getReal(), z.getImaginary());
    }

    /**
     * A count with its noun, plural unless the count is 1, digits grouped: {@code "1 shot"},
     * {@code "2,000 shots"}.
     */
    static String count(long n, String noun) {
        return f("%,d %s", n, n == 1 ? noun : noun + "s");
    }

    /** Formats with {@link Locale#ROOT}, so decimal points never depend on the machine. */
    static String f(String format, Object... args) {
        return String.format(Locale.ROOT, format, args);
    }

    /** Prints a title line and an underline of '=' of the same length. */
    static void title(PrintStream out, String title) {
        out.println(title);
        out.println("=".repeat(title.length()));
    }

    /** Prints a section heading and an underline of '-' of the same length. */
    static void heading(PrintStream out, String heading) {
        out.println();
        out.println(heading);
        out.println("-".repeat(heading.length()));
    }
}
