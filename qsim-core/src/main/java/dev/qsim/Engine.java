package dev.qsim;

import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;

import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.Kernels;
import dev.qsim.kernel.Reductions;

/** Runs instructions on amplitudes: picks the kernel, measures, resets, tests conditions. */
final class Engine {
    private static final int[] NONE = new int[0];

    private Engine() {
    }

    static void gate(Amplitudes a, Instruction in, int threads) {
        switch (in.shape) {
            case Instruction.SHAPE_DIAGONAL:
                Kernels.diagonal(a, in.targetsRaw(), in.controlsRaw(), in.data, threads);
                break;
            case Instruction.SHAPE_MONOMIAL:
                Kernels.monomial(a, in.targetsRaw(), in.controlsRaw(), in.perm, in.data, threads);
                break;
            default:
                Kernels.dense(a, in.targetsRaw(), in.controlsRaw(), in.data, threads);
                break;
        }
    }

    /**
     * Measures qubit q: draws the outcome with its Born probability, then projects and
     * renormalises (Nielsen and Chuang 2010, §2.2.3, postulate 3).
     */
    static int measure(Amplitudes a, int q, UniformRandomProvider rng, int threads) {
        double p1 = Math.min(1, Math.max(0, Reductions.probabilityWhere(a, q, threads)));
        int outcome = rng.nextDouble() < p1 ? 1 : 0;
        double p = outcome == 1 ? p1 : 1 - p1;
        double s = 1 / Math.sqrt(p);
        double[] diag = outcome == 1 ? new double[] {0, 0, s, 0} : new double[] {s, 0, 0, 0};
        Kernels.diagonal(a, new int[] {q}, NONE, diag, threads);
        return outcome;
    }

    static void reset(Amplitudes a, int q, UniformRandomProvider rng, int threads) {
        if (measure(a, q, rng, threads) == 1) {
            Kernels.monomial(a, new int[] {q}, NONE, new int[] {1, 0}, new double[] {1, 0, 1, 0},
                    threads);
        }
    }

    /** Runs instructions from index {@code from} on, for one shot; clbits in {@code reg}. */
    static void run(Amplitudes a, List<Instruction> list, int from, boolean[] reg,
            UniformRandomProvider rng, int threads) {
        for (int i = from; i < list.size(); i++) {
            Instruction in = list.get(i);
            switch (in.kind()) {
                case GATE:
                    gate(a, in, threads);
                    break;
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
        }
    }
}
