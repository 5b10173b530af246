package dev.qsim.noise;

import java.util.Arrays;
import java.util.List;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.internal.EngineWork;
import dev.qsim.internal.HeapLayout;
import dev.qsim.kernel.GateOp;
import dev.qsim.kernel.Workload;

/**
 * Counts the work of the noisy engines without running them, following each engine's own
 * steps: the density matrix ({@code NoiseEngines.densityMatrix}: two dense passes per gate, on
 * the row and the column qubits of the {@code 2n}-qubit storage, and one dense pass of
 * {@code 2k} qubits per {@code k}-qubit channel), and trajectories (per shot: the gates through
 * the lazy frame, one Kraus branch per channel, counted with the expected number of non-trivial
 * branches, measurements and resets). Conditioned blocks are counted as if taken and loops at
 * their bound, so a trajectory's count is an upper bound there.
 */
final class NoiseCost {
    private static final int[] NONE = new int[0];
    private static final double[] ONES = new double[8];

    static {
        Arrays.fill(ONES, 1.0);
    }

    private NoiseCost() {
    }

    static EngineWork densityMatrix(Circuit circuit, NoiseModel model, int shots, int threads) {
        int n = circuit.qubits();
        Workload w = Workload.of(2 * n, false);
        for (Instruction in : circuit.instructions()) {
            switch (in.kind()) {
                case GATE: {
                    int k = in.targets().length;
                    double[] m = k == 1 && in.controls().length == 0 ? matrix(in) : null;
                    w.densityGate(m, k, in.controls().length);
                    channels(w, model.noiseAfter(in));
                    break;
                }
                case RESET:
                    w.densityChannel(in.targets().length);
                    break;
                case MEASURE:
                    break; // terminal: the distribution skips their channels
                default:
                    channels(w, model.noiseDuring(in));
                    break;
            }
        }
        EngineWork e = new EngineWork();
        e.add(new EngineWork.Part("density matrix of " + n + " qubits", w, 1, threads, 1));
        e.hold(HeapLayout.stateBytes(2 * n, false), "the density matrix");
        e.hold(HeapLayout.arrayBytes(8L << n), "its diagonal");
        e.hold(HeapLayout.arrayBytes(8L << circuit.clbits()), "the register distribution");
        e.draw(shots, circuit.clbits());
        return e;
    }

    private static void channels(Workload w, List<NoiseModel.Placed> placed) {
        for (NoiseModel.Placed p : placed) {
            w.densityChannel(p.qubits().length);
        }
    }

    /** A gate's matrix, a parameterized one's at angles of 1 (its shape, not its values). */
    private static double[] matrix(Instruction in) {
        return DensityMatrix.raw(in.isDynamic()
                ? in.gate().operator(Arrays.copyOf(ONES, in.gate().parameters()))
                : in.operator());
    }

    static EngineWork trajectories(Circuit circuit, NoiseModel model, int shots, int threads) {
        int n = circuit.qubits();
        int workers = Math.max(1, Math.min(threads, shots));
        int kernelThreads = Math.max(1, threads / workers);
        Workload per = Workload.of(n, false);
        per.pass(Workload.COPY, 0.5); // the state cleared: written once, not read
        walk(circuit.instructions(), per, model);
        EngineWork e = new EngineWork();
        e.add(new EngineWork.Part("trajectory of " + n + " qubits", per, shots, kernelThreads,
                workers));
        e.hold(workers * HeapLayout.stateBytes(n, false), workers + " trajectory state(s)");
        e.hold(HeapLayout.arrayBytes(8L * shots), "the outcome of each trajectory");
        e.draw(shots, circuit.clbits());
        return e;
    }

    private static void walk(List<Instruction> list, Workload w, NoiseModel model) {
        for (Instruction in : list) {
            switch (in.kind()) {
                case GATE: {
                    w.gates(List.of(GateOp.of(matrix(in), in.targets(), in.controls())));
                    kraus(w, model.noiseAfter(in));
                    break;
                }
                case MEASURE:
                case RESET:
                    w.pass(Workload.MEASURE, 1);
                    break;
                case DELAY:
                    kraus(w, model.noiseDuring(in));
                    break;
                case IF_BIT:
                case IF:
                    walk(in.body(), w, model);
                    break;
                case WHILE: {
                    Workload body = Workload.of(w.qubits(), false);
                    walk(in.body(), body, model);
                    w.addAll(body, in.maxIterations());
                    break;
                }
                default:
                    break;
            }
        }
    }

    /** One Kraus branch per channel: the expected count of branches that need a pass. */
    private static void kraus(Workload w, List<NoiseModel.Placed> placed) {
        for (NoiseModel.Placed p : placed) {
            Channel ch = p.channel();
            double[][] raw = ch.rawKraus();
            boolean[] scalar = ch.scalarBranches();
            int first = 0;
            while (first < scalar.length - 1 && scalar[first]) {
                first++;
            }
            GateOp op = new GateOp(GateOp.DENSE, p.qubits().clone(), NONE, raw[first], null);
            double[] prob = ch.fixedProbabilities();
            if (prob == null) {
                w.pass(Workload.REDUCE, 1);
                w.gates(List.of(op));
                continue;
            }
            double total = 0;
            double moving = 0;
            for (int b = 0; b < prob.length; b++) {
                total += prob[b];
                moving += scalar[b] ? 0 : prob[b];
            }
            if (moving > 0 && total > 0) {
                w.gates(List.of(op), moving / total);
            }
        }
    }
}
