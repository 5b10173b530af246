package dev.qsim.kernel;

/**
 * In-place gate kernels on {@link Amplitudes}. One kernel per shape, chosen once per
 * instruction: dense single-qubit, dense k-qubit, diagonal (phases only) and monomial
 * (permutation with phases), each with optional control qubits that restrict the work to the
 * subspace where every control is 1. Matrices are row-major with re/im interleaved; bit
 * {@code j} of a matrix index is qubit {@code targets[j]}. Unchecked: targets and controls are
 * distinct and below the qubit count. Internal.
 *
 * <p>Every kernel is element-wise over independent groups of amplitudes, so its result does
 * not depend on the thread count. Method: M. Smelyanskiy, N. P. D. Sawaya, A. Aspuru-Guzik,
 * "qHiPSTER: the quantum high performance software testing environment", arXiv:1601.07195
 * (2016), §3 (pairwise amplitude updates with strided indexing).
 */
public final class Kernels {
    private Kernels() {
    }

    /**
     * Applies a dense 2x2 matrix to qubit {@code q} with no controls.
     *
     * @param a amplitudes. Modified.
     * @param q the target qubit
     * @param m matrix, length 8. Not modified.
     * @param threads threads to use
     */
    public static void dense1(Amplitudes a, int q, double[] m, int threads) {
        final long pairs = 1L << (a.n - 1);
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        if (q < a.chunkLog) {
            final long blocks = pairs >>> q;
            Parallel.forRange(threads, blocks, par, (from, to) -> dense1Low(a, q, m, from, to));
        } else {
            Parallel.forRange(threads, pairs, par, (from, to) -> dense1High(a, q, m, from, to));
        }
    }

    /** Target inside a chunk: blocks of 2^(q+1) amplitudes, pairs (i, i + 2^q). */
    private static void dense1Low(Amplitudes a, int q, double[] m, long from, long to) {
        final int blocksPerChunkLog = a.chunkLog - q - 1;
        long b = from;
        while (b < to) {
            final int c = (int) (b >>> blocksPerChunkLog);
            final long end = Math.min(to, ((long) c + 1) << blocksPerChunkLog);
            final int first = (int) (b - ((long) c << blocksPerChunkLog));
            dense1InChunk(a.chunks[c], q, m, first, (int) (end - b));
            b = end;
        }
    }

    private static void dense1InChunk(double[] psi, int q, double[] m, int firstBlock, int count) {
        final double m00r = m[0], m00i = m[1], m01r = m[2], m01i = m[3];
        final double m10r = m[4], m10i = m[5], m11r = m[6], m11i = m[7];
        final int stride = 1 << q;
        final int s2 = stride << 1;
        final int start = firstBlock << (q + 2);
        final int end = start + (count << (q + 2));
        for (int block = start; block < end; block += s2 << 1) {
            final int blockEnd = block + s2;
            for (int x = block; x < blockEnd; x += 2) {
                final int y = x + s2;
                final double ar = psi[x], ai = psi[x + 1], br = psi[y], bi = psi[y + 1];
                psi[x] = m00r * ar - m00i * ai + m01r * br - m01i * bi;
                psi[x + 1] = m00r * ai + m00i * ar + m01r * bi + m01i * br;
                psi[y] = m10r * ar - m10i * ai + m11r * br - m11i * bi;
                psi[y + 1] = m10r * ai + m10i * ar + m11r * bi + m11i * br;
            }
        }
    }

    /** Target at or above the chunk size: pair chunk c with chunk c | 2^(q - chunkLog). */
    private static void dense1High(Amplitudes a, int q, double[] m, long from, long to) {
        final int cl = a.chunkLog;
        final int hb = q - cl;
        long p = from;
        while (p < to) {
            final long pairChunk = p >>> cl;
            final long end = Math.min(to, (pairChunk + 1) << cl);
            final long lowMask = (1L << hb) - 1;
            final int c0 = (int) (((pairChunk >>> hb) << (hb + 1)) | (pairChunk & lowMask));
            final int c1 = c0 | (1 << hb);
            final int off = (int) (p & a.chunkMask);
            dense1Pair(a.chunks[c0], a.chunks[c1], m, off << 1, (off + (int) (end - p)) << 1);
            p = end;
        }
    }

    private static void dense1Pair(double[] u, double[] v, double[] m, int from, int to) {
        final double m00r = m[0], m00i = m[1], m01r = m[2], m01i = m[3];
        final double m10r = m[4], m10i = m[5], m11r = m[6], m11i = m[7];
        for (int x = from; x < to; x += 2) {
            final double ar = u[x], ai = u[x + 1], br = v[x], bi = v[x + 1];
            u[x] = m00r * ar - m00i * ai + m01r * br - m01i * bi;
            u[x + 1] = m00r * ai + m00i * ar + m01r * bi + m01i * br;
            v[x] = m10r * ar - m10i * ai + m11r * br - m11i * bi;
            v[x + 1] = m10r * ai + m10i * ar + m11r * bi + m11i * br;
        }
    }

    /** The shape of a gate's index set: sorted positions, control mask, target offsets. */
    private static final class Layout {
        final long[] offsets;   // 2^k, bit j of the index -> 1 << targets[j]
        final int[] positions;  // targets and controls, ascending
        final long controlMask;
        final int runLog;       // low free bits handled as a contiguous run
        final long outer;       // number of runs

        Layout(Amplitudes a, int[] targets, int[] controls) {
            int k = targets.length;
            offsets = new long[1 << k];
            for (int j = 0; j < offsets.length; j++) {
                long o = 0;
                for (int t = 0; t < k; t++) {
                    if ((j >>> t & 1) != 0) {
                        o |= 1L << targets[t];
                    }
                }
                offsets[j] = o;
            }
            positions = new int[k + controls.length];
            long cm = 0;
            for (int t = 0; t < k; t++) {
                positions[t] = targets[t];
            }
            for (int c = 0; c < controls.length; c++) {
                positions[k + c] = controls[c];
                cm |= 1L << controls[c];
            }
            java.util.Arrays.sort(positions);
            controlMask = cm;
            runLog = Math.min(positions[0], a.chunkLog);
            outer = 1L << (a.n - positions.length - runLog);
        }

        long base(long o) {
            long x = o << runLog;
            for (int p : positions) {
                x = ((x >>> p) << (p + 1)) | (x & ((1L << p) - 1));
            }
            return x | controlMask;
        }
    }

    /**
     * Applies a dense {@code 2^k x 2^k} matrix to the given targets, where every control is 1.
     *
     * @param a amplitudes. Modified.
     * @param targets target qubits, bit j of the matrix index is targets[j]
     * @param controls control qubits (may be empty)
     * @param m matrix, length 2 * 4^k. Not modified.
     * @param threads threads to use
     */
    public static void dense(Amplitudes a, int[] targets, int[] controls, double[] m, int threads) {
        if (targets.length == 1 && controls.length == 0) {
            dense1(a, targets[0], m, threads);
            return;
        }
        final Layout l = new Layout(a, targets, controls);
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        Parallel.forRange(threads, l.outer, par, (from, to) -> denseRuns(a, l, m, from, to));
    }

    private static void denseRuns(Amplitudes a, Layout l, double[] m, long from, long to) {
        final int d = l.offsets.length;
        final double[][] arr = new double[d][];
        final int[] off = new int[d];
        final double[] vr = new double[d];
        final double[] vi = new double[d];
        final int run = 1 << l.runLog;
        for (long o = from; o < to; o++) {
            final long base = l.base(o);
            for (int j = 0; j < d; j++) {
                final long idx = base | l.offsets[j];
                arr[j] = a.chunks[(int) (idx >>> a.chunkLog)];
                off[j] = (int) (idx & a.chunkMask) << 1;
            }
            for (int r = 0; r < run; r++) {
                final int r2 = r << 1;
                for (int j = 0; j < d; j++) {
                    vr[j] = arr[j][off[j] + r2];
                    vi[j] = arr[j][off[j] + r2 + 1];
                }
                for (int i = 0; i < d; i++) {
                    double sr = 0;
                    double si = 0;
                    final int row = 2 * i * d;
                    for (int j = 0; j < d; j++) {
                        final double mr = m[row + 2 * j];
                        final double mi = m[row + 2 * j + 1];
                        sr += mr * vr[j] - mi * vi[j];
                        si += mr * vi[j] + mi * vr[j];
                    }
                    arr[i][off[i] + r2] = sr;
                    arr[i][off[i] + r2 + 1] = si;
                }
            }
        }
    }

    /**
     * Multiplies each amplitude by the diagonal entry its target bits select, where every
     * control is 1. Reads no partner amplitudes.
     *
     * @param a amplitudes. Modified.
     * @param targets target qubits
     * @param controls control qubits (may be empty)
     * @param diag the diagonal, re/im interleaved, length 2 * 2^k. Not modified.
     * @param threads threads to use
     */
    public static void diagonal(Amplitudes a, int[] targets, int[] controls, double[] diag,
            int threads) {
        final Layout l = new Layout(a, targets, controls);
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        Parallel.forRange(threads, l.outer, par, (from, to) -> diagonalRuns(a, l, diag, from, to));
    }

    private static void diagonalRuns(Amplitudes a, Layout l, double[] diag, long from, long to) {
        final int d = l.offsets.length;
        final int run2 = 2 << l.runLog;
        for (long o = from; o < to; o++) {
            final long base = l.base(o);
            for (int j = 0; j < d; j++) {
                final double dr = diag[2 * j];
                final double di = diag[2 * j + 1];
                if (dr == 1 && di == 0) {
                    continue;
                }
                final long idx = base | l.offsets[j];
                final double[] psi = a.chunks[(int) (idx >>> a.chunkLog)];
                final int start = (int) (idx & a.chunkMask) << 1;
                final int end = start + run2;
                for (int x = start; x < end; x += 2) {
                    final double re = psi[x];
                    final double im = psi[x + 1];
                    psi[x] = dr * re - di * im;
                    psi[x + 1] = dr * im + di * re;
                }
            }
        }
    }

    /**
     * Applies a monomial matrix (one non-zero entry per row and column): basis state {@code j}
     * of the targets goes to {@code perm[j]} times {@code phase[j]}, where every control is 1.
     * Moves amplitudes without arithmetic when every phase is exactly 1.
     *
     * @param a amplitudes. Modified.
     * @param targets target qubits
     * @param controls control qubits (may be empty)
     * @param perm destination of each column, length 2^k. Not modified.
     * @param phase the non-zero entry of each column, re/im interleaved. Not modified.
     * @param threads threads to use
     */
    public static void monomial(Amplitudes a, int[] targets, int[] controls, int[] perm,
            double[] phase, int threads) {
        final Layout l = new Layout(a, targets, controls);
        boolean ones = true;
        for (int j = 0; j < perm.length; j++) {
            ones &= phase[2 * j] == 1 && phase[2 * j + 1] == 0;
        }
        final boolean pure = ones;
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        Parallel.forRange(threads, l.outer, par,
                (from, to) -> monomialRuns(a, l, perm, phase, pure, from, to));
    }

    private static void monomialRuns(Amplitudes a, Layout l, int[] perm, double[] phase,
            boolean pure, long from, long to) {
        final int d = l.offsets.length;
        final double[][] arr = new double[d][];
        final int[] off = new int[d];
        final double[] vr = new double[d];
        final double[] vi = new double[d];
        final int run = 1 << l.runLog;
        for (long o = from; o < to; o++) {
            final long base = l.base(o);
            for (int j = 0; j < d; j++) {
                final long idx = base | l.offsets[j];
                arr[j] = a.chunks[(int) (idx >>> a.chunkLog)];
                off[j] = (int) (idx & a.chunkMask) << 1;
            }
            if (d == 2 && pure && perm[0] == 1) {
                // A controlled or plain X: swap two runs.
                swapRuns(arr[0], off[0], arr[1], off[1], run);
                continue;
            }
            for (int r = 0; r < run; r++) {
                final int r2 = r << 1;
                for (int j = 0; j < d; j++) {
                    vr[j] = arr[j][off[j] + r2];
                    vi[j] = arr[j][off[j] + r2 + 1];
                }
                for (int j = 0; j < d; j++) {
                    final int t = perm[j];
                    if (pure) {
                        arr[t][off[t] + r2] = vr[j];
                        arr[t][off[t] + r2 + 1] = vi[j];
                    } else {
                        final double pr = phase[2 * j];
                        final double pi = phase[2 * j + 1];
                        arr[t][off[t] + r2] = pr * vr[j] - pi * vi[j];
                        arr[t][off[t] + r2 + 1] = pr * vi[j] + pi * vr[j];
                    }
                }
            }
        }
    }

    private static void swapRuns(double[] u, int uo, double[] v, int vo, int run) {
        final int n2 = run << 1;
        for (int x = 0; x < n2; x++) {
            final double t = u[uo + x];
            u[uo + x] = v[vo + x];
            v[vo + x] = t;
        }
    }
}
