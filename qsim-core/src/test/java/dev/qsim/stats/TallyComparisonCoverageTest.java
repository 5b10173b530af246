package dev.qsim.stats;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.stream.IntStream;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

import dev.qsim.Tally;

/**
 * The coverage of the distance interval, by simulation: for distributions at a known total
 * variation distance from the prediction, the share of seeded tallies whose 95 % interval holds
 * that distance must be within 2 percentage points of 95 % (the definition of a confidence
 * interval, Neyman 1937; with 500 tallies the share's standard error is
 * {@code sqrt(0.95 * 0.05 / 500) = 1.0} point, binomial variance). Tallies are drawn by
 * {@link Tally#sample}, not by the comparison's own sampler.
 */
class TallyComparisonCoverageTest {
    private static final int TALLIES = 500;
    private static final int DRAWS = 200;

    /** One setting: the device's distribution, the prediction, the shots of each. */
    private record Setting(String name, int width, double[] device, double[] predicted,
            long shots, long predictionShots) {
    }

    private static double tvd(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += Math.abs(a[i] - b[i]);
        }
        return 0.5 * s;
    }

    /** Global depolarizing noise: {@code (1 - lambda) q + lambda / 2^width}. */
    private static double[] depolarized(double[] q, double lambda) {
        double[] p = new double[q.length];
        for (int i = 0; i < q.length; i++) {
            p[i] = (1 - lambda) * q[i] + lambda / q.length;
        }
        return p;
    }

    private static double[] bell() {
        // (|00> + |11>)/sqrt 2 reads 00 or 11 with probability 1/2 each (Nielsen and Chuang
        // 2010, sec. 1.3.6).
        return new double[] {0.5, 0, 0, 0.5};
    }

    private static double[] ghz() {
        // The 5-qubit GHZ state reads 00000 or 11111 with probability 1/2 each.
        double[] q = new double[32];
        q[0] = 0.5;
        q[31] = 0.5;
        return q;
    }

    /** GHZ with each of the ten single-bit flips of 00000 and 11111 at 0.008. */
    private static double[] ghzWithFlips() {
        double[] p = new double[32];
        p[0] = 0.46;
        p[31] = 0.46;
        for (int b = 0; b < 5; b++) {
            p[1 << b] += 0.008;
            p[31 ^ (1 << b)] += 0.008;
        }
        return p;
    }

    /** Four independent qubits reading 1 with probabilities 0.3, 0.5, 0.2 and 0.4. */
    private static double[] product() {
        double[] ones = {0.3, 0.5, 0.2, 0.4};
        double[] q = new double[16];
        for (int i = 0; i < 16; i++) {
            double v = 1;
            for (int b = 0; b < 4; b++) {
                v *= ((i >> b) & 1) == 1 ? ones[b] : 1 - ones[b];
            }
            q[i] = v;
        }
        return q;
    }

    private static List<Setting> settings() {
        List<Setting> s = new ArrayList<>();
        s.add(new Setting("Bell, distance 0, 200 shots", 2, bell(), bell(), 200, 0));
        s.add(new Setting("Bell depolarized 0.04, 2000 shots", 2, depolarized(bell(), 0.04),
                bell(), 2000, 0));
        s.add(new Setting("GHZ depolarized 0.1, 200 shots", 5, depolarized(ghz(), 0.1), ghz(),
                200, 0));
        s.add(new Setting("GHZ with bit flips, 1000 shots", 5, ghzWithFlips(), ghz(), 1000, 0));
        s.add(new Setting("product, distance 0, 200 shots", 4, product(), product(), 200, 0));
        s.add(new Setting("product depolarized 0.3, 1000 shots", 4, depolarized(product(), 0.3),
                product(), 1000, 0));
        s.add(new Setting("Bell, distance 0, 500 shots, prediction from 500", 2, bell(), bell(),
                500, 500));
        s.add(new Setting("product depolarized 0.3, 1000 shots, prediction from 2000", 4,
                depolarized(product(), 0.3), product(), 1000, 2000));
        return s;
    }

    /** Returns {covered, estimate inside} for tally {@code r} of a setting. */
    private static boolean[] run(Setting s, int r, double truth) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(7919L * r + 101);
        Tally tally = Tally.sample(s.device(), s.width(), s.shots(), rng);
        double[] predicted = s.predicted();
        if (s.predictionShots() > 0) {
            Tally sample = Tally.sample(s.predicted(), s.width(), s.predictionShots(), rng);
            predicted = new double[s.predicted().length];
            for (int i = 0; i < predicted.length; i++) {
                predicted[i] = sample.count(Tally.bitString(i, s.width()))
                        / (double) s.predictionShots();
            }
        }
        ComparisonSettings settings = ComparisonSettings.defaults().withSeed(1000 + r)
                .withResamples(DRAWS).withThreads(1).withPredictionShots(s.predictionShots());
        TallyComparison c = TallyComparison.of(tally, predicted, settings);
        boolean covered = c.distanceLow() <= truth && truth <= c.distanceHigh();
        boolean inside = c.distanceLow() <= c.distance() && c.distance() <= c.distanceHigh();
        return new boolean[] {covered, inside};
    }

    @Test
    void theIntervalCoversTheTrueDistanceAtItsNominalRateAndHoldsItsEstimate() {
        List<String> report = new ArrayList<>();
        List<String> bad = new ArrayList<>();
        for (Setting s : settings()) {
            double truth = tvd(s.device(), s.predicted());
            boolean[][] results = IntStream.range(0, TALLIES).parallel()
                    .mapToObj(r -> run(s, r, truth)).toArray(boolean[][]::new);
            int covered = 0;
            int inside = 0;
            for (boolean[] x : results) {
                covered += x[0] ? 1 : 0;
                inside += x[1] ? 1 : 0;
            }
            double rate = covered / (double) TALLIES;
            String line = String.format(Locale.ROOT, "%s (true distance %.4f): coverage %.3f",
                    s.name(), truth, rate);
            report.add(line);
            if (rate < 0.93 || rate > 0.97 || inside != TALLIES) {
                bad.add(line + ", estimate inside " + inside + " of " + TALLIES);
            }
        }
        assertEquals(List.of(), bad, () -> String.join("\n", report));
    }

    @Test
    void theSettingsHaveTheirStatedDistances() {
        // Closed forms from the definition TVD = 1/2 sum |p - q|: depolarizing a Bell pair by
        // lambda moves lambda/4 onto each of the four outcomes, TVD = lambda/2; for GHZ-5 it is
        // lambda (1 - 2/32) = 0.9375 lambda; the bit flips move 0.08 onto outcomes predicted
        // impossible, TVD = 0.08.
        List<Setting> s = settings();
        assertEquals(0, tvd(s.get(0).device(), s.get(0).predicted()), 1e-15);
        assertEquals(0.02, tvd(s.get(1).device(), s.get(1).predicted()), 1e-15);
        assertEquals(0.09375, tvd(s.get(2).device(), s.get(2).predicted()), 1e-15);
        assertEquals(0.08, tvd(s.get(3).device(), s.get(3).predicted()), 1e-15);
        double sum = 0;
        for (double v : product()) {
            sum += v;
        }
        assertEquals(1, sum, 1e-15);
        assertTrue(tvd(s.get(5).device(), s.get(5).predicted()) > 0.05);
    }
}
