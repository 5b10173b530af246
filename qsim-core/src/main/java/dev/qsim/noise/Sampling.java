package dev.qsim.noise;

import java.util.HashMap;
import java.util.Map;

import org.apache.commons.rng.UniformRandomProvider;

import dev.qsim.Tally;

/** Drawing tallies from exact distributions, and bitstring text. */
final class Sampling {
    private Sampling() {
    }

    /**
     * Draws {@code shots} keys from {@code p} (index = key) by inversion of the cumulative
     * distribution (binary search), normalising by the total.
     */
    static Tally tally(double[] p, int width, int shots, UniformRandomProvider rng) {
        double[] cum = new double[p.length];
        double acc = 0;
        for (int i = 0; i < p.length; i++) {
            acc += Math.max(0, p[i]);
            cum[i] = acc;
        }
        long[] counts = new long[p.length];
        for (int s = 0; s < shots; s++) {
            double u = rng.nextDouble() * acc;
            int lo = 0;
            int hi = p.length - 1;
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
        Map<String, Long> map = new HashMap<>();
        for (int i = 0; i < p.length; i++) {
            if (counts[i] > 0) {
                map.put(bits(i, width), counts[i]);
            }
        }
        return Tally.of(width, map);
    }

    /** The key as a bitstring, highest bit leftmost. */
    static String bits(long key, int width) {
        char[] text = new char[width];
        for (int j = 0; j < width; j++) {
            text[width - 1 - j] = ((key >>> j) & 1L) == 1 ? '1' : '0';
        }
        return new String(text);
    }
}
