package dev.qsim.examples.cli;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

import dev.qsim.Circuit;
import dev.qsim.Instruction;

/**
 * Draws a circuit as an SVG picture: one horizontal wire per qubit, a double line for the
 * classical bits, time left to right; gates as labelled boxes, controls as dots, CNOT targets
 * as circled plus signs, swaps as crosses, measurements as meters with an arrow to the classical
 * line, and conditioned blocks inside a dashed frame labelled with their condition. Plain SVG
 * 1.1 written by hand.
 */
final class SvgCircuit {
    private static final int COL = 64;
    private static final int ROW = 52;
    private static final int LEFT = 64;
    private static final int TOP = 56;

    private final StringBuilder sb = new StringBuilder();
    private final int qubits;
    private final boolean classical;
    private final int[] free;
    private int columns;

    private SvgCircuit(Circuit c) {
        this.qubits = c.qubits();
        this.classical = c.clbits() > 0;
        this.free = new int[qubits + 1];
    }

    /** Returns the SVG text for a circuit, with a title line. */
    static String draw(Circuit c, String title) {
        SvgCircuit d = new SvgCircuit(c);
        StringBuilder body = new StringBuilder();
        for (Instruction in : c.instructions()) {
            d.place(in, body, null);
        }
        int rows = d.qubits + (d.classical ? 1 : 0);
        int w = LEFT + Math.max(1, d.columns) * COL + 40;
        int h = TOP + rows * ROW + 10;
        StringBuilder sb = d.sb;
        sb.append("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
        sb.append(Cli.f("<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%d\" height=\"%d\""
                + " viewBox=\"0 0 %d %d\" font-family=\"DejaVu Sans, Arial, sans-serif\">%n",
                w, h, w, h));
        sb.append(Cli.f("<rect width=\"%d\" height=\"%d\" fill=\"white\"/>%n", w, h));
        sb.append(Cli.f("<text x=\"12\" y=\"24\" font-size=\"15\" font-weight=\"bold\">%s</text>%n",
                SvgHistogram.esc(title)));
        sb.append(Cli.f("<text x=\"12\" y=\"42\" font-size=\"11\" fill=\"#555\">%d qubits, %d"
                + " classical bits, %d instructions, depth %d</text>%n", c.qubits(), c.clbits(),
                c.size(), c.depth()));
        for (int q = 0; q < d.qubits; q++) {
            int y = rowY(q);
            sb.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"13\" text-anchor=\"end\">q%d"
                    + "</text>%n", LEFT - 14, y + 4, q));
            sb.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#222\"/>%n",
                    LEFT - 8, y, w - 20, y));
        }
        if (d.classical) {
            int y = rowY(d.qubits);
            sb.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"13\" text-anchor=\"end\">c"
                    + "</text>%n", LEFT - 14, y + 4));
            sb.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#222\"/>"
                    + "<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#222\"/>%n",
                    LEFT - 8, y - 2, w - 20, y - 2, LEFT - 8, y + 2, w - 20, y + 2));
        }
        sb.append(body);
        sb.append("</svg>\n");
        return sb.toString();
    }

    private static int rowY(int row) {
        return TOP + ROW / 2 + row * ROW;
    }

    private static int colX(int col) {
        return LEFT + COL / 2 + col * COL;
    }

    private static int[] qubitsOf(Instruction in) {
        int[] t = in.targets();
        int[] c = in.controls();
        int[] all = Arrays.copyOf(c, c.length + t.length);
        System.arraycopy(t, 0, all, c.length, t.length);
        return all;
    }

    /** Rows an instruction covers: its qubits, the wires between, and the clbit line. */
    private int[] span(Instruction in) {
        int lo = Integer.MAX_VALUE;
        int hi = -1;
        List<Instruction> all = new ArrayList<>();
        all.add(in);
        for (int i = 0; i < all.size(); i++) {
            Instruction x = all.get(i);
            for (int q : qubitsOf(x)) {
                lo = Math.min(lo, q);
                hi = Math.max(hi, q);
            }
            if (x.kind() == Instruction.Kind.MEASURE) {
                hi = qubits;
            }
            all.addAll(x.body());
        }
        if (hi < 0) {
            lo = 0;
            hi = 0;
        }
        return new int[] {lo, hi};
    }

    private void place(Instruction in, StringBuilder out, int[] fixed) {
        int[] s = span(in);
        int col = 0;
        int last = in.kind() == Instruction.Kind.IF_BIT && classical ? qubits : s[1];
        if (fixed != null) {
            col = fixed[0]++;
        } else {
            for (int r = s[0]; r <= last; r++) {
                col = Math.max(col, free[r]);
            }
        }
        if (in.kind() == Instruction.Kind.IF_BIT) {
            int[] cursor = {col};
            StringBuilder inner = new StringBuilder();
            for (Instruction b : in.body()) {
                place(b, inner, cursor);
            }
            int end = Math.max(cursor[0], col + 1);
            int x0 = colX(col) - COL / 2 + 3;
            int x1 = colX(end - 1) + COL / 2 - 3;
            int y0 = rowY(s[0]) - ROW / 2 + 3;
            int y1 = rowY(s[1]) + ROW / 2 - 3;
            out.append(Cli.f("<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"%d\" fill=\"#fff8e6\""
                    + " stroke=\"#c08a00\" stroke-dasharray=\"5,3\" rx=\"6\"/>%n", x0, y0,
                    x1 - x0, y1 - y0));
            if (classical) {
                // The condition reads a classical bit: a double line from the frame down to it.
                int xm = (x0 + x1) / 2;
                int yc = rowY(qubits);
                out.append(Cli.f(
                        "<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#c08a00\"/>"
                        + "<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#c08a00\"/>"
                        + "<circle cx=\"%d\" cy=\"%d\" r=\"4\" fill=\"#c08a00\"/>%n", xm - 2, y1,
                        xm - 2, yc, xm + 2, y1, xm + 2, yc, xm, yc));
                out.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"10\" fill=\"#8a6200\">"
                        + "if c%d=%d</text>%n", xm + 6, yc - 8, in.clbit(), in.value()));
            }
            out.append(inner);
            for (int r = s[0]; r <= (classical ? qubits : s[1]); r++) {
                free[r] = end;
            }
            columns = Math.max(columns, end);
            if (fixed != null) {
                fixed[0] = end;
            }
            return;
        }
        if (fixed == null) {
            for (int r = s[0]; r <= s[1]; r++) {
                free[r] = col + 1;
            }
        }
        columns = Math.max(columns, col + 1);
        int x = colX(col);
        switch (in.kind()) {
            case MEASURE: {
                int q = in.targets()[0];
                int y = rowY(q);
                int yc = rowY(qubits);
                out.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#222\"/>"
                        + "<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#222\"/>%n",
                        x - 2, y + 15, x - 2, yc - 8, x + 2, y + 15, x + 2, yc - 8));
                out.append(Cli.f("<polygon points=\"%d,%d %d,%d %d,%d\" fill=\"#222\"/>%n",
                        x - 6, yc - 9, x + 6, yc - 9, x, yc - 2));
                out.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"10\">%d</text>%n", x + 6,
                        yc - 8, in.clbit()));
                box(out, x, y, 36, "");
                out.append(Cli.f("<path d=\"M %d %d A 11 11 0 0 1 %d %d\" fill=\"none\""
                        + " stroke=\"#222\"/><line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\""
                        + " stroke=\"#222\"/>%n", x - 11, y + 6, x + 11, y + 6, x, y + 6, x + 8,
                        y - 8));
                return;
            }
            case RESET:
                box(out, x, rowY(in.targets()[0]), 36, "|0\u27e9");
                return;
            default:
                break;
        }
        int[] t = in.targets();
        int[] c = in.controls();
        // The catalogue's drawing labels: "\u2295" a NOT target, "\u00d7" a swap end, "\u25cf" a
        // control dot.
        String[] labels = in.gate().targetLabels(in.angles(), t.length);
        if (s[0] != s[1]) {
            out.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"#222\""
                    + " stroke-width=\"1.5\"/>%n", x, rowY(s[0]), x, rowY(s[1])));
        }
        for (int q : c) {
            dot(out, x, rowY(q));
        }
        if (labels[0].equals("\u2295")) {
            int y = rowY(t[0]);
            out.append(Cli.f("<circle cx=\"%d\" cy=\"%d\" r=\"11\" fill=\"white\" stroke=\"#222\""
                    + " stroke-width=\"1.5\"/><line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\""
                    + " stroke=\"#222\" stroke-width=\"1.5\"/><line x1=\"%d\" y1=\"%d\" x2=\"%d\""
                    + " y2=\"%d\" stroke=\"#222\" stroke-width=\"1.5\"/>%n", x, y, x - 11, y,
                    x + 11, y, x, y - 11, x, y + 11));
            return;
        }
        if (labels[0].equals("\u00d7")) {
            for (int q : t) {
                int y = rowY(q);
                out.append(Cli.f("<path d=\"M %d %d L %d %d M %d %d L %d %d\" stroke=\"#222\""
                        + " stroke-width=\"2\"/>%n", x - 7, y - 7, x + 7, y + 7, x - 7, y + 7,
                        x + 7, y - 7));
            }
            return;
        }
        if (labels[0].equals("\u25cf")) {
            for (int q : t) {
                dot(out, x, rowY(q));
            }
            if (labels.length > 1 && !labels[1].equals("\u25cf")) {
                int y = (rowY(t[0]) + rowY(t[1])) / 2;
                out.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"10\" fill=\"#333\">%s"
                        + "</text>%n", x + 6, y, SvgHistogram.esc(pretty(labels[1]))));
            }
            return;
        }
        String label = pretty(labels[0]);
        int lo = Integer.MAX_VALUE;
        int hi = -1;
        for (int q : t) {
            lo = Math.min(lo, q);
            hi = Math.max(hi, q);
        }
        int width = Math.max(36, 8 + 7 * label.length());
        if (lo == hi) {
            box(out, x, rowY(lo), width, label);
        } else {
            int y0 = rowY(lo) - 15;
            int y1 = rowY(hi) + 15;
            out.append(Cli.f("<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"%d\" fill=\"#eaf1fb\""
                    + " stroke=\"#2f6db3\" rx=\"4\"/><text x=\"%d\" y=\"%d\" font-size=\"12\""
                    + " text-anchor=\"middle\">%s</text>%n", x - width / 2, y0, width, y1 - y0,
                    x, (y0 + y1) / 2 + 4, SvgHistogram.esc(label)));
        }
    }

    private static void dot(StringBuilder out, int x, int y) {
        out.append(Cli.f("<circle cx=\"%d\" cy=\"%d\" r=\"5\" fill=\"#222\"/>%n", x, y));
    }

    private static void box(StringBuilder out, int x, int y, int width, String label) {
        out.append(Cli.f("<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"30\" fill=\"#eaf1fb\""
                + " stroke=\"#2f6db3\" rx=\"4\"/>%n", x - width / 2, y - 15, width));
        if (!label.isEmpty()) {
            out.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"12\" text-anchor=\"middle\">"
                    + "%s</text>%n", x, y + 4, SvgHistogram.esc(label)));
        }
    }

    /** A catalogue label in print: daggers, square roots and pi as symbols. */
    private static String pretty(String label) {
        String out = label.replace("SX", "\u221aX").replace("pi", "\u03c0");
        return out.endsWith("+") ? out.substring(0, out.length() - 1) + "\u2020" : out;
    }
}
