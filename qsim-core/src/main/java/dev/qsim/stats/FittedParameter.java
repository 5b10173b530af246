package dev.qsim.stats;

import java.util.Objects;

/**
 * One fitted parameter of a {@link NoiseFamily}: its maximum-likelihood estimate and its
 * profile-likelihood interval {@code [low, high]} at the fit's confidence
 * ({@link FittedNoise#confidence()}). An end of the interval that reaches the end of the
 * parameter's range, because the profile likelihood stays above the cut-off up to there, is
 * flagged: the interval is then cut by the range, not by the data.
 *
 * @param name the parameter's name in the family
 * @param estimate the maximum-likelihood estimate, within the range
 * @param low the lower end of the interval, at most {@code estimate}
 * @param high the upper end of the interval, at least {@code estimate}
 * @param lowAtRangeEnd whether {@code low} is the lower end of the parameter's range and the
 *     profile likelihood is still above the cut-off there
 * @param highAtRangeEnd whether {@code high} is the upper end of the parameter's range and the
 *     profile likelihood is still above the cut-off there
 * @since 0.1
 */
public record FittedParameter(String name, double estimate, double low, double high,
        boolean lowAtRangeEnd, boolean highAtRangeEnd) {

    /**
     * Checks the fields.
     *
     * @param name the name, not null
     * @param estimate the estimate
     * @param low the lower end, at most {@code estimate}
     * @param high the upper end, at least {@code estimate}
     * @param lowAtRangeEnd whether the lower end is the range's
     * @param highAtRangeEnd whether the upper end is the range's
     * @throws IllegalArgumentException if {@code low <= estimate <= high} fails
     */
    public FittedParameter {
        Objects.requireNonNull(name, "name");
        if (!(low <= estimate && estimate <= high)) {
            throw new IllegalArgumentException("the interval [" + low + ", " + high
                    + "] of parameter '" + name + "' must hold its estimate " + estimate);
        }
    }

    /**
     * Tells whether a value lies in the interval, ends included.
     *
     * @param value the value
     * @return whether {@code low <= value <= high}
     */
    public boolean covers(double value) {
        return low <= value && value <= high;
    }
}
