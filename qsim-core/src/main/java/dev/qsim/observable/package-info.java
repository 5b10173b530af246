/**
 * Observables, symbolic circuit parameters and gradients, for variational algorithms.
 *
 * <ul>
 *   <li>{@link dev.qsim.observable.PauliProduct}: a phase times one of I, X, Y, Z per qubit,
 *       parsed from and printed to text.</li>
 *   <li>{@link dev.qsim.observable.Observable}: a real-weighted sum of Pauli products.</li>
 *   <li>{@link dev.qsim.observable.Expectation}: exact {@code <ψ|H|ψ>} and variance on a
 *       {@link dev.qsim.StateVector}, and shot-based estimates with a standard error
 *       ({@link dev.qsim.observable.Estimate}).</li>
 *   <li>{@link dev.qsim.observable.TunableCircuit}: a circuit whose rotation angles depend on
 *       named parameters; binding values gives a plain {@link dev.qsim.Circuit}.</li>
 *   <li>{@link dev.qsim.observable.Gradients}: the gradient of {@code <H>} with respect to every
 *       parameter, by the parameter-shift rule and by adjoint differentiation.</li>
 * </ul>
 *
 * <p>Bit order and bitstring order follow the {@linkplain dev.qsim package conventions}: qubit
 * {@code k} is bit {@code k} of a basis index, and the dense text of a Pauli product, like a
 * bitstring, has the highest qubit leftmost.
 *
 * @since 0.1
 */
package dev.qsim.observable;
