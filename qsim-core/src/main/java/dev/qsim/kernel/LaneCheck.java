package dev.qsim.kernel;

import java.util.List;
import java.util.SplittableRandom;

/**
 * The check {@link Lanes} runs on vector loops before it uses them: every loop of
 * {@link LaneKernels}, on small seeded states that reach each of its paths (targets inside a
 * vector and across vectors and chunks, every matrix kind, low and high controls, both
 * precisions), against the scalar loops on the same input. Gate loops must agree within 1e-13
 * relative (the double gate loops use fused multiply-adds, a few units in the last place from
 * the scalar loops' separate roundings); sums within 1e-12 relative. Running every path also
 * links every call into the incubating API, so a JDK whose API differs fails here, at load
 * time, and not in the middle of a gate. Single-precision gate loops may compute in float:
 * they must agree within 1e-5 relative (a few float roundings on the check's amplitudes, which
 * grow to about 10). Takes a few tens of milliseconds, most of it in the interpreter. Internal.
 */
final class LaneCheck {
    private static final int N = 6;
    private static final int[] NONE = new int[0];
    private static final double SUM_TOLERANCE = 1e-12;
    private static final double GATE_TOLERANCE = 1e-13;
    private static final double FLOAT_TOLERANCE = 1e-5;

    private LaneCheck() {
    }

    /**
     * Runs the check.
     *
     * @param k the candidate loops
     * @throws IllegalStateException naming the first loop that differs from the scalar one
     */
    static void verify(LaneKernels k) {
        SplittableRandom r = new SplittableRandom(20_251_205L);
        for (int chunkLog : new int[] {N, Math.max(3, k.amplitudeLog() + 1)}) {
            singleQubit(k, r, chunkLog);
            severalQubits(k, r, chunkLog);
            singlePrecision(k, r, chunkLog);
            sums(k, r, chunkLog);
        }
    }

    private static void singleQubit(LaneKernels k, SplittableRandom r, int chunkLog) {
        double[] in = random(r);
        for (int q = 0; q < N; q++) {
            for (double[] m : matrices(r)) {
                gate(k, in, chunkLog, new GateOp(GateOp.DENSE, new int[] {q}, NONE, m, null),
                        "dense q" + q);
            }
            double[] d = {r.nextDouble(-1, 1), r.nextDouble(-1, 1), r.nextDouble(-1, 1),
                r.nextDouble(-1, 1)};
            gate(k, in, chunkLog, new GateOp(GateOp.DIAGONAL, new int[] {q}, NONE, d, null),
                    "diagonal q" + q);
            double[] one = {1, 0, d[2], d[3]};
            gate(k, in, chunkLog, new GateOp(GateOp.DIAGONAL, new int[] {q}, NONE, one, null),
                    "diagonal(1, d) q" + q);
            gate(k, in, chunkLog, Frame.xOp(q), "X q" + q);
        }
    }

    private static void severalQubits(LaneKernels k, SplittableRandom r, int chunkLog) {
        double[] in = random(r);
        // Targets and controls inside a vector (0, 1), across (the others), and mixed.
        int[][][] cases = {
            {{0, 1}, {}}, {{1, 4}, {}}, {{4, 5}, {}}, {{5, 0, 3}, {}}, {{2, 3, 4}, {1}},
            {{0, 2, 1, 5}, {}}, {{3, 5, 4, 2}, {}}, {{0}, {1}}, {{4}, {0}}, {{1}, {5}},
            {{0}, {3, 5}}, {{5}, {2}}, {{1, 3}, {0}}, {{2}, {}},
        };
        for (int[][] c : cases) {
            int[] t = c[0];
            int[] ctl = c[1];
            int dim = 1 << t.length;
            double[] m = new double[2 * dim * dim];
            for (int i = 0; i < m.length; i++) {
                m[i] = r.nextDouble(-1, 1);
            }
            String where = java.util.Arrays.toString(t) + " controls "
                    + java.util.Arrays.toString(ctl);
            gate(k, in, chunkLog, new GateOp(GateOp.DENSE, t, ctl, m, null), "dense " + where);
            double[] d = new double[2 * dim];
            for (int i = 0; i < d.length; i++) {
                d[i] = i < 2 ? (i == 0 ? 1 : 0) : r.nextDouble(-1, 1);
            }
            gate(k, in, chunkLog, new GateOp(GateOp.DIAGONAL, t, ctl, d, null),
                    "diagonal " + where);
            if (t.length == 1 && ctl.length > 0) {
                gate(k, in, chunkLog, new GateOp(GateOp.MONOMIAL, t, ctl,
                        new double[] {1, 0, 1, 0}, new int[] {1, 0}), "controlled X " + where);
            }
        }
        double[] onesOnly = new double[8];
        java.util.Arrays.fill(onesOnly, 0);
        onesOnly[0] = 1;
        onesOnly[4] = 1;
        gate(k, in, chunkLog, new GateOp(GateOp.DIAGONAL, new int[] {3, 4}, NONE,
                onesOnly, null), "diagonal of ones");
        // Merged runs of diagonal gates: real factors (signs) and complex ones.
        double[] cz = {1, 0, 1, 0, 1, 0, -1, 0};
        double[] cp = {1, 0, 1, 0, 1, 0, Math.cos(0.7), Math.sin(0.7)};
        for (double[] f : new double[][] {cz, cp}) {
            GateOp[] run = {new GateOp(GateOp.DIAGONAL, new int[] {0, 1}, NONE, f, null),
                new GateOp(GateOp.DIAGONAL, new int[] {1, 2}, NONE, f, null),
                new GateOp(GateOp.DIAGONAL, new int[] {2, 0}, NONE, f, null)};
            gate(k, in, chunkLog, GateOp.table(new int[] {0, 1, 2}, run),
                    f == cz ? "merged signs" : "merged phases");
        }
        // Two gates with half the arithmetic in one sweep, against the two scalar passes.
        double[][] half = {matrices(r)[1], matrices(r)[2]};
        for (int[] qs : new int[][] {{k.amplitudeLog(), N - 1}, {N - 1, k.amplitudeLog()},
                {N - 2, N - 1}}) {
            for (double[] m1 : half) {
                for (double[] m2 : half) {
                    GateOp g1 = new GateOp(GateOp.DENSE, new int[] {qs[0]}, NONE, m1, null);
                    GateOp g2 = new GateOp(GateOp.DENSE, new int[] {qs[1]}, NONE, m2, null);
                    if (!GatePairs.pairable(k, chunkLog, g1, qs[0], g2, qs[1])) {
                        continue;
                    }
                    Amplitudes[] two = pair(k, in, chunkLog, false);
                    g1.plan(two[0]).apply(1);
                    g2.plan(two[0]).apply(1);
                    GatePairs.plan(two[1], qs[0], m1, qs[1], m2).apply(1);
                    compare(two, "paired gates on " + qs[0] + " and " + qs[1] + " (chunks of 2^"
                            + chunkLog + ")");
                }
            }
        }
        // The frame's settling pass: phases on low and high qubits, then a read.
        Amplitudes[] both = pair(k, in, chunkLog, false);
        for (Amplitudes a : both) {
            Frame.apply(a, List.of(phase(0, 0.3), phase(4, 1.1), phase(N - 1, -0.7)), 1);
        }
        compare(both, "settling phases");
        both = pair(k, in, chunkLog, false);
        for (Amplitudes a : both) {
            Frame.apply(a, List.of(phase(N - 1, 0.4)), 1);
        }
        compare(both, "settling a high phase");
    }

    private static void singlePrecision(LaneKernels k, SplittableRandom r, int chunkLog) {
        double[] in = random(r);
        for (int q = 0; q < N; q++) {
            for (double[] m : matrices(r)) {
                Amplitudes[] both = pair(k, in, chunkLog, true);
                for (Amplitudes a : both) {
                    FloatSingleQubitKernels.dense1(a, q, m, 0, 1);
                    FloatSingleQubitKernels.dense1(a, q, m, 1L << ((q + 1) % N), 1);
                    FloatSingleQubitKernels.dense1(a, q, FloatSingleQubitKernels.SWAP, 0, 1);
                }
                close(both, "single precision q" + q);
            }
        }
        // A group of gates: widened into a window and rounded back; then phases settled.
        Amplitudes[] both = pair(k, in, chunkLog, true);
        double[] m = matrices(r)[0];
        for (Amplitudes a : both) {
            Windows.apply(a, List.of(new GateOp(GateOp.DENSE, new int[] {0}, NONE, m, null),
                    new GateOp(GateOp.DENSE, new int[] {3}, NONE, m, null)), 1);
            Frame.apply(a, List.of(phase(1, 0.3), phase(N - 1, 0.9)), 1);
        }
        compare(both, "single-precision window and phases");
    }

    private static void sums(LaneKernels k, SplittableRandom r, int chunkLog) {
        double[] in = random(r);
        double[] other = random(r);
        Amplitudes[] a = pair(k, in, chunkLog, false);
        Amplitudes[] b = pair(k, other, chunkLog, false);
        close(Reductions.norm2(a[0], 1), Reductions.norm2(a[1], 1), "norm");
        for (int q = -1; q < N; q++) {
            close(Reductions.probabilityWhere(a[0], q, 1),
                    Reductions.probabilityWhere(a[1], q, 1), "probability of qubit " + q);
        }
        double[] z0 = Reductions.inner(a[0], b[0], 1);
        double[] z1 = Reductions.inner(a[1], b[1], 1);
        close(z0[0], z1[0], "inner product");
        close(z0[1], z1[1], "inner product");
        double[] p0 = new double[1 << N];
        double[] p1 = new double[1 << N];
        Reductions.probabilities(a[0], p0, 1);
        Reductions.probabilities(a[1], p1, 1);
        same(p0, p1, "probabilities");
        Amplitudes[] s = pair(k, in, chunkLog, true);
        close(Reductions.norm2(s[0], 1), Reductions.norm2(s[1], 1), "single-precision norm");
        for (long[] xz : new long[][] {{0, 0}, {0b000011, 0b100101}, {0b110101, 0b011010}}) {
            double[] i0 = PauliKernels.inner(b[0], a[0], xz[0], xz[1], 1);
            double[] i1 = PauliKernels.inner(b[1], a[1], xz[0], xz[1], 1);
            close(i0[0], i1[0], "Pauli inner product");
            close(i0[1], i1[1], "Pauli inner product");
            Amplitudes[] acc = pair(k, other, chunkLog, false);
            PauliKernels.accumulate(acc[0], a[0], xz[0], xz[1], 0.3, -0.8, 1);
            PauliKernels.accumulate(acc[1], a[1], xz[0], xz[1], 0.3, -0.8, 1);
            compare(acc, "Pauli accumulation");
        }
    }

    private static GateOp phase(int q, double angle) {
        return new GateOp(GateOp.DIAGONAL, new int[] {q}, NONE,
                new double[] {1, 0, Math.cos(angle), Math.sin(angle)}, null);
    }

    /** A complex, a real and an RX-shaped matrix. */
    private static double[][] matrices(SplittableRandom r) {
        double[] complex = new double[8];
        double[] real = new double[8];
        double[] cross = new double[8];
        for (int i = 0; i < 8; i++) {
            complex[i] = r.nextDouble(-1, 1);
            real[i] = i % 2 == 0 ? r.nextDouble(-1, 1) : 0;
            cross[i] = i == 0 || i == 3 || i == 5 || i == 6 ? r.nextDouble(-1, 1) : 0;
        }
        return new double[][] {complex, real, cross};
    }

    private static double[] random(SplittableRandom r) {
        double[] v = new double[2 << N];
        for (int i = 0; i < v.length; i++) {
            v[i] = r.nextDouble(-1, 1);
        }
        return v;
    }

    /** The same state twice: scalar loops first, then the candidate's. */
    private static Amplitudes[] pair(LaneKernels k, double[] in, int chunkLog, boolean single) {
        Amplitudes[] both = new Amplitudes[2];
        for (int x = 0; x < 2; x++) {
            Amplitudes a = single ? Amplitudes.allocateSingle(N, chunkLog)
                    : Amplitudes.allocate(N, chunkLog);
            a.useLanes(null);
            for (int i = 0; i < (1 << N); i++) {
                a.set(i, in[2 * i], in[2 * i + 1]);
            }
            both[x] = a.useLanes(x == 0 ? null : k);
        }
        return both;
    }

    private static void gate(LaneKernels k, double[] in, int chunkLog, GateOp op, String what) {
        Amplitudes[] both = pair(k, in, chunkLog, false);
        for (Amplitudes a : both) {
            op.plan(a).apply(1);
        }
        compare(both, what + " (chunks of 2^" + chunkLog + ")");
    }

    private static void compare(Amplitudes[] both, String what) {
        for (long i = 0; i < (1L << N); i++) {
            if (!near(both[0].re(i), both[1].re(i)) || !near(both[0].im(i), both[1].im(i))) {
                throw new IllegalStateException("the vector loop for " + what
                        + " differs from the scalar loop at amplitude " + i + ": ("
                        + both[1].re(i) + ", " + both[1].im(i) + ") instead of ("
                        + both[0].re(i) + ", " + both[0].im(i) + ")");
            }
        }
    }

    /** Agreement within {@link #GATE_TOLERANCE} relative (NaN never agrees). */
    private static boolean near(double x, double y) {
        return Math.abs(x - y) <= GATE_TOLERANCE * Math.max(1, Math.abs(x));
    }

    /** Agreement within {@link #FLOAT_TOLERANCE} relative, for float arithmetic. */
    private static void close(Amplitudes[] both, String what) {
        for (long i = 0; i < (1L << N); i++) {
            double[] x = {both[0].re(i), both[0].im(i)};
            double[] y = {both[1].re(i), both[1].im(i)};
            for (int p = 0; p < 2; p++) {
                if (!(Math.abs(x[p] - y[p]) <= FLOAT_TOLERANCE * Math.max(1, Math.abs(x[p])))) {
                    throw new IllegalStateException("the vector loop for " + what
                            + " is off at amplitude " + i + ": " + y[p] + " instead of " + x[p]);
                }
            }
        }
    }

    private static void same(double[] expected, double[] actual, String what) {
        for (int i = 0; i < expected.length; i++) {
            if (expected[i] != actual[i]) {
                throw new IllegalStateException("the vector loop for " + what + " differs at "
                        + i + ": " + actual[i] + " instead of " + expected[i]);
            }
        }
    }

    private static void close(double expected, double actual, String what) {
        if (!(Math.abs(expected - actual) <= SUM_TOLERANCE * Math.max(1, Math.abs(expected)))) {
            throw new IllegalStateException("the vector loop for " + what + " gives " + actual
                    + " instead of " + expected);
        }
    }
}
