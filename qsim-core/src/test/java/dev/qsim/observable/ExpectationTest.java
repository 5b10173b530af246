package dev.qsim.observable;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Operator;
import dev.qsim.StateVector;

class ExpectationTest {

    /** A seeded random circuit of rotations and CNOTs (test data only). */
    static StateVector randomState(int n, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        Circuit.Builder b = Circuit.builder(n);
        for (int layer = 0; layer < 3; layer++) {
            for (int q = 0; q < n; q++) {
                b.rx(q, 6 * rng.nextDouble()).rz(q, 6 * rng.nextDouble())
                        .ry(q, 6 * rng.nextDouble());
            }
            for (int q = 0; q + 1 < n; q++) {
                b.cnot(q, q + 1);
            }
        }
        return StateVector.zero(n).apply(b.build());
    }

    /** Random observable with every letter (test data only). */
    static Observable randomObservable(int n, int terms, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        Observable.Builder b = Observable.builder();
        for (int k = 0; k < terms; k++) {
            StringBuilder sb = new StringBuilder();
            for (int q = 0; q < n; q++) {
                sb.append("IXYZ".charAt(rng.nextInt(4)));
            }
            b.add(2 * rng.nextDouble() - 1, sb.toString());
        }
        return b.build();
    }

    /** <ψ|M|ψ> from the dense matrix and the amplitudes (definition). */
    static Complex dense(Operator m, StateVector s) {
        Complex sum = Complex.ZERO;
        for (int r = 0; r < m.dimension(); r++) {
            Complex row = Complex.ZERO;
            for (int c = 0; c < m.dimension(); c++) {
                row = row.add(m.get(r, c).multiply(s.amplitude(c)));
            }
            sum = sum.add(s.amplitude(r).conj().multiply(row));
        }
        return sum;
    }

    @Test
    void exactValueAndVarianceMatchTheDenseMatrix() {
        // Reference: <ψ|H|ψ> and <ψ|H²|ψ> - <ψ|H|ψ>² from the dense toOperator() matrix
        // (Nielsen and Chuang 2010, eqs. 2.110-2.111).
        for (long seed = 1; seed <= 10; seed++) {
            int n = 1 + (int) (seed % 5);
            StateVector s = randomState(n, seed);
            Observable h = randomObservable(n, 6, 100 + seed);
            Operator m = h.toOperator(n);
            double mean = dense(m, s).getReal();
            double square = dense(m.times(m), s).getReal();
            assertEquals(mean, Expectation.of(h, s), 1e-12, "seed " + seed);
            assertEquals(square - mean * mean, Expectation.variance(h, s), 1e-12, "seed " + seed);
            PauliProduct p = PauliProduct.parse("-i" + "XYZXY".substring(0, n));
            Complex z = Expectation.of(p, s);
            Complex ref = dense(Observable.of(1, p.withPhase(0)).toOperator(n), s)
                    .multiply(Complex.I.negate());
            assertEquals(ref.getReal(), z.getReal(), 1e-12, "seed " + seed);
            assertEquals(ref.getImaginary(), z.getImaginary(), 1e-12, "seed " + seed);
        }
    }

    @Test
    void sameBitsForEveryThreadCount() {
        // Design contract: same results whatever the thread count (fixed-block sums).
        StateVector s = randomState(15, 7);
        Observable h = randomObservable(15, 8, 8);
        double one = Expectation.of(h, s.copy().setThreads(1));
        double two = Expectation.of(h, s.copy().setThreads(2));
        double three = Expectation.of(h, s.copy().setThreads(3));
        assertEquals(Double.doubleToLongBits(one), Double.doubleToLongBits(two));
        assertEquals(Double.doubleToLongBits(one), Double.doubleToLongBits(three));
    }

    /** Lowest eigenvalue of a real symmetric matrix by EJML (reference library). */
    static double lowestEigenvalue(Operator m) {
        int d = m.dimension();
        DMatrixRMaj a = new DMatrixRMaj(d, d);
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                assertEquals(0, m.get(r, c).getImaginary(), 0, "the test matrix must be real");
                a.set(r, c, m.get(r, c).getReal());
            }
        }
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(d, false, true);
        assertTrue(eig.decompose(a));
        double min = Double.POSITIVE_INFINITY;
        for (int i = 0; i < d; i++) {
            min = Math.min(min, eig.getEigenvalue(i).getReal());
        }
        return min;
    }

    @Test
    void variationalMinimumReachesTheLowestEigenvalue() {
        // A real 2-qubit observable (invented test data); its ground state is real, and
        // ry·CNOT·(ry ⊗ ry) reaches every real 2-qubit state via the Schmidt form
        // (Nielsen and Chuang 2010, theorem 2.7). Reference: EJML's symmetric eigen solver.
        Observable h = Observable.of(0.5, "Z0").plus(-0.3, "Z1").plus(0.8, "X0 X1")
                .plus(0.2, "Z0 Z1").plus(0.4, "X0").plus(-0.25, "Z0 X1").plus(-0.6, "I");
        TunableCircuit family = TunableCircuit.builder(2).ry(0, "a").cnot(0, 1).ry(0, "b")
                .ry(1, "c").build();
        double[] theta = {0.1, 0.2, 0.3};
        double rate = 0.3;
        for (int it = 0; it < 3000; it++) {
            double[] g = Gradients.adjoint(family, theta, h);
            double norm = 0;
            for (int j = 0; j < theta.length; j++) {
                theta[j] -= rate * g[j];
                norm += g[j] * g[j];
            }
            if (norm < 1e-18) {
                break;
            }
        }
        double energy = Expectation.of(h, StateVector.zero(2).apply(family.bind(theta)));
        assertEquals(lowestEigenvalue(h.toOperator(2)), energy, 1e-6);
    }

    @Test
    void shotEstimatesFallWithinFourStandardErrors() {
        // Central limit theorem: the mean of N shots has standard error σ/√N (common practice);
        // |estimate - exact| > 4 SE has probability about 6e-5 per run.
        StateVector s = randomState(4, 3);
        Observable h = randomObservable(4, 7, 4).plus(0.75, "I");
        double exact = Expectation.of(h, s);
        for (long seed = 1; seed <= 20; seed++) {
            Estimate e = Expectation.sampled(h, s, 4000, seed);
            assertTrue(Math.abs(e.value() - exact) <= 4 * e.standardError(),
                    "seed " + seed + ": " + e + " vs exact " + exact);
            assertEquals(Expectation.groups(h).size(), e.settings());
        }
        assertEquals(Expectation.sampled(h, s, 100, 9).value(),
                Expectation.sampled(h, s, 100, 9).value(), 0, "same seed, same estimate");
    }

    @Test
    void standardErrorShrinksAsOneOverRootShots() {
        // SE = σ/√N (common practice): 16 times the shots gives a quarter of the error.
        StateVector s = randomState(3, 11);
        Observable h = randomObservable(3, 5, 12);
        double small = Expectation.sampled(h, s, 2_000, 5).standardError();
        double large = Expectation.sampled(h, s, 32_000, 6).standardError();
        assertEquals(0.25, large / small, 0.025);
        // One setting: the per-shot variance is Var(H) = <H²> - <H>² (Nielsen and Chuang 2010,
        // eq. 2.111), so SE ≈ sqrt(Var(H)/N); the sample variance is within a few % at N = 32000.
        Observable oneSetting = Observable.of(0.8, "Z0 Z2").plus(-0.4, "Z1").plus(0.3, "Z0");
        double expected = Math.sqrt(Expectation.variance(oneSetting, s) / 32_000);
        Estimate e = Expectation.sampled(oneSetting, s, 32_000, 7);
        assertEquals(1, e.settings());
        assertEquals(expected, e.standardError(), 0.05 * expected);
    }

    @Test
    void groupsCommuteQubitWiseAndCoverTheTerms() {
        Observable h = randomObservable(4, 20, 21).plus(3, "I");
        List<Observable> groups = Expectation.groups(h);
        int terms = 0;
        for (Observable g : groups) {
            for (int a = 0; a < g.size(); a++) {
                for (int b = 0; b < g.size(); b++) {
                    assertTrue(g.product(a).commutesQubitWise(g.product(b)), g::toString);
                }
            }
            terms += g.size();
        }
        int identities = 0;
        for (int k = 0; k < h.size(); k++) {
            identities += h.product(k).weight() == 0 ? 1 : 0;
        }
        assertEquals(h.size() - identities, terms);
        // Z0, Z1, Z0 Z1 share one setting; X0 needs another (qubit-wise rule).
        assertEquals(2, Expectation.groups(Observable.of(1, "Z0").plus(1, "Z1").plus(1, "Z0 Z1")
                .plus(1, "X0")).size());
    }

    @Test
    void observableOutsideTheStateIsRefused() {
        StateVector s = StateVector.zero(3);
        Observable h = Observable.of(1, "X5");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Expectation.of(h, s));
        assertTrue(e.getMessage().contains("qubit 5") && e.getMessage().contains("[0, 2]"),
                e::getMessage);
        e = assertThrows(IllegalArgumentException.class, () -> Expectation.sampled(h, s, 10, 1));
        assertTrue(e.getMessage().contains("qubit 5"), e::getMessage);
        e = assertThrows(IllegalArgumentException.class,
                () -> Expectation.sampled(Observable.of(1, "Z0"), s, 1, 1));
        assertTrue(e.getMessage().contains("1"), e::getMessage);
        e = assertThrows(IllegalArgumentException.class,
                () -> Expectation.of(PauliProduct.parse("Z3"), s));
        assertTrue(e.getMessage().contains("qubit 3"), e::getMessage);
    }
}
