/**
 * Circuits as text in the open OpenQASM 3 language (Cross et al. 2022, "OpenQASM 3: A broader
 * and deeper quantum assembly language", ACM Transactions on Quantum Computing 3(3), 12,
 * doi:10.1145/3505636): {@link dev.qsim.text.QasmReader} reads programs with gates, modifiers,
 * gate definitions, classical variables, conditions, loops and subroutines into a
 * {@link dev.qsim.Circuit} (every read ends in a circuit or a
 * {@link dev.qsim.text.CircuitFormatException}, within limits its
 * {@link dev.qsim.text.QasmReader.Settings} set), and {@link dev.qsim.text.QasmWriter} writes
 * every circuit the reader produces so that it reads back equal. {@code docs/openqasm.md} lists
 * what is read, what is refused and why.
 *
 * @since 0.1
 */
package dev.qsim.text;
