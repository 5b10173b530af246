package dev.qsim.stats;

import dev.qsim.internal.Checks;
import dev.qsim.kernel.Parallel;

/**
 * How a {@link TallyComparison} judges a tally: the tolerance of its verdict, the confidence
 * level of its intervals, the Monte Carlo draws behind the distance interval and their seed,
 * the size of the sample the prediction came from, and the threads that make the draws.
 * Immutable; each {@code with...} method returns a new value. Start from {@link #defaults()}.
 *
 * <p>The default tolerance, {@value #DEFAULT_TOLERANCE}, is a total variation distance: since
 * the distance is the largest difference between the probabilities the two distributions give
 * to one event (Levin, Peres and Wilmer 2017, <i>Markov Chains and Mixing Times</i>, 2nd ed.,
 * Proposition 4.2), passing means that no event's probability, such as "qubit 0 reads 1" or
 * "the parity is even", is off by more than 5 percentage points. That is tight enough to catch a
 * wrong circuit or a badly miscalibrated gate (a rotation 0.45 rad off on one qubit already
 * moves {@code sin²(θ/2) = 0.05} of the probability) and loose enough for a few qubits with
 * readout errors of about a percent each. Choose a tolerance for the question at hand: the
 * verdict is only as meaningful as that choice.
 *
 * @param tolerance the largest total variation distance that still passes, in (0, 1]
 * @param confidence the confidence level of the intervals, in (0, 1)
 * @param resamples Monte Carlo draws per candidate distance, at least 20
 * @param seed the seed of the draws
 * @param predictionShots the shots behind the prediction when it is itself a sample (a
 *     trajectory run, say), or 0 when it is exact
 * @param threads threads for the draws, in [1, 256]; results do not
 *     depend on it
 * @since 0.1
 */
public record ComparisonSettings(double tolerance, double confidence, int resamples, long seed,
        long predictionShots, int threads) {
    /** The default tolerance: {@value}. */
    public static final double DEFAULT_TOLERANCE = 0.05;
    /** The default confidence level: {@value}. */
    public static final double DEFAULT_CONFIDENCE = 0.95;
    /** The default number of draws per candidate distance: {@value}. */
    public static final int DEFAULT_RESAMPLES = 400;
    /** The default seed: {@value}. */
    public static final long DEFAULT_SEED = 20240917L;
    /** The fewest draws per candidate distance: {@value}. */
    public static final int MIN_RESAMPLES = 20;

    /**
     * Checks the settings.
     *
     * @param tolerance the largest total variation distance that still passes, in (0, 1]
     * @param confidence the confidence level of the intervals, in (0, 1)
     * @param resamples Monte Carlo draws per candidate distance, at least
     *     {@value #MIN_RESAMPLES}
     * @param seed the seed of the draws
     * @param predictionShots the prediction's shots, or 0 for an exact prediction
     * @param threads threads for the draws, in [1, 256]
     * @throws IllegalArgumentException if a value is out of range
     */
    public ComparisonSettings {
        if (!(tolerance > 0 && tolerance <= 1)) {
            throw new IllegalArgumentException("the tolerance must be a total variation distance"
                    + " in (0, 1] but was " + tolerance);
        }
        Checks.requireOpenUnit(confidence, "the confidence level");
        Checks.requireAtLeast(resamples, MIN_RESAMPLES, "the number of draws per candidate"
                + " distance");
        Checks.requireAtLeast(predictionShots, 0, "the prediction's shot count (0 for an exact"
                + " prediction)");
        Checks.requireThreads(threads);
    }

    /**
     * Returns the defaults: tolerance {@value #DEFAULT_TOLERANCE}, confidence
     * {@value #DEFAULT_CONFIDENCE}, {@value #DEFAULT_RESAMPLES} draws, seed
     * {@value #DEFAULT_SEED}, an exact prediction, every available processor.
     *
     * @return the default settings
     */
    public static ComparisonSettings defaults() {
        return new ComparisonSettings(DEFAULT_TOLERANCE, DEFAULT_CONFIDENCE, DEFAULT_RESAMPLES,
                DEFAULT_SEED, 0, Parallel.defaultThreads());
    }

    /**
     * Returns these settings with another tolerance.
     *
     * @param value the largest total variation distance that passes, in (0, 1]
     * @return the new settings
     * @throws IllegalArgumentException if the value is out of range
     */
    public ComparisonSettings withTolerance(double value) {
        return new ComparisonSettings(value, confidence, resamples, seed, predictionShots,
                threads);
    }

    /**
     * Returns these settings with another confidence level.
     *
     * @param value the level, in (0, 1)
     * @return the new settings
     * @throws IllegalArgumentException if the value is out of range
     */
    public ComparisonSettings withConfidence(double value) {
        return new ComparisonSettings(tolerance, value, resamples, seed, predictionShots,
                threads);
    }

    /**
     * Returns these settings with another number of draws per candidate distance; the cost of
     * a comparison grows in proportion.
     *
     * @param value the draws, at least {@value #MIN_RESAMPLES}
     * @return the new settings
     * @throws IllegalArgumentException if the value is out of range
     */
    public ComparisonSettings withResamples(int value) {
        return new ComparisonSettings(tolerance, confidence, value, seed, predictionShots,
                threads);
    }

    /**
     * Returns these settings with another seed.
     *
     * @param value the seed
     * @return the new settings
     */
    public ComparisonSettings withSeed(long value) {
        return new ComparisonSettings(tolerance, confidence, resamples, value, predictionShots,
                threads);
    }

    /**
     * Returns these settings for a prediction that is itself the frequencies of
     * {@code value} shots (0: an exact prediction). The distance interval then allows for the
     * prediction's own sampling error.
     *
     * @param value the prediction's shots, at least 0
     * @return the new settings
     * @throws IllegalArgumentException if the value is negative
     */
    public ComparisonSettings withPredictionShots(long value) {
        return new ComparisonSettings(tolerance, confidence, resamples, seed, value, threads);
    }

    /**
     * Returns these settings with another thread count for the draws.
     *
     * @param value the threads, in [1, 256]
     * @return the new settings
     * @throws IllegalArgumentException if the value is out of range
     */
    public ComparisonSettings withThreads(int value) {
        return new ComparisonSettings(tolerance, confidence, resamples, seed, predictionShots,
                value);
    }
}
