package dev.qsim;

/**
 * Something that runs a circuit for a number of shots and tallies its classical bits: a
 * {@link Simulator} with any engine and noise, or a user's adapter for a device. Code written
 * against this interface runs unchanged on either.
 *
 * @since 0.1
 */
@FunctionalInterface
public interface CircuitRunner {
    /**
     * Runs a circuit and tallies its classical register; bits never written read 0.
     *
     * @param circuit the circuit
     * @param shots the number of shots, at least 1
     * @return a tally of width {@code circuit.clbits()} and {@code shots} shots
     * @throws IllegalArgumentException if {@code shots < 1} or the runner cannot run the
     *     circuit
     */
    Tally run(Circuit circuit, int shots);
}
