package dev.qsim.stats;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;

import org.apache.commons.statistics.distribution.BinomialDistribution;
import org.apache.commons.statistics.inference.ChiSquareTest;
import org.junit.jupiter.api.Test;

/**
 * The Monte Carlo sampler of the distance interval and the reference family it draws from.
 */
class MultinomialSamplerTest {

    /** Chi-square p-value of {@code draws} binomial variates against Commons Statistics. */
    private static double binomialFit(long n, double p, int draws, long seed) {
        MultinomialSampler.SplitMix rng = new MultinomialSampler.SplitMix(seed);
        BinomialDistribution ref = BinomialDistribution.of((int) n, p);
        // Cells: values with expected count at least 5, the tails pooled (Cochran 1954).
        int lo = ref.inverseCumulativeProbability(5.0 / draws);
        int hi = ref.inverseCumulativeProbability(1 - 5.0 / draws);
        long[] observed = new long[hi - lo + 1];
        for (int i = 0; i < draws; i++) {
            long x = MultinomialSampler.binomial(rng, n, p);
            assertTrue(x >= 0 && x <= n, () -> "variate " + x + " outside [0, " + n + "]");
            observed[(int) Math.max(0, Math.min(hi - lo, x - lo))]++;
        }
        double[] expected = new double[observed.length];
        for (int k = 0; k < expected.length; k++) {
            int v = lo + k;
            double below = k == 0 ? ref.cumulativeProbability(v)
                    : ref.cumulativeProbability(v) - ref.cumulativeProbability(v - 1);
            expected[k] = draws * (k == expected.length - 1 ? ref.survivalProbability(v - 1)
                    : below);
        }
        return ChiSquareTest.withDefaults().test(expected, observed).getPValue();
    }

    @Test
    void binomialVariatesFollowTheBinomialDistribution() {
        // Reference: Commons Statistics 1.1 BinomialDistribution, by a chi-square test of fit at
        // 0.001 (seeded; the sampler is wrong if one of these fails). Means below 10 use
        // inversion, above it Hormann's BTRS; p above 1/2 goes through the complement.
        double[][] shapes = {{20, 0.3}, {1000, 0.004}, {1000, 0.04}, {200, 0.5}, {5000, 0.37},
            {100_000, 0.05}, {50, 0.8}};
        for (double[] s : shapes) {
            long n = (long) s[0];
            double pv = binomialFit(n, s[1], 20_000, 17 * n + 1);
            assertTrue(pv > 0.001, "Bin(" + n + ", " + s[1] + "): p-value " + pv);
        }
    }

    @Test
    void logFactorialMatchesLogGamma() {
        // Reference: Commons Math 3.6.1 Gamma.logGamma, ln k! = ln Gamma(k + 1).
        for (long k : new long[] {0, 1, 2, 10, 127, 128, 129, 1000, 123_456, 10_000_000}) {
            double ref = org.apache.commons.math3.special.Gamma.logGamma(k + 1.0);
            assertEquals(ref, MultinomialSampler.logFactorial(k), 1e-12 * Math.max(1, ref),
                    "k = " + k);
        }
    }

    @Test
    void bothDrawingRoutesGiveTheMultinomialMeans() {
        // E x_i = n p_i (multinomial mean, textbook). 20 shots over 16 cells go shot by shot
        // through the alias table; 20,000 shots go through successive binomials.
        double[] p = new double[16];
        for (int i = 0; i < 16; i++) {
            p[i] = (i + 1) / 136.0;
        }
        for (long n : new long[] {20, 20_000}) {
            MultinomialSampler sampler = new MultinomialSampler(p, n);
            long[] sum = new long[16];
            long[] x = new long[16];
            int draws = 4000;
            for (int d = 0; d < draws; d++) {
                Arrays.fill(x, 0);
                sampler.draw(MultinomialSampler.SplitMix.forDraw(5, d), x);
                assertEquals(n, Arrays.stream(x).sum());
                for (int i = 0; i < 16; i++) {
                    sum[i] += x[i];
                }
            }
            for (int i = 0; i < 16; i++) {
                double mean = sum[i] / (double) draws;
                double sd = Math.sqrt(n * p[i] * (1 - p[i]) / draws);
                assertEquals(n * p[i], mean, 5 * sd, "n " + n + ", cell " + i);
            }
        }
    }

    @Test
    void aDrawDependsOnlyOnItsSeed() {
        double[] p = {0.5, 0.25, 0.125, 0.125};
        long[] a = new long[4];
        long[] b = new long[4];
        new MultinomialSampler(p, 1000).draw(MultinomialSampler.SplitMix.forDraw(9, 3), a);
        new MultinomialSampler(p, 1000).draw(MultinomialSampler.SplitMix.forDraw(9, 3), b);
        assertArrayEquals(a, b);
    }

    @Test
    void aDrawListingItsCellsGivesTheSameCountsAndListsEachNonZeroCellOnce() {
        // Same generator, same counts: the listing variant must not change a draw. Every cell
        // with a non-zero count is listed exactly once (definition of the list).
        java.util.SplittableRandom r = new java.util.SplittableRandom(5);
        for (int trial = 0; trial < 20; trial++) {
            int k = 1 + r.nextInt(3000);
            double[] p = new double[k];
            for (int i = 0; i < k; i++) {
                p[i] = r.nextInt(4) == 0 ? 0 : r.nextDouble();
            }
            p[r.nextInt(k)] += 1e-3;
            double sum = Arrays.stream(p).sum();
            for (int i = 0; i < k; i++) {
                p[i] /= sum;
            }
            long shots = 1 + r.nextInt(2000);
            MultinomialSampler m = new MultinomialSampler(p, shots);
            long[] a = new long[k];
            long[] b = new long[k];
            int[] touched = new int[(int) Math.min(k, shots) + 1];
            m.draw(MultinomialSampler.SplitMix.forDraw(trial, 7), a);
            int listed = m.draw(MultinomialSampler.SplitMix.forDraw(trial, 7), b, touched);
            assertArrayEquals(a, b, "trial " + trial);
            boolean[] seen = new boolean[k];
            for (int t = 0; t < listed; t++) {
                assertTrue(b[touched[t]] > 0, "listed cell " + touched[t] + " is empty");
                assertTrue(!seen[touched[t]], "cell " + touched[t] + " listed twice");
                seen[touched[t]] = true;
            }
            for (int i = 0; i < k; i++) {
                assertEquals(b[i] > 0, seen[i], "trial " + trial + ", cell " + i);
            }
        }
    }

    @Test
    void summingOnlyTheReachedCellsGivesTheDenseDistances() {
        // TVD(x/n, c) = 1/2 sum |x_i/n - c_i|; cells with x_i = 0 add c_i, so the sum over the
        // reached cells plus the rest of c's mass is the same number (definition of the total
        // variation distance, common practice), up to the order of the additions. With and
        // without prediction shots, 4,096 cells and 300 shots.
        java.util.SplittableRandom r = new java.util.SplittableRandom(11);
        int k = 4096;
        long[] counts = new long[k];
        double[] q = new double[k];
        for (int i = 0; i < k; i++) {
            q[i] = r.nextDouble();
        }
        double qs = Arrays.stream(q).sum();
        for (int i = 0; i < k; i++) {
            q[i] /= qs;
        }
        for (int s = 0; s < 300; s++) {
            counts[r.nextInt(k / 2)]++;
        }
        for (long m : new long[] {0, 400}) {
            DistanceInterval iv = new DistanceInterval(counts, q, 300, m, k, 0.95, 200, 3, 2);
            for (double d : new double[] {0, 0.1, iv.observed() / 2, iv.observed()}) {
                double[] dense = iv.distances(d, false);
                double[] sparse = iv.distances(d, true);
                for (int j = 0; j < dense.length; j++) {
                    assertEquals(dense[j], sparse[j], 1e-12, "M " + m + ", d " + d + ", " + j);
                }
            }
        }
    }

    @Test
    void theReferenceAtEachCandidateLiesAtThatDistance() {
        // The fitted reference p_d must be a distribution at total variation distance exactly d
        // from the prediction (definition of the family), and at d = TVD(f, q) it is the tally's
        // own frequencies (the unconstrained maximum-likelihood fit is f, textbook).
        long[] counts = {40, 0, 25, 15, 20, 0};
        double[] q = {0.30, 0.05, 0.20, 0.25, 0.20, 0};
        DistanceInterval iv = new DistanceInterval(counts, q, 100, 0, 8, 0.95, 50, 1, 1);
        double observed = iv.observed();
        assertEquals(0.5 * (0.10 + 0.05 + 0.05 + 0.10 + 0 + 0), observed, 1e-15);
        for (double d : new double[] {0.01, 0.04, 0.08, observed, 0.2, 0.3}) {
            double[] p = iv.reference(d)[0];
            double sum = 0;
            double dist = 0;
            for (int i = 0; i < p.length; i++) {
                assertTrue(p[i] >= 0, "d " + d + ": p[" + i + "] = " + p[i]);
                sum += p[i];
                dist += Math.abs(p[i] - (i < q.length ? q[i] : 0));
            }
            assertEquals(1, sum, 1e-12, "d " + d);
            assertEquals(d, 0.5 * dist, 1e-12, "d " + d);
        }
        double[] atObserved = iv.reference(observed)[0];
        for (int i = 0; i < counts.length; i++) {
            assertEquals(counts[i] / 100.0, atObserved[i], 1e-12);
        }
    }
}
