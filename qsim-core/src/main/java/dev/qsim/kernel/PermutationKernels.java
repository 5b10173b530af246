package dev.qsim.kernel;

/**
 * In-place kernels for monomial gates: a permutation of the target basis states with a phase
 * on each (one non-zero entry per row and column of the matrix), on double storage, where every
 * control qubit is 1. Basis state {@code j} of the targets goes to {@code perm[j]} times
 * {@code phase[j]}; bit {@code j} of a basis index is qubit {@code targets[j]}. X on one qubit
 * swaps the halves of each block; a permutation without phases whose qubits all select whole
 * chunks moves chunk references instead of amplitudes ({@link #permuteChunks}, which
 * {@link Windows} also uses for float storage); one target with phases goes to the dense 2x2
 * loop. Unchecked: targets and controls are distinct and below the qubit count. Internal.
 *
 * <p>Method: M. Smelyanskiy, N. P. D. Sawaya, A. Aspuru-Guzik, "qHiPSTER: the quantum high
 * performance software testing environment", arXiv:1601.07195 (2016), §3 (pairwise amplitude
 * updates with strided indexing).
 */
final class PermutationKernels {
    private PermutationKernels() {
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
    static void apply(Amplitudes a, int[] targets, int[] controls, int[] perm,
            double[] phase, int threads) {
        plan(a, targets, controls, perm, phase).apply(threads);
    }

    /**
     * Prepares a monomial gate; see {@link #apply}.
     *
     * @param a amplitudes
     * @param targets target qubits
     * @param controls control qubits (may be empty)
     * @param perm destination of each column, length 2^k. Not modified.
     * @param phase the non-zero entry of each column, re/im interleaved. Not modified.
     * @return the plan
     */
    static Plan plan(Amplitudes a, int[] targets, int[] controls, int[] perm,
            double[] phase) {
        final boolean pure = unitPhases(phase);
        if (pure && chunkLevel(a, targets, controls)) {
            return new ChunkPermutationPlan(a, targets, controls, perm);
        }
        if (pure && perm.length == 2 && perm[0] == 1 && controls.length == 0) {
            return new Flip1Plan(a, targets[0]);
        }
        if (pure && perm.length == 2 && perm[0] == 1) {
            Plan p = a.lanes == null ? null : a.lanes.controlledFlip(a, targets[0], controls);
            if (p != null) {
                return p;
            }
            final int[] exchange = {0, 1};
            return new LayoutPlan(a, targets, controls) {
                @Override
                void run(long from, long to) {
                    swapSequenceBlocks(a, l, exchange, from, to);
                }
            };
        }
        if (!pure && perm.length == 2) {
            // One target with phases: the 2x2 dense loop is as fast as a swap and far faster
            // than the general monomial loop.
            double[] m = new double[8];
            for (int c = 0; c < 2; c++) {
                m[2 * (perm[c] * 2 + c)] = phase[2 * c];
                m[2 * (perm[c] * 2 + c) + 1] = phase[2 * c + 1];
            }
            return DenseKernels.plan(a, targets, controls, m);
        }
        if (pure) {
            final int[] swaps = swapSequence(perm);
            return new LayoutPlan(a, targets, controls) {
                @Override
                void run(long from, long to) {
                    swapSequenceBlocks(a, l, swaps, from, to);
                }
            };
        }
        return new LayoutPlan(a, targets, controls) {
            @Override
            void run(long from, long to) {
                monomialBlocks(a, l, perm, phase, from, to);
            }
        };
    }

    /**
     * A permutation of the target basis states as a sequence of exchanges, pairs
     * {@code (j, k)} flattened: each cycle {@code j0 -> j1 -> ... -> j(m-1) -> j0} of
     * {@code perm} becomes the exchanges of {@code j0} with {@code j1}, then {@code j2}, up to
     * {@code j(m-1)} (a cycle of length m is m - 1 transpositions; common practice). SWAP is one
     * exchange.
     */
    static int[] swapSequence(int[] perm) {
        final int d = perm.length;
        final boolean[] seen = new boolean[d];
        final int[] out = new int[2 * d];
        int k = 0;
        for (int j0 = 0; j0 < d; j0++) {
            if (seen[j0]) {
                continue;
            }
            seen[j0] = true;
            for (int j = perm[j0]; j != j0; j = perm[j]) {
                seen[j] = true;
                out[k++] = j0;
                out[k++] = j;
            }
        }
        return java.util.Arrays.copyOf(out, k);
    }

    /** A permutation without phases: exchanges of whole runs, with the vector loops if any. */
    private static void swapSequenceBlocks(Amplitudes a, Layout l, int[] swaps, long from,
            long to) {
        final double[][] arr = new double[l.d][];
        final int[] off = new int[l.d];
        final int[] starts = l.starts;
        final int run = l.run;
        final LaneKernels lanes = a.lanes;
        for (long o = from; o < to; o++) {
            l.locate(a, o, arr, off);
            for (int p = 0; p < swaps.length; p += 2) {
                final int j = swaps[p];
                final int k = swaps[p + 1];
                for (int t = 0; t < starts.length; t++) {
                    swapRuns(lanes, arr[j], (off[j] + starts[t]) << 1, arr[k],
                            (off[k] + starts[t]) << 1, run);
                }
            }
        }
    }

    /** X on one qubit, no controls: swaps the halves of each block without arithmetic. */
    private static final class Flip1Plan extends Plan {
        final int q;

        Flip1Plan(Amplitudes a, int q) {
            super(a);
            this.q = q;
        }

        @Override
        long units() {
            return Layout.singleUnits(a, q);
        }

        @Override
        void run(long from, long to) {
            final LaneKernels lanes = a.lanes;
            if (q < a.chunkLog && q > Layout.PIECE_LOG) {
                for (long u = from; u < to; u++) {
                    final long base = Layout.pieceBase(q, u);
                    final double[] psi = a.chunks[(int) (base >>> a.chunkLog)];
                    final int x = (int) (base & a.chunkMask) << 1;
                    swapRuns(lanes, psi, x, psi, x + (2 << q), 1 << Layout.PIECE_LOG);
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
                    if (lanes != null) {
                        lanes.flipBlocks(psi, start, stop, q);
                    } else if (q == 0) {
                        for (int x = start; x < stop; x += 4) {
                            final double r = psi[x];
                            final double i = psi[x + 1];
                            psi[x] = psi[x + 2];
                            psi[x + 1] = psi[x + 3];
                            psi[x + 2] = r;
                            psi[x + 3] = i;
                        }
                    } else {
                        for (int blk = start; blk < stop; blk += s2 << 1) {
                            swapRuns(null, psi, blk, psi, blk + s2, 1 << q);
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
                    swapRuns(lanes, a.chunks[c0], off, a.chunks[c0 | (1 << hb)], off,
                            (int) (end - p));
                    p = end;
                }
            }
        }

        @Override
        long unitsPerBlock(int blockLog) {
            return Layout.singleUnitsPerBlock(q, blockLog);
        }
    }

    private static int lowest(int[] targets, int[] controls) {
        int low = Integer.MAX_VALUE;
        for (int t : targets) {
            low = Math.min(low, t);
        }
        for (int c : controls) {
            low = Math.min(low, c);
        }
        return low;
    }

    /**
     * Tells whether a gate is a permutation without phases whose qubits all select whole
     * chunks of {@code a}, so that {@link #permuteChunks} can apply it.
     *
     * @param a the storage, either precision
     * @param op the gate
     * @return whether moving chunk references applies the gate
     */
    static boolean movesChunks(Amplitudes a, GateOp op) {
        return op.shape == GateOp.MONOMIAL && unitPhases(op.data)
                && chunkLevel(a, op.targets, op.controls);
    }

    /** Whether every phase of a monomial gate is exactly 1 (a pure permutation). */
    private static boolean unitPhases(double[] phase) {
        for (int j = 0; j < phase.length; j += 2) {
            if (phase[j] != 1 || phase[j + 1] != 0) {
                return false;
            }
        }
        return true;
    }

    /** Whether the state has several chunks and every given qubit selects whole chunks. */
    private static boolean chunkLevel(Amplitudes a, int[] targets, int[] controls) {
        return a.n > a.chunkLog && lowest(targets, controls) >= a.chunkLog;
    }

    /**
     * Applies a permutation gate whose qubits are all at or above the chunk log by moving chunk
     * references: the chunk of column {@code j} of the target bits goes to row {@code perm[j]}
     * where every control is 1.
     *
     * @param chunks the chunk table ({@code double[][]} or {@code float[][]}). Modified.
     * @param cl the chunk log
     * @param targets target qubits, all at least {@code cl}
     * @param controls control qubits, all at least {@code cl}
     * @param perm destination of each column
     */
    static void permuteChunks(Object[] chunks, int cl, int[] targets, int[] controls,
            int[] perm) {
        final Object[] old = chunks.clone();
        long controlMask = 0;
        for (int c : controls) {
            controlMask |= 1L << (c - cl);
        }
        long targetMask = 0;
        for (int t : targets) {
            targetMask |= 1L << (t - cl);
        }
        for (int c = 0; c < old.length; c++) {
            if ((c & controlMask) != controlMask) {
                continue;
            }
            int column = 0;
            for (int j = 0; j < targets.length; j++) {
                column |= ((c >>> (targets[j] - cl)) & 1) << j;
            }
            int row = perm[column];
            long dest = c & ~targetMask;
            for (int j = 0; j < targets.length; j++) {
                dest |= (long) ((row >>> j) & 1) << (targets[j] - cl);
            }
            chunks[(int) dest] = old[c];
        }
    }

    /**
     * A permutation gate (no phases) whose targets and controls all select whole chunks: it
     * moves chunks, not amplitudes, by permuting the chunk references. X, CNOT, SWAP or Toffoli
     * on qubits at or above the chunk log then cost one pass over the chunk table instead of
     * one over the state; the amplitudes are the same to the bit. One unit of work.
     */
    private static final class ChunkPermutationPlan extends Plan {
        final int[] targets;
        final int[] controls;
        final int[] perm;

        ChunkPermutationPlan(Amplitudes a, int[] targets, int[] controls, int[] perm) {
            super(a);
            this.targets = targets;
            this.controls = controls;
            this.perm = perm;
        }

        @Override
        long units() {
            return 1;
        }

        @Override
        void run(long from, long to) {
            if (from < to) {
                permuteChunks(a.chunks, a.chunkLog, targets, controls, perm);
            }
        }

        @Override
        long unitsPerBlock(int blockLog) {
            return -1;
        }
    }

    /** A permutation with phases, amplitude by amplitude. */
    private static void monomialBlocks(Amplitudes a, Layout l, int[] perm, double[] phase,
            long from, long to) {
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
                    for (int j = 0; j < d; j++) {
                        final int dst = perm[j];
                        final int x = (off[dst] + e) << 1;
                        final double pr = phase[2 * j];
                        final double pi = phase[2 * j + 1];
                        arr[dst][x] = pr * vr[j] - pi * vi[j];
                        arr[dst][x + 1] = pr * vi[j] + pi * vr[j];
                    }
                }
            }
        }
    }

    private static void swapRuns(LaneKernels lanes, double[] u, int uo, double[] v, int vo,
            int count) {
        if (lanes != null) {
            lanes.swapRuns(u, uo, v, vo, count);
            return;
        }
        final int n2 = count << 1;
        for (int x = 0; x < n2; x++) {
            final double t = u[uo + x];
            u[uo + x] = v[vo + x];
            v[vo + x] = t;
        }
    }
}
