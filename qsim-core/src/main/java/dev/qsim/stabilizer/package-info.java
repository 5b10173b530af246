/**
 * The stabilizer engine: circuits of Clifford gates and measurements on thousands of qubits.
 *
 * <p>{@link dev.qsim.stabilizer.GeneratorTable} holds a stabilizer state as the tableau of
 * S. Aaronson and D. Gottesman, "Improved simulation of stabilizer circuits", Phys. Rev. A 70,
 * 052328 (2004), doi:10.1103/PhysRevA.70.052328, and answers queries on it (generators as text,
 * expectation of a Pauli string, conversion to a state vector for small n).
 * {@link dev.qsim.stabilizer.CliffordRunner} checks that a {@link dev.qsim.Circuit} is
 * Clifford and samples its shots into a {@link dev.qsim.Tally}. The conventions of
 * {@link dev.qsim} (bit order, bitstrings) hold here too.
 */
package dev.qsim.stabilizer;
