package dev.qsim;

import java.util.Arrays;
import java.util.Objects;

import org.apache.commons.numbers.complex.Complex;

import dev.qsim.internal.Checks;

/**
 * An immutable complex square matrix of size {@code 2^k}, acting on {@code k} qubits.
 *
 * <p>Gates are unitary operators, but any square matrix of size {@code 2^k} is accepted here,
 * so observables (Hermitian matrices) are operators too; the circuit builder and
 * {@link StateVector#apply(Operator, int...)} refuse non-unitary ones. Bit {@code j} of a matrix
 * index refers to the {@code j}-th qubit the operator is applied to (see the
 * {@linkplain dev.qsim package conventions}).
 *
 * <p>Entries are held in one primitive array, real and imaginary parts interleaved, row-major.
 * {@link #equals(Object)} is exact (bitwise on the entries, as {@link Complex#equals(Object)});
 * tolerant comparisons take their tolerance, as {@link #isUnitary(double)} does. Instances are
 * thread-safe.
 *
 * <p>Reference: M. A. Nielsen and I. L. Chuang, <i>Quantum Computation and Quantum
 * Information</i> (2010), §2.1 (linear operators, tensor products) and §4.2.
 *
 * @since 0.1
 */
public final class Operator {
    /** Tolerance on the largest entry of {@code |U†U - I|} used by the circuit builder: {@value}.
     * */
    public static final double UNITARY_TOLERANCE = 1e-9;
    /** The largest number of qubits an operator may act on: {@value}. */
    public static final int MAX_QUBITS = 12;

    private final int qubits;
    private final int dim;
    /** Row-major, re/im interleaved, length 2 * dim * dim. Never exposed. */
    private final double[] m;
    private final boolean diagonal;
    private final boolean monomial;

    private Operator(int qubits, double[] m) {
        this.qubits = qubits;
        this.dim = 1 << qubits;
        this.m = m;
        this.diagonal = computeDiagonal();
        this.monomial = diagonal || computeMonomial();
    }

    /**
     * Returns the operator with the given matrix rows.
     *
     * @param rows a square matrix of size {@code 2^k}, {@code 1 <= k <= }{@value #MAX_QUBITS},
     *     with finite entries; copied, not modified
     * @return the operator
     * @throws IllegalArgumentException if the matrix is not square, its size is not a power of
     *     two of at least 2, or an entry is null or not finite
     */
    public static Operator of(Complex[][] rows) {
        Objects.requireNonNull(rows, "rows");
        int n = rows.length;
        if (n < 2 || Integer.bitCount(n) != 1 || n > (1 << MAX_QUBITS)) {
            throw new IllegalArgumentException("an operator needs 2^k rows with 1 <= k <= "
                    + MAX_QUBITS + " but " + n + " row(s) were given");
        }
        double[] m = new double[2 * n * n];
        for (int r = 0; r < n; r++) {
            Complex[] row = rows[r];
            if (row == null || row.length != n) {
                throw new IllegalArgumentException("the matrix must be square: row " + r + " has "
                        + (row == null ? "no entries (null)" : row.length + " entries")
                        + " but there are " + n + " rows");
            }
            for (int c = 0; c < n; c++) {
                Complex z = row[c];
                if (z == null) {
                    throw new IllegalArgumentException("entry (" + r + ", " + c + ") is null");
                }
                if (!Double.isFinite(z.getReal()) || !Double.isFinite(z.getImaginary())) {
                    throw new IllegalArgumentException("entry (" + r + ", " + c
                            + ") must be finite but was " + z);
                }
                m[2 * (r * n + c)] = z.getReal();
                m[2 * (r * n + c) + 1] = z.getImaginary();
            }
        }
        return new Operator(Integer.numberOfTrailingZeros(n), m);
    }

    /**
     * Returns the identity on the given number of qubits.
     *
     * @param qubits the number of qubits, {@code 1 <= qubits <= }{@value #MAX_QUBITS}
     * @return the identity operator
     * @throws IllegalArgumentException if {@code qubits} is out of range
     */
    public static Operator identity(int qubits) {
        Checks.requireInRange(qubits, 1, MAX_QUBITS, "operator qubit count");
        int d = 1 << qubits;
        double[] m = new double[2 * d * d];
        for (int i = 0; i < d; i++) {
            m[2 * (i * d + i)] = 1;
        }
        return new Operator(qubits, m);
    }

    /** Wraps a raw row-major interleaved matrix without copying. Internal. */
    static Operator ofRaw(int qubits, double[] m) {
        return new Operator(qubits, m);
    }

    /**
     * Returns the number of qubits {@code k} this operator acts on.
     *
     * @return {@code k}, where the matrix is {@code 2^k × 2^k}
     */
    public int qubits() {
        return qubits;
    }

    /**
     * Returns the matrix dimension {@code 2^k}.
     *
     * @return the number of rows (and columns)
     */
    public int dimension() {
        return dim;
    }

    /**
     * Returns one entry of the matrix.
     *
     * @param row the row, in {@code [0, dimension())}
     * @param col the column, in {@code [0, dimension())}
     * @return the entry
     * @throws IndexOutOfBoundsException if {@code row} or {@code col} is out of range
     */
    public Complex get(int row, int col) {
        Objects.checkIndex(row, dim);
        Objects.checkIndex(col, dim);
        int i = 2 * (row * dim + col);
        return Complex.ofCartesian(m[i], m[i + 1]);
    }

    /**
     * Returns the Kronecker product {@code this ⊗ other}: {@code other} acts on the low qubits
     * {@code 0..other.qubits()-1}, this operator on the next {@code qubits()}.
     *
     * @param other the operator for the low qubits
     * @return the product on {@code qubits() + other.qubits()} qubits
     * @throws IllegalArgumentException if the product would exceed {@value #MAX_QUBITS} qubits
     *     or an entry overflows (the message names it)
     */
    public Operator tensor(Operator other) {
        Objects.requireNonNull(other, "other");
        int k = qubits + other.qubits;
        if (k > MAX_QUBITS) {
            throw new IllegalArgumentException("the tensor product would act on " + k
                    + " qubits; at most " + MAX_QUBITS + " are allowed");
        }
        int da = dim;
        int db = other.dim;
        int d = da * db;
        double[] r = new double[2 * d * d];
        double[] b = other.m;
        for (int ia = 0; ia < da; ia++) {
            for (int ja = 0; ja < da; ja++) {
                double ar = m[2 * (ia * da + ja)];
                double ai = m[2 * (ia * da + ja) + 1];
                if (ar == 0 && ai == 0) {
                    continue;
                }
                for (int ib = 0; ib < db; ib++) {
                    int row = ia * db + ib;
                    for (int jb = 0; jb < db; jb++) {
                        int col = ja * db + jb;
                        double br = b[2 * (ib * db + jb)];
                        double bi = b[2 * (ib * db + jb) + 1];
                        r[2 * (row * d + col)] = ar * br - ai * bi;
                        r[2 * (row * d + col) + 1] = ar * bi + ai * br;
                    }
                }
            }
        }
        requireFiniteResult(r, d, "tensor product");
        return new Operator(k, r);
    }

    /** Refuses a computed matrix with an entry that overflowed to infinity or NaN. */
    private static void requireFiniteResult(double[] r, int d, String what) {
        for (int i = 0; i < r.length; i++) {
            if (!Double.isFinite(r[i])) {
                int e = i / 2;
                throw new IllegalArgumentException("the " + what + " overflows: entry ("
                        + e / d + ", " + e % d + ") is " + r[i] + " in its "
                        + (i % 2 == 0 ? "real" : "imaginary") + " part; entries must be finite");
            }
        }
    }

    /**
     * Returns the matrix product {@code this · other} (apply {@code other} first, then this).
     *
     * @param other an operator on the same number of qubits
     * @return the product
     * @throws IllegalArgumentException if the qubit counts differ or an entry overflows (the
     *     message names it)
     */
    public Operator times(Operator other) {
        Objects.requireNonNull(other, "other");
        if (other.qubits != qubits) {
            throw new IllegalArgumentException("cannot multiply a " + qubits
                    + "-qubit operator by a " + other.qubits + "-qubit operator; sizes must match");
        }
        int d = dim;
        double[] b = other.m;
        double[] r = new double[2 * d * d];
        for (int i = 0; i < d; i++) {
            for (int k = 0; k < d; k++) {
                double ar = m[2 * (i * d + k)];
                double ai = m[2 * (i * d + k) + 1];
                if (ar == 0 && ai == 0) {
                    continue;
                }
                for (int j = 0; j < d; j++) {
                    double br = b[2 * (k * d + j)];
                    double bi = b[2 * (k * d + j) + 1];
                    r[2 * (i * d + j)] += ar * br - ai * bi;
                    r[2 * (i * d + j) + 1] += ar * bi + ai * br;
                }
            }
        }
        requireFiniteResult(r, d, "matrix product");
        return new Operator(qubits, r);
    }

    /**
     * Returns this operator times a complex number, {@code z · M}: every entry multiplied by
     * {@code z} (scalar multiplication, Nielsen and Chuang 2010, §2.1). A global phase
     * ({@code scaled(Complex.ofCis(γ))}) keeps a unitary unitary; any other factor of modulus
     * other than 1 makes an operator that the circuit builder refuses as a gate but that
     * serves as an observable or a Kraus operator. Each entry is the product of two complex
     * numbers, {@code (a + bi)(c + di) = (ac - bd) + (ad + bc)i}.
     *
     * @param z a finite complex number
     * @return the scaled operator
     * @throws IllegalArgumentException if {@code z} is not finite, or an entry of the product
     *     is not (it overflows); the message names the entry, its value and {@code z}
     */
    public Operator scaled(Complex z) {
        Objects.requireNonNull(z, "z");
        double zr = z.getReal();
        double zi = z.getImaginary();
        if (!Double.isFinite(zr) || !Double.isFinite(zi)) {
            throw new IllegalArgumentException("the factor must be finite but was " + z);
        }
        int d = dim;
        double[] r = new double[2 * d * d];
        for (int i = 0; i < d * d; i++) {
            double ar = m[2 * i];
            double ai = m[2 * i + 1];
            double re = ar * zr - ai * zi;
            double im = ar * zi + ai * zr;
            if (!Double.isFinite(re) || !Double.isFinite(im)) {
                throw new IllegalArgumentException("entry (" + i / d + ", " + i % d + ") "
                        + Complex.ofCartesian(ar, ai) + " times " + z + " is not finite ("
                        + Complex.ofCartesian(re, im) + "); an operator's entries must be"
                        + " finite");
            }
            r[2 * i] = re;
            r[2 * i + 1] = im;
        }
        return new Operator(qubits, r);
    }

    /**
     * Returns the conjugate transpose {@code U†}.
     *
     * @return the adjoint operator
     */
    public Operator dagger() {
        int d = dim;
        double[] r = new double[2 * d * d];
        for (int i = 0; i < d; i++) {
            for (int j = 0; j < d; j++) {
                r[2 * (j * d + i)] = m[2 * (i * d + j)];
                // 0.0 - x, not -x: a zero stays +0.0, so the adjoint of a real matrix is
                // bitwise equal to its transpose.
                r[2 * (j * d + i) + 1] = 0.0 - m[2 * (i * d + j) + 1];
            }
        }
        return new Operator(qubits, r);
    }

    /**
     * Tells whether {@code U†U = I} within a tolerance: the largest modulus of an entry of
     * {@code U†U - I} is at most {@code tolerance}.
     *
     * @param tolerance a finite, non-negative tolerance
     * @return whether this operator is unitary within {@code tolerance}
     * @throws IllegalArgumentException if {@code tolerance} is negative or not finite
     */
    public boolean isUnitary(double tolerance) {
        return unitarityError() <= requireTolerance(tolerance);
    }

    /**
     * Tells whether {@code U = U†} within a tolerance on the modulus of each entry's difference.
     *
     * @param tolerance a finite, non-negative tolerance
     * @return whether this operator is Hermitian within {@code tolerance}
     * @throws IllegalArgumentException if {@code tolerance} is negative or not finite
     */
    public boolean isHermitian(double tolerance) {
        requireTolerance(tolerance);
        int d = dim;
        for (int i = 0; i < d; i++) {
            for (int j = i; j < d; j++) {
                double dr = m[2 * (i * d + j)] - m[2 * (j * d + i)];
                double di = m[2 * (i * d + j) + 1] + m[2 * (j * d + i) + 1];
                if (Math.hypot(dr, di) > tolerance) {
                    return false;
                }
            }
        }
        return true;
    }

    private static double requireTolerance(double tolerance) {
        if (!(tolerance >= 0) || Double.isInfinite(tolerance)) {
            throw new IllegalArgumentException("tolerance must be finite and non-negative but was "
                    + tolerance);
        }
        return tolerance;
    }

    /** Largest modulus of an entry of U†U - I. */
    double unitarityError() {
        int d = dim;
        double worst = 0;
        for (int i = 0; i < d; i++) {
            for (int j = 0; j < d; j++) {
                double sr = 0;
                double si = 0;
                for (int k = 0; k < d; k++) {
                    // conj(U[k][i]) * U[k][j]
                    double ar = m[2 * (k * d + i)];
                    double ai = -m[2 * (k * d + i) + 1];
                    double br = m[2 * (k * d + j)];
                    double bi = m[2 * (k * d + j) + 1];
                    sr += ar * br - ai * bi;
                    si += ar * bi + ai * br;
                }
                if (i == j) {
                    sr -= 1;
                }
                worst = Math.max(worst, Math.hypot(sr, si));
            }
        }
        return worst;
    }

    /** The raw matrix, row-major interleaved; callers must not modify it. */
    double[] raw() {
        return m;
    }

    /** True if every off-diagonal entry is exactly zero. */
    boolean isDiagonal() {
        return diagonal;
    }

    /** True if each row and each column holds exactly one non-zero entry. */
    boolean isMonomial() {
        return monomial;
    }

    private boolean computeDiagonal() {
        for (int i = 0; i < dim; i++) {
            for (int j = 0; j < dim; j++) {
                if (i != j && (m[2 * (i * dim + j)] != 0 || m[2 * (i * dim + j) + 1] != 0)) {
                    return false;
                }
            }
        }
        return true;
    }

    private boolean computeMonomial() {
        int[] perRow = new int[dim];
        for (int c = 0; c < dim; c++) {
            int inCol = 0;
            for (int r = 0; r < dim; r++) {
                if (m[2 * (r * dim + c)] != 0 || m[2 * (r * dim + c) + 1] != 0) {
                    inCol++;
                    perRow[r]++;
                }
            }
            if (inCol != 1) {
                return false;
            }
        }
        for (int r = 0; r < dim; r++) {
            if (perRow[r] != 1) {
                return false;
            }
        }
        return true;
    }

    /**
     * Compares entries exactly (bitwise, as {@link Complex#equals(Object)}).
     *
     * @param o another object
     * @return whether {@code o} is an operator with bitwise equal entries
     */
    @Override
    public boolean equals(Object o) {
        if (this == o) {
            return true;
        }
        if (!(o instanceof Operator)) {
            return false;
        }
        Operator other = (Operator) o;
        return qubits == other.qubits && Arrays.equals(m, other.m);
    }

    /**
     * Returns a hash code consistent with {@link #equals(Object)}.
     *
     * @return the hash code
     */
    @Override
    public int hashCode() {
        return 31 * qubits + Arrays.hashCode(m);
    }

    /**
     * Returns the matrix as text, one row per line, entries as {@code (re,im)}.
     *
     * @return the matrix as text
     */
    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder();
        sb.append(qubits).append("-qubit operator\n");
        for (int r = 0; r < dim; r++) {
            sb.append('[');
            for (int c = 0; c < dim; c++) {
                if (c > 0) {
                    sb.append(", ");
                }
                sb.append('(').append(fmt(m[2 * (r * dim + c)])).append(',')
                        .append(fmt(m[2 * (r * dim + c) + 1])).append(')');
            }
            sb.append("]\n");
        }
        return sb.toString();
    }

    private static String fmt(double x) {
        return (x == 0 ? "0" : String.format(java.util.Locale.ROOT, "%.6g", x));
    }
}
