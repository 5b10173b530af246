package dev.qsim;

import java.util.Collections;
import java.util.Map;
import java.util.Objects;
import java.util.SortedMap;
import java.util.TreeMap;

import org.apache.commons.rng.UniformRandomProvider;

import dev.qsim.internal.Checks;
import dev.qsim.internal.Heap;

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
            sum = addShots(sum, c);
        }
        this.shots = sum;
    }

    /** Adds counts, refusing a total beyond {@code Long.MAX_VALUE}. */
    private static long addShots(long sum, long count) {
        long s = sum + count;
        if (((sum ^ s) & (count ^ s)) < 0) {
            throw new IllegalArgumentException("the counts sum to more than "
                    + Long.MAX_VALUE + " shots, the most a tally can hold");
        }
        return s;
    }

    private Tally(int width, TreeMap<String, Long> counts) {
        this.width = width;
        this.keys = null;
        this.counts = null;
        long sum = 0;
        for (long c : counts.values()) {
            sum = addShots(sum, c);
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
                sum = addShots(sum, c);
            }
        }
        if (sum == 0) {
            throw new IllegalArgumentException("a tally needs at least one shot but the counts"
                    + " sum to 0");
        }
        return ofStrings(width, copy);
    }

    /**
     * Builds a tally from one outcome per shot: {@code outcomes[s]} is the register value of
     * shot {@code s}, with bit {@code j} the value of classical bit {@code j} (so its binary
     * form is the outcome's bitstring).
     *
     * @param width the register width, {@code 0 <= width <= 63}
     * @param outcomes one value per shot, each in {@code [0, 2^width)}; at least one. Not
     *     modified.
     * @return the tally
     * @throws IllegalArgumentException if the width is out of range, there is no shot, or a
     *     value is out of range
     */
    public static Tally fromShots(int width, long... outcomes) {
        Objects.requireNonNull(outcomes, "outcomes");
        requireKeyWidth(width);
        if (outcomes.length == 0) {
            throw new IllegalArgumentException("a tally needs at least one shot but none was"
                    + " given");
        }
        for (int s = 0; s < outcomes.length; s++) {
            requireValue(outcomes[s], width, "the outcome of shot " + s);
        }
        return ofKeys(width, outcomes.clone());
    }

    /**
     * Builds a tally from outcome values and their counts.
     *
     * @param width the register width, {@code 0 <= width <= 63}
     * @param values distinct outcome values, each in {@code [0, 2^width)}. Not modified.
     * @param counts the count of each value, at least 0, summing to at least 1 and at most
     *     {@code Long.MAX_VALUE}. Not modified.
     * @return the tally (outcomes of count 0 are left out)
     * @throws IllegalArgumentException if the width is out of range, the arrays differ in
     *     length, a value is out of range or repeats, a count is negative, or the counts sum to
     *     0 or overflow
     */
    public static Tally ofCounts(int width, long[] values, long[] counts) {
        Objects.requireNonNull(values, "values");
        Objects.requireNonNull(counts, "counts");
        requireKeyWidth(width);
        if (values.length != counts.length) {
            throw new IllegalArgumentException("there are " + values.length + " values but "
                    + counts.length + " counts; give one count per value");
        }
        long[][] pairs = new long[values.length][];
        long sum = 0;
        int kept = 0;
        for (int i = 0; i < values.length; i++) {
            requireValue(values[i], width, "value " + i);
            if (counts[i] < 0) {
                throw new IllegalArgumentException("the count of value " + values[i]
                        + " must be at least 0 but was " + counts[i]);
            }
            sum = addShots(sum, counts[i]);
            if (counts[i] > 0) {
                pairs[kept++] = new long[] {values[i], counts[i]};
            }
        }
        if (sum == 0) {
            throw new IllegalArgumentException("a tally needs at least one shot but the counts"
                    + " sum to 0");
        }
        long[][] sorted = java.util.Arrays.copyOf(pairs, kept);
        java.util.Arrays.sort(sorted, (a, b) -> Long.compare(a[0], b[0]));
        long[] k = new long[kept];
        long[] c = new long[kept];
        for (int i = 0; i < kept; i++) {
            if (i > 0 && sorted[i][0] == sorted[i - 1][0]) {
                throw new IllegalArgumentException("value " + sorted[i][0] + " is given twice;"
                        + " give each value once");
            }
            k[i] = sorted[i][0];
            c[i] = sorted[i][1];
        }
        return new Tally(width, k, c);
    }

    private static void requireKeyWidth(int width) {
        if (width < 0 || width > 63) {
            throw new IllegalArgumentException("width must be in [0, 63] for outcome values but"
                    + " was " + width + "; wider registers take bitstrings (of(int, Map))");
        }
    }

    private static void requireValue(long value, int width, String what) {
        if (value < 0 || value >= (1L << width)) {
            throw new IllegalArgumentException(what + " is " + value + ", out of range [0, "
                    + ((1L << width) - 1) + "] for width " + width);
        }
    }

    /**
     * Writes a register value as a bitstring of the given width, highest bit leftmost (the
     * {@linkplain dev.qsim package conventions}): {@code bitString(6, 3)} is {@code "110"}.
     * This is the one place qsim turns values into bitstrings.
     *
     * @param value the value; bits at or above {@code width} are ignored
     * @param width the number of characters, at least 0
     * @return the bitstring
     * @throws IllegalArgumentException if {@code width} is negative
     */
    public static String bitString(long value, int width) {
        if (width < 0) {
            throw new IllegalArgumentException("width must be at least 0 but was " + width);
        }
        char[] c = new char[width];
        for (int j = 0; j < width; j++) {
            c[width - 1 - j] = j < 64 && ((value >>> j) & 1) == 1 ? '1' : '0';
        }
        return new String(c);
    }

    /**
     * Draws a tally of {@code shots} outcomes from a distribution over register values: each
     * shot takes one uniform number {@code u} from the generator and the first value whose
     * cumulative probability exceeds {@code u} times the total (inverse transform sampling,
     * Devroye 1986, <i>Non-Uniform Random Variate Generation</i>, §II.2). Negative entries count
     * as 0; the entries need not sum to exactly 1.
     *
     * @param probabilities one non-negative weight per value, {@code 2^width} of them. Not
     *     modified.
     * @param width the register width, {@code 0 <= width <= 30}
     * @param shots the number of shots, at least 1
     * @param rng the source of randomness
     * @return the tally
     * @throws IllegalArgumentException if the array length is not {@code 2^width}, the weights
     *     are not finite or sum to 0, or {@code shots < 1}
     */
    public static Tally sample(double[] probabilities, int width, long shots,
            UniformRandomProvider rng) {
        Objects.requireNonNull(probabilities, "probabilities");
        Objects.requireNonNull(rng, "rng");
        if (width < 0 || width > 30 || probabilities.length != 1 << width) {
            throw new IllegalArgumentException("need 2^width weights with 0 <= width <= 30, but"
                    + " width is " + width + " and " + probabilities.length + " were given");
        }
        Checks.requireShots(shots);
        double[] cum = new double[probabilities.length];
        double acc = 0;
        for (int i = 0; i < probabilities.length; i++) {
            double p = probabilities[i];
            if (!Double.isFinite(p)) {
                throw new IllegalArgumentException("weight " + i + " must be finite but was "
                        + p);
            }
            acc += Math.max(0, p);
            cum[i] = acc;
        }
        if (!(acc > 0)) {
            throw new IllegalArgumentException("the weights sum to " + acc + "; at least one"
                    + " must be positive");
        }
        long[] counts = new long[probabilities.length];
        for (long s = 0; s < shots; s++) {
            double u = rng.nextDouble() * acc;
            int lo = 0;
            int hi = probabilities.length - 1;
            while (lo < hi) {
                int mid = (lo + hi) >>> 1;
                if (cum[mid] > u) {
                    hi = mid;
                } else {
                    lo = mid + 1;
                }
            }
            counts[lo]++;
        }
        int kept = 0;
        for (long c : counts) {
            kept += c > 0 ? 1 : 0;
        }
        long[] k = new long[kept];
        long[] c = new long[kept];
        int w = 0;
        for (int i = 0; i < counts.length; i++) {
            if (counts[i] > 0) {
                k[w] = i;
                c[w++] = counts[i];
            }
        }
        return new Tally(width, k, c);
    }

    /**
     * Returns an empty recorder of shots for a register of the given width.
     *
     * @param width the register width, at least 0
     * @return a new recorder
     * @throws IllegalArgumentException if {@code width} is negative
     */
    public static Recorder recorder(int width) {
        if (width < 0) {
            throw new IllegalArgumentException("width must be at least 0 but was " + width);
        }
        return new Recorder(width);
    }

    /**
     * Collects shots one register at a time and builds a {@link Tally}: the one place where
     * engines turn classical registers into outcomes. Mutable; not thread-safe.
     *
     * @since 0.1
     */
    public static final class Recorder {
        private final int width;
        /** One key per shot recorded with count 1 (width up to 63). */
        private long[] single = new long[16];
        private int size;
        /** Keys recorded with larger counts (width up to 63). */
        private final Map<Long, Long> repeated = new java.util.HashMap<>();
        /** Bitstrings, for widths above 63. */
        private final Map<String, Long> wide;
        private long shots;

        private Recorder(int width) {
            this.width = width;
            this.wide = width > 63 ? new java.util.HashMap<>() : null;
        }

        /**
         * Records a register {@code count} times; {@code register[j]} is classical bit
         * {@code j}.
         *
         * @param register the bits, {@code width} of them. Not modified.
         * @param count how many shots gave it, at least 1
         * @return this recorder
         * @throws IllegalArgumentException if the length differs from the width, the count is
         *     below 1 or the shot total would overflow
         * @throws IllegalStateException if the heap cannot hold the recorded shots
         */
        public Recorder add(boolean[] register, long count) {
            Objects.requireNonNull(register, "register");
            if (register.length != width) {
                throw new IllegalArgumentException("the register has " + register.length
                        + " bit(s) but the recorder's width is " + width);
            }
            if (count < 1) {
                throw new IllegalArgumentException("count must be at least 1 but was " + count);
            }
            long total = addShots(shots, count);
            if (wide != null) {
                char[] text = new char[width];
                for (int c = 0; c < width; c++) {
                    text[width - 1 - c] = register[c] ? '1' : '0';
                }
                wide.merge(new String(text), count, Long::sum);
                shots = total;
                return this;
            }
            long key = 0;
            for (int c = 0; c < width; c++) {
                // No branch on the bit: outcome bits are random, and a mispredicted branch on
                // each cost several times the loop's own work.
                key |= (register[c] ? 1L : 0L) << c;
            }
            if (count > 1) {
                repeated.merge(key, count, Long::sum);
            } else {
                if (size == single.length) {
                    int grown = size >= (Integer.MAX_VALUE - 8) / 2 ? Integer.MAX_VALUE - 8
                            : 2 * size;
                    if (grown == size) {
                        throw new IllegalArgumentException("a recorder holds at most " + size
                                + " single shots; record repeated registers with a count");
                    }
                    Heap.require(8L * grown, "a record of " + grown + " shots");
                    single = java.util.Arrays.copyOf(single, grown);
                }
                single[size++] = key;
            }
            shots = total;
            return this;
        }

        /**
         * Builds the tally of the shots recorded so far.
         *
         * @return the tally
         * @throws IllegalArgumentException if no shot was recorded
         */
        public Tally build() {
            if (shots == 0) {
                throw new IllegalArgumentException("a tally needs at least one shot but none"
                        + " was recorded");
            }
            if (wide != null) {
                return new Tally(width, new TreeMap<>(wide));
            }
            long[] keys = java.util.Arrays.copyOf(single, size);
            TallyKeys.sort(keys, width);
            int distinct = 0;
            long[] k = new long[keys.length];
            long[] c = new long[keys.length];
            for (long key : keys) {
                if (distinct > 0 && k[distinct - 1] == key) {
                    c[distinct - 1]++;
                } else {
                    k[distinct] = key;
                    c[distinct++] = 1;
                }
            }
            k = java.util.Arrays.copyOf(k, distinct);
            c = java.util.Arrays.copyOf(c, distinct);
            if (!repeated.isEmpty()) {
                TreeMap<Long, Long> merged = new TreeMap<>(repeated);
                for (int i = 0; i < distinct; i++) {
                    merged.merge(k[i], c[i], Long::sum);
                }
                k = new long[merged.size()];
                c = new long[merged.size()];
                int w = 0;
                for (Map.Entry<Long, Long> e : merged.entrySet()) {
                    k[w] = e.getKey();
                    c[w++] = e.getValue();
                }
            }
            return new Tally(width, k, c);
        }
    }

    /** Builds a tally from one key per shot (bit j of a key is outcome bit j); sorts keys. */
    static Tally ofKeys(int width, long[] keys) {
        TallyKeys.sort(keys, width);
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
            String text = bitString(value, width);
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
                t.put(bitString(keys[i], width), counts[i]);
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
                sb.append(bitString(keys[i], width)).append(',').append(counts[i]).append('\n');
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
            return java.util.Arrays.equals(keys, t.keys) && java.util.Arrays.equals(counts,
                    t.counts);
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
                out.add(Map.entry(bitString(keys[i], width), counts[i]));
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
