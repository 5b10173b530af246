package dev.qsim.kernel;

import java.util.Arrays;
import java.util.Locale;
import java.util.SplittableRandom;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.SingularValueDecomposition_F64;

/**
 * Not a test: the measurement behind the SVD entry of {@code docs/decisions.md}. Times, on square
 * complex Gaussian matrices, {@link ComplexSvd} (Golub-Kahan-Reinsch), a one-sided Jacobi SVD
 * written here only for the comparison (Hestenes 1958; Demmel and Veselić 1992, "Jacobi's method
 * is more accurate than QR", SIAM J. Matrix Anal. Appl. 13, 1204), and EJML's real SVD of the
 * real embedding (with vectors), alternating, one thread; then the accuracy of each on a
 * graded spectrum (1 down to 1e-12) built from Haar-random unitaries.
 *
 * <p>Run after {@code mvn -o -q -pl qsim-core test-compile} with
 * {@code java -cp qsim-core/target/classes:qsim-core/target/test-classes:EJML_JARS
 * dev.qsim.kernel.SvdTimings} (EJML_JARS: ejml-core, ejml-ddense and ejml-zdense 0.43.1 from the
 * local Maven repository).
 */
public final class SvdTimings {
    private SvdTimings() {
    }

    /**
     * Prints the table.
     *
     * @param args ignored
     */
    public static void main(String[] args) {
        SplittableRandom r = new SplittableRandom(2024);
        System.out.println("n, golub_kahan_ms, jacobi_ms, ejml_embedding_ms");
        for (int n : new int[] {32, 64, 128, 256}) {
            double[] a = ComplexSvdTest.gaussian(n, n, r);
            int reps = n <= 64 ? 40 : n == 128 ? 12 : 4;
            for (int warm = 0; warm < 3; warm++) {
                ComplexSvd.of(a, n, n);
                jacobi(a, n, n);
                embedding(a, n, n);
            }
            double[] gk = new double[reps];
            double[] jc = new double[reps];
            double[] em = new double[reps];
            for (int i = 0; i < reps; i++) {
                long t0 = System.nanoTime();
                ComplexSvd.of(a, n, n);
                long t1 = System.nanoTime();
                jacobi(a, n, n);
                long t2 = System.nanoTime();
                embedding(a, n, n);
                long t3 = System.nanoTime();
                gk[i] = (t1 - t0) / 1e6;
                jc[i] = (t2 - t1) / 1e6;
                em[i] = (t3 - t2) / 1e6;
            }
            System.out.println(String.format(Locale.ROOT, "%d, %.2f, %.2f, %.2f", n, median(gk),
                    median(jc), median(em)));
        }
        int m = 64;
        double[] u = ComplexSvdTest.unitary(m, r);
        double[] v = ComplexSvdTest.unitary(m, r);
        double[] sigma = new double[m];
        for (int j = 0; j < m; j++) {
            sigma[j] = Math.pow(10, -12.0 * j / (m - 1));
        }
        double[] us = u.clone();
        for (int i = 0; i < m; i++) {
            for (int j = 0; j < m; j++) {
                us[2 * (i * m + j)] *= sigma[j];
                us[2 * (i * m + j) + 1] *= sigma[j];
            }
        }
        double[] a = ComplexSvdTest.times(us, ComplexSvd.adjoint(v, m, m), m, m, m);
        double[] gk = ComplexSvd.of(a, m, m).values();
        double[] jc = jacobi(a, m, m);
        double[] em = ComplexSvdTest.ejmlValues(a, m, m);
        System.out.println("graded spectrum 1..1e-12, n = 64: largest error of a singular value"
                + " relative to the largest (and relative to itself, for values of 1e-6 and"
                + " more)");
        System.out.println(String.format(Locale.ROOT, "golub_kahan %.2e (%.2e), jacobi %.2e"
                + " (%.2e), ejml_embedding %.2e (%.2e)", absolute(gk, sigma),
                relative(gk, sigma, 1e-6), absolute(jc, sigma), relative(jc, sigma, 1e-6),
                absolute(em, sigma), relative(em, sigma, 1e-6)));
    }

    private static double absolute(double[] got, double[] exact) {
        double worst = 0;
        for (int j = 0; j < exact.length; j++) {
            worst = Math.max(worst, Math.abs(got[j] - exact[j]) / exact[0]);
        }
        return worst;
    }

    private static double relative(double[] got, double[] exact, double atLeast) {
        double worst = 0;
        for (int j = 0; j < exact.length; j++) {
            if (exact[j] >= atLeast) {
                worst = Math.max(worst, Math.abs(got[j] - exact[j]) / exact[j]);
            }
        }
        return worst;
    }

    private static double median(double[] x) {
        double[] s = x.clone();
        Arrays.sort(s);
        return s[s.length / 2];
    }

    private static void embedding(double[] a, int m, int n) {
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
                2 * n, true, true, true);
        svd.decompose(big);
    }

    /**
     * One-sided (Hestenes) Jacobi SVD of a tall complex matrix, values descending; the vectors
     * are formed (the columns of A U-rotated, V accumulated) but only the values returned.
     */
    static double[] jacobi(double[] a, int m, int n) {
        // x holds the columns of A as rows; y the columns of V as rows.
        double[] x = ComplexSvd.adjoint(a, m, n);
        for (int i = 1; i < x.length; i += 2) {
            x[i] = -x[i];
        }
        double[] y = new double[2 * n * n];
        for (int i = 0; i < n; i++) {
            y[2 * (i * n + i)] = 1;
        }
        double tol = 1e-15;
        for (int sweep = 0; sweep < 60; sweep++) {
            boolean rotated = false;
            for (int i = 0; i < n - 1; i++) {
                for (int j = i + 1; j < n; j++) {
                    double al = 0;
                    double be = 0;
                    double gr = 0;
                    double gi = 0;
                    int pi = 2 * i * m;
                    int pj = 2 * j * m;
                    for (int t = 0; t < 2 * m; t += 2) {
                        double ar = x[pi + t];
                        double ai = x[pi + t + 1];
                        double br = x[pj + t];
                        double bi = x[pj + t + 1];
                        al += ar * ar + ai * ai;
                        be += br * br + bi * bi;
                        gr += ar * br + ai * bi;
                        gi += ar * bi - ai * br;
                    }
                    double g = Math.hypot(gr, gi);
                    if (g <= tol * Math.sqrt(al * be)) {
                        continue;
                    }
                    rotated = true;
                    double zeta = (be - al) / (2 * g);
                    double t = Math.signum(zeta) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
                    if (zeta == 0) {
                        t = 1;
                    }
                    double c = 1 / Math.sqrt(1 + t * t);
                    double s = c * t;
                    // column j times e^{-i phi}, then a real rotation
                    double er = gr / g;
                    double ei = -gi / g;
                    rotate(x, m, i, j, c, s, er, ei);
                    rotate(y, n, i, j, c, s, er, ei);
                }
            }
            if (!rotated) {
                break;
            }
        }
        double[] s = new double[n];
        for (int i = 0; i < n; i++) {
            double sum = 0;
            for (int t = 0; t < 2 * m; t++) {
                sum += x[2 * i * m + t] * x[2 * i * m + t];
            }
            s[i] = Math.sqrt(sum);
        }
        Arrays.sort(s);
        for (int i = 0; i < n / 2; i++) {
            double tmp = s[i];
            s[i] = s[n - 1 - i];
            s[n - 1 - i] = tmp;
        }
        return s;
    }

    private static void rotate(double[] x, int len, int i, int j, double c, double s, double er,
            double ei) {
        int pi = 2 * i * len;
        int pj = 2 * j * len;
        for (int t = 0; t < 2 * len; t += 2) {
            double ar = x[pi + t];
            double ai = x[pi + t + 1];
            double br = x[pj + t] * er - x[pj + t + 1] * ei;
            double bi = x[pj + t] * ei + x[pj + t + 1] * er;
            x[pi + t] = c * ar - s * br;
            x[pi + t + 1] = c * ai - s * bi;
            x[pj + t] = s * ar + c * br;
            x[pj + t + 1] = s * ai + c * bi;
        }
    }
}
