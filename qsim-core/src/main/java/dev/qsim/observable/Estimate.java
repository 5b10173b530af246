package dev.qsim.observable;

import java.util.Locale;

/**
 * A shot-based estimate of an expectation value: the value, its standard error, and how it was
 * measured. Immutable and thread-safe.
 *
 * @since 0.1
 */
public final class Estimate {
    private final double value;
    private final double standardError;
    private final int settings;
    private final int shotsPerSetting;

    Estimate(double value, double standardError, int settings, int shotsPerSetting) {
        this.value = value;
        this.standardError = standardError;
        this.settings = settings;
        this.shotsPerSetting = shotsPerSetting;
    }

    /**
     * Returns the estimated expectation value.
     *
     * @return the estimate
     */
    public double value() {
        return value;
    }

    /**
     * Returns the standard error of {@link #value()}: the square root of the sum over
     * measurement settings of the sample variance of the setting's per-shot value divided by
     * its shot count (settings are sampled independently). Zero when only identity terms were
     * present.
     *
     * @return the standard error, at least 0
     */
    public double standardError() {
        return standardError;
    }

    /**
     * Returns the number of measurement settings (groups of qubit-wise commuting terms).
     *
     * @return the settings
     */
    public int settings() {
        return settings;
    }

    /**
     * Returns the number of shots taken in each setting.
     *
     * @return the shots per setting
     */
    public int shotsPerSetting() {
        return shotsPerSetting;
    }

    /**
     * Returns the estimate as text, such as {@code "-1.1365 ± 0.0042 (3 settings × 1000 shots)"}.
     *
     * @return the text
     */
    @Override
    public String toString() {
        return String.format(Locale.ROOT, "%.6f ± %.6f (%d settings × %d shots)", value,
                standardError, settings, shotsPerSetting);
    }
}
