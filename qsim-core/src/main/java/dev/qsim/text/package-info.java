/**
 * Circuits as text in the open OpenQASM 3 language (Cross et al. 2022, "OpenQASM 3: A broader
 * and deeper quantum assembly language", ACM Transactions on Quantum Computing 3(3), 12,
 * doi:10.1145/3505636): {@link dev.qsim.text.QasmReader} reads a gate-level subset into a
 * {@link dev.qsim.Circuit} and {@link dev.qsim.text.QasmWriter} writes any circuit it can express
 * in that subset.
 *
 * @since 0.1
 */
package dev.qsim.text;
