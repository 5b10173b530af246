package dev.qsim;

import java.util.ArrayList;
import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;

import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.Frame;
import dev.qsim.kernel.GateOp;
import dev.qsim.kernel.Reductions;

/** Runs instructions on amplitudes: picks the kernel, measures, resets, tests conditions. */
final class Engine {
    private static final int[] NONE = new int[0];

    private Engine() {
    }

    /** The kernel description of a gate instruction. */
    static GateOp op(Instruction in) {
        switch (in.shape) {
            case Instruction.SHAPE_DIAGONAL:
                return new GateOp(GateOp.DIAGONAL, in.targetsRaw(), in.controlsRaw(), in.data,
                        null);
            case Instruction.SHAPE_MONOMIAL:
                return new GateOp(GateOp.MONOMIAL, in.targetsRaw(), in.controlsRaw(), in.data,
                        in.perm);
            default:
                return new GateOp(GateOp.DENSE, in.targetsRaw(), in.controlsRaw(), in.data, null);
        }
    }

    static void gate(Amplitudes a, Instruction in, int threads) {
        apply(a, op(in), threads);
    }

    /** Applies one kernel description, in either precision, through the lazy frame. */
    private static void apply(Amplitudes a, GateOp op, int threads) {
        Frame.apply(a, List.of(op), threads);
    }

    /**
     * Applies gates {@code [from, to)} of a list in order, through the lazy frame
     * ({@link Frame}): X and single-qubit phase gates go to the frame, and consecutive gates
     * that all act below the cache-block size are applied block by block while each block
     * sits in cache (cache blocking), with the same result as one at a time.
     */
    static void gates(Amplitudes a, List<Instruction> list, int from, int to, int threads) {
        List<GateOp> ops = new ArrayList<>(to - from);
        for (int i = from; i < to; i++) {
            ops.add(op(list.get(i)));
        }
        Frame.apply(a, ops, threads);
    }

    /**
     * Returns the list with each run of consecutive gates fused (see {@link Fusion}); classical
     * instructions stay where they are. Conditioned blocks are kept as they are.
     */
    static List<Instruction> fuse(List<Instruction> list) {
        List<Instruction> out = new ArrayList<>();
        int i = 0;
        while (i < list.size()) {
            if (list.get(i).isClassical()) {
                out.add(list.get(i++));
                continue;
            }
            int j = i;
            while (j < list.size() && !list.get(j).isClassical()) {
                j++;
            }
            out.addAll(Fusion.fuse(list.subList(i, j)));
            i = j;
        }
        return out;
    }

    /**
     * Measures qubit q: draws the outcome with its Born probability, then projects and
     * renormalises (Nielsen and Chuang 2010, §2.2.3, postulate 3).
     */
    static int measure(Amplitudes a, int q, UniformRandomProvider rng, int threads) {
        double stored = Reductions.probabilityWhere(a, q, threads);
        // A flipped qubit (lazy X) reads 1 where its stored bit is 0.
        double p1 = Math.min(1, Math.max(0, Frame.flipped(a, q) ? 1 - stored : stored));
        int outcome = rng.nextDouble() < p1 ? 1 : 0;
        double p = outcome == 1 ? p1 : 1 - p1;
        double s = 1 / Math.sqrt(p);
        double[] diag = outcome == 1 ? new double[] {0, 0, s, 0} : new double[] {s, 0, 0, 0};
        apply(a, new GateOp(GateOp.DIAGONAL, new int[] {q}, NONE, diag, null), threads);
        return outcome;
    }

    static void reset(Amplitudes a, int q, UniformRandomProvider rng, int threads) {
        if (measure(a, q, rng, threads) == 1) {
            apply(a, new GateOp(GateOp.MONOMIAL, new int[] {q}, NONE, new double[] {1, 0, 1, 0},
                    new int[] {1, 0}), threads);
        }
    }

    /** Runs instructions from index {@code from} on, for one shot; clbits in {@code reg}. */
    static void run(Amplitudes a, List<Instruction> list, int from, boolean[] reg,
            UniformRandomProvider rng, int threads) {
        int i = from;
        while (i < list.size()) {
            Instruction in = list.get(i);
            switch (in.kind()) {
                case GATE:
                    int j = i + 1;
                    while (j < list.size() && list.get(j).kind() == Instruction.Kind.GATE) {
                        j++;
                    }
                    gates(a, list, i, j, threads);
                    i = j;
                    continue;
                case MEASURE:
                    reg[in.clbit()] = measure(a, in.targetsRaw()[0], rng, threads) == 1;
                    break;
                case RESET:
                    reset(a, in.targetsRaw()[0], rng, threads);
                    break;
                default:
                    if (reg[in.clbit()] == (in.value() == 1)) {
                        run(a, in.body(), 0, reg, rng, threads);
                    }
                    break;
            }
            i++;
        }
    }
}
