package dev.qsim.spark;

import java.io.IOException;
import java.io.Serializable;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Objects;

/**
 * The points of a parameter sweep: a grid (a product of evenly spaced axes) or a list of points
 * (given, or read from a CSV file). Each point gives a value to every named parameter; points
 * are numbered {@code 0 .. size() - 1} and a sweep's results carry that number. Immutable and
 * thread-safe; serializable only so that a job can ship it to executors.
 *
 * <p>A grid's axis {@code name=from:to:count} takes {@code count} evenly spaced values from
 * {@code from} to {@code to} (both included; {@code from} alone when {@code count} is 1), the
 * values {@code from + k (to - from) / (count - 1)}, {@code k = 0 .. count - 1}, with the last
 * one exactly {@code to}. Grid points are numbered in row-major order: the last axis varies
 * fastest. Grids are not stored point by point, so a grid of {@value #MAX_POINTS} points costs
 * no memory.
 *
 * <p>Parameter names are identifiers ({@code [A-Za-z_][A-Za-z0-9_]*}, at most
 * {@value #MAX_NAME} characters), distinct ignoring case (Spark's column names ignore case),
 * and none is a result column's name ({@code point}, {@code value}, {@code standard_error}) or
 * starts with {@code gradient_}.
 *
 * @since 0.1
 */
public final class SweepPoints implements Serializable {
    private static final long serialVersionUID = 1L;

    /** The most points a sweep may have: {@value}. */
    public static final long MAX_POINTS = 1L << 31;
    /** The most values a list of points may hold (points times parameters): {@value}. */
    public static final int MAX_LIST_VALUES = 1 << 26;
    /** The most parameters: {@value}. */
    public static final int MAX_PARAMETERS = 1024;
    /** The longest parameter name: {@value}. */
    public static final int MAX_NAME = 64;

    /** Result column names a parameter may not take (compared ignoring case). */
    static final List<String> RESERVED = List.of("point", "value", "standard_error");
    /** The prefix of gradient columns, which a parameter name may not start with. */
    static final String GRADIENT_PREFIX = "gradient_";

    private final String[] names;
    /** Grid: the axes; null for a list. */
    private final double[] from;
    private final double[] to;
    private final int[] counts;
    /** List: the values, point by point; null for a grid. */
    private final double[] values;
    private final long size;

    private SweepPoints(String[] names, double[] from, double[] to, int[] counts,
            double[] values, long size) {
        this.names = names;
        this.from = from;
        this.to = to;
        this.counts = counts;
        this.values = values;
        this.size = size;
    }

    /**
     * One axis of a grid: {@code count} evenly spaced values of a parameter from {@code from}
     * to {@code to}.
     *
     * @param name the parameter's name
     * @param from the first value, finite
     * @param to the last value, finite (equal to {@code from} when {@code count} is 1)
     * @param count the number of values, at least 1
     * @since 0.1
     */
    public record Axis(String name, double from, double to, int count) {
        /**
         * Checks the axis.
         *
         * @param name the parameter's name, an identifier
         * @param from the first value
         * @param to the last value
         * @param count the number of values
         * @throws IllegalArgumentException if the name is not an identifier, a value is not
         *     finite, {@code count < 1}, {@code to - from} overflows, or {@code count} is 1 and
         *     {@code to != from}
         */
        public Axis {
            requireName(name);
            if (!Double.isFinite(from) || !Double.isFinite(to)) {
                throw new IllegalArgumentException("axis '" + name + "': the ends must be"
                        + " finite numbers but were " + from + " and " + to);
            }
            if (count < 1) {
                throw new IllegalArgumentException("axis '" + name + "': the number of values"
                        + " must be at least 1 but was " + count);
            }
            if (!Double.isFinite(to - from)) {
                throw new IllegalArgumentException("axis '" + name + "': the span from " + from
                        + " to " + to + " overflows a double; use a narrower range");
            }
            if (count == 1 && to != from) {
                throw new IllegalArgumentException("axis '" + name + "' has 1 value, so its"
                        + " ends must be equal, but they are " + from + " and " + to);
            }
        }

        /**
         * Reads an axis written {@code name=from:to:count}, or {@code name=value} for one
         * value.
         *
         * @param text the axis
         * @return the axis
         * @throws IllegalArgumentException if the text is not in that form, naming the part
         *     that is wrong
         */
        public static Axis parse(String text) {
            Objects.requireNonNull(text, "text");
            int eq = text.indexOf('=');
            if (eq < 0) {
                throw new IllegalArgumentException("the axis '" + Text.excerpt(text)
                        + "' is not of the form name=from:to:count (such as theta=0:3.14:50)");
            }
            String name = text.substring(0, eq).strip();
            String[] parts = text.substring(eq + 1).split(":", -1);
            if (parts.length == 1) {
                double v = Text.number(parts[0], "the value of axis '" + Text.excerpt(name)
                        + "'");
                return new Axis(name, v, v, 1);
            }
            if (parts.length != 3) {
                throw new IllegalArgumentException("the axis '" + Text.excerpt(text) + "' has "
                        + parts.length + " parts after '='; write name=from:to:count (such as"
                        + " theta=0:3.14:50) or name=value");
            }
            double a = Text.number(parts[0], "the start of axis '" + Text.excerpt(name) + "'");
            double b = Text.number(parts[1], "the end of axis '" + Text.excerpt(name) + "'");
            String c = parts[2].strip();
            int count;
            try {
                count = Integer.parseInt(c);
            } catch (NumberFormatException e) {
                throw new IllegalArgumentException("the count of axis '" + Text.excerpt(name)
                        + "' must be a whole number from 1 to " + Integer.MAX_VALUE + " but was '"
                        + Text.excerpt(c) + "'", e);
            }
            return new Axis(name, a, b, count);
        }

        /** The value at step {@code k}. */
        double value(int k) {
            return step(from, to, count, k);
        }
    }

    /** Step {@code k} of {@code count} evenly spaced values from {@code a} to {@code b}. */
    static double step(double a, double b, int count, int k) {
        if (count == 1) {
            return a;
        }
        if (k == count - 1) {
            return b;
        }
        return a + k * ((b - a) / (count - 1));
    }

    /**
     * Returns the grid of the given axes.
     *
     * @param axes one axis per parameter, names distinct ignoring case
     * @return the grid's points
     * @throws IllegalArgumentException if there is no axis or more than
     *     {@value #MAX_PARAMETERS}, a name repeats, or the grid has more than
     *     {@value #MAX_POINTS} points
     */
    public static SweepPoints grid(List<Axis> axes) {
        Objects.requireNonNull(axes, "axes");
        if (axes.isEmpty() || axes.size() > MAX_PARAMETERS) {
            throw new IllegalArgumentException("a grid needs 1 to " + MAX_PARAMETERS
                    + " axes but " + axes.size() + " were given");
        }
        String[] names = new String[axes.size()];
        double[] from = new double[names.length];
        double[] to = new double[names.length];
        int[] counts = new int[names.length];
        long size = 1;
        for (int j = 0; j < names.length; j++) {
            Axis a = Objects.requireNonNull(axes.get(j), "axis");
            names[j] = a.name();
            from[j] = a.from();
            to[j] = a.to();
            counts[j] = a.count();
            if (size > MAX_POINTS / a.count()) {
                throw new IllegalArgumentException("the grid " + describe(axes) + " has more"
                        + " than " + MAX_POINTS + " points, the most a sweep may have");
            }
            size *= a.count();
        }
        requireDistinct(names);
        return new SweepPoints(names, from, to, counts, null, size);
    }

    private static String describe(List<Axis> axes) {
        StringBuilder sb = new StringBuilder();
        for (Axis a : axes) {
            sb.append(sb.length() == 0 ? "" : " x ").append(a.count());
        }
        return sb.toString();
    }

    /**
     * Returns a list of points.
     *
     * @param names the parameter names, distinct ignoring case
     * @param points the points, each with one finite value per name, in the order of the
     *     names; at least one. Copied.
     * @return the points
     * @throws IllegalArgumentException if a name is bad or repeats, there is no point, a point
     *     has the wrong length or a value that is not finite, or there are more than
     *     {@value #MAX_LIST_VALUES} values
     */
    public static SweepPoints list(List<String> names, double[][] points) {
        Objects.requireNonNull(names, "names");
        Objects.requireNonNull(points, "points");
        String[] n = names.toArray(new String[0]);
        if (n.length == 0 || n.length > MAX_PARAMETERS) {
            throw new IllegalArgumentException("points need 1 to " + MAX_PARAMETERS
                    + " parameter names but " + n.length + " were given");
        }
        for (String name : n) {
            requireName(name);
        }
        requireDistinct(n);
        if (points.length == 0) {
            throw new IllegalArgumentException("a list of points needs at least one point");
        }
        if ((long) points.length * n.length > MAX_LIST_VALUES) {
            throw new IllegalArgumentException(points.length + " points of " + n.length
                    + " parameters are more than " + MAX_LIST_VALUES + " values, the most a"
                    + " list may hold; use a grid or split the sweep");
        }
        double[] v = new double[points.length * n.length];
        for (int i = 0; i < points.length; i++) {
            double[] p = Objects.requireNonNull(points[i], "point");
            if (p.length != n.length) {
                throw new IllegalArgumentException("point " + i + " has " + p.length
                        + " value(s) but there are " + n.length + " parameters " + Arrays
                        .toString(n));
            }
            for (int j = 0; j < n.length; j++) {
                if (!Double.isFinite(p[j])) {
                    throw new IllegalArgumentException("point " + i + ": the value of '" + n[j]
                            + "' must be finite but was " + p[j]);
                }
                v[i * n.length + j] = p[j];
            }
        }
        return new SweepPoints(n, null, null, null, v, points.length);
    }

    /**
     * Reads a list of points from a CSV file in UTF-8: a header line of parameter names, then
     * one line per point with one number per name, separated by commas (spaces around fields
     * are ignored). Numbers are decimal ({@code -0.5}, {@code 3}, {@code 1e-3}); blank lines and
     * lines starting with {@code #} are skipped. The file's size is checked before it is read.
     *
     * @param file the file, at most {@value Text#MAX_POINTS_FILE_BYTES} bytes
     * @return the points, numbered in file order from 0
     * @throws IOException if the file cannot be read
     * @throws IllegalArgumentException if the file is too large, not UTF-8, or not of that
     *     form; the message gives the file, the line and what is wrong
     * @throws IllegalStateException if the heap cannot hold the values
     */
    public static SweepPoints read(Path file) throws IOException {
        Objects.requireNonNull(file, "file");
        List<String> lines = Text.readLines(file, Text.MAX_POINTS_FILE_BYTES, "a points file");
        String[] header = null;
        int headerLine = 0;
        double[] v = new double[64];
        int used = 0;
        long points = 0;
        for (int ln = 0; ln < lines.size(); ln++) {
            String line = lines.get(ln).strip();
            if (line.isEmpty() || line.startsWith("#")) {
                continue;
            }
            String where = file + " line " + (ln + 1);
            String[] fields = line.split(",", -1);
            if (header == null) {
                header = new String[fields.length];
                for (int j = 0; j < fields.length; j++) {
                    header[j] = fields[j].strip();
                    try {
                        requireName(header[j]);
                    } catch (IllegalArgumentException e) {
                        throw new IllegalArgumentException(where + " (the header): "
                                + e.getMessage(), e);
                    }
                }
                if (header.length > MAX_PARAMETERS) {
                    throw new IllegalArgumentException(where + " (the header): " + header.length
                            + " names, more than the " + MAX_PARAMETERS + " allowed");
                }
                try {
                    requireDistinct(header);
                } catch (IllegalArgumentException e) {
                    throw new IllegalArgumentException(where + " (the header): "
                            + e.getMessage(), e);
                }
                headerLine = ln + 1;
                continue;
            }
            if (fields.length != header.length) {
                throw new IllegalArgumentException(where + ": " + fields.length + " field(s),"
                        + " but the header (line " + headerLine + ") names " + header.length);
            }
            if (used + header.length > MAX_LIST_VALUES) {
                throw new IllegalArgumentException(where + ": more than " + MAX_LIST_VALUES
                        + " values, the most a list of points may hold; split the file");
            }
            if (used + header.length > v.length) {
                v = Arrays.copyOf(v, (int) Math.min(MAX_LIST_VALUES, Math.max(2L * v.length,
                        used + header.length)));
            }
            for (int j = 0; j < fields.length; j++) {
                v[used++] = Text.number(fields[j], where + ", column " + (j + 1) + " ("
                        + header[j] + ")");
            }
            points++;
        }
        if (header == null) {
            throw new IllegalArgumentException(file + ": no header line; the first line names"
                    + " the parameters, such as 'theta,phi'");
        }
        if (points == 0) {
            throw new IllegalArgumentException(file + ": no points after the header (line "
                    + headerLine + ")");
        }
        return new SweepPoints(header, null, null, null, Arrays.copyOf(v, used), points);
    }

    /**
     * Returns the parameter names, in the order of the axes or columns.
     *
     * @return an unmodifiable list
     */
    public List<String> names() {
        return List.of(names);
    }

    /**
     * Returns the number of points.
     *
     * @return at least 1, at most {@value #MAX_POINTS}
     */
    public long size() {
        return size;
    }

    /**
     * Tells whether these points are a grid (not stored point by point).
     *
     * @return whether this is a grid
     */
    public boolean isGrid() {
        return values == null;
    }

    /**
     * Returns point {@code index}: one value per name, in the order of {@link #names()}.
     *
     * @param index the point's number
     * @return a new array
     * @throws IndexOutOfBoundsException if {@code index} is not in {@code [0, size())}
     */
    public double[] point(long index) {
        if (index < 0 || index >= size) {
            throw new IndexOutOfBoundsException("point " + index + " is out of range [0, "
                    + (size - 1) + "]");
        }
        int m = names.length;
        double[] p = new double[m];
        if (values != null) {
            System.arraycopy(values, (int) index * m, p, 0, m);
            return p;
        }
        long rest = index;
        for (int j = m - 1; j >= 0; j--) {
            int k = (int) (rest % counts[j]);
            rest /= counts[j];
            p[j] = step(from[j], to[j], counts[j], k);
        }
        return p;
    }

    /**
     * Returns a short description, such as {@code "grid 50 x 40 of [theta, phi]"}.
     *
     * @return the description
     */
    @Override
    public String toString() {
        if (values != null) {
            return "list of " + size + " points of " + Arrays.toString(names);
        }
        StringBuilder sb = new StringBuilder("grid ");
        for (int j = 0; j < counts.length; j++) {
            sb.append(j == 0 ? "" : " x ").append(counts[j]);
        }
        return sb.append(" of ").append(Arrays.toString(names)).toString();
    }

    /**
     * Checks a parameter name: an identifier of at most {@value #MAX_NAME} characters, not a
     * result column's name.
     */
    static String requireName(String name) {
        Objects.requireNonNull(name, "name");
        boolean ok = !name.isEmpty() && name.length() <= MAX_NAME;
        for (int i = 0; ok && i < name.length(); i++) {
            char c = name.charAt(i);
            ok = c == '_' || (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z')
                    || (i > 0 && c >= '0' && c <= '9');
        }
        if (!ok) {
            throw new IllegalArgumentException("the parameter name '" + Text.excerpt(name)
                    + "' is not an identifier of 1 to " + MAX_NAME + " characters (letters,"
                    + " digits and _, not starting with a digit)");
        }
        String lower = name.toLowerCase(Locale.ROOT);
        if (RESERVED.contains(lower) || lower.startsWith(GRADIENT_PREFIX)) {
            throw new IllegalArgumentException("the parameter name '" + name + "' is taken by"
                    + " the results (columns " + RESERVED + " and " + GRADIENT_PREFIX
                    + "NAME); rename the parameter");
        }
        return name;
    }

    private static void requireDistinct(String[] names) {
        List<String> seen = new ArrayList<>();
        for (String n : names) {
            String lower = n.toLowerCase(Locale.ROOT);
            if (seen.contains(lower)) {
                throw new IllegalArgumentException("the parameter name '" + n + "' is given"
                        + " twice (names are compared ignoring case); give each parameter once");
            }
            seen.add(lower);
        }
    }
}
