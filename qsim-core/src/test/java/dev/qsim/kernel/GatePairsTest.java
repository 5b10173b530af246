package dev.qsim.kernel;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;

import org.junit.jupiter.api.Test;

/**
 * Two adjacent single-qubit gates with half the arithmetic run in one sweep
 * ({@link GatePairs}): the sweep must give the bits of the two gates' own passes, and a circuit
 * run through the planner must give the state the gates give one by one, checked against the
 * plain matrix-vector reference of {@link KernelsTest#reference} gate by gate (the definition of
 * a gate on a register: M. A. Nielsen and I. L. Chuang, "Quantum Computation and Quantum
 * Information", 2010, sec. 4.3). Tolerance 1e-12 absolute on O(1) amplitudes after 60 gates
 * (common practice). The pair counts of the cost model are worked by hand. Runs in both surefire
 * executions: without the vector loops nothing pairs, and the tests say so.
 */
class GatePairsTest {
    private static final int[] NONE = new int[0];
    private static final double H = Math.sqrt(0.5);

    /** A random real (kind 1) or RX-shaped (kind 2) 2x2 matrix, re/im interleaved. */
    private static double[] half(SplittableRandom r, boolean real) {
        double[] m = new double[8];
        for (int i = 0; i < 8; i++) {
            boolean used = real ? i % 2 == 0 : i == 0 || i == 3 || i == 5 || i == 6;
            m[i] = used ? r.nextDouble(-1, 1) : 0;
        }
        return m;
    }

    private static GateOp dense(int q, double[] m) {
        return new GateOp(GateOp.DENSE, new int[] {q}, NONE, m, null);
    }

    private static GateOp hadamard(int q) {
        return dense(q, new double[] {H, 0, H, 0, H, 0, -H, 0});
    }

    @Test
    void oneSweepGivesTheBitsOfTheTwoPasses() {
        LaneKernels k = Lanes.kernels();
        assumeTrue(k != null, "the vector loops are not loaded in this run");
        SplittableRandom r = new SplittableRandom(20_261_205L);
        int n = 8;
        int low = k.amplitudeLog();
        for (int q1 = low; q1 < n; q1++) {
            for (int q2 = low; q2 < n; q2++) {
                if (q1 == q2) {
                    continue;
                }
                for (int kinds = 0; kinds < 4; kinds++) {
                    double[] m1 = half(r, (kinds & 1) == 0);
                    double[] m2 = half(r, (kinds & 2) == 0);
                    int block = 4 << Math.max(q1, q2);
                    double[] psi = KernelsTest.randomVector(n, r);
                    // The whole array, and a range of whole blocks inside it.
                    int[][] ranges = {{0, psi.length}, {block, Math.min(psi.length, 2 * block)}};
                    for (int[] range : ranges) {
                        double[] twice = psi.clone();
                        double[] once = psi.clone();
                        k.blocks(twice, range[0], range[1], q1, m1, LaneKernels.kind(m1));
                        k.blocks(twice, range[0], range[1], q2, m2, LaneKernels.kind(m2));
                        k.pairBlocks(once, range[0], range[1], q1, m1, LaneKernels.kind(m1), q2,
                                m2, LaneKernels.kind(m2));
                        assertArrayEquals(twice, once, "targets " + q1 + ", " + q2 + ", kinds "
                                + LaneKernels.kind(m1) + "/" + LaneKernels.kind(m2));
                    }
                }
            }
        }
    }

    /**
     * Layers of random real and RX-shaped rotations with ladders of controlled phases and
     * CNOTs on 16 qubits (above the cache block, so the planner groups them into blocks and
     * windows), against the reference gate by gate, on one and two threads.
     */
    @Test
    void layeredCircuitMatchesTheReferenceOnAnyThreadCount() {
        int n = 16;
        SplittableRandom r = new SplittableRandom(7);
        List<GateOp> ops = new ArrayList<>();
        List<double[]> matrices = new ArrayList<>();
        for (int layer = 0; layer < 3; layer++) {
            for (int q = 0; q < n; q++) {
                double[] m = half(r, r.nextBoolean());
                ops.add(dense(q, m));
                matrices.add(m);
            }
            for (int q = 0; q + 1 < n; q += 3) {
                double[] cz = {1, 0, 1, 0, 1, 0, -1, 0};
                ops.add(new GateOp(GateOp.DIAGONAL, new int[] {q, q + 1}, NONE, cz, null));
                matrices.add(new double[] {1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 0,
                    0, 0, 0, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, -1, 0});
            }
        }
        double[] in = KernelsTest.randomVector(n, r);
        double[] expected = in;
        for (int i = 0; i < ops.size(); i++) {
            GateOp op = ops.get(i);
            expected = KernelsTest.reference(expected, n, op.targets, op.controls,
                    matrices.get(i));
        }
        double[][] got = new double[2][];
        for (int threads = 1; threads <= 2; threads++) {
            KernelsTest.assertExecutes(expected, in, n, n, false, ops, threads);
            Amplitudes a = KernelsTest.load(in, n, n);
            Frame.execute(a, ops, threads);
            got[threads - 1] = KernelsTest.unload(a);
        }
        assertArrayEquals(got[0], got[1], "one and two threads give the same bits");
        Workload w = Workload.of(n, false).gates(ops);
        if (Lanes.kernels() != null) {
            assertTrue(w.cached(Workload.DENSE1_HALF_PAIR) > 0, "the rotations were paired");
        } else {
            assertEquals(0, w.cached(Workload.DENSE1_HALF_PAIR), "the scalar loops never pair");
        }
    }

    /**
     * The pairs the cost model counts, worked by hand on a 16-qubit state (every qubit below
     * the cache block of 2^14, so each list is one cache-blocked group). H on 3, 5 and 7: one
     * pair and one gate alone. H on 3, CNOT 4 to 6, H on 5: the second H moves past the CNOT
     * (other qubits) to pair with the first. H on 3, CNOT 5 to 6, H on 5: it cannot (the CNOT
     * acts on 5), so no pair. A complex gate never pairs: H between two leaves H alone.
     */
    @Test
    void pairsAreCountedAsTheRunnerMakesThem() {
        boolean vector = Lanes.kernels() != null;
        GateOp cnot46 = new GateOp(GateOp.MONOMIAL, new int[] {6}, new int[] {4},
                new double[] {1, 0, 1, 0}, new int[] {1, 0});
        GateOp cnot56 = new GateOp(GateOp.MONOMIAL, new int[] {6}, new int[] {5},
                new double[] {1, 0, 1, 0}, new int[] {1, 0});
        double[] complex = {0.6, 0, 0, 0.8, 0, 0.8, 0.6, 0.1};
        Object[][] cases = {
            {List.of(hadamard(3), hadamard(5), hadamard(7)), 1, 1},
            {List.of(hadamard(3), cnot46, hadamard(5)), 1, 0},
            {List.of(hadamard(3), cnot56, hadamard(5)), 0, 2},
            {List.of(dense(3, complex), hadamard(5), dense(7, complex)), 0, 1},
        };
        for (Object[] c : cases) {
            @SuppressWarnings("unchecked")
            List<GateOp> ops = (List<GateOp>) c[0];
            int pairs = vector ? (Integer) c[1] : 0;
            int alone = vector ? (Integer) c[2] : (Integer) c[2] + 2 * (Integer) c[1];
            Workload w = Workload.of(16, false).gates(ops);
            assertEquals(pairs, w.cached(Workload.DENSE1_HALF_PAIR), "pairs of " + ops.size()
                    + " gates, case " + java.util.Arrays.asList(cases).indexOf(c));
            assertEquals(alone, w.cached(Workload.DENSE1_HALF), "half gates alone, case "
                    + java.util.Arrays.asList(cases).indexOf(c));
        }
    }

    @Test
    void pairingNeedsTheVectorLoopsDistinctTargetsAndHalfMatrices() {
        LaneKernels k = new ScalarLoops();
        int low = k.amplitudeLog();
        GateOp a = hadamard(low);
        GateOp b = hadamard(low + 1);
        assertTrue(GatePairs.pairable(k, 10, a, low, b, low + 1));
        assertFalse(GatePairs.pairable(null, 10, a, low, b, low + 1), "scalar loops");
        assertFalse(GatePairs.pairable(k, 10, a, low, hadamard(low), low), "one target");
        assertFalse(GatePairs.pairable(k, 10, a, low - 1, b, low + 1), "inside a vector");
        assertFalse(GatePairs.pairable(k, low + 1, a, low, b, low + 1), "beyond the chunk");
        GateOp controlled = new GateOp(GateOp.DENSE, new int[] {low + 1}, new int[] {0},
                b.data, null);
        assertFalse(GatePairs.pairable(k, 10, a, low, controlled, low + 1), "controls");
        assertFalse(GatePairs.pairable(k, 10, a, low, dense(low + 1,
                new double[] {0.6, 0, 0, 0.8, 0, 0.8, 0.6, 0.1}), low + 1), "complex");
    }
}
