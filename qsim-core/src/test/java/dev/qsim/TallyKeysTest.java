package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Arrays;
import java.util.SplittableRandom;

import org.junit.jupiter.api.Test;

/**
 * The tally's key sort ({@link TallyKeys#sort}, a least-significant-digit radix sort: D. E.
 * Knuth, "The Art of Computer Programming", vol. 3, 2nd ed., 1998, sec. 5.2.5) against the
 * JDK's general-purpose {@link Arrays#sort(long[])}, on random keys of every width it takes and
 * at the sizes where it switches, and a tally built from many shots against one counted by a
 * plain map.
 */
class TallyKeysTest {
    @Test
    void sortsLikeTheJdkSortAtEveryWidthAndAroundItsLimits() {
        SplittableRandom r = new SplittableRandom(11);
        int[] sizes = {0, 1, 511, 512, 513, 4000, 70_000};
        for (int width = 0; width <= 40; width++) {
            for (int n : sizes) {
                long[] keys = new long[n];
                for (int i = 0; i < n; i++) {
                    keys[i] = width == 0 ? 0 : r.nextLong() >>> (64 - width);
                }
                long[] expected = keys.clone();
                Arrays.sort(expected);
                TallyKeys.sort(keys, width);
                assertArrayEquals(expected, keys, "width " + width + ", " + n + " keys");
            }
        }
    }

    @Test
    void manyShotsAreCountedAsAMapCountsThem() {
        SplittableRandom r = new SplittableRandom(3);
        int width = 12;
        Tally.Recorder rec = Tally.recorder(width);
        java.util.TreeMap<Long, Long> plain = new java.util.TreeMap<>();
        boolean[] reg = new boolean[width];
        for (int s = 0; s < 6000; s++) {
            long key = 0;
            for (int b = 0; b < width; b++) {
                reg[b] = r.nextInt(4) == 0;
                key |= reg[b] ? 1L << b : 0;
            }
            rec.add(reg, 1);
            plain.merge(key, 1L, Long::sum);
        }
        Tally t = rec.build();
        assertEquals(6000, t.shots());
        assertEquals(plain.size(), t.outcomes().size(), "distinct outcomes");
        for (java.util.Map.Entry<Long, Long> e : plain.entrySet()) {
            StringBuilder bits = new StringBuilder();
            for (int b = width - 1; b >= 0; b--) {
                bits.append((e.getKey() >>> b & 1) == 1 ? '1' : '0');
            }
            assertEquals((long) e.getValue(), t.count(bits.toString()), "outcome " + bits);
        }
    }
}
