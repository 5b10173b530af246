package dev.qsim.kernel;

/**
 * The singular value decomposition {@code A = U Σ V^H} of a dense complex matrix, written for
 * the matrix-product-state engine (the two-site updates of Vidal 2003 and Schollwöck 2011 each
 * split a block with one such decomposition). Internal.
 *
 * <p>Method: the Golub-Kahan-Reinsch algorithm (Golub and Kahan 1965, "Calculating the singular
 * values and pseudo-inverse of a matrix", SIAM J. Numer. Anal. B 2, 205,
 * doi:10.1137/0702016; Golub and Reinsch 1970, "Singular value decomposition and least squares
 * solutions", Numer. Math. 14, 403, doi:10.1007/BF02163027), in the form of Golub and Van Loan,
 * <i>Matrix Computations</i>, 4th ed. (2013), §5.4.8 and §8.6.1-8.6.2:
 * <ol>
 *   <li>Householder bidiagonalisation {@code A = U_B B V_B^H} with complex reflectors
 *       {@code I - β v v^H} (§5.1.2, §5.4.8);</li>
 *   <li>a diagonal unitary rescaling of rows and columns that makes the bidiagonal real and
 *       non-negative;</li>
 *   <li>implicit-shift QR sweeps on the real bidiagonal with the Wilkinson shift of the
 *       trailing 2x2 block of {@code B^T B} (Algorithm 8.6.1), deflation when a superdiagonal
 *       entry falls below {@code ε(|d_k| + |d_{k+1}|)}, and the rotations that zero a
 *       superdiagonal next to a zero diagonal entry (§8.6.2); the real rotations are applied
 *       to the complex singular vectors.</li>
 * </ol>
 * The result is backward stable: it is the exact decomposition of {@code A + E} with
 * {@code ||E||} a small multiple of {@code ε ||A||}, so every singular value is correct to
 * about {@code ε σ_max} (absolute) and the vectors of well-separated values are accurate
 * (Golub and Van Loan 2013, §8.6.3). The matrix is scaled by its largest entry first, so no
 * intermediate square overflows or underflows for any finite input.
 *
 * <p>Storage: row-major, real and imaginary parts interleaved (entry {@code (i, j)} of an
 * {@code m x n} matrix at {@code 2(i n + j)}). Singular values come in descending order.
 */
public final class ComplexSvd {
    /** The unit roundoff of a double, {@code 2^-52}. */
    private static final double EPS = 0x1p-52;

    /** Most implicit QR steps per singular value before the decomposition gives up. */
    public static final int MAX_STEPS_PER_VALUE = 60;

    /** Singular values (length {@code k = min(m, n)}), descending, non-negative. */
    private final double[] values;
    /** Left singular vectors: {@code m x k}, column {@code j} is {@code u_j}. */
    private final double[] u;
    /** Right singular vectors, conjugate transposed: {@code k x n}, row j is {@code v_j^H}. */
    private final double[] vh;
    private final int rows;
    private final int cols;

    private ComplexSvd(double[] values, double[] u, double[] vh, int rows, int cols) {
        this.values = values;
        this.u = u;
        this.vh = vh;
        this.rows = rows;
        this.cols = cols;
    }

    /**
     * Returns the bytes the decomposition of an {@code m x n} matrix allocates: the working copy,
     * both sets of vectors and the bidiagonal. Callers check the heap with it first.
     *
     * @param m rows
     * @param n columns
     * @return the bytes
     */
    public static long bytes(int m, int n) {
        long k = Math.min(m, n);
        long big = Math.max(m, n);
        // working copy, W (k x big), Z (k x k), the outputs U and V^H, and small vectors
        return 16L * (3 * big * k + 2 * k * k) + 96L * k;
    }

    /**
     * Decomposes an {@code m x n} matrix. Unchecked: {@code a} has {@code 2 m n} finite entries
     * and {@code m, n >= 1}.
     *
     * @param a the matrix, row-major, re/im interleaved. Not modified.
     * @param m rows
     * @param n columns
     * @return the decomposition
     * @throws IllegalStateException if an entry is not finite, or the QR sweeps do not
     *     converge within {@value #MAX_STEPS_PER_VALUE} steps per singular value (neither
     *     happens for finite input in practice)
     */
    public static ComplexSvd of(double[] a, int m, int n) {
        if (m >= n) {
            double[] work = a.clone();
            Parts p = decomposeTall(work, m, n);
            // U = W^H (m x n)
            return new ComplexSvd(p.values, adjoint(p.w, n, m), p.z, m, n);
        }
        // A^H = U' S V'^H, so A = V' S U'^H: U = V' = Z'^H, V^H = U'^H = W'.
        double[] work = adjoint(a, m, n);
        Parts p = decomposeTall(work, n, m);
        return new ComplexSvd(p.values, adjoint(p.z, m, m), p.w, m, n);
    }

    /**
     * Returns the singular values, descending.
     *
     * @return the array itself (length {@code min(m, n)}); callers must not change it
     */
    public double[] values() {
        return values;
    }

    /**
     * Returns the left singular vectors as an {@code m x k} matrix, column {@code j} the vector
     * of value {@code j}.
     *
     * @return the array itself; callers must not change it
     */
    public double[] u() {
        return u;
    }

    /**
     * Returns the right singular vectors conjugate transposed, a {@code k x n} matrix whose row
     * {@code j} is {@code v_j^H}.
     *
     * @return the array itself; callers must not change it
     */
    public double[] vh() {
        return vh;
    }

    /**
     * Returns the number of rows {@code m} of the decomposed matrix.
     *
     * @return m
     */
    public int rows() {
        return rows;
    }

    /**
     * Returns the number of columns {@code n} of the decomposed matrix.
     *
     * @return n
     */
    public int cols() {
        return cols;
    }

    /** The pieces of a tall decomposition: values, {@code W = U^H} (n x m), {@code Z = V^H}. */
    private record Parts(double[] values, double[] w, double[] z) {
    }

    /**
     * Returns the conjugate transpose of an {@code m x n} matrix.
     *
     * @param a the matrix. Not modified.
     * @param m rows
     * @param n columns
     * @return a new {@code n x m} matrix
     */
    public static double[] adjoint(double[] a, int m, int n) {
        double[] t = new double[2 * m * n];
        for (int i = 0; i < m; i++) {
            int row = 2 * i * n;
            for (int j = 0; j < n; j++) {
                int at = 2 * (j * m + i);
                t[at] = a[row + 2 * j];
                t[at + 1] = -a[row + 2 * j + 1];
            }
        }
        return t;
    }

    /** Decomposes a matrix with {@code m >= n}, overwriting it. */
    private static Parts decomposeTall(double[] a, int m, int n) {
        double scale = 0;
        for (int i = 0; i < a.length; i++) {
            double x = Math.abs(a[i]);
            if (!(x <= scale)) {
                if (!(x < Double.POSITIVE_INFINITY)) {
                    throw new IllegalStateException("a matrix to decompose holds the non-finite"
                            + " entry " + a[i]);
                }
                scale = x;
            }
        }
        double[] d = new double[2 * n];
        double[] e = new double[2 * n];
        double[] betaLeft = new double[n];
        double[] betaRight = new double[n];
        if (scale > 0) {
            double inv = 1 / scale;
            for (int i = 0; i < a.length; i++) {
                a[i] *= inv;
            }
        }
        bidiagonalise(a, m, n, d, e, betaLeft, betaRight);
        double[] w = leftVectors(a, m, n, betaLeft);
        double[] z = rightVectors(a, n, betaRight);
        double[] dr = new double[n];
        double[] er = new double[n];
        makeReal(d, e, dr, er, w, m, z, n);
        diagonalise(dr, er, w, m, z, n);
        finish(dr, w, m, z, n);
        if (scale > 0) {
            for (int k = 0; k < n; k++) {
                dr[k] *= scale;
            }
        }
        return new Parts(dr, w, z);
    }

    /**
     * Householder bidiagonalisation in place (Golub and Van Loan 2013, Algorithm 5.4.2, with
     * complex reflectors): left reflector {@code k} is stored in column {@code k} from row
     * {@code k} down, right reflector {@code k} in row {@code k} from column {@code k + 1}. The
     * complex diagonal goes to {@code d}, the superdiagonal to {@code e}.
     */
    private static void bidiagonalise(double[] a, int m, int n, double[] d, double[] e,
            double[] betaLeft, double[] betaRight) {
        double[] w = new double[2 * n];
        for (int k = 0; k < n; k++) {
            // Left reflector: zero column k below the diagonal.
            double tail = 0;
            for (int i = k + 1; i < m; i++) {
                int at = 2 * (i * n + k);
                tail += a[at] * a[at] + a[at + 1] * a[at + 1];
            }
            int kk = 2 * (k * n + k);
            double x0r = a[kk];
            double x0i = a[kk + 1];
            if (tail == 0) {
                betaLeft[k] = 0;
                d[2 * k] = x0r;
                d[2 * k + 1] = x0i;
            } else {
                double abs0 = Math.sqrt(x0r * x0r + x0i * x0i);
                double norm = Math.sqrt(abs0 * abs0 + tail);
                double pr = 1;
                double pi = 0;
                if (abs0 > 0) {
                    pr = x0r / abs0;
                    pi = x0i / abs0;
                }
                // alpha = -phase * norm; v0 = phase * (|x0| + norm)
                d[2 * k] = -pr * norm;
                d[2 * k + 1] = -pi * norm;
                a[kk] = pr * (abs0 + norm);
                a[kk + 1] = pi * (abs0 + norm);
                double beta = 1 / (norm * (norm + abs0));
                betaLeft[k] = beta;
                applyLeft(a, m, n, k, beta, w);
            }
            if (k >= n - 1) {
                continue;
            }
            // Right reflector: zero row k beyond the superdiagonal. The reflector is built for
            // y = conj(row), so that row * G = conj(alpha) e_1.
            tail = 0;
            int row = 2 * k * n;
            for (int j = k + 2; j < n; j++) {
                tail += a[row + 2 * j] * a[row + 2 * j] + a[row + 2 * j + 1] * a[row + 2 * j + 1];
            }
            int k1 = row + 2 * (k + 1);
            double y0r = a[k1];
            double y0i = -a[k1 + 1];
            if (tail == 0) {
                betaRight[k] = 0;
                e[2 * k] = a[k1];
                e[2 * k + 1] = a[k1 + 1];
                continue;
            }
            double abs0 = Math.sqrt(y0r * y0r + y0i * y0i);
            double norm = Math.sqrt(abs0 * abs0 + tail);
            double pr = 1;
            double pi = 0;
            if (abs0 > 0) {
                pr = y0r / abs0;
                pi = y0i / abs0;
            }
            // alpha = -phase * norm, and e = conj(alpha)
            e[2 * k] = -pr * norm;
            e[2 * k + 1] = pi * norm;
            a[k1] = pr * (abs0 + norm);
            a[k1 + 1] = pi * (abs0 + norm);
            for (int j = k + 2; j < n; j++) {
                a[row + 2 * j + 1] = -a[row + 2 * j + 1];
            }
            double beta = 1 / (norm * (norm + abs0));
            betaRight[k] = beta;
            applyRight(a, m, n, k, beta);
        }
    }

    /** Applies left reflector k (in column k) to columns {@code k+1..n-1}, rows k..m-1. */
    private static void applyLeft(double[] a, int m, int n, int k, double beta, double[] w) {
        int from = 2 * (k + 1);
        int to = 2 * n;
        java.util.Arrays.fill(w, from, to, 0);
        for (int i = k; i < m; i++) {
            int row = 2 * i * n;
            final double vr = a[row + 2 * k];
            final double vi = -a[row + 2 * k + 1]; // conj(v_i)
            for (int j = from; j < to; j += 2) {
                final double xr = a[row + j];
                final double xi = a[row + j + 1];
                w[j] += vr * xr - vi * xi;
                w[j + 1] += vr * xi + vi * xr;
            }
        }
        for (int i = k; i < m; i++) {
            int row = 2 * i * n;
            final double vr = beta * a[row + 2 * k];
            final double vi = beta * a[row + 2 * k + 1];
            for (int j = from; j < to; j += 2) {
                final double wr = w[j];
                final double wi = w[j + 1];
                a[row + j] -= vr * wr - vi * wi;
                a[row + j + 1] -= vr * wi + vi * wr;
            }
        }
    }

    /** Applies right reflector k (in row k, from column k+1) to rows k+1..m-1. */
    private static void applyRight(double[] a, int m, int n, int k, double beta) {
        int from = 2 * (k + 1);
        int to = 2 * n;
        int vrow = 2 * k * n;
        for (int i = k + 1; i < m; i++) {
            int row = 2 * i * n;
            double tr = 0;
            double ti = 0;
            for (int j = from; j < to; j += 2) {
                final double xr = a[row + j];
                final double xi = a[row + j + 1];
                final double vr = a[vrow + j];
                final double vi = a[vrow + j + 1];
                tr += xr * vr - xi * vi;
                ti += xr * vi + xi * vr;
            }
            tr *= beta;
            ti *= beta;
            for (int j = from; j < to; j += 2) {
                final double vr = a[vrow + j];
                final double vi = -a[vrow + j + 1]; // conj(v_j)
                a[row + j] -= tr * vr - ti * vi;
                a[row + j + 1] -= tr * vi + ti * vr;
            }
        }
    }

    /**
     * Returns {@code W = U_B^H} restricted to its first n rows ({@code n x m}): the product
     * {@code E^T H_{n-1} ... H_0} of the left reflectors, formed backwards so that only the
     * rows and columns a reflector touches are updated (Golub and Van Loan 2013, §5.1.6).
     */
    private static double[] leftVectors(double[] a, int m, int n, double[] beta) {
        double[] w = new double[2 * n * m];
        for (int i = 0; i < n; i++) {
            w[2 * (i * m + i)] = 1;
        }
        for (int k = n - 1; k >= 0; k--) {
            double b = beta[k];
            if (b == 0) {
                continue;
            }
            for (int i = k; i < n; i++) {
                int row = 2 * i * m;
                double sr = 0;
                double si = 0;
                for (int r = k; r < m; r++) {
                    int at = 2 * (r * n + k);
                    final double vr = a[at];
                    final double vi = a[at + 1];
                    final double xr = w[row + 2 * r];
                    final double xi = w[row + 2 * r + 1];
                    sr += xr * vr - xi * vi;
                    si += xr * vi + xi * vr;
                }
                if (sr == 0 && si == 0) {
                    continue;
                }
                sr *= b;
                si *= b;
                for (int r = k; r < m; r++) {
                    int at = 2 * (r * n + k);
                    final double vr = a[at];
                    final double vi = -a[at + 1];
                    w[row + 2 * r] -= sr * vr - si * vi;
                    w[row + 2 * r + 1] -= sr * vi + si * vr;
                }
            }
        }
        return w;
    }

    /**
     * Returns {@code Z = V_B^H} ({@code n x n}): the product {@code G_{n-2} ... G_0} of the right
     * reflectors, formed backwards.
     */
    private static double[] rightVectors(double[] a, int n, double[] beta) {
        double[] z = new double[2 * n * n];
        for (int i = 0; i < n; i++) {
            z[2 * (i * n + i)] = 1;
        }
        for (int k = n - 2; k >= 0; k--) {
            double b = beta[k];
            if (b == 0) {
                continue;
            }
            int vrow = 2 * k * n;
            for (int i = k + 1; i < n; i++) {
                int row = 2 * i * n;
                double sr = 0;
                double si = 0;
                for (int c = 2 * (k + 1); c < 2 * n; c += 2) {
                    final double vr = a[vrow + c];
                    final double vi = a[vrow + c + 1];
                    final double xr = z[row + c];
                    final double xi = z[row + c + 1];
                    sr += xr * vr - xi * vi;
                    si += xr * vi + xi * vr;
                }
                if (sr == 0 && si == 0) {
                    continue;
                }
                sr *= b;
                si *= b;
                for (int c = 2 * (k + 1); c < 2 * n; c += 2) {
                    final double vr = a[vrow + c];
                    final double vi = -a[vrow + c + 1];
                    z[row + c] -= sr * vr - si * vi;
                    z[row + c + 1] -= sr * vi + si * vr;
                }
            }
        }
        return z;
    }

    /**
     * Makes the bidiagonal real and non-negative: {@code B = P B_r Q^H} with diagonal unitary
     * {@code P}, {@code Q}; the phases go into the vectors ({@code W <- P^H W},
     * {@code Z <- Q^H Z}).
     */
    private static void makeReal(double[] d, double[] e, double[] dr, double[] er, double[] w,
            int m, double[] z, int n) {
        double qr = 1;
        double qi = 0;
        for (int k = 0; k < n; k++) {
            // t = d_k q_k; p_k = t / |t|
            double tr = d[2 * k] * qr - d[2 * k + 1] * qi;
            double ti = d[2 * k] * qi + d[2 * k + 1] * qr;
            double abs = Math.sqrt(tr * tr + ti * ti);
            double pr = 1;
            double pi = 0;
            if (abs > 0) {
                pr = tr / abs;
                pi = ti / abs;
            }
            dr[k] = abs;
            scaleRow(w, k, m, pr, -pi);
            scaleRow(z, k, n, qr, -qi);
            if (k < n - 1) {
                // t2 = conj(p_k) e_k; q_{k+1} = conj(t2) / |t2|
                double er0 = e[2 * k];
                double ei0 = e[2 * k + 1];
                double sr = pr * er0 + pi * ei0;
                double si = pr * ei0 - pi * er0;
                double abs2 = Math.sqrt(sr * sr + si * si);
                er[k] = abs2;
                if (abs2 > 0) {
                    qr = sr / abs2;
                    qi = -si / abs2;
                } else {
                    qr = 1;
                    qi = 0;
                }
            }
        }
    }

    /** Multiplies row k (length len) by {@code (cr + i ci)}. */
    private static void scaleRow(double[] x, int k, int len, double cr, double ci) {
        if (cr == 1 && ci == 0) {
            return;
        }
        int row = 2 * k * len;
        for (int j = row; j < row + 2 * len; j += 2) {
            double xr = x[j];
            double xi = x[j + 1];
            x[j] = cr * xr - ci * xi;
            x[j + 1] = cr * xi + ci * xr;
        }
    }

    /**
     * Rotates rows i and j of an {@code ? x len} matrix: {@code x_i <- c x_i + s x_j},
     * {@code x_j <- -s x_i + c x_j}.
     */
    private static void rotateRows(double[] x, int len, int i, int j, double c, double s) {
        int a = 2 * i * len;
        int b = 2 * j * len;
        int end = a + 2 * len;
        for (; a < end; a++, b++) {
            final double xa = x[a];
            final double xb = x[b];
            x[a] = c * xa + s * xb;
            x[b] = c * xb - s * xa;
        }
    }

    /**
     * Implicit-shift QR on the real bidiagonal {@code (d, e)} until every superdiagonal entry is
     * negligible (Golub and Van Loan 2013, Algorithms 8.6.1 and 8.6.2). Rows of {@code w} (left
     * vectors, length m) and {@code z} (right vectors, length n) follow the rotations.
     */
    private static void diagonalise(double[] d, double[] e, double[] w, int m, double[] z,
            int n) {
        double norm = 0;
        for (int k = 0; k < n; k++) {
            norm = Math.max(norm, Math.abs(d[k]) + (k < n - 1 ? Math.abs(e[k]) : 0));
        }
        double small = EPS * norm;
        long steps = 0;
        long maxSteps = (long) MAX_STEPS_PER_VALUE * n;
        double[] rot = new double[3];
        int hi = n - 1;
        while (hi > 0) {
            if (Math.abs(e[hi - 1]) <= EPS * (Math.abs(d[hi - 1]) + Math.abs(d[hi]))) {
                e[hi - 1] = 0;
                hi--;
                continue;
            }
            int lo = hi - 1;
            while (lo > 0) {
                if (Math.abs(e[lo - 1]) <= EPS * (Math.abs(d[lo - 1]) + Math.abs(d[lo]))) {
                    e[lo - 1] = 0;
                    break;
                }
                lo--;
            }
            // A zero on the diagonal of the block: rotate its superdiagonal entry away.
            int zero = -1;
            for (int k = lo; k <= hi; k++) {
                if (Math.abs(d[k]) <= small) {
                    d[k] = 0;
                    zero = k;
                    break;
                }
            }
            if (zero >= 0) {
                if (zero < hi) {
                    chaseRow(d, e, zero, hi, w, m, rot);
                } else {
                    chaseColumn(d, e, lo, hi, z, n, rot);
                }
                continue;
            }
            if (++steps > maxSteps) {
                throw new IllegalStateException("the singular value decomposition of a " + n
                        + "-column matrix did not converge in " + maxSteps + " QR steps");
            }
            step(d, e, lo, hi, w, m, z, n, rot);
        }
    }

    /**
     * Sets {@code rot} to {@code (c, s, r)} with {@code r = sqrt(y² + z²)}, {@code c = y/r},
     * {@code s = z/r}, computed without overflow or underflow.
     */
    private static void givens(double y, double z, double[] rot) {
        if (z == 0) {
            rot[0] = 1;
            rot[1] = 0;
            rot[2] = y;
            return;
        }
        if (y == 0) {
            rot[0] = 0;
            rot[1] = 1;
            rot[2] = z;
            return;
        }
        double scale = Math.abs(y) + Math.abs(z);
        double ys = y / scale;
        double zs = z / scale;
        double r = scale * Math.sqrt(ys * ys + zs * zs);
        rot[0] = y / r;
        rot[1] = z / r;
        rot[2] = r;
    }

    /** One implicit-shift Golub-Kahan step on the block {@code [lo, hi]} (Algorithm 8.6.1). */
    private static void step(double[] d, double[] e, int lo, int hi, double[] w, int m,
            double[] z, int n, double[] rot) {
        // Wilkinson shift: the eigenvalue of the trailing 2x2 of B^T B nearer its last entry.
        double dm = d[hi - 1];
        double em = e[hi - 1];
        double ep = hi - 1 > lo ? e[hi - 2] : 0;
        double t11 = dm * dm + ep * ep;
        double t12 = dm * em;
        double t22 = d[hi] * d[hi] + em * em;
        double delta = (t11 - t22) / 2;
        double root = Math.sqrt(delta * delta + t12 * t12);
        double denom = delta + (delta >= 0 ? root : -root);
        double mu = denom == 0 ? t22 : t22 - t12 * t12 / denom;
        double y = d[lo] * d[lo] - mu;
        double x = d[lo] * e[lo];
        for (int k = lo; k < hi; k++) {
            givens(y, x, rot);
            double c = rot[0];
            double s = rot[1];
            if (k > lo) {
                e[k - 1] = rot[2];
            }
            double f = d[k];
            double g = e[k];
            d[k] = c * f + s * g;
            e[k] = c * g - s * f;
            double bulge = s * d[k + 1];
            d[k + 1] = c * d[k + 1];
            rotateRows(z, n, k, k + 1, c, s);
            givens(d[k], bulge, rot);
            c = rot[0];
            s = rot[1];
            d[k] = rot[2];
            f = e[k];
            g = d[k + 1];
            e[k] = c * f + s * g;
            d[k + 1] = c * g - s * f;
            if (k < hi - 1) {
                x = s * e[k + 1];
                e[k + 1] = c * e[k + 1];
                y = e[k];
            }
            rotateRows(w, m, k, k + 1, c, s);
        }
    }

    /** Zeros {@code e[k]} next to {@code d[k] = 0} by rotations of rows k and j > k. */
    private static void chaseRow(double[] d, double[] e, int k, int hi, double[] w, int m,
            double[] rot) {
        double x = e[k];
        e[k] = 0;
        for (int j = k + 1; j <= hi; j++) {
            givens(d[j], x, rot);
            double c = rot[0];
            double s = rot[1];
            d[j] = rot[2];
            rotateRows(w, m, j, k, c, s);
            if (j < hi) {
                x = -s * e[j];
                e[j] = c * e[j];
            }
        }
    }

    /** Zeros {@code e[hi-1]} above {@code d[hi] = 0} by rotations of columns j < hi and hi. */
    private static void chaseColumn(double[] d, double[] e, int lo, int hi, double[] z, int n,
            double[] rot) {
        double x = e[hi - 1];
        e[hi - 1] = 0;
        for (int j = hi - 1; j >= lo; j--) {
            givens(d[j], x, rot);
            double c = rot[0];
            double s = rot[1];
            d[j] = rot[2];
            rotateRows(z, n, j, hi, c, s);
            if (j > lo) {
                x = -s * e[j - 1];
                e[j - 1] = c * e[j - 1];
            }
        }
    }

    /** Makes the values non-negative and sorts them descending, with their vectors. */
    private static void finish(double[] d, double[] w, int m, double[] z, int n) {
        for (int k = 0; k < n; k++) {
            if (d[k] < 0) {
                d[k] = -d[k];
                scaleRow(z, k, n, -1, 0);
            }
        }
        for (int k = 0; k < n - 1; k++) {
            int best = k;
            for (int j = k + 1; j < n; j++) {
                if (d[j] > d[best]) {
                    best = j;
                }
            }
            if (best != k) {
                double t = d[k];
                d[k] = d[best];
                d[best] = t;
                swapRows(w, m, k, best);
                swapRows(z, n, k, best);
            }
        }
    }

    private static void swapRows(double[] x, int len, int i, int j) {
        int a = 2 * i * len;
        int b = 2 * j * len;
        for (int t = 0; t < 2 * len; t++) {
            double v = x[a + t];
            x[a + t] = x[b + t];
            x[b + t] = v;
        }
    }
}
