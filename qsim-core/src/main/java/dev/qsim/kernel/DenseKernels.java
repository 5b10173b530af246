package dev.qsim.kernel;

/**
 * In-place kernels for dense gates on double storage: a {@code 2^k x 2^k} matrix on k target
 * qubits, where every control qubit is 1. Matrices are row-major with re/im interleaved; bit
 * {@code j} of a matrix index is qubit {@code targets[j]}. One target without controls goes to
 * {@link DenseSingleQubitKernels}; other gates go block by block of a {@link Layout}, with
 * unrolled loops for 2x2 and 4x4 matrices, or to the vector plan of {@link LaneKernels#dense}
 * when the storage has vector loops (the same bits). Unchecked: targets and controls are
 * distinct and below the qubit count. Internal.
 *
 * <p>Method: M. Smelyanskiy, N. P. D. Sawaya, A. Aspuru-Guzik, "qHiPSTER: the quantum high
 * performance software testing environment", arXiv:1601.07195 (2016), §3 (pairwise amplitude
 * updates with strided indexing).
 */
final class DenseKernels {
    private DenseKernels() {
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
    static Plan plan(Amplitudes a, int[] targets, int[] controls, double[] m) {
        if (targets.length == 1 && controls.length == 0) {
            return DenseSingleQubitKernels.plan(a, targets[0], m);
        }
        if (a.lanes != null) {
            Plan p = a.lanes.dense(a, targets, controls, m);
            if (p != null) {
                return p;
            }
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
    static void apply(Amplitudes a, int[] targets, int[] controls, double[] m, int threads) {
        plan(a, targets, controls, m).apply(threads);
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
