package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

import dev.qsim.mps.MatrixProductState;

/**
 * The matrix product state against {@link DenseReference}, the independent dense model built
 * from the textbook 2x2 matrices (Nielsen and Chuang 2010, §4.2-4.3) by Kronecker products and
 * projector sums, on random circuits of every builder gate at random, non-adjacent qubits
 * (so swaps route them, and three-qubit and doubly controlled gates are contracted as blocks);
 * and against the state vector on random circuits of up to 20 qubits. With the bond limit above
 * what the circuits need and no threshold the engine drops only numerically zero Schmidt values,
 * so amplitudes agree to 1e-10 (the tolerance the issue sets; each of a few hundred splits adds
 * errors of about 1e-15).
 */
class MatrixProductReferenceTest {
    private static final double TOL = 1e-10;

    static List<String> kinds() {
        return DenseReference.KINDS;
    }

    private static double distance(double[][] expected, MatrixProductState s) {
        double worst = 0;
        for (int i = 0; i < expected[0].length; i++) {
            Complex a = s.amplitude(i);
            worst = Math.max(worst, Math.hypot(a.getReal() - expected[0][i],
                    a.getImaginary() - expected[1][i]));
        }
        return worst;
    }

    /** Each builder gate alone at random placements on 6 qubits, after a random product layer. */
    @ParameterizedTest
    @MethodSource("kinds")
    void eachGateMatchesTheReference(String kind) {
        final long seed = 0x3a11_0002L + kind.hashCode();
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int n = 6;
        for (int trial = 0; trial < 12; trial++) {
            // an entangled start: a random circuit of 12 gates, then the gate under test
            List<DenseReference.Step> steps = new java.util.ArrayList<>(
                    DenseReference.randomSteps(n, 12, rng));
            steps.add(DenseReference.randomStep(kind, n, rng));
            double[][] expected = DenseReference.basisState(1 << n, 0);
            for (DenseReference.Step st : steps) {
                expected = DenseReference.apply(st.matrix(n), expected);
            }
            MatrixProductState mps = MatrixProductState.zero(n, 64, 0)
                    .apply(DenseReference.build(n, steps));
            double d = distance(expected, mps);
            final int t = trial;
            assertTrue(d <= TOL, () -> "seed " + seed + ", trial " + t + ", "
                    + steps.get(steps.size() - 1).describe() + ": distance " + d);
        }
    }

    @Test
    void randomCircuitsMatchTheReference() {
        final long seed = 20_261_205L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        for (int trial = 0; trial < 30; trial++) {
            int n = 1 + trial % 8;
            List<DenseReference.Step> steps = DenseReference.randomSteps(n,
                    10 + rng.nextInt(50), rng);
            double[][] expected = DenseReference.basisState(1 << n, 0);
            for (DenseReference.Step st : steps) {
                expected = DenseReference.apply(st.matrix(n), expected);
            }
            MatrixProductState mps = MatrixProductState.zero(n, 64, 0)
                    .apply(DenseReference.build(n, steps));
            double d = distance(expected, mps);
            final int t = trial;
            assertTrue(d <= TOL, () -> "seed " + seed + ", trial " + t + ": distance " + d);
            // no truncation was needed: at most 2^(n/2) values across the middle bond
            assertEquals(0, mps.truncations(), "trial " + t);
            assertEquals(1.0, mps.fidelityLowerBound(), 1e-12);
        }
    }

    /**
     * Random circuits of 12 to 20 qubits against the state vector: nearest-neighbour and
     * distant two-qubit gates and random rotations, shallow enough that the bonds stay below
     * 128. The state vector's amplitudes are themselves checked against the dense reference in
     * {@code DenseReferenceTest}.
     */
    @Test
    void randomCircuitsUpToTwentyQubitsMatchTheStateVector() {
        final long seed = 77_001L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        for (int n : new int[] {12, 16, 20}) {
            Circuit.Builder b = Circuit.builder(n);
            for (int layer = 0; layer < 5; layer++) {
                for (int q = 0; q < n; q++) {
                    b.u(q, DenseReference.randomAngle(rng), DenseReference.randomAngle(rng),
                            DenseReference.randomAngle(rng));
                }
                for (int q = layer % 2; q + 1 < n; q += 2) {
                    b.cnot(q, q + 1);
                }
                int a = rng.nextInt(n);
                int c = rng.nextInt(n);
                if (a != c) {
                    b.cphase(a, c, DenseReference.randomAngle(rng));
                }
            }
            Circuit circuit = b.build();
            StateVector sv = StateVector.zero(n).apply(circuit);
            MatrixProductState mps = MatrixProductState.zero(n, 512, 0).apply(circuit);
            assertEquals(0, mps.truncations(), "n = " + n);
            double worst = 0;
            for (int i = 0; i < 64; i++) {
                long index = rng.nextLong() & ((1L << n) - 1);
                Complex x = sv.amplitude(index);
                Complex y = mps.amplitude(index);
                worst = Math.max(worst, Math.hypot(x.getReal() - y.getReal(),
                        x.getImaginary() - y.getImaginary()));
            }
            assertTrue(worst <= TOL, "n = " + n + ": distance " + worst);
            assertEquals(1.0, mps.toStateVector().fidelity(sv), 1e-10, "n = " + n);
        }
    }
}
