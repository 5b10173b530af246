package dev.qsim.stats;

import java.math.BigDecimal;
import java.math.MathContext;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;

import org.apache.commons.statistics.distribution.BetaDistribution;
import org.apache.commons.statistics.inference.ChiSquareTest;
import org.apache.commons.statistics.inference.GTest;
import org.apache.commons.statistics.inference.SignificanceResult;

import dev.qsim.Tally;
import dev.qsim.internal.Checks;

/**
 * How well a measured {@link Tally} agrees with a predicted distribution over its outcomes, and
 * a verdict a user can act on: an immutable result, computed once by
 * {@link #of(Tally, double[], ComparisonSettings)} and its shorter forms. Thread-safe.
 *
 * <p><b>Verdict.</b> No prediction of a real device is exact, so "does the tally differ from
 * the prediction at all?" is the wrong question: with enough shots every device differs. The
 * comparison asks instead whether the device is <i>within a tolerance</i> of the prediction, a
 * test of equivalence (Wellek 2010, <i>Testing Statistical Hypotheses of Equivalence and
 * Noninferiority</i>, 2nd ed., the principle of confidence interval inclusion; from memory):
 * it {@linkplain #passes() passes} when the upper end of the confidence interval of the total
 * variation distance is at most the tolerance ({@link ComparisonSettings#DEFAULT_TOLERANCE} by
 * default, justified there). The upper end of a two-sided interval of level {@code c} is a
 * one-sided bound of level {@code (1 + c) / 2}, so a pass rejects "the distance exceeds the
 * tolerance" at significance {@code (1 - c) / 2} (0.025 by default). A failure says either
 * that the device is farther than the tolerance or that the tally is too small to show it is
 * not; {@link #reason()} tells which bound decided.
 *
 * <p><b>Figures.</b> With {@code n} shots, observed frequencies {@code f_i = count_i / n} and
 * predicted probabilities {@code p_i}:
 * <ul>
 *   <li>the total variation distance {@code TVD = ½ Σ |f_i - p_i|} (Levin, Peres and Wilmer
 *       2017, <i>Markov Chains and Mixing Times</i>, 2nd ed., §4.1) as observed
 *       ({@link #observedDistance()}), an estimate corrected for its upward bias
 *       ({@link #distance()}) and a confidence interval ({@link #distanceLow()},
 *       {@link #distanceHigh()}) that contains the estimate. The observed distance is biased
 *       upward, most near 0: sampling noise alone makes {@code f} differ from a perfect
 *       prediction. The interval inverts Monte Carlo tests (Neyman 1937): for each candidate
 *       distance {@code d} it draws seeded tallies from the distribution at distance {@code d}
 *       that best fits the tally (maximum likelihood, a parametric bootstrap: Davison and
 *       Hinkley 1997, §4.2; from memory) and keeps {@code d} unless the observed distance
 *       falls in a tail of theirs; the tails are one-sided at {@code d = 0} and central away
 *       from it (after Feldman and Cousins 1998), so that the interval reaches its nominal
 *       coverage also when the device is perfect. The estimate is the candidate at which the
 *       observed distance is the median draw (median-unbiased; Lehmann and Romano 2005,
 *       §3.5). When the tally is more regular than a perfect device's would be, the upper end
 *       is held at that of a typical perfect tally (power-constrained limits, Cowan et al.
 *       2011), so that "too good" data do not yield an interval of width 0. Measured coverage
 *       of the 95 % interval (500 seeded tallies per setting, {@code
 *       TallyComparisonCoverageTest}; predictions with 4, 16 and 32 outcomes, 200 to 2000
 *       shots, true distances 0 to 0.1 from depolarizing noise and bit flips): 93.6 to
 *       96.8 %. Coverage depends on how the departure is spread, which no interval of this
 *       distance escapes (it is a non-smooth function of the probabilities: Cai and Low 2011,
 *       Annals of Statistics 39(2), 1012-1041, from memory). In our simulations of 1000
 *       tallies each, a departure of 0.05 concentrated on 2 of 16 outcomes (2000 shots) gave
 *       91.6 %, and a true distance of 0.033 with 200 shots over 16 outcomes, where the power
 *       constraint acts, 97.5 %;</li>
 *   <li>when the prediction is itself a sample of {@code M} shots
 *       ({@link ComparisonSettings#withPredictionShots(long)}), the draws also resample the
 *       prediction, so the interval widens by the prediction's own sampling error;</li>
 *   <li>the Bhattacharyya coefficient {@code BC = Σ sqrt(f_i p_i)} (Bhattacharyya 1943, "On a
 *       measure of divergence between two statistical populations defined by their probability
 *       distributions", Bull. Calcutta Math. Soc. 35, 99-109), the Hellinger distance
 *       {@code H = sqrt(1 - BC)} (Le Cam and Yang 2000, <i>Asymptotics in Statistics</i>, 2nd
 *       ed., §3.2, from memory) and the classical fidelity {@code F = BC²} (Nielsen and Chuang
 *       2010, <i>Quantum Computation and Quantum Information</i>, §9.2.2, eq. 9.32,
 *       squared);</li>
 *   <li>Pearson's chi-square and the G-test (log-likelihood ratio) of goodness of fit, with
 *       p-values from Apache Commons Statistics {@link ChiSquareTest} and {@link GTest} (Agresti
 *       2013, <i>Categorical Data Analysis</i>, 3rd ed., §1.5), after merging sparse outcomes so
 *       that every group expects at least {@value #MIN_EXPECTED} counts, the rule of thumb from
 *       Cochran (1954), "Some methods for strengthening the common χ² tests", Biometrics 10(4),
 *       417-451, doi:10.2307/3001616. They answer "is the prediction exact?", which a large
 *       enough tally always denies, so they are reported for information and do not enter the
 *       verdict;</li>
 *   <li>every outcome's standardized residual, largest deviation first ({@link #deviations()}),
 *       and the shots that landed on outcomes predicted impossible ({@link #impossible()}) as a
 *       rate with its Clopper-Pearson exact binomial interval ({@link #impossibleRateLow()},
 *       {@link #impossibleRateHigh()}; Clopper and Pearson 1934, "The use of confidence or
 *       fiducial limits illustrated in the case of the binomial", Biometrika 26(4), 404-413),
 *       from the beta quantiles of Commons Statistics. Such shots count in the distance like
 *       any other departure; they do not fail the comparison by themselves.</li>
 * </ul>
 *
 * <p>Merging: outcomes whose expected count {@code n p_i} is below {@value #MIN_EXPECTED} are
 * pooled into one group; if that pool still expects fewer than {@value #MIN_EXPECTED}, the
 * outcome with the smallest expected count among the others joins it, and so on. With fewer
 * than two groups left the tests have no degrees of freedom: both statistics are 0 with
 * p-value 1 (a one-cell multinomial always matches its prediction).
 *
 * <p>Cost: about 10 to 40 rounds of {@link ComparisonSettings#resamples()} draws, each draw
 * {@code min(shots, outcomes)} steps or so, spread over the settings' threads; a 1024-outcome
 * tally of 4000 shots took 80 to 210 ms of processor time with the defaults (JDK 17, a shared
 * 2-core machine). Results depend only on the tally, the prediction and the settings, not on
 * the thread count.
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
    /** The largest tally width the array form accepts: {@value}. */
    public static final int MAX_ARRAY_WIDTH = 26;

    private final int width;
    private final long shots;
    private final ComparisonSettings settings;
    private final double observed;
    private final double estimate;
    private final double low;
    private final double high;
    private final double bhattacharyya;
    private final double chiSquare;
    private final double chiSquareP;
    private final double gStatistic;
    private final double gP;
    private final int groups;
    private final long impossible;
    private final double impossibleLow;
    private final double impossibleHigh;
    private final List<Deviation> deviations;

    private TallyComparison(int width, long shots, String[] bits, double[] p, long[] obs,
            ComparisonSettings settings) {
        this.width = width;
        this.shots = shots;
        this.settings = settings;
        int m = bits.length;
        double n = shots;
        double bc = 0;
        long imp = 0;
        List<Deviation> devs = new ArrayList<>(m);
        for (int i = 0; i < m; i++) {
            double f = obs[i] / n;
            bc += Math.sqrt(f * p[i]);
            double e = n * p[i];
            double r = e > 0 ? (obs[i] - e) / Math.sqrt(e)
                    : (obs[i] > 0 ? Double.POSITIVE_INFINITY : 0);
            devs.add(new Deviation(bits[i], obs[i], e, r));
            if (obs[i] > 0 && p[i] <= IMPOSSIBLE) {
                imp += obs[i];
            }
        }
        this.bhattacharyya = Math.min(1, bc);
        this.impossible = imp;
        double alpha = 1 - settings.confidence();
        // Clopper and Pearson 1934: beta quantiles of the exact binomial interval.
        impossibleLow = imp == 0 ? 0 : BetaDistribution.of(imp, shots - imp + 1.0)
                .inverseCumulativeProbability(alpha / 2);
        impossibleHigh = imp == shots ? 1 : BetaDistribution.of(imp + 1.0, (double) shots - imp)
                .inverseCumulativeProbability(1 - alpha / 2);
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
        DistanceInterval interval = new DistanceInterval(obs, p, shots,
                settings.predictionShots(), Math.scalb(1.0, width), settings.confidence(),
                settings.resamples(), settings.seed(), settings.threads());
        this.observed = interval.observed();
        this.estimate = interval.estimate();
        this.low = interval.low();
        this.high = interval.high();
    }

    /**
     * Compares a tally with predicted probabilities indexed by outcome value, with
     * {@link ComparisonSettings#defaults()}.
     *
     * @param tally the measured counts
     * @param predicted {@code 2^width} probabilities: entry {@code i} is the outcome whose binary
     *     value is {@code i}; finite, non-negative, summing to 1 within {@value #SUM_TOLERANCE}
     * @return the comparison
     * @throws IllegalArgumentException if the length or an entry of {@code predicted} is bad
     */
    public static TallyComparison of(Tally tally, double[] predicted) {
        return of(tally, predicted, ComparisonSettings.defaults());
    }

    /**
     * Compares a tally with predicted probabilities indexed by outcome value, with the default
     * tolerance and the given seed, draws and confidence level.
     *
     * @param tally the measured counts, width at most {@value #MAX_ARRAY_WIDTH}
     * @param predicted {@code 2^width} probabilities: entry {@code i} is the outcome whose binary
     *     value is {@code i}; finite, non-negative, summing to 1 within {@value #SUM_TOLERANCE}
     * @param seed seed of the Monte Carlo draws
     * @param resamples draws per candidate distance, at least
     *     {@value ComparisonSettings#MIN_RESAMPLES}
     * @param confidence the confidence level of the intervals, in (0, 1)
     * @return the comparison
     * @throws IllegalArgumentException if the length or an entry of {@code predicted} is bad,
     *     the tally is too wide, or an option is out of range
     */
    public static TallyComparison of(Tally tally, double[] predicted, long seed, int resamples,
            double confidence) {
        return of(tally, predicted, ComparisonSettings.defaults().withSeed(seed)
                .withResamples(resamples).withConfidence(confidence));
    }

    /**
     * Compares a tally with predicted probabilities indexed by outcome value.
     *
     * @param tally the measured counts, width at most {@value #MAX_ARRAY_WIDTH}
     * @param predicted {@code 2^width} probabilities: entry {@code i} is the outcome whose binary
     *     value is {@code i}; finite, non-negative, summing to 1 within {@value #SUM_TOLERANCE}
     * @param settings the tolerance, confidence level, draws, seed, prediction shots, threads
     * @return the comparison
     * @throws IllegalArgumentException if the length or an entry of {@code predicted} is bad or
     *     the tally is too wide
     */
    public static TallyComparison of(Tally tally, double[] predicted,
            ComparisonSettings settings) {
        Objects.requireNonNull(settings, "settings");
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
        return new TallyComparison(w, tally.shots(), bits, p, obs, settings);
    }

    /**
     * Compares a tally with predicted probabilities by bitstring, with
     * {@link ComparisonSettings#defaults()}.
     *
     * @param tally the measured counts
     * @param predicted probability per bitstring of the tally's width; missing outcomes have
     *     probability 0; finite, non-negative, summing to 1 within {@value #SUM_TOLERANCE}
     * @return the comparison
     * @throws IllegalArgumentException if a key or value of {@code predicted} is bad
     */
    public static TallyComparison of(Tally tally, Map<String, Double> predicted) {
        return of(tally, predicted, ComparisonSettings.defaults());
    }

    /**
     * Compares a tally with predicted probabilities by bitstring, with the default tolerance
     * and the given seed, draws and confidence level.
     *
     * @param tally the measured counts
     * @param predicted probability per bitstring of the tally's width; missing outcomes have
     *     probability 0; finite, non-negative, summing to 1 within {@value #SUM_TOLERANCE}
     * @param seed seed of the Monte Carlo draws
     * @param resamples draws per candidate distance, at least
     *     {@value ComparisonSettings#MIN_RESAMPLES}
     * @param confidence the confidence level of the intervals, in (0, 1)
     * @return the comparison
     * @throws IllegalArgumentException if a key or value of {@code predicted} is bad, or an
     *     option is out of range
     */
    public static TallyComparison of(Tally tally, Map<String, Double> predicted, long seed,
            int resamples, double confidence) {
        return of(tally, predicted, ComparisonSettings.defaults().withSeed(seed)
                .withResamples(resamples).withConfidence(confidence));
    }

    /**
     * Compares a tally with predicted probabilities by bitstring.
     *
     * @param tally the measured counts
     * @param predicted probability per bitstring of the tally's width; missing outcomes have
     *     probability 0; finite, non-negative, summing to 1 within {@value #SUM_TOLERANCE}
     * @param settings the tolerance, confidence level, draws, seed, prediction shots, threads
     * @return the comparison
     * @throws IllegalArgumentException if a key or value of {@code predicted} is bad
     */
    public static TallyComparison of(Tally tally, Map<String, Double> predicted,
            ComparisonSettings settings) {
        Objects.requireNonNull(settings, "settings");
        Objects.requireNonNull(tally, "tally");
        Objects.requireNonNull(predicted, "predicted");
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
        return new TallyComparison(w, tally.shots(), bits, p, obs, settings);
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
     * Returns the settings the comparison was made with.
     *
     * @return the settings
     */
    public ComparisonSettings settings() {
        return settings;
    }

    /**
     * Returns the observed total variation distance {@code ½ Σ |f_i - p_i|}, in [0, 1]: the
     * plug-in value, biased upward by sampling noise.
     *
     * @return the observed distance
     */
    public double observedDistance() {
        return observed;
    }

    /**
     * Returns the estimate of the total variation distance between the distribution behind the
     * tally and the prediction, corrected for the upward bias of the observed distance
     * (median-unbiased); it lies in {@code [distanceLow(), distanceHigh()]}.
     *
     * @return the estimate, in [0, 1]
     */
    public double distance() {
        return estimate;
    }

    /**
     * Returns the lower end of the confidence interval of the total variation distance.
     *
     * @return the lower end
     */
    public double distanceLow() {
        return low;
    }

    /**
     * Returns the upper end of the confidence interval of the total variation distance; the
     * verdict compares it with the tolerance.
     *
     * @return the upper end
     */
    public double distanceHigh() {
        return high;
    }

    /**
     * Returns the confidence level of the intervals.
     *
     * @return the level in (0, 1)
     */
    public double confidence() {
        return settings.confidence();
    }

    /**
     * Returns the tolerance: the largest total variation distance that passes.
     *
     * @return the tolerance, in (0, 1]
     */
    public double tolerance() {
        return settings.tolerance();
    }

    /**
     * Tells whether the device is within the tolerance of the prediction: the upper end of the
     * distance's confidence interval is at most {@link #tolerance()}. The goodness-of-fit tests
     * and the shots on impossible outcomes do not enter this verdict.
     *
     * @return whether the comparison passes
     */
    public boolean passes() {
        return high <= settings.tolerance();
    }

    /**
     * Returns the reason for the verdict in one sentence, such as "the 95% interval's upper
     * end 0.0123 is within the tolerance 0.05".
     *
     * @return the reason
     */
    public String reason() {
        String level = f("%s%%", number(settings.confidence() * 100));
        if (passes()) {
            return f("the %s interval's upper end %.4f is within the tolerance %s", level, high,
                    number(settings.tolerance()));
        }
        if (low > settings.tolerance()) {
            return f("the %s interval's lower end %.4f exceeds the tolerance %s: the device is"
                    + " farther from the prediction", level, low, number(settings.tolerance()));
        }
        return f("the %s interval's upper end %.4f exceeds the tolerance %s; more shots may"
                + " narrow the interval", level, high, number(settings.tolerance()));
    }

    /**
     * Returns the Bhattacharyya coefficient {@code BC = Σ sqrt(f_i p_i)}, in [0, 1]; 1 when the
     * observed frequencies equal the prediction.
     *
     * @return the coefficient
     */
    public double bhattacharyyaCoefficient() {
        return bhattacharyya;
    }

    /**
     * Returns the Hellinger distance {@code H = sqrt(1 - BC)}, in [0, 1]; 0 when the observed
     * frequencies equal the prediction.
     *
     * @return the distance
     */
    public double hellingerDistance() {
        return Math.sqrt(1 - bhattacharyya);
    }

    /**
     * Returns the classical fidelity {@code F = BC² = (Σ sqrt(f_i p_i))²}, in [0, 1]; 1 when
     * the observed frequencies equal the prediction.
     *
     * @return the fidelity
     */
    public double classicalFidelity() {
        return bhattacharyya * bhattacharyya;
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
     * Returns the share of shots on outcomes predicted impossible, {@code impossible() /
     * shots()}.
     *
     * @return the rate, in [0, 1]
     */
    public double impossibleRate() {
        return impossible / (double) shots;
    }

    /**
     * Returns the lower end of the Clopper-Pearson interval of the rate of shots on outcomes
     * predicted impossible, at the comparison's confidence level.
     *
     * @return the lower end, 0 when no shot landed there
     */
    public double impossibleRateLow() {
        return impossibleLow;
    }

    /**
     * Returns the upper end of the Clopper-Pearson interval of the rate of shots on outcomes
     * predicted impossible, at the comparison's confidence level.
     *
     * @return the upper end
     */
    public double impossibleRateHigh() {
        return impossibleHigh;
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
     * Returns a plain-text report: the distance with its interval, the tolerance, the verdict
     * and its reason, the other figures, and the {@code top} outcomes that deviate most.
     *
     * @param top how many outcomes to list, at least 0
     * @return the report, lines ending in {@code '\n'}
     * @throws IllegalArgumentException if {@code top} is negative
     */
    public String report(int top) {
        Checks.requireAtLeast(top, 0, "the number of outcomes to list");
        StringBuilder sb = new StringBuilder();
        String level = number(settings.confidence() * 100) + "%";
        sb.append(f("shots                      %d%n", shots));
        if (settings.predictionShots() > 0) {
            sb.append(f("prediction                 sampled, %d shots%n",
                    settings.predictionShots()));
        }
        sb.append(f("total variation distance   %.4f (observed %.4f), %s interval %.4f to %.4f%n",
                estimate, observed, level, low, high));
        sb.append(f("tolerance                  %s%n", number(settings.tolerance())));
        sb.append(f("verdict                    %s: %s%n", passes() ? "PASS" : "FAIL", reason()));
        sb.append(f("Hellinger distance         %.4f (Bhattacharyya coefficient %.4f,"
                + " classical fidelity %.4f)%n", hellingerDistance(), bhattacharyya,
                classicalFidelity()));
        sb.append(f("chi-square                 %.3f on %d df, p = %.4g (information only)%n",
                chiSquare, degreesOfFreedom(), chiSquareP));
        sb.append(f("G-test                     %.3f on %d df, p = %.4g (information only)%n",
                gStatistic, degreesOfFreedom(), gP));
        sb.append(f("groups after merging       %d (each expects at least %.0f)%n", groups,
                MIN_EXPECTED));
        sb.append(f("shots on impossible        %d of %d, rate %s (%s interval %s to %s)%n",
                impossible, shots, rate(impossibleRate()), level, rate(impossibleLow),
                rate(impossibleHigh)));
        int shown = Math.min(top, deviations.size());
        if (shown > 0) {
            sb.append(f("%nlargest deviations%n"));
            sb.append(f("  %-" + Math.max(4, width) + "s %10s %12s %10s%n", "bits", "observed",
                    "expected", "residual"));
            for (int i = 0; i < shown; i++) {
                Deviation d = deviations.get(i);
                String residual = Double.isInfinite(d.residual()) ? "impossible"
                        : f("%+.2f", d.residual());
                sb.append(f("  %-" + Math.max(4, width) + "s %10d %12.2f %10s%n", d.bits(),
                        d.observed(), d.expected(), residual));
            }
        }
        return sb.toString();
    }

    /** A setting as typed: 0.05, 95, 0.001 (no trailing zeros, no exponent). */
    private static String number(double v) {
        return BigDecimal.valueOf(v).round(new MathContext(6)).stripTrailingZeros()
                .toPlainString();
    }

    /** A rate: four decimals from 0.001 on, two significant digits below, 0 as 0. */
    private static String rate(double v) {
        if (v == 0) {
            return "0";
        }
        return v >= 1e-3 ? f("%.4f", v) : f("%.2g", v);
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
        return f("TallyComparison[shots=%d, distance=%.4f in [%.4f, %.4f], observed=%.4f,"
                + " tolerance=%s, %s, hellinger=%.4f, chi2 p=%.4g, G p=%.4g, groups=%d,"
                + " impossible=%d]", shots, estimate, low, high, observed,
                number(settings.tolerance()), passes() ? "pass" : "fail", hellingerDistance(),
                chiSquareP, gP, groups, impossible);
    }
}
