package dev.qsim.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.function.DoubleUnaryOperator;
import java.util.function.ToDoubleFunction;

import org.apache.commons.statistics.distribution.ChiSquaredDistribution;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;
import dev.qsim.internal.Checks;
import dev.qsim.noise.NoiseModel;

/**
 * Fits the parameters of a {@link NoiseFamily} to a device's {@link Tally} by maximum likelihood:
 * "how noisy is my device, in numbers?". An immutable configuration (the family, the confidence
 * level of the intervals, the threads of each distribution); {@link #fit(Circuit, Tally)} gives a
 * {@link FittedNoise}. Thread-safe if the family's function is.
 *
 * <p><b>Likelihood.</b> For parameters {@code θ}, {@code p_θ} is the exact distribution of the
 * circuit's classical register under the family's model,
 * {@code Simulator.seeded(0).withNoise(family.model(θ)).distribution(circuit)} (a density
 * matrix, readout error included), and {@code ℓ(θ) = Σ count · log p_θ(outcome)} over the
 * outcomes seen. An outcome seen whose probability is 0 (or below 0 by rounding) makes
 * {@code ℓ(θ) = -∞}; the searches below treat such parameters as worse than any other, and a
 * tally that no parameters found by the search can produce is refused. Hence the circuits: at
 * most {@value #MAX_QUBITS} qubits (the density matrix is {@code 16·4^n} bytes and is computed
 * once per parameter vector tried), and a tally as wide as the circuit's classical register.
 * Mid-circuit measurements, resets and classical control are allowed: their distribution sums
 * one density matrix per classical value, which costs more per evaluation.
 *
 * <p><b>Maximisation</b>, within the family's ranges: for one parameter, a scan of 11 points and
 * then golden-section search between the best one's neighbours (Kiefer 1953, Proc. AMS 4, 502);
 * for several, the simplex method of Nelder and Mead (1965, Computer Journal 7, 308) on the box
 * of ranges, restarted from its result until it gains nothing. These find a local maximum; the
 * scan and the restarts guard against stopping short of the global one but cannot rule it out
 * for a likelihood with several peaks. If a later step (a profile value) finds a higher
 * likelihood, the fit starts again from there (at most three times).
 *
 * <p><b>Intervals</b> are profile-likelihood intervals (Wilks 1938, Ann. Math. Stat. 9, 60):
 * parameter {@code j}'s interval holds the values {@code t} with
 * {@code 2 (ℓ(θ̂) - max over the other parameters of ℓ(t, ·)) <= q}, {@code q} the chi-square
 * quantile with one degree of freedom at the confidence level (Apache Commons Statistics
 * {@link ChiSquaredDistribution}; 3.84 at 95 %). Each end is found by the Illinois variant of
 * regula falsi between the estimate and the range's end, each profile value by maximising over
 * the other parameters as above; after the value at the range's end, a single other parameter is
 * first searched within 2 % of its range around the previous profile value's maximum (with the
 * full scan if that is not a peak), and several start from the previous maximum. An end that
 * reaches the range's end is flagged ({@link FittedParameter#lowAtRangeEnd()}). The interval is
 * taken to be the one stretch around the estimate where the profile is above the cut-off; a
 * profile with several peaks could give a set that is not an interval, of which only this
 * stretch is reported.
 *
 * <p>Deterministic: the distributions do not depend on the thread count and the searches use no
 * randomness, so equal inputs give equal results.
 *
 * @since 0.1
 */
public final class NoiseFit {
    /** The confidence level of intervals unless set: {@value}. */
    public static final double DEFAULT_CONFIDENCE = 0.95;

    /** The most qubits a fitted circuit may have: {@value}. */
    public static final int MAX_QUBITS = 10;

    /** Golden-section stop: the bracket is narrower than this fraction of the range. */
    private static final double GOLDEN_TOLERANCE = 1e-9;
    /** Half-width, as a fraction of the range, of the first bracket around a start. */
    private static final double NEAR = 0.02;
    /** Golden-section stop inside a profile value. */
    private static final double INNER_TOLERANCE = 1e-6;
    /** Nelder-Mead stop: values within this of each other (log-likelihood units). */
    private static final double VALUE_TOLERANCE = 1e-10;
    /** Nelder-Mead stop: vertices within this fraction of each range. */
    private static final double STEP_TOLERANCE = 1e-8;
    /** Nelder-Mead budget per simplex run, per parameter. */
    private static final int EVALUATIONS_PER_PARAMETER = 400;
    /** Interval ends: the bracket is narrower than this fraction of the range. */
    private static final double END_TOLERANCE = 1e-10;
    /** Interval ends: the signed root deviance is within this of its cut-off. */
    private static final double END_VALUE_TOLERANCE = 1e-9;
    /** A later step that beats the fit by more than this restarts it. */
    private static final double REFIT_GAIN = 1e-7;

    private final NoiseFamily family;
    private final double confidence;
    private final int threads;

    private NoiseFit(NoiseFamily family, double confidence, int threads) {
        this.family = family;
        this.confidence = confidence;
        this.threads = threads;
    }

    /**
     * Returns a fit of the given family with {@value #DEFAULT_CONFIDENCE} intervals, using as
     * many threads per distribution as {@link Simulator#seeded(long)} does.
     *
     * @param family the family to fit
     * @return the configuration
     */
    public static NoiseFit of(NoiseFamily family) {
        Objects.requireNonNull(family, "family");
        return new NoiseFit(family, DEFAULT_CONFIDENCE, Simulator.seeded(0).threads());
    }

    /**
     * Returns a fit like this one with intervals at another confidence level.
     *
     * @param confidence the level, in (0, 1), such as 0.95
     * @return the new configuration
     * @throws IllegalArgumentException if the level is outside (0, 1) or NaN
     */
    public NoiseFit withConfidence(double confidence) {
        Checks.requireOpenUnit(confidence, "the confidence level");
        return new NoiseFit(family, confidence, threads);
    }

    /**
     * Returns a fit like this one that computes each distribution with another number of
     * threads. Results do not depend on it.
     *
     * @param threads at least 1 (at most 256)
     * @return the new configuration
     * @throws IllegalArgumentException if {@code threads} is out of range
     */
    public NoiseFit withThreads(int threads) {
        Checks.requireThreads(threads);
        return new NoiseFit(family, confidence, threads);
    }

    /**
     * Returns the family.
     *
     * @return the family
     */
    public NoiseFamily family() {
        return family;
    }

    /**
     * Returns the confidence level of the intervals.
     *
     * @return the level
     */
    public double confidence() {
        return confidence;
    }

    /**
     * Returns the threads used per distribution.
     *
     * @return the thread count
     */
    public int threads() {
        return threads;
    }

    /**
     * Returns the log-likelihood {@code ℓ(θ) = Σ count · log p_θ(outcome)} of a tally under the
     * family's model at {@code θ}.
     *
     * @param circuit the circuit the tally came from (see the class description)
     * @param tally the tally, as wide as the circuit's classical register
     * @param theta one value per parameter, within the ranges. Not modified.
     * @return the log-likelihood, at most 0; {@code -∞} if the model gives probability 0 to an
     *     outcome seen
     * @throws IllegalArgumentException if the circuit, the tally or {@code theta} is refused (the
     *     message says which value and what is allowed)
     */
    public double logLikelihood(Circuit circuit, Tally tally, double... theta) {
        Likelihood like = new Likelihood(family, circuit, tally, threads);
        return like.of(like.distribution(family.model(theta)));
    }

    /**
     * Fits the family to a tally: the maximum-likelihood estimates, their profile-likelihood
     * intervals at this fit's confidence level, and the comparison with the ideal model.
     *
     * @param circuit the circuit the tally came from: at most {@value #MAX_QUBITS} qubits, at
     *     least one classical bit
     * @param tally the device's counts, as wide as the circuit's classical register
     * @return the fit
     * @throws IllegalArgumentException if the circuit or tally is refused (the message names the
     *     value and what is allowed), or the search found no parameters under which every
     *     outcome seen is possible (the message names such an outcome)
     */
    public FittedNoise fit(Circuit circuit, Tally tally) {
        Likelihood like = new Likelihood(family, circuit, tally, threads);
        int k = family.size();
        double[] lo = new double[k];
        double[] hi = new double[k];
        for (int j = 0; j < k; j++) {
            lo[j] = family.lower(j);
            hi[j] = family.upper(j);
        }
        double[] ideal = like.distribution(NoiseModel.none());
        double idealLog = like.of(ideal);
        long forbidden = like.forbiddenShots(ideal);

        double[] start = null;
        double[] estimate = null;
        double best = Double.NEGATIVE_INFINITY;
        List<FittedParameter> parameters = new ArrayList<>();
        double quantile = ChiSquaredDistribution.of(1).inverseCumulativeProbability(confidence);
        for (int round = 0; round < 3; round++) {
            double[] found = maximise(like, lo, hi, start, new int[0], new double[0]);
            estimate = Arrays.copyOf(found, k);
            best = found[k];
            if (best == Double.NEGATIVE_INFINITY) {
                throw like.unexplained(estimate);
            }
            parameters.clear();
            for (int j = 0; j < k; j++) {
                parameters.add(interval(like, lo, hi, estimate, best, j, quantile));
            }
            if (!(like.bestValue > best + REFIT_GAIN)) {
                break;
            }
            start = like.bestTheta.clone();
        }
        double statistic = 2 * (best - idealLog);
        double p = statistic == Double.POSITIVE_INFINITY ? 0
                : statistic <= 0 ? 1 : ChiSquaredDistribution.of(k).survivalProbability(statistic);
        return new FittedNoise(family, parameters, confidence, tally.shots(), like.counts.length,
                best, idealLog, forbidden, p, like.evaluations);
    }

    /**
     * Maximises the likelihood over the parameters not held: {@code held[i]} is a parameter
     * fixed at {@code heldValue[i]}. Returns the full vector followed by the value.
     */
    private static double[] maximise(Likelihood like, double[] lo, double[] hi, double[] start,
            int[] held, double[] heldValue) {
        int k = lo.length;
        int[] free = new int[k - held.length];
        double[] theta = new double[k];
        int f = 0;
        for (int j = 0; j < k; j++) {
            int h = indexOf(held, j);
            if (h >= 0) {
                theta[j] = heldValue[h];
            } else {
                free[f++] = j;
            }
        }
        double[] out = Arrays.copyOf(theta, k + 1);
        if (free.length == 0) {
            out[k] = like.at(theta);
            return out;
        }
        boolean inner = held.length > 0;
        if (free.length == 1) {
            int j = free[0];
            double[] x = theta.clone();
            DoubleUnaryOperator along = t -> {
                x[j] = Math.min(hi[j], t);
                return like.at(x);
            };
            double range = hi[j] - lo[j];
            double tolerance = (inner ? INNER_TOLERANCE : GOLDEN_TOLERANCE) * range;
            // With a start (a profile value next to the last one, or a restart near a better
            // point), search near it first.
            double[] r = start == null ? Search.golden(along, lo[j], hi[j], tolerance)
                    : Search.goldenNear(along, lo[j], hi[j], start[j], NEAR * range, tolerance);
            out[j] = r[0];
            out[k] = r[1];
            return out;
        }
        double[] x = theta.clone();
        ToDoubleFunction<double[]> g = u -> {
            for (int i = 0; i < free.length; i++) {
                int j = free[i];
                x[j] = u[i] >= 1 ? hi[j] : lo[j] + u[i] * (hi[j] - lo[j]);
            }
            return like.at(x);
        };
        double[] u0 = new double[free.length];
        double step = 0.2;
        if (start != null) {
            for (int i = 0; i < free.length; i++) {
                int j = free[i];
                u0[i] = (start[j] - lo[j]) / (hi[j] - lo[j]);
            }
            step = 0.05;
        } else {
            // The best of a few points along the diagonal; error rates are mostly small.
            double bestValue = Double.NEGATIVE_INFINITY;
            for (double t : new double[] {1 / 64.0, 1 / 16.0, 1 / 4.0, 1 / 2.0}) {
                double[] u = new double[free.length];
                Arrays.fill(u, t);
                double v = g.applyAsDouble(u);
                if (v > bestValue) {
                    bestValue = v;
                    u0 = u;
                }
            }
        }
        Search.Point r = Search.nelderMead(g, u0, step, VALUE_TOLERANCE, STEP_TOLERANCE,
                EVALUATIONS_PER_PARAMETER * free.length);
        for (int i = 0; i < free.length; i++) {
            int j = free[i];
            out[j] = r.x()[i] >= 1 ? hi[j] : lo[j] + r.x()[i] * (hi[j] - lo[j]);
        }
        out[k] = r.value();
        return out;
    }

    private static int indexOf(int[] a, int v) {
        for (int i = 0; i < a.length; i++) {
            if (a[i] == v) {
                return i;
            }
        }
        return -1;
    }

    /**
     * The profile-likelihood interval of parameter {@code j}. Each end is the crossing of
     * {@code sqrt(q) - sqrt(2 (ℓ(θ̂) - profile(t)))}, which is close to linear in {@code t} (the
     * signed root of the likelihood-ratio statistic is close to normal; Barndorff-Nielsen and
     * Cox 1994, <i>Inference and Asymptotics</i>), so regula falsi needs few profile
     * values; the crossing is the same as that of {@code profile(t) - (ℓ(θ̂) - q/2)}.
     */
    private static FittedParameter interval(Likelihood like, double[] lo, double[] hi,
            double[] estimate, double best, int j, double quantile) {
        double root = Math.sqrt(quantile);
        double[] warm = estimate.clone();
        boolean[] near = {false};
        DoubleUnaryOperator g = t -> {
            double[] r = maximise(like, lo, hi, near[0] ? warm : null, new int[] {j},
                    new double[] {t});
            double profile = r[lo.length];
            if (profile == Double.NEGATIVE_INFINITY) {
                return Double.NEGATIVE_INFINITY;
            }
            System.arraycopy(r, 0, warm, 0, lo.length);
            return root - Math.sqrt(Math.max(0, 2 * (best - profile)));
        };
        double range = hi[j] - lo[j];
        double high = hi[j];
        boolean highAtEnd = true;
        if (estimate[j] < hi[j]) {
            near[0] = false;
            double atEnd = g.applyAsDouble(hi[j]);
            if (atEnd < 0) {
                System.arraycopy(estimate, 0, warm, 0, lo.length);
                near[0] = true;
                high = Search.crossing(g, estimate[j], root, hi[j], atEnd,
                        END_TOLERANCE * range, END_VALUE_TOLERANCE);
                highAtEnd = false;
            }
        }
        double low = lo[j];
        boolean lowAtEnd = true;
        if (estimate[j] > lo[j]) {
            near[0] = false;
            double atEnd = g.applyAsDouble(lo[j]);
            if (atEnd < 0) {
                System.arraycopy(estimate, 0, warm, 0, lo.length);
                near[0] = true;
                low = Search.crossing(g, estimate[j], root, lo[j], atEnd,
                        END_TOLERANCE * range, END_VALUE_TOLERANCE);
                lowAtEnd = false;
            }
        }
        return new FittedParameter(like.family.names().get(j), estimate[j], low, high, lowAtEnd,
                highAtEnd);
    }

    /** The log-likelihood of one tally under one family, counting its evaluations. */
    private static final class Likelihood {
        final NoiseFamily family;
        final Circuit circuit;
        final Simulator simulator;
        final int width;
        final int[] outcomes;
        final double[] counts;
        long evaluations;
        double bestValue = Double.NEGATIVE_INFINITY;
        double[] bestTheta;

        Likelihood(NoiseFamily family, Circuit circuit, Tally tally, int threads) {
            Objects.requireNonNull(circuit, "circuit");
            Objects.requireNonNull(tally, "tally");
            requireFittable(circuit);
            if (tally.width() != circuit.clbits()) {
                throw new IllegalArgumentException("the tally's width is " + tally.width()
                        + " but the circuit has " + circuit.clbits() + " classical bit(s); the"
                        + " tally must come from this circuit's register");
            }
            this.family = family;
            this.circuit = circuit;
            this.simulator = Simulator.seeded(0).withThreads(threads);
            this.width = tally.width();
            Map<String, Long> seen = tally.outcomes();
            outcomes = new int[seen.size()];
            counts = new double[seen.size()];
            int i = 0;
            for (Map.Entry<String, Long> e : seen.entrySet()) {
                outcomes[i] = Integer.parseInt(e.getKey(), 2);
                counts[i++] = e.getValue();
            }
        }

        double[] distribution(NoiseModel model) {
            evaluations++;
            return simulator.withNoise(model).distribution(circuit);
        }

        double at(double[] theta) {
            double v = of(distribution(family.model(theta)));
            if (v > bestValue) {
                bestValue = v;
                bestTheta = theta.clone();
            }
            return v;
        }

        double of(double[] p) {
            double sum = 0;
            for (int i = 0; i < outcomes.length; i++) {
                double q = p[outcomes[i]];
                if (!(q > 0)) {
                    return Double.NEGATIVE_INFINITY;
                }
                sum += counts[i] * Math.log(q);
            }
            return sum;
        }

        long forbiddenShots(double[] p) {
            long shots = 0;
            for (int i = 0; i < outcomes.length; i++) {
                if (!(p[outcomes[i]] > 0)) {
                    shots += (long) counts[i];
                }
            }
            return shots;
        }

        IllegalArgumentException unexplained(double[] theta) {
            double[] p = distribution(family.model(theta));
            for (int i = 0; i < outcomes.length; i++) {
                if (!(p[outcomes[i]] > 0)) {
                    return new IllegalArgumentException("the search found no parameters of "
                            + family.names() + " under which every outcome seen is possible: at "
                            + Arrays.toString(theta) + " outcome '"
                            + Tally.bitString(outcomes[i], width) + "' (seen " + (long) counts[i]
                            + " time(s)) has probability 0; the family cannot produce this"
                            + " tally from this circuit");
                }
            }
            return new IllegalArgumentException("the search found no parameters of "
                    + family.names() + " under which every outcome seen is possible");
        }
    }

    /** Refuses a circuit whose exact noisy distribution the fit cannot compute. */
    private static void requireFittable(Circuit circuit) {
        if (circuit.qubits() > MAX_QUBITS) {
            throw new IllegalArgumentException("the circuit has " + circuit.qubits() + " qubits;"
                    + " a fit computes its exact noisy distribution (a density matrix) many"
                    + " times, so it takes at most " + MAX_QUBITS);
        }
        if (circuit.clbits() == 0) {
            throw new IllegalArgumentException("the circuit has 0 classical bits, so its tally"
                    + " says nothing about noise; measure at least one qubit");
        }
        if (circuit.clbits() > Simulator.MAX_DISTRIBUTION_CLBITS) {
            throw new IllegalArgumentException("the circuit has " + circuit.clbits()
                    + " classical bits; an exact distribution has at most "
                    + Simulator.MAX_DISTRIBUTION_CLBITS);
        }
    }
}
