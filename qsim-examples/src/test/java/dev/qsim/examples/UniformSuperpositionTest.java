package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.regex.Matcher;
import java.util.regex.Pattern;

import org.apache.commons.statistics.distribution.ChiSquaredDistribution;
import org.junit.jupiter.api.Test;

class UniformSuperpositionTest {

    private static final long SEED = UniformSuperposition.DEFAULT_SEED;
    private static final int SHOTS = UniformSuperposition.DEFAULT_SHOTS;

    @Test
    void seededRunPassesTheChiSquareTestAgainstUniform() {
        Capture out = new Capture();
        UniformSuperposition.Result r = UniformSuperposition.run(out.stream(), SEED, SHOTS);

        long[] counts = r.counts();
        assertEquals(32, counts.length);
        long total = 0;
        for (long c : counts) {
            total += c;
        }
        assertEquals(SHOTS, total, "counts must add up to the shots");

        // H on each qubit gives probability 1/32 for each of the 32 outcomes (Nielsen & Chuang
        // 2010, sec. 1.4.4); a fair sampler passes Pearson's test at the 1% level for this seed.
        assertTrue(r.pValue() > 0.01, () -> "p-value " + r.pValue() + " for seed " + SEED);
        assertTrue(r.consistent());
        assertEquals(31, r.degreesOfFreedom(), "32 cells minus one (Pearson 1900)");
    }

    @Test
    void statisticAndPValueMatchADirectComputation() {
        UniformSuperposition.Result r = UniformSuperposition.run(new Capture().stream(), SEED,
                SHOTS);
        // Pearson (1900), Phil. Mag. 50, 157: X^2 = sum (O - E)^2 / E with E = shots / 32.
        double expected = SHOTS / 32.0;
        double direct = 0;
        for (long c : r.counts()) {
            direct += (c - expected) * (c - expected) / expected;
        }
        assertEquals(direct, r.statistic(), 1e-12 * direct, () -> "seed " + SEED);
        // p-value = upper tail of chi-square with 31 degrees of freedom, from the reference
        // distribution of Commons Statistics.
        double tail = ChiSquaredDistribution.of(31).survivalProbability(direct);
        assertEquals(tail, r.pValue(), 1e-12);
    }

    @Test
    void printsOneHistogramRowPerOutcomeAndTheVerdict() {
        Capture out = new Capture();
        UniformSuperposition.Result r = UniformSuperposition.run(out.stream(), 99L, 640);
        String text = out.text();
        long[] counts = r.counts();
        for (int v = 0; v < 32; v++) {
            String bits = String.format("%5s", Integer.toBinaryString(v)).replace(' ', '0');
            Matcher m = Pattern.compile("(?m)^" + bits + " +(\\d+) ").matcher(text);
            assertTrue(m.find(), () -> "no row for " + bits + " in:\n" + text);
            assertEquals(counts[v], Long.parseLong(m.group(1)), bits);
        }
        assertTrue(text.contains("degrees of freedom"), text);
        assertTrue(text.contains(r.consistent() ? "consistent with uniform"
                : "NOT consistent with uniform"), text);
    }

    @Test
    void equalSeedsGiveEqualResults() {
        // DESIGN.md: a Simulator starts each call from its seed.
        long[] a = UniformSuperposition.run(new Capture().stream(), 5L, 1000).counts();
        long[] b = UniformSuperposition.run(new Capture().stream(), 5L, 1000).counts();
        assertArrayEquals(a, b);
    }

    @Test
    void refusesAShotCountOutOfRange() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> UniformSuperposition.run(new Capture().stream(), 1L, 0));
        assertTrue(e.getMessage().contains("got 0"), e.getMessage());
    }
}
