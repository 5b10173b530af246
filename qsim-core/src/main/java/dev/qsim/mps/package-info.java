/**
 * The matrix-product-state engine: circuits on tens to thousands of qubits that carry little
 * entanglement, in memory that grows with the entanglement rather than with {@code 2^n}.
 *
 * <p>{@link dev.qsim.mps.MatrixProductState} holds a state as a line of tensors, one per qubit,
 * in mixed canonical form (G. Vidal, "Efficient classical simulation of slightly entangled
 * quantum computations", Phys. Rev. Lett. 91, 147902 (2003),
 * doi:10.1103/PhysRevLett.91.147902; U. Schollwöck, "The density-matrix renormalization group in
 * the age of matrix product states", Ann. Phys. 326, 96 (2011), doi:10.1016/j.aop.2010.09.012),
 * truncates its bonds to a limit and a discarded-weight threshold, says how much accuracy that
 * gave up, and answers amplitudes, marginals, expectation values and samples. Circuits with
 * measurement, reset and classical control run on it through the run facade:
 * {@code Simulator.seeded(seed).withEngine(Engine.MATRIX_PRODUCT)}, or {@code Engine.CHEAPEST},
 * which picks it for non-Clifford circuits too wide for a state vector. The conventions of
 * {@link dev.qsim} (bit order, bitstrings) hold here too.
 */
package dev.qsim.mps;
