package dev.qsim;

import java.util.Collections;
import java.util.Map;
import java.util.Objects;
import java.util.SortedMap;
import java.util.TreeMap;

/**
 * Counts of measurement outcomes over a number of shots: an immutable value. Outcomes are
 * bitstrings of a fixed {@linkplain #width() width}, written with the highest-numbered bit
 * leftmost (see the {@linkplain dev.qsim package conventions}). Only outcomes seen are stored.
 * Thread-safe.
 *
 * @since 0.1
 */
public final class Tally {
    private final int width;
    private final long shots;
    private final SortedMap<String, Long> counts;

    private Tally(int width, TreeMap<String, Long> counts) {
        this.width = width;
        long sum = 0;
        for (long c : counts.values()) {
            sum += c;
        }
        this.shots = sum;
        this.counts = Collections.unmodifiableSortedMap(counts);
    }

    /**
     * Returns a tally with the given counts, for example one read from a device's report.
     * Outcomes with a count of zero are dropped.
     *
     * @param width the bitstring width, {@code 0 <= width}
     * @param counts count per bitstring of {@code width} characters {@code '0'}/{@code '1'};
     *     copied
     * @return the tally
     * @throws IllegalArgumentException if the width is negative, a bitstring has the wrong
     *     length or another character, a count is negative or null, or the counts sum to zero
     */
    public static Tally of(int width, Map<String, Long> counts) {
        Objects.requireNonNull(counts, "counts");
        if (width < 0) {
            throw new IllegalArgumentException("width must be at least 0 but was " + width);
        }
        TreeMap<String, Long> copy = new TreeMap<>();
        long sum = 0;
        for (Map.Entry<String, Long> e : counts.entrySet()) {
            requireBits(e.getKey(), width);
            Long c = e.getValue();
            if (c == null || c < 0) {
                throw new IllegalArgumentException("the count of '" + e.getKey()
                        + "' must be at least 0 but was " + c);
            }
            if (c > 0) {
                copy.put(e.getKey(), c);
                sum += c;
            }
        }
        if (sum == 0) {
            throw new IllegalArgumentException("a tally needs at least one shot but the counts"
                    + " sum to 0");
        }
        return new Tally(width, copy);
    }

    /** Builds a tally from one key per shot (bit j of a key is outcome bit j); sorts keys. */
    static Tally ofKeys(int width, long[] keys) {
        java.util.Arrays.sort(keys);
        TreeMap<String, Long> map = new TreeMap<>();
        int i = 0;
        while (i < keys.length) {
            int j = i;
            while (j < keys.length && keys[j] == keys[i]) {
                j++;
            }
            map.put(bits(keys[i], width), (long) (j - i));
            i = j;
        }
        return new Tally(width, map);
    }

    static Tally ofStrings(int width, Map<String, Long> counts) {
        return new Tally(width, new TreeMap<>(counts));
    }

    static String bits(long value, int width) {
        char[] c = new char[width];
        for (int j = 0; j < width; j++) {
            c[width - 1 - j] = ((value >>> j) & 1) == 1 ? '1' : '0';
        }
        return new String(c);
    }

    private static void requireBits(String bits, int width) {
        if (bits == null) {
            throw new IllegalArgumentException("a bitstring is null");
        }
        if (bits.length() != width) {
            throw new IllegalArgumentException("bitstring '" + bits + "' has " + bits.length()
                    + " character(s) but the tally's width is " + width);
        }
        for (int i = 0; i < bits.length(); i++) {
            char ch = bits.charAt(i);
            if (ch != '0' && ch != '1') {
                throw new IllegalArgumentException("bitstring '" + bits + "' has '" + ch
                        + "' at position " + i + "; only '0' and '1' are allowed");
            }
        }
    }

    /**
     * Returns the total number of shots.
     *
     * @return the sum of all counts
     */
    public long shots() {
        return shots;
    }

    /**
     * Returns the number of bits in each outcome.
     *
     * @return the width
     */
    public int width() {
        return width;
    }

    /**
     * Returns how often an outcome was seen.
     *
     * @param bits a bitstring of {@link #width()} characters {@code '0'}/{@code '1'}
     * @return the count, 0 if never seen
     * @throws IllegalArgumentException if {@code bits} is malformed
     */
    public long count(String bits) {
        requireBits(bits, width);
        return counts.getOrDefault(bits, 0L);
    }

    /**
     * Returns how often the outcome with binary value {@code value} was seen.
     *
     * @param value in {@code [0, 2^width)}
     * @return the count, 0 if never seen
     * @throws IllegalArgumentException if {@code value} does not fit the width
     */
    public long count(long value) {
        if (value < 0 || (width < 63 && value >= (1L << width))) {
            throw new IllegalArgumentException("outcome value " + value + " is out of range [0, "
                    + (width < 63 ? Long.toString((1L << width) - 1) : "2^" + width + " - 1")
                    + "] for width " + width);
        }
        if (width > 63) {
            StringBuilder sb = new StringBuilder("0".repeat(width - 63)).append(bits(value, 63));
            return counts.getOrDefault(sb.toString(), 0L);
        }
        return counts.getOrDefault(bits(value, width), 0L);
    }

    /**
     * Returns the observed frequency of an outcome, {@code count(bits) / shots()}.
     *
     * @param bits a bitstring of {@link #width()} characters
     * @return the frequency in {@code [0, 1]}
     * @throws IllegalArgumentException if {@code bits} is malformed
     */
    public double probability(String bits) {
        return count(bits) / (double) shots;
    }

    /**
     * Returns the outcomes seen with their counts, ordered by bitstring (which is also the
     * order of their binary values).
     *
     * @return an unmodifiable sorted map
     */
    public SortedMap<String, Long> outcomes() {
        return counts;
    }

    /**
     * Returns the tally as CSV: a header {@code bits,count}, then one row per outcome seen,
     * ordered by bitstring, lines ending in {@code '\n'}.
     *
     * @return the CSV text
     */
    public String toCsv() {
        StringBuilder sb = new StringBuilder("bits,count\n");
        for (Map.Entry<String, Long> e : counts.entrySet()) {
            sb.append(e.getKey()).append(',').append(e.getValue()).append('\n');
        }
        return sb.toString();
    }

    /**
     * Compares width and counts.
     *
     * @param o another object
     * @return whether the tallies are equal
     */
    @Override
    public boolean equals(Object o) {
        if (this == o) {
            return true;
        }
        if (!(o instanceof Tally)) {
            return false;
        }
        Tally t = (Tally) o;
        return width == t.width && counts.equals(t.counts);
    }

    /**
     * Returns a hash code consistent with {@link #equals(Object)}.
     *
     * @return the hash code
     */
    @Override
    public int hashCode() {
        return 31 * width + counts.hashCode();
    }

    /**
     * Returns a short text such as {@code "Tally[1000 shots: 00=497, 11=503]"}.
     *
     * @return the text
     */
    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder("Tally[").append(shots).append(" shots: ");
        int shown = 0;
        for (Map.Entry<String, Long> e : counts.entrySet()) {
            if (shown++ == 16) {
                sb.append(", ... ").append(counts.size() - 16).append(" more");
                break;
            }
            sb.append(shown > 1 ? ", " : "").append(e.getKey().isEmpty() ? "(empty)" : e.getKey())
                    .append('=').append(e.getValue());
        }
        return sb.append(']').toString();
    }
}
