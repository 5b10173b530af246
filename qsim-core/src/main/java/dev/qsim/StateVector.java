package dev.qsim;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Objects;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;

import dev.qsim.internal.Bridge;
import dev.qsim.internal.Checks;
import dev.qsim.internal.Heap;
import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.Frame;
import dev.qsim.kernel.GateOp;
import dev.qsim.kernel.Measurement;
import dev.qsim.kernel.Parallel;
import dev.qsim.kernel.Reductions;

/**
 * The state vector of {@code n} qubits: {@code 2^n} complex amplitudes. This is the one mutable
 * type of the API: {@link #apply(Circuit)}, {@link #apply(Operator, int...)} and
 * {@link #measure(int, UniformRandomProvider)} change it in place and return it, and
 * {@link #copy()} is the way to keep a state. Not thread-safe; its kernels may use several
 * threads internally ({@link #setThreads(int)}), with results identical to the bit whatever
 * the thread count.
 *
 * <p>X, Y and single-qubit phase gates (Z, S, T, RZ, phase) without controls are not applied
 * to the amplitudes at once but kept in a lazy frame that later gates are applied through; the
 * first read afterwards (an amplitude, probabilities, a sample, an inner product ...) applies
 * the frame in one pass. Every method returns what applying each gate in turn would, up to
 * rounding; only the time a gate or a read takes shows the difference.
 *
 * <p>Amplitudes live in primitive arrays split into chunks, so a state may exceed Java's largest
 * array: 30 qubits (16 GiB) run with {@code -Xmx20g}. A state the heap cannot hold is refused
 * with an {@link IllegalStateException} naming the bytes needed and the {@code -Xmx} that would
 * do. Bit order and tensor order follow the {@linkplain dev.qsim package conventions}.
 *
 * <p>Amplitudes are stored in double precision unless a state is made in
 * {@linkplain Precision#SINGLE single precision} ({@link #zero(int, Precision)},
 * {@link #toPrecision(Precision)}): half the memory, 31 qubits in 16 GiB, about seven
 * significant digits per amplitude. Every method works in both precisions; sums and products
 * are taken in double either way.
 *
 * <p>Reference: Nielsen and Chuang (2010), §2.2 (postulates: state space, evolution,
 * measurement) and §1.3.
 *
 * @since 0.1
 */
public final class StateVector {
    /** Tolerance on {@code |Σ|a|² - 1|} for a state to count as normalised: {@value}. */
    public static final double NORM_TOLERANCE = 1e-9;
    /** The most qubits a state vector may have: {@value} (the heap is the real limit). */
    public static final int MAX_QUBITS = 40;

    static {
        Bridge.register(new Bridge.States() {
            @Override
            public Amplitudes store(StateVector state) {
                return state.amps;
            }

            @Override
            public Amplitudes doubles(StateVector state) {
                Amplitudes a = state.amps;
                if (a.isSingle()) {
                    a.settle();
                    return Heap.allocate(Amplitudes.bytes(state.qubits()), "a double-precision"
                            + " copy of the " + state.qubits() + "-qubit state",
                            () -> a.convert(false));
                }
                return a;
            }

            @Override
            public StateVector wrap(Amplitudes amplitudes, int threads) {
                return new StateVector(amplitudes).setThreads(threads);
            }

            @Override
            public void apply(StateVector state, Instruction gate) {
                Frame.apply(state.amps, List.of(gate.plan()), state.threads);
            }
        });
    }

    private final Amplitudes amps;
    private int threads;

    private StateVector(Amplitudes amps) {
        this.amps = amps;
        setThreads(Parallel.defaultThreads());
    }

    private static Amplitudes allocate(int n) {
        return allocate(n, false);
    }

    private static Amplitudes allocate(int n, boolean single) {
        Checks.requireInRange(n, 1, MAX_QUBITS, "qubit count");
        String what = "a " + n + "-qubit state" + (single ? " in single precision" : "");
        return Heap.allocate(Amplitudes.bytes(n, single), what,
                () -> single ? Amplitudes.allocateSingle(n) : Amplitudes.allocate(n));
    }

    /**
     * Returns {@code |0...0>} on {@code n} qubits.
     *
     * @param n the number of qubits, {@code 1 <= n <= }{@value #MAX_QUBITS}
     * @return a new state
     * @throws IllegalArgumentException if {@code n} is out of range
     * @throws IllegalStateException if the heap cannot hold the state
     */
    public static StateVector zero(int n) {
        return basis(n, 0);
    }

    /**
     * Returns {@code |0...0>} on {@code n} qubits, stored in the given precision.
     *
     * @param n the number of qubits, {@code 1 <= n <= }{@value #MAX_QUBITS}
     * @param precision how the amplitudes are stored
     * @return a new state
     * @throws IllegalArgumentException if {@code n} is out of range
     * @throws IllegalStateException if the heap cannot hold the state
     * @since 0.1
     */
    public static StateVector zero(int n, Precision precision) {
        return basis(n, 0, precision);
    }

    /**
     * Returns the basis state {@code |index>} on {@code n} qubits, stored in the given
     * precision.
     *
     * @param n the number of qubits, {@code 1 <= n <= }{@value #MAX_QUBITS}
     * @param index the basis index, in {@code [0, 2^n)}
     * @param precision how the amplitudes are stored
     * @return a new state
     * @throws IllegalArgumentException if {@code n} is out of range
     * @throws IndexOutOfBoundsException if {@code index} is out of range
     * @throws IllegalStateException if the heap cannot hold the state
     * @since 0.1
     */
    public static StateVector basis(int n, long index, Precision precision) {
        Objects.requireNonNull(precision, "precision");
        Checks.requireInRange(n, 1, MAX_QUBITS, "qubit count");
        requireIndex(index, n);
        Amplitudes a = allocate(n, precision == Precision.SINGLE);
        a.set(index, 1, 0);
        return new StateVector(a);
    }

    /**
     * Returns the basis state {@code |index>} on {@code n} qubits.
     *
     * @param n the number of qubits, {@code 1 <= n <= }{@value #MAX_QUBITS}
     * @param index the basis index, in {@code [0, 2^n)}
     * @return a new state
     * @throws IllegalArgumentException if {@code n} is out of range
     * @throws IndexOutOfBoundsException if {@code index} is out of range
     * @throws IllegalStateException if the heap cannot hold the state
     */
    public static StateVector basis(int n, long index) {
        Checks.requireInRange(n, 1, MAX_QUBITS, "qubit count");
        requireIndex(index, n);
        Amplitudes a = allocate(n);
        a.set(index, 1, 0);
        return new StateVector(a);
    }

    /**
     * Returns the state with the given amplitudes; amplitude {@code i} is basis state
     * {@code |i>}.
     *
     * @param amplitudes {@code 2^n} finite amplitudes, {@code n >= 1}, with
     *     {@code |Σ|a|² - 1| <= }{@value #NORM_TOLERANCE}; copied
     * @return a new state
     * @throws IllegalArgumentException if the length is not a power of two of at least 2, an
     *     amplitude is null or not finite, or the amplitudes are not normalised
     */
    public static StateVector of(Complex... amplitudes) {
        Objects.requireNonNull(amplitudes, "amplitudes");
        int len = amplitudes.length;
        if (len < 2 || Integer.bitCount(len) != 1) {
            throw new IllegalArgumentException("a state needs 2^n amplitudes with n >= 1 but "
                    + len + " were given");
        }
        double sum = 0;
        for (int i = 0; i < len; i++) {
            Complex z = amplitudes[i];
            if (z == null) {
                throw new IllegalArgumentException("amplitude " + i + " is null");
            }
            if (!Double.isFinite(z.getReal()) || !Double.isFinite(z.getImaginary())) {
                throw new IllegalArgumentException("amplitude " + i + " must be finite but was "
                        + z);
            }
            sum += z.getReal() * z.getReal() + z.getImaginary() * z.getImaginary();
        }
        if (!(Math.abs(sum - 1) <= NORM_TOLERANCE)) {
            throw new IllegalArgumentException("the amplitudes must be normalised: Σ|a|² is "
                    + sum + " but must be within " + NORM_TOLERANCE + " of 1");
        }
        int n = Integer.numberOfTrailingZeros(len);
        Amplitudes a = allocate(n);
        for (int i = 0; i < len; i++) {
            a.set(i, amplitudes[i].getReal(), amplitudes[i].getImaginary());
        }
        return new StateVector(a);
    }

    private static void requireIndex(long index, int n) {
        if (index < 0 || index >= (1L << n)) {
            throw new IndexOutOfBoundsException("basis index " + index + " is out of range [0, "
                    + ((1L << n) - 1) + "] for " + n + " qubit(s)");
        }
    }

    /** The storage, possibly with a lazy frame: for the gate engine only. */
    Amplitudes store() {
        return amps;
    }

    /**
     * Sets, in place, the number of threads the kernels of this state may use; states under 16
     * qubits always use one. Results do not depend on it. (A setter, not a copy: this is the
     * one mutable type of the API.)
     *
     * @param threads at least 1 (at most 256)
     * @return this state
     * @throws IllegalArgumentException if {@code threads} is out of range
     */
    public StateVector setThreads(int threads) {
        Checks.requireThreads(threads);
        this.threads = threads;
        amps.setThreads(threads);
        return this;
    }

    /**
     * Returns the number of threads the kernels may use (by default the available processors).
     *
     * @return the thread count
     */
    public int threads() {
        return threads;
    }

    /**
     * Returns how the amplitudes are stored.
     *
     * @return the precision
     * @since 0.1
     */
    public Precision precision() {
        return amps.isSingle() ? Precision.SINGLE : Precision.DOUBLE;
    }

    /**
     * Returns a copy of this state stored in the given precision (same thread setting).
     * Widening to double is exact; narrowing rounds each part to the nearest {@code float}.
     *
     * @param precision the precision of the copy
     * @return a new state, also when the precision is already the one asked for
     * @throws IllegalStateException if the heap cannot hold the copy
     * @since 0.1
     */
    public StateVector toPrecision(Precision precision) {
        Objects.requireNonNull(precision, "precision");
        boolean single = precision == Precision.SINGLE;
        // Settled first: the frame is applied in this state's own precision.
        Amplitudes source = amps;
        return new StateVector(Heap.allocate(Amplitudes.bytes(qubits(), single),
                "a copy of the " + qubits() + "-qubit state", () -> source.convert(single)))
                .setThreads(threads);
    }

    /**
     * Returns the number of qubits.
     *
     * @return {@code n}
     */
    public int qubits() {
        return amps.qubits();
    }

    /**
     * Returns the number of amplitudes, {@code 2^n}.
     *
     * @return the dimension
     */
    public long dimension() {
        return 1L << amps.qubits();
    }

    /**
     * Returns the amplitude of basis state {@code |index>}.
     *
     * @param index in {@code [0, 2^n)}
     * @return the amplitude
     * @throws IndexOutOfBoundsException if {@code index} is out of range
     */
    public Complex amplitude(long index) {
        requireIndex(index, qubits());
        Amplitudes s = amps;
        return Complex.ofCartesian(s.re(index), s.im(index));
    }

    /**
     * Returns the probability {@code |a_index|²} of basis state {@code |index>}.
     *
     * @param index in {@code [0, 2^n)}
     * @return the probability
     * @throws IndexOutOfBoundsException if {@code index} is out of range
     */
    public double probability(long index) {
        requireIndex(index, qubits());
        Amplitudes s = amps;
        double re = s.re(index);
        double im = s.im(index);
        return re * re + im * im;
    }

    /**
     * Returns the amplitudes as {@link Complex} values, for small states.
     *
     * @return {@code 2^n} amplitudes, index {@code i} for basis state {@code |i>}
     * @throws IllegalArgumentException if the state has more than 24 qubits
     * @throws IllegalStateException if the heap cannot hold the array
     */
    public Complex[] amplitudes() {
        int n = qubits();
        if (n > 24) {
            throw new IllegalArgumentException("amplitudes() returns at most 24 qubits' worth of"
                    + " objects but the state has " + n + " qubits; use amplitude(long)");
        }
        Heap.require(48L << n, "the amplitude array");
        Complex[] out = new Complex[1 << n];
        Amplitudes s = amps;
        for (int i = 0; i < out.length; i++) {
            out[i] = Complex.ofCartesian(s.re(i), s.im(i));
        }
        return out;
    }

    /**
     * Returns the probability of every basis state, {@code |a_i|²} at index {@code i}.
     *
     * @return {@code 2^n} probabilities
     * @throws IllegalArgumentException if the state has more than 30 qubits
     * @throws IllegalStateException if the heap cannot hold the array
     */
    public double[] probabilities() {
        int n = qubits();
        if (n > 30) {
            throw new IllegalArgumentException("probabilities() handles at most 30 qubits but"
                    + " the state has " + n + "; use marginal(int...) on fewer qubits");
        }
        Heap.require(8L << n, "the probability array");
        double[] out = new double[1 << n];
        Reductions.probabilities(amps, out, threads);
        return out;
    }

    /**
     * Returns the marginal distribution of some qubits: entry {@code k} is the probability that
     * qubit {@code qubits[j]} reads bit {@code j} of {@code k}, for every {@code j}. With no
     * qubits given, all qubits in order ({@link #probabilities()}).
     *
     * @param qubits distinct qubits, at most 30
     * @return {@code 2^qubits.length} probabilities summing to 1
     * @throws IndexOutOfBoundsException if a qubit is out of range
     * @throws IllegalArgumentException if a qubit repeats or more than 30 are given
     */
    public double[] marginal(int... qubits) {
        Objects.requireNonNull(qubits, "qubits");
        if (qubits.length == 0) {
            return probabilities();
        }
        Checks.requireDistinctQubits(qubits, qubits(), "the marginal's qubits");
        if (qubits.length > 30) {
            throw new IllegalArgumentException("a marginal over at most 30 qubits is allowed but "
                    + qubits.length + " were given");
        }
        Heap.require(8L << qubits.length, "the marginal array");
        double[] out = new double[1 << qubits.length];
        Reductions.marginal(amps, qubits.clone(), out);
        return out;
    }

    /**
     * Returns the Euclidean norm {@code sqrt(Σ|a_i|²)}, 1 for a normalised state.
     *
     * @return the norm
     */
    public double norm() {
        return Math.sqrt(Reductions.norm2(amps, threads));
    }

    /**
     * Returns the inner product {@code <this|other> = Σ conj(a_i) b_i}.
     *
     * @param other a state on the same number of qubits
     * @return the inner product
     * @throws IllegalArgumentException if the qubit counts differ
     */
    public Complex inner(StateVector other) {
        requireSameSize(other);
        double[] z = Reductions.inner(amps, other.amps, threads);
        return Complex.ofCartesian(z[0], z[1]);
    }

    /**
     * Returns the fidelity {@code |<this|other>|²} of two pure states (Nielsen and Chuang 2010,
     * §9.2.2).
     *
     * @param other a state on the same number of qubits
     * @return the fidelity, in {@code [0, 1]} up to rounding
     * @throws IllegalArgumentException if the qubit counts differ
     */
    public double fidelity(StateVector other) {
        requireSameSize(other);
        double[] z = Reductions.inner(amps, other.amps, threads);
        return z[0] * z[0] + z[1] * z[1];
    }

    private void requireSameSize(StateVector other) {
        Objects.requireNonNull(other, "other");
        if (other.qubits() != qubits()) {
            throw new IllegalArgumentException("the states differ in size: " + qubits()
                    + " qubit(s) and " + other.qubits() + " qubit(s)");
        }
    }

    /**
     * Returns the product state {@code this ⊗ other}: {@code other} on the low qubits, this
     * state on the next ones; in single precision if either factor is.
     *
     * @param other the state of the low qubits
     * @return a new state on {@code qubits() + other.qubits()} qubits
     * @throws IllegalArgumentException if the result would exceed {@value #MAX_QUBITS} qubits
     * @throws IllegalStateException if the heap cannot hold the result
     */
    public StateVector tensor(StateVector other) {
        Objects.requireNonNull(other, "other");
        int nb = other.qubits();
        int n = qubits() + nb;
        Checks.requireInRange(n, 1, MAX_QUBITS, "qubit count of the product");
        Amplitudes r = allocate(n, amps.isSingle() || other.amps.isSingle());
        long da = dimension();
        long db = other.dimension();
        Amplitudes sa = amps;
        Amplitudes sb = other.amps;
        for (long i = 0; i < da; i++) {
            double ar = sa.re(i);
            double ai = sa.im(i);
            if (ar == 0 && ai == 0) {
                continue;
            }
            for (long j = 0; j < db; j++) {
                double br = sb.re(j);
                double bi = sb.im(j);
                r.set((i << nb) | j, ar * br - ai * bi, ar * bi + ai * br);
            }
        }
        return new StateVector(r).setThreads(threads);
    }

    /**
     * Returns an independent copy of this state (same precision and thread setting).
     *
     * @return the copy
     * @throws IllegalStateException if the heap cannot hold a second state
     */
    public StateVector copy() {
        return new StateVector(Heap.allocate(Amplitudes.bytes(qubits(), amps.isSingle()),
                "a copy of the " + qubits() + "-qubit state", amps::copy)).setThreads(threads);
    }

    /**
     * Applies every gate of a circuit, in place.
     *
     * @param circuit a circuit of gates only on the same number of qubits
     * @return this state
     * @throws IllegalArgumentException if the qubit counts differ or the circuit measures,
     *     resets or has conditions (run those with {@link Simulator})
     */
    public StateVector apply(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        if (circuit.qubits() != qubits()) {
            throw new IllegalArgumentException("the circuit has " + circuit.qubits()
                    + " qubit(s) but the state has " + qubits() + "; they must match");
        }
        circuit.requireGatesOnly("StateVector.apply(Circuit)");
        List<GateOp> plans = new ArrayList<>(circuit.size());
        for (Instruction in : circuit.instructions()) {
            if (in.kind() == Instruction.Kind.GATE) {
                plans.add(in.plan());
            }
        }
        Frame.apply(amps, plans, threads);
        return this;
    }

    /**
     * Applies a unitary operator to some qubits, in place; bit {@code j} of the operator's
     * matrix index is {@code qubits[j]}. With no qubits given, all qubits in order.
     *
     * @param op a unitary operator (within {@value Operator#UNITARY_TOLERANCE})
     * @param qubits distinct qubits, as many as the operator acts on
     * @return this state
     * @throws IndexOutOfBoundsException if a qubit is out of range
     * @throws IllegalArgumentException if the qubit count does not match the operator, a qubit
     *     repeats, or the operator is not unitary
     */
    public StateVector apply(Operator op, int... qubits) {
        Objects.requireNonNull(op, "op");
        Objects.requireNonNull(qubits, "qubits");
        int[] qs = qubits.length == 0 ? allQubits(qubits()) : qubits.clone();
        Circuit c = Circuit.builder(qubits(), 0).apply(op, qs).build();
        Frame.apply(amps, List.of(c.instructions().get(0).plan()), threads);
        return this;
    }

    private static int[] allQubits(int n) {
        int[] qs = new int[n];
        Arrays.setAll(qs, i -> i);
        return qs;
    }

    /**
     * Measures one qubit in the computational basis: draws 0 or 1 with its Born probability,
     * then collapses and renormalises the state (Nielsen and Chuang 2010, §2.2.3).
     *
     * @param qubit the qubit
     * @param rng the source of randomness
     * @return the outcome, 0 or 1
     * @throws IndexOutOfBoundsException if {@code qubit} is out of range
     */
    public int measure(int qubit, UniformRandomProvider rng) {
        Checks.requireQubit(qubit, qubits());
        Objects.requireNonNull(rng, "rng");
        return Measurement.measure(amps, qubit, rng.nextDouble(), threads);
    }

    /**
     * Samples measurement outcomes of some qubits without changing the state. Bit {@code j} of
     * an outcome is qubit {@code qubits[j]}; with no qubits given, all qubits in order. The
     * shots are drawn in one pass over the probabilities with uniforms made already in
     * ascending order (normalised partial sums of exponential spacings; Devroye 1986,
     * <i>Non-Uniform Random Variate Generation</i>, §V.2), so the cost is one read of the state
     * and no sort.
     *
     * @param shots the number of shots, at least 1
     * @param rng the source of randomness
     * @param qubits distinct qubits, at most 63
     * @return the tally, of width {@code qubits.length} (or {@code n})
     * @throws IllegalArgumentException if {@code shots < 1}, a qubit repeats, or more than 63
     *     qubits are given
     * @throws IndexOutOfBoundsException if a qubit is out of range
     */
    public Tally sample(int shots, UniformRandomProvider rng, int... qubits) {
        Checks.requireShots(shots);
        Objects.requireNonNull(rng, "rng");
        Objects.requireNonNull(qubits, "qubits");
        int[] qs = qubits.length == 0 ? allQubits(qubits()) : qubits.clone();
        Checks.requireDistinctQubits(qs, qubits(), "the sampled qubits");
        if (qs.length > 63) {
            throw new IllegalArgumentException("at most 63 qubits may be sampled at once but "
                    + qs.length + " were given");
        }
        long[] idx = sampleIndices(shots, rng);
        boolean identity = qs.length == qubits();
        for (int j = 0; j < qs.length && identity; j++) {
            identity = qs[j] == j;
        }
        if (identity) {
            return Tally.ofKeys(qs.length, idx);
        }
        long[] keys = new long[shots];
        for (int s = 0; s < shots; s++) {
            long i = idx[s];
            long key = 0;
            for (int j = 0; j < qs.length; j++) {
                key |= ((i >>> qs[j]) & 1L) << j;
            }
            keys[s] = key;
        }
        return Tally.ofKeys(qs.length, keys);
    }

    /**
     * The distribution of a classical register whose bit {@code c} is read from qubit
     * {@code source[c]} (-1: never written, reads 0), from the marginal of the read qubits.
     */
    double[] registerDistribution(int[] source) {
        int width = source.length;
        int[] position = new int[qubits()];
        Arrays.fill(position, -1);
        int[] read = new int[Math.min(width, qubits())];
        int k = 0;
        for (int q : source) {
            if (q >= 0 && position[q] < 0) {
                position[q] = k;
                read[k++] = q;
            }
        }
        Heap.require(8L << width, "a distribution over " + width + " classical bits");
        double[] out = new double[1 << width];
        if (k == 0) {
            out[0] = 1;
            return out;
        }
        double[] m = marginal(Arrays.copyOf(read, k));
        for (int v = 0; v < m.length; v++) {
            if (m[v] == 0) {
                continue;
            }
            int key = 0;
            for (int c = 0; c < width; c++) {
                if (source[c] >= 0 && ((v >>> position[source[c]]) & 1) == 1) {
                    key |= 1 << c;
                }
            }
            out[key] += m[v];
        }
        return out;
    }

    /**
     * Draws basis indices for {@code shots} shots, in ascending order. The sorted uniforms are
     * made directly as normalised partial sums of exponential spacings (L. Devroye,
     * <i>Non-Uniform Random Variate Generation</i>, Springer 1986, §V.2), so no sort is needed;
     * then one pass over the probabilities maps them to indices.
     */
    long[] sampleIndices(int shots, UniformRandomProvider rng) {
        Heap.require(16L * shots, "sampling " + shots + " shots");
        Amplitudes store = amps;
        double[] sums = Reductions.blockSums(store, threads);
        double total = 0;
        for (double x : sums) {
            total += x;
        }
        double[] u = new double[shots];
        double acc = 0;
        for (int s = 0; s < shots; s++) {
            acc += -Math.log1p(-rng.nextDouble());
            u[s] = acc;
        }
        acc += -Math.log1p(-rng.nextDouble());
        double scale = total / acc;
        for (int s = 0; s < shots; s++) {
            u[s] *= scale;
        }
        long[] idx = new long[shots];
        Reductions.pickIndices(store, sums, u, idx, threads);
        return idx;
    }

    /**
     * Returns the non-zero amplitudes of a small state as text, such as
     * {@code "0.7071|00> + 0.7071|11>"}; for more than 10 qubits, a summary.
     *
     * @return the text
     */
    @Override
    public String toString() {
        int n = qubits();
        if (n > 10) {
            return "StateVector[" + n + " qubits]";
        }
        StringBuilder sb = new StringBuilder();
        Amplitudes s = amps;
        for (long i = 0; i < dimension(); i++) {
            double re = s.re(i);
            double im = s.im(i);
            if (Math.hypot(re, im) < 1e-12) {
                continue;
            }
            if (sb.length() > 0) {
                sb.append(" + ");
            }
            String amp = im == 0 ? fmt(re) : re == 0 ? fmt(im) + "i"
                    : "(" + fmt(re) + (im < 0 ? "-" : "+") + fmt(Math.abs(im)) + "i)";
            sb.append(amp).append('|').append(Tally.bitString(i, n)).append('>');
        }
        return sb.length() == 0 ? "0" : sb.toString();
    }

    private static String fmt(double x) {
        return String.format(java.util.Locale.ROOT, "%.4f", x);
    }
}
