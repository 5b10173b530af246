package dev.qsim.bench;

import java.util.ArrayList;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;
import java.util.TreeMap;

import dev.qsim.Precision;

/**
 * Draws the scaling report as a self-contained SVG 1.1 document: time per gate (ns, logarithmic
 * y axis with a tick per decade) against qubit count, one polyline per kernel and precision, and
 * the Java copy loop's floor as a dashed line. Hand-written markup, no dependencies.
 *
 * <p>A kernel's point at {@code n} is its row for target {@code mid} if there is one, else the
 * arithmetic mean of {@code ns_per_gate} over the targets measured at that {@code n}. Rows in
 * single precision make their own series, labelled {@code "dense (single)"} and so on, drawn
 * in the colour of the kernel's double-precision series but dashed, with hollow markers. The
 * floor at {@code n} is the time to move {@code 2 * 16 * 2^n} bytes at the copy bandwidth
 * measured at that {@code n}: {@code 32 * 2^n / copy_gb_per_s} nanoseconds (GB/s is bytes per
 * ns). The probe's arrays are always beyond the caches ({@link HeapBudget#MIN_PROBE_LENGTH}),
 * so this is a main-memory floor at every {@code n}: a kernel whose state fits in a cache can
 * run below it. When there are single-precision rows, a dotted second floor does the same for
 * {@code 2 * 8 * 2^n} bytes. Only state-vector gate rows (one pass over {@code 2^n}
 * amplitudes) set the floor; the noise rows' probe is measured at other sizes. The probe is a
 * Java loop compiled to scalar code, so the floor is labelled as the Java copy loop's: a lower
 * bound on the machine's bandwidth, not a ceiling.
 *
 * <p>With a {@link CeilingReference}, a solid grey line draws the C reference kernel's dense
 * gate at each {@code n} where a double-precision state-vector gate row was measured and the
 * reference has that size at the rows' thread count: {@code 32 * 2^n / reference_gb_per_s}
 * nanoseconds, its time per gate (the kernel counts 32 bytes an amplitude).
 */
final class ScalingPlot {
    static final int WIDTH = 960;
    static final int HEIGHT = 580;
    private static final int LEFT = 96;
    private static final int RIGHT = 700;
    private static final int TOP = 84;
    private static final int BOTTOM = 500;

    /** Line colours, chosen to stay apart for the common forms of colour blindness. */
    private static final String[] COLOURS = {
        "#1b5fa8", "#c4480c", "#2f8a3c", "#7b3294", "#b8860b", "#0e8a8a", "#a61c3c", "#555555",
    };

    private static final String[] MARKERS = {"circle", "square", "diamond", "triangle"};

    /** Dash pattern of a single-precision series. */
    private static final String SINGLE_DASHES = "6 4";

    /** Colour of the C reference kernel's line: grey, drawn wide behind the series. */
    private static final String REFERENCE_COLOUR = "#9a9a9a";

    private ScalingPlot() {
    }

    /**
     * Returns the SVG of the rows.
     *
     * @param rows the measured rows, at least one
     * @param title the first title line
     * @param subtitle the second title line (JDK, CPU, threads)
     * @throws IllegalArgumentException if there are no rows
     */
    static String svg(List<ReportRow> rows, String title, String subtitle) {
        return svg(rows, title, subtitle, null);
    }

    /**
     * Returns the SVG of the rows with the C reference kernel's dense gate drawn as a line.
     *
     * @param rows the measured rows, at least one
     * @param title the first title line
     * @param subtitle the second title line (JDK, CPU, threads)
     * @param reference the C kernel's figures, or {@code null} for no reference line
     * @throws IllegalArgumentException if there are no rows
     */
    static String svg(List<ReportRow> rows, String title, String subtitle,
            CeilingReference reference) {
        if (rows.isEmpty()) {
            throw new IllegalArgumentException("there are no rows to plot");
        }
        final Map<String, TreeMap<Integer, Double>> series = series(rows);
        // The kernel and precision of each series, and a colour and marker per kernel, so a
        // kernel's single-precision series looks like its double one but dashed.
        final Map<String, ReportRow> first = new LinkedHashMap<>();
        final Map<String, Integer> style = new LinkedHashMap<>();
        for (ReportRow r : rows) {
            first.putIfAbsent(label(r), r);
            style.putIfAbsent(r.kernel(), style.size());
        }
        final Map<Precision, TreeMap<Integer, Double>> floors = new EnumMap<>(Precision.class);
        for (Precision p : Precision.values()) {
            final TreeMap<Integer, Double> f = floor(rows, p);
            if (!f.isEmpty()) {
                floors.put(p, f);
            }
        }

        final TreeMap<Integer, Double> referenceLine = reference == null ? new TreeMap<>()
                : referenceLine(rows, reference);

        int minN = Integer.MAX_VALUE;
        int maxN = Integer.MIN_VALUE;
        double minY = Double.POSITIVE_INFINITY;
        double maxY = 0;
        final List<TreeMap<Integer, Double>> all = new ArrayList<>(series.values());
        all.addAll(floors.values());
        all.add(referenceLine);
        for (TreeMap<Integer, Double> s : all) {
            for (Map.Entry<Integer, Double> e : s.entrySet()) {
                minN = Math.min(minN, e.getKey());
                maxN = Math.max(maxN, e.getKey());
                minY = Math.min(minY, e.getValue());
                maxY = Math.max(maxY, e.getValue());
            }
        }
        // A little room beyond the first and last n, so markers stay off the axes.
        final double pad = minN == maxN ? 1 : 0.04 * (maxN - minN);
        final double x0 = minN - pad;
        final double x1 = maxN + pad;
        final int d0 = (int) Math.floor(Math.log10(minY));
        int d1 = (int) Math.ceil(Math.log10(maxY));
        if (d1 == d0) {
            d1 = d0 + 1;
        }
        final Axes axes = new Axes(x0, x1, d0, d1);

        final StringBuilder sb = new StringBuilder(16_384);
        sb.append("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
        sb.append("<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"")
                .append(WIDTH).append("\" height=\"").append(HEIGHT).append("\" viewBox=\"0 0 ")
                .append(WIDTH).append(' ').append(HEIGHT).append("\" font-family=\"Helvetica,"
                + " Arial, sans-serif\">\n");
        sb.append("<rect x=\"0\" y=\"0\" width=\"").append(WIDTH).append("\" height=\"")
                .append(HEIGHT).append("\" fill=\"#ffffff\"/>\n");
        sb.append("<text x=\"").append(WIDTH / 2).append("\" y=\"30\" text-anchor=\"middle\""
                + " font-size=\"18\" font-weight=\"bold\" fill=\"#222222\">")
                .append(escape(title)).append("</text>\n");
        sb.append("<text x=\"").append(WIDTH / 2).append("\" y=\"54\" text-anchor=\"middle\""
                + " font-size=\"12\" fill=\"#555555\">").append(escape(subtitle))
                .append("</text>\n");

        // Grid: minor lines at 2..9 times each decade, major lines and labels at each decade.
        sb.append("<g class=\"grid\" fill=\"none\">\n");
        for (int d = d0; d <= d1; d++) {
            final double y = axes.y(Math.pow(10, d));
            line(sb, LEFT, y, RIGHT, y, "#c8c8c8", 1);
            if (d < d1) {
                for (int m = 2; m <= 9; m++) {
                    final double ym = axes.y(m * Math.pow(10, d));
                    line(sb, LEFT, ym, RIGHT, ym, "#ececec", 1);
                }
            }
        }
        final int step = Math.max(1, (int) Math.ceil((x1 - x0) / 16));
        for (int n = (int) Math.ceil(x0); n <= x1; n += step) {
            line(sb, axes.x(n), TOP, axes.x(n), BOTTOM, "#ececec", 1);
        }
        sb.append("</g>\n");

        // Axes, ticks and labels.
        sb.append("<g class=\"axes\" font-size=\"12\" fill=\"#333333\">\n");
        line(sb, LEFT, BOTTOM, RIGHT, BOTTOM, "#333333", 1.2);
        line(sb, LEFT, TOP, LEFT, BOTTOM, "#333333", 1.2);
        for (int d = d0; d <= d1; d++) {
            final double y = axes.y(Math.pow(10, d));
            line(sb, LEFT - 6, y, LEFT, y, "#333333", 1.2);
            sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%.1f\" text-anchor=\"end\">"
                    + "%s</text>%n", LEFT - 10, y + 4, escape(decadeLabel(d))));
        }
        for (int n = (int) Math.ceil(x0); n <= x1; n += step) {
            final double x = axes.x(n);
            line(sb, x, BOTTOM, x, BOTTOM + 6, "#333333", 1.2);
            sb.append(String.format(Locale.ROOT, "<text x=\"%.1f\" y=\"%d\" text-anchor=\"middle\">"
                    + "%d</text>%n", x, BOTTOM + 22, n));
        }
        final String bytes = floors.containsKey(Precision.SINGLE)
                ? floors.containsKey(Precision.DOUBLE) ? "16 bytes each, 8 in single precision"
                : "8 bytes each in single precision" : "16 bytes each";
        sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" text-anchor=\"middle\""
                + " font-size=\"14\">qubits n (state of 2^n amplitudes, %s)</text>%n",
                (LEFT + RIGHT) / 2, BOTTOM + 50, bytes));
        sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" text-anchor=\"middle\""
                + " font-size=\"14\" transform=\"rotate(-90 %d %d)\">time per gate"
                + " (log scale)</text>%n", 26, (TOP + BOTTOM) / 2, 26, (TOP + BOTTOM) / 2));
        sb.append("</g>\n");

        // The reference, the floors, then one polyline with markers per kernel and precision.
        if (!referenceLine.isEmpty()) {
            sb.append("<polyline class=\"reference\" fill=\"none\" stroke=\"")
                    .append(REFERENCE_COLOUR).append("\" stroke-width=\"4\" points=\"")
                    .append(points(referenceLine, axes)).append("\"/>\n");
        }
        for (Map.Entry<Precision, TreeMap<Integer, Double>> e : floors.entrySet()) {
            sb.append("<polyline class=\"floor\" data-precision=\"")
                    .append(Workloads.precisionName(e.getKey())).append("\" fill=\"none\""
                    + " stroke=\"#222222\" stroke-width=\"1.6\" stroke-dasharray=\"")
                    .append(floorDashes(e.getKey())).append("\" points=\"")
                    .append(points(e.getValue(), axes)).append("\"/>\n");
        }
        for (Map.Entry<String, TreeMap<Integer, Double>> e : series.entrySet()) {
            final ReportRow r = first.get(e.getKey());
            final int k = style.get(r.kernel());
            final String colour = COLOURS[k % COLOURS.length];
            final boolean single = r.precision() == Precision.SINGLE;
            sb.append("<g class=\"kernel\" fill=\"").append(single ? "#ffffff" : colour)
                    .append("\" stroke=\"").append(colour).append("\">\n");
            sb.append("<polyline class=\"series\" data-kernel=\"").append(escape(r.kernel()))
                    .append("\" data-precision=\"").append(Workloads.precisionName(
                    r.precision())).append("\" fill=\"none\" stroke-width=\"2.2\"")
                    .append(single ? " stroke-dasharray=\"" + SINGLE_DASHES + "\"" : "")
                    .append(" stroke-linejoin=\"round\" points=\"")
                    .append(points(e.getValue(), axes)).append("\"/>\n");
            for (Map.Entry<Integer, Double> p : e.getValue().entrySet()) {
                marker(sb, MARKERS[k % MARKERS.length], axes.x(p.getKey()),
                        axes.y(p.getValue()));
            }
            sb.append("</g>\n");
        }

        // Legend to the right of the plot.
        sb.append("<g class=\"legend\" font-size=\"13\" fill=\"#222222\">\n");
        final int lx = RIGHT + 24;
        int ly = TOP + 8;
        sb.append(String.format(Locale.ROOT, "<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"%d\""
                + " fill=\"#fafafa\" stroke=\"#cccccc\"/>%n", lx - 10, ly - 12, WIDTH - lx - 6,
                28 * (series.size() + floors.size() + (referenceLine.isEmpty() ? 0 : 1)) + 8));
        for (String name : series.keySet()) {
            final ReportRow r = first.get(name);
            final int k = style.get(r.kernel());
            final String colour = COLOURS[k % COLOURS.length];
            final boolean single = r.precision() == Precision.SINGLE;
            sb.append(String.format(Locale.ROOT, "<line x1=\"%d\" y1=\"%d\" x2=\"%d\""
                    + " y2=\"%d\" stroke=\"%s\" stroke-width=\"2.2\"%s/>%n", lx, ly + 6,
                    lx + 30, ly + 6, colour, single ? " stroke-dasharray=\"" + SINGLE_DASHES
                    + "\"" : ""));
            sb.append("<g fill=\"").append(single ? "#ffffff" : colour).append("\" stroke=\"")
                    .append(colour).append("\">");
            marker(sb, MARKERS[k % MARKERS.length], lx + 15, ly + 6);
            sb.append("</g>\n");
            sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\">%s</text>%n", lx + 40,
                    ly + 10, escape(name)));
            ly += 28;
        }
        for (Precision p : floors.keySet()) {
            sb.append(String.format(Locale.ROOT, "<line x1=\"%d\" y1=\"%d\" x2=\"%d\""
                    + " y2=\"%d\" stroke=\"#222222\" stroke-width=\"1.6\""
                    + " stroke-dasharray=\"%s\"/>%n", lx, ly + 6, lx + 30, ly + 6,
                    floorDashes(p)));
            // The single floor's label is shorter so it stays inside the legend box.
            sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\">%s</text>%n", lx + 40,
                    ly + 10, p == Precision.SINGLE ? "Java copy (single)"
                    : "Java copy loop (scalar)"));
            ly += 28;
        }
        if (!referenceLine.isEmpty()) {
            sb.append(String.format(Locale.ROOT, "<line x1=\"%d\" y1=\"%d\" x2=\"%d\""
                    + " y2=\"%d\" stroke=\"%s\" stroke-width=\"4\"/>%n", lx, ly + 6, lx + 30,
                    ly + 6, REFERENCE_COLOUR));
            sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\">C reference dense"
                    + " gate</text>%n", lx + 40, ly + 10));
            ly += 28;
        }
        sb.append("</g>\n");
        final String floorBytes = floors.containsKey(Precision.SINGLE)
                ? floors.containsKey(Precision.DOUBLE) ? "32 \u00b7 2^n bytes (16 \u00b7 2^n in"
                + " single precision)" : "16 \u00b7 2^n bytes" : "32 \u00b7 2^n bytes";
        sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" font-size=\"11\""
                + " fill=\"#666666\">dashed: %s at the Java copy loop's GB/s (scalar, not a"
                + " ceiling)%s; points: target mid, else the mean</text>%n",
                LEFT - 80, HEIGHT - 12, floorBytes, referenceLine.isEmpty() ? ""
                : "; grey: the C kernel's dense gate"));
        sb.append("</svg>\n");
        return sb.toString();
    }

    /**
     * One point per n, kernel and precision: the mid-target row, else the mean over targets.
     * Keyed by {@link #label}, in the order the series first appear in the rows.
     */
    static Map<String, TreeMap<Integer, Double>> series(List<ReportRow> rows) {
        final Map<String, TreeMap<Integer, double[]>> sums = new LinkedHashMap<>();
        final Map<String, TreeMap<Integer, Double>> mids = new LinkedHashMap<>();
        for (ReportRow r : rows) {
            final String label = label(r);
            final double[] s = sums.computeIfAbsent(label, x -> new TreeMap<>())
                    .computeIfAbsent(r.n(), x -> new double[2]);
            s[0] += r.nanosPerGate();
            s[1] += 1;
            if (r.target().equals("mid")) {
                mids.computeIfAbsent(label, x -> new TreeMap<>()).put(r.n(), r.nanosPerGate());
            }
        }
        final Map<String, TreeMap<Integer, Double>> out = new LinkedHashMap<>();
        for (Map.Entry<String, TreeMap<Integer, double[]>> e : sums.entrySet()) {
            final TreeMap<Integer, Double> points = new TreeMap<>();
            final TreeMap<Integer, Double> mid = mids.getOrDefault(e.getKey(), new TreeMap<>());
            for (Map.Entry<Integer, double[]> p : e.getValue().entrySet()) {
                final Double m = mid.get(p.getKey());
                points.put(p.getKey(), m != null ? m : p.getValue()[0] / p.getValue()[1]);
            }
            out.put(e.getKey(), points);
        }
        return out;
    }

    /**
     * The name of a row's series: the kernel in double precision, the kernel followed by
     * {@code " (single)"} in single precision.
     */
    static String label(ReportRow r) {
        return r.precision() == Precision.SINGLE ? r.kernel() + " (single)" : r.kernel();
    }

    /**
     * The floor of one precision at each n where a state-vector gate row of that precision was
     * measured: {@code 2 * B * 2^n / copy_gb_per_s} ns, {@code B} the bytes of one amplitude
     * (16 in double precision, 8 in single). Empty if there are no such rows.
     */
    static TreeMap<Integer, Double> floor(List<ReportRow> rows, Precision precision) {
        final TreeMap<Integer, Double> floor = new TreeMap<>();
        for (ReportRow r : rows) {
            if (r.precision() == precision && r.vectorQubits() == r.n() && r.passes() == 1) {
                floor.put(r.n(), ReportRow.bytesMoved(r.n(), precision) / r.copyGbps());
            }
        }
        return floor;
    }

    /**
     * The C reference kernel's time per dense gate, {@code 32 * 2^n / reference_gb_per_s} ns, at
     * each {@code n} where a double-precision state-vector gate row was measured and the
     * reference has that size at the row's thread count.
     */
    static TreeMap<Integer, Double> referenceLine(List<ReportRow> rows,
            CeilingReference reference) {
        final TreeMap<Integer, Double> line = new TreeMap<>();
        for (ReportRow r : rows) {
            if (r.precision() == Precision.DOUBLE && r.vectorQubits() == r.n()
                    && r.passes() == 1) {
                final OptionalDouble gbps = reference.dense(r.n(), r.threads());
                if (gbps.isPresent()) {
                    line.put(r.n(), ReportRow.bytesMoved(r.n()) / gbps.getAsDouble());
                }
            }
        }
        return line;
    }

    /** The dash pattern of a floor: dashed in double precision, dotted in single. */
    private static String floorDashes(Precision precision) {
        return precision == Precision.SINGLE ? "2 4" : "7 5";
    }

    /** Labels 10^d nanoseconds in the nearest unit: 1 ns, 10 ns, 100 ns, 1 µs, ... */
    static String decadeLabel(int d) {
        final String[] units = {"ns", "\u00b5s", "ms", "s"};
        if (d < 0) {
            return "1e" + d + " ns";
        }
        final int unit = Math.min(d / 3, units.length - 1);
        final long value = (long) Math.pow(10, d - 3 * unit);
        return value + " " + units[unit];
    }

    /** Escapes the five XML special characters. */
    static String escape(String text) {
        final StringBuilder sb = new StringBuilder(text.length());
        for (int i = 0; i < text.length(); i++) {
            final char ch = text.charAt(i);
            switch (ch) {
                case '&':
                    sb.append("&amp;");
                    break;
                case '<':
                    sb.append("&lt;");
                    break;
                case '>':
                    sb.append("&gt;");
                    break;
                case '"':
                    sb.append("&quot;");
                    break;
                case '\'':
                    sb.append("&apos;");
                    break;
                default:
                    sb.append(ch < 0x20 ? ' ' : ch);
                    break;
            }
        }
        return sb.toString();
    }

    private static String points(TreeMap<Integer, Double> s, Axes axes) {
        final StringBuilder sb = new StringBuilder();
        for (Map.Entry<Integer, Double> p : s.entrySet()) {
            if (sb.length() > 0) {
                sb.append(' ');
            }
            sb.append(String.format(Locale.ROOT, "%.1f,%.1f", axes.x(p.getKey()),
                    axes.y(p.getValue())));
        }
        return sb.toString();
    }

    private static void line(StringBuilder sb, double x1, double y1, double x2, double y2,
            String colour, double width) {
        sb.append(String.format(Locale.ROOT, "<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\""
                + " y2=\"%.1f\" stroke=\"%s\" stroke-width=\"%.1f\"/>%n", x1, y1, x2, y2, colour,
                width));
    }

    private static void marker(StringBuilder sb, String shape, double x, double y) {
        switch (shape) {
            case "circle":
                sb.append(String.format(Locale.ROOT, "<circle cx=\"%.1f\" cy=\"%.1f\" r=\"3.6\"/>",
                        x, y));
                break;
            case "square":
                sb.append(String.format(Locale.ROOT, "<rect x=\"%.1f\" y=\"%.1f\" width=\"7\""
                        + " height=\"7\"/>", x - 3.5, y - 3.5));
                break;
            case "diamond":
                sb.append(String.format(Locale.ROOT, "<polygon points=\"%.1f,%.1f %.1f,%.1f"
                        + " %.1f,%.1f %.1f,%.1f\"/>", x, y - 4.5, x + 4.5, y, x, y + 4.5, x - 4.5,
                        y));
                break;
            default:
                sb.append(String.format(Locale.ROOT, "<polygon points=\"%.1f,%.1f %.1f,%.1f"
                        + " %.1f,%.1f\"/>", x, y - 4.5, x + 4.5, y + 3.5, x - 4.5, y + 3.5));
                break;
        }
        sb.append('\n');
    }

    /** Maps qubit counts and times (ns) to pixels. */
    private static final class Axes {
        private final double x0;
        private final double x1;
        private final int d0;
        private final int d1;

        Axes(double x0, double x1, int d0, int d1) {
            this.x0 = x0;
            this.x1 = x1;
            this.d0 = d0;
            this.d1 = d1;
        }

        double x(double n) {
            return LEFT + (n - x0) / (x1 - x0) * (RIGHT - LEFT);
        }

        double y(double nanos) {
            return BOTTOM - (Math.log10(nanos) - d0) / (d1 - d0) * (BOTTOM - TOP);
        }
    }
}
