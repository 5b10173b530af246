package dev.qsim.examples.cli;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;

import dev.qsim.Circuit;
import dev.qsim.Expression;
import dev.qsim.Instruction;

/**
 * Draws a circuit as an SVG picture, time left to right, in a look of qsim's own:
 *
 * <ul>
 *   <li>one wire per qubit ({@code q0}, {@code q1}, ...) and, below them, one thin grey line per
 *       classical bit ({@code c0}, {@code c1}, ...);</li>
 *   <li>gates as labelled boxes on the wires they act on, with the catalogue's label and angles
 *       ({@link dev.qsim.Gate#targetLabels(double[], int)}: {@code RX(0.3)},
 *       {@code U(0.4,0,0)}); controls as filled dots, NOT targets as ⊕, swap ends as ×, joined
 *       by a vertical line; a label is only ever drawn on a wire its gate acts on;</li>
 *   <li>a measurement as a gauge-like box on its qubit's wire with a small tag naming the bit it
 *       writes ({@code →c2}), and a small square on that bit's line in the same column;</li>
 *   <li>a conditioned block as a dashed amber frame around its gates, tagged with its condition
 *       ({@code if c1=1}), and a hollow ring on the bit's line where it is read; blocks with a
 *       condition on registers or variables ({@code if}, its {@code else}, {@code while}) in
 *       the same frame tagged with the condition's text;</li>
 *   <li>a delay as a plain box {@code wait(2us)} on each qubit it holds; a gate whose angles are
 *       read during the shot with its angle expressions; an assignment to a variable or bits is
 *       not drawn (it has no wire).</li>
 * </ul>
 * Nothing connects a qubit wire to a bit line: the tags and the marks on the bit lines say which
 * bit is written and read. The circuit model has no barrier, so a barrier in an OpenQASM file is
 * not drawn. Plain SVG 1.1 written by hand.
 */
final class SvgCircuit {
    private static final int COL = 64;
    private static final int ROW = 52;
    private static final int BIT_ROW = 24;
    private static final int LEFT = 64;
    private static final int TOP = 56;
    private static final String INK = "#222";
    private static final String BOX = "#eaf1fb";
    private static final String BOX_EDGE = "#2f6db3";
    private static final String COND = "#b07800";
    private static final String BIT_LINE = "#9a9a9a";
    /** The most lines (qubit wires and bit lines) a picture has. */
    static final int MAX_WIRES = 4096;
    /** The most parts (gates, frames, marks) a picture has: about 50 MB of SVG. */
    static final int MAX_SHAPES = 250_000;
    /** The longest tag or dynamic label drawn whole. */
    private static final int MAX_TAG = 40;

    private final int qubits;
    private final int clbits;
    /** The first free column of each qubit wire. */
    private final int[] free;
    /** The first column at which each bit may be read or written again. */
    private final int[] bitFree;
    /** What to draw, in order, once the columns' widths (hence their positions) are known. */
    private final List<Shape> shapes = new ArrayList<>();
    /** The width each column needs: {@link #COL}, or more for a long label. */
    private final List<Integer> widths = new ArrayList<>();
    /** The centre of each column, set once every instruction is placed. */
    private int[] centres;

    /** One part of the picture, drawn once the column positions are known. */
    @FunctionalInterface
    private interface Shape {
        void draw(StringBuilder out);
    }

    private SvgCircuit(Circuit c) {
        this.qubits = c.qubits();
        this.clbits = c.clbits();
        this.free = new int[qubits];
        this.bitFree = new int[clbits];
    }

    /**
     * Returns the SVG text for a circuit.
     *
     * @param c the circuit
     * @param title the title line (the file name)
     * @return the SVG text
     */
    static String draw(Circuit c, String title) {
        if ((long) c.qubits() + c.clbits() > MAX_WIRES) {
            throw new IllegalArgumentException("the circuit has " + c.qubits() + " qubits and "
                    + c.clbits() + " classical bits, too many lines for a picture (at most "
                    + MAX_WIRES + " in all); draw it as text, which summarises what it cannot"
                    + " show");
        }
        SvgCircuit d = new SvgCircuit(c);
        for (Instruction in : c.instructions()) {
            d.place(in, -1);
            if (d.shapes.size() > MAX_SHAPES) {
                throw new IllegalArgumentException("the circuit has more than " + MAX_SHAPES
                        + " parts to draw (" + c.size() + " instructions), too many for a"
                        + " picture; draw it as text, which summarises what it cannot show");
            }
        }
        d.centres = new int[d.widths.size()];
        int x = LEFT;
        for (int i = 0; i < d.centres.length; i++) {
            d.centres[i] = x + d.widths.get(i) / 2;
            x += d.widths.get(i);
        }
        int w = Math.max(x, LEFT + COL) + 40;
        int h = d.bitY(d.clbits) + (d.clbits > 0 ? 0 : -BIT_ROW) + 10;
        StringBuilder sb = new StringBuilder();
        sb.append("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
        sb.append(Cli.f("<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%d\" height=\"%d\""
                + " viewBox=\"0 0 %d %d\" font-family=\"DejaVu Sans, Arial, sans-serif\">%n",
                w, h, w, h));
        sb.append(Cli.f("<rect width=\"%d\" height=\"%d\" fill=\"white\"/>%n", w, h));
        sb.append(Cli.f("<text x=\"12\" y=\"24\" font-size=\"15\" font-weight=\"bold\">%s</text>%n",
                SvgHistogram.esc(title)));
        sb.append(Cli.f("<text x=\"12\" y=\"42\" font-size=\"11\" fill=\"#555\">%s</text>%n",
                summary(c)));
        for (int q = 0; q < d.qubits; q++) {
            int y = rowY(q);
            sb.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"13\" text-anchor=\"end\">q%d"
                    + "</text>%n", LEFT - 14, y + 4, q));
            sb.append(Cli.f("<line class=\"wire\" data-qubit=\"%d\" x1=\"%d\" y1=\"%d\" x2=\"%d\""
                    + " y2=\"%d\" stroke=\"%s\"/>%n", q, LEFT - 8, y, w - 20, y, INK));
        }
        for (int b = 0; b < d.clbits; b++) {
            int y = d.bitY(b);
            sb.append(Cli.f("<text x=\"%d\" y=\"%d\" font-size=\"11\" fill=\"#555\""
                    + " text-anchor=\"end\">c%d</text>%n", LEFT - 14, y + 4, b));
            sb.append(Cli.f("<line class=\"bit\" data-clbit=\"%d\" x1=\"%d\" y1=\"%d\" x2=\"%d\""
                    + " y2=\"%d\" stroke=\"%s\" stroke-width=\"0.8\"/>%n", b, LEFT - 8, y, w - 20,
                    y, BIT_LINE));
        }
        for (Shape shape : d.shapes) {
            shape.draw(sb);
        }
        sb.append("</svg>\n");
        return sb.toString();
    }

    /** The subtitle: qubits, bits, instructions and depth, in words. */
    static String summary(Circuit c) {
        return Cli.count(c.qubits(), "qubit") + ", " + Cli.count(c.clbits(), "classical bit")
                + ", " + Cli.count(c.size(), "instruction") + ", depth " + c.depth();
    }

    private static int rowY(int row) {
        return TOP + ROW / 2 + row * ROW;
    }

    private int bitY(int bit) {
        return TOP + qubits * ROW + 8 + BIT_ROW / 2 + bit * BIT_ROW;
    }

    /** The centre of a column (once every instruction is placed). */
    private int colX(int col) {
        return centres[col];
    }

    /** The left edge of a column. */
    private int left(int col) {
        return centres[col] - widths.get(col) / 2;
    }

    /** The right edge of a column. */
    private int right(int col) {
        return left(col) + widths.get(col);
    }

    /** Makes room for a box of {@code boxWidth} pixels in a column. */
    private void need(int col, int boxWidth) {
        while (widths.size() <= col) {
            widths.add(COL);
        }
        widths.set(col, Math.max(widths.get(col), boxWidth + 16));
    }

    /** The lowest and highest qubit of an instruction, looking into conditioned blocks. */
    private static int[] span(Instruction in) {
        int lo = Integer.MAX_VALUE;
        int hi = -1;
        List<Instruction> all = new ArrayList<>(List.of(in));
        for (int i = 0; i < all.size(); i++) {
            Instruction x = all.get(i);
            for (int q : x.qubits()) {
                lo = Math.min(lo, q);
                hi = Math.max(hi, q);
            }
            all.addAll(x.body());
        }
        return hi < 0 ? new int[] {0, -1} : new int[] {lo, hi};
    }

    /**
     * Places an instruction in the first column where its wires (and the bit it writes or
     * reads) are free, or at column {@code fixed} inside a conditioned block; returns the
     * column after it.
     */
    private int place(Instruction in, int fixed) {
        int[] s = span(in);
        if (s[1] < 0 && in.kind() != Instruction.Kind.GATE) {
            // Classical only (an assignment, a block of them): as in the text diagram, not drawn.
            return Math.max(fixed, 0);
        }
        int col = fixed;
        if (fixed < 0) {
            col = 0;
            for (int r = s[0]; r <= s[1]; r++) {
                col = Math.max(col, free[r]);
            }
            if (in.kind() == Instruction.Kind.MEASURE || in.kind() == Instruction.Kind.IF_BIT) {
                col = Math.max(col, bitFree[in.clbit()]);
            }
        }
        need(col, 0);
        int end;
        switch (in.kind()) {
            case IF_BIT:
                end = frame(in.body(), "if c" + in.clbit() + "=" + in.value(), in.clbit(), col,
                        s);
                break;
            case IF:
                end = frame(in.body(), tag("if ", in), -1, col, s);
                if (!in.otherwise().isEmpty()) {
                    end = frame(in.otherwise(), tag("else of ", in), -1, end, s);
                }
                break;
            case WHILE:
                end = frame(in.body(), tag("while ", in), -1, col, s);
                break;
            case DELAY:
                delay(in, col);
                end = col + 1;
                break;
            case MEASURE:
                measure(in, col);
                end = col + 1;
                break;
            case RESET:
                final int at = col;
                need(col, 36);
                shapes.add(out -> box(out, colX(at), rowY(in.targets()[0]), 36, "|0\u27e9"));
                end = col + 1;
                break;
            default:
                gate(in, col);
                end = col + 1;
                break;
        }
        if (fixed < 0) {
            for (int r = s[0]; r <= s[1]; r++) {
                free[r] = end;
            }
            if (in.kind() == Instruction.Kind.IF_BIT || in.kind() == Instruction.Kind.MEASURE) {
                bitFree[in.clbit()] = end;
            }
        }
        return end;
    }

    /** The tag of a block with a condition: the prefix and the condition, at most 40 chars. */
    private static String tag(String prefix, Instruction in) {
        String text = prefix + in.condition();
        return text.length() <= MAX_TAG ? text : text.substring(0, MAX_TAG - 3) + "...";
    }

    /**
     * A block run under a condition: its instructions in consecutive columns inside a dashed
     * frame with a tag; {@code bit} is the classical bit read (a ring on its line), or -1.
     */
    private int frame(List<Instruction> body, String tag, int bit, int col, int[] s) {
        int[] last = {col};
        int lo = s[1] < 0 ? 0 : s[0];
        int hi = s[1] < 0 ? 0 : s[1];
        // The frame goes first, so the gates are drawn on it.
        shapes.add(out -> {
            int x0 = left(col) + 4;
            int x1 = right(last[0]) - 4;
            int y0 = rowY(lo) - ROW / 2 + 5;
            int y1 = rowY(hi) + ROW / 2 - 5;
            out.append(Cli.f("<rect class=\"condition\" x=\"%d\" y=\"%d\" width=\"%d\""
                    + " height=\"%d\" fill=\"#fff8e6\" stroke=\"%s\" stroke-dasharray=\"5,3\""
                    + " rx=\"6\"/>%n", x0, y0, x1 - x0, y1 - y0, COND));
        });
        int end = col;
        for (Instruction b : body) {
            end = place(b, end);
        }
        end = Math.max(end, col + 1);
        last[0] = end - 1;
        shapes.add(out -> {
            int x0 = left(col) + 4;
            int x1 = right(last[0]) - 4;
            int y0 = rowY(lo) - ROW / 2 + 5;
            // The tag sits on the frame's top edge, between two wires, on a white ground.
            out.append(Cli.f("<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"12\""
                    + " fill=\"white\"/><text class=\"tag\" x=\"%d\" y=\"%d\" font-size=\"10\""
                    + " fill=\"%s\">%s</text>%n", x0 + 6, y0 - 6, 6 * tag.length() + 6, x0 + 9,
                    y0 + 4, COND, SvgHistogram.esc(tag)));
            if (bit < 0) {
                return;
            }
            // Where the bit is read: a hollow ring on its line, the frame's width marked there.
            int yb = bitY(bit);
            out.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"%s\""
                    + " stroke-width=\"2\" stroke-dasharray=\"5,3\"/><circle cx=\"%d\""
                    + " cy=\"%d\" r=\"4\" fill=\"white\" stroke=\"%s\" stroke-width=\"1.5\">"
                    + "<title>%s reads c%d</title></circle>%n", x0, yb, x1, yb, COND, x0 + 8, yb,
                    COND, tag, bit));
        });
        return end;
    }

    /** A delay: a plain box reading {@code wait(2us)} on each qubit it holds. */
    private void delay(Instruction in, int col) {
        String label = "wait(" + seconds(in.duration()) + ")";
        need(col, boxWidth(label));
        for (int q : in.targets()) {
            shapes.add(out -> box(out, colX(col), rowY(q), boxWidth(label), label));
        }
    }

    /** A duration in seconds, in the largest unit of s, ms, us and ns that keeps it above 1. */
    static String seconds(double d) {
        String[] unit = {"s", "ms", "us", "ns"};
        int k = 0;
        double scaled = d;
        for (; k < 3 && scaled != 0 && Math.abs(scaled) < 1; k++) {
            scaled *= 1e3;
        }
        return new java.math.BigDecimal(Cli.f("%.4g", scaled)).stripTrailingZeros()
                .toPlainString() + unit[k];
    }

    /** A measurement: a gauge on the qubit's wire, a tag naming the bit, a mark on its line. */
    private void measure(Instruction in, int col) {
        int q = in.targets()[0];
        need(col, 36);
        shapes.add(out -> {
            int x = colX(col);
            int y = rowY(q);
            box(out, x, y, 36, "");
            out.append(Cli.f("<path d=\"M %d %d A 12 12 0 0 1 %d %d\" fill=\"none\""
                    + " stroke=\"%s\"/><line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\""
                    + " stroke=\"%s\" stroke-width=\"1.5\"/><circle cx=\"%d\" cy=\"%d\""
                    + " r=\"1.8\" fill=\"%s\"/>%n", x - 12, y + 7, x + 12, y + 7, INK, x, y + 7,
                    x + 7, y - 6, INK, x, y + 7, INK));
            out.append(Cli.f("<text class=\"tag\" x=\"%d\" y=\"%d\" font-size=\"10\""
                    + " fill=\"#333\">\u2192c%d</text>%n", x + 4, y + 27, in.clbit()));
            int yb = bitY(in.clbit());
            out.append(Cli.f("<rect x=\"%d\" y=\"%d\" width=\"7\" height=\"7\" fill=\"%s\">"
                    + "<title>measure q%d \u2192 c%d</title></rect>%n", x - 3, yb - 3, INK, q,
                    in.clbit()));
        });
    }

    /** A gate: the connector, the controls, and each target's symbol or labelled box. */
    private void gate(Instruction in, int col) {
        int[] t = in.targets();
        int[] c = in.controls();
        String[] labels = in.isDynamic() ? dynamicLabels(in)
                : in.gate().targetLabels(in.angles(), t.length);
        int[] s = span(in);
        for (String label : labels) {
            need(col, boxWidth(pretty(label)));
        }
        shapes.add(out -> {
            int x = colX(col);
            if (s[0] != s[1]) {
                out.append(Cli.f("<line x1=\"%d\" y1=\"%d\" x2=\"%d\" y2=\"%d\" stroke=\"%s\""
                        + " stroke-width=\"1.5\"/>%n", x, rowY(s[0]), x, rowY(s[1]), INK));
            }
            for (int q : c) {
                dot(out, x, rowY(q));
            }
            for (int j = 0; j < t.length; j++) {
                target(out, x, rowY(t[j]), labels[j]);
            }
        });
    }

    /**
     * One target: the catalogue's symbols (Nielsen and Chuang 2010, §4.3) ⊕ for a NOT target,
     * × for a swap end, ● for a dot; any other label in a box on the target's own wire.
     */
    private static void target(StringBuilder out, int x, int y, String label) {
        switch (label) {
            case "\u2295":
                out.append(Cli.f("<circle cx=\"%d\" cy=\"%d\" r=\"11\" fill=\"white\""
                        + " stroke=\"%s\" stroke-width=\"1.5\"/><path d=\"M %d %d H %d M %d %d"
                        + " V %d\" stroke=\"%s\" stroke-width=\"1.5\"/>%n", x, y, INK, x - 11, y,
                        x + 11, x, y - 11, y + 11, INK));
                break;
            case "\u00d7":
                out.append(Cli.f("<path d=\"M %d %d L %d %d M %d %d L %d %d\" stroke=\"%s\""
                        + " stroke-width=\"2\"/>%n", x - 7, y - 7, x + 7, y + 7, x - 7, y + 7,
                        x + 7, y - 7, INK));
                break;
            case "\u25cf":
                dot(out, x, y);
                break;
            default:
                String text = pretty(label);
                box(out, x, y, boxWidth(text), text);
                break;
        }
    }

    /** A gate whose angles are read during the shot: its name and expressions, shortened. */
    private static String[] dynamicLabels(Instruction in) {
        StringBuilder sb = new StringBuilder(in.gate().id().toUpperCase(Locale.ROOT)).append('(');
        Expression[] angles = in.angleExpressions();
        for (int k = 0; k < angles.length; k++) {
            sb.append(k > 0 ? "," : "").append(angles[k]);
        }
        String text = sb.append(')').toString();
        if (text.length() > MAX_TAG) {
            text = text.substring(0, MAX_TAG - 3) + "...";
        }
        String[] out = new String[in.targets().length];
        Arrays.fill(out, text);
        return out;
    }

    /** The width of a box for a label (symbols take none). */
    private static int boxWidth(String label) {
        return label.length() <= 1 && !Character.isLetter(label.charAt(0)) ? 22
                : Math.max(36, 8 + 7 * label.length());
    }

    private static void dot(StringBuilder out, int x, int y) {
        out.append(Cli.f("<circle cx=\"%d\" cy=\"%d\" r=\"5\" fill=\"%s\"/>%n", x, y, INK));
    }

    private static void box(StringBuilder out, int x, int y, int width, String label) {
        out.append(Cli.f("<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"30\" fill=\"%s\""
                + " stroke=\"%s\" rx=\"4\"/>%n", x - width / 2, y - 15, width, BOX, BOX_EDGE));
        if (!label.isEmpty()) {
            out.append(Cli.f("<text class=\"label\" x=\"%d\" y=\"%d\" font-size=\"12\""
                    + " text-anchor=\"middle\">%s</text>%n", x, y + 4,
                    SvgHistogram.esc(label)));
        }
    }

    /** A catalogue label in print: daggers, square roots and pi as symbols. */
    private static String pretty(String label) {
        String out = label.replace("SX", "\u221aX").replace("pi", "\u03c0");
        return out.endsWith("+") ? out.substring(0, out.length() - 1) + "\u2020" : out;
    }
}
