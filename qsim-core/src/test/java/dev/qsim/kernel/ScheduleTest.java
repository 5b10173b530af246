package dev.qsim.kernel;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The planner's grouping ({@link Windows#schedule}): gates pulled ahead into a cache block or a
 * gathered window must give the state that the gates in list order give. Checked against the
 * plain matrix-vector reference of {@link KernelsTest#reference} applied gate by gate (the
 * definition of a gate on a register: M. A. Nielsen and I. L. Chuang, "Quantum Computation and
 * Quantum Information", 2010, sec. 4.3; reordering is exact only for gates on disjoint qubits,
 * sec. 2.1.7). Tolerance 1e-12 absolute on O(1) amplitudes after 60 gates (common practice).
 */
class ScheduleTest {

    /** A random gate of each shape, with 0 to 2 controls, on qubits drawn from all of n. */
    private static GateOp randomOp(int n, SplittableRandom r, int g, double[][] dense) {
        int k = 1 + r.nextInt(3);
        int nc = r.nextInt(3);
        int[] qs = KernelsTest.pickDistinct(n, k + nc, r);
        int[] targets = Arrays.copyOf(qs, k);
        int[] controls = Arrays.copyOfRange(qs, k, k + nc);
        int d = 1 << k;
        double[] m = new double[2 * d * d];
        switch (g % 4) {
            case 0: {
                for (int i = 0; i < m.length; i++) {
                    m[i] = r.nextDouble(-1, 1) / d;
                }
                dense[0] = m;
                return new GateOp(GateOp.DENSE, targets, controls, m.clone(), null);
            }
            case 1: {
                double[] diag = new double[2 * d];
                for (int j = 0; j < d; j++) {
                    double phi = r.nextDouble(0, 2 * Math.PI);
                    diag[2 * j] = Math.cos(phi);
                    diag[2 * j + 1] = Math.sin(phi);
                    m[2 * (j * d + j)] = diag[2 * j];
                    m[2 * (j * d + j) + 1] = diag[2 * j + 1];
                }
                dense[0] = m;
                return new GateOp(GateOp.DIAGONAL, targets, controls, diag, null);
            }
            default: {
                // Monomial: a pure permutation (case 2, as SWAP or a Toffoli) or with phases.
                return KernelsTest.randomMonomial(targets, controls, g % 4 != 2, r, dense);
            }
        }
    }

    @ParameterizedTest(name = "n={0} chunkLog={1} threads={2} single={3}")
    @CsvSource({"16, 16, 1, false", "17, 12, 2, false", "18, 18, 2, false", "17, 12, 1, true",
        "16, 16, 2, true"})
    void groupedGatesEqualGatesInOrder(int n, int chunkLog, int threads, boolean single) {
        SplittableRandom r = new SplittableRandom(4099L * n + chunkLog);
        double[] in = KernelsTest.randomVector(n, r);
        double[] expected = single ? KernelsTest.rounded(in) : in.clone();
        List<GateOp> ops = new ArrayList<>();
        double[][] dense = new double[1][];
        for (int g = 0; g < 60; g++) {
            GateOp op = randomOp(n, r, g, dense);
            ops.add(op);
            expected = KernelsTest.reference(expected, n, op.targets, op.controls, dense[0]);
        }
        KernelsTest.assertExecutes(expected, in, n, chunkLog, single, ops, threads);
    }

    @Test
    void layeredGatesGoIntoFewWindows() {
        // 18 qubits, cache block 2^14: five layers of one-qubit gates on every qubit and a
        // CZ-like diagonal ladder, 5 * (18 + 17) = 175 gates. In list order a gate on qubits
        // 14-17 would need a pass of its own; pulled ahead, each layer needs a few groups.
        int n = 18;
        SplittableRandom r = new SplittableRandom(7);
        List<GateOp> ops = new ArrayList<>();
        double[] h = {Math.sqrt(0.5), 0, Math.sqrt(0.5), 0, Math.sqrt(0.5), 0, -Math.sqrt(0.5), 0};
        double[] cz = {1, 0, 1, 0, 1, 0, -1, 0};
        for (int layer = 0; layer < 5; layer++) {
            for (int q = 0; q < n; q++) {
                ops.add(new GateOp(GateOp.DENSE, new int[] {q}, new int[0], h, null));
            }
            for (int q = 0; q + 1 < n; q++) {
                ops.add(new GateOp(GateOp.DIAGONAL, new int[] {q, q + 1}, new int[0], cz, null));
            }
        }
        int[] passes = new int[1];
        List<GateOp> seen = new ArrayList<>();
        Amplitudes a = Amplitudes.allocate(n, n);
        Windows.schedule(a, ops, new Frame.Passes() {
            @Override
            public void single(GateOp op, Plan plan) {
                passes[0]++;
                seen.add(op);
            }

            @Override
            public void blocked(List<GateOp> group, Plan[] plans, int blockLog) {
                passes[0]++;
                addParts(seen, group);
            }

            @Override
            public void window(List<GateOp> group, long mask, int low) {
                passes[0]++;
                addParts(seen, group);
            }

            @Override
            public void floatSingle(GateOp op, double[] m2) {
                throw new AssertionError("double storage");
            }

            @Override
            public void chunkMove(GateOp op) {
                passes[0]++;
                seen.add(op);
            }

            @Override
            public void phases(double[] p) {
                throw new AssertionError("no frame here");
            }
        });
        assertEquals(ops.size(), seen.size(), "every gate handed over once");
        assertTrue(seen.containsAll(ops), "the same gates");
        assertTrue(passes[0] <= 3 * 5, "at most three passes a layer, but " + passes[0]);
    }

    /** The gates of a group, merged runs ({@link GateOp#TABLE}) taken apart. */
    private static void addParts(List<GateOp> seen, List<GateOp> group) {
        for (GateOp op : group) {
            if (op.shape == GateOp.TABLE) {
                seen.addAll(Arrays.asList(op.parts));
            } else {
                seen.add(op);
            }
        }
    }

    @Test
    void swapSequenceRealisesThePermutation() {
        // A cycle of length m is m - 1 transpositions (common practice): 0 -> 2 -> 3 -> 0 with 1
        // fixed takes two exchanges; applying them to the identity arrangement gives perm.
        int[] perm = {2, 1, 3, 0};
        int[] swaps = PermutationKernels.swapSequence(perm);
        assertEquals(4, swaps.length);
        String[] at = {"a", "b", "c", "d"};
        for (int p = 0; p < swaps.length; p += 2) {
            String t = at[swaps[p]];
            at[swaps[p]] = at[swaps[p + 1]];
            at[swaps[p + 1]] = t;
        }
        // Column j's content moves to row perm[j]: a (0) to 2, c (2) to 3, d (3) to 0.
        assertArrayEquals(new String[] {"d", "b", "a", "c"}, at);
        assertEquals(0, PermutationKernels.swapSequence(new int[] {0, 1}).length, "identity");
    }
}
