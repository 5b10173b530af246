/**
 * Checking a device's tally against a circuit: the distance between a measured
 * {@link dev.qsim.Tally} and a predicted distribution with its confidence interval and a
 * tolerance verdict, goodness-of-fit tests for information and the outcomes that deviate most
 * ({@link dev.qsim.stats.TallyComparison}, {@link dev.qsim.stats.ComparisonSettings});
 * error rates fitted to a tally by maximum likelihood with profile-likelihood intervals
 * ({@link dev.qsim.stats.NoiseFit}, {@link dev.qsim.stats.NoiseFamily},
 * {@link dev.qsim.stats.ErrorRates}, {@link dev.qsim.stats.FittedNoise}); and reading and
 * writing tallies as CSV or JSON ({@link dev.qsim.stats.TallyFiles}). The distribution to
 * compare with comes from the run facade: {@link dev.qsim.Simulator#predict(dev.qsim.Circuit,
 * int)}, ideal or noisy, exact or sampled.
 *
 * @since 0.1
 */
package dev.qsim.stats;
