package dev.qsim.kernel;

import java.util.ArrayList;
import java.util.List;

/**
 * Applies runs of gates window by window. A window is a set of {@code 2^w} amplitudes closed
 * under every gate of a run: the indices that share all bits outside the window's bits, which
 * are the low bits {@code [0, l)} and the gates' target qubits above them. A window is read into
 * a double-precision scratch state (in contiguous runs of {@code 2^l} amplitudes), every gate of
 * the run is applied there by its ordinary {@link Plan} with its qubits renumbered, and the
 * window is written back. So the state is streamed once for the whole run, and a
 * single-precision state is computed in double and rounded once per run.
 *
 * <p>A permutation without phases on qubits that select whole chunks moves chunk references
 * instead ({@link PermutationKernels#permuteChunks}). A control qubit outside the window is fixed
 * within it: the gate is applied to the windows where that control is 1 and skipped elsewhere.
 * Windows are disjoint, so they are shared among threads without changing the result: every
 * window gets the same operations in the same order whatever the thread count.
 *
 * <p>Method: applying several gates to a part of the state while it sits in cache is the cache
 * blocking of state-vector simulators such as qHiPSTER (M. Smelyanskiy, N. P. D. Sawaya,
 * A. Aspuru-Guzik, arXiv:1601.07195, 2016) and H. De Raedt et al., "Massively parallel quantum
 * computer simulator, eleven years later", Comput. Phys. Commun. 237 (2019) 47 (citations from
 * memory); gathering the target qubits into a dense window is our own arrangement. Internal.
 */
public final class Windows {
    /** Log2 of the amplitudes of a full window: 2^14, a 256 KiB double scratch that fits L2. */
    public static final int WINDOW_LOG = 14;
    /**
     * Log2 of the shortest contiguous run a window is read in when gates are grouped: 2^6
     * amplitudes, 512 bytes in single precision. A gate that would make runs shorter starts a
     * new group (a first gate is always accepted).
     */
    public static final int MIN_RUN_LOG = 6;

    private static final ThreadLocal<Amplitudes[]> SCRATCH =
            ThreadLocal.withInitial(() -> new Amplitudes[WINDOW_LOG + 1]);

    private Windows() {
    }

    private static Amplitudes scratch(int log) {
        Amplitudes[] cache = SCRATCH.get();
        if (cache[log] == null) {
            cache[log] = Amplitudes.allocate(log, log);
        }
        return cache[log];
    }

    /**
     * Applies gates in order, grouping consecutive gates whose targets fit in one window.
     *
     * @param a the storage, double or single precision. Modified.
     * @param ops the gates, each with at most {@value #WINDOW_LOG} targets
     * @param threads threads to use
     */
    public static void apply(Amplitudes a, List<GateOp> ops, int threads) {
        schedule(a, ops, Frame.runner(a, threads));
    }

    /**
     * How many gates past the first gate of a group the scheduler looks at for gates to pull
     * into the group. Bounds the planning time at {@code LOOKAHEAD} steps a gate.
     */
    static final int LOOKAHEAD = 256;

    /**
     * Decides the groups and lone passes of gates and hands them to {@code passes}, in an
     * order that gives every amplitude the same result as the gates in list order.
     *
     * <p>A group starts at the first gate not yet scheduled and takes, from the next
     * {@value #LOOKAHEAD} gates, each one that fits the window with the group and acts on no
     * qubit (target or control) of a gate passed over before it: such a gate commutes with every
     * gate it is moved ahead of, because their qubits are disjoint (common practice of gate
     * scheduling; M. A. Nielsen and I. L. Chuang, "Quantum Computation and Quantum Information",
     * 2010, sec. 2.1.7: operators on different tensor factors commute). A passed-over gate's
     * qubits stay closed for the rest of the scan.
     *
     * <p>Double precision: a group whose targets all lie in the low cache block runs in place,
     * block by block ({@link Passes#blocked}); a group reaching above it is gathered into windows
     * ({@link Passes#window}); a lone gate runs alone. Single precision: every group runs in
     * windows (computed in double), except a lone single-qubit gate, which has a direct pass.
     */
    static void schedule(Amplitudes a, List<GateOp> ops, Frame.Passes passes) {
        final int size = ops.size();
        final int w = Math.min(a.n, WINDOW_LOG);
        final int maxLow = Math.min(w, a.chunkLog);
        final int blockLog = Math.min(Frame.CACHE_LOG, a.chunkLog);
        final boolean single = a.isSingle();
        final boolean[] done = new boolean[size];
        final long[] touch = new long[size];
        final boolean[] chunkMove = new boolean[size];
        for (int i = 0; i < size; i++) {
            GateOp op = ops.get(i);
            long t = op.targetMask;
            for (int c : op.controls) {
                t |= 1L << c;
            }
            touch[i] = t;
            chunkMove[i] = PermutationKernels.movesChunks(a, op);
        }
        final long all = a.n >= 64 ? -1L : (1L << a.n) - 1;
        final List<GateOp> group = new ArrayList<>();
        int next = 0;
        while (next < size) {
            final int i = next;
            done[i] = true;
            GateOp first = ops.get(i);
            if (chunkMove[i]) {
                passes.chunkMove(first);
                next = advance(done, i);
                continue;
            }
            group.clear();
            group.add(first);
            long mask = first.targetMask;
            int l = lowBits(mask, w, maxLow, 0);
            if (l >= 0) {
                long closed = 0;
                final int end = (int) Math.min(size, (long) i + 1 + LOOKAHEAD);
                for (int j = i + 1; j < end && (closed & all) != all; j++) {
                    if (done[j]) {
                        continue;
                    }
                    if ((touch[j] & closed) != 0 || chunkMove[j]) {
                        closed |= touch[j];
                        continue;
                    }
                    long wider = mask | ops.get(j).targetMask;
                    int l2 = lowBits(wider, w, maxLow, Math.min(MIN_RUN_LOG, l));
                    if (l2 < 0) {
                        closed |= touch[j];
                        continue;
                    }
                    done[j] = true;
                    group.add(ops.get(j));
                    mask = wider;
                    l = l2;
                }
            }
            hand(a, group, mask, l, single, blockLog, passes);
            next = advance(done, i);
        }
    }

    /** The first index after {@code i} not yet scheduled, or the size. */
    private static int advance(boolean[] done, int i) {
        int k = i + 1;
        while (k < done.length && done[k]) {
            k++;
        }
        return k;
    }

    /**
     * Hands one group to {@code passes} as the pass it is run by, runs of diagonal and monomial
     * gates merged ({@link TableKernels#mergeRuns}).
     */
    private static void hand(Amplitudes a, List<GateOp> group, long mask, int l, boolean single,
            int blockLog, Frame.Passes passes) {
        final GateOp first = group.get(0);
        if (single) {
            double[] m2 = group.size() == 1 ? FloatSingleQubitKernels.matrix2(first) : null;
            if (m2 != null) {
                // A lone single-qubit gate: one direct pass beats copying windows in and out.
                passes.floatSingle(first, m2);
            } else {
                passes.window(inWindow(a, group, mask, l), mask, l);
            }
            return;
        }
        if (group.size() == 1 || l < 0) {
            passes.single(first, first.plan(a));
            return;
        }
        if (a.n > blockLog && (mask >>> blockLog) == 0) {
            List<GateOp> ops = GatePairs.arrange(a.lanes, a.chunkLog,
                    TableKernels.mergeRuns(group, identity(a.n), blockLog, a.n), null);
            Plan[] plans = new Plan[ops.size()];
            boolean blockable = true;
            for (int x = 0; x < plans.length && blockable; x++) {
                plans[x] = ops.get(x).plan(a);
                blockable = plans[x].unitsPerBlock(blockLog) >= 0;
            }
            if (blockable) {
                passes.blocked(List.copyOf(ops), plans, blockLog);
                return;
            }
        }
        passes.window(inWindow(a, group, mask, l), mask, l);
    }

    /**
     * The group's gates with runs merged for the window of {@code mask} and {@code l}, and
     * pairable gates next to each other ({@link GatePairs#arrange}).
     */
    private static List<GateOp> inWindow(Amplitudes a, List<GateOp> group, long mask, int l) {
        int[] position = positions(a.n, mask, l);
        int wl = l + Long.bitCount(mask >>> l);
        return List.copyOf(GatePairs.arrange(a.lanes, wl,
                TableKernels.mergeRuns(group, position, wl, a.n), position));
    }

    /**
     * Each qubit's bit in the windows of {@code mask} and {@code l}: the low bits stay, the
     * targets above them follow in order, every other qubit is -1 (it selects the window).
     */
    static int[] positions(int n, long mask, int l) {
        final int[] position = new int[n];
        int next = l;
        for (int q = 0; q < n; q++) {
            position[q] = q < l ? q : ((mask >>> q) & 1) != 0 ? next++ : -1;
        }
        return position;
    }

    /** Each qubit at its own bit. */
    static int[] identity(int n) {
        final int[] position = new int[n];
        for (int q = 0; q < n; q++) {
            position[q] = q;
        }
        return position;
    }

    /**
     * Returns the largest {@code l} in {@code [minLow, maxLow]} such that the low bits
     * {@code [0, l)} and the targets at or above {@code l} number at most {@code w}, or -1.
     */
    static int lowBits(long mask, int w, int maxLow, int minLow) {
        for (int l = maxLow; l >= minLow; l--) {
            if (l + Long.bitCount(mask >>> l) <= w) {
                return l;
            }
        }
        return -1;
    }

    static void applyGroup(Amplitudes a, List<GateOp> ops, long mask, int l,
            int threads) {
        final int n = a.n;
        final int h = Long.bitCount(mask >>> l);
        final int wl = l + h;
        final int[] high = new int[h];
        final int[] free = new int[n - wl];
        final int[] map = new int[n];
        for (int q = 0, hi = 0, fi = 0; q < n; q++) {
            if (q < l) {
                map[q] = q;
            } else if (((mask >>> q) & 1) != 0) {
                map[q] = l + hi;
                high[hi++] = q;
            } else {
                map[q] = -1;
                free[fi++] = q;
            }
        }
        final int k = ops.size();
        final int[][] targets = new int[k][];
        final int[][] controls = new int[k][];
        final long[] outer = new long[k];
        for (int x = 0; x < k; x++) {
            GateOp op = ops.get(x);
            targets[x] = new int[op.targets.length];
            for (int j = 0; j < op.targets.length; j++) {
                targets[x][j] = map[op.targets[j]];
            }
            int inner = 0;
            for (int c : op.controls) {
                if (map[c] >= 0) {
                    inner++;
                } else {
                    outer[x] |= 1L << c;
                }
            }
            controls[x] = new int[inner];
            inner = 0;
            for (int c : op.controls) {
                if (map[c] >= 0) {
                    controls[x][inner++] = map[c];
                }
            }
        }
        final long[] runStart = new long[1 << h];
        for (int r = 0; r < runStart.length; r++) {
            runStart[r] = deposit(r, high);
        }
        // Adjacent single-qubit gates that run as one sweep (they have no controls at all).
        final boolean[] paired = GatePairs.starts(a.lanes, wl, ops, map);
        final boolean par = n >= Parallel.MIN_PARALLEL_QUBITS;
        Parallel.forRange(threads, 1L << (n - wl), par, (from, to) -> {
            Amplitudes s = scratch(wl).useLanes(a.lanes);
            double[] buf = s.chunks[0];
            Plan[] plans = new Plan[k];
            long[] units = new long[k];
            for (int x = 0; x < k; x++) {
                plans[x] = paired[x] ? GatePairs.plan(s, targets[x][0], ops.get(x).data,
                        targets[x + 1][0], ops.get(x + 1).data)
                        : x > 0 && paired[x - 1] ? null
                        : ops.get(x).plan(s, targets[x], controls[x]);
                units[x] = plans[x] == null ? 0 : plans[x].units();
            }
            for (long win = from; win < to; win++) {
                long base = deposit(win, free);
                boolean any = false;
                for (int x = 0; x < k && !any; x++) {
                    any = (base & outer[x]) == outer[x];
                }
                if (!any) {
                    continue;
                }
                for (int r = 0; r < runStart.length; r++) {
                    a.readRaw(base | runStart[r], l, buf, r << (l + 1));
                }
                for (int x = 0; x < k; x++) {
                    if (plans[x] != null && (base & outer[x]) == outer[x]) {
                        plans[x].run(0, units[x]);
                    }
                }
                for (int r = 0; r < runStart.length; r++) {
                    a.writeRaw(base | runStart[r], l, buf, r << (l + 1));
                }
            }
        });
    }

    /** Spreads the bits of {@code value} over the given positions (bit j to positions[j]). */
    private static long deposit(long value, int[] positions) {
        long out = 0;
        for (int j = 0; j < positions.length; j++) {
            out |= ((value >>> j) & 1L) << positions[j];
        }
        return out;
    }
}
