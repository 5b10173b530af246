package dev.qsim.noise;

import java.util.Objects;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.Operator;
import dev.qsim.StateVector;
import dev.qsim.Tally;
import dev.qsim.internal.Bridge;
import dev.qsim.internal.Checks;
import dev.qsim.internal.Heap;
import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.DensityKernels;
import dev.qsim.kernel.Parallel;
import dev.qsim.kernel.Reductions;

/**
 * The density matrix {@code rho} of {@code n} qubits; mutable (the {@code apply} methods work
 * in place, {@link #copy()} is the way out) and not thread-safe.
 *
 * <p>{@code rho} is stored as a vectorised state of {@code 2n} qubits: entry
 * {@code rho[r][c]} is amplitude {@code r + (c << n)}, so the row index lives on qubits
 * {@code 0..n-1} and the column index on qubits {@code n..2n-1}. Then {@code U rho U^dagger}
 * is {@code U} on the row qubits and {@code conj(U)} on the column qubits, and a channel is
 * {@code sum_k K_k (x) conj(K_k)} on both (the index {@code r + (c << n)} is column
 * stacking, and {@code vec(A X B) = (B^T (x) A) vec(X)}: Horn and Johnson 1991, <i>Topics in
 * Matrix Analysis</i>, Cambridge University Press, Lemma 4.3.1), so the state-vector kernels
 * do the work. Storage is {@code 16 * 4^n} bytes: 4 GiB at 14 qubits. Bit order as in
 * {@link dev.qsim}.
 *
 * @since 0.1
 */
public final class DensityMatrix {
    /** The largest number of qubits (the heap usually limits it sooner). */
    public static final int MAX_QUBITS = 15;

    static {
        Bridge.register(new Bridge.Densities() {
            @Override
            public Amplitudes store(DensityMatrix rho) {
                return rho.amps;
            }

            @Override
            public DensityMatrix wrap(Amplitudes amplitudes, int threads) {
                return new DensityMatrix(amplitudes.qubits() / 2, amplitudes, threads);
            }
        });
    }

    private final int n;
    private final Amplitudes amps;
    private int threads;

    private DensityMatrix(int n, Amplitudes amps, int threads) {
        this.n = n;
        this.amps = amps;
        this.threads = threads;
    }

    /**
     * Returns the number of bytes a density matrix of {@code n} qubits takes.
     *
     * @param n the qubit count, 1 to {@value #MAX_QUBITS}
     * @return {@code 16 * 4^n}
     * @throws IllegalArgumentException if {@code n} is out of range
     */
    public static long bytes(int n) {
        requireCount(n);
        return Amplitudes.bytes(2 * n);
    }

    /**
     * Returns {@code |0...0><0...0|} on {@code n} qubits.
     *
     * @param n the qubit count, 1 to {@value #MAX_QUBITS}
     * @return the density matrix
     * @throws IllegalArgumentException if {@code n} is out of range
     * @throws IllegalStateException if the heap cannot hold {@code 16 * 4^n} bytes (the
     *     message gives the bytes needed, the maximum heap and an {@code -Xmx} to use)
     */
    public static DensityMatrix zero(int n) {
        DensityMatrix rho = allocate(n);
        rho.amps.set(0, 1, 0);
        return rho;
    }

    /**
     * Returns the pure state {@code |psi><psi|}.
     *
     * @param psi the state, at most {@value #MAX_QUBITS} qubits
     * @return the density matrix
     * @throws IllegalArgumentException if {@code psi} has too many qubits
     * @throws IllegalStateException if the heap cannot hold the matrix
     */
    public static DensityMatrix of(StateVector psi) {
        Objects.requireNonNull(psi, "psi");
        requireCount(psi.qubits());
        DensityMatrix rho = allocate(psi.qubits());
        DensityKernels.fromPure(Bridge.states().doubles(psi), rho.amps);
        return rho;
    }

    private static DensityMatrix allocate(int n) {
        requireCount(n);
        Amplitudes a = Heap.allocate(Amplitudes.bytes(2 * n), "a " + n + "-qubit density matrix",
                () -> Amplitudes.allocate(2 * n));
        return new DensityMatrix(n, a, Parallel.defaultThreads());
    }

    private static void requireCount(int n) {
        Checks.requireInRange(n, 1, MAX_QUBITS, "the qubit count of a density matrix");
    }

    /**
     * Sets, in place, the number of threads the kernels use; results do not depend on it.
     *
     * @param threads 1 to 256
     * @return this
     * @throws IllegalArgumentException if {@code threads} is out of range
     */
    public DensityMatrix setThreads(int threads) {
        this.threads = Checks.requireThreads(threads);
        return this;
    }

    /**
     * Returns the thread count of the kernels.
     *
     * @return the threads
     */
    public int threads() {
        return threads;
    }

    /**
     * Returns the number of qubits.
     *
     * @return n
     */
    public int qubits() {
        return n;
    }

    /**
     * Returns a deep copy with the same thread count.
     *
     * @return the copy
     * @throws IllegalStateException if the heap cannot hold it
     */
    public DensityMatrix copy() {
        Amplitudes c = Heap.allocate(Amplitudes.bytes(2 * n), "a copy of a " + n
                + "-qubit density matrix", amps::copy);
        return new DensityMatrix(n, c, threads);
    }

    /**
     * Applies a unitary {@code rho -> U rho U^dagger} in place; bit {@code j} of the operator's
     * index is {@code qubits[j]}.
     *
     * @param op a unitary operator (within {@value Operator#UNITARY_TOLERANCE})
     * @param qubits distinct qubits, as many as {@code op.qubits()}
     * @return this
     * @throws IllegalArgumentException if the counts differ, a qubit repeats, or the operator
     *     is not unitary (use {@link #apply(Channel, int...)} for a general map)
     * @throws IndexOutOfBoundsException if a qubit is out of range
     */
    public DensityMatrix apply(Operator op, int... qubits) {
        Objects.requireNonNull(op, "op");
        Objects.requireNonNull(qubits, "qubits");
        if (op.qubits() != qubits.length) {
            throw new IllegalArgumentException("operator acts on " + op.qubits()
                    + " qubit(s) but " + qubits.length + " qubit index(es) were given");
        }
        Checks.requireDistinctQubits(qubits, n, "the qubits of the operator");
        if (!op.isUnitary(Operator.UNITARY_TOLERANCE)) {
            throw new IllegalArgumentException("the operator is not unitary within "
                    + Operator.UNITARY_TOLERANCE + "; apply a general map as a Channel");
        }
        DensityKernels.unitary(amps, n, qubits.clone(), new int[0], raw(op), threads);
        return this;
    }

    /**
     * Applies a channel in place: {@code rho -> sum_k K_k rho K_k^dagger} on the given qubits.
     *
     * @param channel the channel
     * @param qubits distinct qubits, as many as {@code channel.qubits()}
     * @return this
     * @throws IllegalArgumentException if the counts differ or a qubit repeats
     * @throws IndexOutOfBoundsException if a qubit is out of range
     */
    public DensityMatrix apply(Channel channel, int... qubits) {
        Objects.requireNonNull(channel, "channel");
        Objects.requireNonNull(qubits, "qubits");
        if (channel.qubits() != qubits.length) {
            throw new IllegalArgumentException("channel acts on " + channel.qubits()
                    + " qubit(s) but " + qubits.length + " qubit index(es) were given");
        }
        Checks.requireDistinctQubits(qubits, n, "the qubits of the channel");
        channel(channel, qubits.clone());
        return this;
    }

    /**
     * Applies the gates, resets and measurements of a circuit in place, without noise: a reset
     * is the channel {@code |0><0|, |0><1|}, a measurement (its outcome not kept) the channel
     * {@code |0><0|, |1><1|}. For noisy runs use {@link dev.qsim.Simulator#withNoise}.
     *
     * @param circuit a circuit on {@link #qubits()} qubits that uses no measured values: no
     *     conditions, loops, assignments or gates with angles computed during the shot; delays
     *     do nothing
     * @return this
     * @throws IllegalArgumentException if the sizes differ or the circuit uses measured values
     */
    public DensityMatrix apply(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        if (circuit.qubits() != n) {
            throw new IllegalArgumentException("the circuit has " + circuit.qubits()
                    + " qubits but the density matrix has " + n);
        }
        for (Instruction in : circuit.instructions()) {
            String why = whyNotUnconditional(in);
            if (why != null) {
                throw new IllegalArgumentException("a density matrix applies gates, resets,"
                        + " delays and measurements, not " + why + "; run circuits that use"
                        + " measured values with Simulator");
            }
        }
        for (Instruction in : circuit.instructions()) {
            switch (in.kind()) {
                case GATE:
                    gate(in);
                    break;
                case RESET:
                    channel(NoiseEngines.RESET, in.targets());
                    break;
                case MEASURE:
                    channel(NoiseEngines.MEASURE, in.targets());
                    break;
                default:
                    break;
            }
        }
        return this;
    }

    /**
     * Says why an instruction needs the shot's classical values (a condition, loop, assignment
     * or gate with angles computed during the shot), or returns null if it does not.
     */
    static String whyNotUnconditional(Instruction in) {
        switch (in.kind()) {
            case GATE:
                return in.isDynamic() ? "the gate '" + in + "' whose angles are computed during"
                        + " the shot" : null;
            case MEASURE:
            case RESET:
            case DELAY:
                return null;
            case ASSIGN:
                return "the assignment '" + in + "'";
            case WHILE:
                return "the loop '" + in + "'";
            default:
                return "the conditioned block '" + in + "'";
        }
    }

    /** Applies a gate instruction with angles known before the shot (no checks). */
    void gate(Instruction in) {
        DensityKernels.unitary(amps, n, in.targets(), in.controls(), raw(in.operator()),
                threads);
    }

    /** Applies a gate whose angles were evaluated during the shot (no checks). */
    void gate(Instruction in, double[] angles) {
        DensityKernels.unitary(amps, n, in.targets(), in.controls(),
                raw(in.gate().operator(angles)), threads);
    }

    /** Applies {@code P rho P} for a 2x2 matrix P on one qubit (no checks; not trace-kept). */
    void project(int q, double[] p) {
        DensityKernels.unitary(amps, n, new int[] {q}, new int[0], p, threads);
    }

    /** Multiplies every entry by {@code a} (no checks); returns this. */
    DensityMatrix scale(double a) {
        DensityKernels.addScaled(amps, a - 1, amps);
        return this;
    }

    /** Adds {@code a} times another matrix of the same size (no checks); returns this. */
    DensityMatrix addScaled(double a, DensityMatrix other) {
        DensityKernels.addScaled(amps, a, other.amps);
        return this;
    }

    /** Applies a channel (no checks). */
    void channel(Channel ch, int[] qubits) {
        DensityKernels.channel(amps, n, qubits, ch.superoperator(), threads);
    }

    /** An operator's matrix, row-major, re/im interleaved. */
    static double[] raw(Operator op) {
        int d = op.dimension();
        double[] m = new double[2 * d * d];
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                Complex z = op.get(r, c);
                m[2 * (r * d + c)] = z.getReal();
                m[2 * (r * d + c) + 1] = z.getImaginary();
            }
        }
        return m;
    }

    /**
     * Returns the entry {@code rho[row][col]}.
     *
     * @param row the row index, in {@code [0, 2^n)}
     * @param col the column index, in {@code [0, 2^n)}
     * @return the entry
     * @throws IndexOutOfBoundsException if an index is out of range
     */
    public Complex get(long row, long col) {
        long d = 1L << n;
        if (row < 0 || row >= d || col < 0 || col >= d) {
            throw new IndexOutOfBoundsException("entry (" + row + ", " + col
                    + ") is out of range [0, " + (d - 1) + "] for a " + n + "-qubit matrix");
        }
        long i = row | (col << n);
        return Complex.ofCartesian(amps.re(i), amps.im(i));
    }

    /**
     * Returns the whole matrix, for at most 12 qubits.
     *
     * @return a new {@code 2^n x 2^n} array
     * @throws IllegalArgumentException if {@code n > 12}
     */
    public Complex[][] toArray() {
        if (n > 12) {
            throw new IllegalArgumentException("toArray is for at most 12 qubits, not " + n);
        }
        int d = 1 << n;
        Complex[][] out = new Complex[d][d];
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                out[r][c] = get(r, c);
            }
        }
        return out;
    }

    /**
     * Returns the trace {@code sum_r Re rho[r][r]} (1 for a state, up to rounding).
     *
     * @return the trace
     */
    public double trace() {
        return DensityKernels.trace(amps, n);
    }

    /**
     * Returns the purity {@code Tr rho^2 = sum |rho[r][c]|^2} (for Hermitian {@code rho}): 1
     * for a pure state, {@code 2^-n} for the completely mixed one (Nielsen and Chuang 2010,
     * Exercise 2.71).
     *
     * @return the purity
     */
    public double purity() {
        return Reductions.norm2(amps, threads);
    }

    /**
     * Returns the probability of each basis outcome: the diagonal {@code Re rho[i][i]},
     * clamped at 0.
     *
     * @return a new array of length {@code 2^n}, index as in {@link dev.qsim}
     */
    public double[] probabilities() {
        return DensityKernels.diagonal(amps, n);
    }

    /**
     * Returns the fidelity {@code <psi| rho |psi>} with a pure state: the square of the
     * fidelity {@code F(|psi>, rho)} of Nielsen and Chuang (2010), §9.2.2 (the squared form
     * is common practice).
     *
     * @param psi a state on the same number of qubits
     * @return the fidelity, in [0, 1] up to rounding
     * @throws IllegalArgumentException if the qubit counts differ
     */
    public double fidelity(StateVector psi) {
        Objects.requireNonNull(psi, "psi");
        if (psi.qubits() != n) {
            throw new IllegalArgumentException("the state has " + psi.qubits()
                    + " qubits but the density matrix has " + n);
        }
        return DensityKernels.fidelity(amps, n, Bridge.states().doubles(psi));
    }

    /**
     * Returns the reduced density matrix of some qubits, tracing out the others (Nielsen and
     * Chuang 2010, §2.4.3). Bit {@code j} of the result's index is {@code qubits[j]}.
     *
     * @param qubits distinct qubits to keep, at least one
     * @return a new density matrix on {@code qubits.length} qubits, same thread count
     * @throws IllegalArgumentException if none is given or a qubit repeats
     * @throws IndexOutOfBoundsException if a qubit is out of range
     */
    public DensityMatrix reduced(int... qubits) {
        Objects.requireNonNull(qubits, "qubits");
        if (qubits.length == 0) {
            throw new IllegalArgumentException("keep at least one qubit");
        }
        Checks.requireDistinctQubits(qubits, n, "the kept qubits");
        DensityMatrix out = allocate(qubits.length).setThreads(threads);
        DensityKernels.reduce(amps, n, qubits.clone(), out.amps);
        return out;
    }

    /**
     * Draws {@code shots} measurement outcomes of the given qubits in the computational basis
     * from the diagonal of {@code rho}, leaving {@code rho} unchanged. Bit {@code j} of each
     * outcome is {@code qubits[j]}; with no qubits given, all of them in order.
     *
     * @param shots the number of shots, at least 1
     * @param rng the source of randomness
     * @param qubits distinct qubits
     * @return the tally
     * @throws IllegalArgumentException if {@code shots < 1} or a qubit repeats
     * @throws IndexOutOfBoundsException if a qubit is out of range
     */
    public Tally sample(int shots, UniformRandomProvider rng, int... qubits) {
        Checks.requireShots(shots);
        Objects.requireNonNull(rng, "rng");
        Objects.requireNonNull(qubits, "qubits");
        int[] qs = qubits;
        if (qs.length == 0) {
            qs = new int[n];
            for (int q = 0; q < n; q++) {
                qs[q] = q;
            }
        }
        Checks.requireDistinctQubits(qs, n, "the sampled qubits");
        double[] p = probabilities();
        double[] marginal = new double[1 << qs.length];
        for (int i = 0; i < p.length; i++) {
            int key = 0;
            for (int j = 0; j < qs.length; j++) {
                key |= ((i >>> qs[j]) & 1) << j;
            }
            marginal[key] += p[i];
        }
        return Tally.sample(marginal, qs.length, shots, rng);
    }

    /**
     * Describes the matrix by its size, trace and purity.
     *
     * @return a short description
     */
    @Override
    public String toString() {
        return "DensityMatrix[" + n + " qubit(s), trace " + trace() + ", purity " + purity()
                + "]";
    }
}
