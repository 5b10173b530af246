package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.List;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Compares the state-vector engine and {@link Circuit#toOperator()} with {@link DenseReference},
 * an independent dense-matrix model built from textbook 2x2 matrices (Nielsen &amp; Chuang 2010,
 * sec. 4.2) by Kronecker products and projector sums. Per-amplitude tolerance 1e-12: a few
 * dozen gates each add rounding of order 1e-16 per amplitude, far below it (common practice).
 */
class DenseReferenceTest {

    /** Tolerance per amplitude or matrix entry, see the class comment. */
    private static final double TOL = 1e-12;

    static List<String> kinds() {
        return DenseReference.KINDS;
    }

    /** Each builder gate alone, at random placements on 5 qubits, from a random state. */
    @ParameterizedTest
    @MethodSource("kinds")
    void eachGateMatchesTheReference(String kind) {
        final long seed = 0x5eed_0001L + kind.hashCode();
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int n = 5;
        for (int trial = 0; trial < 20; trial++) {
            DenseReference.Step step = DenseReference.randomStep(kind, n, rng);
            double[][] start = DenseReference.randomState(1 << n, rng);
            // Expected: the full reference matrix of the gate times the start vector.
            double[][] expected = DenseReference.apply(step.matrix(n), start);
            StateVector actual = DenseReference.toState(start).apply(DenseReference.build(n,
                    List.of(step)));
            final int t = trial;
            DenseReference.assertClose(expected, actual, TOL,
                () -> "seed " + seed + ", trial " + t + ", " + step.describe());
        }
    }

    /** Random circuits on 1..8 qubits mixing every builder gate, run from |0...0>. */
    @Test
    void randomCircuitsFromZeroMatchTheReference() {
        final long seed = 20_240_611L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        for (int trial = 0; trial < 40; trial++) {
            int n = 1 + trial % 8;
            int gates = 10 + rng.nextInt(40);
            List<DenseReference.Step> steps = DenseReference.randomSteps(n, gates, rng);
            Circuit circuit = DenseReference.build(n, steps);
            // Expected: the reference matrices applied in turn to |0...0>.
            double[][] expected = DenseReference.run(n, steps,
                    DenseReference.basisState(1 << n, 0));
            StateVector actual = StateVector.zero(n).apply(circuit);
            final int t = trial;
            DenseReference.assertClose(expected, actual, TOL,
                () -> "seed " + seed + ", trial " + t + ", " + n + " qubits, circuit "
                        + describe(steps));
        }
    }

    /** Random circuits on 8 qubits, from random start states. */
    @Test
    void randomCircuitsFromRandomStatesMatchTheReference() {
        final long seed = 77_001L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int n = 8;
        for (int trial = 0; trial < 6; trial++) {
            List<DenseReference.Step> steps = DenseReference.randomSteps(n, 40, rng);
            double[][] start = DenseReference.randomState(1 << n, rng);
            double[][] expected = DenseReference.run(n, steps, start);
            StateVector actual = DenseReference.toState(start)
                    .apply(DenseReference.build(n, steps));
            final int t = trial;
            DenseReference.assertClose(expected, actual, TOL,
                () -> "seed " + seed + ", trial " + t + ", circuit " + describe(steps));
        }
    }

    /** Circuit.toOperator() against the product of the reference matrices, 1..6 qubits. */
    @Test
    void toOperatorMatchesTheReferenceProduct() {
        final long seed = 31_337L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        for (int trial = 0; trial < 24; trial++) {
            int n = 1 + trial % 6;
            List<DenseReference.Step> steps = DenseReference.randomSteps(n, 5 + rng.nextInt(25),
                    rng);
            // Expected: U = M_last ... M_2 M_1 (N&C 2010 sec. 4.2: a circuit is the product of
            // its gates, later gates on the left).
            DenseReference.Matrix expected = DenseReference.product(n, steps);
            Operator actual = DenseReference.build(n, steps).toOperator();
            final int t = trial;
            DenseReference.assertClose(expected, actual, TOL,
                () -> "seed " + seed + ", trial " + t + ", " + n + " qubits, circuit "
                        + describe(steps));
        }
    }

    /** Applying the circuit's operator to a state equals running the circuit on it. */
    @Test
    void toOperatorAppliedEqualsCircuitApplied() {
        final long seed = 4_242L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        for (int trial = 0; trial < 10; trial++) {
            int n = 2 + trial % 4;
            List<DenseReference.Step> steps = DenseReference.randomSteps(n, 20, rng);
            Circuit circuit = DenseReference.build(n, steps);
            double[][] start = DenseReference.randomState(1 << n, rng);
            int[] all = new int[n];
            for (int q = 0; q < n; q++) {
                all[q] = q;
            }
            // Expected: the reference run of the same steps.
            double[][] expected = DenseReference.run(n, steps, start);
            StateVector viaOperator = DenseReference.toState(start)
                    .apply(circuit.toOperator(), all);
            final int t = trial;
            DenseReference.assertClose(expected, viaOperator, TOL,
                () -> "seed " + seed + ", trial " + t + ", circuit " + describe(steps));
        }
    }

    /**
     * States of 22 qubits, past the engine's parallel threshold and its 2^10-amplitude kernel
     * blocks (chunk crossings are checked with small chunks in kernel.KernelsTest): random
     * circuits act on 6 of the qubits (some of them the highest, 20 and 21) and leave the rest
     * |0>, so the state is the 6-qubit reference state placed on those
     * qubits, with zeros elsewhere (the tensor product with |0...0>, N&C 2010 sec. 2.1.7).
     */
    @Test
    void largeStatesMatchTheReferenceOnTheQubitsUsed() {
        final long seed = 2_718_281L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int physical = 22;
        int[][] maps = {{21, 0, 20, 9, 1, 15}, {20, 21, 3, 19, 18, 0}, {5, 21, 11, 20, 2, 17}};
        for (int[] map : maps) {
            int n = map.length;
            List<DenseReference.Step> steps = DenseReference.randomSteps(n, 30, rng);
            double[][] expected = DenseReference.run(n, steps,
                    DenseReference.basisState(1 << n, 0));
            StateVector actual = StateVector.zero(physical)
                    .apply(DenseReference.build(physical, steps, map));
            double worst = 0;
            for (int v = 0; v < (1 << n); v++) {
                long index = 0;
                for (int j = 0; j < n; j++) {
                    index |= (long) ((v >> j) & 1) << map[j];
                }
                Complex a = actual.amplitude(index);
                worst = Math.max(worst, Math.hypot(a.getReal() - expected[0][v],
                        a.getImaginary() - expected[1][v]));
            }
            String what = "seed " + seed + ", qubits " + Arrays.toString(map) + ", circuit "
                    + describe(steps);
            assertTrue(worst <= TOL, what + ": max amplitude distance " + worst);
            // The reference amplitudes have norm 1, so a norm of 1 leaves nothing elsewhere.
            assertEquals(1.0, actual.norm(), TOL, what + ": norm");
        }
    }

    private static String describe(List<DenseReference.Step> steps) {
        StringBuilder sb = new StringBuilder();
        for (DenseReference.Step s : steps) {
            if (sb.length() > 0) {
                sb.append("; ");
            }
            sb.append(s.describe());
        }
        return sb.toString();
    }
}
