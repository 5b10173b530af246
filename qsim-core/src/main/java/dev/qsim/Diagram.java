package dev.qsim;

import java.util.ArrayList;
import java.util.List;

/**
 * Draws a circuit as text, one line per qubit, time left to right, in the textbook symbols of
 * Nielsen and Chuang 2010, §4.3: a filled dot for a control, ⊕ for the target of a NOT, × for
 * the ends of a swap (the labels come from {@link Gate#targetLabels(double[], int)}).
 */
final class Diagram {
    /** A control qubit: a filled dot. */
    static final String CONTROL = "\u25cf";

    private Diagram() {
    }

    /**
     * One drawn column: a label per qubit row (null = wire), and for each gap between rows
     * whether an instruction's vertical line crosses it.
     */
    private static final class Column {
        final String[] labels;
        final boolean[] link;

        Column(int qubits) {
            labels = new String[qubits];
            link = new boolean[qubits];
        }

        void put(int q, String label) {
            labels[q] = label;
        }

        /** Draws the vertical line of one instruction spanning rows lo..hi. */
        void span(int lo, int hi) {
            for (int q = lo; q < hi; q++) {
                link[q] = true;
            }
        }

        int width() {
            int w = 1;
            for (String s : labels) {
                if (s != null) {
                    w = Math.max(w, s.length());
                }
            }
            return w;
        }
    }

    /** The most characters a drawing may have; larger circuits get a summary instead. */
    static final int MAX_CHARS = 1 << 22;

    /** The most characters of a condition shown beside a conditioned gate. */
    private static final int MAX_CONDITION = 24;

    /** Thrown inside the placement when the drawing grows past {@link #MAX_CHARS}. */
    private static final class TooLarge extends RuntimeException {
        private static final long serialVersionUID = 1L;

        TooLarge() {
            super(null, null, false, false);
        }
    }

    /** The columns placed so far and the drawing's estimated size. */
    private static final class Layout {
        final int n;
        final List<Column> columns = new ArrayList<>();
        final int[] free;
        long width;

        Layout(int n) {
            this.n = n;
            this.free = new int[n];
        }
    }

    static String draw(Circuit c) {
        int n = c.qubits();
        Layout layout = new Layout(n);
        try {
            for (Instruction in : c.instructions()) {
                place(in, "", layout);
            }
        } catch (TooLarge e) {
            return "circuit of " + n + " qubit(s) and " + c.size() + " instruction(s), depth "
                    + c.depth() + ": too large to draw as text (the drawing would pass "
                    + MAX_CHARS + " characters)";
        }
        List<Column> columns = layout.columns;
        int nameWidth = ("q" + (n - 1)).length();
        StringBuilder[] rows = new StringBuilder[2 * n - 1];
        for (int r = 0; r < rows.length; r++) {
            rows[r] = new StringBuilder();
            if (r % 2 == 0) {
                String name = "q" + (r / 2);
                rows[r].append(" ".repeat(nameWidth - name.length())).append(name).append(": -");
            } else {
                rows[r].append(" ".repeat(nameWidth + 3));
            }
        }
        for (Column col : columns) {
            int w = col.width();
            for (int q = 0; q < n; q++) {
                String label = col.labels[q];
                StringBuilder row = rows[2 * q];
                if (label == null) {
                    boolean crossing = q > 0 && col.link[q - 1] && col.link[q];
                    label = crossing ? "|" : "-";
                }
                int left = (w - label.length()) / 2;
                row.append("-".repeat(left + 1)).append(label)
                        .append("-".repeat(w - label.length() - left + 1));
                if (q < n - 1) {
                    StringBuilder gap = rows[2 * q + 1];
                    boolean link = col.link[q];
                    int mid = (w - 1) / 2;
                    gap.append(" ".repeat(mid + 1)).append(link ? '|' : ' ')
                            .append(" ".repeat(w - mid));
                }
            }
        }
        StringBuilder out = new StringBuilder();
        for (int r = 0; r < rows.length; r++) {
            String line = rows[r].toString();
            if (r % 2 == 0) {
                line = line + "-";
            } else {
                line = line.stripTrailing();
            }
            out.append(line);
            if (r < rows.length - 1) {
                out.append('\n');
            }
        }
        return out.toString();
    }

    /** A condition as a label suffix, at most {@link #MAX_CONDITION} characters inside. */
    private static String condition(String prefix, Expression e) {
        String text = e.toString();
        if (text.startsWith("(") && text.endsWith(")")) {
            text = text.substring(1, text.length() - 1);
        }
        if (text.length() > MAX_CONDITION) {
            text = text.substring(0, MAX_CONDITION - 3) + "...";
        }
        return "[" + prefix + text + "]";
    }

    private static void place(Instruction in, String condition, Layout layout) {
        switch (in.kind()) {
            case IF_BIT: {
                String cond = condition + "[c" + in.clbit() + "=" + in.value() + "]";
                for (Instruction b : in.body()) {
                    place(b, cond, layout);
                }
                return;
            }
            case IF: {
                for (Instruction b : in.body()) {
                    place(b, condition + condition("if ", in.condition()), layout);
                }
                for (Instruction b : in.otherwise()) {
                    place(b, condition + condition("if not ", in.condition()), layout);
                }
                return;
            }
            case WHILE: {
                for (Instruction b : in.body()) {
                    place(b, condition + condition("while ", in.condition()), layout);
                }
                return;
            }
            case ASSIGN:
                return; // classical only: no qubit wire to draw it on
            default:
                break;
        }
        int[] t = in.targetsRaw();
        int[] ctl = in.controlsRaw();
        int lo = Integer.MAX_VALUE;
        int hi = -1;
        for (int q : t) {
            lo = Math.min(lo, q);
            hi = Math.max(hi, q);
        }
        for (int q : ctl) {
            lo = Math.min(lo, q);
            hi = Math.max(hi, q);
        }
        int[] free = layout.free;
        int at = 0;
        for (int q = lo; q <= hi; q++) {
            at = Math.max(at, free[q]);
        }
        List<Column> columns = layout.columns;
        while (columns.size() <= at) {
            // Each new column adds about three characters to each of the 2n - 1 rows.
            layout.width += 3;
            if ((2L * layout.n) * layout.width > MAX_CHARS) {
                throw new TooLarge();
            }
            columns.add(new Column(layout.n));
        }
        Column col = columns.get(at);
        for (int q = lo; q <= hi; q++) {
            free[q] = at + 1;
        }
        col.span(lo, hi);
        for (int q : ctl) {
            col.put(q, CONTROL);
        }
        String[] labels = labels(in);
        int before = col.width();
        for (int j = 0; j < t.length; j++) {
            col.put(t[j], labels[j] + condition);
        }
        layout.width += Math.max(0, col.width() - before);
        if ((2L * layout.n) * layout.width > MAX_CHARS) {
            throw new TooLarge();
        }
    }

    private static String[] labels(Instruction in) {
        switch (in.kind()) {
            case MEASURE:
                return new String[] {"M>c" + in.clbit()};
            case RESET:
                return new String[] {"|0>"};
            case DELAY: {
                String[] out = new String[in.targetsRaw().length];
                java.util.Arrays.fill(out, "wait(" + duration(in.duration()) + ")");
                return out;
            }
            default:
                if (in.isDynamic()) {
                    return dynamicLabels(in);
                }
                return in.gate().targetLabels(in.anglesRaw(), in.targetsRaw().length);
        }
    }

    /** A gate whose angles are expressions: its name with the expressions, on each target. */
    private static String[] dynamicLabels(Instruction in) {
        StringBuilder sb = new StringBuilder(in.gate().id().toUpperCase(java.util.Locale.ROOT))
                .append('(');
        Expression[] angles = in.angleExpressions();
        for (int k = 0; k < angles.length; k++) {
            sb.append(k > 0 ? ", " : "").append(angles[k]);
        }
        String text = sb.append(')').toString();
        if (text.length() > MAX_CONDITION + 8) {
            text = text.substring(0, MAX_CONDITION + 5) + "...";
        }
        String[] out = new String[in.targetsRaw().length];
        java.util.Arrays.fill(out, text);
        return out;
    }

    /** A duration in seconds with an SI prefix: 2e-6 reads "2us". */
    static String duration(double seconds) {
        String[] units = {"s", "ms", "us", "ns"};
        double v = seconds;
        int u = 0;
        while (u < units.length - 1 && v != 0 && Math.abs(v) < 1) {
            v *= 1000;
            u++;
        }
        String number = v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v)
                : String.format(java.util.Locale.ROOT, "%.3g", v);
        return number + units[u];
    }
}
