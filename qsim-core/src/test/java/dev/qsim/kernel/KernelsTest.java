package dev.qsim.kernel;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import java.util.SplittableRandom;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * Each kernel against a slow, obviously correct reference: the full gate as a sum over basis
 * states, computed amplitude by amplitude from the definition of a controlled k-qubit operator
 * (Nielsen and Chuang 2010, §4.3; Barenco et al. 1995, Phys. Rev. A 52, 3457). Small chunk sizes
 * reach the chunk-crossing code paths that large states use. Tolerance 1e-13 absolute: a few
 * rounding errors on O(1) amplitudes (common practice).
 */
class KernelsTest {
    private static final double TOL = 1e-13;

    /** Reference: out[i] = Σ_j M[row(i)][j] a[i with target bits set to j] where controls are 1. */
    static double[] reference(double[] in, int n, int[] targets, int[] controls, double[] m) {
        int k = targets.length;
        int d = 1 << k;
        double[] out = in.clone();
        for (int i = 0; i < (1 << n); i++) {
            boolean on = true;
            for (int c : controls) {
                on &= ((i >>> c) & 1) == 1;
            }
            if (!on) {
                continue;
            }
            int row = 0;
            for (int t = 0; t < k; t++) {
                row |= ((i >>> targets[t]) & 1) << t;
            }
            double sr = 0;
            double si = 0;
            for (int col = 0; col < d; col++) {
                int j = i;
                for (int t = 0; t < k; t++) {
                    j = (j & ~(1 << targets[t])) | (((col >>> t) & 1) << targets[t]);
                }
                double mr = m[2 * (row * d + col)];
                double mi = m[2 * (row * d + col) + 1];
                sr += mr * in[2 * j] - mi * in[2 * j + 1];
                si += mr * in[2 * j + 1] + mi * in[2 * j];
            }
            out[2 * i] = sr;
            out[2 * i + 1] = si;
        }
        return out;
    }

    /**
     * Runs the gates through the planner ({@link Frame#execute}) on a storage loaded with
     * {@code in} and asserts every element within 1e-12 of {@code expected} (1e-4 in single
     * precision, whose storage rounds each element to float).
     */
    static void assertExecutes(double[] expected, double[] in, int n, int chunkLog,
            boolean single, List<GateOp> ops, int threads) {
        Amplitudes a = single ? loadSingle(in, n, chunkLog) : load(in, n, chunkLog);
        Frame.execute(a, ops, threads);
        double[] got = unload(a);
        double tol = single ? 1e-4 : 1e-12;
        for (int i = 0; i < got.length; i++) {
            assertEquals(expected[i], got[i], tol, "element " + i);
        }
    }

    /**
     * A random monomial gate: a permutation of the target basis states, with a random phase on
     * each when {@code phases}; its dense matrix goes to {@code dense[0]} for the reference.
     */
    static GateOp randomMonomial(int[] targets, int[] controls, boolean phases,
            SplittableRandom r, double[][] dense) {
        int d = 1 << targets.length;
        double[] m = new double[2 * d * d];
        int[] perm = pickDistinct(d, d, r);
        double[] phase = new double[2 * d];
        for (int j = 0; j < d; j++) {
            double phi = phases ? r.nextDouble(0, 2 * Math.PI) : 0;
            phase[2 * j] = Math.cos(phi);
            phase[2 * j + 1] = Math.sin(phi);
            m[2 * (perm[j] * d + j)] = phase[2 * j];
            m[2 * (perm[j] * d + j) + 1] = phase[2 * j + 1];
        }
        dense[0] = m;
        return new GateOp(GateOp.MONOMIAL, targets, controls, phase, perm);
    }

    static double[] randomVector(int n, SplittableRandom r) {
        double[] v = new double[2 << n];
        for (int i = 0; i < v.length; i++) {
            v[i] = r.nextDouble(-1, 1);
        }
        return v;
    }

    static Amplitudes load(double[] v, int n, int chunkLog) {
        Amplitudes a = Amplitudes.allocate(n, chunkLog);
        for (int i = 0; i < (1 << n); i++) {
            a.set(i, v[2 * i], v[2 * i + 1]);
        }
        return a;
    }

    static double[] unload(Amplitudes a) {
        int n = a.qubits();
        double[] v = new double[2 << n];
        for (int i = 0; i < (1 << n); i++) {
            v[2 * i] = a.re(i);
            v[2 * i + 1] = a.im(i);
        }
        return v;
    }

    /** Float storage holding {@code v} rounded to float. */
    static Amplitudes loadSingle(double[] v, int n, int chunkLog) {
        Amplitudes s = Amplitudes.allocateSingle(n, chunkLog);
        for (int i = 0; i < (1 << n); i++) {
            s.set(i, v[2 * i], v[2 * i + 1]);
        }
        return s;
    }

    /** {@code v} with each part rounded to float: what float storage holds of it. */
    static double[] rounded(double[] v) {
        double[] out = new double[v.length];
        for (int i = 0; i < v.length; i++) {
            out[i] = (float) v[i];
        }
        return out;
    }

    static int[] pickDistinct(int n, int count, SplittableRandom r) {
        int[] perm = new int[n];
        for (int i = 0; i < n; i++) {
            perm[i] = i;
        }
        for (int i = n - 1; i > 0; i--) {
            int j = r.nextInt(i + 1);
            int t = perm[i];
            perm[i] = perm[j];
            perm[j] = t;
        }
        return java.util.Arrays.copyOf(perm, count);
    }

    @ParameterizedTest(name = "n={0} chunkLog={1} k={2} controls={3} threads={4}")
    @CsvSource({
        "6, 6, 1, 0, 1", "6, 2, 1, 0, 1", "6, 0, 1, 0, 1", "6, 3, 2, 0, 1", "6, 3, 3, 1, 1",
        "7, 2, 1, 2, 1", "8, 4, 2, 1, 1", "16, 6, 1, 0, 2", "16, 6, 2, 1, 2", "16, 15, 1, 0, 2",
        "16, 4, 3, 0, 3", "16, 16, 2, 2, 2"
    })
    void denseDiagonalAndMonomialMatchReference(int n, int chunkLog, int k, int nc, int threads) {
        long seed = 1000L * n + 100L * chunkLog + 10L * k + nc;
        SplittableRandom r = new SplittableRandom(seed);
        for (int trial = 0; trial < 6; trial++) {
            int[] qs = pickDistinct(n, k + nc, r);
            int[] targets = java.util.Arrays.copyOf(qs, k);
            int[] controls = java.util.Arrays.copyOfRange(qs, k, k + nc);
            int d = 1 << k;
            double[] in = randomVector(n, r);
            String where = "seed " + seed + " trial " + trial;

            // Dense: arbitrary matrix (the kernel does not need unitarity).
            double[] m = new double[2 * d * d];
            for (int i = 0; i < m.length; i++) {
                m[i] = r.nextDouble(-1, 1);
            }
            Amplitudes a = load(in, n, chunkLog);
            DenseKernels.apply(a, targets, controls, m, threads);
            assertArrayEquals(reference(in, n, targets, controls, m), unload(a), TOL, where);

            // Diagonal.
            double[] diag = new double[2 * d];
            double[] dm = new double[2 * d * d];
            for (int i = 0; i < d; i++) {
                diag[2 * i] = r.nextDouble(-1, 1);
                diag[2 * i + 1] = r.nextDouble(-1, 1);
                dm[2 * (i * d + i)] = diag[2 * i];
                dm[2 * (i * d + i) + 1] = diag[2 * i + 1];
            }
            a = load(in, n, chunkLog);
            DiagonalKernels.apply(a, targets, controls, diag, threads);
            assertArrayEquals(reference(in, n, targets, controls, dm), unload(a), TOL, where);

            // Monomial with phases, and a pure permutation.
            int[] perm = pickDistinct(d, d, r);
            for (boolean pure : new boolean[] {false, true}) {
                double[] ph = new double[2 * d];
                double[] pm = new double[2 * d * d];
                for (int c = 0; c < d; c++) {
                    ph[2 * c] = pure ? 1 : r.nextDouble(-1, 1);
                    ph[2 * c + 1] = pure ? 0 : r.nextDouble(-1, 1);
                    pm[2 * (perm[c] * d + c)] = ph[2 * c];
                    pm[2 * (perm[c] * d + c) + 1] = ph[2 * c + 1];
                }
                a = load(in, n, chunkLog);
                PermutationKernels.apply(a, targets, controls, perm, ph, threads);
                assertArrayEquals(reference(in, n, targets, controls, pm), unload(a), TOL,
                        where + (pure ? " pure" : " phased"));
            }
        }
    }

    /**
     * A lone single-qubit gate on single-precision storage goes through
     * {@link FloatSingleQubitKernels} (one pass, no window): against the reference on the rounded
     * input, every target, chunk sizes down to one amplitude. Each output part is one rounding of
     * the exact result, so it
     * is within 2^-24 relative of it (IEEE 754-2019 §4.3.1; Higham 2002, §2.1): 1e-6 absolute
     * on parts below 2.
     */
    @ParameterizedTest(name = "n={0} chunkLog={1} threads={2}")
    @CsvSource({"6, 6, 1", "6, 1, 1", "6, 0, 1", "15, 4, 2", "16, 16, 2", "16, 13, 2"})
    void singleQubitGatesOnFloatStorageMatchReference(int n, int chunkLog, int threads) {
        long seed = 9000L + 10L * n + chunkLog;
        SplittableRandom r = new SplittableRandom(seed);
        for (int q = 0; q < n; q++) {
            double[] m = new double[8];
            for (int i = 0; i < 8; i++) {
                m[i] = r.nextDouble(-0.7, 0.7);
            }
            double[] in = randomVector(n, r);
            Amplitudes s = loadSingle(in, n, chunkLog);
            double[] rounded = rounded(in);
            GateOp op = new GateOp(GateOp.DENSE, new int[] {q}, new int[0], m, null);
            Windows.apply(s, java.util.List.of(op), threads);
            assertArrayEquals(reference(rounded, n, new int[] {q}, new int[0], m), unload(s),
                    1e-6, "seed " + seed + " target " + q);

            // With one or two controls elsewhere (only where they are all 1).
            int[] others = pickDistinct(n, n, r);
            int nc = 1 + (q % 2);
            int[] controls = new int[nc];
            for (int i = 0, j = 0; i < nc; j++) {
                if (others[j] != q) {
                    controls[i++] = others[j];
                }
            }
            double[] before = unload(s);
            GateOp controlled = new GateOp(GateOp.DENSE, new int[] {q}, controls, m, null);
            Windows.apply(s, java.util.List.of(controlled), threads);
            assertArrayEquals(reference(before, n, new int[] {q}, controls, m), unload(s), 1e-6,
                    "seed " + seed + " target " + q + " controls "
                    + java.util.Arrays.toString(controls));

            // X and controlled X move floats without arithmetic: exact.
            double[] x = {0, 0, 1, 0, 1, 0, 0, 0};
            for (int[] cs : new int[][] {{}, controls}) {
                before = unload(s);
                GateOp flip = new GateOp(GateOp.MONOMIAL, new int[] {q}, cs,
                        new double[] {1, 0, 1, 0}, new int[] {1, 0});
                Windows.apply(s, java.util.List.of(flip), threads);
                assertArrayEquals(reference(before, n, new int[] {q}, cs, x), unload(s), 0.0,
                        "seed " + seed + " X on " + q + " controls "
                        + java.util.Arrays.toString(cs));
            }
        }
    }

    /**
     * Permutations on qubits that select whole chunks move chunk references instead of
     * amplitudes (double storage through the plan, single storage through {@link Windows}); the
     * result must equal the definition, controls included.
     */
    @ParameterizedTest(name = "n={0} chunkLog={1} k={2} controls={3}")
    @CsvSource({"7, 3, 1, 0", "7, 3, 1, 1", "7, 2, 2, 1", "8, 3, 3, 0", "8, 4, 1, 2"})
    void permutationsOfWholeChunksMatchReference(int n, int chunkLog, int k, int nc) {
        long seed = 7000L + 100L * n + 10L * chunkLog + k + nc;
        SplittableRandom r = new SplittableRandom(seed);
        for (int trial = 0; trial < 6; trial++) {
            int[] qs = pickDistinct(n - chunkLog, k + nc, r);
            for (int i = 0; i < qs.length; i++) {
                qs[i] += chunkLog;
            }
            int[] targets = java.util.Arrays.copyOf(qs, k);
            int[] controls = java.util.Arrays.copyOfRange(qs, k, k + nc);
            int d = 1 << k;
            int[] perm = pickDistinct(d, d, r);
            double[] ph = new double[2 * d];
            double[] pm = new double[2 * d * d];
            for (int c = 0; c < d; c++) {
                ph[2 * c] = 1;
                pm[2 * (perm[c] * d + c)] = 1;
            }
            double[] in = randomVector(n, r);
            double[] expected = reference(in, n, targets, controls, pm);
            String where = "seed " + seed + " trial " + trial;
            GateOp op = new GateOp(GateOp.MONOMIAL, targets, controls, ph, perm);
            Amplitudes a = load(in, n, chunkLog);
            assertEquals(true, PermutationKernels.movesChunks(a, op), where);
            PermutationKernels.apply(a, targets, controls, perm, ph, 1);
            // Moving references copies no number: equality is exact.
            assertArrayEquals(expected, unload(a), 0.0, where);

            Amplitudes s = loadSingle(in, n, chunkLog);
            double[] rounded = rounded(in);
            Windows.apply(s, java.util.List.of(op), 1);
            assertArrayEquals(reference(rounded, n, targets, controls, pm), unload(s), 0.0,
                    where + " single");
        }
    }

    @ParameterizedTest(name = "n={0} chunkLog={1} threads={2}")
    @CsvSource({"5, 5, 1", "5, 2, 1", "16, 6, 2", "16, 16, 3"})
    void reductionsMatchDirectSums(int n, int chunkLog, int threads) {
        SplittableRandom r = new SplittableRandom(n * 31L + chunkLog);
        double[] v = randomVector(n, r);
        double[] w = randomVector(n, r);
        Amplitudes a = load(v, n, chunkLog);
        Amplitudes b = load(w, n, chunkLog);
        double norm = 0;
        double[] where = new double[n];
        double ir = 0;
        double ii = 0;
        for (int i = 0; i < (1 << n); i++) {
            double p = v[2 * i] * v[2 * i] + v[2 * i + 1] * v[2 * i + 1];
            norm += p;
            for (int q = 0; q < n; q++) {
                if (((i >>> q) & 1) == 1) {
                    where[q] += p;
                }
            }
            ir += v[2 * i] * w[2 * i] + v[2 * i + 1] * w[2 * i + 1];
            ii += v[2 * i] * w[2 * i + 1] - v[2 * i + 1] * w[2 * i];
        }
        double tol = 1e-12 * (1 << n);
        assertEquals(norm, Reductions.norm2(a, threads), tol);
        for (int q = 0; q < n; q++) {
            assertEquals(where[q], Reductions.probabilityWhere(a, q, threads), tol, "qubit " + q);
        }
        double[] z = Reductions.inner(a, b, threads);
        assertEquals(ir, z[0], tol);
        assertEquals(ii, z[1], tol);
        // Same bits whatever the thread count: the blocks are fixed.
        assertEquals(Reductions.norm2(a, 1), Reductions.norm2(a, threads), 0.0);
    }

    @ParameterizedTest(name = "n={0} chunkLog={1} blockLog={2} threads={3}")
    @CsvSource({"12, 12, 10, 1", "12, 6, 6, 2", "16, 15, 12, 2", "16, 8, 8, 3"})
    void cacheBlockedGroupEqualsOneByOneBitwise(int n, int chunkLog, int blockLog, int threads) {
        // Blocking changes only the order in which independent amplitude groups are visited, so
        // the result must be identical to the bit (common practice for loop tiling).
        long seed = 77L * n + blockLog;
        SplittableRandom r = new SplittableRandom(seed);
        double[] in = randomVector(n, r);
        Amplitudes blocked = load(in, n, chunkLog);
        Amplitudes plain = load(in, n, chunkLog);
        Plan[] plans = new Plan[12];
        Plan[] plainPlans = new Plan[plans.length];
        for (int g = 0; g < plans.length; g++) {
            int k = 1 + g % 3;
            int nc = g % 2;
            int[] qs = pickDistinct(blockLog, k + nc, r);
            int[] targets = java.util.Arrays.copyOf(qs, k);
            int[] controls = java.util.Arrays.copyOfRange(qs, k, k + nc);
            int d = 1 << k;
            double[] m = new double[2 * d * d];
            for (int i = 0; i < m.length; i++) {
                m[i] = r.nextDouble(-1, 1);
            }
            double[] diag = java.util.Arrays.copyOf(m, 2 * d);
            int[] perm = pickDistinct(d, d, r);
            switch (g % 3) {
                case 0:
                    plans[g] = DenseKernels.plan(blocked, targets, controls, m);
                    plainPlans[g] = DenseKernels.plan(plain, targets, controls, m);
                    break;
                case 1:
                    plans[g] = DiagonalKernels.plan(blocked, targets, controls, diag);
                    plainPlans[g] = DiagonalKernels.plan(plain, targets, controls, diag);
                    break;
                default:
                    plans[g] = PermutationKernels.plan(blocked, targets, controls, perm, diag);
                    plainPlans[g] = PermutationKernels.plan(plain, targets, controls, perm, diag);
                    break;
            }
            assertEquals(true, plans[g].unitsPerBlock(blockLog) > 0, "seed " + seed);
        }
        Plan.applyBlocked(blocked, plans, blockLog, threads);
        for (Plan p : plainPlans) {
            p.apply(1);
        }
        assertArrayEquals(unload(plain), unload(blocked), 0.0, "seed " + seed);
    }

    @ParameterizedTest(name = "n={0} chunkLog={1} threads={2}")
    @CsvSource({"10, 10, 1", "10, 4, 2", "16, 6, 2", "16, 15, 3"})
    void pickIndicesIsInverseTransformSampling(int n, int chunkLog, int threads) {
        // Inverse-transform sampling: u picks the first index whose cumulative probability
        // exceeds u (L. Devroye, Non-Uniform Random Variate Generation, 1986, §III.2.1).
        // Reference: a plain sequential cumulative sum.
        SplittableRandom r = new SplittableRandom(13L * n + chunkLog);
        double[] v = randomVector(n, r);
        for (int i = 0; i < v.length; i += 6) {
            v[i] = 0;       // some zero-probability amplitudes
            v[i + 1] = 0;
        }
        Amplitudes a = load(v, n, chunkLog);
        double[] sums = Reductions.blockSums(a, threads);
        double total = 0;
        for (double x : sums) {
            total += x;
        }
        double[] u = new double[2000];
        for (int i = 0; i < u.length; i++) {
            u[i] = r.nextDouble() * total;
        }
        java.util.Arrays.sort(u);
        long[] out = new long[u.length];
        Reductions.pickIndices(a, sums, u, out, threads);
        for (int s = 0; s < u.length; s++) {
            double cum = 0;
            long expected = -1;
            for (int i = 0; i < (1 << n); i++) {
                cum += v[2 * i] * v[2 * i] + v[2 * i + 1] * v[2 * i + 1];
                if (u[s] < cum) {
                    expected = i;
                    break;
                }
            }
            double lo = 0;
            for (int i = 0; i < expected; i++) {
                lo += v[2 * i] * v[2 * i] + v[2 * i + 1] * v[2 * i + 1];
            }
            if (Math.abs(u[s] - lo) > 1e-9 && Math.abs(u[s] - cum) > 1e-9) {
                assertEquals(expected, out[s], "uniform " + s + " = " + u[s]);
            }
            double p = v[2 * (int) out[s]] * v[2 * (int) out[s]]
                    + v[2 * (int) out[s] + 1] * v[2 * (int) out[s] + 1];
            assertEquals(true, p > 0, "a zero-probability index was picked");
        }
    }

    @ParameterizedTest(name = "n={0} chunkLog={1} threads={2}")
    @CsvSource({"16, 16, 2", "16, 14, 3", "15, 15, 1"})
    void singleQubitPlansMatchTheReferenceOnEveryTarget(int n, int chunkLog, int threads) {
        // Every target, so the whole-block, piece (high target inside a chunk) and chunk-pair
        // paths of the dense, diagonal and flip kernels all run; reference as above.
        SplittableRandom r = new SplittableRandom(31L * n + chunkLog);
        double[] in = randomVector(n, r);
        double[] m = new double[8];
        for (int i = 0; i < 8; i++) {
            m[i] = r.nextDouble(-1, 1);
        }
        double[] diag = {m[0], m[1], m[6], m[7]};
        double[] dm = {m[0], m[1], 0, 0, 0, 0, m[6], m[7]};
        double[] xm = {0, 0, 1, 0, 1, 0, 0, 0};
        int[] none = new int[0];
        for (int q = 0; q < n; q++) {
            int[] t = {q};
            Amplitudes a = load(in, n, chunkLog);
            DenseKernels.apply(a, t, none, m, threads);
            assertArrayEquals(reference(in, n, t, none, m), unload(a), TOL, "dense q" + q);
            a = load(in, n, chunkLog);
            DiagonalKernels.apply(a, t, none, diag, threads);
            assertArrayEquals(reference(in, n, t, none, dm), unload(a), TOL, "diagonal q" + q);
            a = load(in, n, chunkLog);
            PermutationKernels.apply(a, t, none, new int[] {1, 0}, new double[] {1, 0, 1, 0},
                    threads);
            assertArrayEquals(reference(in, n, t, none, xm), unload(a), 0.0, "flip q" + q);
        }
    }

    /**
     * Real 2x2 matrices (H, RY and their products) and matrices shaped like RX (real diagonal,
     * imaginary off-diagonal) take loops with half the arithmetic; here their entries are
     * random, since the kernels are linear. Every target, in one pass and cache
     * blocked, in double storage and (lone gates through {@link FloatSingleQubitKernels}) in float
     * storage, with chunks small enough to reach the piece and chunk-pair paths. Reference as in
     * the tests above (Nielsen and Chuang 2010, §4.3): double results must equal it bit for bit
     * on the scalar loops and within 1e-13 on the vector loops (fused multiply-adds), float ones
     * within 1e-6 (one rounding to float, IEEE 754-2019 §4.3.1).
     */
    @ParameterizedTest(name = "n={0} chunkLog={1} threads={2}")
    @CsvSource({"16, 16, 2", "16, 14, 1", "15, 3, 2", "6, 0, 1", "6, 1, 1"})
    void realAndRxShapedMatricesMatchTheReferenceOnEveryTarget(int n, int chunkLog, int threads) {
        SplittableRandom r = new SplittableRandom(77L * n + chunkLog);
        double[] in = randomVector(n, r);
        int[] none = new int[0];
        for (int shaped = 0; shaped < 2 * n; shaped++) {
            int q = shaped / 2;
            double[] m = new double[8];
            // Even: real entries (H, RY); odd: real diagonal, imaginary off-diagonal (RX).
            int[] slots = shaped % 2 == 0 ? new int[] {0, 2, 4, 6} : new int[] {0, 3, 5, 6};
            for (int i : slots) {
                m[i] = r.nextDouble(-1, 1);
            }
            int[] t = {q};
            double[] expected = reference(in, n, t, none, m);
            // The zero parts drop out exactly (x - 0 * y = x), so the scalar loops give the bits
            // of the complex loop and of the reference, which adds the same two products: exact.
            // The vector loops round a product and a sum once (fused multiply-add, IEEE
            // 754-2019 §5.4.1): within a few units in the last place, TOL.
            Amplitudes a = load(in, n, chunkLog);
            final double exact = a.lanes == null ? 0.0 : TOL;
            DenseKernels.apply(a, t, none, m, threads);
            assertArrayEquals(expected, unload(a), exact, "shape " + shaped % 2 + " q" + q);

            // Cache blocked: the same gate twice in one group, against two passes.
            if (q < Math.min(chunkLog, 10)) {
                a = load(in, n, chunkLog);
                Plan[] plans = {DenseKernels.plan(a, t, none, m),
                    DenseKernels.plan(a, t, none, m)};
                Plan.applyBlocked(a, plans, Math.min(chunkLog, 10), threads);
                assertArrayEquals(reference(expected, n, t, none, m), unload(a), exact,
                        "shape " + shaped % 2 + " twice, blocked, q" + q);
            }

            Amplitudes s = loadSingle(in, n, chunkLog);
            double[] rounded = rounded(in);
            GateOp op = new GateOp(GateOp.DENSE, t, none, m, null);
            Windows.apply(s, java.util.List.of(op), threads);
            assertArrayEquals(reference(rounded, n, t, none, m), unload(s), 1e-6,
                    "shape " + shaped % 2 + " on floats, q" + q);
        }
    }
}
