package dev.qsim.kernel;

/**
 * Loops over a density matrix stored as a vectorised state of {@code 2n} qubits: entry
 * {@code rho[r][c]} is amplitude {@code r | c << n} (column stacking, so {@code U rho U†} is
 * {@code U} on the row qubits and {@code conj(U)} on the column qubits; Horn and Johnson 1991,
 * <i>Topics in Matrix Analysis</i>, Lemma 4.3.1). Storage in double precision, never framed.
 * Unchecked: callers validate. Internal.
 */
public final class DensityKernels {
    private static final int[] NONE = new int[0];

    private DensityKernels() {
    }

    /**
     * Writes {@code |psi><psi|} into {@code rho}.
     *
     * @param psi the pure state, n qubits. Not modified.
     * @param rho zero storage of 2n qubits. Modified.
     */
    public static void fromPure(Amplitudes psi, Amplitudes rho) {
        psi.settle();
        int n = psi.n;
        long d = 1L << n;
        for (long c = 0; c < d; c++) {
            double cr = psi.re(c);
            double ci = -psi.im(c);
            for (long r = 0; r < d; r++) {
                double ar = psi.re(r);
                double ai = psi.im(r);
                rho.set(r | (c << n), ar * cr - ai * ci, ar * ci + ai * cr);
            }
        }
    }

    /**
     * Applies {@code U rho U†} for a (controlled) k-qubit matrix.
     *
     * @param rho the density matrix on {@code 2n} qubits. Modified.
     * @param n its qubit count
     * @param targets target qubits in {@code [0, n)}
     * @param controls control qubits in {@code [0, n)}
     * @param m the matrix on the targets, row-major, re/im interleaved
     * @param threads threads to use
     */
    public static void unitary(Amplitudes rho, int n, int[] targets, int[] controls, double[] m,
            int threads) {
        double[] conj = m.clone();
        for (int i = 1; i < conj.length; i += 2) {
            conj[i] = -conj[i];
        }
        DenseKernels.apply(rho, targets, controls, m, threads);
        DenseKernels.apply(rho, shift(targets, n), shift(controls, n), conj, threads);
    }

    /**
     * Applies a channel given by its superoperator {@code Σ K ⊗ conj(K)} on 2k qubits.
     *
     * @param rho the density matrix on {@code 2n} qubits. Modified.
     * @param n its qubit count
     * @param qubits the channel's qubits in {@code [0, n)}
     * @param superoperator the {@code 4^k x 4^k} matrix, row index {@code r + c·2^k}
     * @param threads threads to use
     */
    public static void channel(Amplitudes rho, int n, int[] qubits, double[] superoperator,
            int threads) {
        int k = qubits.length;
        int[] both = new int[2 * k];
        for (int j = 0; j < k; j++) {
            both[j] = qubits[j];
            both[k + j] = qubits[j] + n;
        }
        DenseKernels.apply(rho, both, NONE, superoperator, threads);
    }

    private static int[] shift(int[] qs, int n) {
        int[] out = new int[qs.length];
        for (int j = 0; j < qs.length; j++) {
            out[j] = qs[j] + n;
        }
        return out;
    }

    /**
     * Returns {@code Σ_r Re rho[r][r]}.
     *
     * @param rho the storage. Not modified.
     * @param n the qubit count
     * @return the trace
     */
    public static double trace(Amplitudes rho, int n) {
        long d = 1L << n;
        double t = 0;
        for (long r = 0; r < d; r++) {
            t += rho.re(r | (r << n));
        }
        return t;
    }

    /**
     * Returns the diagonal {@code Re rho[i][i]}, clamped at 0.
     *
     * @param rho the storage. Not modified.
     * @param n the qubit count, at most 30
     * @return a new array of length {@code 2^n}
     */
    public static double[] diagonal(Amplitudes rho, int n) {
        int d = 1 << n;
        double[] p = new double[d];
        for (int r = 0; r < d; r++) {
            p[r] = Math.max(0, rho.re(r | ((long) r << n)));
        }
        return p;
    }

    /**
     * Returns {@code Re <psi| rho |psi>}.
     *
     * @param rho the storage. Not modified.
     * @param n the qubit count
     * @param psi the state, double precision. Not modified.
     * @return the fidelity with the pure state
     */
    public static double fidelity(Amplitudes rho, int n, Amplitudes psi) {
        psi.settle();
        long d = 1L << n;
        double re = 0;
        for (long c = 0; c < d; c++) {
            double pr = psi.re(c);
            double pi = psi.im(c);
            for (long r = 0; r < d; r++) {
                long i = r | (c << n);
                double xr = rho.re(i) * pr - rho.im(i) * pi;
                double xi = rho.re(i) * pi + rho.im(i) * pr;
                re += psi.re(r) * xr + psi.im(r) * xi;
            }
        }
        return re;
    }

    /**
     * Writes the reduced density matrix of the kept qubits (bit {@code j} of its index is
     * {@code kept[j]}) into {@code out}, tracing out the others.
     *
     * @param rho the storage of 2n qubits. Not modified.
     * @param n its qubit count
     * @param kept distinct qubits in {@code [0, n)}
     * @param out zero storage of {@code 2·kept.length} qubits. Modified.
     */
    public static void reduce(Amplitudes rho, int n, int[] kept, Amplitudes out) {
        int m = kept.length;
        long keptMask = 0;
        for (int q : kept) {
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
                x |= (long) ((a >>> j) & 1) << kept[j];
            }
            keptIndex[a] = x;
        }
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
                    out.set(o, out.re(o) + rho.re(i), out.im(o) + rho.im(i));
                }
            }
        }
    }

    /**
     * Returns {@code Re Tr(rho H)} for a dense matrix {@code H} on all n qubits.
     *
     * @param rho the storage. Not modified.
     * @param n the qubit count, at most 12
     * @param h the matrix, row-major, re/im interleaved, {@code 2^n x 2^n}
     * @return the real part of the trace
     */
    public static double expectation(Amplitudes rho, int n, double[] h) {
        int d = 1 << n;
        double re = 0;
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                // Tr(rho H) = Σ rho[r][c] H[c][r]
                int o = 2 * (c * d + r);
                long i = r | ((long) c << n);
                re += rho.re(i) * h[o] - rho.im(i) * h[o + 1];
            }
        }
        return re;
    }

    /**
     * Adds a multiple of one storage to another of the same size: {@code y += a x}.
     *
     * @param y the sum. Modified.
     * @param a the factor
     * @param x the added storage, same qubits and chunk size. Not modified.
     */
    public static void addScaled(Amplitudes y, double a, Amplitudes x) {
        double[][] yc = y.chunks;
        double[][] xc = x.chunks;
        for (int c = 0; c < yc.length; c++) {
            double[] yy = yc[c];
            double[] xx = xc[c];
            for (int i = 0; i < yy.length; i++) {
                yy[i] += a * xx[i];
            }
        }
    }
}
