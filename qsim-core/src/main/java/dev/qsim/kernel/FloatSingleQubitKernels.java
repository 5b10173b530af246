package dev.qsim.kernel;

/**
 * A single-qubit gate, with or without controls, applied directly to single-precision storage:
 * each pair of amplitudes is read as {@code float}, multiplied by the 2x2 matrix in double and
 * rounded back, in one pass (no window copy). {@link Windows} uses it for a gate that stands
 * alone; runs of gates go through windows. With vector loops on the storage
 * ({@link LaneKernels}) the blocks and runs go to them, with the same bits. Unchecked; internal.
 * Method as in
 * {@link DenseSingleQubitKernels}: pairwise updates with strided indexing (Smelyanskiy et al.,
 * arXiv:1601.07195, 2016, §3).
 */
final class FloatSingleQubitKernels {
    /** Log2 of the pairs of one work unit for targets above it, as {@link Layout#PIECE_LOG}. */
    private static final int PIECE_LOG = Layout.PIECE_LOG;

    /**
     * The matrix of X, used as a marker (compared by identity): pairs are swapped without
     * arithmetic or conversion, exactly.
     */
    static final double[] SWAP = {0, 0, 1, 0, 1, 0, 0, 0};

    private FloatSingleQubitKernels() {
    }

    /**
     * Applies {@code m} (row-major, re/im interleaved, length 8) to qubit {@code q} where every
     * control is 1.
     *
     * @param a single-precision storage. Modified.
     * @param q the target
     * @param m the matrix. Not modified.
     * @param controls the control qubits' bits (0 for none), without bit {@code q}
     * @param threads threads to use
     */
    static void dense1(Amplitudes a, int q, double[] m, long controls, int threads) {
        final long units = (1L << (a.n - 1)) >>> Math.min(q, PIECE_LOG);
        Parallel.forRange(threads, units, a.n >= Parallel.MIN_PARALLEL_QUBITS,
                (from, to) -> run(a, q, m, controls, from, to));
    }

    /** Units {@code [from, to)}: whole blocks of 2^(q+1) amplitudes, or 2^12-pair pieces. */
    private static void run(Amplitudes a, int q, double[] m, long controls, long from,
            long to) {
        final int cl = a.chunkLog;
        final LaneKernels lanes = a.lanes;
        final int kind = m == SWAP ? LaneKernels.FLIP : LaneKernels.kind(m);
        if (controls != 0) {
            // Bits below runLog vary inside a unit's run of pairs; the others are fixed, so a
            // unit whose fixed control bits are not all 1 is skipped whole.
            final int runLog = Math.min(q, PIECE_LOG);
            final long varying = (1L << runLog) - 1;
            final long fixed = controls & ~varying;
            final long inner = controls & varying;
            final boolean inChunk = q < cl && q <= PIECE_LOG;
            for (long u = from; u < to; u++) {
                final long i0 = q <= PIECE_LOG ? u << (q + 1) : Layout.pieceBase(q, u);
                if ((i0 & fixed) != fixed) {
                    continue;
                }
                if (inChunk) {
                    // The block lies in one chunk: index it directly (short blocks, no calls).
                    final float[] psi = a.singles[(int) (i0 >>> cl)];
                    final int x0 = (int) (i0 & a.chunkMask) << 1;
                    final int s2 = 2 << q;
                    for (int k = 0; k < (1 << q); k++) {
                        if ((k & inner) == inner) {
                            pair(psi, x0 + 2 * k, x0 + 2 * k + s2, m);
                        }
                    }
                } else if (inner == 0) {
                    span(a, i0, i0 + (1L << q), 1 << runLog, m, lanes, kind);
                } else {
                    for (int k = 0; k < (1 << runLog); k++) {
                        if ((k & inner) == inner) {
                            span(a, i0 + k, i0 + k + (1L << q), 1, m, null, kind);
                        }
                    }
                }
            }
            return;
        }
        if (q == 0 && cl > 0) {
            // Neighbouring pairs: one flat loop per chunk.
            long u = from;
            while (u < to) {
                final long i0 = u << 1;
                final int c = (int) (i0 >>> cl);
                final long end = Math.min(to, ((long) c + 1) << (cl - 1));
                final int x0 = (int) (i0 & a.chunkMask) << 1;
                if (lanes != null) {
                    lanes.blocks(a.singles[c], x0, x0 + ((int) (end - u) << 2), 0, m, kind);
                } else {
                    flat(a.singles[c], x0, (int) (end - u), m);
                }
                u = end;
            }
            return;
        }
        if (q <= PIECE_LOG && q < cl && lanes != null) {
            // Whole blocks inside chunks: one call per chunk's share of the range.
            final int blocksPerChunkLog = cl - q - 1;
            long b = from;
            while (b < to) {
                final int c = (int) (b >>> blocksPerChunkLog);
                final long end = Math.min(to, ((long) c + 1) << blocksPerChunkLog);
                final int start = (int) (b - ((long) c << blocksPerChunkLog)) << (q + 2);
                lanes.blocks(a.singles[c], start, start + ((int) (end - b) << (q + 2)), q, m,
                        kind);
                b = end;
            }
            return;
        }
        if (q <= PIECE_LOG) {
            for (long u = from; u < to; u++) {
                final long i0 = u << (q + 1);
                span(a, i0, i0 + (1L << q), 1 << q, m, lanes, kind);
            }
            return;
        }
        for (long u = from; u < to; u++) {
            final long i0 = Layout.pieceBase(q, u);
            span(a, i0, i0 + (1L << q), 1 << PIECE_LOG, m, lanes, kind);
        }
    }

    /**
     * Pairs (i0 + k, i1 + k) for k below count, cut where either side crosses a chunk; with
     * {@code lanes}, each piece goes to the vector loop.
     */
    private static void span(Amplitudes a, long i0, long i1, int count, double[] m,
            LaneKernels lanes, int kind) {
        final int cl = a.chunkLog;
        final long size = 1L << cl;
        int k = 0;
        while (k < count) {
            final long j0 = i0 + k;
            final long j1 = i1 + k;
            final int room = (int) Math.min(count - k,
                    Math.min(size - (j0 & a.chunkMask), size - (j1 & a.chunkMask)));
            final float[] u = a.singles[(int) (j0 >>> cl)];
            final float[] v = a.singles[(int) (j1 >>> cl)];
            final int uo = (int) (j0 & a.chunkMask) << 1;
            final int vo = (int) (j1 & a.chunkMask) << 1;
            if (lanes != null) {
                lanes.pairs(u, uo, v, vo, room, m, kind);
            } else {
                pairs(u, uo, v, vo, room, m);
            }
            k += room;
        }
    }

    /** One pair at float offsets x and y of the same array. */
    private static void pair(float[] psi, int x, int y, double[] m) {
        if (m == SWAP) {
            final float r = psi[x];
            final float i = psi[x + 1];
            psi[x] = psi[y];
            psi[x + 1] = psi[y + 1];
            psi[y] = r;
            psi[y + 1] = i;
            return;
        }
        final double ar = psi[x], ai = psi[x + 1], br = psi[y], bi = psi[y + 1];
        psi[x] = (float) (m[0] * ar - m[1] * ai + m[2] * br - m[3] * bi);
        psi[x + 1] = (float) (m[0] * ai + m[1] * ar + m[2] * bi + m[3] * br);
        psi[y] = (float) (m[4] * ar - m[5] * ai + m[6] * br - m[7] * bi);
        psi[y + 1] = (float) (m[4] * ai + m[5] * ar + m[6] * bi + m[7] * br);
    }

    /** {@code count} neighbouring pairs from float offset {@code x0}. */
    private static void flat(float[] psi, int x0, int count, double[] m) {
        final double m00r = m[0], m00i = m[1], m01r = m[2], m01i = m[3];
        final double m10r = m[4], m10i = m[5], m11r = m[6], m11i = m[7];
        final int end = x0 + (count << 2);
        if (m == SWAP) {
            for (int x = x0; x < end; x += 4) {
                final float r = psi[x];
                final float i = psi[x + 1];
                psi[x] = psi[x + 2];
                psi[x + 1] = psi[x + 3];
                psi[x + 2] = r;
                psi[x + 3] = i;
            }
            return;
        }
        if (DenseSingleQubitKernels.isReal(m)) {
            for (int x = x0; x < end; x += 4) {
                final double ar = psi[x], ai = psi[x + 1], br = psi[x + 2], bi = psi[x + 3];
                psi[x] = (float) (m00r * ar + m01r * br);
                psi[x + 1] = (float) (m00r * ai + m01r * bi);
                psi[x + 2] = (float) (m10r * ar + m11r * br);
                psi[x + 3] = (float) (m10r * ai + m11r * bi);
            }
            return;
        }
        if (DenseSingleQubitKernels.isCrossImaginary(m)) {
            crossPairs(psi, x0, psi, x0 + 2, count, 4, m00r, m01i, m10i, m11r);
            return;
        }
        for (int x = x0; x < end; x += 4) {
            final double ar = psi[x], ai = psi[x + 1], br = psi[x + 2], bi = psi[x + 3];
            psi[x] = (float) (m00r * ar - m00i * ai + m01r * br - m01i * bi);
            psi[x + 1] = (float) (m00r * ai + m00i * ar + m01r * bi + m01i * br);
            psi[x + 2] = (float) (m10r * ar - m10i * ai + m11r * br - m11i * bi);
            psi[x + 3] = (float) (m10r * ai + m10i * ar + m11r * bi + m11i * br);
        }
    }

    /** {@code count} pairs (u[uo + 2k], v[vo + 2k]). */
    private static void pairs(float[] u, int uo, float[] v, int vo, int count, double[] m) {
        final double m00r = m[0], m00i = m[1], m01r = m[2], m01i = m[3];
        final double m10r = m[4], m10i = m[5], m11r = m[6], m11i = m[7];
        final int n2 = count << 1;
        if (m == SWAP) {
            // Both halves are contiguous runs of the same length: swap them whole.
            for (int k = 0; k < n2; k++) {
                final float t = u[uo + k];
                u[uo + k] = v[vo + k];
                v[vo + k] = t;
            }
            return;
        }
        if (DenseSingleQubitKernels.isReal(m)) {
            // Re and im parts take the same real coefficients: one flat loop over floats.
            for (int k = 0; k < n2; k++) {
                final double a = u[uo + k];
                final double b = v[vo + k];
                u[uo + k] = (float) (m00r * a + m01r * b);
                v[vo + k] = (float) (m10r * a + m11r * b);
            }
            return;
        }
        if (DenseSingleQubitKernels.isCrossImaginary(m)) {
            crossPairs(u, uo, v, vo, count, 2, m00r, m01i, m10i, m11r);
            return;
        }
        for (int k = 0; k < n2; k += 2) {
            final int x = uo + k;
            final int y = vo + k;
            final double ar = u[x], ai = u[x + 1], br = v[y], bi = v[y + 1];
            u[x] = (float) (m00r * ar - m00i * ai + m01r * br - m01i * bi);
            u[x + 1] = (float) (m00r * ai + m00i * ar + m01r * bi + m01i * br);
            v[y] = (float) (m10r * ar - m10i * ai + m11r * br - m11i * bi);
            v[y + 1] = (float) (m10r * ai + m10i * ar + m11r * bi + m11i * br);
        }
    }

    /**
     * {@code DenseSingleQubitKernels.crossPairs} on float storage: RX-shaped matrices, half the
     * arithmetic.
     */
    private static void crossPairs(float[] u, int uo, float[] v, int vo, int count, int step,
            double d0, double o01, double o10, double d1) {
        final int len = count * step;
        for (int k = 0; k < len; k += step) {
            final int x = uo + k;
            final int y = vo + k;
            final double ar = u[x], ai = u[x + 1], br = v[y], bi = v[y + 1];
            u[x] = (float) (d0 * ar - o01 * bi);
            u[x + 1] = (float) (d0 * ai + o01 * br);
            v[y] = (float) (d1 * br - o10 * ai);
            v[y + 1] = (float) (d1 * bi + o10 * ar);
        }
    }

    /**
     * Returns the 2x2 matrix of a single-qubit gate (its controls aside), or null when the gate
     * has more than one target.
     *
     * @param op the gate
     * @return the matrix (row-major, re/im interleaved), or null
     */
    static double[] matrix2(GateOp op) {
        if (op.targets.length != 1) {
            return null;
        }
        switch (op.shape) {
            case GateOp.DENSE:
                return op.data;
            case GateOp.DIAGONAL:
                return new double[] {op.data[0], op.data[1], 0, 0, 0, 0, op.data[2], op.data[3]};
            default:
                if (op.perm[0] == 1 && op.data[0] == 1 && op.data[1] == 0 && op.data[2] == 1
                        && op.data[3] == 0) {
                    return SWAP;
                }
                double[] m = new double[8];
                // Column j goes to row perm[j] with phase data[j].
                for (int j = 0; j < 2; j++) {
                    int row = op.perm[j];
                    m[2 * (row * 2 + j)] = op.data[2 * j];
                    m[2 * (row * 2 + j) + 1] = op.data[2 * j + 1];
                }
                return m;
        }
    }
}
