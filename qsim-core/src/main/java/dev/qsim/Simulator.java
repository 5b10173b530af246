package dev.qsim;

import java.util.Objects;
import java.util.OptionalInt;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.internal.Bridge;
import dev.qsim.internal.Checks;
import dev.qsim.internal.ClassicalState;
import dev.qsim.kernel.Lanes;
import dev.qsim.kernel.Parallel;
import dev.qsim.mps.MatrixProductState;
import dev.qsim.noise.DensityMatrix;
import dev.qsim.noise.NoiseModel;
import dev.qsim.stabilizer.StabilizerTableau;

/**
 * The one way to run a circuit, whatever the engine: an immutable configuration (seed,
 * threads, engine, noise, precision, fusion) with the same shape for every engine,
 * {@code Simulator.seeded(seed).withThreads(t).run(circuit, shots)}. Each call starts from the
 * seed, so equal calls give equal results, whatever the thread count. Thread-safe.
 *
 * <p>Engines ({@link Engine}): the state vector ({@link Engine#AMPLITUDES}), the stabilizer
 * tableau ({@link Engine#TABLEAU}, Clifford circuits of thousands of qubits), the matrix product
 * state ({@link Engine#MATRIX_PRODUCT}, wide circuits with little entanglement), and for noisy
 * runs the density matrix ({@link Engine#DENSITY_MATRIX}, exact) or Monte Carlo wave-function
 * trajectories ({@link Engine#TRAJECTORIES}, any circuit). Noise is a setting of the run
 * ({@link #withNoise(NoiseModel)}); the engine is another ({@link #withEngine(Engine)}), by
 * default {@link Engine#CHEAPEST}, which picks per circuit and says why
 * ({@link #explain(Circuit, int)}).
 *
 * <p>How shots are taken on the state vector: a circuit whose measurements could all be moved
 * to its end ({@link Circuit#measuresAtEnd()}) is simulated once and its shots are drawn from
 * the final state in one pass. Any other circuit is simulated shot by shot, with the gates
 * before its first measurement, reset or condition simulated once and copied for each shot.
 * Randomness: the XoRoShiRo128++ generator of Commons RNG (Blackman and Vigna, "Scrambled
 * linear pseudorandom number generators", ACM TOMS 47 (2021), doi:10.1145/3460772), seeded with
 * the simulator's seed. Different engines draw their random numbers differently, so one seed
 * gives equally distributed but different tallies on two engines.
 *
 * @since 0.1
 */
public final class Simulator implements CircuitRunner {
    /**
     * Which engine runs a circuit.
     *
     * @since 0.1
     */
    public enum Engine {
        /**
         * Whichever engine below the rules of {@link Simulator#explain(Circuit, int)} expect to
         * be cheapest for the circuit, the noise and the shots.
         */
        CHEAPEST,
        /** The state vector: 2^n amplitudes, any gate, no noise. */
        AMPLITUDES,
        /**
         * The stabilizer tableau (Aaronson and Gottesman 2004): Clifford gates, measurements,
         * resets and conditions on thousands of qubits, no noise. A circuit with a non-Clifford
         * gate is refused, naming the gate and its position.
         */
        TABLEAU,
        /**
         * The density matrix: the exact distribution of a noisy circuit whose measurements come
         * last, at {@code 16·4^n} bytes ({@link DensityMatrix#MAX_QUBITS} qubits at most).
         */
        DENSITY_MATRIX,
        /** Monte Carlo wave-function trajectories of a noisy circuit: one per shot, any circuit. */
        TRAJECTORIES,
        /**
         * The matrix product state ({@link MatrixProductState}): any ideal circuit on up to
         * {@link Circuit#MAX_QUBITS} qubits, in memory that grows with the entanglement; bonds
         * are truncated to {@link #withBondLimit(int)} and {@link #withTruncation(double)}, and
         * {@link #matrixProductStateAfter(Circuit)} says how much accuracy that gave up.
         */
        MATRIX_PRODUCT
    }

    /**
     * An engine chosen for a circuit, with the reason in words.
     *
     * @param engine the engine, never {@link Engine#CHEAPEST}
     * @param reason why this engine, such as {@code "gate t at instruction 4 is not Clifford"}
     * @since 0.1
     */
    public record Choice(Engine engine, String reason) {
        /**
         * Checks the fields.
         *
         * @param engine the engine
         * @param reason the reason
         */
        public Choice {
            Objects.requireNonNull(engine, "engine");
            Objects.requireNonNull(reason, "reason");
        }

        /**
         * Returns {@code "ENGINE: reason"}.
         *
         * @return the text
         */
        @Override
        public String toString() {
            return engine + ": " + reason;
        }
    }

    /**
     * A predicted distribution of a circuit's classical register, exact or estimated.
     *
     * @param probabilities {@code 2^clbits} probabilities, index = register value (copied)
     * @param samples 0 for an exact prediction, else the shots it was estimated from
     * @param method how it was made, in words
     * @since 0.1
     */
    public record Prediction(double[] probabilities, long samples, String method) {
        /**
         * Copies the probabilities and checks the fields.
         *
         * @param probabilities the probabilities
         * @param samples the samples
         * @param method the method
         */
        public Prediction {
            probabilities = Objects.requireNonNull(probabilities, "probabilities").clone();
            Objects.requireNonNull(method, "method");
        }

        /**
         * Returns a copy of the probabilities.
         *
         * @return {@code 2^clbits} probabilities
         */
        @Override
        public double[] probabilities() {
            return probabilities.clone();
        }

        /**
         * Tells whether the prediction is exact.
         *
         * @return {@code samples() == 0}
         */
        public boolean exact() {
            return samples == 0;
        }
    }

    /**
     * The qubit count from which {@link Engine#CHEAPEST} runs a noiseless Clifford circuit on
     * the tableau. A state-vector gate touches 2^n amplitudes; a tableau gate touches about
     * n/32 words per qubit and a measurement O(n²/64) words (Aaronson and Gottesman 2004,
     * Phys. Rev. A 70, 052328), so from 16 qubits on the tableau is the cheaper for any mix of
     * gates and measurements, and every circuit too large for a state vector is above this.
     */
    public static final int TABLEAU_FROM_QUBITS = 16;

    /**
     * The most qubits for which {@link Engine#CHEAPEST} runs a noisy circuit on the density
     * matrix (16 MiB at 10 qubits): a density-matrix gate costs about {@code 4^n} amplitude
     * updates, a trajectory's {@code 2^n} per shot, so above this the density matrix wins only
     * for very many shots, and it also needs the shots to exceed {@code 2^n / 4}.
     */
    public static final int DENSITY_MATRIX_UP_TO_QUBITS = 10;

    private final long seed;
    private final int threads;
    private final boolean fusion;
    private final Engine engine;
    private final NoiseModel noise;
    private final Precision precision;
    private final int bondLimit;
    private final double truncation;

    private Simulator(long seed, int threads, boolean fusion, Engine engine, NoiseModel noise,
            Precision precision, int bondLimit, double truncation) {
        this.bondLimit = bondLimit;
        this.truncation = truncation;
        this.seed = seed;
        this.threads = threads;
        this.fusion = fusion;
        this.engine = engine;
        this.noise = noise;
        this.precision = precision;
    }

    /**
     * Returns a simulator with the given seed, using every available processor, the cheapest
     * engine, no noise, double precision, gate fusion, and the matrix-product defaults (bond
     * limit {@value MatrixProductState#DEFAULT_BOND_LIMIT}, truncation
     * {@value MatrixProductState#DEFAULT_TRUNCATION}).
     *
     * @param seed the seed of every run
     * @return the simulator
     */
    public static Simulator seeded(long seed) {
        return new Simulator(seed, Parallel.defaultThreads(), true, Engine.CHEAPEST,
                NoiseModel.none(), Precision.DOUBLE, MatrixProductState.DEFAULT_BOND_LIMIT,
                MatrixProductState.DEFAULT_TRUNCATION);
    }

    /**
     * Returns which loops run over amplitudes in this JVM, in one line: {@code "vector (...)"}
     * with the vector size and lanes, when the JVM was started with
     * {@code --add-modules jdk.incubator.vector} (the incubating Vector API) and the vector loops
     * passed their check on this JDK; otherwise {@code "scalar (...)"} with the reason. Both
     * give the same results (to the bit for gates in double precision). The system property
     * {@code qsim.vector=off} forces the scalar loops; {@code qsim.vector.quiet=true} hides the
     * one line printed to standard error when the scalar loops run for want of the module. The
     * choice is made once, at the first state the JVM allocates.
     *
     * @return the description
     * @throws IllegalArgumentException if the property {@code qsim.vector} is set to anything
     *     but {@code auto} or {@code off}
     * @since 0.1
     */
    public static String kernels() {
        return Lanes.describe();
    }

    /**
     * Returns a simulator like this one with another seed, every other setting kept: for a sweep
     * or a batch of independent runs of one configuration (each run of a simulator starts from
     * its seed, so repeating a run with one seed repeats its shots exactly).
     *
     * @param seed the seed of every run
     * @return the new simulator
     * @since 0.1
     */
    public Simulator withSeed(long seed) {
        return new Simulator(seed, threads, fusion, engine, noise, precision, bondLimit,
                truncation);
    }

    /**
     * Returns a simulator like this one with another thread count. Results do not depend on it.
     *
     * @param threads at least 1 (at most 256)
     * @return the new simulator
     * @throws IllegalArgumentException if {@code threads} is out of range
     */
    public Simulator withThreads(int threads) {
        Checks.requireThreads(threads);
        return new Simulator(seed, threads, fusion, engine, noise, precision, bondLimit,
                truncation);
    }

    /**
     * Returns a simulator like this one with gate fusion on or off. With fusion (the default),
     * runs of gates on a few qubits are merged into one dense operator before the state-vector
     * engine applies them, which streams the state fewer times; results agree with unfused runs
     * to rounding (about 1e-15 per amplitude), and are still the same for the same seed whatever
     * the thread count. Circuits of fewer than 16 qubits are never fused: their state sits in
     * cache and the fusion pass itself would cost more than it saves.
     *
     * @param on whether to fuse gates
     * @return the new simulator
     */
    public Simulator withFusion(boolean on) {
        return new Simulator(seed, threads, on, engine, noise, precision, bondLimit, truncation);
    }

    /**
     * Returns a simulator like this one that runs circuits on the given engine.
     *
     * @param engine the engine, or {@link Engine#CHEAPEST} to choose per circuit
     * @return the new simulator
     */
    public Simulator withEngine(Engine engine) {
        Objects.requireNonNull(engine, "engine");
        return new Simulator(seed, threads, fusion, engine, noise, precision, bondLimit,
                truncation);
    }

    /**
     * Returns a simulator like this one that runs circuits under a noise model: each gate is
     * followed by the model's channel for it, each measured bit passes through the model's
     * readout error. {@link NoiseModel#none()} runs ideal circuits.
     *
     * @param model the noise model
     * @return the new simulator
     */
    public Simulator withNoise(NoiseModel model) {
        Objects.requireNonNull(model, "model");
        return new Simulator(seed, threads, fusion, engine, model, precision, bondLimit,
                truncation);
    }

    /**
     * Returns a simulator like this one whose state vectors store amplitudes in the given
     * precision. {@link Precision#SINGLE} halves the memory (31 qubits in 16 GiB) at about
     * seven significant digits per amplitude; tallies for a seed can differ from double
     * precision's where a sampled uniform falls within rounding of a cumulative probability.
     * The tableau is exact either way; states it returns are converted. Noisy runs are in
     * double precision.
     *
     * @param precision the storage precision
     * @return the new simulator
     */
    public Simulator withPrecision(Precision precision) {
        Objects.requireNonNull(precision, "precision");
        return new Simulator(seed, threads, fusion, engine, noise, precision, bondLimit,
                truncation);
    }

    /**
     * Returns a simulator like this one whose matrix product states keep at most {@code limit}
     * Schmidt values across any bond ({@link Engine#MATRIX_PRODUCT}; other engines ignore it).
     * A two-qubit gate then costs at most an SVD of a {@code 2·limit} square matrix.
     *
     * @param limit from 1 to {@value MatrixProductState#MAX_BOND_LIMIT}
     * @return the new simulator
     * @throws IllegalArgumentException if {@code limit} is out of range
     */
    public Simulator withBondLimit(int limit) {
        Bridge.matrixProducts().requireSettings(limit, truncation);
        return new Simulator(seed, threads, fusion, engine, noise, precision, limit, truncation);
    }

    /**
     * Returns a simulator like this one whose matrix product states drop, at each split, the
     * largest tail of Schmidt values whose weight is at most {@code threshold} times the total
     * ({@link Engine#MATRIX_PRODUCT}; other engines ignore it). 0 drops only values that are
     * numerically zero.
     *
     * @param threshold in {@code [0, 1)}
     * @return the new simulator
     * @throws IllegalArgumentException if {@code threshold} is out of range or NaN
     */
    public Simulator withTruncation(double threshold) {
        Bridge.matrixProducts().requireSettings(bondLimit, threshold);
        return new Simulator(seed, threads, fusion, engine, noise, precision, bondLimit,
                threshold);
    }

    /**
     * Returns the bond limit of matrix product states.
     *
     * @return the limit
     */
    public int bondLimit() {
        return bondLimit;
    }

    /**
     * Returns the truncation threshold of matrix product states.
     *
     * @return the threshold
     */
    public double truncation() {
        return truncation;
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
     * @return the threads the engines may use
     */
    public int threads() {
        return threads;
    }

    /**
     * Tells whether gate fusion is on.
     *
     * @return whether gates are fused
     */
    public boolean fusion() {
        return fusion;
    }

    /**
     * Returns the configured engine ({@link Engine#CHEAPEST} unless set).
     *
     * @return the engine setting
     */
    public Engine engine() {
        return engine;
    }

    /**
     * Returns the noise model ({@link NoiseModel#none()} unless set).
     *
     * @return the noise model
     */
    public NoiseModel noise() {
        return noise;
    }

    /**
     * Returns the storage precision of state vectors ({@link Precision#DOUBLE} unless set).
     *
     * @return the precision
     */
    public Precision precision() {
        return precision;
    }

    /**
     * Says which engine {@link #run(Circuit, int)} uses for a circuit and why, or why none
     * can. The rules of {@link Engine#CHEAPEST}:
     * <ul>
     *   <li>without noise, a Clifford circuit ({@link Circuit#isClifford()}) of at least
     *       {@value #TABLEAU_FROM_QUBITS} qubits runs on the tableau; any other runs on the state
     *       vector unless that would hold more than {@value StateVector#MAX_QUBITS} qubits or
     *       more bytes than the maximum heap ({@code Runtime.maxMemory()}), when it runs on the
     *       matrix product state;</li>
     *   <li>with noise, a circuit whose measurements come last runs on the density matrix when
     *       it has at most {@value #DENSITY_MATRIX_UP_TO_QUBITS} qubits and the shots are at
     *       least {@code 2^n / 4} (a density-matrix gate costs as much as a gate on about
     *       {@code 2^n} trajectories); any other runs as trajectories.</li>
     * </ul>
     * A fixed engine is explained too, and refused with the reason when it cannot run the
     * circuit.
     *
     * @param circuit the circuit
     * @param shots the shots the run would take, at least 1
     * @return the engine and the reason
     * @throws IllegalArgumentException if {@code shots < 1}, or the configured engine cannot
     *     run the circuit with this noise (the message says why and what would)
     */
    public Choice explain(Circuit circuit, int shots) {
        Objects.requireNonNull(circuit, "circuit");
        Checks.requireShots(shots);
        boolean noisy = !noise.isIdeal();
        int n = circuit.qubits();
        switch (engine) {
            case AMPLITUDES:
                if (noisy) {
                    throw refuse("the state-vector engine runs ideal circuits; with a noise"
                            + " model use DENSITY_MATRIX or TRAJECTORIES (or CHEAPEST)");
                }
                requireStateVector(circuit);
                return new Choice(Engine.AMPLITUDES, "set by withEngine");
            case TABLEAU:
                if (noisy) {
                    throw refuse("the tableau runs ideal circuits; with a noise model use"
                            + " DENSITY_MATRIX or TRAJECTORIES (or CHEAPEST)");
                }
                requireClifford(circuit);
                return new Choice(Engine.TABLEAU, "set by withEngine");
            case DENSITY_MATRIX:
                requireDensityMatrix(circuit);
                return new Choice(Engine.DENSITY_MATRIX, "set by withEngine");
            case TRAJECTORIES:
                requireTrajectories(circuit);
                return new Choice(Engine.TRAJECTORIES, "set by withEngine");
            case MATRIX_PRODUCT:
                if (noisy) {
                    throw refuse("the matrix-product engine runs ideal circuits; with a noise"
                            + " model use DENSITY_MATRIX or TRAJECTORIES (or CHEAPEST)");
                }
                return new Choice(Engine.MATRIX_PRODUCT, "set by withEngine");
            default:
                break;
        }
        if (!noisy) {
            OptionalInt bad = circuit.firstNonClifford();
            if (bad.isEmpty() && n >= TABLEAU_FROM_QUBITS) {
                return new Choice(Engine.TABLEAU, "every gate is Clifford and the circuit has "
                        + n + " qubits (a tableau gate costs about n/32 words, a state-vector"
                        + " gate 2^n amplitudes)");
            }
            String wide = bad.isPresent() ? tooWideForStateVector(n) : null;
            if (wide != null) {
                return new Choice(Engine.MATRIX_PRODUCT, nonClifford(circuit, bad.getAsInt())
                        + ", so the tableau cannot run it, and " + wide + "; a matrix product"
                        + " state holds it in memory that grows with its entanglement (bond"
                        + " limit " + bondLimit + ", truncation " + truncation + ";"
                        + " matrixProductStateAfter reports the accuracy given up)");
            }
            if (bad.isPresent()) {
                requireStateVector(circuit);
                return new Choice(Engine.AMPLITUDES, nonClifford(circuit, bad.getAsInt())
                        + ", so the tableau cannot run it");
            }
            return new Choice(Engine.AMPLITUDES, "every gate is Clifford, but with " + n
                    + " qubits (below " + TABLEAU_FROM_QUBITS + ") the state vector is cheaper");
        }
        if (!circuit.measuresAtEnd()) {
            requireTrajectories(circuit);
            return new Choice(Engine.TRAJECTORIES, circuit.whyNotAtEnd(circuit
                    .firstAfterMeasurement()) + ": it needs measured values during the shot,"
                    + " which one trajectory per shot provides");
        }
        if (n > DENSITY_MATRIX_UP_TO_QUBITS) {
            requireTrajectories(circuit);
            return new Choice(Engine.TRAJECTORIES, n + " qubits: a density matrix would need "
                    + bytes(DensityMatrix.MAX_QUBITS < n ? Long.MAX_VALUE : densityBytes(n))
                    + " and cost 4^n per gate; trajectories cost 2^n per gate and shot");
        }
        if ((1L << n) > 4L * shots) {
            requireTrajectories(circuit);
            return new Choice(Engine.TRAJECTORIES, shots + " shot(s) of 2^" + n
                    + " amplitudes cost less than one density matrix of 4^" + n);
        }
        return new Choice(Engine.DENSITY_MATRIX, n + " qubits and measurements at the end: the"
                + " exact distribution from one density matrix of " + bytes(densityBytes(n)));
    }

    /** Why no state vector of n qubits fits this simulator, or null if one does. */
    private String tooWideForStateVector(int n) {
        if (n > StateVector.MAX_QUBITS) {
            return "a state vector holds at most " + StateVector.MAX_QUBITS + " qubits, not " + n;
        }
        long need = (long) precision.bytesPerAmplitude() << n;
        long max = Runtime.getRuntime().maxMemory();
        return need > max ? "a state vector of " + n + " qubits needs " + bytes(need)
                + " but the maximum heap is " + bytes(max) : null;
    }

    private static long densityBytes(int n) {
        return 16L << (2 * n);
    }

    private static String bytes(long b) {
        if (b == Long.MAX_VALUE) {
            return "more than the largest density matrix allowed";
        }
        return b >= (1L << 30) ? (b >> 30) + " GiB" : b >= (1L << 20) ? (b >> 20) + " MiB"
                : (b >> 10) + " KiB";
    }

    private static IllegalArgumentException refuse(String why) {
        return new IllegalArgumentException(why);
    }

    /** Names the first non-Clifford gate at {@code index}, looking into conditioned blocks. */
    private static String nonClifford(Circuit circuit, int index) {
        StringBuilder where = new StringBuilder("instruction " + index);
        Instruction in = circuit.instructions().get(index);
        while (in.kind() == Instruction.Kind.IF_BIT || in.kind() == Instruction.Kind.IF
                || in.kind() == Instruction.Kind.WHILE) {
            java.util.List<Instruction> block = in.body();
            String part = " (" + in.name() + "), step ";
            if (allClifford(block)) {
                block = in.otherwise();
                part = " (else), step ";
            }
            int step = 0;
            while (block.get(step).isClifford()) {
                step++;
            }
            where.append(part).append(step);
            in = block.get(step);
        }
        return where + " (" + in + ") is not a Clifford gate";
    }

    private static boolean allClifford(java.util.List<Instruction> block) {
        for (Instruction in : block) {
            if (!in.isClifford()) {
                return false;
            }
        }
        return true;
    }

    private void requireStateVector(Circuit circuit) {
        if (circuit.qubits() > StateVector.MAX_QUBITS) {
            OptionalInt bad = circuit.firstNonClifford();
            throw refuse("the circuit has " + circuit.qubits() + " qubits; a state vector holds"
                    + " at most " + StateVector.MAX_QUBITS + (bad.isPresent()
                    ? ", and " + nonClifford(circuit, bad.getAsInt())
                    + ", which rules out the tableau" : "; the tableau (TABLEAU) runs it"));
        }
    }

    private static void requireClifford(Circuit circuit) {
        OptionalInt bad = circuit.firstNonClifford();
        if (bad.isPresent()) {
            throw refuse(nonClifford(circuit, bad.getAsInt()) + "; the tableau runs Clifford"
                    + " gates only (h, x, y, z, s, sDagger, sqrtX, sqrtXDagger, cnot, cy, cz, swap,"
                    + " and rotations by multiples of pi/2), measurements, resets and"
                    + " conditions");
        }
    }

    private static void requireDensityMatrix(Circuit circuit) {
        if (circuit.qubits() > DensityMatrix.MAX_QUBITS) {
            throw refuse("the circuit has " + circuit.qubits() + " qubits; a density matrix"
                    + " holds at most " + DensityMatrix.MAX_QUBITS + " (use TRAJECTORIES)");
        }
        int stop = circuit.firstAfterMeasurement();
        if (stop >= 0) {
            throw refuse(circuit.whyNotAtEnd(stop) + ": the density-matrix engine needs"
                    + " measurements at the end (use TRAJECTORIES)");
        }
    }

    private static void requireTrajectories(Circuit circuit) {
        if (circuit.clbits() > 63) {
            throw refuse("the circuit has " + circuit.clbits() + " classical bits; trajectory"
                    + " runs record at most 63");
        }
        if (circuit.qubits() > StateVector.MAX_QUBITS) {
            throw refuse("the circuit has " + circuit.qubits() + " qubits; a trajectory is a"
                    + " state vector of at most " + StateVector.MAX_QUBITS + " qubits");
        }
    }

    /**
     * Allocates the zero state for a circuit; when the heap cannot hold it, the refusal also
     * names a non-Clifford gate that rules out the tableau and the largest state that fits.
     */
    private StateVector newState(Circuit circuit) {
        try {
            return StateVector.zero(circuit.qubits(), precision).setThreads(threads);
        } catch (IllegalStateException e) {
            OptionalInt bad = circuit.firstNonClifford();
            long max = Runtime.getRuntime().maxMemory() / precision.bytesPerAmplitude();
            int fits = 63 - Long.numberOfLeadingZeros(Math.max(1, max));
            throw new IllegalStateException(e.getMessage() + (bad.isPresent() ? "; "
                    + nonClifford(circuit, bad.getAsInt()) + ", which rules out the tableau"
                    : "; the circuit is Clifford: the tableau (Engine.TABLEAU) runs it") + "; this"
                    + " heap holds " + precision.name().toLowerCase(java.util.Locale.ROOT)
                    + "-precision states of about " + fits + " qubits at most", e);
        }
    }

    private boolean fuses(Circuit circuit) {
        return fusion && circuit.qubits() >= Fusion.MIN_STATE_QUBITS;
    }

    private UniformRandomProvider rng() {
        return RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
    }

    private void requireDoubleForNoise() {
        if (precision != Precision.DOUBLE) {
            throw refuse("noisy runs are in double precision; use withPrecision(DOUBLE) with a"
                    + " noise model");
        }
    }

    /**
     * Runs a circuit for a number of shots on the engine {@link #explain(Circuit, int)} names,
     * and tallies its classical bits; bits never written read 0.
     *
     * @param circuit the circuit
     * @param shots the number of shots, at least 1
     * @return a tally of width {@code circuit.clbits()}
     * @throws IllegalArgumentException if {@code shots < 1} or the engine cannot run the
     *     circuit (see {@link #explain(Circuit, int)})
     * @throws IllegalStateException if the heap cannot hold the engine's state
     */
    @Override
    public Tally run(Circuit circuit, int shots) {
        Choice choice = explain(circuit, shots);
        switch (choice.engine()) {
            case TABLEAU:
                return Bridge.tableaus().run(circuit, shots, seed);
            case DENSITY_MATRIX:
                requireDoubleForNoise();
                return Tally.sample(Bridge.noise().distribution(circuit, noise, threads),
                        circuit.clbits(), shots, rng());
            case TRAJECTORIES:
                requireDoubleForNoise();
                return Bridge.noise().trajectories(circuit, noise, 0, shots, seed, threads,
                        precision);
            case MATRIX_PRODUCT:
                return Bridge.matrixProducts().run(circuit, shots, seed, bondLimit, truncation);
            default:
                return AmplitudeEngine.run(circuit, shots, newState(circuit), rng(),
                        fuses(circuit), threads);
        }
    }

    /**
     * Runs one slice of a trajectory ensemble: trajectories {@code first} to
     * {@code first + count - 1} of the ensemble that {@link #run(Circuit, int)} takes on the
     * {@link Engine#TRAJECTORIES} engine with this seed and noise, and tallies their classical
     * bits. Trajectory {@code t} draws from its own generator seeded from the seed and
     * {@code t} alone, so the slices of any split of {@code [0, n)} add up, count for count, to
     * {@code withEngine(Engine.TRAJECTORIES).run(circuit, n)}, whichever machine or thread ran
     * each slice. This runs trajectories whatever the engine setting (without noise, each is one
     * ideal shot).
     *
     * @param circuit the circuit, at most 63 classical bits
     * @param first the index of the first trajectory, at least 0
     * @param count the number of trajectories, at least 1, with {@code first + count} at most
     *     {@code Long.MAX_VALUE}
     * @return a tally of width {@code circuit.clbits()} and {@code count} shots
     * @throws IllegalArgumentException if {@code first < 0}, {@code count < 1}, the slice
     *     passes {@code Long.MAX_VALUE}, the precision is not double, or trajectories cannot run
     *     the circuit (the message says why)
     * @throws IllegalStateException if the heap cannot hold the state or the outcomes
     * @since 0.1
     */
    public Tally runTrajectories(Circuit circuit, long first, int count) {
        Objects.requireNonNull(circuit, "circuit");
        Checks.requireAtLeast(first, 0, "the first trajectory's index");
        Checks.requireShots(count);
        if (first > Long.MAX_VALUE - count) {
            throw refuse("the slice of " + count + " trajectories from index " + first
                    + " passes the last index " + Long.MAX_VALUE + "; the first index may be at"
                    + " most " + (Long.MAX_VALUE - count));
        }
        requireTrajectories(circuit);
        requireDoubleForNoise();
        return Bridge.noise().trajectories(circuit, noise, first, count, seed, threads,
                precision);
    }

    /**
     * Returns the state after one seeded shot of the circuit: measurements collapse the state
     * with outcomes drawn from the seed, resets and conditions act as in {@link #run}. Ideal
     * circuits run on the state vector, or on the tableau when {@link Engine#TABLEAU} is set
     * (the final stabilizer state is then converted, at most
     * {@value StabilizerTableau#MAX_DENSE_QUBITS} qubits); with noise, the state is the end of
     * one trajectory.
     *
     * @param circuit the circuit
     * @return the final state of that shot
     * @throws IllegalArgumentException if the configured engine cannot give a state vector
     *     for the circuit (the density matrix: use {@link #densityMatrixAfter(Circuit)})
     * @throws IllegalStateException if the heap cannot hold the state
     */
    public StateVector stateAfter(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        if (!noise.isIdeal() || engine == Engine.TRAJECTORIES) {
            if (engine == Engine.DENSITY_MATRIX || engine == Engine.AMPLITUDES
                    || engine == Engine.TABLEAU || engine == Engine.MATRIX_PRODUCT) {
                explain(circuit, 1);
                throw refuse("a noisy run has no single final state vector on the "
                        + engine + " engine; use densityMatrixAfter, or TRAJECTORIES");
            }
            requireTrajectories(circuit);
            requireDoubleForNoise();
            return Bridge.noise().trajectoryState(circuit, noise, seed, threads, precision);
        }
        if (engine == Engine.TABLEAU) {
            requireClifford(circuit);
            StateVector exact = Bridge.tableaus().stateAfter(circuit, seed).toStateVector()
                    .setThreads(threads);
            return precision == Precision.DOUBLE ? exact : exact.toPrecision(precision);
        }
        if (engine == Engine.DENSITY_MATRIX) {
            throw refuse("the density-matrix engine gives a density matrix; use"
                    + " densityMatrixAfter");
        }
        if (engine == Engine.MATRIX_PRODUCT) {
            StateVector dense = matrixProductStateAfter(circuit).toStateVector()
                    .setThreads(threads);
            return precision == Precision.DOUBLE ? dense : dense.toPrecision(precision);
        }
        requireStateVector(circuit);
        StateVector state = newState(circuit);
        java.util.List<Instruction> list = fuses(circuit)
                ? AmplitudeEngine.fuse(circuit.instructions()) : circuit.instructions();
        AmplitudeEngine.run(state.store(), circuit, list, 0, new ClassicalState(circuit.clbits(),
                circuit.variables().size()), rng(), threads);
        return state;
    }

    /**
     * Returns the matrix product state after one seeded shot of an ideal circuit, whatever the
     * engine setting: measurements collapse it with outcomes drawn from the seed, resets and
     * classical control act as in {@link #run}, and bonds are truncated to this simulator's
     * {@linkplain #withBondLimit(int) bond limit} and {@linkplain #withTruncation(double)
     * threshold}. The state reports the accuracy its truncations gave up
     * ({@link MatrixProductState#fidelityLowerBound()}).
     *
     * @param circuit any circuit of up to {@link Circuit#MAX_QUBITS} qubits
     * @return the state of that shot
     * @throws IllegalArgumentException if this simulator has a noise model
     * @throws IllegalStateException if the heap cannot hold a step of the state
     */
    public MatrixProductState matrixProductStateAfter(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        if (!noise.isIdeal()) {
            throw refuse("a matrix product state is the state of an ideal circuit, but this"
                    + " simulator has a noise model; use withNoise(NoiseModel.none())");
        }
        return Bridge.matrixProducts().stateAfter(circuit, seed, bondLimit, truncation);
    }

    /**
     * Returns the density matrix after the circuit under this simulator's noise model (ideal
     * without one): each gate followed by its noise, resets as channels, measurements as the
     * loss of coherence they cause (the ensemble over their outcomes; readout error does not
     * change the state). Deterministic: no seed is used.
     *
     * @param circuit a circuit without conditioned blocks, at most
     *     {@value DensityMatrix#MAX_QUBITS} qubits
     * @return the density matrix
     * @throws IllegalArgumentException if the circuit has a conditioned block or too many
     *     qubits, or a noise rule's channel does not fit a gate
     * @throws IllegalStateException if the heap cannot hold the density matrix
     */
    public DensityMatrix densityMatrixAfter(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        if (circuit.qubits() > DensityMatrix.MAX_QUBITS) {
            throw refuse("the circuit has " + circuit.qubits() + " qubits; a density matrix"
                    + " holds at most " + DensityMatrix.MAX_QUBITS);
        }
        return Bridge.noise().densityMatrix(circuit, noise, threads);
    }

    /**
     * Returns the exact probability of each value of the classical register after the circuit
     * (readout error included). A circuit whose measurements come last is read from its final
     * state vector, or from its density matrix with noise; any other circuit (mid-circuit
     * measurement, reset, classical control) is summed over its measurement branches: one state
     * vector per branch without noise, one density matrix per value of the classical bits and
     * variables with noise or for at most {@value #DENSITY_MATRIX_UP_TO_QUBITS} qubits (Nielsen
     * and Chuang 2010, §2.2.3 and §2.4). Loops are followed up to their iteration bound.
     * Bits never written read 0. Deterministic: no seed is used.
     *
     * @param circuit a circuit with at most 26 classical bits
     * @return a new array of {@code 2^clbits} probabilities; index {@code v} is the register
     *     value with clbit {@code j} as bit {@code j}
     * @throws IllegalArgumentException if the register is too wide, the circuit is too large for
     *     the exact engines (the message says so; {@link #predict(Circuit, int)} samples), or
     *     (with noise) it has more than {@value DensityMatrix#MAX_QUBITS} qubits
     * @throws IllegalStateException if the heap cannot hold the state
     */
    public double[] distribution(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        requireDistributionWidth(circuit);
        double[] exact = exactDistribution(circuit);
        if (exact == null) {
            throw refuse("the circuit's measurement branches do not fit the exact engines' budget"
                    + " of " + bytes(branchBudget()) + "; use predict(circuit, samples) for an"
                    + " estimate from sampled shots");
        }
        return exact;
    }

    private static void requireDistributionWidth(Circuit circuit) {
        if (circuit.clbits() > MAX_DISTRIBUTION_CLBITS) {
            throw refuse("the circuit has " + circuit.clbits() + " classical bits; an exact"
                    + " distribution has at most " + MAX_DISTRIBUTION_CLBITS);
        }
    }

    /** The bytes the branch engines may hold: a quarter of the heap, at most 1 GiB. */
    private static long branchBudget() {
        return Math.min(1L << 30, Runtime.getRuntime().maxMemory() / 4);
    }

    /** The exact distribution, or null when the branches do not fit the budget. */
    private double[] exactDistribution(Circuit circuit) {
        boolean noisy = !noise.isIdeal();
        if (circuit.measuresAtEnd()) {
            if (noisy) {
                requireDensityMatrixQubits(circuit);
                return Bridge.noise().distribution(circuit, noise, threads);
            }
            requireStateVector(circuit);
            StateVector psi = StateVector.zero(circuit.qubits()).setThreads(threads)
                    .apply(circuit.withoutMeasurements());
            return psi.registerDistribution(circuit.clbitSources());
        }
        try {
            if (noisy || circuit.qubits() <= DENSITY_MATRIX_UP_TO_QUBITS) {
                requireDensityMatrixQubits(circuit);
                return Bridge.noise().branchDistribution(circuit, noise, threads,
                        branchBudget());
            }
            requireStateVector(circuit);
            return BranchEngine.distribution(circuit, threads, branchBudget());
        } catch (BranchEngine.TooLarge | IllegalStateException e) {
            return null;
        }
    }

    private static void requireDensityMatrixQubits(Circuit circuit) {
        if (circuit.qubits() > DensityMatrix.MAX_QUBITS) {
            throw refuse("the circuit has " + circuit.qubits() + " qubits; an exact noisy"
                    + " distribution uses a density matrix of at most " + DensityMatrix.MAX_QUBITS
                    + " qubits (use predict(circuit, samples) for an estimate from trajectories)");
        }
    }

    /**
     * Predicts the distribution of the classical register: exactly where the engines can (as
     * {@link #distribution(Circuit)}: the final state, the density matrix, or one state per
     * measurement branch for circuits that use measured values during the shot), otherwise
     * estimated from {@code samples} shots of {@link #run(Circuit, int)} with this simulator's
     * seed (trajectories when there is noise). The prediction says which, so that a comparison
     * can account for the estimate's own sampling error.
     *
     * @param circuit a circuit of at most 26 classical bits
     * @param samples shots for an estimate when no exact engine fits, at least 1
     * @return the prediction
     * @throws IllegalArgumentException if the register is too wide, {@code samples < 1}, or no
     *     engine can run the circuit
     * @throws IllegalStateException if the heap cannot hold the state
     */
    public Prediction predict(Circuit circuit, int samples) {
        Objects.requireNonNull(circuit, "circuit");
        requireDistributionWidth(circuit);
        Checks.requireShots(samples);
        double[] exact;
        try {
            exact = exactDistribution(circuit);
        } catch (IllegalArgumentException e) {
            exact = null; // too many qubits for the exact engines: sample instead
        }
        if (exact != null) {
            String how = noise.isIdeal() ? (circuit.measuresAtEnd() ? "exact, from the final"
                    + " state" : "exact, summed over the measurement branches")
                    : "exact, from the density matrix" + (circuit.measuresAtEnd() ? ""
                    : " of each register value");
            return new Prediction(exact, 0, how);
        }
        Tally t = run(circuit, samples);
        double[] p = new double[1 << circuit.clbits()];
        for (java.util.Map.Entry<String, Long> e : t.outcomes().entrySet()) {
            p[(int) Long.parseLong(e.getKey().isEmpty() ? "0" : e.getKey(), 2)] = e.getValue()
                    / (double) samples;
        }
        return new Prediction(p, samples, "estimated from " + samples + " sampled shots on "
                + explain(circuit, samples).engine());
    }

    /**
     * Predicts the cost of {@link #run(Circuit, int)} without running it: the engine, the wall
     * time on this machine, the bytes held at the peak, the passes over memory, and cheaper
     * settings that apply (see {@link RunCost}). Priced with {@link Calibration#current()}: the
     * calibration file's rates, else a quick probe of two to three seconds, once per
     * JVM.
     *
     * @param circuit the circuit
     * @param shots the shots, at least 1
     * @return the prediction
     * @throws IllegalArgumentException as {@link #run(Circuit, int)} would refuse the run
     */
    public RunCost forecast(Circuit circuit, int shots) {
        return forecast(circuit, shots, Calibration.current());
    }

    /**
     * Predicts the cost of {@link #run(Circuit, int)} with the given rates; see
     * {@link #forecast(Circuit, int)}.
     *
     * @param circuit the circuit
     * @param shots the shots, at least 1
     * @param rates the machine's rates
     * @return the prediction
     * @throws IllegalArgumentException as {@link #run(Circuit, int)} would refuse the run
     */
    public RunCost forecast(Circuit circuit, int shots, Calibration rates) {
        Objects.requireNonNull(rates, "rates");
        explain(circuit, shots);
        return CostModel.forecast(this, circuit, shots, rates);
    }

    /** The widest register {@link #distribution(Circuit)} returns: {@value}. */
    public static final int MAX_DISTRIBUTION_CLBITS = 26;

    /**
     * Returns a short description such as
     * {@code "Simulator[seed 7, 2 threads, fusion on, engine CHEAPEST, ...]"}.
     *
     * @return the text
     */
    @Override
    public String toString() {
        return "Simulator[seed " + seed + ", " + threads + " threads, fusion "
                + (fusion ? "on" : "off") + ", engine " + engine + ", noise " + noise
                + ", precision " + precision + ", bond limit " + bondLimit + ", truncation "
                + truncation + "]";
    }
}
