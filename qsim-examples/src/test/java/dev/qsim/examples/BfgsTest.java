package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class BfgsTest {

    @Test
    void findsTheMinimumOfRosenbrocksFunction() {
        // f(x, y) = 100 (y - x²)² + (1 - x)², minimum 0 at (1, 1) (Rosenbrock 1960; Nocedal and
        // Wright 2006, Numerical Optimization, eq. 2.22), from the book's start (-1.2, 1).
        SteepestDescent.Objective f = new SteepestDescent.Objective() {
            @Override
            public double value(double[] x) {
                return 100 * Math.pow(x[1] - x[0] * x[0], 2) + Math.pow(1 - x[0], 2);
            }

            @Override
            public double[] gradient(double[] x) {
                return new double[] {-400 * x[0] * (x[1] - x[0] * x[0]) - 2 * (1 - x[0]),
                    200 * (x[1] - x[0] * x[0])};
            }
        };
        Bfgs.Result r = Bfgs.minimise(f, new double[] {-1.2, 1}, 200, 1e-10);
        assertEquals(1, r.x()[0], 1e-8);
        assertEquals(1, r.x()[1], 1e-8);
        assertEquals(0, r.value(), 1e-15);
        // Quasi-Newton needs a few dozen iterations here; steepest descent needs thousands.
        assertTrue(r.iterations() < 100, "iterations " + r.iterations());
        assertThrows(IllegalArgumentException.class, () -> Bfgs.minimise(f, new double[2], -1,
                1e-6));
    }
}
