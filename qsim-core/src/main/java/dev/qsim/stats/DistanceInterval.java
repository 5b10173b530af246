package dev.qsim.stats;

import java.util.Arrays;
import java.util.HashMap;
import java.util.Map;

import dev.qsim.kernel.Parallel;

/**
 * The confidence interval and point estimate of the total variation distance between the
 * distribution behind a tally and a prediction, by inverting a family of Monte Carlo tests.
 * Internal; {@link TallyComparison} documents the method for users.
 *
 * <p>Notation: {@code n} shots with frequencies {@code f}, prediction {@code q} (itself the
 * frequencies of {@code M} shots when {@code M > 0}), observed distance
 * {@code T = TVD(f, q)}. For a candidate distance {@code d} a reference pair {@code (p_d, q_d)}
 * with {@code TVD(p_d, q_d) = d} is fitted to the data; {@code resamples} seeded draws of
 * {@code n} shots from {@code p_d} (and {@code M} shots from {@code q_d}) give reference
 * distances {@code T*}. The candidate is kept when {@code T} lies inside the acceptance region
 * of the reference (Neyman 1937, "Outline of a theory of statistical estimation based on the
 * classical theory of probability", Phil. Trans. R. Soc. A 236, 333-380: the interval is the
 * set of kept candidates). Details, each chosen by measured coverage:
 * <ul>
 *   <li>{@code p_d} is the maximum-likelihood distribution at distance {@code d} from
 *       {@code q}: simulating from the fit under the hypothesis tested is the parametric
 *       bootstrap test (Davison and Hinkley 1997, <i>Bootstrap Methods and their
 *       Application</i>, §4.2, from memory). Its Lagrange conditions give, with ratios
 *       {@code r_i = f_i / q_i}, {@code p_i = f_i / a} where {@code r_i > a},
 *       {@code p_i = f_i / b} where {@code r_i < b}, and {@code p_i = q_i} between, with
 *       {@code b <= 1 <= a} solved exactly from the excess and deficit masses, each equal to
 *       {@code d} (below {@code T}); above {@code T} the same form with {@code a < 1 < b}
 *       amplifies the observed departure, up to emptying the cells seen below prediction. A
 *       straight line from {@code q} to {@code f} was tried first: its reference spreads the
 *       sampling noise of {@code f} over every cell and lost coverage (70 % in our simulation
 *       of a departure on two of sixteen outcomes, 2000 shots).</li>
 *   <li>When the tally matches the prediction exactly ({@code T = 0}) the family mixes
 *       {@code q} with the uniform distribution over all outcomes (global depolarizing noise).
 *   </li>
 *   <li>With {@code M > 0}, {@code q_d} runs from the pooled frequencies
 *       {@code (n f + M q) / (n + M)} at {@code d = 0} (the maximum-likelihood common
 *       distribution) to {@code q} at {@code d >= T}, and {@code p_d} is fitted against
 *       {@code q_d}.</li>
 *   <li>Acceptance region: {@code T} is kept unless fewer than a share {@code alpha (1 - w)} of
 *       the draws lie above it or fewer than {@code alpha w} below it, ties counted half (the
 *       mid-p rule, Lancaster 1961, JASA 56, 223-234), with {@code alpha = 1 - confidence}.
 *       The lower-tail share {@code w = min(1, d / (2 s0)) / 2}, {@code s0} the spread of
 *       {@code T*} at {@code d = 0}, makes the region one-sided at the boundary {@code d = 0}
 *       and central away from it, as in the unified intervals of Feldman and Cousins 1998
 *       (Phys. Rev. D 57, 3873-3889), so that the coverage at distance 0 is nominal rather than
 *       {@code 1 - alpha / 2}.</li>
 *   <li>Point estimate: the candidate at which {@code T} is the median of {@code T*}, 0 when
 *       {@code T} lies below the median at {@code d = 0}: a median-unbiased estimate, the
 *       interval of confidence 0 (Lehmann and Romano 2005, <i>Testing Statistical
 *       Hypotheses</i>, 3rd ed., §3.5, from memory). The bounds are searched on either side
 *       of it, so the interval contains it.</li>
 *   <li>Power constraint: when {@code T} is smaller than {@value #POWER_QUANTILE} of the
 *       distances a perfect device gives, the inversion alone would return an upper end near
 *       0 (the tally is more regular than sampling allows, a known trait of unified
 *       intervals); the upper end is then raised to the one that tally at that quantile would
 *       get, the power-constrained limit of Cowan, Cranmer, Gross and Vitells 2011,
 *       "Power-constrained limits", arXiv:1105.3166 (from memory). It only adds coverage.</li>
 * </ul>
 * Each candidate draws with the same seeds (common random numbers), so the tail shares change
 * smoothly with {@code d}; the bisections stop at a bracket of {@link #PRECISION} or less and
 * keep the outer end. Draw {@code j} uses its own generator seeded from the seed and
 * {@code j}, so results do not depend on the thread count.
 */
final class DistanceInterval {
    /**
     * The searches stop at a bracket of a 16th of the spread of the reference distance at 0
     * (half the Monte Carlo error of the bounds with 400 draws, about an 8th), at most
     * {@value} and at least a 50th of it.
     */
    static final double PRECISION = 5e-4;
    private static final double TIE = 1e-12;
    /**
     * The power constraint's quantile of a perfect device's distances: {@value} (the "minus one
     * sigma" point).
     */
    static final double POWER_QUANTILE = 0.16;

    /**
     * Draws are summed over the cells they reach only when all their shots number at most the
     * cells over this: a margin for the sparse sum's extra work per cell it visits (the list of
     * cells, scattered reads instead of a stream); chosen, not tuned.
     */
    private static final int SPARSE_SHARE = 4;

    private final int k;
    private final int tallyCells;
    private final double[] f;
    private final double[] q;
    private final long shots;
    private final long predictionShots;
    private final double outcomes;
    private final int[] above;
    private final int[] below;
    private final int[] unseenBelow;
    private final double observed;
    private final double alpha;
    private final int resamples;
    private final long seed;
    private final int threads;
    private final Map<Double, double[]> cache = new HashMap<>();
    private double spread0;
    private double threshold;
    private double tolerance;

    private double estimate;
    private double low;
    private double high;

    /**
     * Computes the interval.
     *
     * @param counts counts per cell
     * @param predicted predicted probability per cell (the prediction's frequencies when
     *     {@code predictionShots > 0}); the cells hold every outcome seen or predicted possible
     * @param shots the tally's shots, the sum of {@code counts}
     * @param predictionShots the prediction's shots, or 0 for an exact prediction
     * @param outcomes the number of possible outcomes, {@code 2^width}, at least the cell count
     * @param confidence the confidence level in (0, 1)
     * @param resamples draws per candidate distance
     * @param seed the seed
     * @param threads threads for the draws
     */
    DistanceInterval(long[] counts, double[] predicted, long shots, long predictionShots,
            double outcomes, double confidence, int resamples, long seed, int threads) {
        boolean rest = outcomes > counts.length;
        this.tallyCells = counts.length;
        this.k = counts.length + (rest ? 1 : 0);
        this.f = new double[k];
        this.q = new double[k];
        for (int i = 0; i < counts.length; i++) {
            f[i] = counts[i] / (double) shots;
            q[i] = predicted[i];
        }
        this.shots = shots;
        this.predictionShots = predictionShots;
        this.outcomes = outcomes;
        this.alpha = 1 - confidence;
        this.resamples = resamples;
        this.seed = seed;
        this.threads = threads;
        this.observed = tvd(f, q);
        Integer[] up = cells(+1);
        Integer[] down = cells(-1);
        Arrays.sort(up, (x, y) -> Double.compare(ratio(y), ratio(x)));
        Arrays.sort(down, (x, y) -> Double.compare(ratio(x), ratio(y)));
        this.above = unbox(up);
        this.below = unbox(down);
        int unseen = 0;
        while (unseen < below.length && f[below[unseen]] == 0) {
            unseen++;
        }
        this.unseenBelow = Arrays.copyOf(below, unseen);
        search();
    }

    private Integer[] cells(int sign) {
        int count = 0;
        for (int i = 0; i < k; i++) {
            if (Double.compare(f[i], q[i]) == sign) {
                count++;
            }
        }
        Integer[] out = new Integer[count];
        count = 0;
        for (int i = 0; i < k; i++) {
            if (Double.compare(f[i], q[i]) == sign) {
                out[count++] = i;
            }
        }
        return out;
    }

    private static int[] unbox(Integer[] a) {
        int[] out = new int[a.length];
        for (int i = 0; i < a.length; i++) {
            out[i] = a[i];
        }
        return out;
    }

    /** {@code f_i / q_i}, infinite where only the tally has mass. */
    private double ratio(int i) {
        return q[i] > 0 ? f[i] / q[i] : Double.POSITIVE_INFINITY;
    }

    private static double tvd(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += Math.abs(a[i] - b[i]);
        }
        return 0.5 * s;
    }

    /** The largest candidate distance the reference family reaches. */
    private double reach() {
        if (observed > 0) {
            double s = 0;
            for (int i : below) {
                s += q[i];
            }
            return s;
        }
        return tvd(fallbackTarget(q), q);
    }

    private void search() {
        double hi = reach();
        threshold = observed;
        double[] at0 = tails(0);
        double[] null0 = draws(0);
        double sum = 0;
        double sumSq = 0;
        for (double t : null0) {
            sum += t;
        }
        double mean = sum / resamples;
        for (double t : null0) {
            sumSq += (t - mean) * (t - mean);
        }
        spread0 = Math.sqrt(sumSq / resamples);
        tolerance = Math.max(PRECISION / 50, Math.min(PRECISION, spread0 / 16));
        // Estimate: where T is the median of T*; below T unless T lies below its own median.
        Gap median = d -> tails(d)[1] - 0.5;
        double est;
        if (at0[1] >= 0.5) {
            est = 0;
        } else {
            // First guess: the observed distance less the mean reference distance at 0.
            double a = 0;
            double ga = at0[1] - 0.5;
            double guess = Math.max(0, observed - mean - 2 * spread0);
            if (guess > 0) {
                double g = median.at(guess);
                if (g < 0) {
                    a = guess;
                    ga = g;
                }
            }
            double[] br = bracket(median, a, ga, Math.min(hi, Math.max(a + 4 * spread0,
                    a + tolerance)), hi);
            est = br == null ? hi : 0.5 * (br[0] + br[2]);
        }
        // Lower bound: the smallest d whose upper tail share reaches alpha (1 - w).
        Gap lower = d -> tails(d)[1] - alpha * (1 - share(d));
        double lo = 0;
        if (at0[1] < alpha && est > 0) {
            double a = 0;
            double ga = at0[1] - alpha;
            double guess = est - 4 * spread0;
            if (guess > 0) {
                double g = lower.at(guess);
                if (g < 0) {
                    a = guess;
                    ga = g;
                }
            }
            lo = boundary(lower, a, ga, est, lower.at(est))[2];
        }
        // Upper bound: the largest d whose lower tail share reaches alpha w.
        Gap upper = d -> alpha * share(d) - tails(d)[0];
        double up = upperBound(upper, est, hi);
        // Power constraint: not below the upper end that a tally at the 16th percentile of a
        // perfect device's distances would get (Cowan, Cranmer, Gross and Vitells 2011).
        double floor = null0[(int) Math.floor(POWER_QUANTILE * (resamples - 1))];
        if (observed < floor) {
            threshold = floor;
            up = Math.max(up, upperBound(upper, 0, hi));
            threshold = observed;
        }
        this.estimate = est;
        this.low = Math.min(lo, est);
        this.high = Math.max(up, est);
    }

    private double upperBound(Gap upper, double from, double hi) {
        double[] br = bracket(upper, from, upper.at(from), Math.min(hi,
                from + Math.max(4 * spread0, 4 * tolerance)), hi);
        return br == null ? hi : br[0];
    }

    /** A function of the candidate distance whose sign change marks a bound. */
    @FunctionalInterface
    private interface Gap {
        double at(double d);
    }

    /**
     * Steps right from {@code a} (where {@code gap < 0}) to {@code b}, doubling the step,
     * until {@code gap >= 0}, then narrows the bracket; null when {@code gap < 0} even at
     * {@code hi}.
     */
    private double[] bracket(Gap gap, double a, double ga, double b, double hi) {
        double step = Math.max(b - a, tolerance);
        double gb = gap.at(b);
        while (gb < 0) {
            if (b >= hi) {
                return null;
            }
            a = b;
            ga = gb;
            step *= 2;
            b = Math.min(hi, b + step);
            gb = gap.at(b);
        }
        return boundary(gap, a, ga, b, gb);
    }

    /**
     * Bisects {@code [a, b]} with {@code gap(a) < 0 <= gap(b)} down to the tolerance (the
     * gap is a step function of Monte Carlo counts, so interpolation gains little). Returns
     * {@code {a, gap(a), b, gap(b)}}.
     */
    private double[] boundary(Gap gap, double a, double ga, double b, double gb) {
        while (b - a > tolerance) {
            double x = 0.5 * (a + b);
            double gx = gap.at(x);
            if (gx >= 0) {
                b = x;
                gb = gx;
            } else {
                a = x;
                ga = gx;
            }
        }
        return new double[] {a, ga, b, gb};
    }

    /** The lower tail's share of {@code alpha} at candidate {@code d}. */
    private double share(double d) {
        return spread0 > 0 ? 0.5 * Math.min(1, d / (2 * spread0)) : 0.5;
    }

    /**
     * Returns the shares of the reference draws at candidate {@code d} below and above the
     * current threshold (the observed distance, or the power constraint's), ties counted half.
     */
    private double[] tails(double d) {
        double[] t = draws(d);
        int below = countBelow(t, threshold - TIE);
        int tied = countBelow(t, Math.nextUp(threshold + TIE)) - below;
        return new double[] {(below + 0.5 * tied) / resamples,
                (resamples - below - tied + 0.5 * tied) / resamples};
    }

    /** The number of entries of sorted {@code t} below {@code x}. */
    private static int countBelow(double[] t, double x) {
        int lo = 0;
        int hi = t.length;
        while (lo < hi) {
            int mid = (lo + hi) >>> 1;
            if (t[mid] < x) {
                lo = mid + 1;
            } else {
                hi = mid;
            }
        }
        return lo;
    }

    /** The sorted reference distances at candidate {@code d}, drawn once. */
    private double[] draws(double d) {
        double[] known = cache.get(d);
        if (known != null) {
            return known;
        }
        double[] out = distances(d, shots + predictionShots <= k / SPARSE_SHARE);
        cache.put(d, out);
        return out;
    }

    /**
     * The sorted reference distances at candidate {@code d}, summed over every cell or, when
     * {@code sparse}, over the cells the draws reach ({@link #sparseDraws}).
     */
    double[] distances(double d, boolean sparse) {
        double[][] ref = reference(d);
        double[] p = ref[0];
        double[] center = ref[1];
        MultinomialSampler xs = new MultinomialSampler(p, shots);
        MultinomialSampler ys = predictionShots > 0
                ? new MultinomialSampler(center, predictionShots) : null;
        double n = shots;
        double m = predictionShots;
        double[] out = new double[resamples];
        if (sparse) {
            sparseDraws(xs, ys, center, out);
            Arrays.sort(out);
            return out;
        }
        Parallel.forRange(threads, resamples, resamples >= 64, (from, to) -> {
            long[] x = new long[k];
            long[] y = new long[k];
            for (long j = from; j < to; j++) {
                Arrays.fill(x, 0);
                MultinomialSampler.SplitMix rng = MultinomialSampler.SplitMix.forDraw(seed, j);
                xs.draw(rng, x);
                double s = 0;
                if (ys != null) {
                    Arrays.fill(y, 0);
                    ys.draw(rng, y);
                    for (int i = 0; i < k; i++) {
                        s += Math.abs(x[i] / n - y[i] / m);
                    }
                } else {
                    for (int i = 0; i < k; i++) {
                        s += Math.abs(x[i] / n - center[i]);
                    }
                }
                out[(int) j] = 0.5 * s;
            }
        });
        Arrays.sort(out);
        return out;
    }

    /**
     * Draws whose shots are few beside the cells: the same draws as the dense loop of
     * {@link #draws} (same generators, same counts), but each distance summed over the cells
     * the draws reached only, the untouched cells' share of the prediction added as one sum,
     * and only those cells cleared, so a draw costs its shots instead of every cell (at 16
     * qubits and 10,000 shots, 65,536 cells: the dense loop took two thirds of a comparison's
     * 2.7 s). The sums run in another order than the dense loop's, so a distance may differ
     * from it in the last bits.
     */
    private void sparseDraws(MultinomialSampler xs, MultinomialSampler ys, double[] center,
            double[] out) {
        final double n = shots;
        final double m = predictionShots;
        double all = 0;
        for (int i = 0; i < k; i++) {
            all += center[i];
        }
        final double centerSum = all;
        Parallel.forRange(threads, resamples, resamples >= 64, (from, to) -> {
            long[] x = new long[k];
            long[] y = ys != null ? new long[k] : null;
            int[] tx = new int[(int) Math.min(k, shots) + 1];
            int[] ty = ys != null ? new int[(int) Math.min(k, predictionShots) + 1] : null;
            for (long j = from; j < to; j++) {
                MultinomialSampler.SplitMix rng = MultinomialSampler.SplitMix.forDraw(seed, j);
                int cx = xs.draw(rng, x, tx);
                double s = 0;
                if (ys != null) {
                    int cy = ys.draw(rng, y, ty);
                    for (int a = 0; a < cx; a++) {
                        int i = tx[a];
                        s += Math.abs(x[i] / n - y[i] / m);
                    }
                    for (int a = 0; a < cy; a++) {
                        int i = ty[a];
                        if (x[i] == 0) {
                            s += y[i] / m;
                        }
                    }
                    for (int a = 0; a < cy; a++) {
                        y[ty[a]] = 0;
                    }
                } else {
                    double rest = centerSum;
                    for (int a = 0; a < cx; a++) {
                        int i = tx[a];
                        s += Math.abs(x[i] / n - center[i]);
                        rest -= center[i];
                    }
                    s += Math.max(0, rest);
                }
                for (int a = 0; a < cx; a++) {
                    x[tx[a]] = 0;
                }
                out[(int) j] = 0.5 * s;
            }
        });
    }

    /** The reference pair {@code {p_d, q_d}} at candidate distance {@code d}. */
    double[][] reference(double d) {
        double[] center = q;
        if (predictionShots > 0 && observed > 0) {
            double pull = Math.max(0, 1 - d / observed) * shots
                    / ((double) shots + predictionShots);
            center = new double[k];
            for (int i = 0; i < k; i++) {
                center[i] = q[i] + pull * (f[i] - q[i]);
            }
        }
        double dist = tvd(f, center);
        if (d <= 0) {
            return new double[][] {center, center};
        }
        if (dist == 0) {
            double[] g = fallbackTarget(center);
            double s = Math.min(1, d / tvd(g, center));
            double[] p = new double[k];
            for (int i = 0; i < k; i++) {
                p[i] = center[i] + s * (g[i] - center[i]);
            }
            return new double[][] {p, center};
        }
        return new double[][] {fit(center, Math.min(d, reachFrom(center)), dist), center};
    }

    private double reachFrom(double[] center) {
        double s = 0;
        for (int i : below) {
            s += center[i];
        }
        return s;
    }

    /**
     * Uniform over all outcomes (the last cell, if any beyond the tally's, stands for every
     * outcome neither seen nor predicted), or a point mass on the first cell when the
     * prediction is already uniform.
     */
    private double[] fallbackTarget(double[] center) {
        double[] g = new double[k];
        int kept = tallyCells;
        for (int i = 0; i < kept; i++) {
            g[i] = 1 / outcomes;
        }
        if (kept < k) {
            g[k - 1] = (outcomes - kept) / outcomes;
        }
        if (tvd(g, center) == 0) {
            Arrays.fill(g, 0);
            g[0] = 1;
        }
        return g;
    }

    /**
     * The maximum-likelihood distribution at distance {@code d} from {@code center}, given the
     * frequencies {@code f} at distance {@code dist > 0}.
     */
    private double[] fit(double[] center, double d, double dist) {
        double[] p = center.clone();
        if (d <= dist) {
            // Excess: cells with f_i > a c_i scaled to f_i / a, their excess summing to d.
            double sp = 0;
            double sq = 0;
            double a = 1;
            for (int j = 0; j < above.length; j++) {
                int i = above[j];
                sp += f[i];
                sq += center[i];
                a = sp / (d + sq);
                if (j == above.length - 1 || a >= ratioTo(above[j + 1], center)) {
                    break;
                }
            }
            for (int i : above) {
                if (ratioTo(i, center) > a) {
                    p[i] = f[i] / a;
                }
            }
            // Deficit: unseen cells first; then cells with f_i < b c_i scaled to f_i / b.
            double unseenMass = 0;
            for (int i : unseenBelow) {
                unseenMass += center[i];
            }
            if (d <= unseenMass) {
                for (int i : unseenBelow) {
                    p[i] = center[i] * (1 - d / unseenMass);
                }
            } else {
                sp = 0;
                sq = 0;
                double b = 1;
                for (int j = 0; j < below.length; j++) {
                    int i = below[j];
                    sp += f[i];
                    sq += center[i];
                    if (sq <= d) {
                        continue;
                    }
                    b = sp / (sq - d);
                    if (j == below.length - 1 || b <= ratioTo(below[j + 1], center)) {
                        break;
                    }
                }
                for (int i : below) {
                    if (ratioTo(i, center) < b) {
                        p[i] = f[i] / b;
                    }
                }
            }
            return p;
        }
        // Beyond the observed distance: amplify the departure, f_i / a above and f_i / b below.
        double pa = 0;
        double qa = 0;
        for (int i : above) {
            pa += f[i];
            qa += center[i];
        }
        double pb = 0;
        double qb = 0;
        for (int i : below) {
            pb += f[i];
            qb += center[i];
        }
        double a = pa / (d + qa);
        for (int i : above) {
            p[i] = f[i] / a;
        }
        for (int i : below) {
            p[i] = qb - d > 0 && pb > 0 ? f[i] * (qb - d) / pb : 0;
        }
        return p;
    }

    private double ratioTo(int i, double[] center) {
        return center[i] > 0 ? f[i] / center[i] : Double.POSITIVE_INFINITY;
    }

    /**
     * Returns the observed distance {@code TVD(f, q)}.
     *
     * @return the distance
     */
    double observed() {
        return observed;
    }

    /**
     * Returns the median-unbiased estimate.
     *
     * @return the estimate
     */
    double estimate() {
        return estimate;
    }

    /**
     * Returns the lower bound.
     *
     * @return the bound
     */
    double low() {
        return low;
    }

    /**
     * Returns the upper bound.
     *
     * @return the bound
     */
    double high() {
        return high;
    }
}
