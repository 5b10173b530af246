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

    private static final class Dense1Plan extends Plan {
        final int q;
        final double[] m;

        Dense1Plan(Amplitudes a, int q, double[] m) {
            super(a);
            this.q = q;
            this.m = m;
        }

        @Override
        long units() {
            return Layout.singleUnits(a, q);
        }

        @Override
        void run(long from, long to) {
            if (q >= a.chunkLog) {
                dense1High(a, q, m, from, to);
            } else if (q <= Layout.PIECE_LOG) {
                dense1Low(a, q, m, from, to);
            } else {
                for (long u = from; u < to; u++) {
                    final long base = Layout.pieceBase(q, u);
                    final double[] psi = a.chunks[(int) (base >>> a.chunkLog)];
                    final int x = (int) (base & a.chunkMask) << 1;
                    dense1Pair(psi, x, psi, x + (2 << q), 1 << Layout.PIECE_LOG, m);
                }
            }
        }

        @Override
        long unitsPerBlock(int blockLog) {
            return Layout.singleUnitsPerBlock(q, blockLog);
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
        final int start = firstBlock << (q + 2);
        final int end = start + (count << (q + 2));
        if (isReal(m)) {
            real1InChunk(psi, q, m00r, m01r, m10r, m11r, start, end);
            return;
        }
        if (isCrossImaginary(m)) {
            if (q == 0) {
                crossPairs(psi, start, psi, start + 2, (end - start) >> 2, 4,
                        m00r, m01i, m10i, m11r);
                return;
            }
            final int s2 = 2 << q;
            for (int block = start; block < end; block += s2 << 1) {
                crossPairs(psi, block, psi, block + s2, 1 << q, 2, m00r, m01i, m10i, m11r);
            }
            return;
        }
        if (q == 0) {
            // Pairs are neighbours: one flat loop the JIT can unroll.
            for (int x = start; x < end; x += 4) {
                final double ar = psi[x], ai = psi[x + 1], br = psi[x + 2], bi = psi[x + 3];
                psi[x] = m00r * ar - m00i * ai + m01r * br - m01i * bi;
                psi[x + 1] = m00r * ai + m00i * ar + m01r * bi + m01i * br;
                psi[x + 2] = m10r * ar - m10i * ai + m11r * br - m11i * bi;
                psi[x + 3] = m10r * ai + m10i * ar + m11r * bi + m11i * br;
            }
            return;
        }
        if (q == 1) {
            for (int x = start; x < end; x += 8) {
                double ar = psi[x], ai = psi[x + 1], br = psi[x + 4], bi = psi[x + 5];
                psi[x] = m00r * ar - m00i * ai + m01r * br - m01i * bi;
                psi[x + 1] = m00r * ai + m00i * ar + m01r * bi + m01i * br;
                psi[x + 4] = m10r * ar - m10i * ai + m11r * br - m11i * bi;
                psi[x + 5] = m10r * ai + m10i * ar + m11r * bi + m11i * br;
                ar = psi[x + 2];
                ai = psi[x + 3];
                br = psi[x + 6];
                bi = psi[x + 7];
                psi[x + 2] = m00r * ar - m00i * ai + m01r * br - m01i * bi;
                psi[x + 3] = m00r * ai + m00i * ar + m01r * bi + m01i * br;
                psi[x + 6] = m10r * ar - m10i * ai + m11r * br - m11i * bi;
                psi[x + 7] = m10r * ai + m10i * ar + m11r * bi + m11i * br;
            }
            return;
        }
        final int s2 = 2 << q;
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

    /**
     * Whether a 2x2 matrix (re/im interleaved) has no imaginary part: H, RY and their products.
     * Such a matrix needs half the arithmetic (four real products per amplitude pair and part).
     */
    static boolean isReal(double[] m) {
        return m[1] == 0 && m[3] == 0 && m[5] == 0 && m[7] == 0;
    }

    /**
     * Whether a 2x2 matrix (re/im interleaved) has a real diagonal and an imaginary
     * off-diagonal, as RX has: half the arithmetic of a complex matrix, like a real one.
     */
    static boolean isCrossImaginary(double[] m) {
        return m[1] == 0 && m[2] == 0 && m[4] == 0 && m[7] == 0;
    }

    /**
     * {@code count} pairs {@code (u[uo + k], v[vo + k])}, k stepping by {@code step} doubles,
     * times a matrix {@code [[d0, i o01], [i o10, d1]]} with d0, o01, o10, d1 real.
     */
    private static void crossPairs(double[] u, int uo, double[] v, int vo, int count, int step,
            double d0, double o01, double o10, double d1) {
        final int len = count * step;
        for (int k = 0; k < len; k += step) {
            final int x = uo + k;
            final int y = vo + k;
            final double ar = u[x], ai = u[x + 1], br = v[y], bi = v[y + 1];
            u[x] = d0 * ar - o01 * bi;
            u[x + 1] = d0 * ai + o01 * br;
            v[y] = d1 * br - o10 * ai;
            v[y + 1] = d1 * bi + o10 * ar;
        }
    }

    /** {@link #dense1InChunk} for a real matrix, on the array offsets {@code [start, end)}. */
    private static void real1InChunk(double[] psi, int q, double m00, double m01, double m10,
            double m11, int start, int end) {
        if (q == 0) {
            for (int x = start; x < end; x += 4) {
                final double ar = psi[x], ai = psi[x + 1], br = psi[x + 2], bi = psi[x + 3];
                psi[x] = m00 * ar + m01 * br;
                psi[x + 1] = m00 * ai + m01 * bi;
                psi[x + 2] = m10 * ar + m11 * br;
                psi[x + 3] = m10 * ai + m11 * bi;
            }
            return;
        }
        // With q >= 1 both halves of a block are runs of at least four doubles; re and im parts
        // take the same real coefficients, so each run is one flat loop over doubles.
        final int s2 = 2 << q;
        for (int block = start; block < end; block += s2 << 1) {
            realRuns(psi, block, psi, block + s2, s2, m00, m01, m10, m11);
        }
    }

    /** {@code (u[uo + k], v[vo + k]) <- M (u[uo + k], v[vo + k])} for k below len, M real. */
    private static void realRuns(double[] u, int uo, double[] v, int vo, int len, double m00,
            double m01, double m10, double m11) {
        for (int k = 0; k < len; k++) {
            final double a = u[uo + k];
            final double b = v[vo + k];
            u[uo + k] = m00 * a + m01 * b;
            v[vo + k] = m10 * a + m11 * b;
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
            dense1Pair(a.chunks[c0], off << 1, a.chunks[c1], off << 1, (int) (end - p), m);
            p = end;
        }
    }

    private static void dense1Pair(double[] u, int uo, double[] v, int vo, int count,
            double[] m) {
        final double m00r = m[0], m00i = m[1], m01r = m[2], m01i = m[3];
        final double m10r = m[4], m10i = m[5], m11r = m[6], m11i = m[7];
        final int n2 = count << 1;
        if (isReal(m)) {
            realRuns(u, uo, v, vo, n2, m00r, m01r, m10r, m11r);
            return;
        }
        if (isCrossImaginary(m)) {
            crossPairs(u, uo, v, vo, count, 2, m00r, m01i, m10i, m11r);
            return;
        }
        for (int k = 0; k < n2; k += 2) {
            final int x = uo + k;
            final int y = vo + k;
            final double ar = u[x], ai = u[x + 1], br = v[y], bi = v[y + 1];
            u[x] = m00r * ar - m00i * ai + m01r * br - m01i * bi;
            u[x + 1] = m00r * ai + m00i * ar + m01r * bi + m01i * br;
            v[y] = m10r * ar - m10i * ai + m11r * br - m11i * bi;
            v[y + 1] = m10r * ai + m10i * ar + m11r * bi + m11i * br;
        }
    }

    /**
     * Prepares a dense {@code 2^k x 2^k} matrix on the given targets, where every control is 1.
     *
     * @param a amplitudes
     * @param targets target qubits, bit j of the matrix index is targets[j]
     * @param controls control qubits (may be empty)
     * @param m matrix, length 2 * 4^k. Not modified.
     * @return the plan
     */
    public static Plan densePlan(Amplitudes a, int[] targets, int[] controls, double[] m) {
        if (targets.length == 1 && controls.length == 0) {
            return new Dense1Plan(a, targets[0], m);
        }
        if (targets.length == 1) {
            return new LayoutPlan(a, targets, controls) {
                @Override
                void run(long from, long to) {
                    dense2x2(a, l, m, from, to);
                }
            };
        }
        if (targets.length == 2) {
            return new LayoutPlan(a, targets, controls) {
                @Override
                void run(long from, long to) {
                    dense4x4(a, l, m, from, to);
                }
            };
        }
        return new LayoutPlan(a, targets, controls) {
            @Override
            void run(long from, long to) {
                denseBlocks(a, l, m, from, to);
            }
        };
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
        densePlan(a, targets, controls, m).apply(threads);
    }

    private static void dense2x2(Amplitudes a, Layout l, double[] m, long from, long to) {
        final double m00r = m[0], m00i = m[1], m01r = m[2], m01i = m[3];
        final double m10r = m[4], m10i = m[5], m11r = m[6], m11i = m[7];
        final double[][] arr = new double[2][];
        final int[] off = new int[2];
        final int[] starts = l.starts;
        final int run = l.run;
        for (long o = from; o < to; o++) {
            l.locate(a, o, arr, off);
            final double[] u = arr[0];
            final double[] v = arr[1];
            final int uo = off[0];
            final int vo = off[1];
            for (int t = 0; t < starts.length; t++) {
                final int e0 = starts[t];
                for (int e = e0; e < e0 + run; e++) {
                    final int x = (uo + e) << 1;
                    final int y = (vo + e) << 1;
                    final double ar = u[x], ai = u[x + 1], br = v[y], bi = v[y + 1];
                    u[x] = m00r * ar - m00i * ai + m01r * br - m01i * bi;
                    u[x + 1] = m00r * ai + m00i * ar + m01r * bi + m01i * br;
                    v[y] = m10r * ar - m10i * ai + m11r * br - m11i * bi;
                    v[y + 1] = m10r * ai + m10i * ar + m11r * bi + m11i * br;
                }
            }
        }
    }

    private static void dense4x4(Amplitudes a, Layout l, double[] m, long from, long to) {
        final double a00 = m[0], b00 = m[1], a01 = m[2], b01 = m[3];
        final double a02 = m[4], b02 = m[5], a03 = m[6], b03 = m[7];
        final double a10 = m[8], b10 = m[9], a11 = m[10], b11 = m[11];
        final double a12 = m[12], b12 = m[13], a13 = m[14], b13 = m[15];
        final double a20 = m[16], b20 = m[17], a21 = m[18], b21 = m[19];
        final double a22 = m[20], b22 = m[21], a23 = m[22], b23 = m[23];
        final double a30 = m[24], b30 = m[25], a31 = m[26], b31 = m[27];
        final double a32 = m[28], b32 = m[29], a33 = m[30], b33 = m[31];
        final double[][] arr = new double[4][];
        final int[] off = new int[4];
        final int[] starts = l.starts;
        final int run = l.run;
        for (long o = from; o < to; o++) {
            l.locate(a, o, arr, off);
            final double[] p0 = arr[0], p1 = arr[1], p2 = arr[2], p3 = arr[3];
            final int o0 = off[0], o1 = off[1], o2 = off[2], o3 = off[3];
            for (int t = 0; t < starts.length; t++) {
                final int e0 = starts[t];
                for (int e = e0; e < e0 + run; e++) {
                    final int x0 = (o0 + e) << 1, x1 = (o1 + e) << 1;
                    final int x2 = (o2 + e) << 1, x3 = (o3 + e) << 1;
                    final double r0 = p0[x0], i0 = p0[x0 + 1], r1 = p1[x1], i1 = p1[x1 + 1];
                    final double r2 = p2[x2], i2 = p2[x2 + 1], r3 = p3[x3], i3 = p3[x3 + 1];
                    p0[x0] = a00 * r0 - b00 * i0 + a01 * r1 - b01 * i1
                            + a02 * r2 - b02 * i2 + a03 * r3 - b03 * i3;
                    p0[x0 + 1] = a00 * i0 + b00 * r0 + a01 * i1 + b01 * r1
                            + a02 * i2 + b02 * r2 + a03 * i3 + b03 * r3;
                    p1[x1] = a10 * r0 - b10 * i0 + a11 * r1 - b11 * i1
                            + a12 * r2 - b12 * i2 + a13 * r3 - b13 * i3;
                    p1[x1 + 1] = a10 * i0 + b10 * r0 + a11 * i1 + b11 * r1
                            + a12 * i2 + b12 * r2 + a13 * i3 + b13 * r3;
                    p2[x2] = a20 * r0 - b20 * i0 + a21 * r1 - b21 * i1
                            + a22 * r2 - b22 * i2 + a23 * r3 - b23 * i3;
                    p2[x2 + 1] = a20 * i0 + b20 * r0 + a21 * i1 + b21 * r1
                            + a22 * i2 + b22 * r2 + a23 * i3 + b23 * r3;
                    p3[x3] = a30 * r0 - b30 * i0 + a31 * r1 - b31 * i1
                            + a32 * r2 - b32 * i2 + a33 * r3 - b33 * i3;
                    p3[x3 + 1] = a30 * i0 + b30 * r0 + a31 * i1 + b31 * r1
                            + a32 * i2 + b32 * r2 + a33 * i3 + b33 * r3;
                }
            }
        }
    }

    private static void denseBlocks(Amplitudes a, Layout l, double[] m, long from, long to) {
        final int d = l.d;
        final double[][] arr = new double[d][];
        final int[] off = new int[d];
        final double[] vr = new double[d];
        final double[] vi = new double[d];
        final int[] starts = l.starts;
        final int run = l.run;
        for (long o = from; o < to; o++) {
            l.locate(a, o, arr, off);
            for (int t = 0; t < starts.length; t++) {
                final int e0 = starts[t];
                for (int e = e0; e < e0 + run; e++) {
                    for (int j = 0; j < d; j++) {
                        final int x = (off[j] + e) << 1;
                        vr[j] = arr[j][x];
                        vi[j] = arr[j][x + 1];
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
                        final int x = (off[i] + e) << 1;
                        arr[i][x] = sr;
                        arr[i][x + 1] = si;
                    }
                }
            }
        }
    }

}
