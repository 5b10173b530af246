package dev.qsim.kernel;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.SplittableRandom;

import org.ejml.data.DMatrixRMaj;
import org.ejml.data.ZMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_ZDRM;
import org.ejml.interfaces.decomposition.QRDecomposition;
import org.ejml.interfaces.decomposition.SingularValueDecomposition_F64;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The complex SVD against a reference library and against identities.
 *
 * <p>Reference: EJML 0.43.1 (Abeles, Efficient Java Matrix Library), whose real SVD
 * ({@code DecompositionFactory_DDRM.svd}) of the real embedding {@code [[Re A, -Im A],
 * [Im A, Re A]]} holds each singular value of {@code A} twice (the "K1" real form of Day and
 * Heroux 2001, "Solving complex-valued linear systems via equivalent real formulations", SIAM
 * J. Sci. Comput. 23, 480, doi:10.1137/S1064827500372262: it is unitarily similar to
 * {@code A ⊕ conj(A)}). Identities (Golub and Van Loan 2013, Matrix Computations, §2.4):
 * {@code A = U Σ V^H} with orthonormal columns; a unitary matrix has every singular value 1;
 * {@code U diag(σ) V^H} built from unitary factors has singular values {@code σ}; a rank-one
 * matrix {@code x y^H} has the one non-zero value {@code |x| |y|}. Tolerances: backward
 * stability promises errors of a modest multiple of {@code ε σ_max} (GVL §8.6.3); 1e-13
 * relative to {@code σ_max} for sizes up to 128 (common practice: about {@code n ε}).
 */
class ComplexSvdTest {
    private static final double TOL = 1e-13;

    static double[] gaussian(int m, int n, SplittableRandom r) {
        double[] a = new double[2 * m * n];
        for (int i = 0; i < a.length; i++) {
            a[i] = gauss(r);
        }
        return a;
    }

    private static double gauss(SplittableRandom r) {
        // Box-Muller (Box and Muller 1958, Ann. Math. Stat. 29, 610).
        double u = 1 - r.nextDouble();
        return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * r.nextDouble());
    }

    /** A Haar-random unitary: QR of a complex Gaussian matrix by EJML, phases fixed (Mezzadri
     * 2007, "How to generate random matrices from the classical compact groups", Notices AMS
     * 54, 592). */
    static double[] unitary(int n, SplittableRandom r) {
        ZMatrixRMaj g = new ZMatrixRMaj(n, n);
        System.arraycopy(gaussian(n, n, r), 0, g.data, 0, 2 * n * n);
        QRDecomposition<ZMatrixRMaj> qr = DecompositionFactory_ZDRM.qr(n, n);
        assertTrue(qr.decompose(g));
        ZMatrixRMaj q = qr.getQ(null, false);
        ZMatrixRMaj rr = qr.getR(null, false);
        double[] out = q.data.clone();
        for (int j = 0; j < n; j++) {
            double re = rr.data[2 * (j * n + j)];
            double im = rr.data[2 * (j * n + j) + 1];
            double abs = Math.hypot(re, im);
            double pr = re / abs;
            double pi = im / abs;
            for (int i = 0; i < n; i++) {
                int at = 2 * (i * n + j);
                double xr = out[at];
                double xi = out[at + 1];
                out[at] = xr * pr - xi * pi;
                out[at + 1] = xr * pi + xi * pr;
            }
        }
        return out;
    }

    /** Singular values of A from EJML's real SVD of the embedding, each taken once. */
    static double[] ejmlValues(double[] a, int m, int n) {
        DMatrixRMaj big = new DMatrixRMaj(2 * m, 2 * n);
        for (int i = 0; i < m; i++) {
            for (int j = 0; j < n; j++) {
                double re = a[2 * (i * n + j)];
                double im = a[2 * (i * n + j) + 1];
                big.set(i, j, re);
                big.set(i, j + n, -im);
                big.set(i + m, j, im);
                big.set(i + m, j + n, re);
            }
        }
        SingularValueDecomposition_F64<DMatrixRMaj> svd = DecompositionFactory_DDRM.svd(2 * m,
                2 * n, false, false, true);
        assertTrue(svd.decompose(big));
        double[] all = svd.getSingularValues().clone();
        Arrays.sort(all);
        int k = Math.min(m, n);
        double[] out = new double[k];
        for (int i = 0; i < k; i++) {
            out[i] = all[all.length - 1 - 2 * i];
        }
        return out;
    }

    /** C = A B for row-major interleaved matrices. */
    static double[] times(double[] a, double[] b, int m, int k, int n) {
        double[] c = new double[2 * m * n];
        for (int i = 0; i < m; i++) {
            for (int p = 0; p < k; p++) {
                double ar = a[2 * (i * k + p)];
                double ai = a[2 * (i * k + p) + 1];
                for (int j = 0; j < n; j++) {
                    double br = b[2 * (p * n + j)];
                    double bi = b[2 * (p * n + j) + 1];
                    c[2 * (i * n + j)] += ar * br - ai * bi;
                    c[2 * (i * n + j) + 1] += ar * bi + ai * br;
                }
            }
        }
        return c;
    }

    /** Largest |(X^H X - I)_ij| for an r x c matrix X with orthonormal columns. */
    static double columnsOffOrthonormal(double[] x, int r, int c) {
        double worst = 0;
        for (int i = 0; i < c; i++) {
            for (int j = 0; j < c; j++) {
                double sr = 0;
                double si = 0;
                for (int t = 0; t < r; t++) {
                    double ar = x[2 * (t * c + i)];
                    double ai = -x[2 * (t * c + i) + 1];
                    double br = x[2 * (t * c + j)];
                    double bi = x[2 * (t * c + j) + 1];
                    sr += ar * br - ai * bi;
                    si += ar * bi + ai * br;
                }
                worst = Math.max(worst, Math.hypot(sr - (i == j ? 1 : 0), si));
            }
        }
        return worst;
    }

    /** Checks A = U S V^H, orthonormality, order; returns the decomposition. */
    static ComplexSvd check(double[] a, int m, int n, String label) {
        ComplexSvd svd = ComplexSvd.of(a, m, n);
        int k = Math.min(m, n);
        double[] s = svd.values();
        assertEquals(k, s.length, label);
        double top = Math.max(s[0], Double.MIN_NORMAL);
        for (int i = 1; i < k; i++) {
            assertTrue(s[i] <= s[i - 1] && s[i] >= 0, label + ": order at " + i);
        }
        double[] us = svd.u().clone();
        for (int i = 0; i < m; i++) {
            for (int j = 0; j < k; j++) {
                us[2 * (i * k + j)] *= s[j];
                us[2 * (i * k + j) + 1] *= s[j];
            }
        }
        double[] back = times(us, svd.vh(), m, k, n);
        double err = 0;
        for (int i = 0; i < back.length; i++) {
            err = Math.max(err, Math.abs(back[i] - a[i]));
        }
        assertTrue(err <= TOL * top, label + ": reconstruction error " + err);
        assertTrue(columnsOffOrthonormal(svd.u(), m, k) <= TOL, label + ": U^H U");
        double[] v = ComplexSvd.adjoint(svd.vh(), k, n);
        assertTrue(columnsOffOrthonormal(v, n, k) <= TOL, label + ": V^H V");
        return svd;
    }

    @ParameterizedTest
    @CsvSource({"1, 1", "1, 6", "6, 1", "2, 2", "8, 8", "12, 7", "7, 12", "40, 40", "64, 33",
        "33, 64", "128, 128"})
    void gaussianMatricesAgreeWithTheRealEmbeddingInEjml(int m, int n) {
        SplittableRandom r = new SplittableRandom(1000L * m + n);
        double[] a = gaussian(m, n, r);
        ComplexSvd svd = check(a, m, n, m + "x" + n);
        double[] ref = ejmlValues(a, m, n);
        for (int i = 0; i < ref.length; i++) {
            assertEquals(ref[i], svd.values()[i], TOL * ref[0], m + "x" + n + " value " + i);
        }
    }

    @Test
    void unitaryMatricesHaveEverySingularValueOne() {
        SplittableRandom r = new SplittableRandom(7);
        for (int n : new int[] {1, 2, 5, 16, 64}) {
            double[] q = unitary(n, r);
            ComplexSvd svd = check(q, n, n, "unitary " + n);
            for (double s : svd.values()) {
                assertEquals(1, s, TOL, "unitary " + n);
            }
        }
    }

    @Test
    void builtSpectraAreRecovered() {
        SplittableRandom r = new SplittableRandom(11);
        int m = 24;
        int n = 16;
        double[][] spectra = {
            // graded from 1 down to 1e-15
            {1, 1e-1, 1e-2, 1e-3, 1e-4, 1e-5, 1e-6, 1e-7, 1e-8, 1e-9, 1e-10, 1e-11, 1e-12,
                1e-13, 1e-14, 1e-15},
            // repeated values and exact zeros (rank 6)
            {3, 3, 3, 2, 2, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0},
            // clustered
            {1, 1 + 1e-12, 1 - 1e-12, 0.5, 0.5 + 1e-9, 0.25, 0.125, 0.0625, 1e-3, 1e-3, 1e-3,
                1e-6, 1e-6, 1e-9, 1e-9, 1e-12},
        };
        for (double[] sigma : spectra) {
            double[] u = unitary(m, r);
            double[] v = unitary(n, r);
            // A = U[:, :n] diag(sigma) V^H
            double[] us = new double[2 * m * n];
            for (int i = 0; i < m; i++) {
                for (int j = 0; j < n; j++) {
                    us[2 * (i * n + j)] = u[2 * (i * m + j)] * sigma[j];
                    us[2 * (i * n + j) + 1] = u[2 * (i * m + j) + 1] * sigma[j];
                }
            }
            double[] a = times(us, ComplexSvd.adjoint(v, n, n), m, n, n);
            double[] sorted = sigma.clone();
            Arrays.sort(sorted);
            double top = sorted[n - 1];
            ComplexSvd svd = check(a, m, n, Arrays.toString(sigma));
            for (int i = 0; i < n; i++) {
                assertEquals(sorted[n - 1 - i], svd.values()[i], TOL * top,
                        Arrays.toString(sigma) + " value " + i);
            }
            // and the transposed shape
            ComplexSvd wide = check(ComplexSvd.adjoint(a, m, n), n, m, "adjoint");
            for (int i = 0; i < n; i++) {
                assertEquals(sorted[n - 1 - i], wide.values()[i], TOL * top, "adjoint " + i);
            }
        }
    }

    @Test
    void rankOneAndZeroMatrices() {
        SplittableRandom r = new SplittableRandom(3);
        double[] x = gaussian(9, 1, r);
        double[] y = gaussian(1, 5, r);
        double[] a = times(x, y, 9, 1, 5);
        double nx = 0;
        double ny = 0;
        for (double t : x) {
            nx += t * t;
        }
        for (double t : y) {
            ny += t * t;
        }
        ComplexSvd svd = check(a, 9, 5, "rank one");
        assertEquals(Math.sqrt(nx * ny), svd.values()[0], TOL * Math.sqrt(nx * ny));
        for (int i = 1; i < 5; i++) {
            assertEquals(0, svd.values()[i], TOL * Math.sqrt(nx * ny));
        }
        ComplexSvd zero = check(new double[2 * 6 * 4], 6, 4, "zero");
        for (double s : zero.values()) {
            assertEquals(0, s, 0.0);
        }
        // A diagonal with complex entries: singular values are the moduli, sorted.
        double[] d = new double[2 * 4 * 4];
        double[][] z = {{0, -2}, {3, 4}, {-1, 0}, {0.6, -0.8}};
        for (int i = 0; i < 4; i++) {
            d[2 * (i * 4 + i)] = z[i][0];
            d[2 * (i * 4 + i) + 1] = z[i][1];
        }
        double[] s = check(d, 4, 4, "diagonal").values();
        double[] expected = {5, 2, 1, 1};
        for (int i = 0; i < 4; i++) {
            assertEquals(expected[i], s[i], TOL * 5);
        }
    }

    @Test
    void hugeAndTinyScalesDoNotOverflow() {
        SplittableRandom r = new SplittableRandom(5);
        double[] a = gaussian(10, 10, r);
        double[] ref = ComplexSvd.of(a, 10, 10).values();
        for (double f : new double[] {1e-300, 1e300}) {
            double[] b = a.clone();
            for (int i = 0; i < b.length; i++) {
                b[i] *= f;
            }
            double[] s = ComplexSvd.of(b, 10, 10).values();
            for (int i = 0; i < 10; i++) {
                assertEquals(ref[i], s[i] / f, 1e-13 * ref[0], "scale " + f);
            }
        }
        double[] bad = a.clone();
        bad[3] = Double.NaN;
        IllegalStateException e = assertThrows(IllegalStateException.class,
                () -> ComplexSvd.of(bad, 10, 10));
        assertTrue(e.getMessage().contains("NaN"), e.getMessage());
    }

    @ParameterizedTest
    @CsvSource({"1, 1", "6, 3", "3, 6", "16, 16", "40, 20"})
    void qrReconstructsWithOrthonormalQAndTriangularR(int m, int n) {
        SplittableRandom r = new SplittableRandom(31L * m + n);
        double[] a = gaussian(m, n, r);
        ComplexQr qr = ComplexQr.of(a, m, n);
        int k = Math.min(m, n);
        assertEquals(k, qr.rank());
        double[] back = times(qr.q(), qr.r(), m, k, n);
        for (int i = 0; i < back.length; i++) {
            assertEquals(a[i], back[i], TOL * 10, "entry " + i);
        }
        assertTrue(columnsOffOrthonormal(qr.q(), m, k) <= TOL);
        for (int i = 0; i < k; i++) {
            for (int j = 0; j < i; j++) {
                assertEquals(0, qr.r()[2 * (i * n + j)], 0.0);
                assertEquals(0, qr.r()[2 * (i * n + j) + 1], 0.0);
            }
        }
        // |R_ii| is unique (GVL 2013, Theorem 5.2.3): compare with EJML's complex QR.
        ZMatrixRMaj g = new ZMatrixRMaj(m, n);
        System.arraycopy(a, 0, g.data, 0, a.length);
        QRDecomposition<ZMatrixRMaj> ref = DecompositionFactory_ZDRM.qr(m, n);
        assertTrue(ref.decompose(g));
        ZMatrixRMaj rr = ref.getR(null, true);
        for (int i = 0; i < k; i++) {
            double mine = Math.hypot(qr.r()[2 * (i * n + i)], qr.r()[2 * (i * n + i) + 1]);
            double theirs = Math.hypot(rr.data[2 * (i * n + i)], rr.data[2 * (i * n + i) + 1]);
            assertEquals(theirs, mine, TOL * 10 * theirs, "R " + i);
        }
    }
}
