package dev.qsim.noise;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Gates;
import dev.qsim.Simulator;
import dev.qsim.StateVector;
import dev.qsim.Tally;
import dev.qsim.internal.Heap;
import dev.qsim.observable.Expectation;
import dev.qsim.observable.Observable;

class DensityMatrixTest {
    private static final double TOL = 1e-12;

    @Test
    void unitaryEvolutionMatchesTheStateVector() {
        // rho = |psi><psi| evolves to U rho U^dagger (Nielsen and Chuang 2010, §2.4.1), so
        // every entry must equal psi_r conj(psi_c) of the state-vector engine.
        for (long seed = 1; seed <= 4; seed++) {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
            int n = 2 + (int) seed;
            Circuit c = NoiseFixtures.randomGates(Circuit.builder(n), n, 40, rng).build();
            StateVector psi = StateVector.zero(n).apply(c);
            DensityMatrix rho = DensityMatrix.zero(n).setThreads(1 + (int) (seed % 2)).apply(c);
            for (int r = 0; r < 1 << n; r++) {
                for (int col = 0; col < 1 << n; col++) {
                    Complex want = psi.amplitude(r).multiply(psi.amplitude(col).conj());
                    Complex got = rho.get(r, col);
                    assertEquals(want.getReal(), got.getReal(), TOL, "seed " + seed);
                    assertEquals(want.getImaginary(), got.getImaginary(), TOL, "seed " + seed);
                }
            }
            assertEquals(1, rho.purity(), TOL, "seed " + seed);
            assertEquals(1, rho.trace(), TOL, "seed " + seed);
            assertEquals(1, rho.fidelity(psi), TOL, "seed " + seed);
            double[] p = psi.probabilities();
            double[] q = rho.probabilities();
            for (int i = 0; i < p.length; i++) {
                assertEquals(p[i], q[i], TOL, "seed " + seed);
            }
            // Fidelity with an orthogonal pure state is |<phi|psi>|^2 (Nielsen and Chuang 2010,
            // §9.2.2).
            StateVector phi = StateVector.basis(n, 3);
            assertEquals(psi.probability(3), rho.fidelity(phi), TOL, "seed " + seed);
        }
    }

    @Test
    void noisyStatesStayHermitianNormalisedAndPositive() {
        // A CPTP map sends density matrices to density matrices (Nielsen and Chuang 2010,
        // §8.2.4): Hermitian, trace 1, positive semidefinite (smallest eigenvalue from EJML).
        for (long seed = 11; seed <= 16; seed++) {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
            int n = 3 + (int) (seed % 3);
            Circuit c = NoiseFixtures.randomGates(Circuit.builder(n), n, 30, rng).build();
            DensityMatrix rho = Simulator.seeded(seed).withThreads(2)
                    .withNoise(NoiseFixtures.richModel()).densityMatrixAfter(c);
            Complex[][] m = rho.toArray();
            for (int r = 0; r < m.length; r++) {
                for (int col = 0; col < m.length; col++) {
                    assertEquals(m[r][col].getReal(), m[col][r].getReal(), TOL, "seed " + seed);
                    assertEquals(m[r][col].getImaginary(), -m[col][r].getImaginary(), TOL,
                            "seed " + seed);
                }
            }
            assertEquals(1, rho.trace(), TOL, "seed " + seed);
            assertTrue(NoiseFixtures.smallestEigenvalue(m) >= -TOL, "seed " + seed);
            assertTrue(rho.purity() < 1 - 1e-3, "noise must mix the state, seed " + seed);
        }
    }

    @Test
    void reducedMatricesAreThePartialTraces() {
        // Nielsen and Chuang (2010), §2.4.3: each qubit of a Bell pair is I/2.
        DensityMatrix bell = DensityMatrix.of(StateVector.zero(3).apply(Gates.H, 0)
                .apply(Gates.CNOT, 0, 2).apply(Gates.ry(0.9), 1));
        DensityMatrix one = bell.reduced(2);
        assertEquals(0.5, one.get(0, 0).getReal(), TOL);
        assertEquals(0.5, one.get(1, 1).getReal(), TOL);
        assertEquals(0, one.get(0, 1).abs(), TOL);
        // A factor of a product state is that factor: ry(0.9)|0> on qubit 1.
        StateVector factor = StateVector.zero(1).apply(Gates.ry(0.9), 0);
        assertEquals(1, bell.reduced(1).fidelity(factor), TOL);
        // Keeping (2, 0) in that order: the index bit 0 is qubit 2; the pair is still |00>+|11>.
        DensityMatrix pair = bell.reduced(2, 0);
        assertEquals(0.5, pair.get(3, 0).getReal(), TOL);
        assertEquals(1, pair.purity(), TOL);
        // Purity of the completely mixed state is 2^-n (Nielsen and Chuang 2010, Ex. 2.71).
        DensityMatrix mixed = DensityMatrix.zero(3);
        for (int q = 0; q < 3; q++) {
            mixed.apply(Channel.depolarizing(0.75), q);
        }
        assertEquals(0.125, mixed.purity(), TOL);
    }

    @Test
    void expectationIsTheTraceWithTheObservable() {
        // For a pure state Tr(rho H) = <psi|H|psi> (Nielsen and Chuang 2010, §2.4.1); the right
        // side is computed with the dense operator on the state vector.
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(5);
        Circuit c = NoiseFixtures.randomGates(Circuit.builder(3), 3, 25, rng).build();
        StateVector psi = StateVector.zero(3).apply(c);
        Observable h = Observable.builder().add(0.7, "XZ").add(-1.3, "ZIY").add(0.4, "YY")
                .build();
        dev.qsim.Operator op = h.toOperator(3);
        Complex want = Complex.ZERO;
        for (int r = 0; r < 8; r++) {
            for (int col = 0; col < 8; col++) {
                want = want.add(psi.amplitude(r).conj().multiply(op.get(r, col))
                        .multiply(psi.amplitude(col)));
            }
        }
        assertEquals(want.getReal(), Expectation.of(h, DensityMatrix.of(psi)), TOL);
        // Z on a qubit after amplitude damping from |1>: z = gamma - (1 - gamma) (§8.3.5).
        DensityMatrix rho = DensityMatrix.of(StateVector.basis(1, 1))
                .apply(Channel.amplitudeDamping(0.3), 0);
        assertEquals(0.3 - 0.7, Expectation.of(Observable.of(1, "Z"), rho), TOL);
    }

    @Test
    void samplingFollowsTheDiagonal() {
        // |+> on qubit 0 and |1> on qubit 1: outcomes "10" and "11" with probability 1/2 each
        // (Born rule); sampling the qubits (1, 0) gives "01" and "11".
        DensityMatrix rho = DensityMatrix.of(StateVector.zero(2).apply(Gates.H, 0)
                .apply(Gates.X, 1));
        int shots = 4000;
        Tally t = rho.sample(shots, RandomSource.XO_RO_SHI_RO_128_PP.create(8));
        assertEquals(shots, t.count("10") + t.count("11"));
        // within 4 standard errors of shots/2 (binomial standard error, common practice)
        assertEquals(shots / 2.0, t.count("10"), 4 * Math.sqrt(shots * 0.25), "seed 8");
        Tally swapped = rho.sample(100, RandomSource.XO_RO_SHI_RO_128_PP.create(9), 1, 0);
        assertEquals(100, swapped.count("01") + swapped.count("11"));
    }

    @Test
    void tooLargeForTheHeapNamesTheBytes() {
        // 16 * 4^n bytes: common practice for complex doubles.
        assertEquals(16L << 28, DensityMatrix.bytes(14));
        IllegalStateException e = assertThrows(IllegalStateException.class,
                () -> {
                    throw Heap.tooLarge(16L << 28, 1L << 30, 2L << 30, "a 14-qubit density matrix");
                });
        assertTrue(e.getMessage().contains("4294967296 bytes")
                && e.getMessage().contains("-Xmx"), e.getMessage());
        // The test JVM runs with -Xmx2g (parent pom), so 15 qubits (16 GiB) cannot fit.
        if (Runtime.getRuntime().maxMemory() < (16L << 30)) {
            e = assertThrows(IllegalStateException.class, () -> DensityMatrix.zero(15));
            assertTrue(e.getMessage().contains("17179869184 bytes"), e.getMessage());
        }
        IllegalArgumentException bad = assertThrows(IllegalArgumentException.class,
                () -> DensityMatrix.zero(16));
        assertTrue(bad.getMessage().contains("16"), bad.getMessage());
        IndexOutOfBoundsException out = assertThrows(IndexOutOfBoundsException.class,
                () -> DensityMatrix.zero(2).apply(Gates.H, 5));
        assertTrue(out.getMessage().contains("qubit 5"), out.getMessage());
    }
}
