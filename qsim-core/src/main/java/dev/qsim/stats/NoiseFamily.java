package dev.qsim.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.EnumSet;
import java.util.List;
import java.util.Locale;
import java.util.Objects;
import java.util.function.Function;

import dev.qsim.internal.Checks;
import dev.qsim.noise.NoiseModel;

/**
 * Noise models indexed by a small vector of parameters: a function from {@code θ} to a
 * {@link NoiseModel}, with a name and a closed range {@code [lower, upper]} per parameter. This
 * is what {@link NoiseFit} fits to a tally. Immutable, provided the function always gives the
 * same model for the same parameters; thread-safe if the function is.
 *
 * <p>Two ready-made families build their models from {@link ErrorRates}:
 * <ul>
 *   <li>{@link #scaled(ErrorRates)}: one parameter {@code "scale"}, a factor {@code λ} that
 *       multiplies every rate of a base device model (are the errors larger or smaller than
 *       the calibration says, and by how much?);</li>
 *   <li>{@link #ofKinds(ErrorRates, ErrorKind...)}: one parameter per chosen kind of error rate
 *       (one- or two-qubit depolarizing, readout errors), the other rates held fixed.</li>
 * </ul>
 * Whether a circuit's outcomes can tell the parameters apart is a property of the circuit: with
 * only {@code h(0)} before the measurements, a depolarizing error after the {@code h} changes
 * no outcome probability, so its likelihood is flat and its interval is its whole range.
 *
 * @since 0.1
 */
public final class NoiseFamily {
    /** The most parameters a family may have: {@value}. */
    public static final int MAX_PARAMETERS = 4;

    /** The name of the one parameter of {@link #scaled(ErrorRates)}: {@value}. */
    public static final String SCALE = "scale";

    private final List<String> names;
    private final double[] lower;
    private final double[] upper;
    private final Function<double[], NoiseModel> models;
    private final String description;

    private NoiseFamily(List<String> names, double[] lower, double[] upper,
            Function<double[], NoiseModel> models, String description) {
        this.names = names;
        this.lower = lower;
        this.upper = upper;
        this.models = models;
        this.description = description;
    }

    /**
     * Returns a family given by a function of its parameters.
     *
     * @param names one name per parameter, 1 to {@value #MAX_PARAMETERS} of them, distinct,
     *     not blank, without whitespace; copied
     * @param lower the smallest value of each parameter, finite; copied
     * @param upper the largest value of each parameter, finite and above {@code lower}; copied
     * @param models the model for each parameter vector within the ranges; it receives a copy of
     *     the vector (in the order of {@code names}) and must not return null
     * @return the family
     * @throws IllegalArgumentException if the counts differ or are out of range, a name is bad
     *     or repeats, or a range is empty or not finite (the message names the parameter)
     */
    public static NoiseFamily of(List<String> names, double[] lower, double[] upper,
            Function<double[], NoiseModel> models) {
        Objects.requireNonNull(names, "names");
        Objects.requireNonNull(lower, "lower");
        Objects.requireNonNull(upper, "upper");
        Objects.requireNonNull(models, "models");
        List<String> copy = List.copyOf(names);
        Checks.requireInRange(copy.size(), 1, MAX_PARAMETERS, "the number of parameters");
        if (lower.length != copy.size() || upper.length != copy.size()) {
            throw new IllegalArgumentException("there are " + copy.size() + " parameter names but "
                    + lower.length + " lower and " + upper.length + " upper bounds; give one of"
                    + " each per parameter");
        }
        for (int j = 0; j < copy.size(); j++) {
            String name = Checks.requireName(copy.get(j), "parameter name " + j);
            if (copy.indexOf(name) != j) {
                throw new IllegalArgumentException("parameter name '" + Checks.excerpt(name)
                        + "' is given twice; each parameter needs its own name");
            }
            if (!Double.isFinite(lower[j]) || !Double.isFinite(upper[j])
                    || !(lower[j] < upper[j])) {
                throw new IllegalArgumentException("the range of parameter '"
                        + Checks.excerpt(name) + "' is [" + lower[j] + ", " + upper[j]
                        + "]; it must be finite with lower < upper");
            }
        }
        double[] lo = lower.clone();
        double[] hi = upper.clone();
        return new NoiseFamily(copy, lo, hi, models, "NoiseFamily[" + ranges(copy, lo, hi) + "]");
    }

    /**
     * Returns the one-parameter family {@code λ -> base.scaled(λ).model()}: every rate of the
     * base multiplied by the parameter {@value #SCALE}, in {@code [0, base.maxScale()]}. At
     * {@code λ = 0} the model is ideal, at {@code λ = 1} it is the base model.
     *
     * @param base the rates at {@code λ = 1}, not all zero
     * @return the family
     * @throws IllegalArgumentException if every rate of the base is zero
     */
    public static NoiseFamily scaled(ErrorRates base) {
        Objects.requireNonNull(base, "base");
        if (base.isZero()) {
            throw new IllegalArgumentException("the base rates are all zero (" + base
                    + "); a scale factor needs at least one non-zero rate to multiply");
        }
        double max = base.maxScale();
        return new NoiseFamily(List.of(SCALE), new double[] {0}, new double[] {max},
                theta -> base.scaled(Math.min(theta[0], max)).model(),
                "NoiseFamily[" + SCALE + " in [0, " + number(max) + "] times " + base + "]");
    }

    /**
     * Returns the family with one parameter per given kind of error rate, named
     * {@link ErrorKind#parameterName()} and ranging over {@code [0, }{@link ErrorKind#limit()}
     * {@code ]}, in the order given; the rates of the other kinds are taken from {@code fixed}.
     * At all parameters 0 the model is {@code fixed} with the chosen rates set to 0.
     *
     * @param fixed the rates of the kinds that are not parameters (the chosen kinds' values here
     *     are ignored)
     * @param free the kinds to fit, 1 to 4 of them, each once; {@link ErrorKind#READOUT_SYMMETRIC}
     *     not together with {@link ErrorKind#READOUT_ONE_GIVEN_ZERO} or
     *     {@link ErrorKind#READOUT_ZERO_GIVEN_ONE}
     * @return the family
     * @throws IllegalArgumentException if no kind is given, a kind repeats, or the symmetric
     *     readout kind is combined with a one-way readout kind
     */
    public static NoiseFamily ofKinds(ErrorRates fixed, ErrorKind... free) {
        Objects.requireNonNull(fixed, "fixed");
        Objects.requireNonNull(free, "free");
        if (free.length == 0) {
            throw new IllegalArgumentException("give at least one kind of error rate to fit; the"
                    + " kinds are " + Arrays.toString(ErrorKind.values()));
        }
        EnumSet<ErrorKind> seen = EnumSet.noneOf(ErrorKind.class);
        List<String> names = new ArrayList<>();
        double[] lower = new double[free.length];
        double[] upper = new double[free.length];
        for (int j = 0; j < free.length; j++) {
            ErrorKind k = Objects.requireNonNull(free[j], "free[" + j + "]");
            if (!seen.add(k)) {
                throw new IllegalArgumentException("kind " + k + " is given twice; give each"
                        + " kind once");
            }
            names.add(k.parameterName());
            upper[j] = k.limit();
        }
        if (seen.contains(ErrorKind.READOUT_SYMMETRIC)
                && (seen.contains(ErrorKind.READOUT_ONE_GIVEN_ZERO)
                || seen.contains(ErrorKind.READOUT_ZERO_GIVEN_ONE))) {
            throw new IllegalArgumentException("kind READOUT_SYMMETRIC sets both readout errors,"
                    + " so it cannot be fitted together with " + (seen.contains(
                    ErrorKind.READOUT_ONE_GIVEN_ZERO) ? ErrorKind.READOUT_ONE_GIVEN_ZERO
                    : ErrorKind.READOUT_ZERO_GIVEN_ONE) + "; choose one or the other");
        }
        ErrorKind[] kinds = free.clone();
        Function<double[], NoiseModel> models = theta -> {
            ErrorRates r = fixed;
            for (int j = 0; j < kinds.length; j++) {
                r = r.with(kinds[j], Math.min(theta[j], kinds[j].limit()));
            }
            return r.model();
        };
        List<String> list = List.copyOf(names);
        return new NoiseFamily(list, lower, upper, models, "NoiseFamily[" + ranges(list, lower,
                upper) + (fixed.isZero() ? "; other rates 0]" : "; other rates from " + fixed
                + "]"));
    }

    private static String ranges(List<String> names, double[] lower, double[] upper) {
        StringBuilder sb = new StringBuilder();
        for (int j = 0; j < names.size(); j++) {
            sb.append(j > 0 ? ", " : "").append(Checks.excerpt(names.get(j))).append(" in [")
                    .append(number(lower[j])).append(", ").append(number(upper[j])).append(']');
        }
        return sb.toString();
    }

    /** A number in at most six significant digits, without trailing zeros. */
    static String number(double x) {
        String s = String.format(Locale.ROOT, "%.6g", x);
        if (s.indexOf('e') < 0 && s.indexOf('.') >= 0) {
            s = s.replaceAll("0+$", "");
            s = s.endsWith(".") ? s.substring(0, s.length() - 1) : s;
        }
        return s;
    }

    /**
     * Returns the number of parameters.
     *
     * @return 1 to {@value #MAX_PARAMETERS}
     */
    public int size() {
        return names.size();
    }

    /**
     * Returns the parameter names, in the order of the parameter vector.
     *
     * @return an unmodifiable list
     */
    public List<String> names() {
        return names;
    }

    /**
     * Returns the smallest allowed value of a parameter.
     *
     * @param j the parameter's position, in {@code [0, size())}
     * @return the lower end of its range
     * @throws IndexOutOfBoundsException if {@code j} is out of range
     */
    public double lower(int j) {
        Objects.checkIndex(j, lower.length);
        return lower[j];
    }

    /**
     * Returns the largest allowed value of a parameter.
     *
     * @param j the parameter's position, in {@code [0, size())}
     * @return the upper end of its range
     * @throws IndexOutOfBoundsException if {@code j} is out of range
     */
    public double upper(int j) {
        Objects.checkIndex(j, upper.length);
        return upper[j];
    }

    /**
     * Returns the model at a parameter vector.
     *
     * @param theta one value per parameter, each within its range. Not modified.
     * @return the model
     * @throws IllegalArgumentException if the length differs from {@link #size()}, a value is
     *     outside its range or NaN (the message names the parameter, its value and the range), or
     *     the function returns null
     */
    public NoiseModel model(double... theta) {
        Objects.requireNonNull(theta, "theta");
        if (theta.length != names.size()) {
            throw new IllegalArgumentException("the family has " + names.size() + " parameter(s) "
                    + names + " but " + theta.length + " value(s) were given");
        }
        for (int j = 0; j < theta.length; j++) {
            if (!(theta[j] >= lower[j] && theta[j] <= upper[j])) {
                throw new IllegalArgumentException("parameter '" + Checks.excerpt(names.get(j))
                        + "' must be in [" + lower[j] + ", " + upper[j] + "] but was "
                        + theta[j]);
            }
        }
        NoiseModel m = models.apply(theta.clone());
        if (m == null) {
            throw new IllegalArgumentException("the family's function returned no model for "
                    + names + " = " + Arrays.toString(theta));
        }
        return m;
    }

    /**
     * Describes the family: its parameters and, for the ready-made families, the base or fixed
     * rates.
     *
     * @return a short description
     */
    @Override
    public String toString() {
        return description;
    }
}
