package dev.qsim.kernel;

/**
 * In-place kernels for diagonal gates (phases only) on double storage, where every control
 * qubit is 1: each amplitude is multiplied by the diagonal entry its target bits select, with no
 * partner read. Bit {@code j} of a diagonal index is qubit {@code targets[j]}. One target without
 * controls scales the halves of each block; other gates go block by block of a {@link Layout}.
 * With vector loops on the storage ({@link LaneKernels}) both go to them, with the same bits.
 * Unchecked: targets and controls are distinct and below the qubit count. Internal.
 *
 * <p>Method: M. Smelyanskiy, N. P. D. Sawaya, A. Aspuru-Guzik, "qHiPSTER: the quantum high
 * performance software testing environment", arXiv:1601.07195 (2016), §3 (pairwise amplitude
 * updates with strided indexing).
 */
final class DiagonalKernels {
    private DiagonalKernels() {
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
    static void apply(Amplitudes a, int[] targets, int[] controls, double[] diag,
            int threads) {
        plan(a, targets, controls, diag).apply(threads);
    }

    /**
     * Prepares a diagonal gate; see {@link #apply}.
     *
     * @param a amplitudes
     * @param targets target qubits
     * @param controls control qubits (may be empty)
     * @param diag the diagonal, re/im interleaved, length 2 * 2^k. Not modified.
     * @return the plan
     */
    static Plan plan(Amplitudes a, int[] targets, int[] controls, double[] diag) {
        if (targets.length == 1 && controls.length == 0) {
            return new Diagonal1Plan(a, targets[0], diag);
        }
        if (a.lanes != null) {
            Plan p = a.lanes.diagonal(a, targets, controls, diag);
            if (p != null) {
                return p;
            }
        }
        return new LayoutPlan(a, targets, controls) {
            @Override
            void run(long from, long to) {
                diagonalBlocks(a, l, diag, from, to);
            }
        };
    }

    /** diag(d0, d1) on one qubit: each half of each block scaled, no partner read. */
    private static final class Diagonal1Plan extends Plan {
        final int q;
        final double[] d;

        Diagonal1Plan(Amplitudes a, int q, double[] d) {
            super(a);
            this.q = q;
            this.d = d;
        }

        @Override
        long units() {
            return Layout.singleUnits(a, q);
        }

        @Override
        void run(long from, long to) {
            final LaneKernels lanes = a.lanes;
            if (q < a.chunkLog && q > Layout.PIECE_LOG) {
                final boolean skip0 = d[0] == 1 && d[1] == 0;
                for (long u = from; u < to; u++) {
                    final long base = Layout.pieceBase(q, u);
                    final double[] psi = a.chunks[(int) (base >>> a.chunkLog)];
                    final int x = (int) (base & a.chunkMask) << 1;
                    final int len = 2 << Layout.PIECE_LOG;
                    if (!skip0) {
                        scale(lanes, psi, x, x + len, d[0], d[1]);
                    }
                    scale(lanes, psi, x + (2 << q), x + (2 << q) + len, d[2], d[3]);
                }
                return;
            }
            if (q < a.chunkLog) {
                final int blocksPerChunkLog = a.chunkLog - q - 1;
                long b = from;
                while (b < to) {
                    final int c = (int) (b >>> blocksPerChunkLog);
                    final long end = Math.min(to, ((long) c + 1) << blocksPerChunkLog);
                    final int first = (int) (b - ((long) c << blocksPerChunkLog));
                    final double[] psi = a.chunks[c];
                    final int s2 = 2 << q;
                    final int start = first << (q + 2);
                    final int stop = start + ((int) (end - b) << (q + 2));
                    final double d0r = d[0], d0i = d[1], d1r = d[2], d1i = d[3];
                    final boolean skip0 = d0r == 1 && d0i == 0;
                    if (lanes != null) {
                        lanes.diagonalBlocks(psi, start, stop, q, d);
                    } else if (q == 0) {
                        // Neighbours: one pass, both halves in the same iteration.
                        for (int x = start; x < stop; x += 4) {
                            final double ar = psi[x], ai = psi[x + 1];
                            final double br = psi[x + 2], bi = psi[x + 3];
                            psi[x] = d0r * ar - d0i * ai;
                            psi[x + 1] = d0r * ai + d0i * ar;
                            psi[x + 2] = d1r * br - d1i * bi;
                            psi[x + 3] = d1r * bi + d1i * br;
                        }
                    } else {
                        // Block by block, each half once: the range is streamed once.
                        for (int blk = start; blk < stop; blk += s2 << 1) {
                            if (!skip0) {
                                scale(null, psi, blk, blk + s2, d0r, d0i);
                            }
                            scale(null, psi, blk + s2, blk + (s2 << 1), d1r, d1i);
                        }
                    }
                    b = end;
                }
            } else {
                final int cl = a.chunkLog;
                final int hb = q - cl;
                long p = from;
                while (p < to) {
                    final long pairChunk = p >>> cl;
                    final long end = Math.min(to, (pairChunk + 1) << cl);
                    final long lowMask = (1L << hb) - 1;
                    final int c0 = (int) (((pairChunk >>> hb) << (hb + 1)) | (pairChunk & lowMask));
                    final int off = (int) (p & a.chunkMask) << 1;
                    final int stop = off + ((int) (end - p) << 1);
                    for (int half = 0; half < 2; half++) {
                        final double dr = d[2 * half];
                        final double di = d[2 * half + 1];
                        if (dr == 1 && di == 0) {
                            continue;
                        }
                        final double[] psi = a.chunks[half == 0 ? c0 : c0 | (1 << hb)];
                        scale(lanes, psi, off, stop, dr, di);
                    }
                    p = end;
                }
            }
        }

        @Override
        long unitsPerBlock(int blockLog) {
            return Layout.singleUnitsPerBlock(q, blockLog);
        }
    }

    private static void diagonalBlocks(Amplitudes a, Layout l, double[] diag, long from, long to) {
        final int d = l.d;
        final double[][] arr = new double[d][];
        final int[] off = new int[d];
        final int[] starts = l.starts;
        final int run2 = l.run << 1;
        for (long o = from; o < to; o++) {
            l.locate(a, o, arr, off);
            for (int j = 0; j < d; j++) {
                final double dr = diag[2 * j];
                final double di = diag[2 * j + 1];
                if (dr == 1 && di == 0) {
                    continue;
                }
                final double[] psi = arr[j];
                final int base = off[j];
                for (int t = 0; t < starts.length; t++) {
                    final int start = (base + starts[t]) << 1;
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
    }

    private static void scale(LaneKernels lanes, double[] psi, int from, int to, double dr,
            double di) {
        if (lanes != null) {
            lanes.scale(psi, from, to, dr, di);
            return;
        }
        for (int x = from; x < to; x += 2) {
            final double re = psi[x];
            final double im = psi[x + 1];
            psi[x] = dr * re - di * im;
            psi[x + 1] = dr * im + di * re;
        }
    }
}
