/**
 * The stabilizer engine: circuits of Clifford gates and measurements on thousands of qubits.
 *
 * <p>{@link dev.qsim.stabilizer.StabilizerTableau} holds a stabilizer state as the tableau of
 * S. Aaronson and D. Gottesman, "Improved simulation of stabilizer circuits", Phys. Rev. A 70,
 * 052328 (2004), doi:10.1103/PhysRevA.70.052328, and answers queries on it (generators and
 * expectations as Pauli products, conversion to a state vector for small n). Circuits run on
 * it through the run facade: {@code Simulator.seeded(seed).withEngine(Engine.TABLEAU)}, or
 * {@code Engine.CHEAPEST}, which picks the tableau for large Clifford circuits
 * ({@link dev.qsim.Circuit#isClifford()}). The conventions of {@link dev.qsim} (bit order,
 * bitstrings) hold here too.
 */
package dev.qsim.stabilizer;
