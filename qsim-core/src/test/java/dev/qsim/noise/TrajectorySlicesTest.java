package dev.qsim.noise;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.HashMap;
import java.util.Map;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.apache.commons.statistics.inference.ChiSquareTest;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Precision;
import dev.qsim.Simulator;
import dev.qsim.Tally;

/**
 * Slices of a trajectory ensemble ({@link Simulator#runTrajectories}): any split of the
 * trajectory indices adds up to the whole run, and the slices sample the exact noisy
 * distribution.
 */
class TrajectorySlicesTest {
    private static final NoiseModel MODEL = NoiseModel.builder()
            .afterOneQubitGates(Channel.depolarizing(0.02))
            .afterTwoQubitGates(Channel.twoQubitDepolarizing(0.05))
            .readoutError(0.02, 0.04).build();

    private static Simulator trajectories(long seed) {
        return Simulator.seeded(seed).withNoise(MODEL).withThreads(2)
                .withEngine(Simulator.Engine.TRAJECTORIES);
    }

    private static Circuit random(int n, int gates, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        return NoiseFixtures.randomGates(Circuit.builder(n), n, gates, rng).measure().build();
    }

    /** Adds tallies count for count. */
    private static Tally merge(int width, Tally... parts) {
        Map<String, Long> sum = new HashMap<>();
        for (Tally t : parts) {
            t.outcomes().forEach((bits, n) -> sum.merge(bits, n, Long::sum));
        }
        return Tally.of(width, sum);
    }

    @Test
    void slicesOfAnySplitAddUpToTheWholeRun() {
        Circuit c = random(4, 30, 11);
        int n = 600;
        Tally whole = trajectories(5).run(c, n);
        int[][] splits = {{n}, {1, n - 1}, {250, 350}, {100, 100, 100, 100, 100, 100},
            {7, 93, 1, 499}};
        for (int[] split : splits) {
            Tally[] parts = new Tally[split.length];
            long from = 0;
            for (int k = 0; k < split.length; k++) {
                // Each slice on its own simulator with another thread count: as on another
                // machine.
                parts[k] = trajectories(5).withThreads(1 + k % 3).runTrajectories(c, from,
                        split[k]);
                assertEquals(split[k], parts[k].shots());
                from += split[k];
            }
            assertEquals(whole, merge(c.clbits(), parts), java.util.Arrays.toString(split));
        }
    }

    @Test
    void slicesOfACircuitWithMidCircuitMeasurementAddUp() {
        Circuit c = Circuit.builder(3).h(0).cnot(0, 1).measure(0, 0)
                .ifBit(0, 1, b -> b.x(2)).h(1).measure(1, 1).measure(2, 2).build();
        Tally whole = trajectories(9).run(c, 300);
        Tally joined = merge(3, trajectories(9).runTrajectories(c, 0, 120),
                trajectories(9).runTrajectories(c, 120, 180));
        assertEquals(whole, joined);
    }

    @Test
    void slicesSampleTheDensityMatrixDistribution() {
        // Reference: trajectories average to the density matrix (Dalibard, Castin and Molmer
        // 1992, Phys. Rev. Lett. 68, 580); chi-square test of Apache Commons Statistics 1.1.
        Circuit c = random(3, 20, 23);
        double[] p = Simulator.seeded(1).withNoise(MODEL).distribution(c);
        Tally t = merge(3, trajectories(3).runTrajectories(c, 1_000_000, 2000),
                trajectories(3).runTrajectories(c, 5_000_000_000L, 2000));
        double[] expected = new double[p.length];
        long[] observed = new long[p.length];
        for (int i = 0; i < p.length; i++) {
            assertTrue(p[i] > 1e-6, "every outcome is possible under depolarizing noise");
            expected[i] = p[i];
            observed[i] = t.count(i);
        }
        double pValue = ChiSquareTest.withDefaults().test(expected, observed).getPValue();
        assertTrue(pValue > 1e-4, "p-value " + pValue);
    }

    @Test
    void badSlicesAreRefusedByValue() {
        Circuit c = random(2, 5, 3);
        Simulator sim = trajectories(1);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> sim.runTrajectories(c, -1, 10));
        assertTrue(e.getMessage().contains("-1"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> sim.runTrajectories(c, 0, 0));
        assertTrue(e.getMessage().contains("at least 1 but was 0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> sim.runTrajectories(c, Long.MAX_VALUE - 5, 10));
        assertTrue(e.getMessage().contains(Long.toString(Long.MAX_VALUE - 10)), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> sim.withPrecision(Precision.SINGLE).runTrajectories(c, 0, 10));
        assertTrue(e.getMessage().contains("double precision"), e.getMessage());
        Tally last = sim.runTrajectories(c, Long.MAX_VALUE - 10, 10);
        assertEquals(10, last.shots());
    }
}
