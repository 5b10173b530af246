package dev.qsim.spark.benchmarking;

import java.util.Objects;
import java.util.TreeSet;

import org.apache.commons.math3.exception.MathIllegalStateException;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresBuilder;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresOptimizer;
import org.apache.commons.math3.fitting.leastsquares.LevenbergMarquardtOptimizer;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.RealVector;
import org.apache.commons.math3.linear.SingularMatrixException;
import org.apache.commons.math3.util.Pair;

/**
 * The least-squares fit of a randomized-benchmarking decay {@code y = A p^m + B} to survival
 * probabilities {@code y_i} of sequences of {@code m_i} Cliffords, and the error per Clifford
 * {@code r = (1 - p)(d - 1)/d} it implies (Magesan, Gambetta and Emerson 2011, Phys. Rev. Lett.
 * 106, 180504, eq. 3 and the text after it). Immutable.
 *
 * <p>The fit is Levenberg-Marquardt (Moré 1978, "The Levenberg-Marquardt algorithm:
 * implementation and theory", in Numerical Analysis, Dundee 1977, Springer, pp. 105-116,
 * doi:10.1007/BFb0067700) as Apache Commons Math 3.6
 * implements it, every point weighted equally. Standard errors come from the covariance
 * {@code s² (JᵀJ)⁻¹} at the optimum with {@code s²} the residual sum of squares over
 * {@code n - 3} (common practice for nonlinear least squares; Seber and Wild 2003, Nonlinear
 * Regression, §2.1). The start: {@code B = 1/d}, {@code A} from the shortest length, {@code p}
 * from the mean survival at the middle length.
 *
 * @param a the fitted {@code A}
 * @param p the fitted decay {@code p}
 * @param b the fitted {@code B}
 * @param pError the standard error of {@code p}
 * @param errorPerClifford {@code r = (1 - p)(d - 1)/d}
 * @param errorPerCliffordError its standard error, {@code (d - 1)/d} times that of {@code p}
 * @param points the number of points fitted
 * @param dimension {@code d = 2^qubits}
 * @since 0.1
 */
public record DecayFit(double a, double p, double b, double pError, double errorPerClifford,
        double errorPerCliffordError, int points, int dimension) {
    /**
     * Checks the fields.
     *
     * @param a the fitted {@code A}
     * @param p the fitted decay
     * @param b the fitted {@code B}
     * @param pError the standard error of {@code p}
     * @param errorPerClifford the error per Clifford
     * @param errorPerCliffordError its standard error
     * @param points the number of points
     * @param dimension the dimension
     */
    public DecayFit {
        if (points < 4 || dimension < 2) {
            throw new IllegalArgumentException("a decay fit has at least 4 points and dimension"
                    + " 2 or more, not " + points + " and " + dimension);
        }
    }

    /**
     * Fits {@code A p^m + B} to survival probabilities.
     *
     * @param lengths the sequence length {@code m_i} of each point, at least 1; at least three
     *     distinct lengths
     * @param survival the survival probability {@code y_i} of each point, finite
     * @param qubits the number of qubits benchmarked, 1 or 2 ({@code d = 2^qubits})
     * @return the fit
     * @throws IllegalArgumentException if the arrays differ in length, there are fewer than 4
     *     points or 3 distinct lengths, a value is out of range, or the fit does not converge
     *     (the message says so)
     */
    public static DecayFit of(int[] lengths, double[] survival, int qubits) {
        Objects.requireNonNull(lengths, "lengths");
        Objects.requireNonNull(survival, "survival");
        if (lengths.length != survival.length) {
            throw new IllegalArgumentException(lengths.length + " lengths but " + survival.length
                    + " survival probabilities; give one of each per point");
        }
        if (qubits < 1 || qubits > 2) {
            throw new IllegalArgumentException("the qubits benchmarked must be 1 or 2 but were "
                    + qubits);
        }
        TreeSet<Integer> distinct = new TreeSet<>();
        for (int i = 0; i < lengths.length; i++) {
            if (lengths[i] < 1) {
                throw new IllegalArgumentException("length " + i + " is " + lengths[i]
                        + "; lengths are at least 1");
            }
            if (!Double.isFinite(survival[i])) {
                throw new IllegalArgumentException("survival probability " + i + " is "
                        + survival[i] + "; it must be finite");
            }
            distinct.add(lengths[i]);
        }
        if (lengths.length < 4 || distinct.size() < 3) {
            throw new IllegalArgumentException("a decay fit needs at least 4 points and 3"
                    + " distinct lengths but has " + lengths.length + " points and "
                    + distinct.size() + " lengths");
        }
        int d = 1 << qubits;
        double b0 = 1.0 / d;
        int shortest = distinct.first();
        int middle = distinct.toArray(new Integer[0])[distinct.size() / 2];
        double a0 = Math.max(0.05, mean(lengths, survival, shortest) - b0);
        double ratio = (mean(lengths, survival, middle) - b0) / a0;
        double p0 = Math.min(0.9999, Math.max(0.5, Math.pow(Math.max(ratio, 1e-6),
                1.0 / (middle - shortest + 1e-9))));
        double[] y = survival.clone();
        int n = y.length;
        LeastSquaresOptimizer.Optimum opt;
        try {
            opt = new LevenbergMarquardtOptimizer().optimize(new LeastSquaresBuilder()
                    .start(new double[] {a0, p0, b0})
                    .target(y)
                    .model(point -> model(point, lengths))
                    .maxEvaluations(10_000)
                    .maxIterations(10_000)
                    .build());
        } catch (MathIllegalStateException e) {
            throw new IllegalArgumentException("the decay A p^m + B could not be fitted to "
                    + n + " points: " + e.getMessage(), e);
        }
        double[] x = opt.getPoint().toArray();
        double rss = opt.getResiduals().dotProduct(opt.getResiduals());
        double s2 = rss / (n - 3);
        double pError;
        try {
            pError = Math.sqrt(opt.getCovariances(1e-14).getEntry(1, 1) * s2);
        } catch (SingularMatrixException e) {
            pError = Double.NaN; // singular at the optimum: no error estimate
        }
        double scale = (d - 1) / (double) d;
        return new DecayFit(x[0], x[1], x[2], pError, (1 - x[1]) * scale, pError * scale, n, d);
    }

    private static double mean(int[] lengths, double[] y, int m) {
        double sum = 0;
        int k = 0;
        for (int i = 0; i < lengths.length; i++) {
            if (lengths[i] == m) {
                sum += y[i];
                k++;
            }
        }
        return sum / k;
    }

    /** Values and Jacobian of {@code A p^m + B} at the parameters {@code (A, p, B)}. */
    private static Pair<RealVector, RealMatrix> model(RealVector point, int[] lengths) {
        double a = point.getEntry(0);
        double p = point.getEntry(1);
        double b = point.getEntry(2);
        double[] v = new double[lengths.length];
        double[][] j = new double[lengths.length][3];
        for (int i = 0; i < lengths.length; i++) {
            int m = lengths[i];
            double pm = Math.pow(p, m);
            v[i] = a * pm + b;
            j[i][0] = pm;
            j[i][1] = a * m * Math.pow(p, m - 1);
            j[i][2] = 1;
        }
        return new Pair<>(new ArrayRealVector(v, false), new Array2DRowRealMatrix(j, false));
    }

    /**
     * Returns the fit in one line, such as
     * {@code "p = 0.98412 ± 0.00031, r = 0.01191 ± 0.00023 (A = 0.722, B = 0.247, 240 points)"}.
     *
     * @return the text
     */
    @Override
    public String toString() {
        return String.format(java.util.Locale.ROOT, "p = %.5f ± %.5f, r = %.5f ± %.5f (A = %.3f,"
                + " B = %.3f, %d points)", p, pError, errorPerClifford, errorPerCliffordError, a,
                b, points);
    }
}
