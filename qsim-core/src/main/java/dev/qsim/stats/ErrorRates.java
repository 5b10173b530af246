package dev.qsim.stats;

import java.util.Objects;

import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;

/**
 * The four error rates of a simple device model: a depolarizing channel after every one-qubit
 * gate, a two-qubit depolarizing channel after every two-qubit gate, and the same readout error
 * on every qubit. An immutable value; {@link #model()} builds the {@link NoiseModel}. Gates on
 * three or more qubits get no noise in this model (as in {@link NoiseModel}'s rules, which
 * place channels by gate size for one- and two-qubit gates only).
 *
 * <p>Each rate must lie in its kind's range, {@code [0, }{@link ErrorKind#limit()}{@code ]}:
 * {@code [0, 3/4]}, {@code [0, 15/16]}, {@code [0, 1/2]}, {@code [0, 1/2]}.
 *
 * @param oneQubitDepolarizing the probability of a Pauli error after a one-qubit gate
 *     ({@link Channel#depolarizing(double)})
 * @param twoQubitDepolarizing the probability of a two-qubit Pauli error after a two-qubit gate
 *     ({@link Channel#twoQubitDepolarizing(double)})
 * @param readoutOneGivenZero the probability {@code P(1|0)} of reading 1 when 0 was measured
 * @param readoutZeroGivenOne the probability {@code P(0|1)} of reading 0 when 1 was measured
 * @since 0.1
 */
public record ErrorRates(double oneQubitDepolarizing, double twoQubitDepolarizing,
        double readoutOneGivenZero, double readoutZeroGivenOne) {

    private static final ErrorRates NONE = new ErrorRates(0, 0, 0, 0);

    /**
     * Checks that each rate lies in its range.
     *
     * @param oneQubitDepolarizing in {@code [0, 3/4]}
     * @param twoQubitDepolarizing in {@code [0, 15/16]}
     * @param readoutOneGivenZero in {@code [0, 1/2]}
     * @param readoutZeroGivenOne in {@code [0, 1/2]}
     * @throws IllegalArgumentException if a rate is outside its range or NaN (the message names
     *     the rate, its value and the range)
     */
    public ErrorRates {
        check(oneQubitDepolarizing, ErrorKind.ONE_QUBIT_DEPOLARIZING);
        check(twoQubitDepolarizing, ErrorKind.TWO_QUBIT_DEPOLARIZING);
        check(readoutOneGivenZero, ErrorKind.READOUT_ONE_GIVEN_ZERO);
        check(readoutZeroGivenOne, ErrorKind.READOUT_ZERO_GIVEN_ONE);
    }

    private static void check(double rate, ErrorKind kind) {
        if (!(rate >= 0 && rate <= kind.limit())) {
            throw new IllegalArgumentException("the rate " + kind.parameterName() + " must be in"
                    + " [0, " + kind.limit() + "] but was " + rate);
        }
    }

    /**
     * Returns the rates of an ideal device: all zero.
     *
     * @return the zero rates
     */
    public static ErrorRates none() {
        return NONE;
    }

    /**
     * Returns these rates with one kind set to a value; {@link ErrorKind#READOUT_SYMMETRIC} sets
     * both readout errors.
     *
     * @param kind the kind to set
     * @param value its new value, in the kind's range
     * @return the new rates
     * @throws IllegalArgumentException if the value is outside the kind's range
     */
    public ErrorRates with(ErrorKind kind, double value) {
        Objects.requireNonNull(kind, "kind");
        switch (kind) {
            case ONE_QUBIT_DEPOLARIZING:
                return new ErrorRates(value, twoQubitDepolarizing, readoutOneGivenZero,
                        readoutZeroGivenOne);
            case TWO_QUBIT_DEPOLARIZING:
                return new ErrorRates(oneQubitDepolarizing, value, readoutOneGivenZero,
                        readoutZeroGivenOne);
            case READOUT_ONE_GIVEN_ZERO:
                return new ErrorRates(oneQubitDepolarizing, twoQubitDepolarizing, value,
                        readoutZeroGivenOne);
            case READOUT_ZERO_GIVEN_ONE:
                return new ErrorRates(oneQubitDepolarizing, twoQubitDepolarizing,
                        readoutOneGivenZero, value);
            default:
                check(value, ErrorKind.READOUT_SYMMETRIC);
                return new ErrorRates(oneQubitDepolarizing, twoQubitDepolarizing, value, value);
        }
    }

    /**
     * Returns the largest factor by which every rate can be multiplied and stay in its range:
     * the smallest of {@code limit / rate} over the non-zero rates, or infinity if all are zero.
     *
     * @return the largest allowed factor of {@link #scaled(double)}, at least 1
     */
    public double maxScale() {
        double m = Double.POSITIVE_INFINITY;
        m = Math.min(m, room(oneQubitDepolarizing, ErrorKind.ONE_QUBIT_DEPOLARIZING));
        m = Math.min(m, room(twoQubitDepolarizing, ErrorKind.TWO_QUBIT_DEPOLARIZING));
        m = Math.min(m, room(readoutOneGivenZero, ErrorKind.READOUT_ONE_GIVEN_ZERO));
        return Math.min(m, room(readoutZeroGivenOne, ErrorKind.READOUT_ZERO_GIVEN_ONE));
    }

    private static double room(double rate, ErrorKind kind) {
        return rate > 0 ? kind.limit() / rate : Double.POSITIVE_INFINITY;
    }

    /**
     * Tells whether every rate is zero.
     *
     * @return whether these rates describe an ideal device
     */
    public boolean isZero() {
        return oneQubitDepolarizing == 0 && twoQubitDepolarizing == 0 && readoutOneGivenZero == 0
                && readoutZeroGivenOne == 0;
    }

    /**
     * Returns every rate multiplied by {@code factor}. A factor within rounding of
     * {@link #maxScale()} is allowed: a rate that then exceeds its limit by rounding is set to the
     * limit.
     *
     * @param factor the factor, in {@code [0, maxScale()]}
     * @return the scaled rates
     * @throws IllegalArgumentException if the factor is negative, NaN or above
     *     {@link #maxScale()}
     */
    public ErrorRates scaled(double factor) {
        double max = maxScale();
        if (!(factor >= 0 && factor <= max)) {
            throw new IllegalArgumentException("the scale factor must be in [0, " + max
                    + "] (every rate stays in its range) but was " + factor);
        }
        return new ErrorRates(
                Math.min(oneQubitDepolarizing * factor, ErrorKind.ONE_QUBIT_DEPOLARIZING.limit()),
                Math.min(twoQubitDepolarizing * factor, ErrorKind.TWO_QUBIT_DEPOLARIZING.limit()),
                Math.min(readoutOneGivenZero * factor, ErrorKind.READOUT_ONE_GIVEN_ZERO.limit()),
                Math.min(readoutZeroGivenOne * factor, ErrorKind.READOUT_ZERO_GIVEN_ONE.limit()));
    }

    /**
     * Returns the rates by their parameter names, such as
     * {@code "ErrorRates[depolarizing1 0.001, depolarizing2 0.01, readout1given0 0.02,
     * readout0given1 0.03]"}.
     *
     * @return the text
     */
    @Override
    public String toString() {
        return "ErrorRates[" + ErrorKind.ONE_QUBIT_DEPOLARIZING.parameterName() + " "
                + NoiseFamily.number(oneQubitDepolarizing) + ", "
                + ErrorKind.TWO_QUBIT_DEPOLARIZING.parameterName() + " "
                + NoiseFamily.number(twoQubitDepolarizing) + ", "
                + ErrorKind.READOUT_ONE_GIVEN_ZERO.parameterName() + " "
                + NoiseFamily.number(readoutOneGivenZero) + ", "
                + ErrorKind.READOUT_ZERO_GIVEN_ONE.parameterName() + " "
                + NoiseFamily.number(readoutZeroGivenOne) + "]";
    }

    /**
     * Builds the noise model: {@link Channel#depolarizing(double)} after every one-qubit gate,
     * {@link Channel#twoQubitDepolarizing(double)} after every two-qubit gate (each left out when
     * its rate is 0), and the readout error on every qubit.
     *
     * @return the model; {@link NoiseModel#isIdeal()} when every rate is 0
     */
    public NoiseModel model() {
        NoiseModel.Builder b = NoiseModel.builder();
        if (oneQubitDepolarizing > 0) {
            b.afterOneQubitGates(Channel.depolarizing(oneQubitDepolarizing));
        }
        if (twoQubitDepolarizing > 0) {
            b.afterTwoQubitGates(Channel.twoQubitDepolarizing(twoQubitDepolarizing));
        }
        return b.readoutError(readoutOneGivenZero, readoutZeroGivenOne).build();
    }
}
