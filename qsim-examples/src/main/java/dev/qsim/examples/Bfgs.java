package dev.qsim.examples;

import java.util.Objects;

/**
 * A small quasi-Newton minimiser for the variational examples with more than a few angles: BFGS
 * with the inverse-Hessian update of Nocedal and Wright 2006, <i>Numerical Optimization</i>,
 * 2nd ed., Algorithm 6.1 and eq. 6.17, and the backtracking line search of their Algorithm 3.1
 * (Armijo condition with constant {@value SteepestDescent#ARMIJO}, the step halved until it
 * holds). An update is skipped when the curvature {@code s·y} is not positive, and the
 * approximation restarts from the identity when its direction does not descend.
 */
final class Bfgs {

    /** The end point: where, the value there, the gradient norm, and the iterations taken. */
    record Result(double[] x, double value, double gradientNorm, int iterations) {
    }

    private Bfgs() {
    }

    /**
     * Minimises from {@code start} until the gradient norm is at most {@code tolerance}, no step
     * lowers f any more, or {@code maxIterations} iterations have run.
     */
    static Result minimise(SteepestDescent.Objective f, double[] start, int maxIterations,
            double tolerance) {
        Objects.requireNonNull(f, "f");
        if (maxIterations < 0) {
            throw new IllegalArgumentException("maxIterations must be at least 0 but was "
                    + maxIterations);
        }
        int m = start.length;
        double[] x = start.clone();
        double value = f.value(x);
        double[] g = f.gradient(x);
        double[][] h = identity(m);
        int it = 0;
        while (it < maxIterations && norm(g) > tolerance) {
            double[] d = new double[m];
            double slope = 0;
            for (int i = 0; i < m; i++) {
                for (int j = 0; j < m; j++) {
                    d[i] -= h[i][j] * g[j];
                }
                slope += d[i] * g[i];
            }
            if (!(slope < 0)) {
                h = identity(m);
                slope = 0;
                for (int i = 0; i < m; i++) {
                    d[i] = -g[i];
                    slope -= g[i] * g[i];
                }
            }
            double t = 1;
            double[] trial = new double[m];
            double trialValue;
            while (true) {
                for (int i = 0; i < m; i++) {
                    trial[i] = x[i] + t * d[i];
                }
                trialValue = f.value(trial);
                if (trialValue <= value + SteepestDescent.ARMIJO * t * slope || t < 1e-12) {
                    break;
                }
                t /= 2;
            }
            if (!(trialValue < value)) {
                break; // no step lowers f: converged to rounding
            }
            double[] gt = f.gradient(trial);
            double[] s = new double[m];
            double[] y = new double[m];
            double sy = 0;
            for (int i = 0; i < m; i++) {
                s[i] = trial[i] - x[i];
                y[i] = gt[i] - g[i];
                sy += s[i] * y[i];
            }
            x = trial;
            value = trialValue;
            g = gt;
            it++;
            if (sy > 0) {
                // H <- (I - ρ s y^T) H (I - ρ y s^T) + ρ s s^T, ρ = 1 / (y^T s) (eq. 6.17)
                double[] hy = new double[m];
                double yhy = 0;
                for (int i = 0; i < m; i++) {
                    for (int j = 0; j < m; j++) {
                        hy[i] += h[i][j] * y[j];
                    }
                    yhy += y[i] * hy[i];
                }
                for (int i = 0; i < m; i++) {
                    for (int j = 0; j < m; j++) {
                        h[i][j] += (sy + yhy) * s[i] * s[j] / (sy * sy)
                                - (hy[i] * s[j] + s[i] * hy[j]) / sy;
                    }
                }
            }
        }
        return new Result(x, value, norm(g), it);
    }

    private static double[][] identity(int m) {
        double[][] h = new double[m][m];
        for (int i = 0; i < m; i++) {
            h[i][i] = 1;
        }
        return h;
    }

    private static double norm(double[] g) {
        double s = 0;
        for (double v : g) {
            s += v * v;
        }
        return Math.sqrt(s);
    }
}
