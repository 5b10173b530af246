package dev.qsim.stats;

import java.util.List;
import java.util.Locale;

import dev.qsim.noise.NoiseModel;

/**
 * The result of {@link NoiseFit#fit(dev.qsim.Circuit, dev.qsim.Tally)}: the maximum-likelihood
 * parameters of a {@link NoiseFamily} for a tally, their profile-likelihood intervals, and how
 * much better the fitted model explains the tally than the ideal one. An immutable value;
 * thread-safe.
 *
 * <p>Log-likelihoods are natural logarithms, {@code ℓ = Σ count · log p} over the outcomes seen,
 * without the multinomial coefficient (which is the same for every model). The comparison with
 * the ideal model ({@link NoiseModel#none()}) is the likelihood-ratio statistic
 * {@code Λ = 2 (ℓ(θ̂) - ℓ_ideal)} referred to the chi-square distribution with as many degrees
 * of freedom as the family has parameters (Wilks 1938, "The large-sample distribution of the
 * likelihood ratio for testing composite hypotheses", Ann. Math. Stat. 9, 60). This reference
 * assumes the family contains the ideal model, as the ready-made families do at all parameters
 * 0. That point is on the edge of the ranges, where the statistic's large-sample distribution is
 * a mixture of chi-squares of fewer degrees of freedom (Self and Liang 1987, "Asymptotic
 * properties of maximum likelihood estimators and likelihood ratio tests under nonstandard
 * conditions", J. Am. Stat. Assoc. 82, 605), so the p-value reported is conservative (too large,
 * by up to a factor 2 for one parameter). When the ideal model gives probability 0 to an outcome
 * that was seen, its log-likelihood is {@code -∞}, the statistic {@code +∞} and the p-value 0.
 *
 * @since 0.1
 */
public final class FittedNoise {
    private final NoiseFamily family;
    private final List<FittedParameter> parameters;
    private final double confidence;
    private final long shots;
    private final int outcomesSeen;
    private final double logLikelihood;
    private final double idealLogLikelihood;
    private final long idealForbiddenShots;
    private final double ratioStatistic;
    private final double ratioPValue;
    private final long evaluations;

    FittedNoise(NoiseFamily family, List<FittedParameter> parameters, double confidence,
            long shots, int outcomesSeen, double logLikelihood, double idealLogLikelihood,
            long idealForbiddenShots, double ratioPValue, long evaluations) {
        this.family = family;
        this.parameters = List.copyOf(parameters);
        this.confidence = confidence;
        this.shots = shots;
        this.outcomesSeen = outcomesSeen;
        this.logLikelihood = logLikelihood;
        this.idealLogLikelihood = idealLogLikelihood;
        this.idealForbiddenShots = idealForbiddenShots;
        this.ratioStatistic = Math.max(0, 2 * (logLikelihood - idealLogLikelihood));
        this.ratioPValue = ratioPValue;
        this.evaluations = evaluations;
    }

    /**
     * Returns the family that was fitted.
     *
     * @return the family
     */
    public NoiseFamily family() {
        return family;
    }

    /**
     * Returns each parameter's estimate and interval, in the family's order.
     *
     * @return an unmodifiable list of {@link NoiseFamily#size()} parameters
     */
    public List<FittedParameter> parameters() {
        return parameters;
    }

    /**
     * Returns one parameter by name.
     *
     * @param name a parameter name of the family
     * @return the parameter
     * @throws IllegalArgumentException if the family has no parameter of that name (the message
     *     lists the names)
     */
    public FittedParameter parameter(String name) {
        for (FittedParameter p : parameters) {
            if (p.name().equals(name)) {
                return p;
            }
        }
        throw new IllegalArgumentException("the family has no parameter '"
                + dev.qsim.internal.Checks.excerpt(name) + "'; its parameters are "
                + family.names());
    }

    /**
     * Returns the estimates as a vector, in the family's order.
     *
     * @return a new array
     */
    public double[] estimates() {
        double[] out = new double[parameters.size()];
        for (int j = 0; j < out.length; j++) {
            out[j] = parameters.get(j).estimate();
        }
        return out;
    }

    /**
     * Returns the fitted model, the family's model at the estimates.
     *
     * @return the model
     */
    public NoiseModel model() {
        return family.model(estimates());
    }

    /**
     * Returns the confidence level of the intervals.
     *
     * @return a number in (0, 1), such as 0.95
     */
    public double confidence() {
        return confidence;
    }

    /**
     * Returns the number of shots in the tally.
     *
     * @return the shots
     */
    public long shots() {
        return shots;
    }

    /**
     * Returns the number of distinct outcomes in the tally.
     *
     * @return the outcomes seen
     */
    public int outcomesSeen() {
        return outcomesSeen;
    }

    /**
     * Returns the maximised log-likelihood {@code ℓ(θ̂)}.
     *
     * @return the log-likelihood of the fitted model, finite and at most 0
     */
    public double logLikelihood() {
        return logLikelihood;
    }

    /**
     * Returns the log-likelihood of the ideal model.
     *
     * @return at most 0; {@code -∞} when the ideal model gives probability 0 to an outcome seen
     *     ({@link #idealForbiddenShots()} {@code > 0})
     */
    public double idealLogLikelihood() {
        return idealLogLikelihood;
    }

    /**
     * Returns the number of shots whose outcome the ideal model gives probability 0.
     *
     * @return the shots on outcomes the ideal circuit cannot produce, at least 0
     */
    public long idealForbiddenShots() {
        return idealForbiddenShots;
    }

    /**
     * Returns the likelihood-ratio statistic {@code Λ = 2 (ℓ(θ̂) - ℓ_ideal)} against the ideal
     * model, or 0 if the ideal model explains the tally at least as well (possible only for a
     * family that does not contain it).
     *
     * @return {@code Λ}, at least 0, {@code +∞} when the ideal model forbids an outcome seen
     */
    public double ratioStatistic() {
        return ratioStatistic;
    }

    /**
     * Returns the degrees of freedom of the likelihood-ratio test: the number of parameters.
     *
     * @return {@link NoiseFamily#size()}
     */
    public int degreesOfFreedom() {
        return parameters.size();
    }

    /**
     * Returns the p-value of the likelihood-ratio test against the ideal model: the probability
     * that a chi-square variable with {@link #degreesOfFreedom()} degrees of freedom exceeds
     * {@link #ratioStatistic()} (conservative: see the class description).
     *
     * @return the p-value in [0, 1]; 0 when the statistic is infinite
     */
    public double ratioPValue() {
        return ratioPValue;
    }

    /**
     * Returns how many exact distributions the fit computed (one per parameter vector tried,
     * plus one for the ideal model): the measure of its cost.
     *
     * @return the number of distribution evaluations
     */
    public long evaluations() {
        return evaluations;
    }

    /**
     * Returns the fit as a few lines of text: the family and tally, one line per parameter with
     * its estimate and interval (decimals chosen from the interval's width), the two
     * log-likelihoods and the likelihood-ratio test.
     *
     * @return the report, lines ending in {@code '\n'}
     */
    public String report() {
        StringBuilder sb = new StringBuilder();
        sb.append("Fit of ").append(family).append('\n');
        sb.append(String.format(Locale.ROOT, "to %d shots (%d outcome(s) seen), %d distribution"
                + " evaluations", shots, outcomesSeen, evaluations)).append('\n');
        int width = "parameter".length();
        for (FittedParameter p : parameters) {
            width = Math.max(width, p.name().length());
        }
        String level = NoiseFamily.number(100 * confidence) + "%";
        sb.append(pad("parameter", width)).append("  estimate  ").append(level)
                .append(" interval\n");
        for (FittedParameter p : parameters) {
            String f = "%." + decimals(p.high() - p.low()) + "f";
            sb.append(pad(p.name(), width)).append("  ")
                    .append(pad(String.format(Locale.ROOT, f, p.estimate()), 8)).append("  [")
                    .append(String.format(Locale.ROOT, f, p.low())).append(", ")
                    .append(String.format(Locale.ROOT, f, p.high())).append(']');
            if (p.lowAtRangeEnd() && p.highAtRangeEnd()) {
                sb.append(" (the whole range: the tally does not narrow it)");
            } else if (p.lowAtRangeEnd()) {
                sb.append(" (the lower end is the range's)");
            } else if (p.highAtRangeEnd()) {
                sb.append(" (the upper end is the range's)");
            }
            sb.append('\n');
        }
        sb.append(String.format(Locale.ROOT, "log-likelihood: fitted %.2f, ideal ", logLikelihood));
        if (idealLogLikelihood == Double.NEGATIVE_INFINITY) {
            sb.append("-infinity (the ideal model gives probability 0 to outcomes seen in ")
                    .append(idealForbiddenShots).append(" shot(s))\n");
        } else {
            sb.append(String.format(Locale.ROOT, "%.2f", idealLogLikelihood)).append('\n');
        }
        sb.append("likelihood ratio against the ideal model: ");
        if (ratioStatistic == Double.POSITIVE_INFINITY) {
            sb.append("infinity");
        } else {
            sb.append(String.format(Locale.ROOT, "%.2f", ratioStatistic));
        }
        sb.append(" on ").append(degreesOfFreedom()).append(" degree(s) of freedom, p-value ");
        if (ratioPValue == 0 && ratioStatistic == Double.POSITIVE_INFINITY) {
            sb.append('0');
        } else if (ratioPValue < 1e-300) {
            sb.append("< 1e-300");
        } else {
            sb.append(String.format(Locale.ROOT, "%.3g", ratioPValue));
        }
        return sb.append('\n').toString();
    }

    /** Decimals that show an interval of this width to about two significant digits. */
    static int decimals(double width) {
        if (!(width > 0) || !Double.isFinite(width)) {
            return 6;
        }
        int d = 2 - (int) Math.floor(Math.log10(width));
        return Math.max(2, Math.min(10, d));
    }

    private static String pad(String s, int width) {
        StringBuilder b = new StringBuilder(s);
        while (b.length() < width) {
            b.append(' ');
        }
        return b.toString();
    }

    /**
     * Returns a one-line summary such as
     * {@code "FittedNoise[scale = 1.04 in [0.93, 1.16], log-likelihood -2301.55]"}.
     *
     * @return the text
     */
    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder("FittedNoise[");
        for (FittedParameter p : parameters) {
            String f = "%." + decimals(p.high() - p.low()) + "f";
            sb.append(p.name()).append(" = ").append(String.format(Locale.ROOT, f, p.estimate()))
                    .append(" in [").append(String.format(Locale.ROOT, f, p.low())).append(", ")
                    .append(String.format(Locale.ROOT, f, p.high())).append("], ");
        }
        return sb.append(String.format(Locale.ROOT, "log-likelihood %.2f]", logLikelihood))
                .toString();
    }
}
