package dev.qsim.stats;

import java.util.Arrays;

/**
 * Seeded multinomial draws for the reference distributions of {@link DistanceInterval}: one
 * small generator per draw, so that a draw depends only on its seed and the distribution, not
 * on the thread that makes it. Internal.
 *
 * <p>A draw of {@code n} shots over {@code k} cells with probabilities {@code p} is made either
 * shot by shot from an alias table (Walker 1977, "An efficient method for generating discrete
 * random variables with general distributions", ACM TOMS 3(3), 253-256; the linear-time table
 * of Vose 1991, IEEE Transactions on Software Engineering 17(9), 972-975) when {@code n} is small
 * against {@code k}, or as successive binomials {@code x_i ~ Bin(n - x_1 - ... - x_{i-1},
 * p_i / (p_i + ... + p_k))} (Devroye 1986, <i>Non-Uniform Random Variate Generation</i>,
 * §XI.1.4) otherwise. Binomials come from inversion by sequential search when the mean is
 * below {@value #INVERSION_MEAN} (Devroye 1986, §X.4.3) and from Hörmann's transformed
 * rejection BTRS otherwise (Hörmann 1993, "The generation of binomial random variates", Journal
 * of Statistical Computation and Simulation 46(1-2), 101-110).
 */
final class MultinomialSampler {
    /** Binomials whose mean {@code n min(p, 1 - p)} is below this use inversion: {@value}. */
    static final double INVERSION_MEAN = 10;
    /** Cells expecting fewer shots than this each are drawn shot by shot: {@value}. */
    static final int SHOTS_PER_CELL = 8;

    private static final double HALF_LOG_TWO_PI = 0.5 * Math.log(2 * Math.PI);
    private static final double[] LOG_FACTORIAL = new double[128];

    static {
        for (int k = 2; k < LOG_FACTORIAL.length; k++) {
            LOG_FACTORIAL[k] = LOG_FACTORIAL[k - 1] + Math.log(k);
        }
    }

    private final double[] p;
    private final int[] cells;
    private final double[] tail;
    private final int split;
    private final double[] aliasCut;
    private final int[] alias;
    /** Per alias column {@code j}: {@code [2j]} its alias's cell, {@code [2j + 1]} its own. */
    private final int[] target;
    private final long shots;

    /**
     * Prepares draws of {@code shots} shots from {@code p} (non-negative, summing to 1 within
     * rounding; cells of probability 0 are never drawn). The likeliest cells are drawn as
     * successive binomials while the shots expected in the remaining cells are at least
     * {@value #SHOTS_PER_CELL} per cell; the shots left then go shot by shot to the remaining
     * cells through an alias table.
     */
    MultinomialSampler(double[] p, long shots) {
        this.p = p;
        this.shots = shots;
        int k = 0;
        for (double v : p) {
            if (v > 0) {
                k++;
            }
        }
        Integer[] order = new Integer[k];
        k = 0;
        for (int i = 0; i < p.length; i++) {
            if (p[i] > 0) {
                order[k++] = i;
            }
        }
        Arrays.sort(order, (x, y) -> Double.compare(p[y], p[x]));
        cells = new int[k];
        for (int j = 0; j < k; j++) {
            cells[j] = order[j];
        }
        tail = new double[k + 1];
        for (int j = k - 1; j >= 0; j--) {
            tail[j] = tail[j + 1] + p[cells[j]];
        }
        int s = 0;
        while (s < k && shots * tail[s] >= (double) SHOTS_PER_CELL * (k - s)) {
            s++;
        }
        split = s;
        if (s < k) {
            aliasCut = new double[k - s];
            alias = new int[k - s];
            buildAlias();
            target = new int[2 * (k - s)];
            for (int j = 0; j < k - s; j++) {
                target[2 * j] = cells[s + alias[j]];
                target[2 * j + 1] = cells[s + j];
            }
        } else {
            aliasCut = null;
            alias = null;
            target = null;
        }
    }

    /**
     * Vose's construction over the cells from {@code split} on: column {@code j} keeps its
     * own cell with probability {@code aliasCut[j]}, else takes cell {@code alias[j]}.
     */
    private void buildAlias() {
        int k = aliasCut.length;
        double total = tail[split];
        double[] scaled = new double[k];
        int[] small = new int[k];
        int[] large = new int[k];
        int ns = 0;
        int nl = 0;
        for (int j = 0; j < k; j++) {
            scaled[j] = p[cells[split + j]] / total * k;
            if (scaled[j] < 1) {
                small[ns++] = j;
            } else {
                large[nl++] = j;
            }
        }
        while (ns > 0 && nl > 0) {
            int sm = small[--ns];
            int l = large[--nl];
            aliasCut[sm] = scaled[sm];
            alias[sm] = l;
            scaled[l] = scaled[l] + scaled[sm] - 1;
            if (scaled[l] < 1) {
                small[ns++] = l;
            } else {
                large[nl++] = l;
            }
        }
        while (nl > 0) {
            int l = large[--nl];
            aliasCut[l] = 1;
            alias[l] = l;
        }
        while (ns > 0) { // only from rounding
            int sm = small[--ns];
            aliasCut[sm] = 1;
            alias[sm] = sm;
        }
    }

    /**
     * Adds one draw's counts to {@code out} (length {@code p.length}, cleared by the caller).
     */
    void draw(SplitMix rng, long[] out) {
        draw(rng, out, null);
    }

    /**
     * As {@link #draw(SplitMix, long[])}, the same counts from the same generator, and, unless
     * {@code touched} is null, lists each cell the draw makes non-zero in it (at least
     * {@code min(k, shots) + 1} long: each step writes a slot before it knows whether the
     * cell is new), once, in the order first reached.
     *
     * @return how many cells were listed (0 when {@code touched} is null)
     */
    int draw(SplitMix rng, long[] out, int[] touched) {
        int k = cells.length;
        if (k == 0) {
            return 0;
        }
        int t = 0;
        long left = shots;
        int j = 0;
        for (; j < split && j < k - 1 && left > 0; j++) {
            double prob = tail[j] > 0 ? Math.min(1, p[cells[j]] / tail[j]) : 1;
            long x = binomial(rng, left, prob);
            int cell = cells[j];
            if (touched != null) {
                touched[t] = cell;
                t += out[cell] == 0 && x > 0 ? 1 : 0;
            }
            out[cell] += x;
            left -= x;
        }
        if (left == 0) {
            return t;
        }
        if (j == k - 1) {
            int cell = cells[j];
            if (touched != null) {
                touched[t] = cell;
                t += out[cell] == 0 ? 1 : 0;
            }
            out[cell] += left;
            return t;
        }
        int width = alias.length;
        for (long s = 0; s < left; s++) {
            double u = rng.nextDouble() * width;
            int c = (int) u;
            if (c >= width) {
                c = width - 1;
            }
            // Branch-free choice (the comparison is a coin flip the processor cannot predict):
            // the sign bit of (fraction - cut) is 1 exactly when the column keeps its own cell.
            int own = (int) (Double.doubleToRawLongBits(u - c - aliasCut[c]) >>> 63);
            int cell = target[(c << 1) | own];
            if (touched != null) {
                touched[t] = cell;
                t += out[cell] == 0 ? 1 : 0;
            }
            out[cell]++;
        }
        return t;
    }

    /** A binomial variate {@code Bin(n, prob)}. */
    static long binomial(SplitMix rng, long n, double prob) {
        if (n <= 0 || prob <= 0) {
            return 0;
        }
        if (prob >= 1) {
            return n;
        }
        if (prob > 0.5) {
            return n - binomial(rng, n, 1 - prob);
        }
        if (n * prob < INVERSION_MEAN) {
            return inversion(rng, n, prob);
        }
        return btrs(rng, n, prob);
    }

    /** Sequential search from 0 (Devroye 1986, §X.4.3); mean below {@value #INVERSION_MEAN}. */
    private static long inversion(SplitMix rng, long n, double prob) {
        double q = 1 - prob;
        double s = prob / q;
        double a = (n + 1) * s;
        while (true) {
            double r = Math.exp(n * Math.log1p(-prob));
            double u = rng.nextDouble();
            long x = 0;
            while (u > r) {
                u -= r;
                x++;
                if (x > n) {
                    break; // rounding left u above the total mass: draw again
                }
                r *= a / x - s;
            }
            if (x <= n) {
                return x;
            }
        }
    }

    /** Hörmann's BTRS for {@code prob <= 0.5} and {@code n prob >= 10} (Hörmann 1993). */
    private static long btrs(SplitMix rng, long n, double prob) {
        double q = 1 - prob;
        double spq = Math.sqrt(n * prob * q);
        double b = 1.15 + 2.53 * spq;
        double a = -0.0873 + 0.0248 * b + 0.01 * prob;
        double c = n * prob + 0.5;
        double vr = 0.92 - 4.2 / b;
        double alpha = (2.83 + 5.1 / b) * spq;
        double lpq = Math.log(prob / q);
        long m = (long) Math.floor((n + 1) * prob);
        double h = logFactorial(m) + logFactorial(n - m);
        while (true) {
            double u = rng.nextDouble() - 0.5;
            double v = rng.nextDouble();
            double us = 0.5 - Math.abs(u);
            double kd = Math.floor((2 * a / us + b) * u + c);
            if (kd < 0 || kd > n) {
                continue;
            }
            long k = (long) kd;
            if (us >= 0.07 && v <= vr) {
                return k;
            }
            double lv = Math.log(v * alpha / (a / (us * us) + b));
            if (lv <= h - logFactorial(k) - logFactorial(n - k) + (k - m) * lpq) {
                return k;
            }
        }
    }

    /**
     * {@code ln k!}: a table below 128, else Stirling's series to the {@code x^-5} term, whose
     * error is below {@code 1 / (1680 x^7)} (Abramowitz and Stegun 1964, 6.1.41).
     */
    static double logFactorial(long k) {
        if (k < LOG_FACTORIAL.length) {
            return LOG_FACTORIAL[(int) k];
        }
        double x = k + 1.0;
        double ix = 1 / x;
        double ix2 = ix * ix;
        return (x - 0.5) * Math.log(x) - x + HALF_LOG_TWO_PI
                + ix * (1.0 / 12 - ix2 * (1.0 / 360 - ix2 / 1260));
    }

    /**
     * SplitMix64 (Steele, Lea and Flood 2014, "Fast splittable pseudorandom number generators",
     * OOPSLA '14): a 64-bit state stepped by the golden-ratio increment and mixed. Cheap to
     * create, so each draw has its own, seeded from the comparison's seed and the draw's index.
     */
    static final class SplitMix {
        private long state;

        SplitMix(long seed) {
            this.state = seed;
        }

        /** A generator for draw {@code index} of the stream {@code seed}. */
        static SplitMix forDraw(long seed, long index) {
            return new SplitMix(mix(seed) ^ (index * 0xD1B54A32D192ED03L));
        }

        long nextLong() {
            state += 0x9E3779B97F4A7C15L;
            return mix(state);
        }

        /** A uniform double in [0, 1) with 53 random bits. */
        double nextDouble() {
            return (nextLong() >>> 11) * 0x1.0p-53;
        }

        private static long mix(long z) {
            z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
            z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
            return z ^ (z >>> 31);
        }
    }
}
