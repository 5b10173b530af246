package dev.qsim.kernel;

/**
 * In-place kernels for a dense 2x2 matrix on one qubit without controls, on double storage (a
 * controlled single-qubit gate goes through the layout loop of {@link DenseKernels}). The matrix
 * is row-major with re/im interleaved, length 8. A target inside a chunk is worked block by block
 * (pairs {@code (i, i + 2^q)} in blocks of {@code 2^(q+1)} amplitudes), in pieces of a block
 * above {@link Layout#PIECE_LOG}; a target at or above the chunk log pairs whole chunks. A real
 * matrix (H, RY and their products) or one shaped like RX takes a loop with half the arithmetic
 * and the same bits as the complex loop. With vector loops ({@link LaneKernels}) on the storage,
 * the blocks and runs go to them (the same bits again). Unchecked: the target is below the qubit
 * count. Internal.
 *
 * <p>Method: M. Smelyanskiy, N. P. D. Sawaya, A. Aspuru-Guzik, "qHiPSTER: the quantum high
 * performance software testing environment", arXiv:1601.07195 (2016), §3 (pairwise amplitude
 * updates with strided indexing).
 */
final class DenseSingleQubitKernels {
    private DenseSingleQubitKernels() {
    }

    /**
     * Prepares a dense 2x2 matrix on qubit {@code q}, with no controls.
     *
     * @param a amplitudes
     * @param q the target qubit
     * @param m matrix, length 8. Not modified.
     * @return the plan
     */
    static Plan plan(Amplitudes a, int q, double[] m) {
        return new Dense1Plan(a, q, m);
    }

    private static final class Dense1Plan extends Plan {
        final int q;
        final double[] m;
        final int kind;

        Dense1Plan(Amplitudes a, int q, double[] m) {
            super(a);
            this.q = q;
            this.m = m;
            this.kind = LaneKernels.kind(m);
        }

        @Override
        long units() {
            return Layout.singleUnits(a, q);
        }

        @Override
        void run(long from, long to) {
            final LaneKernels lanes = a.lanes;
            if (q >= a.chunkLog) {
                dense1High(a, q, m, from, to, lanes, kind);
            } else if (q <= Layout.PIECE_LOG) {
                dense1Low(a, q, m, from, to, lanes, kind);
            } else {
                for (long u = from; u < to; u++) {
                    final long base = Layout.pieceBase(q, u);
                    final double[] psi = a.chunks[(int) (base >>> a.chunkLog)];
                    final int x = (int) (base & a.chunkMask) << 1;
                    if (lanes != null) {
                        lanes.pairs(psi, x, psi, x + (2 << q), 1 << Layout.PIECE_LOG, m, kind);
                    } else {
                        dense1Pair(psi, x, psi, x + (2 << q), 1 << Layout.PIECE_LOG, m);
                    }
                }
            }
        }

        @Override
        long unitsPerBlock(int blockLog) {
            return Layout.singleUnitsPerBlock(q, blockLog);
        }
    }

    /** Target inside a chunk: blocks of 2^(q+1) amplitudes, pairs (i, i + 2^q). */
    private static void dense1Low(Amplitudes a, int q, double[] m, long from, long to,
            LaneKernels lanes, int kind) {
        final int blocksPerChunkLog = a.chunkLog - q - 1;
        long b = from;
        while (b < to) {
            final int c = (int) (b >>> blocksPerChunkLog);
            final long end = Math.min(to, ((long) c + 1) << blocksPerChunkLog);
            final int first = (int) (b - ((long) c << blocksPerChunkLog));
            if (lanes != null) {
                final int start = first << (q + 2);
                lanes.blocks(a.chunks[c], start, start + ((int) (end - b) << (q + 2)), q, m,
                        kind);
            } else {
                dense1InChunk(a.chunks[c], q, m, first, (int) (end - b));
            }
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
        // Each loop in a method of its own: in one method, C2 compiled the general loop to
        // code 1.16 or 1.49 ns an amplitude (in cache, one thread, JDK 17), chosen per JVM by
        // which loop its profile had seen hot first (docs/decisions.md).
        if (q == 0) {
            complexNeighbours(psi, start, end, m00r, m00i, m01r, m01i, m10r, m10i, m11r, m11i);
        } else if (q == 1) {
            complexSecond(psi, start, end, m00r, m00i, m01r, m01i, m10r, m10i, m11r, m11i);
        } else {
            complexRuns(psi, q, start, end, m00r, m00i, m01r, m01i, m10r, m10i, m11r, m11i);
        }
    }

    /** The complex loop on qubit 0: pairs are neighbours, one flat loop the JIT can unroll. */
    private static void complexNeighbours(double[] psi, int start, int end, double m00r,
            double m00i, double m01r, double m01i, double m10r, double m10i, double m11r,
            double m11i) {
        for (int x = start; x < end; x += 4) {
            final double ar = psi[x], ai = psi[x + 1], br = psi[x + 2], bi = psi[x + 3];
            psi[x] = m00r * ar - m00i * ai + m01r * br - m01i * bi;
            psi[x + 1] = m00r * ai + m00i * ar + m01r * bi + m01i * br;
            psi[x + 2] = m10r * ar - m10i * ai + m11r * br - m11i * bi;
            psi[x + 3] = m10r * ai + m10i * ar + m11r * bi + m11i * br;
        }
    }

    /** The complex loop on qubit 1: two pairs in each group of four amplitudes. */
    private static void complexSecond(double[] psi, int start, int end, double m00r,
            double m00i, double m01r, double m01i, double m10r, double m10i, double m11r,
            double m11i) {
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
    }

    /** The complex loop on qubit 2 and above: runs of {@code 2^q} amplitudes and partners. */
    private static void complexRuns(double[] psi, int q, int start, int end, double m00r,
            double m00i, double m01r, double m01i, double m10r, double m10i, double m11r,
            double m11i) {
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
    private static void dense1High(Amplitudes a, int q, double[] m, long from, long to,
            LaneKernels lanes, int kind) {
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
            if (lanes != null) {
                lanes.pairs(a.chunks[c0], off << 1, a.chunks[c1], off << 1, (int) (end - p), m,
                        kind);
            } else {
                dense1Pair(a.chunks[c0], off << 1, a.chunks[c1], off << 1, (int) (end - p), m);
            }
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
}
