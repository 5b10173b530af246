package dev.qsim.examples.cli;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

import dev.qsim.Tally;

/**
 * Draws a tally as an SVG histogram: one bar per outcome for the tallied frequency and, when a
 * prediction is given, a grey bar beside it for the ideal probability. Plain SVG 1.1 written by
 * hand.
 *
 * <p>Up to {@value #MAX_COLUMNS} outcomes stand as columns over a horizontal axis; more lie as
 * rows, one per outcome, so the picture grows in height by a fixed step per outcome and its
 * width stays the same whatever the count (at most {@value #MAX_ROWS} rows: the likeliest
 * outcomes). Each value label is drawn after every bar, above (or beside) the longer bar of its
 * outcome, so no bar hides it.
 */
final class SvgHistogram {
    /** The most outcomes drawn as columns; beyond, one row per outcome. */
    static final int MAX_COLUMNS = 16;
    /** The most outcomes drawn as rows; the likeliest are kept. */
    static final int MAX_ROWS = 128;

    private static final String TALLIED = "#2f6db3";
    private static final String PREDICTED = "#c9c9c9";
    private static final String VALUE = "#1d4f86";
    private static final String MONO = "DejaVu Sans Mono, Consolas, monospace";

    /**
     * A drawn histogram and a summary of it for the tool's "wrote ..." line.
     *
     * @param svg the SVG text
     * @param summary what the picture holds, such as {@code "histogram of 32 outcomes"}
     */
    record Picture(String svg, String summary) {
    }

    /** One outcome: its bits, tallied frequency and predicted probability. */
    private record Bar(String bits, double tallied, double predicted) {
        double larger() {
            return Math.max(tallied, predicted);
        }
    }

    private SvgHistogram() {
    }

    /**
     * Draws a tally.
     *
     * @param tally the counts
     * @param predicted probabilities by outcome value ({@code 2^width} entries), or null
     * @param title a title line (file names and settings)
     * @param tallied what the counts are, for the legend: {@code "simulated"} or
     *     {@code "measured"}
     * @param kind what the prediction is, for the legend: {@code "ideal"} or {@code "noisy"}
     * @return the picture
     */
    static Picture draw(Tally tally, double[] predicted, String title, String tallied,
            String kind) {
        int width = tally.width();
        Map<String, double[]> byBits = new TreeMap<>();
        for (Map.Entry<String, Long> e : tally.outcomes().entrySet()) {
            byBits.put(e.getKey(), new double[] {e.getValue() / (double) tally.shots(), 0});
        }
        if (predicted != null) {
            for (int i = 0; i < predicted.length; i++) {
                if (predicted[i] > 1e-12) {
                    byBits.computeIfAbsent(Cli.bits(i, width), k -> new double[2])[1] =
                            predicted[i];
                }
            }
        }
        List<Bar> bars = new ArrayList<>();
        for (Map.Entry<String, double[]> e : byBits.entrySet()) {
            bars.add(new Bar(e.getKey(), e.getValue()[0], e.getValue()[1]));
        }
        int total = bars.size();
        if (bars.size() > MAX_ROWS) {
            bars.sort(Comparator.comparingDouble(Bar::larger).reversed());
            bars = new ArrayList<>(bars.subList(0, MAX_ROWS));
            bars.sort(Comparator.comparing(Bar::bits));
        }
        boolean rows = bars.size() > MAX_COLUMNS;
        String shown = total > bars.size() ? "the " + bars.size() + " likeliest of " + total
                + " outcomes" : Cli.count(total, "outcome");
        String summary = "histogram of " + shown + (rows ? ", one row each" : "")
                + (predicted != null ? ", " + tallied + " beside the " + kind + " prediction"
                : "");
        Canvas c = new Canvas(title, Cli.f("%,d %s, %s", tally.shots(),
                tally.shots() == 1 ? "shot" : "shots", shown), tallied, predicted != null, kind);
        String svg = rows ? c.rows(bars, width) : c.columns(bars, width);
        return new Picture(svg, summary);
    }

    /** The parts both layouts share: header, legend, scale. */
    private static final class Canvas {
        private static final int LEFT = 70;
        private static final int TOP = 84;
        private final String title;
        private final String subtitle;
        private final String tallied;
        private final boolean predicted;
        private final String kind;
        private final StringBuilder sb = new StringBuilder();

        Canvas(String title, String subtitle, String tallied, boolean predicted, String kind) {
            this.title = title;
            this.subtitle = subtitle;
            this.tallied = tallied;
            this.predicted = predicted;
            this.kind = kind;
        }

        private void header(int w, int h) {
            sb.append("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
            sb.append(Cli.f("<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%d\" height=\"%d\""
                    + " viewBox=\"0 0 %d %d\" font-family=\"DejaVu Sans, Arial, sans-serif\">%n",
                    w, h, w, h));
            sb.append(Cli.f("<rect width=\"%d\" height=\"%d\" fill=\"white\"/>%n", w, h));
            sb.append(Cli.f("<text x=\"%d\" y=\"26\" font-size=\"16\" font-weight=\"bold\">%s"
                    + "</text>%n", 12, esc(title)));
            sb.append(Cli.f("<text x=\"%d\" y=\"46\" font-size=\"12\" fill=\"#555\">%s</text>%n",
                    12, esc(subtitle)));
            sb.append(Cli.f("<rect x=\"%d\" y=\"55\" width=\"12\" height=\"12\" fill=\"%s\"/>"
                    + "<text x=\"%d\" y=\"65\" font-size=\"12\">%s%s</text>%n", LEFT, TALLIED,
                    LEFT + 16, tallied, predicted ? "" : " (no prediction drawn)"));
            if (predicted) {
                int x = LEFT + 30 + 7 * tallied.length();
                sb.append(Cli.f("<rect x=\"%d\" y=\"55\" width=\"12\" height=\"12\" fill=\"%s\""
                        + " stroke=\"#777\"/><text x=\"%d\" y=\"65\" font-size=\"12\">%s"
                        + " prediction</text>%n", x, PREDICTED, x + 16, kind));
            }
        }

        /** The end of the probability scale and its step: {@code {end, step}}. */
        private static double[] scale(List<Bar> bars) {
            double top = 0;
            for (Bar b : bars) {
                top = Math.max(top, b.larger());
            }
            double step = niceStep(top);
            return new double[] {Math.max(step, Math.ceil(top / step - 1e-9) * step), step};
        }

        /** Columns over a horizontal axis, one group of one or two bars per outcome. */
        String columns(List<Bar> bars, int width) {
            int bar = predicted ? 14 : 22;
            int group = predicted ? 2 * bar + 14 : bar + 14;
            int plotH = 260;
            int labelH = 14 + 7 * width;
            int plotW = Math.max(Math.max(360, group * bars.size()), 10 * title.length() - LEFT);
            int w = LEFT + plotW + 30;
            int h = TOP + 16 + plotH + labelH + 40;
            header(w, h);
            double[] scale = scale(bars);
            double yMax = scale[0];
            double step = scale[1];
            int y0 = TOP + 16 + plotH;
            for (double v = 0; v <= yMax + 1e-12; v += step) {
                int y = (int) Math.round(y0 - plotH * v / yMax);
                sb.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#e4e4e4\"/>"
                        + "<text x=\"%d\" y=\"%d\" font-size=\"11\" text-anchor=\"end\">%s"
                        + "</text>%n", LEFT, y, LEFT + plotW, y, LEFT - 6, y + 4, trim(v)));
            }
            sb.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#333\"/>%n",
                    LEFT, TOP + 16, LEFT, y0));
            sb.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#333\"/>%n",
                    LEFT, y0, LEFT + plotW, y0));
            sb.append(Cli.f("<text x=\"18\" y=\"%d\" font-size=\"12\" transform=\"rotate(-90 18"
                    + " %d)\" text-anchor=\"middle\">probability</text>%n", y0 - plotH / 2,
                    y0 - plotH / 2));
            int offset = (plotW - group * bars.size()) / 2;
            StringBuilder values = new StringBuilder();
            for (int i = 0; i < bars.size(); i++) {
                Bar b = bars.get(i);
                int x = LEFT + offset + i * group + 7;
                int ht = (int) Math.round(plotH * b.tallied() / yMax);
                sb.append(Cli.f("<rect class=\"bar %s\" x=\"%d\" y=\"%d\" width=\"%d\""
                        + " height=\"%d\" fill=\"%s\"><title>%s %s %.4f</title></rect>%n",
                        tallied, x, y0 - ht, bar, ht, TALLIED, b.bits(), tallied, b.tallied()));
                int hp = 0;
                if (predicted) {
                    hp = (int) Math.round(plotH * b.predicted() / yMax);
                    sb.append(Cli.f("<rect class=\"bar predicted\" x=\"%d\" y=\"%d\" width=\"%d\""
                            + " height=\"%d\" fill=\"%s\" stroke=\"#777\"><title>%s %s %.4f"
                            + "</title></rect>%n", x + bar, y0 - hp, bar, hp, PREDICTED, b.bits(),
                            kind, b.predicted()));
                }
                int span = predicted ? 2 * bar : bar;
                // Above the taller bar of the group, centred on the group: no bar covers it.
                values.append(Cli.f("<text class=\"value\" x=\"%d\" y=\"%d\" font-size=\"9\""
                        + " fill=\"%s\" text-anchor=\"middle\">%s</text>%n", x + span / 2,
                        y0 - Math.max(ht, hp) - 4, VALUE, percent(b.tallied())));
                int cx = x + span / 2;
                sb.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"11\" font-family=\"%s\""
                        + " text-anchor=\"end\" transform=\"rotate(-60 %d %d)\">%s</text>%n",
                        cx + 4, y0 + 14, MONO, cx + 4, y0 + 14, b.bits()));
            }
            sb.append(values);
            sb.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"12\" text-anchor=\"middle\">"
                    + "outcome (highest bit left)</text>%n", LEFT + plotW / 2, h - 10));
            return sb.append("</svg>\n").toString();
        }

        /** One row per outcome: bits on the left, bars to the right, the value after them. */
        String rows(List<Bar> bars, int width) {
            int row = predicted ? 16 : 14;
            int bar = predicted ? 6 : 10;
            int left = Math.max(LEFT, 16 + 7 * width);
            int plotW = 480;
            int top = TOP + 30;
            int w = Math.max(left + plotW + 70, 10 * title.length() + 24);
            int h = top + row * bars.size() + 30;
            header(w, h);
            double[] scale = scale(bars);
            double xMax = scale[0];
            double step = scale[1];
            int y1 = top + row * bars.size();
            for (double v = 0; v <= xMax + 1e-12; v += step) {
                int x = (int) Math.round(left + plotW * v / xMax);
                sb.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#e4e4e4\"/>"
                        + "<text x=\"%d\" y=\"%d\" font-size=\"11\" text-anchor=\"middle\">%s"
                        + "</text>%n", x, top - 4, x, y1, x, top - 8, trim(v)));
            }
            sb.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"12\" text-anchor=\"middle\">"
                    + "probability</text>%n", left + plotW / 2, top - 22));
            sb.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"12\" text-anchor=\"end\">"
                    + "outcome</text>%n", left - 6, top - 22));
            sb.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#333\"/>%n",
                    left, top, left, y1));
            StringBuilder values = new StringBuilder();
            for (int i = 0; i < bars.size(); i++) {
                Bar b = bars.get(i);
                int y = top + i * row + (row - (predicted ? 2 * bar : bar)) / 2;
                int lt = (int) Math.round(plotW * b.tallied() / xMax);
                sb.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"11\" font-family=\"%s\""
                        + " text-anchor=\"end\">%s</text>%n", left - 6, top + i * row + row - 4,
                        MONO, b.bits()));
                sb.append(Cli.f("<rect class=\"bar %s\" x=\"%d\" y=\"%d\" width=\"%d\""
                        + " height=\"%d\" fill=\"%s\"><title>%s %s %.4f</title></rect>%n",
                        tallied, left, y, lt, bar, TALLIED, b.bits(), tallied, b.tallied()));
                int lp = 0;
                if (predicted) {
                    lp = (int) Math.round(plotW * b.predicted() / xMax);
                    sb.append(Cli.f("<rect class=\"bar predicted\" x=\"%d\" y=\"%d\" width=\"%d\""
                            + " height=\"%d\" fill=\"%s\" stroke=\"#777\"><title>%s %s %.4f"
                            + "</title></rect>%n", left, y + bar, lp, bar, PREDICTED, b.bits(),
                            kind, b.predicted()));
                }
                values.append(Cli.f("<text class=\"value\" x=\"%d\" y=\"%d\" font-size=\"9\""
                        + " fill=\"%s\">%s</text>%n", left + Math.max(lt, lp) + 4,
                        top + i * row + row - 4, VALUE, percent(b.tallied())));
            }
            sb.append(values);
            return sb.append("</svg>\n").toString();
        }
    }

    private static String percent(double v) {
        return v >= 0.1 ? Cli.f("%.0f%%", 100 * v) : Cli.f("%.1f%%", 100 * v);
    }

    private static double niceStep(double top) {
        if (!(top > 0)) {
            return 0.1;
        }
        double raw = top / 5;
        double mag = Math.pow(10, Math.floor(Math.log10(raw)));
        double[] nice = {1, 2, 2.5, 5, 10};
        for (double n : nice) {
            if (n * mag >= raw) {
                return n * mag;
            }
        }
        return 10 * mag;
    }

    private static String trim(double v) {
        String s = Cli.f("%.4f", v);
        s = s.replaceAll("0+$", "");
        return s.endsWith(".") ? s + "0" : s;
    }

    static String esc(String s) {
        return s.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")
                .replace("\"", "&quot;");
    }
}
