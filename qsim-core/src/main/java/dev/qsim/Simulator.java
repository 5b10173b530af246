package dev.qsim;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.Parallel;
import dev.qsim.stabilizer.CliffordRunner;

/**
 * Runs circuits and tallies their shots: an immutable configuration (seed, threads, fusion,
 * engine).
 * Each call starts from the seed, so equal calls give equal results, whatever the thread count.
 * Thread-safe.
 *
 * <p>How shots are taken: a circuit whose measurements could all be moved to its end (no reset,
 * no condition, no gate on a qubit after it was measured) is simulated once and its shots are
 * drawn from the final state in one pass. Any other circuit is simulated shot by shot, with the
 * gates before its first measurement, reset or condition simulated once and copied for each
 * shot. Randomness: the XoRoShiRo128++ generator of Commons RNG (Blackman and Vigna,
 * "Scrambled linear pseudorandom number generators", ACM TOMS 47 (2021),
 * doi:10.1145/3460772), seeded with the simulator's seed.
 *
 * <p>Engines: {@link #run} uses the state-vector engine, or for circuits of Clifford gates,
 * measurements, resets and conditions the stabilizer engine
 * ({@link dev.qsim.stabilizer.CliffordRunner}), as {@link #withMethod(Method)} sets;
 * {@link #methodFor(Circuit)} tells which one runs a given circuit. The two engines draw their
 * random numbers differently, so one seed gives equally distributed but different tallies on
 * the two.
 *
 * @since 0.1
 */
public final class Simulator {
    /**
     * Which engine runs a circuit.
     *
     * @since 0.1
     */
    public enum Method {
        /**
         * The stabilizer engine for a Clifford circuit (see
         * {@link dev.qsim.stabilizer.CliffordRunner#isClifford(Circuit)}) of at least
         * {@link Simulator#STABILIZER_FROM_QUBITS} qubits, otherwise the state-vector engine.
         */
        AUTOMATIC,
        /** Always the state-vector engine. */
        STATE_VECTOR,
        /**
         * Always the stabilizer engine; a circuit with a non-Clifford gate is refused with an
         * {@link IllegalArgumentException} naming the gate and its position.
         */
        STABILIZER
    }

    /**
     * The qubit count from which {@link Method#AUTOMATIC} runs a Clifford circuit on the
     * stabilizer engine. A state-vector gate touches 2^n amplitudes; a tableau gate touches
     * about n/32 words per qubit and a measurement O(n²/64) words (Aaronson and Gottesman 2004,
     * Phys. Rev. A 70, 052328), so from 16 qubits on the tableau is the cheaper for any mix of
     * gates and measurements, and every circuit too large for a state vector is above this.
     */
    public static final int STABILIZER_FROM_QUBITS = 16;

    private final long seed;
    private final int threads;
    private final boolean fusion;
    private final Method method;
    private final Precision precision;

    private Simulator(long seed, int threads, boolean fusion, Method method,
            Precision precision) {
        this.seed = seed;
        this.threads = threads;
        this.fusion = fusion;
        this.method = method;
        this.precision = precision;
    }

    /**
     * Returns a simulator with the given seed, using every available processor.
     *
     * @param seed the seed of every run
     * @return the simulator
     */
    public static Simulator seeded(long seed) {
        return new Simulator(seed, Runtime.getRuntime().availableProcessors(), true,
                Method.AUTOMATIC, Precision.DOUBLE);
    }

    /**
     * Returns a simulator like this one with another thread count. Results do not depend on it.
     *
     * @param threads at least 1 (at most 256)
     * @return the new simulator
     * @throws IllegalArgumentException if {@code threads} is out of range
     */
    public Simulator withThreads(int threads) {
        Checks.requireInRange(threads, 1, Parallel.MAX_THREADS, "thread count");
        return new Simulator(seed, threads, fusion, method, precision);
    }

    /**
     * Returns a simulator like this one with gate fusion on or off. With fusion (the default),
     * runs of gates on a few qubits are merged into one dense operator before they are applied,
     * which streams the state fewer times; results agree with unfused runs to rounding (about
     * 1e-15 per amplitude), and are still the same for the same seed whatever the thread count.
     * Circuits of fewer than 16 qubits are never fused: their state sits in cache and the
     * fusion pass itself would cost more than it saves.
     *
     * @param on whether to fuse gates
     * @return the new simulator
     */
    public Simulator withFusion(boolean on) {
        return new Simulator(seed, threads, on, method, precision);
    }

    /**
     * Returns a simulator like this one that chooses engines as {@code method} says.
     *
     * @param method the engine choice
     * @return the new simulator
     * @since 0.1
     */
    public Simulator withMethod(Method method) {
        Objects.requireNonNull(method, "method");
        return new Simulator(seed, threads, fusion, method, precision);
    }

    /**
     * Returns a simulator like this one whose state vectors store amplitudes in the given
     * precision. {@link Precision#SINGLE} halves the memory (31 qubits in 16 GiB) at about
     * seven significant digits per amplitude; tallies for a seed can differ from double
     * precision's where a sampled uniform falls within rounding of a cumulative probability.
     * The stabilizer engine is exact either way; states it returns are converted.
     *
     * @param precision the storage precision
     * @return the new simulator
     * @since 0.1
     */
    public Simulator withPrecision(Precision precision) {
        Objects.requireNonNull(precision, "precision");
        return new Simulator(seed, threads, fusion, method, precision);
    }

    /**
     * Returns the storage precision of the state vectors ({@link Precision#DOUBLE} unless
     * set).
     *
     * @return the precision
     * @since 0.1
     */
    public Precision precision() {
        return precision;
    }

    /**
     * Returns the configured engine choice ({@link Method#AUTOMATIC} unless set).
     *
     * @return the method
     * @since 0.1
     */
    public Method method() {
        return method;
    }

    /**
     * Returns the engine that {@link #run} uses for a circuit: {@link Method#STATE_VECTOR} or
     * {@link Method#STABILIZER}, never {@link Method#AUTOMATIC}.
     *
     * @param circuit the circuit
     * @return the engine that runs it
     * @since 0.1
     */
    public Method methodFor(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        if (method != Method.AUTOMATIC) {
            return method;
        }
        return circuit.qubits() >= STABILIZER_FROM_QUBITS && CliffordRunner.isClifford(circuit)
                ? Method.STABILIZER : Method.STATE_VECTOR;
    }

    /** Fusion is used from this many qubits on; below, the pass costs more than it saves. */
    private boolean fuses(Circuit circuit) {
        return fusion && circuit.qubits() >= Fusion.MIN_STATE_QUBITS;
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
     * @return the threads the kernels may use
     */
    public int threads() {
        return threads;
    }

    private UniformRandomProvider rng() {
        return RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
    }

    /**
     * Runs a circuit for a number of shots and tallies its classical bits; bits never written
     * read 0.
     *
     * @param circuit the circuit
     * @param shots the number of shots, at least 1
     * @return a tally of width {@code circuit.clbits()}
     * @throws IllegalArgumentException if {@code shots < 1}, or the stabilizer engine is forced
     *     and the circuit has a non-Clifford gate
     * @throws IllegalStateException if the heap cannot hold the state
     * @see #methodFor(Circuit)
     */
    public Tally run(Circuit circuit, int shots) {
        Objects.requireNonNull(circuit, "circuit");
        Checks.requirePositiveShots(shots);
        if (methodFor(circuit) == Method.STABILIZER) {
            return CliffordRunner.run(circuit, shots, seed);
        }
        StateVector state = StateVector.zero(circuit.qubits(), precision).withThreads(threads);
        UniformRandomProvider rng = rng();
        List<Instruction> original = circuit.instructions();
        if (measurementsDeferrable(original)) {
            return sampleAtEnd(circuit, state, shots, rng);
        }
        List<Instruction> list = fuses(circuit) ? Engine.fuse(original) : original;
        int first = 0;
        while (first < list.size() && !list.get(first).isClassical()) {
            first++;
        }
        Engine.gates(state.store(), list, 0, first, threads);
        Amplitudes prefix = state.store();
        Amplitudes work = state.copy().store();
        boolean[] reg = new boolean[circuit.clbits()];
        Map<String, Long> counts = new HashMap<>();
        char[] text = new char[circuit.clbits()];
        for (int s = 0; s < shots; s++) {
            work.copyFrom(prefix);
            java.util.Arrays.fill(reg, false);
            Engine.run(work, list, first, reg, rng, threads);
            for (int c = 0; c < reg.length; c++) {
                text[reg.length - 1 - c] = reg[c] ? '1' : '0';
            }
            counts.merge(new String(text), 1L, Long::sum);
        }
        return Tally.ofStrings(circuit.clbits(), counts);
    }

    /** No reset, no condition, and no gate on a qubit after that qubit was measured. */
    static boolean measurementsDeferrable(List<Instruction> list) {
        java.util.Set<Integer> measured = new java.util.HashSet<>();
        for (Instruction in : list) {
            switch (in.kind()) {
                case MEASURE:
                    measured.add(in.targetsRaw()[0]);
                    break;
                case GATE:
                    for (int q : in.targetsRaw()) {
                        if (measured.contains(q)) {
                            return false;
                        }
                    }
                    for (int q : in.controlsRaw()) {
                        if (measured.contains(q)) {
                            return false;
                        }
                    }
                    break;
                default:
                    return false;
            }
        }
        return true;
    }

    private Tally sampleAtEnd(Circuit circuit, StateVector state, int shots,
            UniformRandomProvider rng) {
        List<int[]> measures = new ArrayList<>();
        List<Instruction> gates = new ArrayList<>();
        for (Instruction in : circuit.instructions()) {
            if (in.kind() == Instruction.Kind.GATE) {
                gates.add(in);
            } else {
                measures.add(new int[] {in.targetsRaw()[0], in.clbit()});
            }
        }
        // Measured qubits are not touched afterwards, so all gates may run first.
        List<Instruction> program = fuses(circuit) ? Fusion.fuse(gates) : gates;
        Engine.gates(state.store(), program, 0, program.size(), threads);
        int width = circuit.clbits();
        if (measures.isEmpty()) {
            Map<String, Long> one = new HashMap<>();
            one.put("0".repeat(width), (long) shots);
            return Tally.ofStrings(width, one);
        }
        long[] idx = state.sampleIndices(shots, rng);
        if (width <= 63) {
            long[] keys = new long[shots];
            for (int s = 0; s < shots; s++) {
                long key = 0;
                for (int[] m : measures) {
                    long bit = (idx[s] >>> m[0]) & 1L;
                    key = (key & ~(1L << m[1])) | (bit << m[1]);
                }
                keys[s] = key;
            }
            return Tally.ofKeys(width, keys);
        }
        Map<String, Long> counts = new HashMap<>();
        char[] text = new char[width];
        for (int s = 0; s < shots; s++) {
            java.util.Arrays.fill(text, '0');
            for (int[] m : measures) {
                text[width - 1 - m[1]] = ((idx[s] >>> m[0]) & 1L) == 1 ? '1' : '0';
            }
            counts.merge(new String(text), 1L, Long::sum);
        }
        return Tally.ofStrings(width, counts);
    }

    /**
     * Returns the state after one seeded shot of the circuit: measurements collapse the state
     * with outcomes drawn from the seed, resets and conditions act as in {@link #run}. Runs on
     * the state-vector engine unless the stabilizer engine is forced
     * ({@link Method#STABILIZER}); then the final stabilizer state is converted (at most
     * {@value dev.qsim.stabilizer.GeneratorTable#MAX_DENSE_QUBITS} qubits).
     *
     * @param circuit the circuit
     * @return the final state of that shot
     * @throws IllegalArgumentException if the stabilizer engine is forced and the circuit is
     *     not Clifford or has too many qubits to convert
     * @throws IllegalStateException if the heap cannot hold the state
     */
    public StateVector stateAfter(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        if (method == Method.STABILIZER) {
            StateVector exact = CliffordRunner.stateAfter(circuit, seed).toStateVector()
                    .withThreads(threads);
            return precision == Precision.DOUBLE ? exact : exact.toPrecision(precision);
        }
        StateVector state = StateVector.zero(circuit.qubits(), precision).withThreads(threads);
        List<Instruction> list = fuses(circuit) ? Engine.fuse(circuit.instructions())
                : circuit.instructions();
        Engine.run(state.store(), list, 0, new boolean[circuit.clbits()], rng(), threads);
        return state;
    }

    /**
     * Returns a short description such as {@code "Simulator[seed 7, 2 threads]"}.
     *
     * @return the text
     */
    @Override
    public String toString() {
        return "Simulator[seed " + seed + ", " + threads + " threads, fusion "
                + (fusion ? "on" : "off") + ", method " + method + ", precision " + precision
                + "]";
    }
}
