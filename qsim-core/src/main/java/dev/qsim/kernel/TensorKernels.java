package dev.qsim.kernel;

/**
 * The loops of the matrix-product-state engine on its site tensors: complex matrix products,
 * a small matrix applied to the middle index of a three-index tensor, and the transfer of an
 * environment across one site (Schollwöck 2011, "The density-matrix renormalization group in
 * the age of matrix product states", Ann. Phys. 326, 96, doi:10.1016/j.aop.2010.09.012, §4.2
 * and §6.2). Internal; static, unchecked and allocation-free in their inner loops.
 *
 * <p>Storage: row-major, real and imaginary parts interleaved. A site tensor {@code A[a][s][b]}
 * (left bond {@code l}, physical index {@code s} of dimension {@code d}, right bond {@code r})
 * lies at {@code 2((a d + s) r + b)}, so the same array is the {@code (l d) x r} matrix with
 * rows {@code (a, s)} and the {@code l x (d r)} matrix with columns {@code (s, b)}.
 */
public final class TensorKernels {
    private TensorKernels() {
    }

    /**
     * {@code c = a b} for an {@code m x k} matrix {@code a} and a {@code k x n} matrix {@code b}.
     *
     * @param a left factor. Not modified.
     * @param b right factor. Not modified.
     * @param c the product, {@code 2 m n} doubles, not aliasing {@code a} or {@code b}.
     *     Modified.
     * @param m rows of a
     * @param k columns of a, rows of b
     * @param n columns of b
     */
    public static void multiply(double[] a, double[] b, double[] c, int m, int k, int n) {
        java.util.Arrays.fill(c, 0, 2 * m * n, 0);
        for (int i = 0; i < m; i++) {
            final int ci = 2 * i * n;
            final int ai = 2 * i * k;
            for (int p = 0; p < k; p++) {
                final double ar = a[ai + 2 * p];
                final double aim = a[ai + 2 * p + 1];
                if (ar == 0 && aim == 0) {
                    continue;
                }
                final int bp = 2 * p * n;
                for (int j = 0; j < 2 * n; j += 2) {
                    final double br = b[bp + j];
                    final double bi = b[bp + j + 1];
                    c[ci + j] += ar * br - aim * bi;
                    c[ci + j + 1] += ar * bi + aim * br;
                }
            }
        }
    }

    /**
     * {@code c = a^H b} for a {@code k x m} matrix {@code a} and a {@code k x n} matrix
     * {@code b}.
     *
     * @param a left factor, conjugate transposed in the product. Not modified.
     * @param b right factor. Not modified.
     * @param c the {@code m x n} product, not aliasing the factors. Modified.
     * @param k rows of a and b
     * @param m columns of a
     * @param n columns of b
     */
    public static void multiplyAdjointLeft(double[] a, double[] b, double[] c, int k, int m,
            int n) {
        java.util.Arrays.fill(c, 0, 2 * m * n, 0);
        for (int p = 0; p < k; p++) {
            final int ap = 2 * p * m;
            final int bp = 2 * p * n;
            for (int i = 0; i < m; i++) {
                final double ar = a[ap + 2 * i];
                final double aim = -a[ap + 2 * i + 1];
                if (ar == 0 && aim == 0) {
                    continue;
                }
                final int ci = 2 * i * n;
                for (int j = 0; j < 2 * n; j += 2) {
                    final double br = b[bp + j];
                    final double bi = b[bp + j + 1];
                    c[ci + j] += ar * br - aim * bi;
                    c[ci + j + 1] += ar * bi + aim * br;
                }
            }
        }
    }

    /**
     * {@code c = a b^H} for an {@code m x k} matrix {@code a} and an {@code n x k} matrix
     * {@code b}.
     *
     * @param a left factor. Not modified.
     * @param b right factor, conjugate transposed in the product. Not modified.
     * @param c the {@code m x n} product, not aliasing the factors. Modified.
     * @param m rows of a
     * @param k columns of a and b
     * @param n rows of b
     */
    public static void multiplyAdjointRight(double[] a, double[] b, double[] c, int m, int k,
            int n) {
        for (int i = 0; i < m; i++) {
            final int ai = 2 * i * k;
            for (int j = 0; j < n; j++) {
                final int bj = 2 * j * k;
                double sr = 0;
                double si = 0;
                for (int p = 0; p < 2 * k; p += 2) {
                    final double ar = a[ai + p];
                    final double aim = a[ai + p + 1];
                    final double br = b[bj + p];
                    final double bi = b[bj + p + 1];
                    sr += ar * br + aim * bi;
                    si += aim * br - ar * bi;
                }
                c[2 * (i * n + j)] = sr;
                c[2 * (i * n + j) + 1] = si;
            }
        }
    }

    /**
     * Applies a {@code d x d} matrix to the middle index of a tensor {@code t[a][s][b]} in place:
     * {@code t[a][s][b] <- Σ_q g[s][q] t[a][q][b]}.
     *
     * @param g the matrix, {@code 2 d d} doubles. Not modified.
     * @param d the dimension of the middle index
     * @param t the tensor, {@code 2 l d r} doubles. Modified.
     * @param l the left dimension
     * @param r the right dimension
     * @param work scratch of at least {@code 2 d r} doubles. Modified.
     */
    public static void applyToMiddle(double[] g, int d, double[] t, int l, int r,
            double[] work) {
        final int slab = 2 * d * r;
        if (d == 2) {
            final double g00r = g[0];
            final double g00i = g[1];
            final double g01r = g[2];
            final double g01i = g[3];
            final double g10r = g[4];
            final double g10i = g[5];
            final double g11r = g[6];
            final double g11i = g[7];
            for (int a = 0; a < l; a++) {
                final int x = a * slab;
                final int y = x + 2 * r;
                for (int b = 0; b < 2 * r; b += 2) {
                    final double xr = t[x + b];
                    final double xi = t[x + b + 1];
                    final double yr = t[y + b];
                    final double yi = t[y + b + 1];
                    t[x + b] = g00r * xr - g00i * xi + g01r * yr - g01i * yi;
                    t[x + b + 1] = g00r * xi + g00i * xr + g01r * yi + g01i * yr;
                    t[y + b] = g10r * xr - g10i * xi + g11r * yr - g11i * yi;
                    t[y + b + 1] = g10r * xi + g10i * xr + g11r * yi + g11i * yr;
                }
            }
            return;
        }
        for (int a = 0; a < l; a++) {
            final int base = a * slab;
            System.arraycopy(t, base, work, 0, slab);
            java.util.Arrays.fill(t, base, base + slab, 0);
            for (int s = 0; s < d; s++) {
                final int out = base + 2 * s * r;
                for (int q = 0; q < d; q++) {
                    final double gr = g[2 * (s * d + q)];
                    final double gi = g[2 * (s * d + q) + 1];
                    if (gr == 0 && gi == 0) {
                        continue;
                    }
                    final int in = 2 * q * r;
                    for (int b = 0; b < 2 * r; b += 2) {
                        final double xr = work[in + b];
                        final double xi = work[in + b + 1];
                        t[out + b] += gr * xr - gi * xi;
                        t[out + b + 1] += gr * xi + gi * xr;
                    }
                }
            }
        }
    }

    /**
     * Carries a left environment across one site, with an operator on its physical index:
     * {@code out[b'][b] = Σ conj(A[a'][s'][b']) op[s'][s] e[a'][a] A[a][s][b]} (Schollwöck 2011,
     * eq. 98 with a one-site operator). A {@code null} environment or operator is the identity.
     *
     * @param e the {@code l x l} environment (bra index first), or null. Not modified.
     * @param a the site tensor, {@code l x 2 x r}. Not modified.
     * @param l the left bond
     * @param r the right bond
     * @param op a {@code 2 x 2} operator, or null. Not modified.
     * @param work scratch of at least {@code 4 l r} doubles. Modified.
     * @param out the {@code r x r} result. Modified.
     */
    public static void transferLeft(double[] e, double[] a, int l, int r, double[] op,
            double[] work, double[] out) {
        double[] f = a;
        if (e != null) {
            multiply(e, a, work, l, l, 2 * r);
            f = work;
        }
        if (op != null) {
            if (f == a) {
                System.arraycopy(a, 0, work, 0, 4 * l * r);
                f = work;
            }
            applyToMiddle(op, 2, f, l, r, null);
        }
        multiplyAdjointLeft(a, f, out, 2 * l, r, r);
    }

    /**
     * Carries a right environment across one site, tracing the physical index:
     * {@code out[a][a'] = Σ A[a][s][b] e[b][b'] conj(A[a'][s][b'])}. A {@code null} environment
     * is the identity.
     *
     * @param e the {@code r x r} environment, or null. Not modified.
     * @param a the site tensor, {@code l x 2 x r}. Not modified.
     * @param l the left bond
     * @param r the right bond
     * @param work scratch of at least {@code 4 l r} doubles. Modified.
     * @param out the {@code l x l} result. Modified.
     */
    public static void transferRight(double[] e, double[] a, int l, int r, double[] work,
            double[] out) {
        double[] g = a;
        if (e != null) {
            multiply(a, e, work, 2 * l, r, r);
            g = work;
        }
        multiplyAdjointRight(g, a, out, l, 2 * r, l);
    }
}
