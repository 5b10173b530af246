package dev.qsim.kernel;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import java.util.function.IntUnaryOperator;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * Runs of diagonal and monomial gates merged into one table pass ({@link TableKernels}) must
 * give the state the gates give one by one. Checked against the plain matrix-vector reference of
 * {@link KernelsTest#reference} applied gate by gate (the definition of a gate on a register:
 * M. A. Nielsen and I. L. Chuang, "Quantum Computation and Quantum Information", 2010,
 * sec. 4.3). Tolerance 1e-12 absolute on O(1) amplitudes after 60 gates (common practice); a
 * run of factors 1 and -1 only (CZ, Z, CNOT, SWAP) multiplies exactly, so those agree to the
 * bit with the gates applied one by one.
 */
class TableKernelsTest {
    private static final int[] NONE = new int[0];

    /**
     * A random diagonal or monomial gate on one or two targets with 0 to 2 controls, on qubits
     * drawn from {@code qubits}: signs only (kind 0), phases (1), a pure permutation (2) or a
     * permutation with phases (3).
     */
    private static GateOp randomOp(int[] qubits, SplittableRandom r, int kind, double[][] dense) {
        int k = 1 + r.nextInt(2);
        int nc = r.nextInt(3);
        int[] pick = KernelsTest.pickDistinct(qubits.length, k + nc, r);
        int[] targets = new int[k];
        int[] controls = new int[nc];
        for (int i = 0; i < k + nc; i++) {
            if (i < k) {
                targets[i] = qubits[pick[i]];
            } else {
                controls[i - k] = qubits[pick[i]];
            }
        }
        int d = 1 << k;
        double[] m = new double[2 * d * d];
        if (kind < 2) {
            double[] diag = new double[2 * d];
            for (int j = 0; j < d; j++) {
                double phi = kind == 0 ? Math.PI * r.nextInt(2) : r.nextDouble(0, 2 * Math.PI);
                diag[2 * j] = Math.cos(phi);
                diag[2 * j + 1] = kind == 0 ? 0 : Math.sin(phi);
                m[2 * (j * d + j)] = diag[2 * j];
                m[2 * (j * d + j) + 1] = diag[2 * j + 1];
            }
            dense[0] = m;
            return new GateOp(GateOp.DIAGONAL, targets, controls, diag, null);
        }
        return KernelsTest.randomMonomial(targets, controls, kind == 3, r, dense);
    }

    /** How many merged runs the planner hands over for these gates on a state of n qubits. */
    private static int merged(List<GateOp> ops, int n, int chunkLog) {
        int[] count = new int[1];
        Amplitudes a = Amplitudes.allocate(n, chunkLog);
        Windows.schedule(a, ops, new Frame.Passes() {
            private void see(List<GateOp> group) {
                for (GateOp op : group) {
                    count[0] += op.shape == GateOp.TABLE ? 1 : 0;
                }
            }

            @Override
            public void single(GateOp op, Plan plan) {
                see(List.of(op));
            }

            @Override
            public void blocked(List<GateOp> group, Plan[] plans, int blockLog) {
                see(group);
            }

            @Override
            public void window(List<GateOp> group, long mask, int low) {
                see(group);
            }

            @Override
            public void floatSingle(GateOp op, double[] m2) {
            }

            @Override
            public void chunkMove(GateOp op) {
            }

            @Override
            public void phases(double[] p) {
            }
        });
        return count[0];
    }

    /** {@code count} random gates of {@link #randomOp} on {@code qs}, gate g of kind kind(g). */
    private static List<GateOp> randomRun(int[] qs, int count, IntUnaryOperator kind,
            SplittableRandom r) {
        List<GateOp> ops = new ArrayList<>();
        double[][] dense = new double[1][];
        for (int g = 0; g < count; g++) {
            ops.add(randomOp(qs, r, kind.applyAsInt(g), dense));
        }
        return ops;
    }

    /** Every qubit below {@code n}. */
    private static int[] all(int n) {
        int[] q = new int[n];
        for (int i = 0; i < n; i++) {
            q[i] = i;
        }
        return q;
    }

    @ParameterizedTest(name = "n={0} chunkLog={1} threads={2} single={3} kinds={4}")
    @CsvSource({"20, 20, 1, false, 0123", "17, 12, 2, false, 0123", "18, 18, 2, false, 13",
        "19, 9, 1, false, 0123", "20, 20, 2, false, 02", "17, 12, 1, true, 0123",
        "19, 19, 2, true, 02"})
    void mergedRunsEqualGatesInOrder(int n, int chunkLog, int threads, boolean single,
            String kinds) {
        SplittableRandom r = new SplittableRandom(7919L * n + chunkLog);
        double[] in = KernelsTest.randomVector(n, r);
        double[] expected = single ? KernelsTest.rounded(in) : in.clone();
        List<GateOp> ops = new ArrayList<>();
        double[][] dense = new double[1][];
        // Runs of 2 to 12 gates on a few qubits (so they merge), now and then a dense gate.
        int[] qs = all(n);
        for (int g = 0; g < 60; g++) {
            GateOp op;
            if (g % 13 == 12) {
                double[] m = new double[8];
                for (int i = 0; i < m.length; i++) {
                    m[i] = r.nextDouble(-1, 1) / 2;
                }
                op = new GateOp(GateOp.DENSE, new int[] {r.nextInt(n)}, NONE, m, null);
                dense[0] = m;
            } else {
                if (g % 13 == 0) {
                    qs = Arrays.copyOf(KernelsTest.pickDistinct(n, n, r), Math.min(n, 6));
                }
                int kind = kinds.charAt(r.nextInt(kinds.length())) - '0';
                op = randomOp(qs, r, kind, dense);
            }
            ops.add(op);
            expected = KernelsTest.reference(expected, n, op.targets, op.controls, dense[0]);
        }
        assertTrue(merged(ops, n, chunkLog) > 0, "some runs merge");
        KernelsTest.assertExecutes(expected, in, n, chunkLog, single, ops, threads);
    }

    @Test
    void laddersWithRotationsBetweenTheirGatesMergeAndEqualTheReference() {
        // A layer as circuits write it: each controlled phase of the ladder follows a rotation
        // on the next qubit, which no gate of the ladder so far touches, so the run steps over
        // it (the rotation is applied first). 20 qubits, chunks of 2^14: the ladder crosses
        // windows and cache blocks.
        int n = 20;
        SplittableRandom r = new SplittableRandom(47);
        double[] in = KernelsTest.randomVector(n, r);
        double[] expected = in.clone();
        List<GateOp> ops = new ArrayList<>();
        List<double[]> matrices = new ArrayList<>();
        for (int layer = 0; layer < 3; layer++) {
            for (int q = 0; q + 1 < n; q++) {
                double a = r.nextDouble(0, 2 * Math.PI);
                double b = r.nextDouble(0, 2 * Math.PI);
                // RZ(2a) RY(2b) up to a phase: unitary, complex, every entry non-zero.
                double[] u = {Math.cos(b) * Math.cos(a), -Math.cos(b) * Math.sin(a), -Math.sin(b),
                    0, Math.sin(b), 0, Math.cos(b) * Math.cos(a), Math.cos(b) * Math.sin(a)};
                ops.add(new GateOp(GateOp.DENSE, new int[] {q + 1}, NONE, u, null));
                matrices.add(u);
                double phi = r.nextDouble(0, 2 * Math.PI);
                ops.add(new GateOp(GateOp.DIAGONAL, new int[] {q + 1}, new int[] {q},
                        new double[] {1, 0, Math.cos(phi), Math.sin(phi)}, null));
                matrices.add(new double[] {1, 0, 0, 0, 0, 0, Math.cos(phi), Math.sin(phi)});
            }
        }
        for (int g = 0; g < ops.size(); g++) {
            expected = KernelsTest.reference(expected, n, ops.get(g).targets, ops.get(g).controls,
                    matrices.get(g));
        }
        assertTrue(merged(ops, n, 14) > 0, "the ladders merge across their rotations");
        KernelsTest.assertExecutes(expected, in, n, 14, false, ops, 1);
        KernelsTest.assertExecutes(expected, in, n, 14, false, ops, 2);
    }

    @Test
    void laddersThroughTheFrameEqualTheReference() {
        // The shapes the planner meets most: RZ phases kept in the lazy frame, then a CZ ladder
        // and a CNOT ladder whose targets carry those phases (so the CNOTs arrive with phases),
        // and an X in the frame that flips a CZ's signs. 20 qubits: the ladders cross windows.
        int n = 20;
        SplittableRandom r = new SplittableRandom(31);
        double[] in = KernelsTest.randomVector(n, r);
        double[] expected = in.clone();
        List<GateOp> ops = new ArrayList<>();
        for (int layer = 0; layer < 3; layer++) {
            for (int q = 0; q < n; q += 2) {
                double phi = r.nextDouble(0, 2 * Math.PI);
                double[] rz = {Math.cos(phi), -Math.sin(phi), Math.cos(phi), Math.sin(phi)};
                ops.add(new GateOp(GateOp.DIAGONAL, new int[] {q}, NONE, rz, null));
            }
            ops.add(Frame.xOp(3 + layer));
            for (int q = 0; q + 1 < n; q++) {
                ops.add(new GateOp(GateOp.DIAGONAL, new int[] {q + 1}, new int[] {q},
                        new double[] {1, 0, -1, 0}, null));
            }
            for (int q = 0; q + 1 < n; q++) {
                ops.add(new GateOp(GateOp.MONOMIAL, new int[] {q + 1}, new int[] {q},
                        new double[] {1, 0, 1, 0}, new int[] {1, 0}));
            }
        }
        for (GateOp op : ops) {
            int d = 1 << op.targets.length;
            double[] m = new double[2 * d * d];
            for (int c = 0; c < d; c++) {
                int row = op.shape == GateOp.DIAGONAL ? c : op.perm[c];
                m[2 * (row * d + c)] = op.data[2 * c];
                m[2 * (row * d + c) + 1] = op.data[2 * c + 1];
            }
            expected = KernelsTest.reference(expected, n, op.targets, op.controls, m);
        }
        assertTrue(merged(ops, n, n) > 0, "the ladders merge");
        for (int threads : new int[] {1, 2}) {
            Amplitudes a = KernelsTest.load(in, n, n);
            Frame.apply(a, ops, threads);
            Frame.settle(a, threads);
            double[] got = KernelsTest.unload(a);
            for (int i = 0; i < got.length; i++) {
                assertEquals(expected[i], got[i], 1e-12, "element " + i + ", threads " + threads);
            }
        }
    }

    @Test
    void resultsAreTheSameBitsOnOneAndTwoThreads() {
        int n = 19;
        SplittableRandom r = new SplittableRandom(5);
        double[] in = KernelsTest.randomVector(n, r);
        List<GateOp> ops = randomRun(new int[] {1, 2, 4, 6, 7, 10, 13}, 40, g -> g % 4, r);
        double[][] got = new double[2][];
        for (int threads = 1; threads <= 2; threads++) {
            Amplitudes a = KernelsTest.load(in, n, 14);
            Frame.execute(a, ops, threads);
            got[threads - 1] = KernelsTest.unload(a);
        }
        assertTrue(merged(ops, n, 14) > 0, "the runs merge");
        assertArrayEquals(got[0], got[1]);
    }

    @Test
    void signRunsMultiplyExactly() {
        // Factors of 1 and -1 and pure permutations move and negate amplitudes without rounding,
        // so the merged pass gives exactly the bits of the gates one by one.
        int n = 19;
        SplittableRandom r = new SplittableRandom(11);
        double[] in = KernelsTest.randomVector(n, r);
        List<GateOp> ops = randomRun(new int[] {0, 2, 3, 5, 8, 9, 11, 12}, 30,
                g -> g % 2 == 0 ? 0 : 2, r);
        assertTrue(merged(ops, n, n) > 0, "the run merges");
        Amplitudes merged = KernelsTest.load(in, n, n);
        Frame.execute(merged, ops, 1);
        Amplitudes oneByOne = KernelsTest.load(in, n, n);
        for (GateOp op : ops) {
            op.plan(oneByOne).apply(1);
        }
        assertArrayEquals(KernelsTest.unload(oneByOne), KernelsTest.unload(merged));
    }

    @Test
    void onlyLongEnoughRunsInsideTheStorageMerge() {
        double[] cz = {1, 0, 1, 0, 1, 0, -1, 0};
        double[] h = {Math.sqrt(0.5), 0, Math.sqrt(0.5), 0, Math.sqrt(0.5), 0, -Math.sqrt(0.5), 0};
        GateOp cz01 = new GateOp(GateOp.DIAGONAL, new int[] {0, 1}, NONE, cz, null);
        GateOp cz12 = new GateOp(GateOp.DIAGONAL, new int[] {1, 2}, NONE, cz, null);
        GateOp cz23 = new GateOp(GateOp.DIAGONAL, new int[] {2, 3}, NONE, cz, null);
        GateOp h0 = new GateOp(GateOp.DENSE, new int[] {0}, NONE, h, null);
        int[] position = Windows.identity(8);
        // Two in a row: too short, the list itself comes back.
        List<GateOp> two = List.of(cz01, cz12, h0, cz23);
        assertSame(two, TableKernels.mergeRuns(two, position, 8, 20));
        // Three in a row merge into one gate on their four qubits; the dense gate stays.
        List<GateOp> three = TableKernels.mergeRuns(List.of(h0, cz01, cz12, cz23, h0),
                position, 8, 20);
        assertEquals(3, three.size());
        assertSame(h0, three.get(0));
        assertEquals(GateOp.TABLE, three.get(1).shape());
        assertArrayEquals(new int[] {0, 1, 2, 3}, three.get(1).targets());
        assertSame(h0, three.get(2));
        // A qubit without a position (outside a window) or at the limit breaks the run.
        List<GateOp> ladder = List.of(cz01, cz12, cz23);
        int[] outside = Windows.identity(8);
        outside[2] = -1;
        assertEquals(3, TableKernels.mergeRuns(ladder, outside, 8, 20).size());
        int[] high = {9, 10, 11, 12};
        assertEquals(3, TableKernels.mergeRuns(ladder, high, 12, 20).size());
        assertEquals(1, TableKernels.mergeRuns(ladder, high, 13, 20).size());
        // A table must serve 2^5 blocks: 13 bits of a 17-qubit state serve only 16.
        assertEquals(3, TableKernels.mergeRuns(ladder, high, 13, 17).size());
        assertEquals(1, TableKernels.mergeRuns(ladder, high, 13, 18).size());
        // Gates on other qubits than the run so far are stepped over and applied first; gates
        // stepped over at the end of the run stay after it.
        GateOp h3 = new GateOp(GateOp.DENSE, new int[] {3}, NONE, h, null);
        GateOp h2 = new GateOp(GateOp.DENSE, new int[] {2}, NONE, h, null);
        GateOp h5 = new GateOp(GateOp.DENSE, new int[] {5}, NONE, h, null);
        List<GateOp> stepped = TableKernels.mergeRuns(List.of(cz01, h3, h2, cz12, cz23, h5),
                position, 8, 20);
        assertEquals(List.of(h3, h2), stepped.subList(0, 2));
        assertEquals(GateOp.TABLE, stepped.get(2).shape());
        assertEquals(List.of(cz01, cz12, cz23), Arrays.asList(stepped.get(2).parts));
        assertSame(h5, stepped.get(3));
        assertEquals(4, stepped.size());
        // A gate on a qubit of the run ends it: h on qubit 1 after CZ(0, 1) leaves two runs of
        // fewer than three gates, so nothing merges.
        GateOp h1 = new GateOp(GateOp.DENSE, new int[] {1}, NONE, h, null);
        List<GateOp> blocked = List.of(cz01, h1, cz12, cz23);
        assertSame(blocked, TableKernels.mergeRuns(blocked, position, 8, 20));
    }
}
