package dev.qsim;

import java.util.List;

import dev.qsim.internal.EngineWork;
import dev.qsim.internal.HeapLayout;
import dev.qsim.stabilizer.StabilizerTableau;

/**
 * Counts the stabilizer tableau's work in 64-bit words, following its steps: a gate on k qubits
 * rewrites the x and z columns of its qubits, {@code 4k·⌈n/64⌉} words; a measurement or reset
 * is counted as {@code n·⌈n/64⌉} words, priced at its own measured rate (Aaronson and
 * Gottesman 2004, Phys. Rev. A 70, 052328, section III: O(n) per gate, O(n²) per
 * measurement). A circuit without conditions
 * is simulated once and its shots replayed in batches of 64, each measurement costing one
 * half-column per batch; any other circuit is simulated shot by shot from a copy of its prefix.
 */
final class TableauCost {
    private TableauCost() {
    }

    /**
     * Words of one run of the circuit: {gate words, measurement words, words of one replayed
     * 64-shot batch, gates, measurements and resets}.
     */
    static double[] words(Circuit c) {
        int n = c.qubits();
        double half = (n + 63) >>> 6;
        double[] w = new double[3];
        count(c.instructions(), n, half, w);
        return new double[] {w[0], w[1] * n * half, w[1] * half, w[2], w[1]};
    }

    /** Adds to w[0] the gate words, to w[1] the measurements and resets, to w[2] the gates. */
    private static void count(List<Instruction> list, int n, double half, double[] w) {
        for (Instruction in : list) {
            switch (in.kind()) {
                case GATE:
                    w[0] += 4 * half * (in.targetsRaw().length + in.controlsRaw().length);
                    w[2]++;
                    break;
                case MEASURE:
                case RESET:
                    w[1]++;
                    break;
                case IF_BIT:
                case IF:
                    count(in.body(), n, half, w);
                    break;
                case WHILE: {
                    double[] body = new double[3];
                    count(in.body(), n, half, body);
                    w[0] += body[0] * in.maxIterations();
                    w[1] += body[1] * in.maxIterations();
                    w[2] += body[2] * in.maxIterations();
                    break;
                }
                default:
                    break;
            }
        }
    }

    static EngineWork work(Circuit c, int shots) {
        int n = c.qubits();
        double half = (n + 63) >>> 6;
        double[] words = words(c);
        EngineWork e = new EngineWork();
        long table = HeapLayout.arrayBytes(StabilizerTableau.bytes(n));
        if (c.measuresAtEnd() || !hasControl(c.instructions())) {
            e.tableau(words[3], words[0], words[4], words[1], Math.ceil(shots / 64.0)
                    * words[2]);
            e.hold(table, "the tableau");
            e.hold((long) (words[2] / half) * 6 * HeapLayout.arrayBytes(8L * (long) half),
                    "the replay of the signs");
        } else {
            double copy = 4.0 * n * half;
            e.tableau(shots * words[3], shots * (words[0] + copy), shots * words[4],
                    shots * words[1], 0);
            e.hold(2 * table, "the tableau and a copy for each shot");
        }
        e.draw(shots, c.clbits());
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
