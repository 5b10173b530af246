package dev.qsim.examples.cli;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

import dev.qsim.Tally;

/**
 * Draws a tally as an SVG histogram: one bar per outcome for the measured frequency and, when a
 * prediction is given, a grey bar beside it for the ideal probability. Plain SVG 1.1 written by
 * hand.
 */
final class SvgHistogram {
    /** The most outcomes drawn; the likeliest are kept. */
    static final int MAX_BARS = 64;

    private static final String MEASURED = "#2f6db3";
    private static final String PREDICTED = "#c9c9c9";

    private SvgHistogram() {
    }

    /**
     * Returns the SVG text.
     *
     * @param tally the measured counts
     * @param predicted probabilities by outcome value ({@code 2^width} entries), or null
     * @param title a title line
     */
    static String draw(Tally tally, double[] predicted, String title) {
        int width = tally.width();
        Map<String, double[]> rows = new TreeMap<>();
        for (Map.Entry<String, Long> e : tally.outcomes().entrySet()) {
            rows.put(e.getKey(), new double[] {e.getValue() / (double) tally.shots(), 0});
        }
        if (predicted != null) {
            for (int i = 0; i < predicted.length; i++) {
                if (predicted[i] > 1e-12) {
                    rows.computeIfAbsent(Cli.bits(i, width), k -> new double[2])[1] = predicted[i];
                }
            }
        }
        int total = rows.size();
        List<Map.Entry<String, double[]>> list = new ArrayList<>(rows.entrySet());
        if (list.size() > MAX_BARS) {
            list.sort(Comparator.comparingDouble(
                    (Map.Entry<String, double[]> e) -> -Math.max(e.getValue()[0],
                            e.getValue()[1])));
            list = new ArrayList<>(list.subList(0, MAX_BARS));
            list.sort(Map.Entry.comparingByKey());
        }
        double top = 0;
        for (Map.Entry<String, double[]> e : list) {
            top = Math.max(top, Math.max(e.getValue()[0], e.getValue()[1]));
        }
        double step = niceStep(top);
        double yMax = Math.max(step, Math.ceil(top / step - 1e-9) * step);

        int bar = predicted != null ? 12 : 20;
        int group = predicted != null ? 2 * bar + 10 : bar + 10;
        int left = 70;
        int right = 30;
        int plotH = 260;
        int topM = 84;
        int labelH = 14 + 7 * width;
        int plotW = Math.max(Math.max(360, group * list.size()), 10 * title.length() - right);
        int w = left + plotW + right;
        int h = topM + plotH + labelH + 40;
        StringBuilder sb = new StringBuilder();
        sb.append("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
        sb.append(Cli.f("<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%d\" height=\"%d\""
                + " viewBox=\"0 0 %d %d\" font-family=\"DejaVu Sans, Arial, sans-serif\">%n",
                w, h, w, h));
        sb.append(Cli.f("<rect width=\"%d\" height=\"%d\" fill=\"white\"/>%n", w, h));
        sb.append(Cli.f("<text x=\"%d\" y=\"26\" font-size=\"16\" font-weight=\"bold\">%s</text>%n",
                left, esc(title)));
        String sub = Cli.f("%d shots, %d outcome%s%s", tally.shots(), total,
                total == 1 ? "" : "s", total > list.size() ? " (the " + list.size()
                + " likeliest shown)" : "");
        sb.append(Cli.f("<text x=\"%d\" y=\"46\" font-size=\"12\" fill=\"#555\">%s</text>%n",
                left, esc(sub)));
        // Legend.
        int lx = left;
        sb.append(Cli.f("<rect x=\"%d\" y=\"55\" width=\"12\" height=\"12\" fill=\"%s\"/>"
                + "<text x=\"%d\" y=\"65\" font-size=\"12\">measured%s</text>%n", lx, MEASURED,
                lx + 16, predicted == null ? " (no ideal prediction drawn)"
                : ""));
        if (predicted != null) {
            sb.append(Cli.f("<rect x=\"%d\" y=\"55\" width=\"12\" height=\"12\" fill=\"%s\""
                    + " stroke=\"#777\"/><text x=\"%d\" y=\"65\" font-size=\"12\">ideal"
                    + " prediction</text>%n", lx + 90, PREDICTED, lx + 106));
        }
        // Axes and grid.
        int y0 = topM + plotH;
        for (double v = 0; v <= yMax + 1e-12; v += step) {
            int y = (int) Math.round(y0 - plotH * v / yMax);
            sb.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#e4e4e4\"/>"
                    + "<text x=\"%d\" y=\"%d\" font-size=\"11\" text-anchor=\"end\">%s</text>%n",
                    left, y, left + plotW, y, left - 6, y + 4, trim(v)));
        }
        sb.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#333\"/>%n", left,
                topM, left, y0));
        sb.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#333\"/>%n", left,
                y0, left + plotW, y0));
        sb.append(Cli.f("<text x=\"18\" y=\"%d\" font-size=\"12\" transform=\"rotate(-90 18 %d)\""
                + " text-anchor=\"middle\">probability</text>%n", topM + plotH / 2,
                topM + plotH / 2));
        int offset = (plotW - group * list.size()) / 2;
        for (int i = 0; i < list.size(); i++) {
            String bits = list.get(i).getKey();
            double[] v = list.get(i).getValue();
            int x = left + offset + i * group + 5;
            int hm = (int) Math.round(plotH * v[0] / yMax);
            sb.append(Cli.f("<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"%d\" fill=\"%s\">"
                    + "<title>%s measured %.4f</title></rect>%n", x, y0 - hm, bar, hm, MEASURED,
                    bits, v[0]));
            if (list.size() <= 24) {
                sb.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"9\" fill=\"#1d4f86\""
                        + " text-anchor=\"middle\">%s</text>%n", x + bar / 2, y0 - hm - 3,
                        percent(v[0])));
            }
            if (predicted != null) {
                int hp = (int) Math.round(plotH * v[1] / yMax);
                sb.append(Cli.f("<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"%d\" fill=\"%s\""
                        + " stroke=\"#777\"><title>%s ideal %.4f</title></rect>%n", x + bar,
                        y0 - hp, bar, hp, PREDICTED, bits, v[1]));
            }
            int cx = x + (predicted != null ? bar : bar / 2);
            sb.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"11\" font-family=\"DejaVu Sans"
                    + " Mono, monospace\" text-anchor=\"end\" transform=\"rotate(-60 %d %d)\">%s"
                    + "</text>%n", cx + 4, y0 + 14, cx + 4, y0 + 14, bits));
        }
        sb.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"12\" text-anchor=\"middle\">outcome"
                + " (highest bit left)</text>%n", left + plotW / 2, h - 10));
        sb.append("</svg>\n");
        return sb.toString();
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
