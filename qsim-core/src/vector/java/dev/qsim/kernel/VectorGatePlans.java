package dev.qsim.kernel;

import static dev.qsim.kernel.VectorShapes.AMP_LOG;
import static dev.qsim.kernel.VectorShapes.D;
import static dev.qsim.kernel.VectorShapes.L;
import static dev.qsim.kernel.VectorShapes.SIGN;
import static dev.qsim.kernel.VectorShapes.SWAP;

import jdk.incubator.vector.DoubleVector;
import jdk.incubator.vector.VectorMask;
import jdk.incubator.vector.VectorShuffle;

/**
 * Vector plans for gates with several targets or with controls: dense (the fused blocks of
 * {@code Fusion} among them), diagonal, and X with controls. A gate's qubits below
 * {@code AMP_LOG} ("low") lie inside one vector; the others ("high") select whole vectors. The
 * high qubits are laid out by a {@link Layout} of their own, whose runs are then whole vectors;
 * the low ones are handled in the lanes: a low target by lane permutations (each lane reads the
 * amplitude of each column of its own row) and per-lane matrix entries, a low control by a
 * lane mask that keeps the lanes where it is 0. With no high qubit at all, every vector is
 * worked alone.
 *
 * <p>Every lane computes the scalar formula of {@link DenseKernels}, {@link DiagonalKernels}
 * or {@link PermutationKernels} for its amplitude, with the same products added in the same
 * order (for k at most 2, one sum left to right; from k = 3, each column's complex product
 * first, then the running sum), so the results are the same bits. Internal.
 */
final class VectorGatePlans {
    private VectorGatePlans() {
    }

    /** Where a gate's qubits fall: inside a vector or across vectors. */
    private abstract static class Split extends Plan {
        final Layout l;
        final int flatLog;
        final int maxPosition;
        /** Lanes where every low control is 1, or null without low controls. */
        final boolean[] controlLanes;

        Split(Amplitudes a, int[] highTargets, int[] controls) {
            super(a);
            int max = -1;
            int highControls = 0;
            for (int t : highTargets) {
                max = Math.max(max, t);
            }
            for (int c : controls) {
                max = Math.max(max, c);
                highControls += c >= AMP_LOG ? 1 : 0;
            }
            int[] hc = new int[highControls];
            boolean[] lanes = null;
            for (int c : controls) {
                if (c >= AMP_LOG) {
                    hc[--highControls] = c;
                } else {
                    if (lanes == null) {
                        lanes = new boolean[L];
                        java.util.Arrays.fill(lanes, true);
                    }
                    for (int i = 0; i < L; i++) {
                        lanes[i] &= (((i >> 1) >>> c) & 1) == 1;
                    }
                }
            }
            this.controlLanes = lanes;
            this.l = highTargets.length + hc.length == 0 ? null : new Layout(a, highTargets, hc);
            this.flatLog = Math.min(a.chunkLog, Layout.TABLE_LOG);
            this.maxPosition = max;
        }

        @Override
        long units() {
            return l != null ? l.outer : 1L << (a.n - flatLog);
        }

        @Override
        long unitsPerBlock(int blockLog) {
            if (maxPosition >= blockLog) {
                return -1;
            }
            if (l == null) {
                return flatLog <= blockLog ? 1L << (blockLog - flatLog) : -1;
            }
            if (l.blockLog + l.highPos.length > blockLog) {
                return -1;
            }
            return 1L << (blockLog - l.highPos.length - l.blockLog);
        }

        @Override
        void run(long from, long to) {
            final int dh = l == null ? 1 : l.d;
            final double[][] arr = new double[dh][];
            final int[] off = new int[dh];
            final Object scratch = scratch();
            for (long o = from; o < to; o++) {
                if (l == null) {
                    final long first = o << flatLog;
                    arr[0] = a.chunks[(int) (first >>> a.chunkLog)];
                    off[0] = (int) (first & a.chunkMask);
                    unit(arr, off, ZERO, 1 << flatLog, scratch);
                } else {
                    l.locate(a, o, arr, off);
                    unit(arr, off, l.starts, l.run, scratch);
                }
            }
        }

        /** Per-thread working space for {@link #unit}, or null. */
        Object scratch() {
            return null;
        }

        /**
         * Works one unit: for each start s and each e in {@code [s, s + run)} (amplitude
         * offsets, a step of one vector), high combination j's vector is at {@code arr[j]},
         * double offset {@code 2 * (off[j] + e)}. Runs are whole vectors.
         */
        abstract void unit(double[][] arr, int[] off, int[] starts, int run, Object scratch);
    }

    private static final int[] ZERO = {0};

    /** Positions of a gate's targets below {@code AMP_LOG}, as bits of the target index. */
    private static int lowBits(int[] targets) {
        int b = 0;
        for (int t = 0; t < targets.length; t++) {
            if (targets[t] < AMP_LOG) {
                b |= 1 << t;
            }
        }
        return b;
    }

    private static int[] high(int[] targets) {
        int count = 0;
        for (int t : targets) {
            count += t >= AMP_LOG ? 1 : 0;
        }
        int[] h = new int[count];
        int w = 0;
        for (int t : targets) {
            if (t >= AMP_LOG) {
                h[w++] = t;
            }
        }
        return h;
    }

    /**
     * The target index of the amplitude in lane-amplitude {@code c} of high combination
     * {@code jh}: the bits of {@code jh} at the high targets' places, those of {@code c} at the
     * low targets' places.
     */
    private static int index(int[] targets, int jh, int c) {
        int j = 0;
        int h = 0;
        for (int t = 0; t < targets.length; t++) {
            int bit = targets[t] >= AMP_LOG ? (jh >>> h++) & 1 : (c >>> targets[t]) & 1;
            j |= bit << t;
        }
        return j;
    }

    /** The high combination of target index j (its bits at the high targets' places). */
    private static int highPart(int[] targets, int j) {
        int jh = 0;
        int h = 0;
        for (int t = 0; t < targets.length; t++) {
            if (targets[t] >= AMP_LOG) {
                jh |= ((j >>> t) & 1) << h++;
            }
        }
        return jh;
    }

    /** Lane-amplitude c with its low-target bits replaced by those of target index j. */
    private static int select(int[] targets, int c, int j) {
        int s = c;
        for (int t = 0; t < targets.length; t++) {
            if (targets[t] < AMP_LOG) {
                s = (s & ~(1 << targets[t])) | (((j >>> t) & 1) << targets[t]);
            }
        }
        return s;
    }

    // ---------------------------------------------------------------- dense

    /** See {@link LaneKernels#dense}. */
    static Plan dense(Amplitudes a, int[] targets, int[] controls, double[] m) {
        if (a.chunkLog < AMP_LOG) {
            return null;
        }
        if (targets.length >= 2 && lowBits(targets) != 0) {
            // Two or more targets with one inside a vector: a lane permutation per column and
            // vector made these 2-3 times slower than the scalar loops (24 qubits, one thread:
            // targets {0, 1} 8.8-20 against 3.9 ns an amplitude, {0, 1, 2} 27-29 against 11.8;
            // docs/decisions.md), so they run scalar.
            return null;
        }
        return new DensePlan(a, targets, controls, m);
    }

    private static final class DensePlan extends Split {
        final int d;
        final int dh;
        final int target;
        final int kind;
        final boolean grouped;
        final boolean uniform;
        final double[] m;
        /**
         * Per output vector and column: the real and signed imaginary entries by lane, vector
         * {@code ih * d + j} at {@code (ih * d + j) * L} (arrays, so that the loops make the
         * vectors themselves and the compiler knows their exact class).
         */
        final double[] re;
        final double[] im;
        /** Per column: the vector it reads and the lane permutations. */
        final int[] from;
        final VectorShuffle<Long>[] pick;
        final VectorShuffle<Long>[] pickSwapped;
        final boolean[] keep;

        @SuppressWarnings({"unchecked", "rawtypes"})
        DensePlan(Amplitudes a, int[] targets, int[] controls, double[] m) {
            super(a, high(targets), controls);
            this.m = m;
            this.d = 1 << targets.length;
            this.dh = l == null ? 1 : l.d;
            this.target = targets[0];
            this.kind = LaneKernels.kind(m);
            this.grouped = targets.length >= 3;
            this.uniform = lowBits(targets) == 0 && controlLanes == null;
            this.keep = controlLanes;
            this.from = new int[d];
            for (int j = 0; j < d; j++) {
                from[j] = highPart(targets, j);
            }
            re = new double[dh * d * L];
            im = new double[dh * d * L];
            pick = new VectorShuffle[d];
            pickSwapped = new VectorShuffle[d];
            for (int j = 0; j < d; j++) {
                int[] p = new int[L];
                int[] ps = new int[L];
                for (int i = 0; i < L; i++) {
                    int src = 2 * select(targets, i >> 1, j) + (i & 1);
                    p[i] = src;
                    ps[i] = src ^ 1;
                }
                pick[j] = VectorShapes.shuffle(p);
                pickSwapped[j] = VectorShapes.shuffle(ps);
            }
            for (int ih = 0; ih < dh; ih++) {
                for (int j = 0; j < d; j++) {
                    final int at = (ih * d + j) * L;
                    for (int i = 0; i < L; i++) {
                        int row = index(targets, ih, i >> 1);
                        re[at + i] = m[2 * (row * d + j)];
                        double mi = m[2 * (row * d + j) + 1];
                        im[at + i] = (i & 1) == 0 ? -mi : mi;
                    }
                }
            }
        }

        @Override
        Object scratch() {
            return new double[2 * d * L];
        }

        @Override
        void unit(double[][] arr, int[] off, int[] starts, int run, Object scratch) {
            if (d == 2 && target >= AMP_LOG) {
                // One target across vectors: the two halves of the single-qubit loops.
                for (int s : starts) {
                    final int x = (off[0] + s) << 1;
                    final int y = (off[1] + s) << 1;
                    if (keep == null) {
                        VectorPairs.pairs(arr[0], x, arr[1], y, run, m, kind);
                    } else {
                        VectorPairs.pairsKeeping(arr[0], x, arr[1], y, run, m, keep);
                    }
                }
            } else if (d == 2) {
                // One target inside the vector: the in-register single-qubit loops.
                for (int s : starts) {
                    final int x = (off[0] + s) << 1;
                    if (keep == null) {
                        VectorPairs.blocks(arr[0], x, x + (run << 1), target, m, kind);
                    } else {
                        VectorPairs.blocksKeeping(arr[0], x, x + (run << 1), target, m, keep);
                    }
                }
            } else if (d == 4 && uniform) {
                for (int s : starts) {
                    uniform4(arr, off, s, s + run, m);
                }
            } else if (d == 8 && uniform) {
                for (int s : starts) {
                    uniform8(arr, off, s, s + run, m);
                }

            } else if (!uniform) {
                for (int s : starts) {
                    lanes(arr, off, s, s + run, (double[]) scratch, this);
                }
            } else if (grouped) {
                for (int s : starts) {
                    uniformGrouped(arr, off, s, s + run, (double[]) scratch, m, d);
                }
            } else {
                for (int s : starts) {
                    uniformInOrder(arr, off, s, s + run, (double[]) scratch, m, d);
                }
            }
        }
    }

    /**
     * A 4x4 matrix on two targets across vectors, in registers: the scalar loop's one sum left
     * to right, {@code re = a00 r0 - b00 i0 + a01 r1 - ...}, lane by lane.
     */
    private static void uniform4(double[][] arr, int[] off, int from, int to, double[] m) {
        final double[] p0 = arr[0];
        final double[] p1 = arr[1];
        final double[] p2 = arr[2];
        final double[] p3 = arr[3];
        final int o1 = (off[1] - off[0]) << 1;
        final int o2 = (off[2] - off[0]) << 1;
        final int o3 = (off[3] - off[0]) << 1;
        for (int x = (off[0] + from) << 1; x < (off[0] + to) << 1; x += L) {
            final DoubleVector v0 = DoubleVector.fromArray(D, p0, x);
            final DoubleVector v1 = DoubleVector.fromArray(D, p1, x + o1);
            final DoubleVector v2 = DoubleVector.fromArray(D, p2, x + o2);
            final DoubleVector v3 = DoubleVector.fromArray(D, p3, x + o3);
            final DoubleVector w0 = v0.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                    .mul(SIGN);
            final DoubleVector w1 = v1.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                    .mul(SIGN);
            final DoubleVector w2 = v2.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                    .mul(SIGN);
            final DoubleVector w3 = v3.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                    .mul(SIGN);
            // Written out row by row: a helper taking vectors as arguments would box them
            // whenever the compiler does not inline it.
            v0.mul(m[0]).add(w0.mul(m[1])).add(v1.mul(m[2])).add(w1.mul(m[3]))
                    .add(v2.mul(m[4])).add(w2.mul(m[5])).add(v3.mul(m[6])).add(w3.mul(m[7]))
                    .intoArray(p0, x);
            v0.mul(m[8]).add(w0.mul(m[9])).add(v1.mul(m[10])).add(w1.mul(m[11]))
                    .add(v2.mul(m[12])).add(w2.mul(m[13])).add(v3.mul(m[14])).add(w3.mul(m[15]))
                    .intoArray(p1, x + o1);
            v0.mul(m[16]).add(w0.mul(m[17])).add(v1.mul(m[18])).add(w1.mul(m[19]))
                    .add(v2.mul(m[20])).add(w2.mul(m[21])).add(v3.mul(m[22])).add(w3.mul(m[23]))
                    .intoArray(p2, x + o2);
            v0.mul(m[24]).add(w0.mul(m[25])).add(v1.mul(m[26])).add(w1.mul(m[27]))
                    .add(v2.mul(m[28])).add(w2.mul(m[29])).add(v3.mul(m[30])).add(w3.mul(m[31]))
                    .intoArray(p3, x + o3);
        }
    }

    /**
     * An 8x8 matrix on three targets across vectors, in registers: each column's complex product
     * added to the sum, as the scalar loop groups it. Written out, one statement per output
     * vector (a helper taking vectors would box them when not inlined).
     */
    private static void uniform8(double[][] arr, int[] off, int from, int to, double[] m) {
        final double[] p0 = arr[0];
        final double[] p1 = arr[1];
        final double[] p2 = arr[2];
        final double[] p3 = arr[3];
        final double[] p4 = arr[4];
        final double[] p5 = arr[5];
        final double[] p6 = arr[6];
        final double[] p7 = arr[7];
        final int o1 = (off[1] - off[0]) << 1;
        final int o2 = (off[2] - off[0]) << 1;
        final int o3 = (off[3] - off[0]) << 1;
        final int o4 = (off[4] - off[0]) << 1;
        final int o5 = (off[5] - off[0]) << 1;
        final int o6 = (off[6] - off[0]) << 1;
        final int o7 = (off[7] - off[0]) << 1;
        for (int x = (off[0] + from) << 1; x < (off[0] + to) << 1; x += L) {
            final DoubleVector v0 = DoubleVector.fromArray(D, p0, x);
            final DoubleVector v1 = DoubleVector.fromArray(D, p1, x + o1);
            final DoubleVector v2 = DoubleVector.fromArray(D, p2, x + o2);
            final DoubleVector v3 = DoubleVector.fromArray(D, p3, x + o3);
            final DoubleVector v4 = DoubleVector.fromArray(D, p4, x + o4);
            final DoubleVector v5 = DoubleVector.fromArray(D, p5, x + o5);
            final DoubleVector v6 = DoubleVector.fromArray(D, p6, x + o6);
            final DoubleVector v7 = DoubleVector.fromArray(D, p7, x + o7);
            final DoubleVector w0 = v0.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                    .mul(SIGN);
            final DoubleVector w1 = v1.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                    .mul(SIGN);
            final DoubleVector w2 = v2.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                    .mul(SIGN);
            final DoubleVector w3 = v3.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                    .mul(SIGN);
            final DoubleVector w4 = v4.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                    .mul(SIGN);
            final DoubleVector w5 = v5.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                    .mul(SIGN);
            final DoubleVector w6 = v6.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                    .mul(SIGN);
            final DoubleVector w7 = v7.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                    .mul(SIGN);
            DoubleVector.zero(D)
                    .add(v0.mul(m[0]).add(w0.mul(m[1])))
                    .add(v1.mul(m[2]).add(w1.mul(m[3])))
                    .add(v2.mul(m[4]).add(w2.mul(m[5])))
                    .add(v3.mul(m[6]).add(w3.mul(m[7])))
                    .add(v4.mul(m[8]).add(w4.mul(m[9])))
                    .add(v5.mul(m[10]).add(w5.mul(m[11])))
                    .add(v6.mul(m[12]).add(w6.mul(m[13])))
                    .add(v7.mul(m[14]).add(w7.mul(m[15])))
                    .intoArray(p0, x);
            DoubleVector.zero(D)
                    .add(v0.mul(m[16]).add(w0.mul(m[17])))
                    .add(v1.mul(m[18]).add(w1.mul(m[19])))
                    .add(v2.mul(m[20]).add(w2.mul(m[21])))
                    .add(v3.mul(m[22]).add(w3.mul(m[23])))
                    .add(v4.mul(m[24]).add(w4.mul(m[25])))
                    .add(v5.mul(m[26]).add(w5.mul(m[27])))
                    .add(v6.mul(m[28]).add(w6.mul(m[29])))
                    .add(v7.mul(m[30]).add(w7.mul(m[31])))
                    .intoArray(p1, x + o1);
            DoubleVector.zero(D)
                    .add(v0.mul(m[32]).add(w0.mul(m[33])))
                    .add(v1.mul(m[34]).add(w1.mul(m[35])))
                    .add(v2.mul(m[36]).add(w2.mul(m[37])))
                    .add(v3.mul(m[38]).add(w3.mul(m[39])))
                    .add(v4.mul(m[40]).add(w4.mul(m[41])))
                    .add(v5.mul(m[42]).add(w5.mul(m[43])))
                    .add(v6.mul(m[44]).add(w6.mul(m[45])))
                    .add(v7.mul(m[46]).add(w7.mul(m[47])))
                    .intoArray(p2, x + o2);
            DoubleVector.zero(D)
                    .add(v0.mul(m[48]).add(w0.mul(m[49])))
                    .add(v1.mul(m[50]).add(w1.mul(m[51])))
                    .add(v2.mul(m[52]).add(w2.mul(m[53])))
                    .add(v3.mul(m[54]).add(w3.mul(m[55])))
                    .add(v4.mul(m[56]).add(w4.mul(m[57])))
                    .add(v5.mul(m[58]).add(w5.mul(m[59])))
                    .add(v6.mul(m[60]).add(w6.mul(m[61])))
                    .add(v7.mul(m[62]).add(w7.mul(m[63])))
                    .intoArray(p3, x + o3);
            DoubleVector.zero(D)
                    .add(v0.mul(m[64]).add(w0.mul(m[65])))
                    .add(v1.mul(m[66]).add(w1.mul(m[67])))
                    .add(v2.mul(m[68]).add(w2.mul(m[69])))
                    .add(v3.mul(m[70]).add(w3.mul(m[71])))
                    .add(v4.mul(m[72]).add(w4.mul(m[73])))
                    .add(v5.mul(m[74]).add(w5.mul(m[75])))
                    .add(v6.mul(m[76]).add(w6.mul(m[77])))
                    .add(v7.mul(m[78]).add(w7.mul(m[79])))
                    .intoArray(p4, x + o4);
            DoubleVector.zero(D)
                    .add(v0.mul(m[80]).add(w0.mul(m[81])))
                    .add(v1.mul(m[82]).add(w1.mul(m[83])))
                    .add(v2.mul(m[84]).add(w2.mul(m[85])))
                    .add(v3.mul(m[86]).add(w3.mul(m[87])))
                    .add(v4.mul(m[88]).add(w4.mul(m[89])))
                    .add(v5.mul(m[90]).add(w5.mul(m[91])))
                    .add(v6.mul(m[92]).add(w6.mul(m[93])))
                    .add(v7.mul(m[94]).add(w7.mul(m[95])))
                    .intoArray(p5, x + o5);
            DoubleVector.zero(D)
                    .add(v0.mul(m[96]).add(w0.mul(m[97])))
                    .add(v1.mul(m[98]).add(w1.mul(m[99])))
                    .add(v2.mul(m[100]).add(w2.mul(m[101])))
                    .add(v3.mul(m[102]).add(w3.mul(m[103])))
                    .add(v4.mul(m[104]).add(w4.mul(m[105])))
                    .add(v5.mul(m[106]).add(w5.mul(m[107])))
                    .add(v6.mul(m[108]).add(w6.mul(m[109])))
                    .add(v7.mul(m[110]).add(w7.mul(m[111])))
                    .intoArray(p6, x + o6);
            DoubleVector.zero(D)
                    .add(v0.mul(m[112]).add(w0.mul(m[113])))
                    .add(v1.mul(m[114]).add(w1.mul(m[115])))
                    .add(v2.mul(m[116]).add(w2.mul(m[117])))
                    .add(v3.mul(m[118]).add(w3.mul(m[119])))
                    .add(v4.mul(m[120]).add(w4.mul(m[121])))
                    .add(v5.mul(m[122]).add(w5.mul(m[123])))
                    .add(v6.mul(m[124]).add(w6.mul(m[125])))
                    .add(v7.mul(m[126]).add(w7.mul(m[127])))
                    .intoArray(p7, x + o7);
        }
    }

    /**
     * No qubit inside a vector: operands are each vector and its parts exchanged with the real
     * lane negated, entries are broadcast; one sum left to right (k at most 2).
     */
    private static void uniformInOrder(double[][] arr, int[] off, int from, int to,
            double[] op, double[] m, int d) {
        for (int e = from; e < to; e += 1 << AMP_LOG) {
            operands(arr, off, e, op, d);
            for (int i = 0; i < d; i++) {
                final int row = 2 * i * d;
                DoubleVector acc = DoubleVector.fromArray(D, op, 0).mul(m[row])
                        .add(DoubleVector.fromArray(D, op, L).mul(m[row + 1]));
                for (int j = 1; j < d; j++) {
                    acc = acc.add(DoubleVector.fromArray(D, op, 2 * j * L).mul(m[row + 2 * j]))
                            .add(DoubleVector.fromArray(D, op, (2 * j + 1) * L)
                                    .mul(m[row + 2 * j + 1]));
                }
                acc.intoArray(arr[i], (off[i] + e) << 1);
            }
        }
    }

    /** As {@link #uniformInOrder}, each column's complex product added to the sum (k >= 3). */
    private static void uniformGrouped(double[][] arr, int[] off, int from, int to,
            double[] op, double[] m, int d) {
        for (int e = from; e < to; e += 1 << AMP_LOG) {
            operands(arr, off, e, op, d);
            for (int i = 0; i < d; i++) {
                final int row = 2 * i * d;
                DoubleVector acc = DoubleVector.zero(D);
                for (int j = 0; j < d; j++) {
                    acc = acc.add(DoubleVector.fromArray(D, op, 2 * j * L).mul(m[row + 2 * j])
                            .add(DoubleVector.fromArray(D, op, (2 * j + 1) * L)
                                    .mul(m[row + 2 * j + 1])));
                }
                acc.intoArray(arr[i], (off[i] + e) << 1);
            }
        }
    }

    /** Each vector j into {@code op}, then its parts exchanged, real lane negated. */
    private static void operands(double[][] arr, int[] off, int e, double[] op, int d) {
        for (int j = 0; j < d; j++) {
            final DoubleVector v = DoubleVector.fromArray(D, arr[j], (off[j] + e) << 1);
            v.intoArray(op, 2 * j * L);
            v.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles().mul(SIGN)
                    .intoArray(op, (2 * j + 1) * L);
        }
    }

    /** Some qubit inside a vector: per-lane entries and lane permutations of each column. */
    private static void lanes(double[][] arr, int[] off, int from, int to, double[] op,
            DensePlan p) {
        final int d = p.d;
        final VectorMask<Double> keep = p.keep == null ? null : VectorShapes.mask(p.keep);
        for (int e = from; e < to; e += 1 << AMP_LOG) {
            for (int j = 0; j < d; j++) {
                final int h = p.from[j];
                final DoubleVector v = DoubleVector.fromArray(D, arr[h], (off[h] + e) << 1);
                v.reinterpretAsLongs().rearrange(p.pick[j]).reinterpretAsDoubles()
                        .intoArray(op, 2 * j * L);
                v.reinterpretAsLongs().rearrange(p.pickSwapped[j]).reinterpretAsDoubles()
                        .intoArray(op, (2 * j + 1) * L);
            }
            for (int ih = 0; ih < p.dh; ih++) {
                final DoubleVector acc = p.grouped ? laneSumGrouped(op, p.re, p.im, ih * d, d)
                        : laneSumInOrder(op, p.re, p.im, ih * d, d);
                final int x = (off[ih] + e) << 1;
                if (keep != null) {
                    DoubleVector.fromArray(D, arr[ih], x).blend(acc, keep).intoArray(arr[ih], x);
                } else {
                    acc.intoArray(arr[ih], x);
                }
            }
        }
    }

    private static DoubleVector laneSumInOrder(double[] op, double[] re, double[] im, int row,
            int d) {
        final int at = row * L;
        DoubleVector acc = DoubleVector.fromArray(D, op, 0).mul(DoubleVector.fromArray(D, re, at))
                .add(DoubleVector.fromArray(D, op, L).mul(DoubleVector.fromArray(D, im, at)));
        for (int j = 1; j < d; j++) {
            acc = acc.add(DoubleVector.fromArray(D, op, 2 * j * L)
                    .mul(DoubleVector.fromArray(D, re, at + j * L)))
                    .add(DoubleVector.fromArray(D, op, (2 * j + 1) * L)
                            .mul(DoubleVector.fromArray(D, im, at + j * L)));
        }
        return acc;
    }

    private static DoubleVector laneSumGrouped(double[] op, double[] re, double[] im, int row,
            int d) {
        final int at = row * L;
        DoubleVector acc = DoubleVector.zero(D);
        for (int j = 0; j < d; j++) {
            acc = acc.add(DoubleVector.fromArray(D, op, 2 * j * L)
                    .mul(DoubleVector.fromArray(D, re, at + j * L))
                    .add(DoubleVector.fromArray(D, op, (2 * j + 1) * L)
                            .mul(DoubleVector.fromArray(D, im, at + j * L))));
        }
        return acc;
    }

    // ---------------------------------------------------------------- diagonal

    /** See {@link LaneKernels#diagonal}. */
    static Plan diagonal(Amplitudes a, int[] targets, int[] controls, double[] diag) {
        if (a.chunkLog < AMP_LOG) {
            return null;
        }
        return new DiagonalPlan(a, targets, controls, diag);
    }

    private static final class DiagonalPlan extends Split {
        final int dh;
        /** Per high combination: the entries by lane, at {@code ih * L} (see DensePlan.re). */
        final double[] re;
        final double[] im;
        /** Per high combination: lanes that change, or null when all do. */
        final boolean[][] change;
        final boolean[] skip;

        DiagonalPlan(Amplitudes a, int[] targets, int[] controls, double[] diag) {
            super(a, high(targets), controls);
            dh = l == null ? 1 : l.d;
            re = new double[dh * L];
            im = new double[dh * L];
            change = new boolean[dh][];
            skip = new boolean[dh];
            for (int ih = 0; ih < dh; ih++) {
                boolean[] ch = new boolean[L];
                boolean any = false;
                boolean all = true;
                for (int i = 0; i < L; i++) {
                    int j = index(targets, ih, i >> 1);
                    double dr = diag[2 * j];
                    double di = diag[2 * j + 1];
                    re[ih * L + i] = dr;
                    im[ih * L + i] = (i & 1) == 0 ? -di : di;
                    // The scalar loop leaves entries of exactly 1 and unmet controls alone.
                    ch[i] = !(dr == 1 && di == 0) && (controlLanes == null || controlLanes[i]);
                    any |= ch[i];
                    all &= ch[i];
                }
                change[ih] = all ? null : ch;
                skip[ih] = !any;
            }
        }

        @Override
        void unit(double[][] arr, int[] off, int[] starts, int run, Object scratch) {
            for (int ih = 0; ih < dh; ih++) {
                if (skip[ih]) {
                    continue;
                }
                if (change[ih] == null) {
                    scaleRuns(arr[ih], off[ih], starts, run, re, im, ih * L);
                } else {
                    scaleRuns(arr[ih], off[ih], starts, run, re, im, ih * L, change[ih]);
                }
            }
        }
    }

    /** The runs of a unit times per-lane factors. */
    private static void scaleRuns(double[] a, int off, int[] starts, int run, double[] reLanes,
            double[] imLanes, int at) {
        final DoubleVector re = DoubleVector.fromArray(D, reLanes, at);
        final DoubleVector im = DoubleVector.fromArray(D, imLanes, at);
        if (zero(imLanes, at)) {
            // Real factors (CZ's -1, Z): no lane swap. Equal to the complex formula but for the
            // sign of a zero result (x + 0 * y = x for finite y).
            for (int s : starts) {
                final int end = (off + s + run) << 1;
                for (int x = (off + s) << 1; x < end; x += L) {
                    DoubleVector.fromArray(D, a, x).mul(re).intoArray(a, x);
                }
            }
            return;
        }
        for (int s : starts) {
            final int end = (off + s + run) << 1;
            for (int x = (off + s) << 1; x < end; x += L) {
                final DoubleVector w = DoubleVector.fromArray(D, a, x);
                w.mul(re).add(w.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles().mul(im))
                        .intoArray(a, x);
            }
        }
    }

    /** Whether the L lanes from {@code at} are all zero. */
    private static boolean zero(double[] lanes, int at) {
        for (int i = at; i < at + L; i++) {
            if (lanes[i] != 0) {
                return false;
            }
        }
        return true;
    }

    /** As above, only in the lanes of {@code change}. */
    private static void scaleRuns(double[] a, int off, int[] starts, int run, double[] reLanes,
            double[] imLanes, int at, boolean[] change) {
        final DoubleVector re = DoubleVector.fromArray(D, reLanes, at);
        final DoubleVector im = DoubleVector.fromArray(D, imLanes, at);
        final VectorMask<Double> ch = VectorMask.fromArray(D, change, 0);
        for (int s : starts) {
            final int end = (off + s + run) << 1;
            for (int x = (off + s) << 1; x < end; x += L) {
                final DoubleVector w = DoubleVector.fromArray(D, a, x);
                w.blend(w.mul(re).add(w.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                        .mul(im)), ch).intoArray(a, x);
            }
        }
    }

    // ---------------------------------------------------------------- controlled X

    /** See {@link LaneKernels#controlledFlip}. */
    static Plan controlledFlip(Amplitudes a, int target, int[] controls) {
        if (a.chunkLog < AMP_LOG) {
            return null;
        }
        return new FlipPlan(a, target, controls);
    }

    private static final class FlipPlan extends Split {
        final int target;
        final boolean[] keep;

        FlipPlan(Amplitudes a, int target, int[] controls) {
            super(a, target >= AMP_LOG ? new int[] {target} : new int[0], controls);
            this.target = target;
            this.keep = controlLanes;
        }

        @Override
        void unit(double[][] arr, int[] off, int[] starts, int run, Object scratch) {
            if (target < AMP_LOG) {
                permuteRuns(arr[0], off[0], starts, run, target, keep);
            } else if (keep == null) {
                swapRuns(arr[0], off[0], arr[1], off[1], starts, run);
            } else {
                swapRuns(arr[0], off[0], arr[1], off[1], starts, run, keep);
            }
        }
    }

    private static void permuteRuns(double[] a, int off, int[] starts, int run, int target,
            boolean[] keep) {
        final VectorShuffle<Long> p = VectorShapes.xor(2 << target);
        final VectorMask<Double> k = VectorMask.fromArray(D, keep == null ? ALL : keep, 0);
        for (int s : starts) {
            final int end = (off + s + run) << 1;
            for (int x = (off + s) << 1; x < end; x += L) {
                final DoubleVector w = DoubleVector.fromArray(D, a, x);
                w.blend(w.reinterpretAsLongs().rearrange(p).reinterpretAsDoubles(), k)
                        .intoArray(a, x);
            }
        }
    }

    private static final boolean[] ALL = all();

    private static boolean[] all() {
        boolean[] b = new boolean[L];
        java.util.Arrays.fill(b, true);
        return b;
    }

    private static void swapRuns(double[] u, int uo, double[] v, int vo, int[] starts, int run) {
        final int shift = (vo - uo) << 1;
        for (int s : starts) {
            final int end = (uo + s + run) << 1;
            for (int x = (uo + s) << 1; x < end; x += L) {
                final DoubleVector a = DoubleVector.fromArray(D, u, x);
                DoubleVector.fromArray(D, v, x + shift).intoArray(u, x);
                a.intoArray(v, x + shift);
            }
        }
    }

    private static void swapRuns(double[] u, int uo, double[] v, int vo, int[] starts, int run,
            boolean[] keep) {
        final int shift = (vo - uo) << 1;
        final VectorMask<Double> k = VectorMask.fromArray(D, keep, 0);
        for (int s : starts) {
            final int end = (uo + s + run) << 1;
            for (int x = (uo + s) << 1; x < end; x += L) {
                final DoubleVector a = DoubleVector.fromArray(D, u, x);
                final DoubleVector b = DoubleVector.fromArray(D, v, x + shift);
                a.blend(b, k).intoArray(u, x);
                b.blend(a, k).intoArray(v, x + shift);
            }
        }
    }
}
