package dev.qsim;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.function.BiConsumer;
import java.util.function.IntFunction;
import java.util.function.Supplier;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;

/**
 * A deliberately simple, independent dense-matrix model of circuits, used as the reference in
 * tests. Nothing here calls qsim's kernels or reads qsim's gate constants: every gate matrix is
 * written out by hand from Nielsen &amp; Chuang (2010), <i>Quantum Computation and Quantum
 * Information</i>, sec. 4.2 (eqs. 4.4-4.6 for the rotations), or from the conventions fixed in
 * DESIGN.md (SQRT_X, phase, cphase, rzz), and every n-qubit matrix is built from Kronecker
 * products of 2x2 matrices with identities, or from sums of such products (projector sums for
 * controlled gates, matrix-unit sums for general operators). Circuits are then multiplied out in
 * full. Slow on purpose: O(4^n) memory per gate, fine up to 8 qubits.
 *
 * <p>Bit order (DESIGN.md): qubit k is bit k of a basis index, so the full matrix of per-qubit
 * factors F_q is F_{n-1} ⊗ ... ⊗ F_1 ⊗ F_0 with the ordinary Kronecker product in which
 * {@code a ⊗ b} puts {@code b} on the low bits.
 *
 * <p>Also holds the random-circuit generator shared by the reference and property tests: each
 * random instruction is recorded both into a {@link Circuit.Builder} and as a {@link Step} that
 * knows its own full reference matrix.
 */
final class DenseReference {

    private DenseReference() {
    }

    // ---------------------------------------------------------------------------------------
    // A tiny complex matrix: separate real and imaginary double[][] (rows, columns).
    // ---------------------------------------------------------------------------------------

    /** A square complex matrix with separate real and imaginary parts. Mutable, unshared. */
    static final class Matrix {
        final int dim;
        final double[][] re;
        final double[][] im;

        Matrix(int dim) {
            this.dim = dim;
            this.re = new double[dim][dim];
            this.im = new double[dim][dim];
        }
    }

    /** Builds a 2x2 matrix from row-major (re, im) pairs: a, b / c, d. */
    static Matrix m2(double ar, double ai, double br, double bi,
                     double cr, double ci, double dr, double di) {
        Matrix m = new Matrix(2);
        m.re[0][0] = ar;
        m.im[0][0] = ai;
        m.re[0][1] = br;
        m.im[0][1] = bi;
        m.re[1][0] = cr;
        m.im[1][0] = ci;
        m.re[1][1] = dr;
        m.im[1][1] = di;
        return m;
    }

    static Matrix identity(int dim) {
        Matrix m = new Matrix(dim);
        for (int i = 0; i < dim; i++) {
            m.re[i][i] = 1;
        }
        return m;
    }

    /** Ordinary Kronecker product: (a ⊗ b)[i*db + k][j*db + l] = a[i][j] * b[k][l]. */
    static Matrix kron(Matrix a, Matrix b) {
        int db = b.dim;
        Matrix r = new Matrix(a.dim * db);
        for (int i = 0; i < a.dim; i++) {
            for (int j = 0; j < a.dim; j++) {
                double xr = a.re[i][j];
                double xi = a.im[i][j];
                if (xr == 0 && xi == 0) {
                    continue;
                }
                for (int k = 0; k < db; k++) {
                    for (int l = 0; l < db; l++) {
                        r.re[i * db + k][j * db + l] = xr * b.re[k][l] - xi * b.im[k][l];
                        r.im[i * db + k][j * db + l] = xr * b.im[k][l] + xi * b.re[k][l];
                    }
                }
            }
        }
        return r;
    }

    /** Matrix product a·b (b acts first). */
    static Matrix multiply(Matrix a, Matrix b) {
        int d = a.dim;
        Matrix r = new Matrix(d);
        for (int i = 0; i < d; i++) {
            for (int k = 0; k < d; k++) {
                double xr = a.re[i][k];
                double xi = a.im[i][k];
                if (xr == 0 && xi == 0) {
                    continue;
                }
                double[] br = b.re[k];
                double[] bi = b.im[k];
                double[] rr = r.re[i];
                double[] ri = r.im[i];
                for (int j = 0; j < d; j++) {
                    rr[j] += xr * br[j] - xi * bi[j];
                    ri[j] += xr * bi[j] + xi * br[j];
                }
            }
        }
        return r;
    }

    /** a + s·b for a complex scalar s = (sr, si). */
    static Matrix addScaled(Matrix a, double sr, double si, Matrix b) {
        int d = a.dim;
        Matrix r = new Matrix(d);
        for (int i = 0; i < d; i++) {
            for (int j = 0; j < d; j++) {
                r.re[i][j] = a.re[i][j] + sr * b.re[i][j] - si * b.im[i][j];
                r.im[i][j] = a.im[i][j] + sr * b.im[i][j] + si * b.re[i][j];
            }
        }
        return r;
    }

    /** Complex scalar times a matrix. */
    static Matrix scale(double sr, double si, Matrix a) {
        return addScaled(new Matrix(a.dim), sr, si, a);
    }

    /** Conjugate transpose. */
    static Matrix dagger(Matrix a) {
        int d = a.dim;
        Matrix r = new Matrix(d);
        for (int i = 0; i < d; i++) {
            for (int j = 0; j < d; j++) {
                r.re[j][i] = a.re[i][j];
                r.im[j][i] = -a.im[i][j];
            }
        }
        return r;
    }

    /** Matrix times column vector (re, im). */
    static double[][] apply(Matrix m, double[][] v) {
        int d = m.dim;
        double[] vr = v[0];
        double[] vi = v[1];
        double[] or = new double[d];
        double[] oi = new double[d];
        for (int i = 0; i < d; i++) {
            double sr = 0;
            double si = 0;
            double[] mr = m.re[i];
            double[] mi = m.im[i];
            for (int j = 0; j < d; j++) {
                sr += mr[j] * vr[j] - mi[j] * vi[j];
                si += mr[j] * vi[j] + mi[j] * vr[j];
            }
            or[i] = sr;
            oi[i] = si;
        }
        return new double[][] {or, oi};
    }

    // ---------------------------------------------------------------------------------------
    // Textbook 2x2 matrices, written out by hand.
    // ---------------------------------------------------------------------------------------

    private static final double R = 1 / Math.sqrt(2);

    /** Identity (N&C 2010 sec. 4.2). */
    static Matrix i2() {
        return identity(2);
    }

    /** Pauli X = [[0,1],[1,0]] (N&C 2010 sec. 4.2). */
    static Matrix x() {
        return m2(0, 0, 1, 0, 1, 0, 0, 0);
    }

    /** Pauli Y = [[0,-i],[i,0]] (N&C 2010 sec. 4.2). */
    static Matrix y() {
        return m2(0, 0, 0, -1, 0, 1, 0, 0);
    }

    /** Pauli Z = [[1,0],[0,-1]] (N&C 2010 sec. 4.2). */
    static Matrix z() {
        return m2(1, 0, 0, 0, 0, 0, -1, 0);
    }

    /** Hadamard = [[1,1],[1,-1]]/sqrt2 (N&C 2010 sec. 4.2). */
    static Matrix h() {
        return m2(R, 0, R, 0, R, 0, -R, 0);
    }

    /** Phase gate S = [[1,0],[0,i]] (N&C 2010 sec. 4.2). */
    static Matrix s() {
        return m2(1, 0, 0, 0, 0, 0, 0, 1);
    }

    /** S dagger = [[1,0],[0,-i]] (conjugate transpose of S, N&C 2010 sec. 4.2). */
    static Matrix sDagger() {
        return m2(1, 0, 0, 0, 0, 0, 0, -1);
    }

    /** T = [[1,0],[0,e^{iπ/4}]] (N&C 2010 sec. 4.2, the π/8 gate). */
    static Matrix t() {
        return m2(1, 0, 0, 0, 0, 0, Math.cos(Math.PI / 4), Math.sin(Math.PI / 4));
    }

    /** T dagger = [[1,0],[0,e^{-iπ/4}]] (conjugate transpose of T). */
    static Matrix tDagger() {
        return m2(1, 0, 0, 0, 0, 0, Math.cos(Math.PI / 4), -Math.sin(Math.PI / 4));
    }

    /** SQRT_X = ½[[1+i, 1−i], [1−i, 1+i]] (DESIGN.md conventions). */
    static Matrix sqrtX() {
        return m2(0.5, 0.5, 0.5, -0.5, 0.5, -0.5, 0.5, 0.5);
    }

    /** rx(θ) = [[cos θ/2, −i sin θ/2], [−i sin θ/2, cos θ/2]] (N&C 2010 eq. 4.4). */
    static Matrix rx(double theta) {
        double c = Math.cos(theta / 2);
        double s = Math.sin(theta / 2);
        return m2(c, 0, 0, -s, 0, -s, c, 0);
    }

    /** ry(θ) = [[cos θ/2, −sin θ/2], [sin θ/2, cos θ/2]] (N&C 2010 eq. 4.5). */
    static Matrix ry(double theta) {
        double c = Math.cos(theta / 2);
        double s = Math.sin(theta / 2);
        return m2(c, 0, -s, 0, s, 0, c, 0);
    }

    /** rz(θ) = diag(e^{−iθ/2}, e^{iθ/2}) (N&C 2010 eq. 4.6). */
    static Matrix rz(double theta) {
        double c = Math.cos(theta / 2);
        double s = Math.sin(theta / 2);
        return m2(c, -s, 0, 0, 0, 0, c, s);
    }

    /** phase(λ) = diag(1, e^{iλ}) (DESIGN.md conventions). */
    static Matrix phase(double lambda) {
        return m2(1, 0, 0, 0, 0, 0, Math.cos(lambda), Math.sin(lambda));
    }

    /** Projector |0><0|. */
    static Matrix p0() {
        return m2(1, 0, 0, 0, 0, 0, 0, 0);
    }

    /** Projector |1><1|. */
    static Matrix p1() {
        return m2(0, 0, 0, 0, 0, 0, 1, 0);
    }

    /** Matrix unit |r><c| for r, c in {0, 1}. */
    static Matrix unit(int r, int c) {
        Matrix m = new Matrix(2);
        m.re[r][c] = 1;
        return m;
    }

    // ---------------------------------------------------------------------------------------
    // n-qubit matrices from per-qubit factors.
    // ---------------------------------------------------------------------------------------

    /**
     * The n-qubit matrix F_{n-1} ⊗ ... ⊗ F_0 where F_q is {@code factors[q]} or the identity
     * where that entry is null.
     */
    static Matrix onQubits(int n, Matrix[] factors) {
        Matrix r = identity(1);
        for (int q = n - 1; q >= 0; q--) {
            Matrix f = factors[q] == null ? i2() : factors[q];
            r = kron(r, f);
        }
        return r;
    }

    /** A 2x2 matrix on one qubit of n, identity elsewhere. */
    static Matrix single(int n, int q, Matrix u) {
        Matrix[] f = new Matrix[n];
        f[q] = u;
        return onQubits(n, f);
    }

    /** Two per-qubit factors on an n-qubit system, identity elsewhere. */
    static Matrix pair(int n, int qa, Matrix a, int qb, Matrix b) {
        Matrix[] f = new Matrix[n];
        f[qa] = a;
        f[qb] = b;
        return onQubits(n, f);
    }

    /** CNOT = |0><0|_c ⊗ I + |1><1|_c ⊗ X_t (N&C 2010 sec. 4.3, controlled-U as projectors). */
    static Matrix cnot(int n, int c, int t) {
        return addScaled(single(n, c, p0()), 1, 0, pair(n, c, p1(), t, x()));
    }

    /** CZ = |0><0|_a ⊗ I + |1><1|_a ⊗ Z_b (N&C 2010 sec. 4.3). */
    static Matrix cz(int n, int a, int b) {
        return addScaled(single(n, a, p0()), 1, 0, pair(n, a, p1(), b, z()));
    }

    /** cphase(λ) = |0><0|_c ⊗ I + |1><1|_c ⊗ phase(λ)_t = diag(1,1,1,e^{iλ}). */
    static Matrix cphase(int n, int c, int t, double lambda) {
        return addScaled(single(n, c, p0()), 1, 0, pair(n, c, p1(), t, phase(lambda)));
    }

    /**
     * SWAP = Σ_{i,j} |i><j|_a ⊗ |j><i|_b: exchanges the two qubits' states (N&C 2010
     * sec. 1.3.4 builds it from three CNOTs; section from memory).
     */
    static Matrix swap(int n, int a, int b) {
        Matrix r = new Matrix(1 << n);
        for (int i = 0; i < 2; i++) {
            for (int j = 0; j < 2; j++) {
                r = addScaled(r, 1, 0, pair(n, a, unit(i, j), b, unit(j, i)));
            }
        }
        return r;
    }

    /** rzz(θ) = exp(−iθ Z⊗Z/2) = cos(θ/2) I − i sin(θ/2) Z_a Z_b, since (Z⊗Z)² = I. */
    static Matrix rzz(int n, int a, int b, double theta) {
        return addScaled(scale(Math.cos(theta / 2), 0, identity(1 << n)),
                0, -Math.sin(theta / 2), pair(n, a, z(), b, z()));
    }

    /**
     * Toffoli = I − P1_c1 P1_c2 + P1_c1 P1_c2 X_t: X on the target iff both controls are 1
     * (N&C 2010 sec. 4.3).
     */
    static Matrix toffoli(int n, int c1, int c2, int t) {
        Matrix[] both = new Matrix[n];
        both[c1] = p1();
        both[c2] = p1();
        Matrix[] flip = both.clone();
        flip[t] = x();
        Matrix r = addScaled(identity(1 << n), -1, 0, onQubits(n, both));
        return addScaled(r, 1, 0, onQubits(n, flip));
    }

    /**
     * Fredkin = |0><0|_c ⊗ I + |1><1|_c ⊗ SWAP_ab, the controlled swap (N&C 2010 sec. 3.2.5;
     * section from memory).
     */
    static Matrix fredkin(int n, int c, int a, int b) {
        Matrix r = single(n, c, p0());
        for (int i = 0; i < 2; i++) {
            for (int j = 0; j < 2; j++) {
                Matrix[] f = new Matrix[n];
                f[c] = p1();
                f[a] = unit(i, j);
                f[b] = unit(j, i);
                r = addScaled(r, 1, 0, onQubits(n, f));
            }
        }
        return r;
    }

    /**
     * A k-qubit matrix u placed on qubits (q_0, ..., q_{k-1}) of n, with matrix-index bit j on
     * qubit q_j (DESIGN.md), optionally controlled on |1> of every qubit in {@code controls}:
     * U_full = (I − P) + Σ_{r,c} u[r][c] · P ⊗_j |r_j><c_j|_{q_j}, with P = ⊗ |1><1| on the
     * controls (P = I when there are none). The matrix-unit expansion of u.
     */
    static Matrix general(int n, Matrix u, int[] controls, int[] targets) {
        int k = targets.length;
        int d = 1 << k;
        Matrix r = new Matrix(1 << n);
        if (controls.length > 0) {
            Matrix[] proj = new Matrix[n];
            for (int c : controls) {
                proj[c] = p1();
            }
            r = addScaled(identity(1 << n), -1, 0, onQubits(n, proj));
        }
        for (int row = 0; row < d; row++) {
            for (int col = 0; col < d; col++) {
                double ur = u.re[row][col];
                double ui = u.im[row][col];
                if (ur == 0 && ui == 0) {
                    continue;
                }
                Matrix[] f = new Matrix[n];
                for (int c : controls) {
                    f[c] = p1();
                }
                for (int j = 0; j < k; j++) {
                    f[targets[j]] = unit((row >> j) & 1, (col >> j) & 1);
                }
                r = addScaled(r, ur, ui, onQubits(n, f));
            }
        }
        return r;
    }

    // ---------------------------------------------------------------------------------------
    // Random unitaries and states (independent of qsim).
    // ---------------------------------------------------------------------------------------

    /** Standard normal deviate by the Box-Muller transform (common practice). */
    static double gaussian(UniformRandomProvider rng) {
        double u1 = 1 - rng.nextDouble(); // in (0, 1]
        double u2 = rng.nextDouble();
        return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
    }

    /**
     * A random unitary of dimension d: modified Gram-Schmidt on the columns of a complex
     * Gaussian matrix (common practice; the columns of the result are orthonormal to ~1e-15).
     */
    static Matrix randomUnitary(int d, UniformRandomProvider rng) {
        double[][] cr = new double[d][d]; // cr[col][row]
        double[][] ci = new double[d][d];
        for (int c = 0; c < d; c++) {
            for (int r = 0; r < d; r++) {
                cr[c][r] = gaussian(rng);
                ci[c][r] = gaussian(rng);
            }
            for (int pass = 0; pass < 2; pass++) { // re-orthogonalise once for accuracy
                for (int p = 0; p < c; p++) {
                    double sr = 0;
                    double si = 0;
                    for (int r = 0; r < d; r++) { // <p|c>
                        sr += cr[p][r] * cr[c][r] + ci[p][r] * ci[c][r];
                        si += cr[p][r] * ci[c][r] - ci[p][r] * cr[c][r];
                    }
                    for (int r = 0; r < d; r++) {
                        cr[c][r] -= sr * cr[p][r] - si * ci[p][r];
                        ci[c][r] -= sr * ci[p][r] + si * cr[p][r];
                    }
                }
            }
            double norm = 0;
            for (int r = 0; r < d; r++) {
                norm += cr[c][r] * cr[c][r] + ci[c][r] * ci[c][r];
            }
            norm = Math.sqrt(norm);
            for (int r = 0; r < d; r++) {
                cr[c][r] /= norm;
                ci[c][r] /= norm;
            }
        }
        Matrix m = new Matrix(d);
        for (int c = 0; c < d; c++) {
            for (int r = 0; r < d; r++) {
                m.re[r][c] = cr[c][r];
                m.im[r][c] = ci[c][r];
            }
        }
        return m;
    }

    /** A random normalised state vector (re, im) of dimension d. */
    static double[][] randomState(int d, UniformRandomProvider rng) {
        double[] re = new double[d];
        double[] im = new double[d];
        double norm = 0;
        for (int i = 0; i < d; i++) {
            re[i] = gaussian(rng);
            im[i] = gaussian(rng);
            norm += re[i] * re[i] + im[i] * im[i];
        }
        norm = Math.sqrt(norm);
        for (int i = 0; i < d; i++) {
            re[i] /= norm;
            im[i] /= norm;
        }
        return new double[][] {re, im};
    }

    /** The basis state |index> of dimension d. */
    static double[][] basisState(int d, int index) {
        double[][] v = new double[2][d];
        v[0][index] = 1;
        return v;
    }

    // ---------------------------------------------------------------------------------------
    // Conversions to and from qsim's public types.
    // ---------------------------------------------------------------------------------------

    static Operator toOperator(Matrix m) {
        Complex[][] rows = new Complex[m.dim][m.dim];
        for (int i = 0; i < m.dim; i++) {
            for (int j = 0; j < m.dim; j++) {
                rows[i][j] = Complex.ofCartesian(m.re[i][j], m.im[i][j]);
            }
        }
        return Operator.of(rows);
    }

    static StateVector toState(double[][] v) {
        Complex[] a = new Complex[v[0].length];
        for (int i = 0; i < a.length; i++) {
            a[i] = Complex.ofCartesian(v[0][i], v[1][i]);
        }
        return StateVector.of(a);
    }

    static double[][] amplitudes(StateVector s) {
        int d = (int) s.dimension();
        double[][] v = new double[2][d];
        for (int i = 0; i < d; i++) {
            Complex a = s.amplitude(i);
            v[0][i] = a.getReal();
            v[1][i] = a.getImaginary();
        }
        return v;
    }

    /** Largest |expected[r][c] − actual.get(r, c)| over all entries; fails on size mismatch. */
    static double maxDistance(Matrix expected, Operator actual) {
        if (actual.dimension() != expected.dim) {
            throw new AssertionError("operator dimension " + actual.dimension()
                    + " but the reference has " + expected.dim);
        }
        double worst = 0;
        for (int i = 0; i < expected.dim; i++) {
            for (int j = 0; j < expected.dim; j++) {
                Complex a = actual.get(i, j);
                worst = Math.max(worst, Math.hypot(a.getReal() - expected.re[i][j],
                        a.getImaginary() - expected.im[i][j]));
            }
        }
        return worst;
    }

    /** Largest |expected[i] − actual.amplitude(i)| over all amplitudes. */
    static double maxDistance(double[][] expected, StateVector actual) {
        if (actual.dimension() != expected[0].length) {
            throw new AssertionError("state dimension " + actual.dimension()
                    + " but the reference has " + expected[0].length);
        }
        double worst = 0;
        for (int i = 0; i < expected[0].length; i++) {
            Complex a = actual.amplitude(i);
            worst = Math.max(worst, Math.hypot(a.getReal() - expected[0][i],
                    a.getImaginary() - expected[1][i]));
        }
        return worst;
    }

    /** Fails with the message if the operator differs from the reference by more than tol. */
    static void assertClose(Matrix expected, Operator actual, double tol, Supplier<String> what) {
        double d = maxDistance(expected, actual);
        if (!(d <= tol)) {
            throw new AssertionError(what.get() + ": max entry distance " + d + " > " + tol);
        }
    }

    /** Fails with the message if the state differs from the reference by more than tol. */
    static void assertClose(double[][] expected, StateVector actual, double tol,
                            Supplier<String> what) {
        double d = maxDistance(expected, actual);
        if (!(d <= tol)) {
            throw new AssertionError(what.get() + ": max amplitude distance " + d + " > " + tol);
        }
    }

    // ---------------------------------------------------------------------------------------
    // Random circuits: each instruction is recorded in a builder and as a reference Step.
    // ---------------------------------------------------------------------------------------

    /** One recorded instruction: how to add it to a builder, and its full reference matrix. */
    interface Step {
        /** Adds this instruction to the builder, on the same qubits as the reference. */
        default void addTo(Circuit.Builder b) {
            addTo(b, null);
        }

        /**
         * Adds this instruction to the builder with reference qubit q placed on builder qubit
         * {@code map[q]} ({@code null}: no relabelling).
         */
        void addTo(Circuit.Builder b, int[] map);

        /** The full 2^n x 2^n reference matrix. */
        Matrix matrix(int n);

        /** A short description for failure messages. */
        String describe();
    }

    /** The builder gate kinds, by name. */
    static final List<String> KINDS = List.of(
            "h", "x", "y", "z", "s", "sDagger", "t", "tDagger", "sqrtX",
            "rx", "ry", "rz", "phase",
            "cnot", "cz", "cphase", "swap", "rzz",
            "toffoli", "fredkin", "apply", "controlled");

    /** The fewest qubits a kind needs. */
    static int minQubits(String kind) {
        switch (kind) {
            case "cnot": case "cz": case "cphase": case "swap": case "rzz": case "controlled":
                return 2;
            case "toffoli": case "fredkin":
                return 3;
            default:
                return 1;
        }
    }

    /** Distinct random qubits of 0..n-1, count of them. */
    static int[] distinctQubits(int n, int count, UniformRandomProvider rng) {
        int[] all = new int[n];
        for (int i = 0; i < n; i++) {
            all[i] = i;
        }
        for (int i = 0; i < count; i++) { // partial Fisher-Yates
            int j = i + rng.nextInt(n - i);
            int tmp = all[i];
            all[i] = all[j];
            all[j] = tmp;
        }
        int[] r = new int[count];
        System.arraycopy(all, 0, r, 0, count);
        return r;
    }

    static double randomAngle(UniformRandomProvider rng) {
        return (rng.nextDouble() * 4 - 2) * Math.PI;
    }

    /** A random instruction of the given kind on n qubits (n >= minQubits(kind)). */
    static Step randomStep(String kind, int n, UniformRandomProvider rng) {
        switch (kind) {
            case "h":
                return one(kind, n, rng, DenseReference::h, Circuit.Builder::h);
            case "x":
                return one(kind, n, rng, DenseReference::x, Circuit.Builder::x);
            case "y":
                return one(kind, n, rng, DenseReference::y, Circuit.Builder::y);
            case "z":
                return one(kind, n, rng, DenseReference::z, Circuit.Builder::z);
            case "s":
                return one(kind, n, rng, DenseReference::s, Circuit.Builder::s);
            case "sDagger":
                return one(kind, n, rng, DenseReference::sDagger, Circuit.Builder::sDagger);
            case "t":
                return one(kind, n, rng, DenseReference::t, Circuit.Builder::t);
            case "tDagger":
                return one(kind, n, rng, DenseReference::tDagger, Circuit.Builder::tDagger);
            case "sqrtX":
                return one(kind, n, rng, DenseReference::sqrtX, Circuit.Builder::sqrtX);
            case "rx": case "ry": case "rz": case "phase": {
                int q = rng.nextInt(n);
                double a = randomAngle(rng);
                return step(kind + "(" + q + ", " + a + ")",
                    (b, p) -> {
                        switch (kind) {
                            case "rx":
                                b.rx(at(p, q), a);
                                break;
                            case "ry":
                                b.ry(at(p, q), a);
                                break;
                            case "rz":
                                b.rz(at(p, q), a);
                                break;
                            default:
                                b.phase(at(p, q), a);
                                break;
                        }
                    },
                    m -> {
                        switch (kind) {
                            case "rx":
                                return single(m, q, rx(a));
                            case "ry":
                                return single(m, q, ry(a));
                            case "rz":
                                return single(m, q, rz(a));
                            default:
                                return single(m, q, phase(a));
                        }
                    });
            }
            case "cnot": {
                int[] q = distinctQubits(n, 2, rng);
                return step("cnot(" + q[0] + ", " + q[1] + ")",
                    (b, p) -> b.cnot(at(p, q[0]), at(p, q[1])),
                    m -> cnot(m, q[0], q[1]));
            }
            case "cz": {
                int[] q = distinctQubits(n, 2, rng);
                return step("cz(" + q[0] + ", " + q[1] + ")",
                    (b, p) -> b.cz(at(p, q[0]), at(p, q[1])),
                    m -> cz(m, q[0], q[1]));
            }
            case "cphase": {
                int[] q = distinctQubits(n, 2, rng);
                double a = randomAngle(rng);
                return step("cphase(" + q[0] + ", " + q[1] + ", " + a + ")",
                    (b, p) -> b.cphase(at(p, q[0]), at(p, q[1]), a),
                    m -> cphase(m, q[0], q[1], a));
            }
            case "swap": {
                int[] q = distinctQubits(n, 2, rng);
                return step("swap(" + q[0] + ", " + q[1] + ")",
                    (b, p) -> b.swap(at(p, q[0]), at(p, q[1])),
                    m -> swap(m, q[0], q[1]));
            }
            case "rzz": {
                int[] q = distinctQubits(n, 2, rng);
                double a = randomAngle(rng);
                return step("rzz(" + q[0] + ", " + q[1] + ", " + a + ")",
                    (b, p) -> b.rzz(at(p, q[0]), at(p, q[1]), a),
                    m -> rzz(m, q[0], q[1], a));
            }
            case "toffoli": {
                int[] q = distinctQubits(n, 3, rng);
                return step("toffoli(" + q[0] + ", " + q[1] + ", " + q[2] + ")",
                    (b, p) -> b.toffoli(at(p, q[0]), at(p, q[1]), at(p, q[2])),
                    m -> toffoli(m, q[0], q[1], q[2]));
            }
            case "fredkin": {
                int[] q = distinctQubits(n, 3, rng);
                return step("fredkin(" + q[0] + ", " + q[1] + ", " + q[2] + ")",
                    (b, p) -> b.fredkin(at(p, q[0]), at(p, q[1]), at(p, q[2])),
                    m -> fredkin(m, q[0], q[1], q[2]));
            }
            case "apply": {
                int k = 1 + rng.nextInt(Math.min(3, n));
                int[] q = distinctQubits(n, k, rng);
                Matrix u = randomUnitary(1 << k, rng);
                Operator op = toOperator(u);
                return step("apply(random " + k + "-qubit unitary, " + Arrays.toString(q)
                        + ")", (b, p) -> b.apply(op, at(p, q)), m -> general(m, u, new int[0], q));
            }
            case "controlled": {
                int nc = 1 + rng.nextInt(Math.min(2, n - 1));
                int nt = 1 + rng.nextInt(Math.min(2, n - nc));
                int[] all = distinctQubits(n, nc + nt, rng);
                int[] controls = Arrays.copyOfRange(all, 0, nc);
                int[] targets = Arrays.copyOfRange(all, nc, nc + nt);
                Matrix u = randomUnitary(1 << nt, rng);
                Operator op = toOperator(u);
                return step("controlled(random " + nt + "-qubit unitary, controls "
                        + Arrays.toString(controls) + ", targets "
                        + Arrays.toString(targets) + ")",
                    (b, p) -> b.controlled(op, at(p, controls), at(p, targets)),
                    m -> general(m, u, controls, targets));
            }
            default:
                throw new IllegalArgumentException("unknown gate kind " + kind);
        }
    }

    /** A builder call on one qubit. */
    interface OneQubitCall {
        void add(Circuit.Builder b, int q);
    }

    private static Step one(String kind, int n, UniformRandomProvider rng,
                            Supplier<Matrix> matrix, OneQubitCall call) {
        int q = rng.nextInt(n);
        return step(kind + "(" + q + ")", (b, p) -> call.add(b, at(p, q)),
            m -> single(m, q, matrix.get()));
    }

    /** The builder qubit for reference qubit q. */
    static int at(int[] map, int q) {
        return map == null ? q : map[q];
    }

    /** The builder qubits for reference qubits qs. */
    static int[] at(int[] map, int[] qs) {
        int[] r = new int[qs.length];
        for (int i = 0; i < qs.length; i++) {
            r[i] = at(map, qs[i]);
        }
        return r;
    }

    private static Step step(String text, BiConsumer<Circuit.Builder, int[]> add,
                             IntFunction<Matrix> matrix) {
        return new Step() {
            @Override
            public void addTo(Circuit.Builder b, int[] map) {
                add.accept(b, map);
            }

            @Override
            public Matrix matrix(int n) {
                return matrix.apply(n);
            }

            @Override
            public String describe() {
                return text;
            }
        };
    }

    /** A random step of any kind that fits on n qubits. */
    static Step randomStep(int n, UniformRandomProvider rng) {
        while (true) {
            String kind = KINDS.get(rng.nextInt(KINDS.size()));
            if (minQubits(kind) <= n) {
                return randomStep(kind, n, rng);
            }
        }
    }

    /** Random steps, count of them, on n qubits. */
    static List<Step> randomSteps(int n, int count, UniformRandomProvider rng) {
        List<Step> steps = new ArrayList<>(count);
        for (int i = 0; i < count; i++) {
            steps.add(randomStep(n, rng));
        }
        return steps;
    }

    /** The circuit recorded by the steps. */
    static Circuit build(int n, List<Step> steps) {
        Circuit.Builder b = Circuit.builder(n);
        for (Step s : steps) {
            s.addTo(b);
        }
        return b.build();
    }

    /**
     * The circuit recorded by the steps on {@code qubits} builder qubits, reference qubit q
     * placed on builder qubit {@code map[q]}.
     */
    static Circuit build(int qubits, List<Step> steps, int[] map) {
        Circuit.Builder b = Circuit.builder(qubits);
        for (Step s : steps) {
            s.addTo(b, map);
        }
        return b.build();
    }

    /** The reference state: each step's full matrix applied in turn to the start vector. */
    static double[][] run(int n, List<Step> steps, double[][] start) {
        double[][] v = start;
        for (Step s : steps) {
            v = apply(s.matrix(n), v);
        }
        return v;
    }

    /** The reference matrix of the whole circuit: product of step matrices, last on the left. */
    static Matrix product(int n, List<Step> steps) {
        Matrix m = identity(1 << n);
        for (Step s : steps) {
            m = multiply(s.matrix(n), m);
        }
        return m;
    }
}
