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
            final int[] x = new int[dh];
            final Object scratch = scratch();
            final int step = 1 << AMP_LOG;
            for (long o = from; o < to; o++) {
                final int[] starts;
                final int run;
                if (l == null) {
                    final long first = o << flatLog;
                    arr[0] = a.chunks[(int) (first >>> a.chunkLog)];
                    off[0] = (int) (first & a.chunkMask);
                    starts = ZERO;
                    run = 1 << flatLog;
                } else {
                    l.locate(a, o, arr, off);
                    starts = l.starts;
                    run = l.run;
                }
                for (int s : starts) {
                    for (int e = s; e < s + run; e += step) {
                        for (int j = 0; j < dh; j++) {
                            x[j] = (off[j] + e) << 1;
                        }
                        group(arr, x, scratch);
                    }
                }
            }
        }

        /** Per-thread working space for {@link #group}, or null. */
        Object scratch() {
            return null;
        }

        /** Works one group: vector j of the high combinations at {@code arr[j][x[j]]}. */
        abstract void group(double[][] arr, int[] x, Object scratch);
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
        return new DensePlan(a, targets, controls, m);
    }

    private static final class DensePlan extends Split {
        final int d;
        final int dh;
        final boolean grouped;
        final boolean uniform;
        final double[] m;
        /** Per output vector and column: the real and signed imaginary entries by lane. */
        final DoubleVector[] re;
        final DoubleVector[] im;
        /** Per column: the vector it reads and the lane permutations. */
        final int[] from;
        final VectorShuffle<Double>[] pick;
        final VectorShuffle<Double>[] pickSwapped;
        final VectorMask<Double> keep;

        @SuppressWarnings("unchecked")
        DensePlan(Amplitudes a, int[] targets, int[] controls, double[] m) {
            super(a, high(targets), controls);
            this.m = m;
            this.d = 1 << targets.length;
            this.dh = l == null ? 1 : l.d;
            this.grouped = targets.length >= 3;
            this.uniform = lowBits(targets) == 0 && controlLanes == null;
            this.keep = controlLanes == null ? null : VectorShapes.mask(controlLanes);
            this.from = new int[d];
            for (int j = 0; j < d; j++) {
                from[j] = highPart(targets, j);
            }
            if (uniform) {
                re = null;
                im = null;
                pick = null;
                pickSwapped = null;
                return;
            }
            re = new DoubleVector[dh * d];
            im = new DoubleVector[dh * d];
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
                    double[] r = new double[L];
                    double[] s = new double[L];
                    for (int i = 0; i < L; i++) {
                        int row = index(targets, ih, i >> 1);
                        r[i] = m[2 * (row * d + j)];
                        double mi = m[2 * (row * d + j) + 1];
                        s[i] = (i & 1) == 0 ? -mi : mi;
                    }
                    re[ih * d + j] = VectorShapes.of(r);
                    im[ih * d + j] = VectorShapes.of(s);
                }
            }
        }

        @Override
        Object scratch() {
            return new double[2 * d * L];
        }

        @Override
        void group(double[][] arr, int[] x, Object scratch) {
            final double[] op = (double[]) scratch;
            if (uniform) {
                // Operands: each vector, and its parts exchanged with the real lane negated.
                for (int j = 0; j < d; j++) {
                    final DoubleVector v = DoubleVector.fromArray(D, arr[j], x[j]);
                    v.intoArray(op, 2 * j * L);
                    v.rearrange(SWAP).mul(SIGN).intoArray(op, (2 * j + 1) * L);
                }
                for (int i = 0; i < d; i++) {
                    final int row = 2 * i * d;
                    DoubleVector acc;
                    if (grouped) {
                        acc = DoubleVector.zero(D);
                        for (int j = 0; j < d; j++) {
                            acc = acc.add(DoubleVector.fromArray(D, op, 2 * j * L)
                                    .mul(m[row + 2 * j])
                                    .add(DoubleVector.fromArray(D, op, (2 * j + 1) * L)
                                            .mul(m[row + 2 * j + 1])));
                        }
                    } else {
                        acc = DoubleVector.fromArray(D, op, 0).mul(m[row])
                                .add(DoubleVector.fromArray(D, op, L).mul(m[row + 1]));
                        for (int j = 1; j < d; j++) {
                            acc = acc.add(DoubleVector.fromArray(D, op, 2 * j * L)
                                    .mul(m[row + 2 * j]))
                                    .add(DoubleVector.fromArray(D, op, (2 * j + 1) * L)
                                            .mul(m[row + 2 * j + 1]));
                        }
                    }
                    acc.intoArray(arr[i], x[i]);
                }
                return;
            }
            for (int j = 0; j < d; j++) {
                final int h = from[j];
                final DoubleVector v = DoubleVector.fromArray(D, arr[h], x[h]);
                v.rearrange(pick[j]).intoArray(op, 2 * j * L);
                v.rearrange(pickSwapped[j]).intoArray(op, (2 * j + 1) * L);
            }
            for (int ih = 0; ih < dh; ih++) {
                final int row = ih * d;
                DoubleVector acc;
                if (grouped) {
                    acc = DoubleVector.zero(D);
                    for (int j = 0; j < d; j++) {
                        acc = acc.add(DoubleVector.fromArray(D, op, 2 * j * L).mul(re[row + j])
                                .add(DoubleVector.fromArray(D, op, (2 * j + 1) * L)
                                        .mul(im[row + j])));
                    }
                } else {
                    acc = DoubleVector.fromArray(D, op, 0).mul(re[row])
                            .add(DoubleVector.fromArray(D, op, L).mul(im[row]));
                    for (int j = 1; j < d; j++) {
                        acc = acc.add(DoubleVector.fromArray(D, op, 2 * j * L).mul(re[row + j]))
                                .add(DoubleVector.fromArray(D, op, (2 * j + 1) * L)
                                        .mul(im[row + j]));
                    }
                }
                if (keep != null) {
                    acc = DoubleVector.fromArray(D, arr[ih], x[ih]).blend(acc, keep);
                }
                acc.intoArray(arr[ih], x[ih]);
            }
        }
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
        final DoubleVector[] re;
        final DoubleVector[] im;
        /** Per high combination: lanes that change, or null when all do. */
        final VectorMask<Double>[] change;
        final boolean[] skip;

        @SuppressWarnings("unchecked")
        DiagonalPlan(Amplitudes a, int[] targets, int[] controls, double[] diag) {
            super(a, high(targets), controls);
            dh = l == null ? 1 : l.d;
            re = new DoubleVector[dh];
            im = new DoubleVector[dh];
            change = new VectorMask[dh];
            skip = new boolean[dh];
            for (int ih = 0; ih < dh; ih++) {
                double[] r = new double[L];
                double[] s = new double[L];
                boolean[] ch = new boolean[L];
                boolean any = false;
                boolean all = true;
                for (int i = 0; i < L; i++) {
                    int j = index(targets, ih, i >> 1);
                    double dr = diag[2 * j];
                    double di = diag[2 * j + 1];
                    r[i] = dr;
                    s[i] = (i & 1) == 0 ? -di : di;
                    // The scalar loop leaves entries of exactly 1 and unmet controls alone.
                    ch[i] = !(dr == 1 && di == 0) && (controlLanes == null || controlLanes[i]);
                    any |= ch[i];
                    all &= ch[i];
                }
                re[ih] = VectorShapes.of(r);
                im[ih] = VectorShapes.of(s);
                change[ih] = all ? null : VectorShapes.mask(ch);
                skip[ih] = !any;
            }
        }

        @Override
        void group(double[][] arr, int[] x, Object scratch) {
            for (int ih = 0; ih < dh; ih++) {
                if (skip[ih]) {
                    continue;
                }
                final DoubleVector w = DoubleVector.fromArray(D, arr[ih], x[ih]);
                final DoubleVector z = w.mul(re[ih]).add(w.rearrange(SWAP).mul(im[ih]));
                (change[ih] == null ? z : w.blend(z, change[ih])).intoArray(arr[ih], x[ih]);
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
        final boolean inside;
        final VectorShuffle<Double> partner;
        final VectorMask<Double> keep;

        FlipPlan(Amplitudes a, int target, int[] controls) {
            super(a, target >= AMP_LOG ? new int[] {target} : new int[0], controls);
            inside = target < AMP_LOG;
            partner = inside ? VectorShapes.xor(2 << target) : null;
            keep = controlLanes == null ? null : VectorShapes.mask(controlLanes);
        }

        @Override
        void group(double[][] arr, int[] x, Object scratch) {
            if (inside) {
                final DoubleVector w = DoubleVector.fromArray(D, arr[0], x[0]);
                final DoubleVector z = w.rearrange(partner);
                (keep == null ? z : w.blend(z, keep)).intoArray(arr[0], x[0]);
                return;
            }
            final DoubleVector u = DoubleVector.fromArray(D, arr[0], x[0]);
            final DoubleVector v = DoubleVector.fromArray(D, arr[1], x[1]);
            if (keep == null) {
                v.intoArray(arr[0], x[0]);
                u.intoArray(arr[1], x[1]);
            } else {
                u.blend(v, keep).intoArray(arr[0], x[0]);
                v.blend(u, keep).intoArray(arr[1], x[1]);
            }
        }
    }
}
