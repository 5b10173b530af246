package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.apache.commons.math3.transform.DftNormalization;
import org.apache.commons.math3.transform.FastFourierTransformer;
import org.apache.commons.math3.transform.TransformType;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The quantum Fourier transform circuit against a classical FFT from Commons Math 3.6.1.
 *
 * <p>The QFT maps |j> to (1/√N) Σ_k e^{+2πi jk/N} |k> (Nielsen &amp; Chuang 2010, <i>Quantum
 * Computation and Quantum Information</i>, sec. 5.1, eq. 5.2; equation number from memory).
 * Its circuit (sec. 5.1) takes the most significant qubit first: H, then controlled-R_m for
 * m = 2, 3, ... from each less significant qubit with R_m = diag(1, e^{2πi/2^m}) (our
 * {@code cphase(2π/2^m)}), then the next qubit, and finally swaps that reverse the qubit order.
 * In our bit order (qubit k = bit k) the most significant qubit is n−1.
 *
 * <p>Commons Math's {@code FastFourierTransformer} with {@code DftNormalization.UNITARY} and
 * {@code TransformType.INVERSE} computes x_k = (1/√N) Σ_n y_n e^{+2πi nk/N}: see the javadoc of
 * {@code org.apache.commons.math3.transform.DftNormalization#UNITARY} (Commons Math 3.6.1 API),
 * which gives the forward transform with e^{−2πi nk/N}/√N and the inverse with
 * e^{+2πi nk/N}/√N. The sign is also checked on its own below. So the QFT of |j> is the
 * unitary inverse DFT of the unit vector e_j.
 */
class FourierReferenceTest {

    /** Per-amplitude tolerance: ~n²/2 gates and the FFT, ~1e-16 rounding each (common practice). */
    private static final double TOL = 1e-12;

    /** QFT on n qubits from H, cphase and swap (N&amp;C 2010 sec. 5.1). */
    static Circuit qft(int n) {
        Circuit.Builder b = Circuit.builder(n);
        for (int i = n - 1; i >= 0; i--) {
            b.h(i);
            for (int m = i - 1; m >= 0; m--) {
                int order = i - m + 1; // R_order, controlled by the qubit (i − m) places lower
                b.cphase(m, i, 2 * Math.PI / (1 << order));
            }
        }
        for (int k = 0; k < n / 2; k++) {
            b.swap(k, n - 1 - k);
        }
        return b.build();
    }

    /** The unitary inverse DFT of the unit vector e_j of length 2^n, by Commons Math. */
    private static org.apache.commons.math3.complex.Complex[] inverseUnitaryDft(int n, int j) {
        double[] unit = new double[1 << n];
        unit[j] = 1;
        return new FastFourierTransformer(DftNormalization.UNITARY)
                .transform(unit, TransformType.INVERSE);
    }

    @Test
    void commonsMathInverseUnitaryHasPlusSign() {
        // Closed form e^{+2πi jk/N}/√N for e_j (DftNormalization javadoc, Commons Math 3.6.1):
        // checked here at N = 8, j = 1, k = 1: (1 + i)/√2 / √8 = (1 + i)/4.
        org.apache.commons.math3.complex.Complex[] y = inverseUnitaryDft(3, 1);
        assertEquals(0.25, y[1].getReal(), 1e-15, "Re of the k = 1 entry");
        assertEquals(0.25, y[1].getImaginary(), 1e-15, "Im of the k = 1 entry (plus sign)");
    }

    @ParameterizedTest
    @ValueSource(ints = {3, 4, 5, 6})
    void qftOfEachBasisStateIsTheUnitaryInverseDft(int n) {
        Circuit c = qft(n);
        int d = 1 << n;
        for (int j = 0; j < d; j++) {
            // Expected: Commons Math 3.6.1 FastFourierTransformer, UNITARY, INVERSE (see above).
            org.apache.commons.math3.complex.Complex[] y = inverseUnitaryDft(n, j);
            double[][] expected = new double[2][d];
            for (int k = 0; k < d; k++) {
                expected[0][k] = y[k].getReal();
                expected[1][k] = y[k].getImaginary();
            }
            StateVector actual = StateVector.basis(n, j).apply(c);
            final int jj = j;
            DenseReference.assertClose(expected, actual, TOL,
                () -> "QFT on " + n + " qubits of |" + jj + ">");
        }
    }

    @ParameterizedTest
    @ValueSource(ints = {3, 4, 5})
    void qftOperatorIsTheDftMatrix(int n) {
        Operator u = qft(n).toOperator();
        for (int j = 0; j < (1 << n); j++) {
            // Column j of the QFT matrix is the transform of e_j (Commons Math, as above).
            org.apache.commons.math3.complex.Complex[] y = inverseUnitaryDft(n, j);
            for (int k = 0; k < (1 << n); k++) {
                double dist = Math.hypot(u.get(k, j).getReal() - y[k].getReal(),
                        u.get(k, j).getImaginary() - y[k].getImaginary());
                assertEquals(0, dist, TOL, "QFT matrix entry (" + k + ", " + j + ") on " + n
                        + " qubits");
            }
        }
    }
}
