package dev.qsim.examples;

import java.util.Objects;

/**
 * A small plain minimiser for the variational examples: steepest descent with the exact gradient
 * and a backtracking line search that halves the step until the Armijo sufficient-decrease
 * condition {@code f(x - t g) <= f(x) - c t |g|²} holds (Armijo 1966, "Minimization of functions
 * having Lipschitz continuous first partial derivatives", Pacific J. Math. 16, 1-3; Nocedal and
 * Wright 2006, Numerical Optimization, 2nd ed., Algorithm 3.1). Each accepted step lowers
 * {@code f}; the next trial step starts at twice the last accepted one.
 */
final class SteepestDescent {

    /** The Armijo constant {@code c}: {@value}. */
    static final double ARMIJO = 1e-4;

    /** The function to minimise and its gradient. */
    interface Objective {
        /** Returns f(x). */
        double value(double[] x);

        /** Returns the gradient of f at x. */
        double[] gradient(double[] x);
    }

    /** Called after every iteration (iteration 0 is the start). */
    @FunctionalInterface
    interface Progress {
        /** Reports one iteration: its number, the point, the value and the gradient norm. */
        void report(int iteration, double[] x, double value, double gradientNorm);
    }

    /** The end point: where, the value there, the gradient norm, and the iterations taken. */
    record Result(double[] x, double value, double gradientNorm, int iterations) {
    }

    private SteepestDescent() {
    }

    /**
     * Minimises from {@code start} until the gradient norm is at most {@code tolerance}, no
     * step lowers f any more, or {@code maxIterations} iterations have run.
     */
    static Result minimise(Objective f, double[] start, int maxIterations, double tolerance,
            Progress progress) {
        Objects.requireNonNull(f, "f");
        Objects.requireNonNull(progress, "progress");
        if (maxIterations < 0) {
            throw new IllegalArgumentException("maxIterations must be at least 0 but was "
                    + maxIterations);
        }
        double[] x = start.clone();
        double value = f.value(x);
        double[] g = f.gradient(x);
        double norm = norm(g);
        progress.report(0, x, value, norm);
        double step = 1;
        int it = 0;
        while (it < maxIterations && norm > tolerance) {
            double t = Math.min(2 * step, 16);
            double[] trial = new double[x.length];
            double trialValue;
            while (true) {
                for (int j = 0; j < x.length; j++) {
                    trial[j] = x[j] - t * g[j];
                }
                trialValue = f.value(trial);
                if (trialValue <= value - ARMIJO * t * norm * norm || t < 1e-12) {
                    break;
                }
                t /= 2;
            }
            if (!(trialValue < value)) {
                break; // no step lowers f: converged to rounding
            }
            step = t;
            x = trial;
            value = trialValue;
            g = f.gradient(x);
            norm = norm(g);
            it++;
            progress.report(it, x, value, norm);
        }
        return new Result(x, value, norm, it);
    }

    private static double norm(double[] g) {
        double s = 0;
        for (double v : g) {
            s += v * v;
        }
        return Math.sqrt(s);
    }
}
