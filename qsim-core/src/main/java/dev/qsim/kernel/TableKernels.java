package dev.qsim.kernel;

import java.util.ArrayList;
import java.util.List;

/**
 * Runs of diagonal and monomial gates (CZ and CNOT ladders, SWAP networks, controlled phases,
 * Toffoli) merged into one pass. The gates of a run, on at most {@value #MAX_LOG} qubits, are
 * multiplied out into one monomial matrix on all their qubits (a permutation of basis states
 * with a phase on each; a product of monomial matrices is monomial), and that monomial is
 * applied from full tables over the low {@code 2^b} amplitudes of each aligned block: one
 * multiplication by a table of factors when the run is diagonal, else one gather through a
 * table of source offsets (with the factors, if any) into a scratch block that is copied back.
 * So a ladder of 13 controlled gates costs one pass instead of 13 while a window sits in cache.
 *
 * <p>The planner ({@link Windows}) merges runs of at least {@value #MIN_RUN} consecutive
 * diagonal gates, or {@value #MIN_MOVING_RUN} gates of which some move amplitudes, of a group
 * whose qubits all lie in the group's window or cache block, when the state holds at least
 * {@code 2^}{@value #MIN_REUSE_LOG} blocks of the run's table (building a table costs more than
 * the gates on one block). A merged run gives each amplitude the product of the run's factors
 * in one multiplication instead of one per gate, so its result may differ from the gates
 * applied one by one in the last bits (never for factors that are 1 or -1, which multiply
 * exactly); it is the same whatever the thread count or
 * vector path.
 *
 * <p>Method: the closure of monomial matrices under products is common practice (they form the
 * group of generalised permutation matrices; R. A. Horn and C. R. Johnson, "Matrix Analysis",
 * 2nd ed., 2013, sec. 0.9.5, from memory); applying a gate as an index table over a cache-sized
 * block is our own arrangement. Internal.
 */
final class TableKernels {
    /**
     * The fewest consecutive diagonal gates merged into one pass: the table multiplication
     * costs about three diagonal gates (0.43 against 0.15 ns an amplitude in cache, 512-bit
     * vectors, JDK 17).
     */
    static final int MIN_RUN = 3;
    /**
     * The fewest consecutive gates merged when one of them moves amplitudes: the gather costs
     * about nine controlled X gates (1.3 to 1.8 against 0.2 ns an amplitude in cache, JDK 25 and
     * 17; vector gathers are no faster), so only long runs such as ladders pay.
     */
    static final int MIN_MOVING_RUN = 12;
    /** The most qubits a merged run may hold, and the log2 of its largest table. */
    static final int MAX_LOG = Windows.WINDOW_LOG;
    /** Log2 of the smallest block a table covers, so that each call works on 64 amplitudes. */
    static final int MIN_BLOCK_LOG = 6;
    /**
     * Log2 of the fewest blocks a table must serve: building it costs a few nanoseconds per
     * entry and gate of the run, about ten times what the run's gates cost one by one on the
     * same amplitudes, so a table pays only when the state holds many blocks of its size.
     */
    static final int MIN_REUSE_LOG = 5;
    /**
     * The most gates one run's scan reads, run gates and gates it lets pass together, so that
     * planning stays linear in the gates.
     */
    static final int MAX_SCAN = 64;

    private static final ThreadLocal<double[][]> SCRATCH =
            ThreadLocal.withInitial(() -> new double[MAX_LOG + 1][]);

    private TableKernels() {
    }

    /**
     * Replaces each run of at least {@value #MIN_RUN} consecutive diagonal gates, or
     * {@value #MIN_MOVING_RUN} diagonal or monomial gates of which one is not diagonal,
     * whose qubits all have a position, at most {@value #MAX_LOG} of them, the highest position
     * below {@code limitLog}, by one {@link GateOp#TABLE} gate. A run may step over gates on
     * none of its qubits so far (the rotations between a ladder's gates): each of them commutes
     * with every run gate before it, so it is applied before the merged run instead; a gate on
     * a qubit of the run, or the {@value #MAX_SCAN}th gate read, ends it. Other gates stay as
     * they are, in order; without such a run the list itself is returned.
     *
     * @param ops gates in order
     * @param position each qubit's bit in the storage the gates will run on, or -1 when it has
     *     none there (a control fixed outside a window)
     * @param limitLog the largest table's log2: the window's or the cache block's
     * @param stateLog the qubits of the whole state: a run is merged only when its table
     *     serves at least {@code 2^MIN_REUSE_LOG} blocks of it
     * @return the gates, runs merged
     */
    static List<GateOp> mergeRuns(List<GateOp> ops, int[] position, int limitLog,
            int stateLog) {
        final int limit = Math.min(limitLog, stateLog - MIN_REUSE_LOG);
        if (limit < MIN_BLOCK_LOG) {
            return ops;
        }
        List<GateOp> out = null;
        final int size = ops.size();
        // Per gate of a scan: whether it joins the run (else it is passed: applied before).
        final boolean[] joins = new boolean[MAX_SCAN];
        int i = 0;
        while (i < size) {
            long qubits = 0;
            boolean moves = false;
            int members = 0;
            int j = i;
            while (j < size && j - i < MAX_SCAN) {
                final GateOp g = ops.get(j);
                final long q = mergeable(g, position, limit);
                if (q != 0 && Long.bitCount(qubits | q) <= MAX_LOG) {
                    qubits |= q;
                    moves |= g.shape != GateOp.DIAGONAL;
                    members++;
                    joins[j - i] = true;
                } else if (members > 0 && (qubitsOf(g) & qubits) == 0) {
                    // On other qubits than the run so far: it commutes with every gate of
                    // the run before it, so it may be applied before the whole run.
                    joins[j - i] = false;
                } else {
                    break;
                }
                j++;
            }
            // Gates passed at the end of the scan stay after the run, where they were.
            while (j > i && !joins[j - 1 - i]) {
                j--;
            }
            if (members >= (moves ? MIN_MOVING_RUN : MIN_RUN)) {
                if (out == null) {
                    out = new ArrayList<>(ops.subList(0, i));
                }
                final GateOp[] parts = new GateOp[members];
                int m = 0;
                for (int x = i; x < j; x++) {
                    if (joins[x - i]) {
                        parts[m++] = ops.get(x);
                    } else {
                        out.add(ops.get(x));
                    }
                }
                int[] qs = new int[Long.bitCount(qubits)];
                for (int x = 0, q = 0; x < qs.length; q++) {
                    if (((qubits >>> q) & 1) != 0) {
                        qs[x++] = q;
                    }
                }
                out.add(GateOp.table(qs, parts));
                i = j;
            } else {
                if (out != null) {
                    out.add(ops.get(i));
                }
                i++;
            }
        }
        return out == null ? ops : out;
    }

    /** Every qubit a gate acts on, targets and controls. */
    private static long qubitsOf(GateOp op) {
        long q = 0;
        for (int t : op.targets) {
            q |= 1L << t;
        }
        for (int c : op.controls) {
            q |= 1L << c;
        }
        return q;
    }

    /**
     * The qubits of a gate a run may hold (a diagonal or monomial gate whose qubits all have a
     * position below {@code limitLog}), or 0.
     */
    private static long mergeable(GateOp op, int[] position, int limitLog) {
        if (op.shape != GateOp.DIAGONAL && op.shape != GateOp.MONOMIAL) {
            return 0;
        }
        long q = 0;
        for (int t : op.targets) {
            if (position[t] < 0 || position[t] >= limitLog) {
                return 0;
            }
            q |= 1L << t;
        }
        for (int c : op.controls) {
            if (position[c] < 0 || position[c] >= limitLog) {
                return 0;
            }
            q |= 1L << c;
        }
        return q;
    }

    /**
     * The work of building a merged run's tables, in entries times gates: each of the
     * {@code 2^b} entries of a table over a block of {@code 2^b} amplitudes goes through every
     * gate of the run ({@code TablePlan}), at a few nanoseconds each, once per group.
     *
     * @param op the merged run ({@link GateOp#TABLE})
     * @param position each qubit's bit in the storage the run is planned on
     * @param storageLog log2 of the amplitudes of that storage (a window's or the state's)
     * @return entries times gates
     */
    static double buildWork(GateOp op, int[] position, int storageLog) {
        int top = 0;
        for (int q : op.targets) {
            top = Math.max(top, position[q] + 1);
        }
        return Math.scalb((double) op.parts.length, blockLog(top, storageLog));
    }

    /**
     * Log2 of the block a merged run's tables cover: up to its highest bit ({@code top} bits),
     * at least {@value #MIN_BLOCK_LOG} where the storage's chunks hold that many.
     */
    private static int blockLog(int top, int chunkLog) {
        return Math.max(top, Math.min(MIN_BLOCK_LOG, chunkLog));
    }

    /**
     * Prepares a merged run for a storage.
     *
     * @param a double storage whose chunks hold at least the run's block
     * @param t the run's qubits' bits in {@code a}, ascending
     * @param op the run
     * @return the plan
     */
    static Plan plan(Amplitudes a, int[] t, GateOp op) {
        return new TablePlan(a, t, op);
    }

    /** A merged run applied block by block from tables. */
    private static final class TablePlan extends Plan {
        private final int b;
        /** Source offset (in doubles) of each amplitude of a block, or null. */
        private final int[] source;
        /** Factors, re/im interleaved (complex) or duplicated (real), or null. */
        private final double[] factor;
        private final boolean real;
        /** Complex factors expanded for the vector loops ({@link LaneKernels#expand}), or null. */
        private final double[][] expanded;

        TablePlan(Amplitudes a, int[] t, GateOp op) {
            super(a);
            int top = 0;
            for (int x : t) {
                top = Math.max(top, x + 1);
            }
            this.b = blockLog(top, Math.min(a.n, a.chunkLog));
            if (b > a.chunkLog || b > MAX_LOG) {
                throw new IllegalStateException("a merged run reaches bit " + (top - 1)
                        + ", above its storage's chunks of 2^" + a.chunkLog + " amplitudes");
            }
            if (a.chunks.length == 0) {
                // A storage without amplitudes (planning only): no tables.
                this.source = null;
                this.factor = null;
                this.real = true;
                this.expanded = null;
                return;
            }
            final int size = 1 << b;
            final int[] src = new int[size];
            final double[] f = new double[2 * size];
            for (int y = 0; y < size; y++) {
                src[y] = y;
                f[2 * y] = 1;
            }
            // The last gate first: out[y] = f_K(y) mid[g_K(y)], and so on inwards.
            for (int p = op.parts.length - 1; p >= 0; p--) {
                back(op.parts[p], op.targets, t, src, f);
            }
            boolean stays = true;
            boolean ones = true;
            boolean isReal = true;
            for (int y = 0; y < size; y++) {
                stays &= src[y] == y;
                ones &= f[2 * y] == 1 && f[2 * y + 1] == 0;
                isReal &= f[2 * y + 1] == 0;
            }
            this.real = isReal;
            if (stays) {
                this.source = null;
            } else {
                for (int y = 0; y < size; y++) {
                    src[y] <<= 1;
                }
                this.source = src;
            }
            if (ones) {
                this.factor = null;
            } else {
                if (isReal) {
                    for (int y = 0; y < size; y++) {
                        f[2 * y + 1] = f[2 * y];
                    }
                }
                this.factor = f;
            }
            // Only the pure multiplication by complex factors runs on the expanded tables.
            this.expanded = a.lanes != null && stays && !ones && !isReal
                    ? LaneKernels.expand(f) : null;
        }

        /**
         * Takes one gate into the tables from the outside: for each output index whose path so
         * far reaches {@code src[y]}, the gate's factor there multiplies {@code f[y]} and its
         * source index replaces {@code src[y]}.
         */
        private static void back(GateOp g, int[] qubits, int[] t, int[] src, double[] f) {
            final int k = g.targets.length;
            final int[] pos = new int[k];
            int tm = 0;
            for (int i = 0; i < k; i++) {
                pos[i] = t[indexOf(qubits, g.targets[i])];
                tm |= 1 << pos[i];
            }
            int cm = 0;
            for (int c : g.controls) {
                cm |= 1 << t[indexOf(qubits, c)];
            }
            final double[] data = g.data;
            int[] inv = null;
            if (g.shape == GateOp.MONOMIAL) {
                inv = new int[g.perm.length];
                for (int c = 0; c < inv.length; c++) {
                    inv[g.perm[c]] = c;
                }
            }
            final int p0 = pos[0];
            final int p1 = k > 1 ? pos[1] : 0;
            for (int y = 0; y < src.length; y++) {
                final int s = src[y];
                if ((s & cm) != cm) {
                    continue;
                }
                int j;
                if (k == 1) {
                    j = (s >>> p0) & 1;
                } else if (k == 2) {
                    j = ((s >>> p0) & 1) | (((s >>> p1) & 1) << 1);
                } else {
                    j = 0;
                    for (int i = 0; i < k; i++) {
                        j |= ((s >>> pos[i]) & 1) << i;
                    }
                }
                int c = j;
                if (inv != null) {
                    c = inv[j];
                    int moved = s & ~tm;
                    for (int i = 0; i < k; i++) {
                        moved |= ((c >>> i) & 1) << pos[i];
                    }
                    src[y] = moved;
                }
                final double gr = data[2 * c];
                final double gi = data[2 * c + 1];
                if (!(gr == 1 && gi == 0)) {
                    final double fr = f[2 * y];
                    final double fi = f[2 * y + 1];
                    f[2 * y] = fr * gr - fi * gi;
                    f[2 * y + 1] = fr * gi + fi * gr;
                }
            }
        }

        private static int indexOf(int[] qubits, int q) {
            int x = 0;
            while (qubits[x] != q) {
                x++;
            }
            return x;
        }

        @Override
        long units() {
            return 1L << (a.n - b);
        }

        @Override
        long unitsPerBlock(int blockLog) {
            return b <= blockLog ? 1L << (blockLog - b) : -1;
        }

        @Override
        void run(long from, long to) {
            final int len = 2 << b;
            final LaneKernels lanes = a.lanes;
            double[] tmp = null;
            if (source != null) {
                double[][] cache = SCRATCH.get();
                if (cache[b] == null) {
                    cache[b] = new double[len];
                }
                tmp = cache[b];
            }
            for (long u = from; u < to; u++) {
                final long base = u << b;
                final double[] psi = a.chunks[(int) (base >>> a.chunkLog)];
                final int off = (int) (base & a.chunkMask) << 1;
                if (source == null) {
                    if (factor == null) {
                        continue;
                    }
                    if (real) {
                        multiply(lanes, psi, off, factor, len);
                    } else if (expanded != null) {
                        lanes.scaleByExpanded(psi, off, expanded[0], expanded[1], 1 << b);
                    } else if (lanes != null) {
                        lanes.scaleByTable(psi, off, factor, 1 << b);
                    } else {
                        Frame.scaleRow(psi, off, factor, 1 << b);
                    }
                    continue;
                }
                gather(psi, off, tmp, len);
                System.arraycopy(tmp, 0, psi, off, len);
            }
        }

        /** The block at {@code off} permuted (and scaled) into {@code tmp}. */
        private void gather(double[] psi, int off, double[] tmp, int len) {
            final int[] src = source;
            if (factor == null) {
                for (int y = 0, x = 0; x < len; y++, x += 2) {
                    final int s = off + src[y];
                    tmp[x] = psi[s];
                    tmp[x + 1] = psi[s + 1];
                }
            } else if (real) {
                for (int y = 0, x = 0; x < len; y++, x += 2) {
                    final int s = off + src[y];
                    final double f = factor[x];
                    tmp[x] = f * psi[s];
                    tmp[x + 1] = f * psi[s + 1];
                }
            } else {
                for (int y = 0, x = 0; x < len; y++, x += 2) {
                    final int s = off + src[y];
                    final double tr = factor[x];
                    final double ti = factor[x + 1];
                    final double re = psi[s];
                    final double im = psi[s + 1];
                    tmp[x] = tr * re - ti * im;
                    tmp[x + 1] = tr * im + ti * re;
                }
            }
        }

        private static void multiply(LaneKernels lanes, double[] psi, int off, double[] f,
                int len) {
            if (lanes != null) {
                lanes.multiply(psi, off, f, len);
                return;
            }
            for (int x = 0; x < len; x++) {
                psi[off + x] *= f[x];
            }
        }
    }
}
