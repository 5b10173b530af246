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
    /** Outcomes as binary values, ascending; null when the width exceeds 63 bits. */
    private final long[] keys;
    private final long[] counts;
    /** Outcomes by bitstring: built on first use when keys are held. */
    private volatile SortedMap<String, Long> map;

    private Tally(int width, long[] keys, long[] counts) {
        this.width = width;
        this.keys = keys;
        this.counts = counts;
        long sum = 0;
        for (long c : counts) {
            sum += c;
        }
        this.shots = sum;
    }

    private Tally(int width, TreeMap<String, Long> counts) {
        this.width = width;
        this.keys = null;
        this.counts = null;
        long sum = 0;
        for (long c : counts.values()) {
            sum += c;
        }
        this.shots = sum;
        this.map = Collections.unmodifiableSortedMap(counts);
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
        return ofStrings(width, copy);
    }

    /** Builds a tally from one key per shot (bit j of a key is outcome bit j); sorts keys. */
    static Tally ofKeys(int width, long[] keys) {
        java.util.Arrays.sort(keys);
        int distinct = 0;
        for (int i = 0; i < keys.length; i++) {
            if (i == 0 || keys[i] != keys[i - 1]) {
                distinct++;
            }
        }
        long[] k = new long[distinct];
        long[] c = new long[distinct];
        int w = -1;
        for (int i = 0; i < keys.length; i++) {
            if (i == 0 || keys[i] != keys[i - 1]) {
                k[++w] = keys[i];
            }
            c[w]++;
        }
        return new Tally(width, k, c);
    }

    /** Builds a tally from validated bitstring counts (all positive). */
    static Tally ofStrings(int width, Map<String, Long> counts) {
        if (width > 63) {
            return new Tally(width, new TreeMap<>(counts));
        }
        TreeMap<String, Long> sorted = new TreeMap<>(counts);
        long[] k = new long[sorted.size()];
        long[] c = new long[sorted.size()];
        int i = 0;
        for (Map.Entry<String, Long> e : sorted.entrySet()) {
            k[i] = width == 0 ? 0 : Long.parseLong(e.getKey(), 2);
            c[i++] = e.getValue();
        }
        return new Tally(width, k, c);
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
        if (keys != null) {
            return countOf(width == 0 ? 0 : Long.parseLong(bits, 2));
        }
        return map.getOrDefault(bits, 0L);
    }

    private long countOf(long value) {
        int i = java.util.Arrays.binarySearch(keys, value);
        return i >= 0 ? counts[i] : 0;
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
        if (keys == null) {
            String text = "0".repeat(width - 63) + bits(value, 63);
            return map.getOrDefault(text, 0L);
        }
        return countOf(value);
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
        SortedMap<String, Long> m = map;
        if (m == null) {
            TreeMap<String, Long> t = new TreeMap<>();
            for (int i = 0; i < keys.length; i++) {
                t.put(bits(keys[i], width), counts[i]);
            }
            m = Collections.unmodifiableSortedMap(t);
            map = m;
        }
        return m;
    }

    /**
     * Returns the tally as CSV: a header {@code bits,count}, then one row per outcome seen,
     * ordered by bitstring, lines ending in {@code '\n'}.
     *
     * @return the CSV text
     */
    public String toCsv() {
        StringBuilder sb = new StringBuilder("bits,count\n");
        if (keys != null) {
            for (int i = 0; i < keys.length; i++) {
                sb.append(bits(keys[i], width)).append(',').append(counts[i]).append('\n');
            }
            return sb.toString();
        }
        for (Map.Entry<String, Long> e : map.entrySet()) {
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
        if (width != t.width || shots != t.shots) {
            return false;
        }
        if (keys != null) {
            return java.util.Arrays.equals(keys, t.keys) && java.util.Arrays.equals(counts, t.counts);
        }
        return map.equals(t.map);
    }

    /**
     * Returns a hash code consistent with {@link #equals(Object)}.
     *
     * @return the hash code
     */
    @Override
    public int hashCode() {
        if (keys != null) {
            return 31 * (31 * width + java.util.Arrays.hashCode(keys))
                    + java.util.Arrays.hashCode(counts);
        }
        return 31 * width + map.hashCode();
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
        int size = keys != null ? keys.length : map.size();
        for (Map.Entry<String, Long> e : outcomesHead(17)) {
            if (shown++ == 16) {
                sb.append(", ... ").append(size - 16).append(" more");
                break;
            }
            sb.append(shown > 1 ? ", " : "").append(e.getKey().isEmpty() ? "(empty)" : e.getKey())
                    .append('=').append(e.getValue());
        }
        return sb.append(']').toString();
    }

    private java.util.List<Map.Entry<String, Long>> outcomesHead(int limit) {
        java.util.List<Map.Entry<String, Long>> out = new java.util.ArrayList<>();
        if (keys != null) {
            for (int i = 0; i < keys.length && i < limit; i++) {
                out.add(Map.entry(bits(keys[i], width), counts[i]));
            }
            return out;
        }
        for (Map.Entry<String, Long> e : map.entrySet()) {
            if (out.size() == limit) {
                break;
            }
            out.add(e);
        }
        return out;
    }
}
