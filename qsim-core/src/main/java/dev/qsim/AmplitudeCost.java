package dev.qsim;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

import dev.qsim.internal.EngineWork;
import dev.qsim.internal.HeapLayout;
import dev.qsim.kernel.Frame;
import dev.qsim.kernel.GateOp;
import dev.qsim.kernel.Workload;

/**
 * Counts the state-vector engine's work without running it, step for step as
 * {@link AmplitudeEngine} runs: the same fusion blocks ({@link Fusion#shapes}), the same lazy
 * frame, cache blocking and single-precision windows ({@link Workload}, which calls the
 * kernel's planner), then either one sampling pass for a circuit that measures at the end, or
 * a copy of the simulated prefix and the rest of the circuit for each shot. Conditioned blocks
 * are counted as if taken and loops at their bound, so a shot-by-shot count is an upper bound
 * there.
 */
final class AmplitudeCost {
    private static final double[] ONES = new double[8];

    static {
        Arrays.fill(ONES, 1.0);
    }

    private AmplitudeCost() {
    }

    static EngineWork work(Circuit circuit, int shots, Precision precision, boolean fuse,
            int threads) {
        int n = circuit.qubits();
        boolean single = precision == Precision.SINGLE;
        long state = HeapLayout.stateBytes(n, single);
        EngineWork e = new EngineWork();
        e.hold(state, "the state");
        if (single) {
            int windowLog = Math.min(n, dev.qsim.kernel.Windows.WINDOW_LOG);
            e.hold(Math.min(threads, 1L << Math.max(0, n - windowLog))
                    * HeapLayout.arrayBytes(16L << windowLog), "a window buffer per thread");
        }
        if (circuit.measuresAtEnd()) {
            List<Instruction> gates = circuit.withoutMeasurements().instructions();
            Workload w = Workload.of(n, single);
            w.gates(fuse ? Fusion.shapes(gates) : plans(gates));
            if (fuse) {
                w.fusion(gates.size());
            }
            boolean measured = false;
            for (int q : circuit.clbitSources()) {
                measured |= q >= 0;
            }
            if (measured) {
                w.settle();
                w.pass(Workload.SAMPLE, 1);
                e.hold(HeapLayout.arrayBytes(8L * shots) * 2, "the sorted uniforms and indices");
                e.hold(HeapLayout.arrayBytes(8L << Math.max(0, n - Frame.CACHE_LOG)),
                        "the block sums");
            }
            holdPhaseTables(e, w, threads);
            e.add(new EngineWork.Part("the circuit once", w, 1, threads, 1));
            e.draw(shots, circuit.clbits());
            return e;
        }
        List<Instruction> list = circuit.instructions();
        int first = 0;
        while (first < list.size() && !list.get(first).isClassical()) {
            first++;
        }
        Workload prefix = Workload.of(n, single);
        List<Instruction> head = list.subList(0, first);
        prefix.gates(fuse ? Fusion.shapes(head) : plans(head));
        if (fuse) {
            prefix.fusion(head.size());
        }
        prefix.pass(Workload.COPY, 1);
        Workload shot = Workload.of(n, single);
        shot.pass(Workload.COPY, 1);
        walk(list.subList(first, list.size()), shot, fuse);
        e.hold(state, "a copy of the state after the prefix");
        holdPhaseTables(e, prefix.addAll(shot, 0), threads);
        e.add(new EngineWork.Part("the gates before the first measurement", prefix, 1, threads,
                1));
        e.add(new EngineWork.Part("each shot", shot, shots, threads, 1));
        e.draw(shots, circuit.clbits());
        return e;
    }

    /** The lazy frame's phase table, and a copy per thread's piece, while it settles. */
    private static void holdPhaseTables(EngineWork e, Workload w, int threads) {
        int log = w.phaseTableLog();
        if (log >= 0) {
            int pieces = w.qubits() >= dev.qsim.kernel.Parallel.MIN_PARALLEL_QUBITS ? threads : 1;
            e.hold((1 + pieces) * HeapLayout.arrayBytes(16L << log),
                    "the frame's phase tables");
        }
    }

    /** The gates of a list as {@code AmplitudeEngine.gates} hands them to the kernels. */
    private static List<GateOp> plans(List<Instruction> gates) {
        List<GateOp> ops = new ArrayList<>(gates.size());
        for (Instruction g : gates) {
            ops.add(g.plan());
        }
        return ops;
    }

    /** The shot interpreter's steps: runs of gates in one call (fused at the top level). */
    private static void walk(List<Instruction> list, Workload w, boolean fuse) {
        int i = 0;
        while (i < list.size()) {
            Instruction in = list.get(i);
            if (!in.isClassical()) {
                int j = i;
                while (j < list.size() && !list.get(j).isClassical()) {
                    j++;
                }
                List<Instruction> run = list.subList(i, j);
                w.gates(fuse ? Fusion.shapes(run) : plans(run));
                if (fuse) {
                    w.fusion(run.size());
                }
                i = j;
                continue;
            }
            switch (in.kind()) {
                case GATE: // a gate with angles computed during the shot
                    w.gates(List.of(GateOp.of(in.gate().operator(Arrays.copyOf(ONES,
                            in.gate().parameters())).raw(), in.targetsRaw(), in.controlsRaw())));
                    break;
                case MEASURE:
                case RESET:
                    w.pass(Workload.MEASURE, 1);
                    break;
                case IF_BIT:
                case IF:
                    walk(in.body(), w, false);
                    break;
                case WHILE: {
                    Workload body = Workload.of(w.qubits(), w.single());
                    walk(in.body(), body, false);
                    w.addAll(body, in.maxIterations());
                    break;
                }
                default:
                    break;
            }
            i++;
        }
    }
}
