/**
 * Comparing a measured {@link dev.qsim.Tally} with a predicted distribution: distances,
 * goodness-of-fit tests and the outcomes that deviate most ({@link
 * dev.qsim.stats.TallyComparison}),
 * and reading and writing tallies as CSV or JSON
 * ({@link dev.qsim.stats.TallyFiles}). The distribution to compare with comes from the run
 * facade: {@link dev.qsim.Simulator#distribution(dev.qsim.Circuit)}, ideal or noisy.
 *
 * @since 0.1
 */
package dev.qsim.stats;
