package dev.qsim;

import java.util.List;

import dev.qsim.internal.EngineWork;
import dev.qsim.internal.HeapLayout;
import dev.qsim.stabilizer.StabilizerTableau;

/**
 * Counts the stabilizer tableau's work as the terms it costs time by, following its steps
 * (Aaronson and Gottesman 2004, Phys. Rev. A 70, 052328, section III: O(n) per gate, O(n²)
 * per measurement). A gate is applied as its primitive steps, each rewriting the x and z
 * columns of its qubits, {@code 4·⌈n/64⌉} words a qubit; a measurement or reset walks the n
 * columns of the table, {@code n·⌈n/64⌉} words, so it is counted as one measurement, n columns
 * and those words; making or copying a table writes its {@code 4n·⌈n/64⌉} words. A circuit
 * without conditions is simulated once and its shots replayed in batches of 64: each batch
 * takes every measurement again as one step that flips at most n rows of the sign column,
 * counted as one step and n rows, its outcome bits unpacked for the tally. Any other circuit
 * is simulated shot by shot from a copy of its table. The tally's share is priced with the
 * tableau's own rates (per shot, and within each replayed step), not the state vector's.
 */
final class TableauCost {
    /** Term: runs (one table made, the replay recorded, the tally built). */
    static final int RUNS = 0;
    /** Term: words of the tables made or copied. */
    static final int TABLE_WORDS = 1;
    /** Term: gates applied. */
    static final int GATES = 2;
    /** Term: words the gates' primitive steps rewrite. */
    static final int GATE_WORDS = 3;
    /** Term: measurements and resets. */
    static final int MEASUREMENTS = 4;
    /** Term: columns the measurements walk (n each). */
    static final int MEASURE_COLUMNS = 5;
    /** Term: words the measurements walk ({@code n·⌈n/64⌉} each). */
    static final int MEASURE_WORDS = 6;
    /** Term: measurements replayed in batches of 64 shots (one per batch and measurement). */
    static final int BATCH_STEPS = 7;
    /** Term: rows of the sign column a replayed measurement may flip (n per step). */
    static final int BATCH_ROWS = 8;
    /**
     * Term: shots tallied. A replayed batch unpacks each measurement's bit for its 64 shots,
     * so the tally's work per bit is part of a replayed step's.
     */
    static final int SHOTS = 9;
    /**
     * Term: bits of the shots tallied as bitstrings, {@code shots · clbits} for a register wider
     * than a tally key (63 bits), 0 otherwise: each such shot writes, hashes and compares a
     * string of one character a bit (at 200 bits about 1.7 µs a shot, ten times a key's).
     */
    static final int WIDE_BITS = 10;
    /** The number of terms. */
    static final int TERMS = 11;
    /** The widest register tallied as one key a shot. */
    private static final int KEY_BITS = 63;

    private TableauCost() {
    }

    /** The terms of one pass through the instructions, once each, without runs or tables. */
    static double[] once(Circuit c) {
        int n = c.qubits();
        double half = (n + 63) >>> 6;
        double[] w = new double[TERMS];
        count(c.instructions(), n, half, w);
        return w;
    }

    /** Adds the gate and measurement terms of the instructions to w. */
    private static void count(List<Instruction> list, int n, double half, double[] w) {
        for (Instruction in : list) {
            switch (in.kind()) {
                case GATE:
                    w[GATES]++;
                    w[GATE_WORDS] += 4 * half * primitiveQubits(in);
                    break;
                case MEASURE:
                case RESET:
                    w[MEASUREMENTS]++;
                    w[MEASURE_COLUMNS] += n;
                    w[MEASURE_WORDS] += n * half;
                    break;
                case IF_BIT:
                case IF:
                    count(in.body(), n, half, w);
                    break;
                case WHILE: {
                    double[] body = new double[TERMS];
                    count(in.body(), n, half, body);
                    for (int t = 0; t < TERMS; t++) {
                        w[t] += body[t] * in.maxIterations();
                    }
                    break;
                }
                default:
                    break;
            }
        }
    }

    /**
     * The qubits the gate's primitive steps act on, summed over the steps (H on one qubit 1,
     * CNOT 2, a Y as S, X, S-dagger ... as its catalogue decomposition says); a gate that is
     * not Clifford (it cannot run on the tableau) counts its own qubits.
     */
    private static int primitiveQubits(Instruction in) {
        try {
            int q = 0;
            for (Gate.Step st : in.gate().cliffordSteps(in.angles())) {
                q += st.second() < 0 ? 1 : 2;
            }
            return q;
        } catch (IllegalArgumentException e) {
            return in.targetsRaw().length + in.controlsRaw().length;
        }
    }

    /** The terms of a run of {@code shots} shots, as {@link #work} counts them. */
    static double[] terms(Circuit c, int shots) {
        int n = c.qubits();
        double half = (n + 63) >>> 6;
        double table = 4.0 * n * half;
        double[] once = once(c);
        double[] t = new double[TERMS];
        if (!hasControl(c.instructions())) {
            System.arraycopy(once, 0, t, 0, TERMS);
            t[RUNS] = 1;
            t[TABLE_WORDS] = table;
            double batches = Math.ceil(shots / 64.0);
            t[BATCH_STEPS] = batches * once[MEASUREMENTS];
            t[BATCH_ROWS] = batches * once[MEASUREMENTS] * n;
        } else {
            for (int k = GATES; k <= MEASURE_WORDS; k++) {
                t[k] = shots * once[k];
            }
            t[TABLE_WORDS] = (2 + shots) * table;
            t[RUNS] = 1;
        }
        t[SHOTS] = shots;
        t[WIDE_BITS] = c.clbits() > KEY_BITS ? (double) shots * c.clbits() : 0;
        return t;
    }

    static EngineWork work(Circuit c, int shots) {
        int n = c.qubits();
        double half = (n + 63) >>> 6;
        EngineWork e = new EngineWork();
        double[] t = terms(c, shots);
        e.tableau(t);
        long table = HeapLayout.arrayBytes(StabilizerTableau.bytes(n));
        if (!hasControl(c.instructions())) {
            e.hold(table, "the tableau");
            e.hold((long) t[MEASUREMENTS] * 6 * HeapLayout.arrayBytes(8L * (long) half),
                    "the replay of the signs");
        } else {
            e.hold(2 * table, "the tableau and a copy for each shot");
        }
        return e;
    }

    private static boolean hasControl(List<Instruction> list) {
        for (Instruction in : list) {
            Instruction.Kind k = in.kind();
            if (k == Instruction.Kind.IF_BIT || k == Instruction.Kind.IF
                    || k == Instruction.Kind.WHILE || k == Instruction.Kind.ASSIGN
                    || (k == Instruction.Kind.GATE && in.isDynamic())) {
                return true;
            }
        }
        return false;
    }
}
