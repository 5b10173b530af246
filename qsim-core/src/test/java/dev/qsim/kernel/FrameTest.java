package dev.qsim.kernel;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The lazy frame ({@link Frame}) against the definition of each gate: random sequences of X,
 * single-qubit phases (taken into the frame) and dense, diagonal and monomial gates with and
 * without controls (conjugated by it) are compared, after {@link Frame#settle}, with the same
 * gates applied one after another by {@link KernelsTest#reference}, the sum over basis states
 * of a controlled k-qubit operator (Nielsen and Chuang 2010, §4.3). Small chunk sizes put flips
 * and phases on chunk-level qubits. Tolerance 1e-12 for double storage (a few hundred rounding
 * errors on O(1) amplitudes, common practice), 1e-5 for single storage (the bound).
 */
class FrameTest {

    /** One random gate and its full matrix (for the reference). */
    private static final class Gate {
        final GateOp op;
        final double[] matrix;

        Gate(GateOp op, double[] matrix) {
            this.op = op;
            this.matrix = matrix;
        }
    }

    private static double[] unitPhase(SplittableRandom r) {
        double a = r.nextDouble(-Math.PI, Math.PI);
        return new double[] {Math.cos(a), Math.sin(a)};
    }

    /** A random gate: a third of them frame gates (X, Y-like monomials, unit diagonals). */
    private static Gate randomGate(int n, SplittableRandom r) {
        int kind = r.nextInt(9);
        int k = kind < 3 ? 1 : 1 + r.nextInt(Math.min(3, n));
        int nc = kind < 3 ? 0 : r.nextInt(Math.min(2, n - k) + 1);
        int[] qs = KernelsTest.pickDistinct(n, k + nc, r);
        int[] targets = java.util.Arrays.copyOf(qs, k);
        int[] controls = java.util.Arrays.copyOfRange(qs, k, k + nc);
        int d = 1 << k;
        double[] m = new double[2 * d * d];
        switch (kind) {
            case 0: { // X
                m[2 * 1] = 1;
                m[2 * 2] = 1;
                return new Gate(new GateOp(GateOp.MONOMIAL, targets, controls,
                        new double[] {1, 0, 1, 0}, new int[] {1, 0}), m);
            }
            case 1: { // X times unit phases (Y is one of them)
                double[] p0 = unitPhase(r);
                double[] p1 = unitPhase(r);
                m[2 * 2] = p0[0];
                m[2 * 2 + 1] = p0[1];
                m[2 * 1] = p1[0];
                m[2 * 1 + 1] = p1[1];
                return new Gate(new GateOp(GateOp.MONOMIAL, targets, controls,
                        new double[] {p0[0], p0[1], p1[0], p1[1]}, new int[] {1, 0}), m);
            }
            case 2:
            case 3:
            case 4: { // unit diagonal (one qubit without controls: a frame gate)
                double[] diag = new double[2 * d];
                for (int j = 0; j < d; j++) {
                    double[] p = r.nextInt(4) == 0 ? new double[] {1, 0} : unitPhase(r);
                    diag[2 * j] = p[0];
                    diag[2 * j + 1] = p[1];
                    m[2 * (j * d + j)] = p[0];
                    m[2 * (j * d + j) + 1] = p[1];
                }
                return new Gate(new GateOp(GateOp.DIAGONAL, targets, controls, diag, null), m);
            }
            case 5:
            case 6: { // monomial: a permutation, pure or with phases
                int[] perm = KernelsTest.pickDistinct(d, d, r);
                boolean pure = r.nextBoolean();
                double[] ph = new double[2 * d];
                for (int c = 0; c < d; c++) {
                    double[] p = pure ? new double[] {1, 0} : unitPhase(r);
                    ph[2 * c] = p[0];
                    ph[2 * c + 1] = p[1];
                    m[2 * (perm[c] * d + c)] = p[0];
                    m[2 * (perm[c] * d + c) + 1] = p[1];
                }
                return new Gate(new GateOp(GateOp.MONOMIAL, targets, controls, ph, perm), m);
            }
            default: { // dense, any matrix (conjugation by a unitary frame needs no unitarity)
                for (int i = 0; i < m.length; i++) {
                    m[i] = r.nextDouble(-1, 1) / Math.sqrt(d);
                }
                return new Gate(new GateOp(GateOp.DENSE, targets, controls, m, null), m);
            }
        }
    }

    @ParameterizedTest(name = "n={0} chunkLog={1} single={2} threads={3}")
    @CsvSource({
        "5, 5, false, 1", "6, 2, false, 1", "6, 0, false, 1", "7, 3, true, 1", "6, 1, true, 1",
        "16, 6, false, 2", "16, 13, true, 2", "17, 15, false, 2"
    })
    void framedSequencesMatchTheReference(int n, int chunkLog, boolean single, int threads) {
        long seed = 97L * n + 13L * chunkLog + (single ? 5 : 0);
        SplittableRandom r = new SplittableRandom(seed);
        int trials = n > 8 ? 2 : 12;
        int gates = n > 8 ? 25 : 40;
        double tol = single ? 1e-5 : 1e-12;
        for (int trial = 0; trial < trials; trial++) {
            double[] v = KernelsTest.randomVector(n, r);
            double norm = 0;
            for (double x : v) {
                norm += x * x;
            }
            for (int i = 0; i < v.length; i++) {
                v[i] /= Math.sqrt(norm);
            }
            Amplitudes a = single ? Amplitudes.allocateSingle(n, chunkLog)
                    : Amplitudes.allocate(n, chunkLog);
            for (int i = 0; i < (1 << n); i++) {
                a.set(i, v[2 * i], v[2 * i + 1]);
            }
            double[] expected = single ? KernelsTest.unload(a) : v;
            boolean sawFrame = false;
            // Gates in runs of random length, so frames carry across calls.
            int done = 0;
            while (done < gates) {
                int run = 1 + r.nextInt(6);
                List<GateOp> ops = new ArrayList<>();
                for (int g = 0; g < run; g++) {
                    Gate gate = randomGate(n, r);
                    ops.add(gate.op);
                    expected = KernelsTest.reference(expected, n, gate.op.targets,
                            gate.op.controls, gate.matrix);
                }
                Frame.apply(a, ops, threads);
                sawFrame |= a.framed();
                done += run;
            }
            assertTrue(sawFrame, "seed " + seed + ": the sequence never left a frame pending");
            Frame.settle(a, threads);
            assertFalse(a.framed());
            assertArrayEquals(expected, KernelsTest.unload(a), tol,
                    "seed " + seed + " trial " + trial);
        }
    }

    /**
     * A frame gate costs no pass: X and a phase leave the amplitudes untouched until settled,
     * then equal their definitions (X|0> = |1>, diag(1, e^{ia})|1> = e^{ia}|1>; common
     * practice). Copies carry the frame; clearing drops it.
     */
    @Test
    void frameGatesWaitUntilSettled() {
        Amplitudes a = Amplitudes.allocate(3);
        a.set(0, 1, 0);
        double c = Math.cos(0.7);
        double s = Math.sin(0.7);
        Frame.apply(a, List.of(Frame.xOp(2),
                new GateOp(GateOp.DIAGONAL, new int[] {2}, new int[0],
                        new double[] {1, 0, c, s}, null)), 1);
        assertTrue(a.framed());
        assertTrue(Frame.flipped(a, 2));
        assertEquals(1.0, a.chunks[0][0], 0.0, "stored amplitudes are not touched by frame gates");
        Amplitudes copy = a.copy();
        Frame.settle(a, 1);
        assertEquals(0.0, a.re(0), 0.0);
        assertEquals(c, a.re(4), 1e-15);
        assertEquals(s, a.im(4), 1e-15);
        Frame.settle(copy, 1);
        assertArrayEquals(KernelsTest.unload(a), KernelsTest.unload(copy), 0.0);
        copy.clear();
        assertFalse(copy.framed());
    }

    /**
     * A non-unitary diagonal (a measurement's projection) is never taken into the frame, where
     * it would change probabilities; it is applied to the amplitudes.
     */
    @Test
    void projectionsAreNotFrameGates() {
        Amplitudes a = Amplitudes.allocate(2);
        a.set(0, Math.sqrt(0.5), 0);
        a.set(1, Math.sqrt(0.5), 0);
        Frame.apply(a, List.of(new GateOp(GateOp.DIAGONAL, new int[] {0}, new int[0],
                new double[] {0, 0, Math.sqrt(2), 0}, null)), 1);
        assertFalse(a.framed());
        assertEquals(0.0, a.re(0), 0.0);
        assertEquals(1.0, a.re(1), 1e-15);
    }
}
