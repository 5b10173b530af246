package dev.qsim.stats;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.apache.commons.statistics.inference.ChiSquareTest;
import org.apache.commons.statistics.inference.GTest;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;

class TallyComparisonTest {

    private static Tally tally(int width, long... counts) {
        Map<String, Long> m = new TreeMap<>();
        for (int i = 0; i < counts.length; i++) {
            StringBuilder b = new StringBuilder(Integer.toBinaryString(i));
            while (b.length() < width) {
                b.insert(0, '0');
            }
            m.put(b.toString(), counts[i]);
        }
        return Tally.of(width, m);
    }

    @Test
    void distancesMatchTheirDefinitionsOnASmallTally() {
        // 3 of 4 shots read 0 against a fair coin. TVD = 1/2 (|3/4 - 1/2| + |1/4 - 1/2|) = 1/4
        // (definition, Levin, Peres and Wilmer 2017, sec. 4.1); Hellinger fidelity
        // (sqrt(3/8) + sqrt(1/8))^2 = 1/2 + 2 sqrt(3/64) = 1/2 + sqrt(3)/4 (closed form).
        TallyComparison c = TallyComparison.of(tally(1, 3, 1), new double[] {0.5, 0.5});
        assertEquals(0.25, c.totalVariation(), 1e-15);
        assertEquals(0.5 + Math.sqrt(3) / 4, c.hellingerFidelity(), 1e-15);
        assertEquals(4, c.shots());
    }

    @Test
    void testsAgreeWithCommonsStatisticsAndCommonsMathWhenNothingIsMerged() {
        // Every expected count is at least 5, so the groups are the outcomes themselves and the
        // figures must equal those of the reference libraries on the same data.
        long[] observed = {130, 95, 110, 65};
        double[] p = {0.3, 0.25, 0.25, 0.2};
        TallyComparison c = TallyComparison.of(tally(2, observed), p);
        double[] expected = new double[4];
        for (int i = 0; i < 4; i++) {
            expected[i] = 400 * p[i];
        }
        assertEquals(4, c.groups());
        assertEquals(3, c.degreesOfFreedom());
        // Reference: Apache Commons Statistics 1.1 ChiSquareTest / GTest.
        assertEquals(ChiSquareTest.withDefaults().statistic(expected, observed), c.chiSquare(),
                1e-12);
        assertEquals(ChiSquareTest.withDefaults().test(expected, observed).getPValue(),
                c.chiSquarePValue(), 1e-12);
        assertEquals(GTest.withDefaults().test(expected, observed).getPValue(), c.gTestPValue(),
                1e-12);
        // Independent reference: Apache Commons Math 3.6.1.
        org.apache.commons.math3.stat.inference.ChiSquareTest chi3 =
                new org.apache.commons.math3.stat.inference.ChiSquareTest();
        org.apache.commons.math3.stat.inference.GTest g3 =
                new org.apache.commons.math3.stat.inference.GTest();
        assertEquals(chi3.chiSquare(expected, observed), c.chiSquare(), 1e-10);
        assertEquals(chi3.chiSquareTest(expected, observed), c.chiSquarePValue(), 1e-10);
        assertEquals(g3.g(expected, observed), c.gStatistic(), 1e-10);
        assertEquals(g3.gTest(expected, observed), c.gTestPValue(), 1e-10);
    }

    @Test
    void mendelsDihybridCrossMatchesTheHandComputedStatistic() {
        // Mendel's 556 F2 peas: 315 round-yellow, 108 round-green, 101 wrinkled-yellow,
        // 32 wrinkled-green against 9:3:3:1 (Mendel 1866, "Versuche ueber Pflanzen-Hybriden";
        // counts as reprinted in most genetics texts). Expected 312.75, 104.25, 104.25, 34.75;
        // chi-square = 2.25^2/312.75 + 3.75^2/104.25 + 3.25^2/104.25 + 2.75^2/34.75
        // = 0.470024... (exact arithmetic by hand); df = 3, p = 0.9254 (from memory, checked
        // here against Commons Math 3.6.1).
        TallyComparison c = TallyComparison.of(tally(2, 315, 108, 101, 32),
                new double[] {9 / 16.0, 3 / 16.0, 3 / 16.0, 1 / 16.0});
        double byHand = 5.0625 / 312.75 + 14.0625 / 104.25 + 10.5625 / 104.25 + 7.5625 / 34.75;
        assertEquals(byHand, c.chiSquare(), 1e-12);
        assertEquals(0.470024, c.chiSquare(), 5e-7);
        assertEquals(0.9254, c.chiSquarePValue(), 5e-4);
        assertEquals(new org.apache.commons.math3.stat.inference.ChiSquareTest().chiSquareTest(
                new double[] {312.75, 104.25, 104.25, 34.75}, new long[] {315, 108, 101, 32}),
                c.chiSquarePValue(), 1e-10);
        assertTrue(c.passes(0.05));
    }

    /**
     * A 5-bit tally of 1,000 shots over 24 possible outcomes (8 outcomes impossible) whose
     * chi-square statistic is {@code target}: 23 outcomes observed 42 times, one 34 times;
     * expected counts equal observed except outcomes 0 and 1, moved by {@code -d} and
     * {@code +d} so that {@code d^2 (1/(42 - d) + 1/(42 + d)) = target}, i.e.
     * {@code d = sqrt(target 42^2 / (84 + target))}.
     */
    private static TallyComparison withChiSquare(double target) {
        long[] observed = new long[32];
        double[] p = new double[32];
        for (int i = 0; i < 24; i++) {
            observed[i] = i == 23 ? 34 : 42;
            p[i] = observed[i] / 1000.0;
        }
        double d = Math.sqrt(target * 42 * 42 / (84 + target));
        p[0] = (42 - d) / 1000;
        p[1] = (42 + d) / 1000;
        return TallyComparison.of(tally(5, observed), p);
    }

    @Test
    void chiSquareAgreesWithTheNistSematechWorkedExample() {
        // NIST/SEMATECH e-Handbook of Statistical Methods (2012), section 1.3.5.15,
        // "Chi-Square Goodness-of-Fit Test", sample output for 1,000 normal numbers tested
        // against the normal distribution (values from memory; the critical values were checked
        // here against Commons Statistics 1.1 and agree to all printed digits):
        // 24 non-empty cells, 0 parameters, statistic 17.52155, 23 degrees of freedom,
        // chi-squared CDF 0.217101; cut-offs 32.00690 (10 %), 35.17246 (5 %), 41.63840 (1 %);
        // H0 accepted at all three levels. The handbook's 1,000 numbers are not reproduced:
        // the tally below has the same statistic, cell count and degrees of freedom, and the
        // comparison must reach the handbook's CDF and decisions.
        TallyComparison c = withChiSquare(17.52155);
        assertEquals(17.52155, c.chiSquare(), 1e-9);
        assertEquals(24, c.groups());
        assertEquals(23, c.degreesOfFreedom());
        assertEquals(0.217101, 1 - c.chiSquarePValue(), 1.5e-6);
        assertTrue(c.chiSquarePValue() >= 0.10);
        // Each printed cut-off separates acceptance from rejection at its level.
        double[] cutoffs = {32.00690, 35.17246, 41.63840};
        double[] levels = {0.10, 0.05, 0.01};
        for (int k = 0; k < 3; k++) {
            TallyComparison below = withChiSquare(cutoffs[k] - 1e-3);
            TallyComparison above = withChiSquare(cutoffs[k] + 1e-3);
            assertEquals(23, above.degreesOfFreedom());
            assertTrue(below.chiSquarePValue() > levels[k], "below the " + levels[k] + " cut-off");
            assertTrue(above.chiSquarePValue() < levels[k], "above the " + levels[k] + " cut-off");
        }
    }

    @Test
    void sparseOutcomesArePooledUntilEveryGroupExpectsAtLeastFive() {
        // n = 100. Expected counts 60, 30, 4, 3, 2, 1: the four below 5 pool to 10 >= 5
        // (Cochran 1954 rule, common practice). Groups: {60}, {30}, {4+3+2+1}.
        long[] observed = {55, 33, 6, 2, 3, 1};
        double[] p = {0.6, 0.3, 0.04, 0.03, 0.02, 0.01, 0, 0};
        long[] padded = {55, 33, 6, 2, 3, 1, 0, 0};
        TallyComparison c = TallyComparison.of(tally(3, padded), p);
        assertEquals(3, c.groups());
        double[] e = {10, 60, 30};
        long[] o = {6 + 2 + 3 + 1, 55, 33};
        // Reference: Commons Math 3.6.1 on the hand-merged groups.
        assertEquals(new org.apache.commons.math3.stat.inference.ChiSquareTest()
                .chiSquareTest(e, o), c.chiSquarePValue(), 1e-10);
        assertEquals(new org.apache.commons.math3.stat.inference.GTest().gTest(e, o),
                c.gTestPValue(), 1e-10);
        assertEquals(observed.length, c.deviations().size());
    }

    @Test
    void aSmallPoolJoinsTheSmallestOtherOutcome() {
        // n = 100. Expected 70, 27, 3: the pool {3} is below 5, so it takes the next smallest
        // outcome (27): groups {70}, {27 + 3} (Cochran 1954 rule, common practice).
        TallyComparison c = TallyComparison.of(tally(2, 66, 30, 4, 0),
                new double[] {0.7, 0.27, 0.03, 0});
        assertEquals(2, c.groups());
        assertEquals(new org.apache.commons.math3.stat.inference.ChiSquareTest()
                .chiSquareTest(new double[] {30, 70}, new long[] {34, 66}), c.chiSquarePValue(),
                1e-10);
    }

    @Test
    void fiveQubitUniformPredictionPassesForASeededSimulatedTally() {
        // H on every qubit gives the uniform distribution (Nielsen and Chuang 2010, sec. 1.4.4).
        Circuit.Builder b = Circuit.builder(5);
        for (int q = 0; q < 5; q++) {
            b.h(q);
        }
        long seed = 11;
        Tally t = Simulator.seeded(seed).run(b.measure().build(), 5000);
        double[] uniform = new double[32];
        java.util.Arrays.fill(uniform, 1 / 32.0);
        TallyComparison c = TallyComparison.of(t, uniform);
        assertTrue(c.passes(0.01), () -> "seed " + seed + ": " + c);
        assertEquals(32, c.groups());
        assertTrue(c.totalVariationLow() <= c.totalVariationHigh(), c::toString);
        assertTrue(c.totalVariation() < 0.1, c::toString);
    }

    @Test
    void biasedTallyFailsWithTheBiasedOutcomesFirst() {
        // Outcomes 00000 and 11111 drawn three times as often as the others: 30 others of weight
        // 1 and two of weight 3, total 36.
        long seed = 99;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        long[] counts = new long[32];
        for (int s = 0; s < 5000; s++) {
            int u = rng.nextInt(36);
            int outcome = u < 3 ? 0 : u < 6 ? 31 : (u - 6) + 1;
            counts[outcome]++;
        }
        double[] uniform = new double[32];
        java.util.Arrays.fill(uniform, 1 / 32.0);
        TallyComparison c = TallyComparison.of(tally(5, counts), uniform);
        assertFalse(c.passes(0.01), () -> "seed " + seed + ": " + c);
        List<Deviation> d = c.deviations();
        assertEquals(Set.of("00000", "11111"), Set.of(d.get(0).bits(), d.get(1).bits()),
                () -> "seed " + seed + ": " + d.subList(0, 4));
        assertTrue(d.get(0).residual() > 0);
        assertTrue(c.report(0.01, 3).contains("FAIL"));
    }

    @Test
    void anOutcomePredictedImpossibleFailsTheComparison() {
        // A Bell pair never reads 01 or 10 (Nielsen and Chuang 2010, sec. 1.3.6).
        Map<String, Double> bell = Map.of("00", 0.5, "11", 0.5);
        TallyComparison c = TallyComparison.of(Tally.of(2, Map.of("00", 480L, "11", 517L,
                "01", 3L)), bell);
        assertEquals(3, c.impossible());
        assertEquals("01", c.deviations().get(0).bits());
        assertEquals(Double.POSITIVE_INFINITY, c.deviations().get(0).residual());
        assertFalse(c.passes(0.01));
        TallyComparison ok = TallyComparison.of(Tally.of(2, Map.of("00", 480L, "11", 520L)), bell);
        assertTrue(ok.passes(0.01), ok::toString);
    }

    @Test
    void mapAndArrayFormsAgree() {
        long[] counts = {40, 10, 35, 15};
        double[] p = {0.4, 0.1, 0.3, 0.2};
        Map<String, Double> m = new HashMap<>();
        m.put("00", 0.4);
        m.put("01", 0.1);
        m.put("10", 0.3);
        m.put("11", 0.2);
        TallyComparison a = TallyComparison.of(tally(2, counts), p, 5, 200, 0.9);
        TallyComparison b = TallyComparison.of(tally(2, counts), m, 5, 200, 0.9);
        assertEquals(a.toString(), b.toString());
        assertEquals(a.totalVariationLow(), b.totalVariationLow());
        assertEquals(a.totalVariationHigh(), b.totalVariationHigh());
    }

    @Test
    void bootstrapIntervalIsSeededAndCoversTheEstimate() {
        long[] counts = new long[16];
        for (int i = 0; i < 16; i++) {
            counts[i] = 20 + (i % 3);
        }
        double[] uniform = new double[16];
        java.util.Arrays.fill(uniform, 1 / 16.0);
        TallyComparison a = TallyComparison.of(tally(4, counts), uniform, 42, 500, 0.95);
        TallyComparison b = TallyComparison.of(tally(4, counts), uniform, 42, 500, 0.95);
        assertEquals(a.totalVariationLow(), b.totalVariationLow());
        assertEquals(a.totalVariationHigh(), b.totalVariationHigh());
        assertTrue(a.totalVariationLow() <= a.totalVariationHigh());
        // A percentile interval of a plug-in TVD sits around the estimate (Efron and Tibshirani
        // 1993, sec. 13.3): the observed distance lies between its ends or near the low end.
        assertTrue(a.totalVariationHigh() >= a.totalVariation(), a::toString);
        // With many shots per outcome the binomial-splitting resampler is used; it must give
        // an interval of the same kind: TVD of 1e5 shots drawn from the prediction is small.
        long[] big = new long[4];
        java.util.Arrays.fill(big, 25_000);
        TallyComparison c = TallyComparison.of(tally(2, big),
                new double[] {0.25, 0.25, 0.25, 0.25}, 3, 300, 0.95);
        assertEquals(0, c.totalVariation());
        assertTrue(c.totalVariationHigh() > 0 && c.totalVariationHigh() < 0.01, c::toString);
    }

    @Test
    void badPredictionsAreRefusedWithTheBadValue() {
        Tally t = tally(2, 5, 5, 5, 5);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> TallyComparison.of(t, new double[] {0.5, 0.5}));
        assertTrue(e.getMessage().contains("2 probabilities"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> TallyComparison.of(t, new double[] {0.5, 0.5, 0.5, -0.5}));
        assertTrue(e.getMessage().contains("-0.5"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> TallyComparison.of(t, new double[] {0.5, 0.5, 0.5, 0.5}));
        assertTrue(e.getMessage().contains("sum to 2.0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> TallyComparison.of(t, Map.of("0x", 1.0)));
        assertTrue(e.getMessage().contains("'0x'"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> TallyComparison.of(t, new double[] {1, 0, 0, 0}, 1, 0, 0.9));
        assertTrue(e.getMessage().contains("was 0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> TallyComparison.of(t, new double[] {1, 0, 0, 0}, 1, 10, 1.5));
        assertTrue(e.getMessage().contains("1.5"), e.getMessage());
        TallyComparison c = TallyComparison.of(t, new double[] {0.25, 0.25, 0.25, 0.25});
        e = assertThrows(IllegalArgumentException.class, () -> c.passes(0));
        assertTrue(e.getMessage().contains("was 0.0"), e.getMessage());
    }
}
