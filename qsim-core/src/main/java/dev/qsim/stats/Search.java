package dev.qsim.stats;

import java.util.function.DoubleUnaryOperator;
import java.util.function.ToDoubleFunction;

/**
 * The searches behind {@link NoiseFit}, on functions to maximise that may be {@code -∞} (a
 * log-likelihood where the model forbids an observed outcome) but never NaN: golden-section
 * search in one dimension, Nelder-Mead in a box, and a bracketed root of a decreasing function.
 * Each returns the best point it evaluated, so a {@code -∞} value never wins over a finite one.
 * Deterministic: the same function gives the same points in the same order.
 */
final class Search {
    /** {@code (sqrt(5) - 1) / 2}, the golden-section ratio. */
    static final double GOLDEN = (Math.sqrt(5) - 1) / 2;

    /** Points of the scan that brackets the golden-section search. */
    static final int SCAN = 11;

    private Search() {
    }

    /** A point and the function's value there. */
    record Point(double[] x, double value) {
    }

    /**
     * Maximises {@code f} on {@code [a, b]}: a scan of {@value #SCAN} equally spaced points
     * (ends included) picks the best, then golden-section search (Kiefer 1953, "Sequential
     * minimax search for a maximum", Proc. AMS 4, 502) narrows the interval between its two
     * neighbours down to {@code tolerance}. The scan guards against a second, lower peak and
     * against regions where {@code f} is {@code -∞}; on a unimodal function the result is within
     * {@code tolerance} of the maximum, or at an end of {@code [a, b]} when the maximum lies
     * there.
     *
     * @return {x, f(x)} of the best point evaluated
     */
    static double[] golden(DoubleUnaryOperator f, double a, double b, double tolerance) {
        double bestX = a;
        double bestF = Double.NEGATIVE_INFINITY;
        int bestI = 0;
        double[] xs = new double[SCAN];
        for (int i = 0; i < SCAN; i++) {
            xs[i] = i == SCAN - 1 ? b : a + (b - a) * i / (SCAN - 1);
            double v = f.applyAsDouble(xs[i]);
            if (v > bestF || i == 0) {
                bestF = v;
                bestX = xs[i];
                bestI = i;
            }
        }
        return section(f, xs[Math.max(0, bestI - 1)], xs[Math.min(SCAN - 1, bestI + 1)],
                tolerance, bestX, bestF);
    }

    /**
     * Maximises {@code f} on {@code [a, b]} from a guess {@code w} in it, such as the maximum of
     * a nearby function: if {@code f(w)} is finite and at least {@code f} at {@code w - delta}
     * and {@code w + delta} (each kept in {@code [a, b]}), golden-section search between those
     * two, which brackets the maximum of a function with one peak; otherwise
     * {@link #golden(DoubleUnaryOperator, double, double, double)} on all of {@code [a, b]}.
     *
     * @return {x, f(x)} of the best point evaluated
     */
    static double[] goldenNear(DoubleUnaryOperator f, double a, double b, double w, double delta,
            double tolerance) {
        double left = Math.max(a, w - delta);
        double right = Math.min(b, w + delta);
        double fw = f.applyAsDouble(w);
        double fl = left < w ? f.applyAsDouble(left) : fw;
        double fr = right > w ? f.applyAsDouble(right) : fw;
        if (fw > Double.NEGATIVE_INFINITY && fw >= fl && fw >= fr) {
            return section(f, left, right, tolerance, w, fw);
        }
        double[] r = golden(f, a, b, tolerance);
        return r[1] >= fw ? r : new double[] {w, fw};
    }

    /**
     * Golden-section search (Kiefer 1953, Proc. AMS 4, 502) on {@code [lo, hi]} down to
     * {@code tolerance}; returns the best of its points and {@code (bestX, bestF)}.
     */
    private static double[] section(DoubleUnaryOperator f, double lo, double hi,
            double tolerance, double bestX, double bestF) {
        double c = hi - GOLDEN * (hi - lo);
        double d = lo + GOLDEN * (hi - lo);
        double fc = f.applyAsDouble(c);
        double fd = f.applyAsDouble(d);
        while (hi - lo > tolerance) {
            if (fc >= fd) {
                if (fc > bestF) {
                    bestF = fc;
                    bestX = c;
                }
                hi = d;
                d = c;
                fd = fc;
                c = hi - GOLDEN * (hi - lo);
                fc = f.applyAsDouble(c);
            } else {
                if (fd > bestF) {
                    bestF = fd;
                    bestX = d;
                }
                lo = c;
                c = d;
                fc = fd;
                d = lo + GOLDEN * (hi - lo);
                fd = f.applyAsDouble(d);
            }
        }
        if (fc > bestF) {
            bestF = fc;
            bestX = c;
        }
        if (fd > bestF) {
            bestF = fd;
            bestX = d;
        }
        return new double[] {bestX, bestF};
    }

    /**
     * Maximises {@code f} over the unit box {@code [0, 1]^k} by the simplex method of Nelder and
     * Mead (1965, "A simplex method for function minimization", Computer Journal 7, 308), with
     * the usual coefficients (reflection 1, expansion 2, contraction 1/2, shrink 1/2). A trial
     * point outside the box is moved to the nearest point of the box. The search stops when the
     * simplex's values differ by at most {@code valueTolerance} and its vertices lie within
     * {@code stepTolerance} of the best (or after {@code maxEvaluations}), and then restarts from
     * the best vertex with a fresh simplex until a restart gains no more than
     * {@code valueTolerance} (at most 5 restarts), which undoes a simplex that collapsed early
     * (common practice).
     *
     * @param start the first vertex, in the box (copied)
     * @param step the initial edge length of the simplex, in (0, 1]
     */
    static Point nelderMead(ToDoubleFunction<double[]> f, double[] start, double step,
            double valueTolerance, double stepTolerance, int maxEvaluations) {
        Point best = simplex(f, start.clone(), step, valueTolerance, stepTolerance,
                maxEvaluations);
        for (int restart = 0; restart < 5; restart++) {
            Point again = simplex(f, best.x(), Math.max(step / 4, 1e-3), valueTolerance,
                    stepTolerance, maxEvaluations);
            boolean gained = again.value() > best.value() + valueTolerance;
            if (again.value() > best.value()) {
                best = again;
            }
            if (!gained) {
                break;
            }
        }
        return best;
    }

    private static Point simplex(ToDoubleFunction<double[]> f, double[] start, double step,
            double valueTolerance, double stepTolerance, int maxEvaluations) {
        int k = start.length;
        double[][] v = new double[k + 1][];
        double[] fv = new double[k + 1];
        v[0] = start.clone();
        fv[0] = f.applyAsDouble(v[0]);
        for (int i = 0; i < k; i++) {
            double[] p = start.clone();
            p[i] = p[i] + step <= 1 ? p[i] + step : p[i] - step;
            clamp(p);
            v[i + 1] = p;
            fv[i + 1] = f.applyAsDouble(p);
        }
        int evaluations = k + 1;
        double[] centroid = new double[k];
        while (evaluations < maxEvaluations) {
            sort(v, fv);
            if (converged(v, fv, valueTolerance, stepTolerance)) {
                break;
            }
            java.util.Arrays.fill(centroid, 0);
            for (int i = 0; i < k; i++) {
                for (int d = 0; d < k; d++) {
                    centroid[d] += v[i][d] / k;
                }
            }
            double[] worst = v[k];
            double[] reflected = along(centroid, worst, 1);
            double fr = f.applyAsDouble(reflected);
            evaluations++;
            if (fr > fv[0]) {
                double[] expanded = along(centroid, worst, 2);
                double fe = f.applyAsDouble(expanded);
                evaluations++;
                if (fe > fr) {
                    v[k] = expanded;
                    fv[k] = fe;
                } else {
                    v[k] = reflected;
                    fv[k] = fr;
                }
                continue;
            }
            if (fr > fv[k - 1]) {
                v[k] = reflected;
                fv[k] = fr;
                continue;
            }
            boolean outside = fr > fv[k];
            double[] contracted = along(centroid, worst, outside ? 0.5 : -0.5);
            double fc = f.applyAsDouble(contracted);
            evaluations++;
            if (outside ? fc >= fr : fc > fv[k]) {
                v[k] = contracted;
                fv[k] = fc;
                continue;
            }
            for (int i = 1; i <= k; i++) {
                for (int d = 0; d < k; d++) {
                    v[i][d] = v[0][d] + 0.5 * (v[i][d] - v[0][d]);
                }
                fv[i] = f.applyAsDouble(v[i]);
                evaluations++;
            }
        }
        sort(v, fv);
        return new Point(v[0], fv[0]);
    }

    /** The point {@code c + t (c - w)}, moved into the box. */
    private static double[] along(double[] c, double[] w, double t) {
        double[] p = new double[c.length];
        for (int d = 0; d < c.length; d++) {
            p[d] = c[d] + t * (c[d] - w[d]);
        }
        clamp(p);
        return p;
    }

    private static void clamp(double[] p) {
        for (int d = 0; d < p.length; d++) {
            p[d] = Math.min(1, Math.max(0, p[d]));
        }
    }

    /** Sorts the vertices by value, best first (a stable insertion sort: ties keep order). */
    private static void sort(double[][] v, double[] fv) {
        for (int i = 1; i < v.length; i++) {
            double[] x = v[i];
            double fx = fv[i];
            int j = i - 1;
            while (j >= 0 && fv[j] < fx) {
                v[j + 1] = v[j];
                fv[j + 1] = fv[j];
                j--;
            }
            v[j + 1] = x;
            fv[j + 1] = fx;
        }
    }

    private static boolean converged(double[][] v, double[] fv, double valueTolerance,
            double stepTolerance) {
        int k = v.length - 1;
        if (fv[0] == Double.NEGATIVE_INFINITY) {
            return false;
        }
        if (!(fv[0] - fv[k] <= valueTolerance)) {
            return false;
        }
        for (int i = 1; i <= k; i++) {
            for (int d = 0; d < k; d++) {
                if (Math.abs(v[i][d] - v[0][d]) > stepTolerance) {
                    return false;
                }
            }
        }
        return true;
    }

    /**
     * Finds {@code t} in {@code [a, b]} where {@code g} crosses zero, given {@code g(a) > 0 >
     * g(b)} ({@code g(b)} may be {@code -∞}): the Illinois variant of regula falsi (Dowell and
     * Jarratt 1971, "A modified regula falsi method for computing the root of an equation", BIT
     * 11, 168), with a bisection step whenever an end's value is not finite. Stops when the
     * bracket is narrower than {@code tolerance} or {@code |g| <= valueTolerance}; returns the
     * end of the final bracket with the smaller {@code |g|}. {@code a} may be above {@code b}.
     */
    static double crossing(DoubleUnaryOperator g, double a, double ga, double b, double gb,
            double tolerance, double valueTolerance) {
        double wa = ga;
        double wb = gb;
        int side = 0;
        for (int iteration = 0; iteration < 200; iteration++) {
            if (Math.abs(b - a) <= tolerance) {
                break;
            }
            double t;
            if (Double.isFinite(wa) && Double.isFinite(wb)) {
                t = (a * wb - b * wa) / (wb - wa);
                if (!(Math.min(a, b) < t && t < Math.max(a, b))) {
                    t = 0.5 * (a + b);
                }
            } else {
                t = 0.5 * (a + b);
            }
            double gt = g.applyAsDouble(t);
            if (Math.abs(gt) <= valueTolerance) {
                return t;
            }
            if (gt > 0) {
                a = t;
                ga = gt;
                wa = gt;
                if (side == 1) {
                    wb /= 2;
                }
                side = 1;
            } else {
                b = t;
                gb = gt;
                wb = gt;
                if (side == -1) {
                    wa /= 2;
                }
                side = -1;
            }
        }
        return Math.abs(ga) <= Math.abs(gb) ? a : b;
    }
}
