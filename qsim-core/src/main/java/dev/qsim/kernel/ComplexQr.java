package dev.qsim.kernel;

/**
 * The thin QR decomposition {@code A = Q R} of a dense complex matrix by Householder
 * reflections (Golub and Van Loan, <i>Matrix Computations</i>, 4th ed. (2013), §5.2.2, with the
 * complex reflectors {@code I - β v v^H} of §5.1.13), for moving the orthogonality centre of a
 * matrix product state, where nothing is truncated and a QR costs a fraction of an SVD.
 * Internal.
 *
 * <p>For an {@code m x n} matrix with {@code r = min(m, n)}: {@code Q} is {@code m x r} with
 * orthonormal columns and {@code R} is {@code r x n} upper triangular. Storage: row-major, real
 * and imaginary parts interleaved.
 */
public final class ComplexQr {
    private final double[] q;
    private final double[] r;
    private final int rank;

    private ComplexQr(double[] q, double[] r, int rank) {
        this.q = q;
        this.r = r;
        this.rank = rank;
    }

    /**
     * Returns the bytes the decomposition of an {@code m x n} matrix allocates.
     *
     * @param m rows
     * @param n columns
     * @return the bytes
     */
    public static long bytes(int m, int n) {
        long k = Math.min(m, n);
        return 16L * ((long) m * n + 2 * k * m + k * n) + 8L * k;
    }

    /**
     * Decomposes an {@code m x n} matrix. Unchecked: {@code a} has {@code 2 m n} finite entries.
     *
     * @param a the matrix, row-major, re/im interleaved. Not modified.
     * @param m rows, at least 1
     * @param n columns, at least 1
     * @return the decomposition
     */
    public static ComplexQr of(double[] a, int m, int n) {
        double[] w = a.clone();
        int k = Math.min(m, n);
        double[] beta = new double[k];
        double[] diag = new double[2 * k];
        double[] tmp = new double[2 * n];
        for (int c = 0; c < k; c++) {
            double tail = 0;
            for (int i = c + 1; i < m; i++) {
                int at = 2 * (i * n + c);
                tail += w[at] * w[at] + w[at + 1] * w[at + 1];
            }
            int cc = 2 * (c * n + c);
            double x0r = w[cc];
            double x0i = w[cc + 1];
            if (tail == 0) {
                diag[2 * c] = x0r;
                diag[2 * c + 1] = x0i;
                continue;
            }
            double abs0 = Math.sqrt(x0r * x0r + x0i * x0i);
            double norm = Math.sqrt(abs0 * abs0 + tail);
            double pr = 1;
            double pi = 0;
            if (abs0 > 0) {
                pr = x0r / abs0;
                pi = x0i / abs0;
            }
            diag[2 * c] = -pr * norm;
            diag[2 * c + 1] = -pi * norm;
            w[cc] = pr * (abs0 + norm);
            w[cc + 1] = pi * (abs0 + norm);
            double b = 1 / (norm * (norm + abs0));
            beta[c] = b;
            // apply to columns c+1..n-1
            int from = 2 * (c + 1);
            java.util.Arrays.fill(tmp, from, 2 * n, 0);
            for (int i = c; i < m; i++) {
                int row = 2 * i * n;
                final double vr = w[row + 2 * c];
                final double vi = -w[row + 2 * c + 1];
                for (int j = from; j < 2 * n; j += 2) {
                    tmp[j] += vr * w[row + j] - vi * w[row + j + 1];
                    tmp[j + 1] += vr * w[row + j + 1] + vi * w[row + j];
                }
            }
            for (int i = c; i < m; i++) {
                int row = 2 * i * n;
                final double vr = b * w[row + 2 * c];
                final double vi = b * w[row + 2 * c + 1];
                for (int j = from; j < 2 * n; j += 2) {
                    w[row + j] -= vr * tmp[j] - vi * tmp[j + 1];
                    w[row + j + 1] -= vr * tmp[j + 1] + vi * tmp[j];
                }
            }
        }
        double[] r = new double[2 * k * n];
        for (int i = 0; i < k; i++) {
            r[2 * (i * n + i)] = diag[2 * i];
            r[2 * (i * n + i) + 1] = diag[2 * i + 1];
            System.arraycopy(w, 2 * (i * n + i + 1), r, 2 * (i * n + i + 1), 2 * (n - i - 1));
        }
        // Q^H (k x m) = E^T H_{k-1} ... H_0, formed backwards; then Q is its adjoint.
        double[] qh = new double[2 * k * m];
        for (int i = 0; i < k; i++) {
            qh[2 * (i * m + i)] = 1;
        }
        for (int c = k - 1; c >= 0; c--) {
            double b = beta[c];
            if (b == 0) {
                continue;
            }
            for (int i = c; i < k; i++) {
                int row = 2 * i * m;
                double sr = 0;
                double si = 0;
                for (int t = c; t < m; t++) {
                    int at = 2 * (t * n + c);
                    sr += qh[row + 2 * t] * w[at] - qh[row + 2 * t + 1] * w[at + 1];
                    si += qh[row + 2 * t] * w[at + 1] + qh[row + 2 * t + 1] * w[at];
                }
                if (sr == 0 && si == 0) {
                    continue;
                }
                sr *= b;
                si *= b;
                for (int t = c; t < m; t++) {
                    int at = 2 * (t * n + c);
                    final double vr = w[at];
                    final double vi = -w[at + 1];
                    qh[row + 2 * t] -= sr * vr - si * vi;
                    qh[row + 2 * t + 1] -= sr * vi + si * vr;
                }
            }
        }
        return new ComplexQr(ComplexSvd.adjoint(qh, k, m), r, k);
    }

    /**
     * Returns {@code Q}, an {@code m x r} matrix with orthonormal columns.
     *
     * @return the array itself; callers must not change it
     */
    public double[] q() {
        return q;
    }

    /**
     * Returns {@code R}, an {@code r x n} upper-triangular matrix.
     *
     * @return the array itself; callers must not change it
     */
    public double[] r() {
        return r;
    }

    /**
     * Returns {@code r = min(m, n)}.
     *
     * @return the inner dimension
     */
    public int rank() {
        return rank;
    }
}
