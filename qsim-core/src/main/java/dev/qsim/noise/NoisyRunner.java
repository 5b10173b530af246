package dev.qsim.noise;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.Operator;
import dev.qsim.StateVector;
import dev.qsim.Tally;
import dev.qsim.kernel.Args;
import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.Internals;
import dev.qsim.kernel.Kernels;
import dev.qsim.kernel.Parallel;

/**
 * Runs an ideal circuit under a {@link NoiseModel}, either exactly on a {@link DensityMatrix}
 * or by Monte Carlo wave-function trajectories on state vectors. Immutable and thread-safe;
 * results depend only on the seed, never on the thread count.
 *
 * <p><b>Density-matrix runs</b> ({@link #densityMatrix}, {@link #probabilities}, {@link #run})
 * apply each gate, then its noise; a reset is the channel with Kraus operators
 * {@code |0><0|, |0><1|}. They take circuits whose measurements can be deferred to the end:
 * no conditioned blocks, and no gate or reset on a qubit after it is measured. The outcome
 * distribution is read from the diagonal of {@code rho}, then each measured bit passes
 * through its qubit's readout confusion matrix.
 *
 * <p><b>Trajectory runs</b> ({@link #runTrajectories}) take any circuit. Each trajectory
 * starts from {@code |0...0>}; after each gate, for each channel, one Kraus branch {@code k}
 * is chosen with probability {@code ||K_k psi||^2} and {@code psi -> K_k psi / ||K_k psi||}
 * (Dalibard, Castin and Mølmer 1992, "Wave-function approach to dissipative processes in
 * quantum optics", Phys. Rev. Lett. 68, 580, doi:10.1103/PhysRevLett.68.580; the
 * quantum-trajectory unravelling of a Kraus map, Nielsen and Chuang 2010, §8.2.3). Averaged
 * over trajectories this reproduces the density-matrix distribution. Trajectory {@code t}
 * draws from its own generator seeded from {@code (seed, t)}, so the tally does not depend on
 * how trajectories are spread over threads.
 *
 * @since 0.1
 */
public final class NoisyRunner {
    /** The reset channel {@code rho -> |0><0| rho |0><0| + |0><1| rho |1><0|}. */
    static final Channel RESET = Channel.of(
            Operator.of(new Complex[][] {{Complex.ONE, Complex.ZERO}, {Complex.ZERO, Complex.ZERO}}),
            Operator.of(new Complex[][] {{Complex.ZERO, Complex.ONE}, {Complex.ZERO, Complex.ZERO}}));

    /** The largest classical register for exact outcome distributions. */
    public static final int MAX_EXACT_CLBITS = 24;

    private static final int[] NONE = new int[0];

    private final long seed;
    private final int threads;

    private NoisyRunner(long seed, int threads) {
        this.seed = seed;
        this.threads = threads;
    }

    /**
     * Returns a runner with the given seed, using all available processors.
     *
     * @param seed the seed of every random choice
     * @return the runner
     */
    public static NoisyRunner seeded(long seed) {
        return new NoisyRunner(seed,
                Math.max(1, Math.min(256, Runtime.getRuntime().availableProcessors())));
    }

    /**
     * Returns a runner like this one with another thread count.
     *
     * @param threads 1 to 256
     * @return the runner
     * @throws IllegalArgumentException if {@code threads} is out of range
     */
    public NoisyRunner withThreads(int threads) {
        Args.requireThreads(threads);
        return new NoisyRunner(seed, threads);
    }

    /**
     * Returns the seed.
     *
     * @return the seed
     */
    public long seed() {
        return seed;
    }

    /**
     * Returns the thread count.
     *
     * @return the threads
     */
    public int threads() {
        return threads;
    }

    /**
     * Returns the density matrix after all gates, their noise and the resets of the circuit,
     * before its (terminal) measurements.
     *
     * @param circuit a circuit with deferrable measurements, at most
     *     {@value DensityMatrix#MAX_QUBITS} qubits
     * @param model the noise model
     * @return the density matrix
     * @throws IllegalArgumentException if the circuit has a conditioned block, a gate or
     *     reset after a measurement of one of its qubits, or a rule's channel does not fit a
     *     gate
     * @throws IllegalStateException if the heap cannot hold the density matrix
     */
    public DensityMatrix densityMatrix(Circuit circuit, NoiseModel model) {
        Objects.requireNonNull(circuit, "circuit");
        Objects.requireNonNull(model, "model");
        requireDeferrable(circuit);
        DensityMatrix rho = DensityMatrix.zero(circuit.qubits()).withThreads(threads);
        for (Instruction in : circuit.instructions()) {
            if (in.kind() == Instruction.Kind.GATE) {
                rho.gate(in);
                for (NoiseModel.Placed p : model.noiseAfter(in)) {
                    rho.channel(p.channel(), p.qubits());
                }
            } else if (in.kind() == Instruction.Kind.RESET) {
                rho.channel(RESET, in.targets());
            }
        }
        return rho;
    }

    /**
     * Returns the exact probability of each value of the classical register, readout error
     * included; bits never written read 0.
     *
     * @param circuit a circuit as for {@link #densityMatrix}, with at most
     *     {@value #MAX_EXACT_CLBITS} classical bits
     * @param model the noise model
     * @return a new array of length {@code 2^clbits}; index {@code v} is the register value
     *     with clbit {@code j} as bit {@code j}
     * @throws IllegalArgumentException as for {@link #densityMatrix}, or if there are too
     *     many classical bits
     * @throws IllegalStateException if the heap cannot hold the density matrix
     */
    public double[] probabilities(Circuit circuit, NoiseModel model) {
        Objects.requireNonNull(circuit, "circuit");
        if (circuit.clbits() > MAX_EXACT_CLBITS) {
            throw new IllegalArgumentException("the circuit has " + circuit.clbits()
                    + " classical bits; exact distributions allow at most " + MAX_EXACT_CLBITS);
        }
        DensityMatrix rho = densityMatrix(circuit, model);
        int width = circuit.clbits();
        int[] writer = new int[width];
        Arrays.fill(writer, -1);
        for (Instruction in : circuit.instructions()) {
            if (in.kind() == Instruction.Kind.MEASURE) {
                writer[in.clbit()] = in.targets()[0];
            }
        }
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
                confuse(out, c, model.readoutP1Given0(writer[c]), model.readoutP0Given1(writer[c]));
            }
        }
        return out;
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

    /**
     * Draws a tally of the classical register from the exact distribution of
     * {@link #probabilities}, with the generator seeded by {@link #seed()}.
     *
     * @param circuit a circuit as for {@link #probabilities}
     * @param model the noise model
     * @param shots the number of shots, at least 1
     * @return the tally, of width {@code circuit.clbits()}
     * @throws IllegalArgumentException as for {@link #probabilities}, or if {@code shots < 1}
     * @throws IllegalStateException if the heap cannot hold the density matrix
     */
    public Tally run(Circuit circuit, NoiseModel model, int shots) {
        Args.requirePositiveShots(shots);
        double[] p = probabilities(circuit, model);
        return Sampling.tally(p, circuit.clbits(), shots, RandomSource.XO_RO_SHI_RO_128_PP.create(seed));
    }

    /**
     * Runs {@code trajectories} Monte Carlo wave-function trajectories, one shot each, and
     * tallies their classical registers (readout error included). Measurements, resets and
     * conditioned blocks act as in {@link dev.qsim.Simulator}.
     *
     * @param circuit any circuit with at most 63 classical bits
     * @param model the noise model
     * @param trajectories the number of trajectories (shots), at least 1
     * @return the tally, of width {@code circuit.clbits()}
     * @throws IllegalArgumentException if {@code trajectories < 1}, the register is wider
     *     than 63 bits, or a rule's channel does not fit a gate
     * @throws IllegalStateException if the heap cannot hold the state vectors
     */
    public Tally runTrajectories(Circuit circuit, NoiseModel model, int trajectories) {
        Objects.requireNonNull(circuit, "circuit");
        Objects.requireNonNull(model, "model");
        Args.requirePositiveShots(trajectories);
        int width = circuit.clbits();
        if (width > 63) {
            throw new IllegalArgumentException("the circuit has " + width
                    + " classical bits; trajectory runs allow at most 63");
        }
        Step[] program = compile(circuit.instructions(), model);
        long[] keys = new long[trajectories];
        int workers = Math.min(threads, trajectories);
        int kernelThreads = Math.max(1, threads / workers);
        int n = circuit.qubits();
        Parallel.forRange(workers, trajectories, workers > 1, (from, to) -> {
            StateVector sv = StateVector.zero(n).withThreads(kernelThreads);
            Amplitudes a = Internals.access().amplitudes(sv);
            boolean[] reg = new boolean[width];
            double[] work = new double[32];
            for (long t = from; t < to; t++) {
                UniformRandomProvider rng = trajectoryRng(seed, t);
                a.clear();
                a.set(0, 1, 0);
                Arrays.fill(reg, false);
                execute(a, program, reg, rng, kernelThreads, work);
                long key = 0;
                for (int c = 0; c < width; c++) {
                    if (reg[c]) {
                        key |= 1L << c;
                    }
                }
                keys[(int) t] = key;
            }
        });
        Map<Long, Long> counts = new HashMap<>();
        for (long k : keys) {
            counts.merge(k, 1L, Long::sum);
        }
        Map<String, Long> text = new HashMap<>();
        for (Map.Entry<Long, Long> e : counts.entrySet()) {
            text.put(Sampling.bits(e.getKey(), width), e.getValue());
        }
        return Tally.of(width, text);
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

    private static void requireDeferrable(Circuit circuit) {
        boolean[] measured = new boolean[circuit.qubits()];
        for (Instruction in : circuit.instructions()) {
            switch (in.kind()) {
                case MEASURE:
                    measured[in.targets()[0]] = true;
                    break;
                case IF_BIT:
                    throw new IllegalArgumentException("the density-matrix engine does not run "
                            + "conditioned blocks (on clbit " + in.clbit()
                            + "); use runTrajectories");
                default:
                    for (int q : NoiseModel.qubitsOf(in)) {
                        if (measured[q]) {
                            throw new IllegalArgumentException("'" + in.name() + "' acts on qubit "
                                    + q + " after it was measured; the density-matrix engine "
                                    + "needs measurements at the end (use runTrajectories)");
                        }
                    }
                    break;
            }
        }
    }

    /** One compiled step of a trajectory program. */
    private static final class Step {
        final Instruction.Kind kind;
        final Instruction gate;
        final NoiseModel.Placed[] noise;
        final int qubit;
        final int clbit;
        final int value;
        final double e0;
        final double e1;
        final Step[] body;

        Step(Instruction.Kind kind, Instruction gate, NoiseModel.Placed[] noise, int qubit,
                int clbit, int value, double e0, double e1, Step[] body) {
            this.kind = kind;
            this.gate = gate;
            this.noise = noise;
            this.qubit = qubit;
            this.clbit = clbit;
            this.value = value;
            this.e0 = e0;
            this.e1 = e1;
            this.body = body;
        }
    }

    private static Step[] compile(List<Instruction> list, NoiseModel model) {
        List<Step> out = new ArrayList<>();
        for (Instruction in : list) {
            switch (in.kind()) {
                case GATE:
                    out.add(new Step(in.kind(), in,
                            model.noiseAfter(in).toArray(new NoiseModel.Placed[0]), -1, -1, -1, 0,
                            0, null));
                    break;
                case MEASURE: {
                    int q = in.targets()[0];
                    out.add(new Step(in.kind(), null, null, q, in.clbit(), -1,
                            model.readoutP1Given0(q), model.readoutP0Given1(q), null));
                    break;
                }
                case RESET:
                    out.add(new Step(in.kind(), null, null, in.targets()[0], -1, -1, 0, 0, null));
                    break;
                default:
                    out.add(new Step(in.kind(), null, null, -1, in.clbit(), in.value(), 0, 0,
                            compile(in.body(), model)));
                    break;
            }
        }
        return out.toArray(new Step[0]);
    }

    private static void execute(Amplitudes a, Step[] program, boolean[] reg,
            UniformRandomProvider rng, int threads, double[] work) {
        Internals.Access access = Internals.access();
        for (Step s : program) {
            switch (s.kind) {
                case GATE:
                    access.applyGate(a, s.gate, threads);
                    for (NoiseModel.Placed p : s.noise) {
                        kraus(a, p.channel(), p.qubits(), rng, threads, work);
                    }
                    break;
                case MEASURE: {
                    int outcome = access.measure(a, s.qubit, rng, threads);
                    double u = rng.nextDouble();
                    if (outcome == 0 ? u < s.e0 : u < s.e1) {
                        outcome ^= 1;
                    }
                    reg[s.clbit] = outcome == 1;
                    break;
                }
                case RESET:
                    if (access.measure(a, s.qubit, rng, threads) == 1) {
                        Kernels.monomial(a, new int[] {s.qubit}, NONE, new int[] {1, 0},
                                new double[] {1, 0, 1, 0}, threads);
                    }
                    break;
                default:
                    if (reg[s.clbit] == (s.value == 1)) {
                        execute(a, s.body, reg, rng, threads, work);
                    }
                    break;
            }
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
        Kernels.dense(a, qubits.clone(), NONE, m, threads);
    }

    /**
     * Returns {@code Tr(K_k^dagger K_k R)} for each branch, where {@code R} is the reduced
     * density matrix of the channel's qubits, accumulated in one pass over the amplitudes.
     */
    private static double[] branchProbabilities(Amplitudes a, Channel ch, int[] qubits,
            double[] work) {
        int k = qubits.length;
        int d = 1 << k;
        // R[x][y] = sum over the other qubits of psi(x) conj(psi(y)), in work[2*(x*d+y)].
        Arrays.fill(work, 0, 2 * d * d, 0.0);
        double[][] chunks = a.chunks();
        if (k == 1 && chunks.length == 1) {
            oneQubitReduced(chunks[0], a.qubits(), qubits[0], work);
        } else {
            generalReduced(a, qubits, work);
        }
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

    /** The 2 x 2 reduced density matrix of qubit q of a single-chunk state, into work. */
    private static void oneQubitReduced(double[] c, int n, int q, double[] work) {
        int stride = 1 << q;
        int dim = 1 << n;
        double r00 = 0;
        double r11 = 0;
        double r01re = 0;
        double r01im = 0;
        for (int base = 0; base < dim; base += 2 * stride) {
            for (int i0 = base; i0 < base + stride; i0++) {
                int o0 = i0 << 1;
                int o1 = (i0 + stride) << 1;
                double a0 = c[o0];
                double b0 = c[o0 + 1];
                double a1 = c[o1];
                double b1 = c[o1 + 1];
                r00 += a0 * a0 + b0 * b0;
                r11 += a1 * a1 + b1 * b1;
                // psi0 conj(psi1)
                r01re += a0 * a1 + b0 * b1;
                r01im += b0 * a1 - a0 * b1;
            }
        }
        work[0] = r00;
        work[2] = r01re;
        work[3] = r01im;
        work[4] = r01re;
        work[5] = -r01im;
        work[6] = r11;
    }

    /** The reduced density matrix of any qubits of any state, into work. */
    private static void generalReduced(Amplitudes a, int[] qubits, double[] work) {
        int k = qubits.length;
        int d = 1 << k;
        long[] offset = new long[d];
        for (int x = 0; x < d; x++) {
            long o = 0;
            for (int j = 0; j < k; j++) {
                o |= (long) ((x >>> j) & 1) << qubits[j];
            }
            offset[x] = o;
        }
        int[] sorted = qubits.clone();
        Arrays.sort(sorted);
        double[][] chunks = a.chunks();
        int cl = a.chunkLog();
        long cm = (1L << cl) - 1;
        double[] vr = new double[d];
        double[] vi = new double[d];
        long count = 1L << (a.qubits() - k);
        for (long j = 0; j < count; j++) {
            long i = j;
            for (int s : sorted) {
                i = ((i >>> s) << (s + 1)) | (i & ((1L << s) - 1));
            }
            for (int x = 0; x < d; x++) {
                long idx = i | offset[x];
                double[] c = chunks[(int) (idx >>> cl)];
                int o = (int) (idx & cm) << 1;
                vr[x] = c[o];
                vi[x] = c[o + 1];
            }
            for (int x = 0; x < d; x++) {
                double xr = vr[x];
                double xi = vi[x];
                for (int y = 0; y < d; y++) {
                    double yr = vr[y];
                    double yi = -vi[y];
                    work[2 * (x * d + y)] += xr * yr - xi * yi;
                    work[2 * (x * d + y) + 1] += xr * yi + xi * yr;
                }
            }
        }
    }

    /**
     * Describes the runner by its seed and thread count.
     *
     * @return a short description
     */
    @Override
    public String toString() {
        return "NoisyRunner[seed " + seed + ", " + threads + " thread(s)]";
    }
}
