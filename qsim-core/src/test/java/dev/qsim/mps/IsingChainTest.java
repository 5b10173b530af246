package dev.qsim.mps;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.numbers.complex.Complex;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Operator;
import dev.qsim.observable.Observable;

/**
 * The open transverse-field Ising chain at its critical point, {@code H = -Σ Z_i Z_{i+1} -
 * Σ X_i}: the closed form of its ground-state energy that the {@code ising} example compares
 * against, checked by EJML's dense eigensolver, and the matrix product state's energies of
 * circuit states on it, checked by EJML's dense products and by the variational principle.
 */
class IsingChainTest {

    /**
     * {@code E_0(N) = 1 - 1/sin(π/(2(2N+1)))}: Pfeuty 1970 (Ann. Phys. 57, 79), open chain at
     * g = 1, quasi-momenta {@code 2πm/(2N+1)}, energies {@code 4 cos(k/2)}, summed in closed
     * form.
     */
    private static double closedForm(int n) {
        return 1 - 1 / Math.sin(Math.PI / (2 * (2.0 * n + 1)));
    }

    private static Observable hamiltonian(int n) {
        Observable.Builder b = Observable.builder();
        for (int q = 0; q + 1 < n; q++) {
            b.add(-1, "Z" + q + " Z" + (q + 1));
        }
        for (int q = 0; q < n; q++) {
            b.add(-1, "X" + q);
        }
        return b.build();
    }

    private static DMatrixRMaj dense(int n) {
        Operator h = hamiltonian(n).toOperator(n);
        int d = 1 << n;
        DMatrixRMaj m = new DMatrixRMaj(d, d);
        for (int i = 0; i < d; i++) {
            for (int j = 0; j < d; j++) {
                Complex z = h.get(i, j);
                assertEquals(0, z.getImaginary(), 0.0, "the Hamiltonian is real");
                m.set(i, j, z.getReal());
            }
        }
        return m;
    }

    @Test
    void theClosedFormIsTheLowestEigenvalue() {
        for (int n = 1; n <= 8; n++) {
            DMatrixRMaj m = dense(n);
            EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(m.numRows,
                    false, true);
            assertTrue(eig.decompose(m));
            double lowest = Double.POSITIVE_INFINITY;
            for (int i = 0; i < m.numRows; i++) {
                lowest = Math.min(lowest, eig.getEigenvalue(i).getReal());
            }
            assertEquals(lowest, closedForm(n), 1e-10, "N = " + n);
        }
    }

    @Test
    void circuitEnergiesAreDenseExpectationsAndNeverBelowTheGround() {
        // A two-layer Hamiltonian-variational circuit (angles picked at random, fixed here) on
        // 8 spins: <H> from the matrix product state equals the dense <ψ|H|ψ> computed with
        // EJML, and is at least E_0 (Rayleigh-Ritz variational principle).
        int n = 8;
        double[][] angles = {{0.61, 1.37}, {0.93, 0.44}};
        Circuit c = circuit(n, angles);
        MatrixProductState s = MatrixProductState.zero(n).apply(c);
        double mine = s.expectation(hamiltonian(n));
        DMatrixRMaj h = dense(n);
        int d = 1 << n;
        double[] re = new double[d];
        double[] im = new double[d];
        for (int i = 0; i < d; i++) {
            Complex a = s.amplitude(i);
            re[i] = a.getReal();
            im[i] = a.getImaginary();
        }
        double sum = 0;
        for (int i = 0; i < d; i++) {
            double hr = 0;
            double hi = 0;
            for (int j = 0; j < d; j++) {
                hr += h.get(i, j) * re[j];
                hi += h.get(i, j) * im[j];
            }
            sum += re[i] * hr + im[i] * hi;
        }
        assertEquals(sum, mine, 1e-12);
        assertTrue(mine >= closedForm(n));
        // Wide: on 120 spins the energy per spin is still above the exact one.
        MatrixProductState wide = MatrixProductState.zero(120).apply(circuit(120, angles));
        assertTrue(wide.expectation(hamiltonian(120)) >= closedForm(120));
    }

    /** H on every spin, then per layer rzz(a) on every bond and rx(b) on every spin. */
    private static Circuit circuit(int n, double[][] angles) {
        Circuit.Builder b = Circuit.builder(n);
        for (int q = 0; q < n; q++) {
            b.h(q);
        }
        for (double[] layer : angles) {
            for (int q = 0; q + 1 < n; q++) {
                b.rzz(q, q + 1, layer[0]);
            }
            for (int q = 0; q < n; q++) {
                b.rx(q, layer[1]);
            }
        }
        return b.build();
    }
}
