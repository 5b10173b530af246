/**
 * Quantum circuits, operators, state vectors, measurement and sampling.
 *
 * <h2>Conventions</h2>
 * These hold for every type in this package; other documentation links here rather than
 * restating them.
 * <ul>
 *   <li><b>Bit order.</b> Qubit {@code k} is bit {@code k} of a basis-state index: qubit 0 is
 *       the least significant bit.</li>
 *   <li><b>Bitstrings.</b> A bitstring is written with the highest-numbered (qu)bit leftmost,
 *       so its binary value is the index: on 3 qubits {@code "110"} is index 6 and means qubits
 *       1 and 2 are 1.</li>
 *   <li><b>Tensor order.</b> {@code a.tensor(b)} is the Kronecker product {@code a ⊗ b}:
 *       {@code b} takes the low qubits {@code 0..nb-1}, {@code a} the next {@code na}.</li>
 *   <li><b>Operator qubits.</b> A k-qubit operator applied to qubits {@code (q0, q1, ...)} maps
 *       bit {@code j} of its matrix index to qubit {@code qj}; {@link dev.qsim.Gates#CNOT}
 *       acts on (control, target) in that order.</li>
 *   <li><b>Angles</b> are radians. {@code rx(θ) = exp(-iθX/2)}, likewise {@code ry}, {@code rz};
 *       {@code phase(λ) = diag(1, e^{iλ})}; {@code cphase(λ) = diag(1, 1, 1, e^{iλ})};
 *       {@code rzz(θ) = exp(-iθ Z⊗Z/2)}. Global phases are exactly these.</li>
 *   <li><b>Tolerances.</b> An operator is accepted as unitary when the largest entry of
 *       {@code |U†U - I|} is at most {@value dev.qsim.Operator#UNITARY_TOLERANCE}; a state is
 *       accepted as normalised when {@code |Σ|a|² - 1|} is at most
 *       {@value dev.qsim.StateVector#NORM_TOLERANCE}.</li>
 *   <li><b>Validation.</b> Every public method checks its arguments before it changes anything
 *       and throws {@link java.lang.IllegalArgumentException} (or
 *       {@link java.lang.IndexOutOfBoundsException} for an index) naming the bad value and what
 *       is allowed; a refused call leaves every object as it was. A state too large for the heap
 *       is refused with an {@link java.lang.IllegalStateException} naming the bytes needed.</li>
 * </ul>
 *
 * <p>Background: M. A. Nielsen and I. L. Chuang, <i>Quantum Computation and Quantum
 * Information</i>, 10th anniversary edition, Cambridge University Press (2010), chapters 1, 2
 * and 4.
 */
package dev.qsim;
