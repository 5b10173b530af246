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

    static String draw(Circuit c) {
        int n = c.qubits();
        List<Column> columns = new ArrayList<>();
        int[] free = new int[n]; // first column index where each qubit row is free
        for (Instruction in : c.instructions()) {
            place(in, "", n, columns, free);
        }
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

    private static void place(Instruction in, String condition, int n, List<Column> columns,
            int[] free) {
        if (in.kind() == Instruction.Kind.IF_BIT) {
            String cond = "[c" + in.clbit() + "=" + in.value() + "]";
            for (Instruction b : in.body()) {
                place(b, cond, n, columns, free);
            }
            return;
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
        int at = 0;
        for (int q = lo; q <= hi; q++) {
            at = Math.max(at, free[q]);
        }
        while (columns.size() <= at) {
            columns.add(new Column(n));
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
        for (int j = 0; j < t.length; j++) {
            col.put(t[j], labels[j] + condition);
        }
    }

    private static String[] labels(Instruction in) {
        switch (in.kind()) {
            case MEASURE:
                return new String[] {"M>c" + in.clbit()};
            case RESET:
                return new String[] {"|0>"};
            default:
                return in.gate().targetLabels(in.anglesRaw(), in.targetsRaw().length);
        }
    }
}
