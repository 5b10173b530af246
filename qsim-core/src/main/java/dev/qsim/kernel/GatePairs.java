package dev.qsim.kernel;

import java.util.ArrayList;
import java.util.List;

/**
 * Two adjacent single-qubit gates of a cache-blocked group or window run in one sweep of the
 * vector loops ({@link LaneKernels#pairBlocks}). In cache, the vector loops of the gates with
 * half the arithmetic (real matrices such as H and RY, and RX-shaped ones) are bound by moving
 * data between the cache and the registers, not by arithmetic: two such gates on different
 * targets, each at or above a vector, load and store their four vectors once instead of twice.
 * Measured on the 2-core machine of record (2^14 amplitudes, 512-bit vectors, Temurin 25): 0.27
 * ns an amplitude a gate alone, 0.15-0.17 in a pair; complex gates, bound by arithmetic, gain
 * little (0.30 against 0.29) and are not paired. Every element gets the bits the two gates give
 * one after the other, so pairing changes the time, never the result.
 *
 * <p>Method: applying several gates to amplitudes while they sit in registers is the gate
 * fusion of state-vector simulators (e.g. M. Smelyanskiy, N. P. D. Sawaya, A. Aspuru-Guzik,
 * arXiv:1601.07195, 2016; citation from memory); keeping the two gates' own loops instead of
 * their 4x4 product (which costs four times the arithmetic) is our own arrangement. Internal.
 */
final class GatePairs {
    private GatePairs() {
    }


    /**
     * Whether gate {@code x} on target {@code qx} followed by gate {@code y} on target
     * {@code qy} (targets in the storage they run on) run as one pair: the vector loops are in
     * use, both gates are dense single-qubit gates without controls and with half the
     * arithmetic, on different targets at or above a vector and inside a chunk.
     *
     * @param lanes the storage's vector loops, or null
     * @param chunkLog the storage's chunk log
     * @param x the first gate
     * @param qx its target
     * @param y the second gate
     * @param qy its target
     * @return whether they pair
     */
    static boolean pairable(LaneKernels lanes, int chunkLog, GateOp x, int qx, GateOp y,
            int qy) {
        if (lanes == null || !x.halfArithmetic() || !y.halfArithmetic() || qx == qy) {
            return false;
        }
        int low = lanes.amplitudeLog();
        return Math.min(qx, qy) >= low && Math.max(qx, qy) < chunkLog;
    }


    /** How far past a gate {@link #arrange} looks for its partner. */
    static final int LOOKAHEAD = 64;

    /**
     * Returns the gates of a group in an order that puts pairable gates next to each other:
     * after each gate that could pair, the first later gate (within {@value #LOOKAHEAD}) that
     * pairs with it and acts on no qubit of the gates it is moved ahead of is moved up to
     * follow it. Gates on disjoint qubits commute (M. A. Nielsen and I. L. Chuang, "Quantum
     * Computation and Quantum Information", 2010, sec. 2.1.7), so the product is the same; the
     * roundings of the moved gates may differ in the last bits. The same list when nothing
     * pairs (always on the scalar loops).
     *
     * @param lanes the storage's vector loops, or null
     * @param chunkLog the chunk log of the storage the gates run on
     * @param ops the gates, in order
     * @param position each qubit's position in that storage, or null for the qubit itself
     * @return the gates, rearranged
     */
    static List<GateOp> arrange(LaneKernels lanes, int chunkLog, List<GateOp> ops,
            int[] position) {
        if (lanes == null) {
            return ops;
        }
        int k = ops.size();
        List<GateOp> out = new ArrayList<>(k);
        boolean[] used = new boolean[k];
        boolean moved = false;
        for (int i = 0; i < k; i++) {
            if (used[i]) {
                continue;
            }
            GateOp x = ops.get(i);
            out.add(x);
            used[i] = true;
            if (!x.halfArithmetic()) {
                continue;
            }
            int qx = at(position, x.targets[0]);
            long passed = 0;
            int end = Math.min(k, i + 1 + LOOKAHEAD);
            for (int j = i + 1; j < end; j++) {
                if (used[j]) {
                    continue;
                }
                GateOp y = ops.get(j);
                long touch = touch(y);
                if ((touch & passed) == 0 && y.halfArithmetic()
                        && pairable(lanes, chunkLog, x, qx, y, at(position, y.targets[0]))) {
                    out.add(y);
                    used[j] = true;
                    moved |= j != i + 1;
                    break;
                }
                passed |= touch;
            }
        }
        return moved ? out : ops;
    }

    private static int at(int[] position, int q) {
        return position == null ? q : position[q];
    }

    /** The qubits a gate acts on, targets and controls. */
    private static long touch(GateOp op) {
        long t = op.targetMask;
        for (int c : op.controls) {
            t |= 1L << c;
        }
        return t;
    }

    /**
     * Returns the plans of a cache-blocked group with each pair of adjacent pairable gates
     * ({@link #pairable}, greedily from the first) replaced by one plan; the same array when
     * none pair.
     *
     * @param a the storage the plans run on
     * @param ops the group's gates, in order, one per plan
     * @param plans their plans
     * @return the plans to run, in order
     */
    static Plan[] pairUp(Amplitudes a, List<GateOp> ops, Plan[] plans) {
        int k = ops.size();
        boolean[] starts = starts(a.lanes, a.chunkLog, ops, null);
        int pairs = 0;
        for (boolean s : starts) {
            pairs += s ? 1 : 0;
        }
        if (pairs == 0) {
            return plans;
        }
        Plan[] out = new Plan[k - pairs];
        for (int i = 0, j = 0; i < k; i++) {
            if (starts[i]) {
                GateOp x = ops.get(i);
                GateOp y = ops.get(i + 1);
                out[j++] = plan(a, x.targets[0], x.data, y.targets[0], y.data);
                i++;
            } else {
                out[j++] = plans[i];
            }
        }
        return out;
    }

    /**
     * Marks where {@link #pairUp} and the windows pair a list of gates on the given targets.
     *
     * @param lanes the storage's vector loops, or null
     * @param chunkLog the storage's chunk log
     * @param ops the gates, in order
     * @param position each qubit's position in the storage the gates run on, or null for the
     *     qubit itself
     * @return where pairs start: element i is true when gates i and i + 1 pair
     */
    static boolean[] starts(LaneKernels lanes, int chunkLog, List<GateOp> ops, int[] position) {
        int k = ops.size();
        boolean[] starts = new boolean[k];
        for (int i = 0; i + 1 < k; i++) {
            GateOp x = ops.get(i);
            GateOp y = ops.get(i + 1);
            if (x.targets.length != 1 || y.targets.length != 1) {
                continue;
            }
            int qx = position == null ? x.targets[0] : position[x.targets[0]];
            int qy = position == null ? y.targets[0] : position[y.targets[0]];
            if (pairable(lanes, chunkLog, x, qx, y, qy)) {
                starts[i] = true;
                i++;
            }
        }
        return starts;
    }

    /**
     * Prepares two gates as one pair; the storage has vector loops and the pair is
     * {@link #pairable}.
     *
     * @param a the storage
     * @param q1 the first gate's target
     * @param m1 its matrix, length 8. Not modified.
     * @param q2 the second gate's target
     * @param m2 its matrix, length 8. Not modified.
     * @return the plan
     */
    static Plan plan(Amplitudes a, int q1, double[] m1, int q2, double[] m2) {
        return new PairPlan(a, q1, m1, q2, m2);
    }

    /** Blocks of {@code 2^(max(q1, q2) + 1)} amplitudes, one unit each, chunk by chunk. */
    private static final class PairPlan extends Plan {
        private final int q1;
        private final int q2;
        private final int top;
        private final double[] m1;
        private final double[] m2;
        private final int kind1;
        private final int kind2;

        PairPlan(Amplitudes a, int q1, double[] m1, int q2, double[] m2) {
            super(a);
            this.q1 = q1;
            this.q2 = q2;
            this.top = Math.max(q1, q2);
            this.m1 = m1;
            this.m2 = m2;
            this.kind1 = LaneKernels.kind(m1);
            this.kind2 = LaneKernels.kind(m2);
        }

        @Override
        long units() {
            return 1L << (a.n - top - 1);
        }

        @Override
        void run(long from, long to) {
            final int perChunkLog = a.chunkLog - top - 1;
            long b = from;
            while (b < to) {
                final int c = (int) (b >>> perChunkLog);
                final long end = Math.min(to, ((long) c + 1) << perChunkLog);
                final int start = (int) (b - ((long) c << perChunkLog)) << (top + 2);
                a.lanes.pairBlocks(a.chunks[c], start, start + ((int) (end - b) << (top + 2)),
                        q1, m1, kind1, q2, m2, kind2);
                b = end;
            }
        }

        @Override
        long unitsPerBlock(int blockLog) {
            return top < blockLog ? 1L << (blockLog - top - 1) : -1;
        }
    }
}
