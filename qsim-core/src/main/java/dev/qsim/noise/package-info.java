/**
 * Noise: quantum channels given by Kraus operators ({@link dev.qsim.noise.Channel}), noise
 * models saying which channel follows which gate and how measured bits are misread
 * ({@link dev.qsim.noise.NoiseModel}), exact mixed-state evolution
 * ({@link dev.qsim.noise.DensityMatrix}) and a runner with a density-matrix engine and a
 * Monte Carlo wave-function (trajectory) engine ({@link dev.qsim.noise.NoisyRunner}).
 *
 * <p>Definitions follow Nielsen and Chuang (2010), <i>Quantum Computation and Quantum
 * Information</i>, Cambridge University Press, chapter 8. Bit order and matrix conventions
 * are those of {@link dev.qsim}.
 */
package dev.qsim.noise;
