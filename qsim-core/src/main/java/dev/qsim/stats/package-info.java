/**
 * Comparing a measured {@link dev.qsim.Tally} with a predicted distribution: distances,
 * goodness-of-fit tests and the outcomes that deviate most ({@link dev.qsim.stats.TallyComparison}),
 * the exact outcome distribution of a circuit to compare with
 * ({@link dev.qsim.stats.IdealPrediction}), and reading and writing tallies as CSV or JSON
 * ({@link dev.qsim.stats.TallyFiles}).
 *
 * @since 0.2
 */
package dev.qsim.stats;
