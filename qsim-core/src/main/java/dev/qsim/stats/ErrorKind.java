package dev.qsim.stats;

/**
 * A kind of error rate that {@link NoiseFamily#ofKinds(ErrorRates, ErrorKind...)} can fit, with
 * the parameter name it gets and the range it may take. Each range ends where the error
 * erases what it acts on: one-qubit depolarizing at probability 3/4 and two-qubit depolarizing at
 * 15/16 give the completely mixed state ({@link dev.qsim.noise.Channel#depolarizing(double)},
 * {@link dev.qsim.noise.Channel#twoQubitDepolarizing(double)}), and a readout flip probability
 * of 1/2 makes the reported bit independent of the measured one (beyond it the bit would more
 * often be wrong than right).
 *
 * @since 0.1
 */
public enum ErrorKind {
    /**
     * The depolarizing probability after every one-qubit gate, parameter
     * {@code "depolarizing1"}, in {@code [0, 3/4]}.
     */
    ONE_QUBIT_DEPOLARIZING("depolarizing1", 0.75),
    /**
     * The two-qubit depolarizing probability after every two-qubit gate, parameter
     * {@code "depolarizing2"}, in {@code [0, 15/16]}.
     */
    TWO_QUBIT_DEPOLARIZING("depolarizing2", 0.9375),
    /**
     * The readout error {@code P(1|0)} of every qubit (a measured 0 reported as 1), parameter
     * {@code "readout1given0"}, in {@code [0, 1/2]}.
     */
    READOUT_ONE_GIVEN_ZERO("readout1given0", 0.5),
    /**
     * The readout error {@code P(0|1)} of every qubit (a measured 1 reported as 0), parameter
     * {@code "readout0given1"}, in {@code [0, 1/2]}.
     */
    READOUT_ZERO_GIVEN_ONE("readout0given1", 0.5),
    /**
     * One readout flip probability for both directions, {@code P(1|0) = P(0|1)}, parameter
     * {@code "readout"}, in {@code [0, 1/2]}; it cannot be combined with the two one-way kinds.
     */
    READOUT_SYMMETRIC("readout", 0.5);

    private final String parameterName;
    private final double limit;

    ErrorKind(String parameterName, double limit) {
        this.parameterName = parameterName;
        this.limit = limit;
    }

    /**
     * Returns the name of the parameter this kind becomes in a family, such as
     * {@code "depolarizing2"}.
     *
     * @return the parameter name
     */
    public String parameterName() {
        return parameterName;
    }

    /**
     * Returns the largest value of this kind's rate: the upper end of its range, which starts at
     * 0.
     *
     * @return 3/4, 15/16 or 1/2
     */
    public double limit() {
        return limit;
    }
}
