package dev.qsim.stats;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.function.ToDoubleFunction;

import org.junit.jupiter.api.Test;

class SearchTest {

    @Test
    void goldenSectionFindsTheVertexOfAParabola() {
        // The maximum of -(x - 0.3)^2 is at its vertex 0.3 (closed form).
        double[] r = Search.golden(x -> -(x - 0.3) * (x - 0.3), 0, 1, 1e-10);
        assertEquals(0.3, r[0], 1e-9);
        assertEquals(0, r[1], 1e-18);
    }

    @Test
    void goldenSectionStepsOverMinusInfinityAndFindsAnEndMaximum() {
        // -inf below 0.55 (an outcome the model forbids), then -(x - 0.7)^2: maximum at 0.7;
        // an increasing function has its maximum at the right end (closed forms).
        double[] r = Search.golden(x -> x < 0.55 ? Double.NEGATIVE_INFINITY
                : -(x - 0.7) * (x - 0.7), 0, 1, 1e-10);
        assertEquals(0.7, r[0], 1e-9);
        assertEquals(2.0, Search.golden(x -> x, -1, 2, 1e-10)[0]);
        assertEquals(-1.0, Search.golden(x -> -x, -1, 2, 1e-10)[0]);
    }

    @Test
    void goldenSectionPrefersTheHigherOfTwoPeaksWhenTheScanSeesBoth() {
        // Two bumps, heights 1 at 0.15 and 2 at 0.75 (closed form): the scan of 11 points sees
        // that the second is higher.
        double[] r = Search.golden(x -> Math.max(1 - 100 * (x - 0.15) * (x - 0.15),
                2 - 100 * (x - 0.75) * (x - 0.75)), 0, 1, 1e-10);
        assertEquals(0.75, r[0], 1e-8);
    }

    @Test
    void goldenSectionNearAGuessSearchesLocallyOnlyAtAPeak() {
        // -(x - 0.31)^2 has its vertex at 0.31 (closed form). From the guess 0.3 (a peak at the
        // scale 0.02) the search stays within [0.28, 0.32]: few evaluations. From the guess 0.8
        // (not a peak) it falls back to the full scan and still finds 0.31.
        int[] calls = new int[1];
        java.util.function.DoubleUnaryOperator f = x -> {
            calls[0]++;
            return -(x - 0.31) * (x - 0.31);
        };
        double[] r = Search.goldenNear(f, 0, 1, 0.3, 0.02, 1e-10);
        assertEquals(0.31, r[0], 1e-9);
        int near = calls[0];
        calls[0] = 0;
        r = Search.goldenNear(f, 0, 1, 0.8, 0.02, 1e-10);
        assertEquals(0.31, r[0], 1e-9);
        assertTrue(near < calls[0], near + " evaluations near, " + calls[0] + " with the scan");
        // A guess at the end of the range: the bracket is cut there.
        assertEquals(0.0, Search.goldenNear(x -> -x, 0, 1, 0, 0.02, 1e-10)[0]);
    }

    @Test
    void nelderMeadFindsTheMinimumOfRosenbrocksValley() {
        // Rosenbrock (1960, "An automatic method for finding the greatest or least value of a
        // function", Computer Journal 3, 175): (1 - x)^2 + 100 (y - x^2)^2 has its minimum 0
        // at (1, 1). Here x = -1.5 + 3u, y = -1.5 + 3v, so the maximum of its negative is at
        // u = v = 5/6.
        ToDoubleFunction<double[]> f = u -> {
            double x = -1.5 + 3 * u[0];
            double y = -1.5 + 3 * u[1];
            return -((1 - x) * (1 - x) + 100 * (y - x * x) * (y - x * x));
        };
        Search.Point p = Search.nelderMead(f, new double[] {0.1, 0.9}, 0.2, 1e-14, 1e-10, 4000);
        assertEquals(5 / 6.0, p.x()[0], 1e-5);
        assertEquals(5 / 6.0, p.x()[1], 1e-5);
        assertTrue(p.value() > -1e-9, "value " + p.value());
    }

    @Test
    void nelderMeadStaysInTheBoxAndFindsAMaximumOnItsFace() {
        // -(u + 0.5)^2 - (v - 0.3)^2 - (w - 0.6)^2 over the unit cube: the maximum over the cube
        // is at u = 0 (the nearest face to -0.5), v = 0.3, w = 0.6 (closed form).
        ToDoubleFunction<double[]> f = u -> {
            for (double x : u) {
                assertTrue(x >= 0 && x <= 1, "a point outside the box: " + x);
            }
            return -(u[0] + 0.5) * (u[0] + 0.5) - (u[1] - 0.3) * (u[1] - 0.3)
                    - (u[2] - 0.6) * (u[2] - 0.6);
        };
        Search.Point p = Search.nelderMead(f, new double[] {0.5, 0.5, 0.5}, 0.2, 1e-14, 1e-10,
                3000);
        assertEquals(0, p.x()[0], 1e-7);
        assertEquals(0.3, p.x()[1], 1e-6);
        assertEquals(0.6, p.x()[2], 1e-6);
    }

    @Test
    void theCrossingOfALineIsItsRootEvenBehindMinusInfinity() {
        // 0.5 - t crosses zero at t = 0.5 (closed form); a bisection step leaves the -inf part.
        assertEquals(0.5, Search.crossing(t -> 0.5 - t, 0, 0.5, 2, -1.5, 1e-12, 1e-15), 1e-12);
        assertEquals(0.5, Search.crossing(t -> t > 1 ? Double.NEGATIVE_INFINITY : 0.5 - t, 0,
                0.5, 2, Double.NEGATIVE_INFINITY, 1e-12, 1e-15), 1e-12);
        // From a bracket given high end first: 0.5 - exp(-t) is positive above its root log 2
        // (closed form) and negative below; the search runs from 3 down to -0.2.
        java.util.function.DoubleUnaryOperator g = t -> 0.5 - Math.exp(-t);
        assertEquals(Math.log(2), Search.crossing(g, 3, g.applyAsDouble(3), -0.2,
                g.applyAsDouble(-0.2), 1e-13, 1e-15), 1e-12);
    }
}
