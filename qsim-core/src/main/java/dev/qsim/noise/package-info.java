/**
 * Noise: quantum channels given by Kraus operators ({@link dev.qsim.noise.Channel}), noise
 * models saying which channel follows which gate and how measured bits are misread
 * ({@link dev.qsim.noise.NoiseModel}), exact mixed states
 * ({@link dev.qsim.noise.DensityMatrix}) and device profiles, the noise model of a described
 * device read from a JSON file ({@link dev.qsim.noise.DeviceProfile}). Noisy runs go through
 * the run facade: {@code Simulator.seeded(seed).withNoise(model).run(circuit, shots)} runs a
 * density-matrix engine or a Monte Carlo wave-function (trajectory) engine.
 *
 * <p>Definitions follow Nielsen and Chuang (2010), <i>Quantum Computation and Quantum
 * Information</i>, Cambridge University Press, chapter 8. Bit order and matrix conventions
 * are those of {@link dev.qsim}.
 */
package dev.qsim.noise;
