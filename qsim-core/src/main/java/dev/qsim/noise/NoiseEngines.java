package dev.qsim.noise;

import java.util.HashMap;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.Operator;
import dev.qsim.Precision;
import dev.qsim.StateVector;
import dev.qsim.Tally;
import dev.qsim.internal.Bridge;
import dev.qsim.internal.ClassicalState;
import dev.qsim.internal.EngineWork;
import dev.qsim.internal.Heap;
import dev.qsim.internal.ShotRunner;
import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.Frame;
import dev.qsim.kernel.GateOp;
import dev.qsim.kernel.Measurement;
import dev.qsim.kernel.Parallel;
import dev.qsim.kernel.ReducedStates;

/**
 * The noise engines behind {@link dev.qsim.Simulator}: an ideal circuit run under a
 * {@link NoiseModel}, exactly on a {@link DensityMatrix} or by Monte Carlo wave-function
 * trajectories on state vectors. Results depend only on the seed, never on the thread count.
 *
 * <p><b>Density matrix</b>: each gate is applied, then its noise; a reset is the channel with
 * Kraus operators {@code |0><0|, |0><1|}; a measurement (its outcome unused) is the channel
 * {@code |0><0|, |1><1|}. The outcome distribution of a circuit whose measurements come last is
 * read from the diagonal of {@code rho}, then each measured bit passes through its qubit's
 * readout confusion matrix.
 *
 * <p><b>Trajectories</b> take any circuit. Each trajectory starts from {@code |0...0>}; after
 * each gate, for each channel, one Kraus branch {@code k} is chosen with probability
 * {@code ||K_k psi||^2} and {@code psi -> K_k psi / ||K_k psi||} (Dalibard, Castin and Mølmer
 * 1992, "Wave-function approach to dissipative processes in quantum optics", Phys. Rev. Lett.
 * 68, 580, doi:10.1103/PhysRevLett.68.580; the quantum-trajectory unravelling of a Kraus map,
 * Nielsen and Chuang 2010, §8.2.3). Averaged over trajectories this reproduces the
 * density-matrix distribution. Trajectory {@code t} draws from its own generator seeded from
 * {@code (seed, t)}, so the tally does not depend on how trajectories are spread over threads.
 */
final class NoiseEngines implements Bridge.Noise {
    /** The reset channel {@code rho -> |0><0| rho |0><0| + |0><1| rho |1><0|}. */
    static final Channel RESET = Channel.of(
            Operator.of(new Complex[][] {{Complex.ONE, Complex.ZERO}, {Complex.ZERO,
                    Complex.ZERO}}),
            Operator.of(new Complex[][] {{Complex.ZERO, Complex.ONE}, {Complex.ZERO,
                    Complex.ZERO}}));

    /** An unread measurement: the projections onto |0> and |1>. */
    static final Channel MEASURE = Channel.of(
            Operator.of(new Complex[][] {{Complex.ONE, Complex.ZERO}, {Complex.ZERO,
                    Complex.ZERO}}),
            Operator.of(new Complex[][] {{Complex.ZERO, Complex.ZERO}, {Complex.ZERO,
                    Complex.ONE}}));

    private static final int[] NONE = new int[0];

    @Override
    public EngineWork work(Circuit circuit, NoiseModel model, boolean densityMatrix, int shots,
            int threads) {
        return densityMatrix ? NoiseCost.densityMatrix(circuit, model, shots, threads)
                : NoiseCost.trajectories(circuit, model, shots, threads);
    }

    @Override
    public DensityMatrix densityMatrix(Circuit circuit, NoiseModel model, int threads) {
        return evolve(circuit, model, threads, true);
    }

    /** The density matrix after the circuit; terminal measurements may be skipped. */
    private static DensityMatrix evolve(Circuit circuit, NoiseModel model, int threads,
            boolean measurements) {
        List<Instruction> list = circuit.instructions();
        for (int i = 0; i < list.size(); i++) {
            String why = DensityMatrix.whyNotUnconditional(list.get(i));
            if (why != null) {
                throw new IllegalArgumentException("instruction " + i + " is " + why + "; the"
                        + " density matrix of the whole ensemble cannot follow measured values"
                        + " (use distribution() or trajectories)");
            }
        }
        DensityMatrix rho = DensityMatrix.zero(circuit.qubits()).setThreads(threads);
        for (Instruction in : list) {
            switch (in.kind()) {
                case GATE:
                    rho.gate(in);
                    for (NoiseModel.Placed p : model.noiseAfter(in)) {
                        rho.channel(p.channel(), p.qubits());
                    }
                    break;
                case RESET:
                    rho.channel(RESET, in.targets());
                    break;
                case MEASURE:
                    if (measurements) {
                        rho.channel(MEASURE, in.targets());
                    }
                    break;
                default:
                    for (NoiseModel.Placed p : model.noiseDuring(in)) {
                        rho.channel(p.channel(), p.qubits());
                    }
                    break;
            }
        }
        return rho;
    }

    @Override
    public double[] distribution(Circuit circuit, NoiseModel model, int threads) {
        if (!circuit.measuresAtEnd()) {
            throw new IllegalArgumentException("the exact distribution needs measurements at"
                    + " the end; this circuit uses measured values during the shot");
        }
        // Terminal measurements leave the diagonal as it is: skip their channels.
        DensityMatrix rho = evolve(circuit, model, threads, false);
        int width = circuit.clbits();
        int[] writer = circuit.clbitSources();
        double[] diag = rho.probabilities();
        double[] out = new double[1 << width];
        for (int i = 0; i < diag.length; i++) {
            int key = 0;
            for (int c = 0; c < width; c++) {
                if (writer[c] >= 0) {
                    key |= ((i >>> writer[c]) & 1) << c;
                }
            }
            out[key] += diag[i];
        }
        for (int c = 0; c < width; c++) {
            if (writer[c] >= 0) {
                confuse(out, c, model.readoutP1Given0(writer[c]),
                        model.readoutP0Given1(writer[c]));
            }
        }
        return out;
    }

    @Override
    public double[] branchDistribution(Circuit circuit, NoiseModel model, int threads,
            long budgetBytes) {
        int n = circuit.qubits();
        long each = DensityMatrix.bytes(n);
        int maxEntries = (int) Math.max(1, Math.min(1 << 20, budgetBytes / each));
        Map<ClassicalState, DensityMatrix> branches = new HashMap<>();
        branches.put(new ClassicalState(circuit.clbits(), circuit.variables().size()),
                DensityMatrix.zero(n).setThreads(threads));
        branches = new Branches(model, maxEntries, circuit.variables())
                .run(circuit.instructions(), branches);
        double[] out = new double[1 << circuit.clbits()];
        for (Map.Entry<ClassicalState, DensityMatrix> e : branches.entrySet()) {
            out[(int) e.getKey().register()] += Math.max(0, e.getValue().trace());
        }
        return out;
    }

    /**
     * Evolves a classical-quantum state: for each value of the classical bits and variables,
     * the unnormalised density matrix of the shots that reach it (its trace is their
     * probability). Conditions and loops act on the entries whose values satisfy them; a
     * measurement splits each entry into its two projections and passes the recorded bit
     * through the readout confusion; entries that come to hold equal values merge exactly.
     */
    private static final class Branches {
        private final NoiseModel model;
        private final int maxEntries;
        private final List<Circuit.Variable> variables;

        Branches(NoiseModel model, int maxEntries, List<Circuit.Variable> variables) {
            this.model = model;
            this.maxEntries = maxEntries;
            this.variables = variables;
        }

        Map<ClassicalState, DensityMatrix> run(List<Instruction> list,
                Map<ClassicalState, DensityMatrix> branches) {
            Map<ClassicalState, DensityMatrix> current = branches;
            for (Instruction in : list) {
                if (current.isEmpty()) {
                    return current;
                }
                switch (in.kind()) {
                    case GATE:
                        for (Map.Entry<ClassicalState, DensityMatrix> e : current.entrySet()) {
                            DensityMatrix rho = e.getValue();
                            if (in.isDynamic()) {
                                rho.gate(in, ShotRunner.angles(in, e.getKey()));
                            } else {
                                rho.gate(in);
                            }
                            for (NoiseModel.Placed p : model.noiseAfter(in)) {
                                rho.channel(p.channel(), p.qubits());
                            }
                        }
                        break;
                    case RESET:
                        for (DensityMatrix rho : current.values()) {
                            rho.channel(RESET, in.targets());
                        }
                        break;
                    case MEASURE:
                        current = measureBranches(current, in, model, maxEntries);
                        break;
                    case DELAY: {
                        List<NoiseModel.Placed> idle = model.noiseDuring(in);
                        for (DensityMatrix rho : current.values()) {
                            for (NoiseModel.Placed p : idle) {
                                rho.channel(p.channel(), p.qubits());
                            }
                        }
                        break;
                    }
                    case ASSIGN: {
                        Map<ClassicalState, DensityMatrix> out = new HashMap<>();
                        for (Map.Entry<ClassicalState, DensityMatrix> e : current.entrySet()) {
                            ClassicalState c = e.getKey().copy();
                            ShotRunner.assign(in, c, variables);
                            merge(out, c, e.getValue());
                        }
                        current = out;
                        break;
                    }
                    case WHILE: {
                        Map<ClassicalState, DensityMatrix> done = new HashMap<>();
                        Map<ClassicalState, DensityMatrix> active = current;
                        for (int k = 0; k < in.maxIterations() && !active.isEmpty(); k++) {
                            Map<ClassicalState, DensityMatrix> looping = new HashMap<>();
                            for (Map.Entry<ClassicalState, DensityMatrix> e
                                    : active.entrySet()) {
                                if (in.condition().test(e.getKey())) {
                                    looping.put(e.getKey(), e.getValue());
                                } else {
                                    merge(done, e.getKey(), e.getValue());
                                }
                            }
                            active = looping.isEmpty() ? looping : run(in.body(), looping);
                        }
                        for (Map.Entry<ClassicalState, DensityMatrix> e : active.entrySet()) {
                            merge(done, e.getKey(), e.getValue());
                        }
                        current = done;
                        break;
                    }
                    default: {
                        Map<ClassicalState, DensityMatrix> taken = new HashMap<>();
                        Map<ClassicalState, DensityMatrix> kept = new HashMap<>();
                        for (Map.Entry<ClassicalState, DensityMatrix> e : current.entrySet()) {
                            ClassicalState c = e.getKey();
                            boolean holds = in.kind() == Instruction.Kind.IF_BIT
                                    ? c.bit(in.clbit()) == (in.value() == 1)
                                    : in.condition().test(c);
                            (holds ? taken : kept).put(c, e.getValue());
                        }
                        Map<ClassicalState, DensityMatrix> out = new HashMap<>();
                        Map<ClassicalState, DensityMatrix> a = taken.isEmpty() ? taken
                                : run(in.body(), taken);
                        Map<ClassicalState, DensityMatrix> b = kept.isEmpty()
                                || in.otherwise().isEmpty() ? kept : run(in.otherwise(), kept);
                        for (Map.Entry<ClassicalState, DensityMatrix> e : a.entrySet()) {
                            merge(out, e.getKey(), e.getValue());
                        }
                        for (Map.Entry<ClassicalState, DensityMatrix> e : b.entrySet()) {
                            merge(out, e.getKey(), e.getValue());
                        }
                        current = out;
                        break;
                    }
                }
            }
            return current;
        }
    }

    private static final double[] ZERO_PROJECTOR = {1, 0, 0, 0, 0, 0, 0, 0};
    private static final double[] ONE_PROJECTOR = {0, 0, 0, 0, 0, 0, 1, 0};

    private static Map<ClassicalState, DensityMatrix> measureBranches(
            Map<ClassicalState, DensityMatrix> current, Instruction in, NoiseModel model,
            int maxEntries) {
        int q = in.targets()[0];
        double e0 = model.readoutP1Given0(q);
        double e1 = model.readoutP0Given1(q);
        Map<ClassicalState, DensityMatrix> out = new HashMap<>();
        for (Map.Entry<ClassicalState, DensityMatrix> e : current.entrySet()) {
            DensityMatrix rho = e.getValue();
            DensityMatrix one = rho.copy();
            rho.project(q, ZERO_PROJECTOR);
            one.project(q, ONE_PROJECTOR);
            ClassicalState key0 = e.getKey().copy();
            key0.setBit(in.clbit(), false);
            ClassicalState key1 = e.getKey().copy();
            key1.setBit(in.clbit(), true);
            // Read 0: (1 - e0) of the |0> part and e1 of the |1> part; read 1: the rest.
            DensityMatrix read0 = rho.copy().scale(1 - e0).addScaled(e1, one);
            DensityMatrix read1 = one.scale(1 - e1).addScaled(e0, rho);
            merge(out, key0, read0);
            merge(out, key1, read1);
            if (out.size() > maxEntries) {
                throw new IllegalStateException("more than " + maxEntries + " classical values"
                        + " to track");
            }
        }
        return out;
    }

    private static void merge(Map<ClassicalState, DensityMatrix> out, ClassicalState key,
            DensityMatrix rho) {
        if (!(rho.trace() > 1e-16)) {
            return;
        }
        DensityMatrix old = out.get(key);
        if (old == null) {
            out.put(key, rho);
        } else {
            old.addScaled(1, rho);
        }
    }

    /**
     * Applies the confusion matrix {@code [[1-e0, e1], [e0, 1-e1]]} to bit {@code c} of a
     * distribution, in place.
     */
    static void confuse(double[] p, int c, double e0, double e1) {
        int bit = 1 << c;
        for (int i = 0; i < p.length; i++) {
            if ((i & bit) == 0) {
                double p0 = p[i];
                double p1 = p[i | bit];
                p[i] = (1 - e0) * p0 + e1 * p1;
                p[i | bit] = e0 * p0 + (1 - e1) * p1;
            }
        }
    }

    @Override
    public Tally trajectories(Circuit circuit, NoiseModel model, long first, int shots,
            long seed, int threads, Precision precision) {
        int width = circuit.clbits();
        Compiled compiled = new Compiled(circuit.instructions(), model);
        long[] keys = Heap.allocate(8L * shots, "the outcomes of " + shots + " trajectories",
                () -> new long[shots]);
        int workers = Math.min(threads, shots);
        int kernelThreads = Math.max(1, threads / workers);
        int n = circuit.qubits();
        Parallel.forRange(workers, shots, workers > 1, (from, to) -> {
            StateVector sv = StateVector.zero(n, precision).setThreads(kernelThreads);
            Amplitudes a = Bridge.states().store(sv);
            ClassicalState classical = new ClassicalState(width, circuit.variables().size());
            Trajectory backend = new Trajectory(a, compiled, kernelThreads);
            for (long t = from; t < to; t++) {
                a.clear();
                a.set(0, 1, 0);
                classical.clear();
                backend.rng = trajectoryRng(seed, first + t);
                ShotRunner.run(circuit.instructions(), 0, classical, circuit.variables(),
                        backend);
                long key = 0;
                for (int c = 0; c < width; c++) {
                    if (classical.bit(c)) {
                        key |= 1L << c;
                    }
                }
                keys[(int) t] = key;
            }
        });
        return Tally.fromShots(width, keys);
    }

    @Override
    public StateVector trajectoryState(Circuit circuit, NoiseModel model, long seed, int threads,
            Precision precision) {
        StateVector sv = StateVector.zero(circuit.qubits(), precision).setThreads(threads);
        Trajectory backend = new Trajectory(Bridge.states().store(sv),
                new Compiled(circuit.instructions(), model), threads);
        backend.rng = trajectoryRng(seed, 0);
        ShotRunner.run(circuit.instructions(), 0,
                new ClassicalState(circuit.clbits(), circuit.variables().size()),
                circuit.variables(), backend);
        return sv;
    }

    /** The generator of trajectory {@code t}: SplitMix64 outputs of (seed, t) as its state. */
    static UniformRandomProvider trajectoryRng(long seed, long t) {
        long s0 = mix(seed + 0x9E3779B97F4A7C15L * (2 * t + 1));
        long s1 = mix(s0 ^ seed + 0x9E3779B97F4A7C15L * (2 * t + 2));
        return RandomSource.XO_RO_SHI_RO_128_PP.create(new long[] {s0, s1});
    }

    /** The SplitMix64 finaliser (Steele, Lea and Flood 2014, doi:10.1145/2714064.2660195). */
    private static long mix(long z) {
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }

    /**
     * The kernel forms of a circuit's gates and the noise after each, prepared once and shared
     * read-only by all trajectories; keyed by instruction identity, nested blocks included.
     */
    private static final class Compiled {
        final Map<Instruction, GateOp> plans = new IdentityHashMap<>();
        final Map<Instruction, NoiseModel.Placed[]> noise = new IdentityHashMap<>();
        final NoiseModel model;

        Compiled(List<Instruction> list, NoiseModel model) {
            this.model = model;
            add(list);
        }

        private void add(List<Instruction> list) {
            for (Instruction in : list) {
                if (in.kind() == Instruction.Kind.DELAY) {
                    noise.put(in, model.noiseDuring(in).toArray(new NoiseModel.Placed[0]));
                } else if (in.kind() == Instruction.Kind.GATE) {
                    if (!in.isDynamic()) {
                        plans.put(in, GateOp.of(DensityMatrix.raw(in.operator()), in.targets(),
                                in.controls()));
                    }
                    noise.put(in, model.noiseAfter(in).toArray(new NoiseModel.Placed[0]));
                }
                add(in.body());
                add(in.otherwise());
            }
        }
    }

    /** One trajectory's quantum side: its state, its generator, the shared compiled gates. */
    private static final class Trajectory implements ShotRunner.Backend {
        private final Amplitudes a;
        private final Compiled compiled;
        private final int threads;
        private final double[] work = new double[32];
        UniformRandomProvider rng;

        Trajectory(Amplitudes a, Compiled compiled, int threads) {
            this.a = a;
            this.compiled = compiled;
            this.threads = threads;
        }

        @Override
        public void gates(List<Instruction> list, int from, int to) {
            for (int i = from; i < to; i++) {
                Instruction in = list.get(i);
                Frame.apply(a, List.of(compiled.plans.get(in)), threads);
                noise(in);
            }
        }

        @Override
        public void gate(Instruction gate, double[] angles) {
            Frame.apply(a, List.of(GateOp.of(DensityMatrix.raw(gate.gate().operator(angles)),
                    gate.targets(), gate.controls())), threads);
            noise(gate);
        }

        private void noise(Instruction in) {
            for (NoiseModel.Placed p : compiled.noise.get(in)) {
                kraus(a, p.channel(), p.qubits(), rng, threads, work);
            }
        }

        @Override
        public void delay(Instruction delay) {
            noise(delay);
        }

        @Override
        public boolean measure(Instruction measure) {
            int q = measure.targets()[0];
            int outcome = Measurement.measure(a, q, rng.nextDouble(), threads);
            double u = rng.nextDouble();
            if (outcome == 0 ? u < compiled.model.readoutP1Given0(q)
                    : u < compiled.model.readoutP0Given1(q)) {
                outcome ^= 1;
            }
            return outcome == 1;
        }

        @Override
        public void reset(Instruction reset) {
            Measurement.reset(a, reset.targets()[0], rng.nextDouble(), threads);
        }
    }

    /**
     * Applies one Kraus branch of {@code ch}, chosen with probability {@code Tr(K^dagger K R)}
     * where {@code R} is the reduced density matrix of the channel's qubits.
     */
    static void kraus(Amplitudes a, Channel ch, int[] qubits, UniformRandomProvider rng,
            int threads, double[] work) {
        double[][] raw = ch.rawKraus();
        double[] p = ch.fixedProbabilities();
        if (p == null) {
            p = branchProbabilities(a, ch, qubits, work);
        }
        double total = 0;
        for (double x : p) {
            total += x;
        }
        double target = rng.nextDouble() * total;
        int chosen = -1;
        double acc = 0;
        for (int b = 0; b < p.length; b++) {
            if (p[b] > 0) {
                chosen = b;
                acc += p[b];
                if (target < acc) {
                    break;
                }
            }
        }
        if (ch.scalarBranches()[chosen]) {
            // K = c I: after normalisation only a global phase is left.
            return;
        }
        double s = 1 / Math.sqrt(p[chosen]);
        double[] m = raw[chosen].clone();
        for (int i = 0; i < m.length; i++) {
            m[i] *= s;
        }
        Frame.apply(a, List.of(new GateOp(GateOp.DENSE, qubits.clone(), NONE, m, null)),
                threads);
    }

    /**
     * Returns {@code Tr(K_k^dagger K_k R)} for each branch, where {@code R} is the reduced
     * density matrix of the channel's qubits.
     */
    private static double[] branchProbabilities(Amplitudes a, Channel ch, int[] qubits,
            double[] work) {
        int d = 1 << qubits.length;
        ReducedStates.of(a, qubits, work);
        double[][] w = ch.weights();
        double[] p = new double[w.length];
        for (int b = 0; b < w.length; b++) {
            // Tr(W R) = sum_{x,y} W[x][y] R[y][x], real part.
            double tr = 0;
            for (int x = 0; x < d; x++) {
                for (int y = 0; y < d; y++) {
                    tr += w[b][2 * (x * d + y)] * work[2 * (y * d + x)]
                            - w[b][2 * (x * d + y) + 1] * work[2 * (y * d + x) + 1];
                }
            }
            p[b] = Math.max(0, tr);
        }
        return p;
    }
}
