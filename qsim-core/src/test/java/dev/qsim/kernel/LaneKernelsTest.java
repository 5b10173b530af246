package dev.qsim.kernel;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The vector loops against the scalar loops, in one JVM: the same seeded random circuits (dense
 * gates on 1 to 4 qubits of every matrix kind, diagonal, monomial and X gates, with and without
 * controls; targets that always include qubits 0, 1, 2 and the highest) on two storages, one
 * using the vector loops and one the scalar ones, through the engine's gate path (lazy frame,
 * cache blocking, windows). Double precision must agree to 1e-13 per amplitude part and single
 * precision to 1e-6 (the bounds; a few roundings of O(1) numbers, IEEE 754-2019 §4.3);
 * the double vector gate loops use fused multiply-adds, so they differ from the scalar loops in the
 * last places (IEEE 754-2019 §5.4.1). The scalar loops are in turn checked
 * against the definition of a controlled k-qubit gate (Nielsen and Chuang 2010, §4.3) in
 * {@link KernelsTest}; here small states are also compared with that definition directly.
 * Results must not depend on the thread count (the project's rule: fixed work units). Runs only
 * where the JVM has the vector loops (the build's second test run); {@link LanesTest} makes sure
 * that run has them.
 */
class LaneKernelsTest {
    private static final double DOUBLE_TOL = 1e-13;
    private static final double SINGLE_TOL = 1e-6;
    private static final int[] NONE = new int[0];

    private static void requireVectorLoops() {
        assumeTrue(Lanes.kernels() != null, "the vector loops are not loaded in this run");
    }

    /** A random unitary 2^k x 2^k (Gram-Schmidt on random complex columns), re/im interleaved. */
    static double[] unitary(int k, SplittableRandom r) {
        int d = 1 << k;
        double[][] re = new double[d][d];
        double[][] im = new double[d][d];
        for (int c = 0; c < d; c++) {
            for (int i = 0; i < d; i++) {
                re[c][i] = r.nextDouble(-1, 1);
                im[c][i] = r.nextDouble(-1, 1);
            }
            for (int p = 0; p < c; p++) {
                double dr = 0;
                double di = 0;
                for (int i = 0; i < d; i++) {
                    dr += re[p][i] * re[c][i] + im[p][i] * im[c][i];
                    di += re[p][i] * im[c][i] - im[p][i] * re[c][i];
                }
                for (int i = 0; i < d; i++) {
                    re[c][i] -= dr * re[p][i] - di * im[p][i];
                    im[c][i] -= dr * im[p][i] + di * re[p][i];
                }
            }
            double norm = 0;
            for (int i = 0; i < d; i++) {
                norm += re[c][i] * re[c][i] + im[c][i] * im[c][i];
            }
            norm = Math.sqrt(norm);
            for (int i = 0; i < d; i++) {
                re[c][i] /= norm;
                im[c][i] /= norm;
            }
        }
        double[] m = new double[2 * d * d];
        for (int row = 0; row < d; row++) {
            for (int c = 0; c < d; c++) {
                m[2 * (row * d + c)] = re[c][row];
                m[2 * (row * d + c) + 1] = im[c][row];
            }
        }
        return m;
    }

    /** One gate of a random circuit and its full matrix on its targets. */
    private static GateOp randomGate(int n, SplittableRandom r, int forced) {
        int kind = r.nextInt(10);
        int k = kind < 5 ? 1 : 1 + r.nextInt(Math.min(4, n - 1));
        int nc = r.nextInt(Math.min(2, n - k) + 1);
        int[] qs = KernelsTest.pickDistinct(n, k + nc, r);
        if (forced >= 0 && !contains(qs, forced)) {
            qs[r.nextInt(qs.length)] = forced;
        }
        int[] targets = java.util.Arrays.copyOf(qs, k);
        int[] controls = java.util.Arrays.copyOfRange(qs, k, k + nc);
        int d = 1 << k;
        switch (kind) {
            case 0: { // real: RY
                double t = r.nextDouble(-3, 3);
                double c = Math.cos(t / 2);
                double s = Math.sin(t / 2);
                return GateOp.of(new double[] {c, 0, -s, 0, s, 0, c, 0}, targets, controls);
            }
            case 1: { // RX-shaped
                double t = r.nextDouble(-3, 3);
                double c = Math.cos(t / 2);
                double s = Math.sin(t / 2);
                return GateOp.of(new double[] {c, 0, 0, -s, 0, -s, c, 0}, targets, controls);
            }
            case 2: { // X with or without controls
                return GateOp.of(new double[] {0, 0, 1, 0, 1, 0, 0, 0}, targets, controls);
            }
            case 3:
            case 4:
            case 5: { // dense
                return GateOp.of(unitary(k, r), targets, controls);
            }
            case 6:
            case 7: { // diagonal, some entries exactly 1
                double[] m = new double[2 * d * d];
                for (int j = 0; j < d; j++) {
                    double a = r.nextInt(3) == 0 ? 0 : r.nextDouble(-3, 3);
                    m[2 * (j * d + j)] = Math.cos(a);
                    m[2 * (j * d + j) + 1] = Math.sin(a);
                }
                return GateOp.of(m, targets, controls);
            }
            default: { // monomial: a permutation with phases
                int[] perm = KernelsTest.pickDistinct(d, d, r);
                double[] m = new double[2 * d * d];
                for (int c = 0; c < d; c++) {
                    double a = r.nextBoolean() ? 0 : r.nextDouble(-3, 3);
                    m[2 * (perm[c] * d + c)] = Math.cos(a);
                    m[2 * (perm[c] * d + c) + 1] = Math.sin(a);
                }
                return GateOp.of(m, targets, controls);
            }
        }
    }

    private static boolean contains(int[] qs, int q) {
        for (int x : qs) {
            if (x == q) {
                return true;
            }
        }
        return false;
    }

    /** A seeded circuit whose gates touch qubits 0, 1, 2 and n-1 in turn, among others. */
    static List<GateOp> randomCircuit(int n, int gates, SplittableRandom r) {
        int[] forced = {0, 1, 2, n - 1};
        List<GateOp> ops = new ArrayList<>();
        for (int g = 0; g < gates; g++) {
            ops.add(randomGate(n, r, g % 2 == 0 ? forced[(g / 2) % forced.length] : -1));
        }
        return ops;
    }

    private static Amplitudes state(double[] v, int n, int chunkLog, boolean single,
            boolean vector) {
        Amplitudes a = single ? KernelsTest.loadSingle(v, n, chunkLog)
                : KernelsTest.load(v, n, chunkLog);
        return a.useLanes(vector ? Lanes.kernels() : null);
    }

    private static double maxDifference(double[] x, double[] y) {
        double worst = 0;
        for (int i = 0; i < x.length; i++) {
            worst = Math.max(worst, Math.abs(x[i] - y[i]));
        }
        return worst;
    }

    @ParameterizedTest(name = "n={0} chunkLog={1} threads={2}")
    @CsvSource({"6, 6, 1", "6, 3, 1", "9, 9, 2", "9, 4, 1", "16, 16, 2", "17, 15, 2",
        "17, 17, 3"})
    void randomCircuitsAgreeWithTheScalarLoops(int n, int chunkLog, int threads) {
        requireVectorLoops();
        long seed = 4100L + 100L * n + chunkLog;
        SplittableRandom r = new SplittableRandom(seed);
        double[] in = KernelsTest.randomVector(n, r);
        double norm = Math.sqrt(Reductions.norm2(KernelsTest.load(in, n, n), 1));
        for (int i = 0; i < in.length; i++) {
            in[i] /= norm;
        }
        List<GateOp> circuit = randomCircuit(n, n < 10 ? 80 : 40, r);
        for (boolean single : new boolean[] {false, true}) {
            Amplitudes scalar = state(in, n, chunkLog, single, false);
            Amplitudes vector = state(in, n, chunkLog, single, true);
            Frame.apply(scalar, circuit, threads);
            Frame.apply(vector, circuit, threads);
            double diff = maxDifference(KernelsTest.unload(scalar), KernelsTest.unload(vector));
            assertTrue(diff <= (single ? SINGLE_TOL : DOUBLE_TOL), "seed " + seed + (single
                    ? " single" : " double") + ": largest difference " + diff);
        }
        if (n <= 9) {
            // The definition, gate by gate (Nielsen and Chuang 2010, §4.3).
            double[] expected = in;
            for (GateOp op : circuit) {
                expected = KernelsTest.reference(expected, n, op.targets, op.controls,
                        fullMatrix(op));
            }
            Amplitudes vector = state(in, n, chunkLog, false, true);
            Frame.apply(vector, circuit, threads);
            assertArrayEquals(expected, KernelsTest.unload(vector), 1e-12, "seed " + seed);
        }
    }

    /**
     * Multiplying by an expanded table of complex factors gives the bits the plain table gives,
     * on the vector loops, their scalar default and the scalar loops' {@code scaleByTable}
     * (complex multiplication, (a + ib)(c + id) = ac - bd + i(ad + bc), common practice), for
     * counts with and without a scalar tail and offsets inside an array.
     */
    @Test
    void expandedTablesMultiplyAsThePlainTable() {
        requireVectorLoops();
        SplittableRandom r = new SplittableRandom(21);
        LaneKernels vector = Lanes.kernels();
        LaneKernels scalar = new ScalarLoops();
        for (int count : new int[] {1, 3, 4, 5, 16, 67, 256}) {
            double[] table = new double[2 * count];
            double[] psi = new double[2 * count + 6];
            for (int i = 0; i < table.length; i++) {
                table[i] = r.nextDouble() * 2 - 1;
            }
            for (int i = 0; i < psi.length; i++) {
                psi[i] = r.nextDouble() * 2 - 1;
            }
            double[][] ex = LaneKernels.expand(table);
            double[] plain = psi.clone();
            scalar.scaleByTable(plain, 4, table, count);
            double[] fast = psi.clone();
            vector.scaleByExpanded(fast, 4, ex[0], ex[1], count);
            double[] slow = psi.clone();
            scalar.scaleByExpanded(slow, 4, ex[0], ex[1], count);
            double[] vectorPlain = psi.clone();
            vector.scaleByTable(vectorPlain, 4, table, count);
            assertArrayEquals(plain, slow, "scalar default, count " + count);
            assertArrayEquals(vectorPlain, fast, "vector loops, count " + count);
            assertArrayEquals(plain, fast, "vector against scalar, count " + count);
        }
    }

    /**
     * A dense block of k = 2 to 4 targets (what {@code Fusion} emits) takes the vector k-qubit
     * plan when every target selects whole vectors, and the scalar plan when one lies inside a
     * vector (measured faster there, docs/decisions.md); either way the result is the
     * definition of a k-qubit gate (Nielsen and Chuang 2010, §4.3).
     */
    @Test
    void denseBlocksTakeTheVectorPlanWhenEveryTargetSpansVectors() {
        requireVectorLoops();
        final int n = 9;
        final int low = Lanes.kernels().amplitudeLog();
        SplittableRandom r = new SplittableRandom(4_207L);
        for (int k = 2; k <= 4; k++) {
            double[] m = unitary(k, r);
            int[][] placements = {highest(n, k), withQubit(highest(n, k), 0),
                withQubit(highest(n, k), low - 1)};
            for (int p = 0; p < placements.length; p++) {
                int[] targets = placements[p];
                double[] in = KernelsTest.randomVector(n, r);
                Amplitudes a = state(in, n, n, false, true);
                Plan plan = new GateOp(GateOp.DENSE, targets, NONE, m, null).plan(a);
                boolean vector = plan.getClass().getName().startsWith(
                        "dev.qsim.kernel.VectorGatePlans");
                assertEquals(p == 0, vector, "k=" + k + " targets "
                        + Arrays.toString(targets) + ": " + plan.getClass());
                plan.apply(1);
                double[] expected = KernelsTest.reference(in, n, targets, NONE, m);
                assertArrayEquals(expected, KernelsTest.unload(a), 1e-12, "k=" + k);
            }
        }
    }

    private static int[] highest(int n, int k) {
        int[] t = new int[k];
        for (int j = 0; j < k; j++) {
            t[j] = n - 1 - j;
        }
        return t;
    }

    private static int[] withQubit(int[] targets, int q) {
        int[] t = targets.clone();
        t[t.length - 1] = q;
        return t;
    }

    /** The matrix of a gate's description on its targets, re/im interleaved. */
    private static double[] fullMatrix(GateOp op) {
        int d = 1 << op.targets.length;
        double[] m = new double[2 * d * d];
        switch (op.shape) {
            case GateOp.DIAGONAL:
                for (int j = 0; j < d; j++) {
                    m[2 * (j * d + j)] = op.data[2 * j];
                    m[2 * (j * d + j) + 1] = op.data[2 * j + 1];
                }
                return m;
            case GateOp.MONOMIAL:
                for (int c = 0; c < d; c++) {
                    m[2 * (op.perm[c] * d + c)] = op.data[2 * c];
                    m[2 * (op.perm[c] * d + c) + 1] = op.data[2 * c + 1];
                }
                return m;
            default:
                return op.data;
        }
    }

    @ParameterizedTest(name = "n={0} chunkLog={1} threads={2}")
    @CsvSource({"17, 17, 2", "17, 14, 1", "12, 5, 2"})
    void everyTargetAndMatrixKindInBothPrecisions(int n, int chunkLog, int threads) {
        requireVectorLoops();
        long seed = 5200L + n + chunkLog;
        SplittableRandom r = new SplittableRandom(seed);
        double[] in = KernelsTest.randomVector(n, r);
        for (int q = 0; q < n; q++) {
            double t = r.nextDouble(-3, 3);
            double c = Math.cos(t / 2);
            double s = Math.sin(t / 2);
            double[][] kinds = {unitary(1, r), {c, 0, -s, 0, s, 0, c, 0},
                {c, 0, 0, -s, 0, -s, c, 0}};
            for (double[] m : kinds) {
                for (boolean single : new boolean[] {false, true}) {
                    Amplitudes scalar = state(in, n, chunkLog, single, false);
                    Amplitudes vector = state(in, n, chunkLog, single, true);
                    GateOp op = new GateOp(GateOp.DENSE, new int[] {q}, NONE, m, null);
                    Frame.apply(scalar, List.of(op), threads);
                    Frame.apply(vector, List.of(op), threads);
                    double diff = maxDifference(KernelsTest.unload(scalar),
                            KernelsTest.unload(vector));
                    assertTrue(diff <= (single ? SINGLE_TOL : DOUBLE_TOL), "seed " + seed
                            + " target " + q + (single ? " single" : " double") + ": " + diff);
                }
            }
        }
    }

    @ParameterizedTest(name = "n={0} chunkLog={1}")
    @CsvSource({"17, 17", "17, 13", "16, 6"})
    void resultsAreTheSameBitsForAnyThreadCount(int n, int chunkLog) {
        requireVectorLoops();
        long seed = 6300L + n + chunkLog;
        SplittableRandom r = new SplittableRandom(seed);
        double[] in = KernelsTest.randomVector(n, r);
        List<GateOp> circuit = randomCircuit(n, 30, r);
        for (boolean single : new boolean[] {false, true}) {
            double[] first = null;
            double firstNorm = 0;
            for (int threads = 1; threads <= 3; threads++) {
                Amplitudes a = state(in, n, chunkLog, single, true);
                Frame.apply(a, circuit, threads);
                double[] out = KernelsTest.unload(a);
                double norm = Reductions.norm2(a, threads);
                if (first == null) {
                    first = out;
                    firstNorm = norm;
                } else {
                    assertArrayEquals(first, out, "seed " + seed + " threads " + threads);
                    assertEquals(firstNorm, norm, 0.0, "norm, threads " + threads);
                }
            }
        }
    }

    @ParameterizedTest(name = "n={0} chunkLog={1} threads={2}")
    @CsvSource({"17, 17, 2", "16, 8, 1", "6, 3, 1"})
    void sumsAgreeWithTheScalarLoops(int n, int chunkLog, int threads) {
        requireVectorLoops();
        long seed = 7400L + n + chunkLog;
        SplittableRandom r = new SplittableRandom(seed);
        double[] v = KernelsTest.randomVector(n, r);
        double[] w = KernelsTest.randomVector(n, r);
        // Sums of 2^n terms of size about 1: relative error a few times 1e-16 per term at
        // worst (Higham 2002, §4.2), far below 1e-13 relative for these sizes.
        double tol = 1e-13 * (1 << n);
        Amplitudes[] a = {state(v, n, chunkLog, false, false), state(v, n, chunkLog, false, true)};
        Amplitudes[] b = {state(w, n, chunkLog, false, false), state(w, n, chunkLog, false, true)};
        assertEquals(Reductions.norm2(a[0], threads), Reductions.norm2(a[1], threads), tol);
        for (int q = -1; q < n; q++) {
            assertEquals(Reductions.probabilityWhere(a[0], q, threads),
                    Reductions.probabilityWhere(a[1], q, threads), tol, "qubit " + q);
        }
        double[] z0 = Reductions.inner(a[0], b[0], threads);
        double[] z1 = Reductions.inner(a[1], b[1], threads);
        assertArrayEquals(z0, z1, tol);
        double[] p0 = new double[1 << n];
        double[] p1 = new double[1 << n];
        Reductions.probabilities(a[0], p0, threads);
        Reductions.probabilities(a[1], p1, threads);
        assertArrayEquals(p0, p1, DOUBLE_TOL);
        Amplitudes[] s = {state(v, n, chunkLog, true, false), state(v, n, chunkLog, true, true)};
        assertEquals(Reductions.norm2(s[0], threads), Reductions.norm2(s[1], threads), tol);
        for (int trial = 0; trial < 4; trial++) {
            long x = r.nextLong(1L << n);
            long z = r.nextLong(1L << n);
            assertArrayEquals(PauliKernels.inner(b[0], a[0], x, z, threads),
                    PauliKernels.inner(b[1], a[1], x, z, threads), tol, "x " + x + " z " + z);
            Amplitudes[] acc = {state(w, n, chunkLog, false, false),
                state(w, n, chunkLog, false, true)};
            PauliKernels.accumulate(acc[0], a[0], x, z, 0.6, -0.8, threads);
            PauliKernels.accumulate(acc[1], a[1], x, z, 0.6, -0.8, threads);
            assertArrayEquals(KernelsTest.unload(acc[0]), KernelsTest.unload(acc[1]), DOUBLE_TOL,
                    "accumulate x " + x + " z " + z);
        }
    }
}
