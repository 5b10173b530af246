package dev.qsim.examples.cli;

import java.math.BigInteger;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

import picocli.CommandLine.ITypeConverter;
import picocli.CommandLine.TypeConversionException;

import dev.qsim.Precision;
import dev.qsim.stats.ComparisonSettings;
import dev.qsim.stats.ErrorKind;

/**
 * The tool's option values, read and checked as the command line is parsed, before any work:
 * a value outside its range is refused with a message that names it and the range, such as
 * {@code "99999999999 is not a whole number from 1 to 10,000,000"}; {@link Cli} puts the
 * option's name in front.
 */
final class OptionValues {
    private OptionValues() {
    }

    /** A whole number in {@code [min, max]}, refused with the range in words. */
    static long whole(String text, long min, long max) {
        String t = text.strip();
        if (t.matches("[+-]?\\d+")) {
            BigInteger v = new BigInteger(t);
            if (v.compareTo(BigInteger.valueOf(min)) >= 0
                    && v.compareTo(BigInteger.valueOf(max)) <= 0) {
                return v.longValueExact();
            }
        }
        throw new TypeConversionException("'" + text + "' is not a whole number from "
                + grouped(min) + " to " + grouped(max));
    }

    /**
     * A number from {@code min} to {@code max}, each end included unless {@code openBottom} or
     * {@code openTop}; {@code what} names it in the refusal ("a probability").
     */
    static double decimal(String text, double min, double max, boolean openBottom,
            boolean openTop, String what) {
        double v;
        try {
            v = Double.parseDouble(text.strip());
        } catch (NumberFormatException e) {
            v = Double.NaN;
        }
        boolean ok = (openBottom ? v > min : v >= min) && (openTop ? v < max : v <= max);
        if (!ok) {
            String range = openBottom && openTop ? "between " + plain(min) + " and "
                    + plain(max) + ", both excluded" : openTop ? "from " + plain(min)
                    + " up to (not including) " + plain(max) : "from " + plain(min) + " to "
                    + plain(max);
            throw new TypeConversionException("'" + text + "' is not " + what + " " + range);
        }
        return v;
    }

    private static String grouped(long v) {
        return String.format(Locale.ROOT, "%,d", v);
    }

    private static String plain(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }

    /** {@code --shots}: 1 to {@link Cli#MAX_SHOTS}. */
    static final class Shots implements ITypeConverter<Integer> {
        @Override
        public Integer convert(String value) {
            return (int) whole(value, 1, Cli.MAX_SHOTS);
        }
    }

    /**
     * {@code --budget-time}: a positive duration with a unit, {@code 90s}, {@code 5min},
     * {@code 2h} or {@code 250ms}; at most a year. Returns seconds.
     */
    static final class Duration implements ITypeConverter<Double> {
        @Override
        public Double convert(String value) {
            String t = value.strip().toLowerCase(Locale.ROOT);
            String[] units = {"ms", "s", "min", "h"};
            double[] scale = {1e-3, 1, 60, 3600};
            for (int u = 0; u < units.length; u++) {
                if (t.endsWith(units[u]) && !(units[u].equals("s") && t.endsWith("ms"))) {
                    String number = t.substring(0, t.length() - units[u].length()).strip();
                    double v = number.matches("\\d+(\\.\\d+)?") ? Double.parseDouble(number)
                            * scale[u] : Double.NaN;
                    if (v > 0 && v <= 366 * 86400.0) {
                        return v;
                    }
                }
            }
            throw new TypeConversionException("'" + value + "' is not a duration such as 90s,"
                    + " 5min, 2h or 250ms (above 0, at most a year)");
        }
    }

    /**
     * {@code --budget-memory}: a positive size with a binary unit, {@code 512MiB}, {@code 4GiB}
     * (also {@code 512m}, {@code 4g}, {@code 64k}); at most 1 PiB. Returns bytes.
     */
    static final class Size implements ITypeConverter<Long> {
        @Override
        public Long convert(String value) {
            String t = value.strip().toLowerCase(Locale.ROOT);
            String[][] units = {{"kib", "k"}, {"mib", "m"}, {"gib", "g"}, {"tib", "t"}};
            for (int u = 0; u < units.length; u++) {
                for (String name : units[u]) {
                    if (t.endsWith(name)) {
                        String number = t.substring(0, t.length() - name.length()).strip();
                        double v = number.matches("\\d+(\\.\\d+)?")
                                ? Double.parseDouble(number) * Math.pow(1024, u + 1) : Double.NaN;
                        if (v >= 1 && v <= Math.pow(1024, 5)) {
                            return (long) v;
                        }
                        u = units.length;
                        break;
                    }
                }
            }
            throw new TypeConversionException("'" + value + "' is not a memory size such as"
                    + " 512MiB, 4GiB or 4g (above 0, at most 1 PiB)");
        }
    }

    /** {@code --seed}: any 64-bit whole number. */
    static final class Seed implements ITypeConverter<Long> {
        @Override
        public Long convert(String value) {
            return whole(value, Long.MIN_VALUE, Long.MAX_VALUE);
        }
    }

    /** {@code --threads}: 1 to {@link Cli#MAX_THREADS}. */
    static final class Threads implements ITypeConverter<Integer> {
        @Override
        public Integer convert(String value) {
            return (int) whole(value, 1, Cli.MAX_THREADS);
        }
    }

    /** A probability of noise, 0 to 1. */
    static final class Probability implements ITypeConverter<Double> {
        @Override
        public Double convert(String value) {
            return decimal(value, 0, 1, false, false, "a probability");
        }
    }

    /** {@code --cutoff}: 0 up to but not including 1. */
    static final class Cutoff implements ITypeConverter<Double> {
        @Override
        public Double convert(String value) {
            return decimal(value, 0, 1, false, true, "a probability");
        }
    }

    /** {@code --tolerance}: above 0, at most 1. */
    static final class Tolerance implements ITypeConverter<Double> {
        @Override
        public Double convert(String value) {
            return decimal(value, 0, 1, true, false, "a distance");
        }
    }

    /** {@code --confidence}: strictly between 0.5 and 1. */
    static final class Confidence implements ITypeConverter<Double> {
        @Override
        public Double convert(String value) {
            return decimal(value, 0.5, 1, true, true, "a confidence level");
        }
    }

    /** {@code --prediction-shots}: 1 to {@value Cli#MAX_PREDICTION_SHOTS}. */
    static final class PredictionShots implements ITypeConverter<Integer> {
        @Override
        public Integer convert(String value) {
            return (int) whole(value, 1, Cli.MAX_PREDICTION_SHOTS);
        }
    }

    /** {@code scale}, or a comma list of the kinds' parameter names. */
    static final class FitKinds implements ITypeConverter<Cli.FitRequest> {
        @Override
        public Cli.FitRequest convert(String value) {
            if (value.strip().equals("scale")) {
                return new Cli.FitRequest(true, List.of());
            }
            List<ErrorKind> kinds = new ArrayList<>();
            List<String> names = new ArrayList<>();
            for (ErrorKind k : ErrorKind.values()) {
                names.add(k.parameterName());
            }
            String[] parts = value.split(",", -1);
            if (parts.length > ErrorKind.values().length) {
                throw new TypeConversionException("'" + Cli.excerpt(value) + "' names more"
                        + " kinds than there are (" + String.join(", ", names) + ")");
            }
            for (String part : parts) {
                String name = part.strip();
                ErrorKind found = null;
                for (ErrorKind k : ErrorKind.values()) {
                    if (k.parameterName().equals(name)) {
                        found = k;
                    }
                }
                if (found == null) {
                    throw new TypeConversionException("'" + Cli.excerpt(name) + "' is not"
                            + " 'scale' or a kind of error rate (" + String.join(", ", names)
                            + ")");
                }
                if (kinds.contains(found)) {
                    throw new TypeConversionException("'" + name + "' is given twice");
                }
                kinds.add(found);
            }
            return new Cli.FitRequest(false, List.copyOf(kinds));
        }
    }

    /** {@code --resamples}: 1 to {@link Cli#MAX_RESAMPLES}. */
    static final class Resamples implements ITypeConverter<Integer> {
        @Override
        public Integer convert(String value) {
            return (int) whole(value, ComparisonSettings.MIN_RESAMPLES,
                    Cli.MAX_RESAMPLES);
        }
    }

    /** {@code --top}: 0 to {@link Cli#MAX_TOP}. */
    static final class Top implements ITypeConverter<Integer> {
        @Override
        public Integer convert(String value) {
            return (int) whole(value, 0, Cli.MAX_TOP);
        }
    }

    /** {@code scale --min} and {@code --max}: 1 to {@link Cli#MAX_SCALE_QUBITS}. */
    static final class ScaleQubits implements ITypeConverter<Integer> {
        @Override
        public Integer convert(String value) {
            return (int) whole(value, 1, Cli.MAX_SCALE_QUBITS);
        }
    }

    /** {@code --precision}: {@code double} or {@code single}. */
    static final class Storage implements ITypeConverter<Precision> {
        @Override
        public Precision convert(String value) {
            switch (value) {
                case "double":
                    return Precision.DOUBLE;
                case "single":
                    return Precision.SINGLE;
                default:
                    throw new TypeConversionException("'" + value + "' is not double or single");
            }
        }
    }

    /** {@code --format} of {@code run}: {@code table}, {@code csv} or {@code json}. */
    static final class TallyFormat implements ITypeConverter<Cli.Format> {
        @Override
        public Cli.Format convert(String value) {
            for (Cli.Format f : Cli.Format.values()) {
                if (f.name().equals(value)) {
                    return f;
                }
            }
            throw new TypeConversionException("'" + value + "' is not table, csv or json");
        }
    }

    /** {@code --format} of {@code scale}: {@code table} or {@code csv}. */
    static final class TableFormat implements ITypeConverter<String> {
        @Override
        public String convert(String value) {
            if (value.equals("table") || value.equals("csv")) {
                return value;
            }
            throw new TypeConversionException("'" + value + "' is not table or csv");
        }
    }

    /** One {@code --input NAME=VALUE}: the name, the value, and whether it was written whole. */
    record InputValue(String name, double value, boolean integer) {
    }

    /** {@code --input NAME=VALUE} with a finite number. */
    static final class Input implements ITypeConverter<InputValue> {
        @Override
        public InputValue convert(String value) {
            int eq = value.indexOf('=');
            String name = eq < 0 ? "" : value.substring(0, eq).strip();
            String number = eq < 0 ? "" : value.substring(eq + 1).strip();
            if (name.isEmpty() || !name.matches("[A-Za-z_][A-Za-z0-9_]*")) {
                throw new TypeConversionException("'" + Cli.excerpt(value) + "' is not"
                        + " NAME=VALUE with the name of an input declaration");
            }
            if (number.matches("[+-]?\\d{1,18}")) {
                return new InputValue(name, Long.parseLong(number), true);
            }
            double v;
            try {
                v = Double.parseDouble(number);
            } catch (NumberFormatException e) {
                v = Double.NaN;
            }
            if (!Double.isFinite(v)) {
                throw new TypeConversionException("'" + Cli.excerpt(number) + "' (the value of "
                        + name + ") is not a finite number");
            }
            return new InputValue(name, v, false);
        }
    }

    /** {@code --loop-bound}: 1 to the builder's most iterations. */
    static final class LoopBound implements ITypeConverter<Integer> {
        @Override
        public Integer convert(String value) {
            return (int) whole(value, 1, dev.qsim.Circuit.Builder.MAX_ITERATIONS);
        }
    }

    /** {@code --work-budget}: 1 to 10^11 steps. */
    static final class WorkBudget implements ITypeConverter<Long> {
        @Override
        public Long convert(String value) {
            return whole(value, 1, 100_000_000_000L);
        }
    }

    /** {@code --dt}: above 0, at most one second. */
    static final class TimeStep implements ITypeConverter<Double> {
        @Override
        public Double convert(String value) {
            return decimal(value, 0, 1, true, false, "a time in seconds");
        }
    }
}
