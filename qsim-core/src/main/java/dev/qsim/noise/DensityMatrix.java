package dev.qsim.noise;

import java.util.Objects;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.Operator;
import dev.qsim.StateVector;
import dev.qsim.Tally;
import dev.qsim.kernel.Args;
import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.Heap;
import dev.qsim.kernel.Internals;
import dev.qsim.kernel.Kernels;
import dev.qsim.kernel.Reductions;
import dev.qsim.observable.Observable;

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

    private static final int[] NONE = new int[0];

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
        DensityMatrix rho = allocate(psi.qubits());
        Amplitudes a = Internals.access().amplitudes(psi);
        long d = 1L << rho.n;
        for (long c = 0; c < d; c++) {
            double cr = a.re(c);
            double ci = -a.im(c);
            for (long r = 0; r < d; r++) {
                double ar = a.re(r);
                double ai = a.im(r);
                rho.amps.set(r | (c << rho.n), ar * cr - ai * ci, ar * ci + ai * cr);
            }
        }
        return rho;
    }

    private static DensityMatrix allocate(int n) {
        requireCount(n);
        long bytes = Amplitudes.bytes(2 * n);
        Heap.require(bytes, "a " + n + "-qubit density matrix");
        return new DensityMatrix(n, Amplitudes.allocate(2 * n),
                Math.max(1, Math.min(256, Runtime.getRuntime().availableProcessors())));
    }

    private static void requireCount(int n) {
        if (n < 1 || n > MAX_QUBITS) {
            throw new IllegalArgumentException("qubit count " + n + " is out of range [1, "
                    + MAX_QUBITS + "] for a density matrix");
        }
    }

    /**
     * Sets the number of threads the kernels use; results do not depend on it.
     *
     * @param threads 1 to 256
     * @return this
     * @throws IllegalArgumentException if {@code threads} is out of range
     */
    public DensityMatrix withThreads(int threads) {
        Args.requireThreads(threads);
        this.threads = threads;
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
     * @return {@code n}
     */
    public int qubits() {
        return n;
    }

    /**
     * Returns an independent copy.
     *
     * @return the copy, same thread count
     * @throws IllegalStateException if the heap cannot hold it
     */
    public DensityMatrix copy() {
        Heap.require(Amplitudes.bytes(2 * n), "a copy of a " + n + "-qubit density matrix");
        return new DensityMatrix(n, amps.copy(), threads);
    }

    /**
     * Applies a unitary: {@code rho -> U rho U^dagger}, bit {@code j} of the matrix index on
     * {@code qubits[j]}.
     *
     * @param op the operator (meant to be unitary; not checked again)
     * @param qubits distinct qubits, as many as {@code op.qubits()}
     * @return this
     * @throws IllegalArgumentException if the qubit count differs or a qubit repeats
     * @throws IndexOutOfBoundsException if a qubit is out of range
     */
    public DensityMatrix apply(Operator op, int... qubits) {
        Objects.requireNonNull(op, "op");
        Objects.requireNonNull(qubits, "qubits");
        if (op.qubits() != qubits.length) {
            throw new IllegalArgumentException("operator acts on " + op.qubits()
                    + " qubit(s) but " + qubits.length + " qubit index(es) were given");
        }
        Args.requireDistinctQubits(qubits, n, "the qubits of the operator");
        unitary(op, qubits.clone(), NONE);
        return this;
    }

    /**
     * Applies a channel: {@code rho -> sum_k K_k rho K_k^dagger}, bit {@code j} of the Kraus
     * matrix index on {@code qubits[j]}.
     *
     * @param channel the channel
     * @param qubits distinct qubits, as many as {@code channel.qubits()}
     * @return this
     * @throws IllegalArgumentException if the qubit count differs or a qubit repeats
     * @throws IndexOutOfBoundsException if a qubit is out of range
     */
    public DensityMatrix apply(Channel channel, int... qubits) {
        Objects.requireNonNull(channel, "channel");
        Objects.requireNonNull(qubits, "qubits");
        if (channel.qubits() != qubits.length) {
            throw new IllegalArgumentException("channel acts on " + channel.qubits()
                    + " qubit(s) but " + qubits.length + " qubit index(es) were given");
        }
        Args.requireDistinctQubits(qubits, n, "the qubits of the channel");
        channel(channel, qubits);
        return this;
    }

    /**
     * Applies the gates and resets of a circuit without noise (a reset is the channel with
     * Kraus operators {@code |0><0|} and {@code |0><1|}).
     *
     * @param circuit a circuit on {@link #qubits()} qubits with only gates and resets
     * @return this
     * @throws IllegalArgumentException if the qubit counts differ or the circuit measures or
     *     has a conditioned block
     */
    public DensityMatrix apply(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        if (circuit.qubits() != n) {
            throw new IllegalArgumentException("the circuit has " + circuit.qubits()
                    + " qubits but the density matrix has " + n);
        }
        for (Instruction in : circuit.instructions()) {
            if (in.kind() == Instruction.Kind.GATE) {
                gate(in);
            } else if (in.kind() == Instruction.Kind.RESET) {
                channel(NoisyRunner.RESET, in.targets());
            } else {
                throw new IllegalArgumentException("a density matrix applies gates and resets "
                        + "only, not '" + in.name() + "'; run measured circuits with NoisyRunner");
            }
        }
        return this;
    }

    void gate(Instruction in) {
        unitary(in.operator(), in.targets(), in.controls());
    }

    private void unitary(Operator op, int[] targets, int[] controls) {
        int d = op.dimension();
        double[] m = new double[2 * d * d];
        double[] mc = new double[2 * d * d];
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                Complex z = op.get(r, c);
                int o = 2 * (r * d + c);
                m[o] = z.getReal();
                m[o + 1] = z.getImaginary();
                mc[o] = z.getReal();
                mc[o + 1] = -z.getImaginary();
            }
        }
        Kernels.dense(amps, targets, controls, m, threads);
        Kernels.dense(amps, shift(targets), shift(controls), mc, threads);
    }

    void channel(Channel ch, int[] qubits) {
        int k = qubits.length;
        int[] both = new int[2 * k];
        for (int j = 0; j < k; j++) {
            both[j] = qubits[j];
            both[k + j] = qubits[j] + n;
        }
        Kernels.dense(amps, both, NONE, ch.superoperator(), threads);
    }

    private int[] shift(int[] qs) {
        int[] out = new int[qs.length];
        for (int j = 0; j < qs.length; j++) {
            out[j] = qs[j] + n;
        }
        return out;
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
                long i = r | ((long) c << n);
                out[r][c] = Complex.ofCartesian(amps.re(i), amps.im(i));
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
        long d = 1L << n;
        double t = 0;
        for (long r = 0; r < d; r++) {
            t += amps.re(r | (r << n));
        }
        return t;
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
        int d = 1 << n;
        double[] p = new double[d];
        for (int r = 0; r < d; r++) {
            p[r] = Math.max(0, amps.re(r | ((long) r << n)));
        }
        return p;
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
        Amplitudes a = Internals.access().amplitudes(psi);
        long d = 1L << n;
        double re = 0;
        for (long c = 0; c < d; c++) {
            // (rho psi)_r summed against conj(psi_r)
            double pr = a.re(c);
            double pi = a.im(c);
            for (long r = 0; r < d; r++) {
                long i = r | (c << n);
                double xr = amps.re(i) * pr - amps.im(i) * pi;
                double xi = amps.re(i) * pi + amps.im(i) * pr;
                re += a.re(r) * xr + a.im(r) * xi;
            }
        }
        return re;
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
        Args.requireDistinctQubits(qubits, n, "the kept qubits");
        int m = qubits.length;
        long keptMask = 0;
        for (int q : qubits) {
            keptMask |= 1L << q;
        }
        int[] traced = new int[n - m];
        int t = 0;
        for (int q = 0; q < n; q++) {
            if ((keptMask >>> q & 1L) == 0) {
                traced[t++] = q;
            }
        }
        int dk = 1 << m;
        long[] keptIndex = new long[dk];
        for (int a = 0; a < dk; a++) {
            long x = 0;
            for (int j = 0; j < m; j++) {
                x |= (long) ((a >>> j) & 1) << qubits[j];
            }
            keptIndex[a] = x;
        }
        DensityMatrix out = allocate(m).withThreads(threads);
        long dt = 1L << traced.length;
        for (long b = 0; b < dt; b++) {
            long y = 0;
            for (int j = 0; j < traced.length; j++) {
                y |= ((b >>> j) & 1L) << traced[j];
            }
            for (int c = 0; c < dk; c++) {
                long col = (keptIndex[c] | y) << n;
                for (int r = 0; r < dk; r++) {
                    long i = (keptIndex[r] | y) | col;
                    long o = r | ((long) c << m);
                    out.amps.set(o, out.amps.re(o) + amps.re(i), out.amps.im(o) + amps.im(i));
                }
            }
        }
        return out;
    }

    /**
     * Returns the expectation value {@code Tr(rho H)} of an observable (Nielsen and Chuang
     * 2010, §2.4.1), for at most 12 qubits.
     *
     * @param h the observable, with {@code h.span() <= n}
     * @return the real part of {@code Tr(rho H)} (the imaginary part vanishes for Hermitian
     *     {@code H} and {@code rho})
     * @throws IllegalArgumentException if {@code n > 12} or the observable acts beyond the
     *     register
     */
    public double expectation(Observable h) {
        Objects.requireNonNull(h, "h");
        if (n > Operator.MAX_QUBITS) {
            throw new IllegalArgumentException("expectation is for at most "
                    + Operator.MAX_QUBITS + " qubits, not " + n);
        }
        if (h.span() > n) {
            throw new IllegalArgumentException("the observable acts on qubit "
                    + (h.span() - 1) + " but the density matrix has " + n + " qubits");
        }
        Operator op = h.toOperator(n);
        int d = 1 << n;
        double re = 0;
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                Complex z = op.get(c, r);
                long i = r | ((long) c << n);
                re += amps.re(i) * z.getReal() - amps.im(i) * z.getImaginary();
            }
        }
        return re;
    }

    /**
     * Draws {@code shots} measurement outcomes of the given qubits in the computational basis
     * from the diagonal of {@code rho}, leaving {@code rho} unchanged. Bit {@code j} of each
     * outcome is {@code qubits[j]}; with no qubits given, all of them in order.
     *
     * @param shots the number of shots, at least 1
     * @param rng the source of randomness
     * @param qubits distinct qubits, at most 30
     * @return the tally
     * @throws IllegalArgumentException if {@code shots < 1} or a qubit repeats
     * @throws IndexOutOfBoundsException if a qubit is out of range
     */
    public Tally sample(int shots, UniformRandomProvider rng, int... qubits) {
        Args.requirePositiveShots(shots);
        Objects.requireNonNull(rng, "rng");
        Objects.requireNonNull(qubits, "qubits");
        int[] qs = qubits;
        if (qs.length == 0) {
            qs = new int[n];
            for (int q = 0; q < n; q++) {
                qs[q] = q;
            }
        }
        Args.requireDistinctQubits(qs, n, "the sampled qubits");
        double[] p = probabilities();
        double[] marginal = new double[1 << qs.length];
        for (int i = 0; i < p.length; i++) {
            int key = 0;
            for (int j = 0; j < qs.length; j++) {
                key |= ((i >>> qs[j]) & 1) << j;
            }
            marginal[key] += p[i];
        }
        return Sampling.tally(marginal, qs.length, shots, rng);
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
