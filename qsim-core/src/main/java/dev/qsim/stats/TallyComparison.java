package dev.qsim.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.apache.commons.statistics.distribution.BinomialDistribution;
import org.apache.commons.statistics.inference.ChiSquareTest;
import org.apache.commons.statistics.inference.GTest;
import org.apache.commons.statistics.inference.SignificanceResult;

import dev.qsim.Tally;
import dev.qsim.internal.Checks;

/**
 * How well a measured {@link Tally} agrees with a predicted distribution over its outcomes: an
 * immutable result, computed once by {@link #of(Tally, double[])} and its overloads.
 * Thread-safe.
 *
 * <p>With {@code n} shots, observed frequencies {@code f_i = count_i / n} and predicted
 * probabilities {@code p_i}, it reports:
 * <ul>
 *   <li>the total variation distance {@code TVD = ½ Σ |f_i - p_i|} (Levin, Peres and Wilmer
 *       2017, <i>Markov Chains and Mixing Times</i>, 2nd ed., §4.1), with a percentile bootstrap
 *       confidence interval from seeded multinomial resamples of the tally (Efron and Tibshirani
 *       1993, <i>An Introduction to the Bootstrap</i>, §13.3);</li>
 *   <li>the Hellinger fidelity {@code (Σ sqrt(f_i p_i))²}, the classical fidelity of two
 *       distributions (Nielsen and Chuang 2010, <i>Quantum Computation and Quantum
 *       Information</i>, §9.2.2, eq. 9.32, squared);</li>
 *   <li>Pearson's chi-square and the G-test (log-likelihood ratio) of goodness of fit, with
 *       p-values from Apache Commons Statistics {@link ChiSquareTest} and {@link GTest} (Agresti
 *       2013, <i>Categorical Data Analysis</i>, 3rd ed., §1.5), after merging sparse outcomes so
 *       that every group expects at least {@value #MIN_EXPECTED} counts, the rule of thumb from
 *       Cochran (1954), "Some methods for strengthening the common χ² tests", Biometrics 10(4),
 *       417-451, doi:10.2307/3001616;</li>
 *   <li>every outcome's standardized residual, largest deviation first ({@link #deviations()}),
 *       and the shots that landed on outcomes predicted impossible ({@link #impossible()}).</li>
 * </ul>
 *
 * <p>Merging: outcomes whose expected count {@code n p_i} is below {@value #MIN_EXPECTED} are
 * pooled into one group; if that pool still expects fewer than {@value #MIN_EXPECTED}, the
 * outcome with the smallest expected count among the others joins it, and so on. With fewer
 * than two groups left the tests have no degrees of freedom: both statistics are 0 with
 * p-value 1 (a one-cell multinomial always matches its prediction).
 *
 * <p>A comparison {@linkplain #passes(double) passes} at significance {@code α} when neither test
 * rejects the prediction at {@code α} and no shot landed on an outcome whose predicted
 * probability is at most {@value #IMPOSSIBLE}.
 *
 * @since 0.1
 */
public final class TallyComparison {
    /** The smallest expected count of a group in the chi-square and G tests: {@value}. */
    public static final double MIN_EXPECTED = 5;
    /** Predicted probabilities at most this ({@value}) count as impossible outcomes. */
    public static final double IMPOSSIBLE = 1e-12;
    /** The largest allowed distance of the predicted probabilities' sum from 1: {@value}. */
    public static final double SUM_TOLERANCE = 1e-6;
    /** Bootstrap resamples used by the short factories: {@value}. */
    public static final int DEFAULT_RESAMPLES = 1000;
    /** Confidence level of the interval used by the short factories: {@value}. */
    public static final double DEFAULT_CONFIDENCE = 0.95;
    /** Seed of the bootstrap used by the short factories: {@value}. */
    public static final long DEFAULT_SEED = 20240917L;
    /** The largest tally width the array form accepts: {@value}. */
    public static final int MAX_ARRAY_WIDTH = 26;

    private final int width;
    private final long shots;
    private final double tvd;
    private final double tvdLow;
    private final double tvdHigh;
    private final double confidence;
    private final double fidelity;
    private final double chiSquare;
    private final double chiSquareP;
    private final double gStatistic;
    private final double gP;
    private final int groups;
    private final long impossible;
    private final List<Deviation> deviations;

    private TallyComparison(int width, long shots, String[] bits, double[] p, long[] obs,
            long seed, int resamples, double confidence) {
        this.width = width;
        this.shots = shots;
        this.confidence = confidence;
        int m = bits.length;
        double n = shots;
        double dist = 0;
        double bc = 0;
        long imp = 0;
        List<Deviation> devs = new ArrayList<>(m);
        for (int i = 0; i < m; i++) {
            double f = obs[i] / n;
            dist += Math.abs(f - p[i]);
            bc += Math.sqrt(f * p[i]);
            double e = n * p[i];
            double r = e > 0 ? (obs[i] - e) / Math.sqrt(e)
                    : (obs[i] > 0 ? Double.POSITIVE_INFINITY : 0);
            devs.add(new Deviation(bits[i], obs[i], e, r));
            if (obs[i] > 0 && p[i] <= IMPOSSIBLE) {
                imp += obs[i];
            }
        }
        this.tvd = 0.5 * dist;
        this.fidelity = bc * bc;
        this.impossible = imp;
        devs.sort((a, b) -> {
            int c = Double.compare(Math.abs(b.residual()), Math.abs(a.residual()));
            if (c == 0) {
                c = Long.compare(b.observed(), a.observed()); // among infinite residuals
            }
            return c != 0 ? c : a.bits().compareTo(b.bits());
        });
        this.deviations = Collections.unmodifiableList(devs);

        // Merge sparse outcomes (Cochran 1954).
        Integer[] order = new Integer[m];
        for (int i = 0; i < m; i++) {
            order[i] = i;
        }
        Arrays.sort(order, (a, b) -> Double.compare(p[a], p[b]));
        double poolE = 0;
        long poolO = 0;
        int next = 0;
        while (next < m && n * p[order[next]] < MIN_EXPECTED) {
            poolE += n * p[order[next]];
            poolO += obs[order[next]];
            next++;
        }
        while (next > 0 && poolE < MIN_EXPECTED && next < m) {
            poolE += n * p[order[next]];
            poolO += obs[order[next]];
            next++;
        }
        int g = (m - next) + (next > 0 ? 1 : 0);
        this.groups = g;
        if (g < 2) {
            chiSquare = 0;
            chiSquareP = 1;
            gStatistic = 0;
            gP = 1;
        } else {
            double[] expected = new double[g];
            long[] observed = new long[g];
            int k = 0;
            if (next > 0) {
                expected[k] = poolE;
                observed[k++] = poolO;
            }
            for (int j = next; j < m; j++) {
                expected[k] = n * p[order[j]];
                observed[k++] = obs[order[j]];
            }
            SignificanceResult chi = ChiSquareTest.withDefaults().test(expected, observed);
            SignificanceResult gt = GTest.withDefaults().test(expected, observed);
            chiSquare = chi.getStatistic();
            chiSquareP = chi.getPValue();
            gStatistic = gt.getStatistic();
            gP = gt.getPValue();
        }
        double[] interval = bootstrap(p, obs, shots, seed, resamples, confidence);
        this.tvdLow = interval[0];
        this.tvdHigh = interval[1];
    }

    /**
     * Compares a tally with predicted probabilities indexed by outcome value, using
     * {@value #DEFAULT_RESAMPLES} bootstrap resamples, seed {@value #DEFAULT_SEED} and a
     * {@value #DEFAULT_CONFIDENCE} confidence interval.
     *
     * @param tally the measured counts
     * @param predicted {@code 2^width} probabilities: entry {@code i} is the outcome whose binary
     *     value is {@code i}; finite, non-negative, summing to 1 within {@value #SUM_TOLERANCE}
     * @return the comparison
     * @throws IllegalArgumentException if the length or an entry of {@code predicted} is bad
     */
    public static TallyComparison of(Tally tally, double[] predicted) {
        return of(tally, predicted, DEFAULT_SEED, DEFAULT_RESAMPLES, DEFAULT_CONFIDENCE);
    }

    /**
     * Compares a tally with predicted probabilities indexed by outcome value.
     *
     * @param tally the measured counts, width at most {@value #MAX_ARRAY_WIDTH}
     * @param predicted {@code 2^width} probabilities: entry {@code i} is the outcome whose binary
     *     value is {@code i}; finite, non-negative, summing to 1 within {@value #SUM_TOLERANCE}
     * @param seed seed of the bootstrap resampling
     * @param resamples number of bootstrap resamples, at least 1; the cost grows as
     *     {@code resamples * min(shots, outcomes * 30)}
     * @param confidence the confidence level of the interval, in (0, 1)
     * @return the comparison
     * @throws IllegalArgumentException if the length or an entry of {@code predicted} is bad,
     *     the tally is too wide, or an option is out of range
     */
    public static TallyComparison of(Tally tally, double[] predicted, long seed, int resamples,
            double confidence) {
        Objects.requireNonNull(tally, "tally");
        Objects.requireNonNull(predicted, "predicted");
        int w = tally.width();
        if (w > MAX_ARRAY_WIDTH) {
            throw new IllegalArgumentException("a tally of width " + w + " needs the map form;"
                    + " the array form takes widths up to " + MAX_ARRAY_WIDTH);
        }
        long size = 1L << w;
        if (predicted.length != size) {
            throw new IllegalArgumentException("the prediction has " + predicted.length
                    + " probabilities but a tally of width " + w + " has " + size + " outcomes");
        }
        checkOptions(resamples, confidence);
        double sum = 0;
        for (int i = 0; i < predicted.length; i++) {
            double v = predicted[i];
            if (!(v >= 0) || v == Double.POSITIVE_INFINITY) {
                throw new IllegalArgumentException("predicted probability " + i + " is " + v
                        + " but must be finite and at least 0");
            }
            sum += v;
        }
        checkSum(sum);
        int kept = 0;
        for (int i = 0; i < predicted.length; i++) {
            if (predicted[i] > 0) {
                kept++;
            }
        }
        for (Map.Entry<String, Long> e : tally.outcomes().entrySet()) {
            if (predicted[valueOf(e.getKey())] == 0) {
                kept++;
            }
        }
        String[] bits = new String[kept];
        double[] p = new double[kept];
        long[] obs = new long[kept];
        int k = 0;
        for (int i = 0; i < predicted.length; i++) {
            if (predicted[i] > 0) {
                bits[k] = bitsOf(i, w);
                p[k] = predicted[i];
                obs[k++] = tally.count(bits[k - 1]);
            }
        }
        for (Map.Entry<String, Long> e : tally.outcomes().entrySet()) {
            if (predicted[valueOf(e.getKey())] == 0) {
                bits[k] = e.getKey();
                p[k] = 0;
                obs[k++] = e.getValue();
            }
        }
        return new TallyComparison(w, tally.shots(), bits, p, obs, seed, resamples, confidence);
    }

    /**
     * Compares a tally with predicted probabilities by bitstring, using the default bootstrap
     * settings of {@link #of(Tally, double[])}.
     *
     * @param tally the measured counts
     * @param predicted probability per bitstring of the tally's width; missing outcomes have
     *     probability 0; finite, non-negative, summing to 1 within {@value #SUM_TOLERANCE}
     * @return the comparison
     * @throws IllegalArgumentException if a key or value of {@code predicted} is bad
     */
    public static TallyComparison of(Tally tally, Map<String, Double> predicted) {
        return of(tally, predicted, DEFAULT_SEED, DEFAULT_RESAMPLES, DEFAULT_CONFIDENCE);
    }

    /**
     * Compares a tally with predicted probabilities by bitstring.
     *
     * @param tally the measured counts
     * @param predicted probability per bitstring of the tally's width; missing outcomes have
     *     probability 0; finite, non-negative, summing to 1 within {@value #SUM_TOLERANCE}
     * @param seed seed of the bootstrap resampling
     * @param resamples number of bootstrap resamples, at least 1
     * @param confidence the confidence level of the interval, in (0, 1)
     * @return the comparison
     * @throws IllegalArgumentException if a key or value of {@code predicted} is bad, or an
     *     option is out of range
     */
    public static TallyComparison of(Tally tally, Map<String, Double> predicted, long seed,
            int resamples, double confidence) {
        Objects.requireNonNull(tally, "tally");
        Objects.requireNonNull(predicted, "predicted");
        checkOptions(resamples, confidence);
        int w = tally.width();
        TreeMap<String, double[]> all = new TreeMap<>();
        double sum = 0;
        for (Map.Entry<String, Double> e : predicted.entrySet()) {
            String key = e.getKey();
            Double v = e.getValue();
            requireBits(key, w);
            if (v == null || !(v >= 0) || v == Double.POSITIVE_INFINITY) {
                throw new IllegalArgumentException("the predicted probability of '" + key
                        + "' is " + v + " but must be finite and at least 0");
            }
            sum += v;
            if (v > 0) {
                all.put(key, new double[] {v, 0});
            }
        }
        checkSum(sum);
        for (Map.Entry<String, Long> e : tally.outcomes().entrySet()) {
            all.computeIfAbsent(e.getKey(), b -> new double[2])[1] = e.getValue();
        }
        int m = all.size();
        String[] bits = new String[m];
        double[] p = new double[m];
        long[] obs = new long[m];
        int k = 0;
        for (Map.Entry<String, double[]> e : all.entrySet()) {
            bits[k] = e.getKey();
            p[k] = e.getValue()[0];
            obs[k++] = (long) e.getValue()[1];
        }
        return new TallyComparison(w, tally.shots(), bits, p, obs, seed, resamples, confidence);
    }

    private static void checkOptions(int resamples, double confidence) {
        Checks.requireAtLeast(resamples, 1, "the number of bootstrap resamples");
        Checks.requireOpenUnit(confidence, "the confidence level");
    }

    private static void checkSum(double sum) {
        if (!(Math.abs(sum - 1) <= SUM_TOLERANCE)) {
            throw new IllegalArgumentException("the predicted probabilities sum to " + sum
                    + " but must sum to 1 within " + SUM_TOLERANCE);
        }
    }

    private static void requireBits(String bits, int width) {
        if (bits == null || bits.length() != width) {
            throw new IllegalArgumentException("predicted outcome '" + bits + "' must be a"
                    + " bitstring of " + width + " characters, the tally's width");
        }
        for (int i = 0; i < width; i++) {
            char c = bits.charAt(i);
            if (c != '0' && c != '1') {
                throw new IllegalArgumentException("predicted outcome '" + bits + "' has '" + c
                        + "' at position " + i + "; only '0' and '1' are allowed");
            }
        }
    }

    private static int valueOf(String bits) {
        int v = 0;
        for (int i = 0; i < bits.length(); i++) {
            v = (v << 1) | (bits.charAt(i) - '0');
        }
        return v;
    }

    private static String bitsOf(long value, int width) {
        char[] c = new char[width];
        for (int j = 0; j < width; j++) {
            c[width - 1 - j] = ((value >>> j) & 1) == 1 ? '1' : '0';
        }
        return new String(c);
    }

    /** Percentile bootstrap interval of the TVD (Efron and Tibshirani 1993, §13.3). */
    private static double[] bootstrap(double[] p, long[] obs, long shots, long seed,
            int resamples, double confidence) {
        int m = 0;
        double fixed = 0; // predicted mass on outcomes never seen: a resample never lands there
        for (int i = 0; i < p.length; i++) {
            if (obs[i] > 0) {
                m++;
            } else {
                fixed += p[i];
            }
        }
        double[] q = new double[m];
        long[] c = new long[m];
        int k = 0;
        for (int i = 0; i < p.length; i++) {
            if (obs[i] > 0) {
                q[k] = p[i];
                c[k++] = obs[i];
            }
        }
        long[] cumulative = new long[m];
        long run = 0;
        for (int i = 0; i < m; i++) {
            run += c[i];
            cumulative[i] = run;
        }
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        boolean bySplitting = (double) m * 30 < shots && shots <= Integer.MAX_VALUE;
        long[] draw = new long[m];
        double[] tvds = new double[resamples];
        double n = shots;
        for (int b = 0; b < resamples; b++) {
            Arrays.fill(draw, 0);
            if (bySplitting) {
                // Multinomial as successive binomials (Devroye 1986, Non-Uniform Random Variate
                // Generation, §XI.1.4).
                long left = shots;
                long massLeft = shots;
                for (int i = 0; i < m - 1 && left > 0; i++) {
                    double prob = Math.min(1, c[i] / (double) massLeft);
                    long x = (long) BinomialDistribution.of((int) left,
                            prob).inverseCumulativeProbability(rng.nextDouble());
                    draw[i] = x;
                    left -= x;
                    massLeft -= c[i];
                }
                draw[m - 1] += left;
            } else {
                for (long s = 0; s < shots; s++) {
                    long u = rng.nextLong(shots);
                    int pos = Arrays.binarySearch(cumulative, u + 1);
                    draw[pos >= 0 ? pos : -pos - 1]++;
                }
            }
            double d = fixed;
            for (int i = 0; i < m; i++) {
                d += Math.abs(draw[i] / n - q[i]);
            }
            tvds[b] = 0.5 * d;
        }
        Arrays.sort(tvds);
        int lo = (int) Math.floor(resamples * (1 - confidence) / 2);
        int hi = (int) Math.ceil(resamples * (1 + confidence) / 2) - 1;
        lo = Math.max(0, Math.min(resamples - 1, lo));
        hi = Math.max(lo, Math.min(resamples - 1, hi));
        return new double[] {tvds[lo], tvds[hi]};
    }

    /**
     * Returns the bitstring width of the compared outcomes.
     *
     * @return the width
     */
    public int width() {
        return width;
    }

    /**
     * Returns the number of shots in the tally.
     *
     * @return the shots
     */
    public long shots() {
        return shots;
    }

    /**
     * Returns the total variation distance {@code ½ Σ |f_i - p_i|}, in [0, 1].
     *
     * @return the distance
     */
    public double totalVariation() {
        return tvd;
    }

    /**
     * Returns the lower end of the bootstrap confidence interval of the total variation
     * distance.
     *
     * @return the lower end
     */
    public double totalVariationLow() {
        return tvdLow;
    }

    /**
     * Returns the upper end of the bootstrap confidence interval of the total variation
     * distance.
     *
     * @return the upper end
     */
    public double totalVariationHigh() {
        return tvdHigh;
    }

    /**
     * Returns the confidence level of the interval.
     *
     * @return the level in (0, 1)
     */
    public double confidence() {
        return confidence;
    }

    /**
     * Returns the Hellinger fidelity {@code (Σ sqrt(f_i p_i))²}, in [0, 1]; 1 when the observed
     * frequencies equal the prediction.
     *
     * @return the fidelity
     */
    public double hellingerFidelity() {
        return fidelity;
    }

    /**
     * Returns Pearson's chi-square statistic {@code Σ (O - E)² / E} over the merged groups.
     *
     * @return the statistic
     */
    public double chiSquare() {
        return chiSquare;
    }

    /**
     * Returns the p-value of the chi-square goodness-of-fit test, with
     * {@link #degreesOfFreedom()} degrees of freedom.
     *
     * @return the p-value in [0, 1]
     */
    public double chiSquarePValue() {
        return chiSquareP;
    }

    /**
     * Returns the G statistic {@code 2 Σ O ln(O / E)} over the merged groups.
     *
     * @return the statistic
     */
    public double gStatistic() {
        return gStatistic;
    }

    /**
     * Returns the p-value of the G-test of goodness of fit.
     *
     * @return the p-value in [0, 1]
     */
    public double gTestPValue() {
        return gP;
    }

    /**
     * Returns the number of groups the tests compared after merging sparse outcomes.
     *
     * @return the group count
     */
    public int groups() {
        return groups;
    }

    /**
     * Returns the degrees of freedom of both tests, {@code groups() - 1} (0 with one group).
     *
     * @return the degrees of freedom
     */
    public int degreesOfFreedom() {
        return Math.max(0, groups - 1);
    }

    /**
     * Returns the number of shots on outcomes whose predicted probability is at most
     * {@value #IMPOSSIBLE}.
     *
     * @return the count
     */
    public long impossible() {
        return impossible;
    }

    /**
     * Returns every outcome that was seen or predicted, the largest absolute standardized
     * residual first (ties, such as several outcomes seen although predicted impossible, by
     * larger count, then by bitstring).
     *
     * @return an unmodifiable list
     */
    public List<Deviation> deviations() {
        return deviations;
    }

    /**
     * Tells whether the tally agrees with the prediction at significance {@code alpha}: both
     * p-values are at least {@code alpha} and no shot landed on an impossible outcome.
     *
     * @param alpha the significance level, in (0, 1), such as 0.01
     * @return whether the comparison passes
     * @throws IllegalArgumentException if {@code alpha} is not in (0, 1)
     */
    public boolean passes(double alpha) {
        Checks.requireOpenUnit(alpha, "the significance level");
        return chiSquareP >= alpha && gP >= alpha && impossible == 0;
    }

    /**
     * Returns a plain-text report: the figures above, the verdict at {@code alpha}, and the
     * {@code top} outcomes that deviate most.
     *
     * @param alpha the significance level, in (0, 1)
     * @param top how many outcomes to list, at least 0
     * @return the report, lines ending in {@code '\n'}
     * @throws IllegalArgumentException if {@code alpha} or {@code top} is out of range
     */
    public String report(double alpha, int top) {
        Checks.requireOpenUnit(alpha, "the significance level");
        Checks.requireAtLeast(top, 0, "the number of outcomes to list");
        StringBuilder sb = new StringBuilder();
        sb.append(f("shots                      %d%n", shots));
        sb.append(f("total variation distance   %.4f  (%.0f%% interval %.4f to %.4f)%n", tvd,
                confidence * 100, tvdLow, tvdHigh));
        sb.append(f("Hellinger fidelity         %.4f%n", fidelity));
        sb.append(f("chi-square                 %.3f on %d df, p = %.4g%n", chiSquare,
                degreesOfFreedom(), chiSquareP));
        sb.append(f("G-test                     %.3f on %d df, p = %.4g%n", gStatistic,
                degreesOfFreedom(), gP));
        sb.append(f("groups after merging       %d (each expects at least %.0f)%n", groups,
                MIN_EXPECTED));
        sb.append(f("shots on impossible        %d%n", impossible));
        sb.append(f("%-27s%s%n", "verdict at alpha " + alpha, passes(alpha) ? "PASS" : "FAIL"));
        int shown = Math.min(top, deviations.size());
        if (shown > 0) {
            sb.append(f("%nlargest deviations%n"));
            sb.append(f("  %-" + Math.max(4, width) + "s %10s %12s %10s%n", "bits", "observed",
                    "expected", "residual"));
            for (int i = 0; i < shown; i++) {
                Deviation d = deviations.get(i);
                sb.append(f("  %-" + Math.max(4, width) + "s %10d %12.2f %+10.2f%n", d.bits(),
                        d.observed(), d.expected(), d.residual()));
            }
        }
        return sb.toString();
    }

    private static String f(String format, Object... args) {
        return String.format(Locale.ROOT, format, args).replace(System.lineSeparator(), "\n");
    }

    /**
     * Returns a one-line summary of the figures.
     *
     * @return the summary
     */
    @Override
    public String toString() {
        return f("TallyComparison[shots=%d, tvd=%.4f, fidelity=%.4f, chi2 p=%.4g, G p=%.4g,"
                + " groups=%d, impossible=%d]", shots, tvd, fidelity, chiSquareP, gP, groups,
                impossible);
    }
}
