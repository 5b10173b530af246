package dev.qsim;

/**
 * How a {@link StateVector} stores its amplitudes.
 *
 * <p>{@link #DOUBLE} keeps each real and imaginary part in a 64-bit IEEE 754 {@code double}
 * (16 bytes per amplitude); {@link #SINGLE} in a 32-bit {@code float} (8 bytes), so a state
 * needs half the memory and half the memory traffic: 31 qubits fit in 16 GiB. Arithmetic is in
 * double in both cases; a single-precision state is widened, worked on in double window by
 * window, and rounded back to the nearest {@code float} once per run of gates
 * (IEEE 754-2019, §4.3.1, round to nearest, ties to even), so each run adds a relative error
 * of at most {@code 2^-24} (about 6e-8) per part. Measured drift of the norm and agreement with
 * double precision are stated in the project's README.
 *
 * @since 0.1
 */
public enum Precision {
    /** 64-bit parts, 16 bytes per amplitude (the default). */
    DOUBLE,
    /** 32-bit parts, 8 bytes per amplitude. */
    SINGLE;

    /**
     * Returns the bytes one amplitude takes.
     *
     * @return 16 or 8
     */
    public int bytesPerAmplitude() {
        return this == DOUBLE ? 16 : 8;
    }
}
