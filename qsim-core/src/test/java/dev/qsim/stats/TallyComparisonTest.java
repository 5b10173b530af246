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
        // (definition, Levin, Peres and Wilmer 2017, sec. 4.1). Bhattacharyya coefficient
        // (Bhattacharyya 1943) BC = sqrt(3/8) + sqrt(1/8) = (sqrt 3 + 1) / (2 sqrt 2); classical
        // fidelity BC^2 = 1/2 + 2 sqrt(3/64) = 1/2 + sqrt(3)/4 (Nielsen and Chuang 2010,
        // sec. 9.2.2); Hellinger distance sqrt(1 - BC) (Le Cam and Yang 2000), closed forms.
        TallyComparison c = TallyComparison.of(tally(1, 3, 1), new double[] {0.5, 0.5});
        double bc = (Math.sqrt(3) + 1) / (2 * Math.sqrt(2));
        assertEquals(0.25, c.observedDistance(), 1e-15);
        assertEquals(bc, c.bhattacharyyaCoefficient(), 1e-15);
        assertEquals(0.5 + Math.sqrt(3) / 4, c.classicalFidelity(), 1e-15);
        assertEquals(Math.sqrt(1 - bc), c.hellingerDistance(), 1e-12);
        assertEquals(4, c.shots());
    }

    @Test
    void hellingerDistanceIsHalfTheEuclideanDistanceOfRootProbabilities() {
        // Textbook identity (Le Cam and Yang 2000, from memory): 1 - BC = 1/2 sum (sqrt f -
        // sqrt p)^2, so H^2 = 1/2 ||sqrt f - sqrt p||^2.
        long[] counts = {130, 95, 110, 65};
        double[] p = {0.3, 0.25, 0.25, 0.2};
        TallyComparison c = TallyComparison.of(tally(2, counts), p);
        double s = 0;
        for (int i = 0; i < 4; i++) {
            double d = Math.sqrt(counts[i] / 400.0) - Math.sqrt(p[i]);
            s += d * d;
        }
        assertEquals(0.5 * s, c.hellingerDistance() * c.hellingerDistance(), 1e-12);
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
        // A noiseless simulation is at distance 0 from its own prediction; 5,000 shots over 32
        // outcomes resolve distances of about 0.02 (binomial noise of sqrt(p / n) per outcome,
        // common practice), well inside the default tolerance.
        assertTrue(c.passes(), () -> "seed " + seed + ": " + c);
        assertEquals(32, c.groups());
        assertTrue(c.distanceLow() <= c.distance() && c.distance() <= c.distanceHigh(),
                c::toString);
        assertEquals(0, c.distanceLow(), c::toString);
        // The observed distance of a sample from the prediction itself is pure sampling noise,
        // which the estimate removes (E|X| >= |E X|, Jensen's inequality).
        assertTrue(c.distance() < c.observedDistance(), c::toString);
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
        // True distance: the two heavy outcomes carry 3/36 each instead of 1/32, so
        // TVD = 2 (3/36 - 1/32) = 0.1042 (definition), twice the default tolerance; 5,000 shots
        // put the whole interval above it.
        double truth = 2 * (3 / 36.0 - 1 / 32.0);
        assertFalse(c.passes(), () -> "seed " + seed + ": " + c);
        assertTrue(c.distanceLow() > 0.05 && c.distanceLow() < truth
                && truth < c.distanceHigh(), c::toString);
        assertTrue(c.reason().contains("lower end"), c::reason);
        List<Deviation> d = c.deviations();
        assertEquals(Set.of("00000", "11111"), Set.of(d.get(0).bits(), d.get(1).bits()),
                () -> "seed " + seed + ": " + d.subList(0, 4));
        assertTrue(d.get(0).residual() > 0);
        assertTrue(c.report(3).contains("FAIL"));
    }

    @Test
    void shotsOnImpossibleOutcomesAreARateWithAnExactIntervalNotAFailure() {
        // A Bell pair never reads 01 or 10 (Nielsen and Chuang 2010, sec. 1.3.6).
        Map<String, Double> bell = Map.of("00", 0.5, "11", 0.5);
        TallyComparison c = TallyComparison.of(Tally.of(2, Map.of("00", 4800L, "11", 5170L,
                "01", 30L)), bell);
        assertEquals(30, c.impossible());
        assertEquals("01", c.deviations().get(0).bits());
        assertEquals(Double.POSITIVE_INFINITY, c.deviations().get(0).residual());
        assertEquals(0.003, c.impossibleRate(), 1e-15);
        // Reference: Commons Math 3.6.1 ClopperPearsonInterval (Clopper and Pearson 1934).
        org.apache.commons.math3.stat.interval.ConfidenceInterval cp =
                new org.apache.commons.math3.stat.interval.ClopperPearsonInterval()
                        .createInterval(10_000, 30, 0.95);
        assertEquals(cp.getLowerBound(), c.impossibleRateLow(), 1e-9);
        assertEquals(cp.getUpperBound(), c.impossibleRateHigh(), 1e-9);
        // TVD = 1/2 (0.02 + 0.017 + 0.003) = 0.02 (definition) with sampling noise of
        // sqrt(0.25 / 10000) = 0.005 per frequency (binomial variance): within the tolerance
        // 0.05 although 30 shots landed where none should.
        assertEquals(0.02, c.observedDistance(), 1e-12);
        assertTrue(c.passes(), c::toString);
        assertTrue(c.report(0).contains(String.format(java.util.Locale.ROOT,
                "shots on impossible        30 of 10000, rate 0.0030 (95%% interval %.4f to"
                + " %.4f)", cp.getLowerBound(), cp.getUpperBound())), () -> c.report(0));
    }

    @Test
    void noShotOnAnImpossibleOutcomeGivesTheExactUpperBound() {
        // With 0 of n events the Clopper-Pearson interval is [0, 1 - (alpha/2)^(1/n)]
        // (closed form of the beta quantile, Clopper and Pearson 1934).
        TallyComparison c = TallyComparison.of(Tally.of(2, Map.of("00", 480L, "11", 520L)),
                Map.of("00", 0.5, "11", 0.5));
        assertEquals(0, c.impossible());
        assertEquals(0, c.impossibleRateLow());
        assertEquals(1 - Math.pow(0.025, 1 / 1000.0), c.impossibleRateHigh(), 1e-12);
    }

    @Test
    void oneStrayShotInABellTallyPassesAndTheIntervalHoldsItsEstimate() {
        // 10,000 shots: 5000 x 00, 4999 x 11, 1 x 01. TVD = 1/2 (0 + 1e-4 + 1e-4) = 1e-4
        // (definition). The frequencies' sampling noise is sqrt(0.25 / 10000) = 0.005 (binomial
        // variance, common practice), so a valid 95 % interval sits within a few times that of
        // 0, far inside the tolerance 0.05.
        TallyComparison c = TallyComparison.of(Tally.of(2, Map.of("00", 5000L, "11", 4999L,
                "01", 1L)), Map.of("00", 0.5, "11", 0.5));
        assertEquals(1e-4, c.observedDistance(), 1e-15);
        assertTrue(c.distanceLow() <= c.distance() && c.distance() <= c.distanceHigh(),
                c::toString);
        assertEquals(0, c.distanceLow());
        assertTrue(c.distanceHigh() < 0.02, c::toString);
        assertTrue(c.passes(), c::toString);
        String report = c.report(4);
        assertTrue(report.contains("tolerance                  0.05\n"), report);
        assertTrue(report.contains("verdict                    PASS: the 95% interval's upper"
                + " end "), report);
        assertTrue(report.contains(String.format(java.util.Locale.ROOT,
                "95%% interval %.4f to %.4f", c.distanceLow(), c.distanceHigh())), report);
        // Sensible precision: no number in the report carries more than six decimals.
        assertFalse(java.util.regex.Pattern.compile("\\d\\.\\d{7,}").matcher(report).find(),
                report);
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
        assertEquals(a.distanceLow(), b.distanceLow());
        assertEquals(a.distanceHigh(), b.distanceHigh());
    }

    @Test
    void resultsDependOnTheSeedButNotOnTheThreadCount() {
        // Each Monte Carlo draw has its own generator (common practice for reproducible
        // parallel simulation), so splitting the draws over threads changes nothing.
        long[] counts = new long[16];
        for (int i = 0; i < 16; i++) {
            counts[i] = 20 + (i % 3);
        }
        double[] uniform = new double[16];
        java.util.Arrays.fill(uniform, 1 / 16.0);
        ComparisonSettings s = ComparisonSettings.defaults().withSeed(42).withResamples(300);
        TallyComparison one = TallyComparison.of(tally(4, counts), uniform, s.withThreads(1));
        TallyComparison two = TallyComparison.of(tally(4, counts), uniform, s.withThreads(2));
        TallyComparison three = TallyComparison.of(tally(4, counts), uniform, s.withThreads(3));
        assertEquals(one.toString(), two.toString());
        assertEquals(one.toString(), three.toString());
        assertEquals(one.distanceHigh(), three.distanceHigh());
        TallyComparison other = TallyComparison.of(tally(4, counts), uniform, s.withSeed(43));
        assertTrue(other.distanceHigh() != one.distanceHigh()
                || other.distance() != one.distance(), other::toString);
    }

    @Test
    void manyShotsGiveANarrowIntervalAtZero() {
        // 100,000 shots exactly on the prediction: each frequency's noise is
        // sqrt(0.25 * 0.75 / 1e5) = 0.0014 (binomial variance, common practice), so the upper
        // end lies within a few of those of 0.
        long[] big = new long[4];
        java.util.Arrays.fill(big, 25_000);
        TallyComparison c = TallyComparison.of(tally(2, big),
                new double[] {0.25, 0.25, 0.25, 0.25}, 3, 300, 0.95);
        assertEquals(0, c.observedDistance());
        assertEquals(0, c.distance());
        assertTrue(c.distanceHigh() > 0 && c.distanceHigh() < 0.01, c::toString);
    }

    @Test
    void aSampledPredictionWidensTheInterval() {
        // The difference of two independent samples varies more than one sample's departure
        // from a fixed distribution (variances add, textbook), so allowing for a prediction
        // from 500 shots must widen the interval of the same tally.
        long[] counts = {230, 18, 22, 230};
        double[] p = {0.46, 0.04, 0.04, 0.46};
        ComparisonSettings s = ComparisonSettings.defaults().withResamples(300);
        TallyComparison exact = TallyComparison.of(tally(2, counts), p, s);
        TallyComparison sampled = TallyComparison.of(tally(2, counts), p,
                s.withPredictionShots(500));
        assertEquals(exact.observedDistance(), sampled.observedDistance());
        assertTrue(sampled.distanceHigh() - sampled.distanceLow()
                > exact.distanceHigh() - exact.distanceLow(), () -> exact + "\n" + sampled);
        assertTrue(sampled.report(0).contains("prediction                 sampled, 500 shots"));
    }

    @Test
    void theToleranceDecidesTheVerdict() {
        // The same tally passes a tolerance above its interval's upper end and fails one
        // below (definition of the verdict, Wellek 2010).
        long[] counts = {460, 40, 40, 460};
        double[] p = {0.5, 0, 0, 0.5};
        TallyComparison loose = TallyComparison.of(tally(2, counts), p,
                ComparisonSettings.defaults().withTolerance(0.2));
        assertTrue(loose.passes(), loose::toString);
        TallyComparison tight = TallyComparison.of(tally(2, counts), p,
                ComparisonSettings.defaults().withTolerance(loose.distanceHigh() / 2));
        assertFalse(tight.passes(), tight::toString);
        assertEquals(loose.distanceHigh(), tight.distanceHigh());
        assertEquals(0.2, loose.tolerance());
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
                () -> TallyComparison.of(t, new double[] {1, 0, 0, 0}, 1, 100, 1.5));
        assertTrue(e.getMessage().contains("1.5"), e.getMessage());
        ComparisonSettings d = ComparisonSettings.defaults();
        e = assertThrows(IllegalArgumentException.class, () -> d.withTolerance(0));
        assertTrue(e.getMessage().contains("(0, 1] but was 0.0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> d.withTolerance(1.5));
        assertTrue(e.getMessage().contains("was 1.5"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> d.withPredictionShots(-1));
        assertTrue(e.getMessage().contains("was -1"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> d.withThreads(0));
        assertTrue(e.getMessage().contains("was 0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> d.withResamples(19));
        assertTrue(e.getMessage().contains("at least 20 but was 19"), e.getMessage());
        // A refused change leaves the settings as they were (immutable values).
        assertEquals(ComparisonSettings.DEFAULT_TOLERANCE, d.tolerance());
        TallyComparison c = TallyComparison.of(t, new double[] {0.25, 0.25, 0.25, 0.25});
        e = assertThrows(IllegalArgumentException.class, () -> c.report(-1));
        assertTrue(e.getMessage().contains("was -1"), e.getMessage());
    }
}
