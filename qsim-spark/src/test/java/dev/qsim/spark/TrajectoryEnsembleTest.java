package dev.qsim.spark;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.statistics.inference.ChiSquareTest;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;
import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;

/** Trajectory ensembles on local Spark against the single-machine run and the density matrix. */
class TrajectoryEnsembleTest {
    private static SparkSession spark;

    private static final Recipe<Circuit> CIRCUIT = () -> Circuit.builder(3).h(0).cnot(0, 1)
            .ry(2, 0.8).cnot(1, 2).measure(0, 0).ifBit(0, 1, b -> b.x(2)).measure(1, 1)
            .measure(2, 2).build();
    private static final Recipe<NoiseModel> NOISE = () -> NoiseModel.builder()
            .afterOneQubitGates(Channel.amplitudeDamping(0.05))
            .afterTwoQubitGates(Channel.twoQubitDepolarizing(0.04))
            .readoutError(0.02, 0.03).build();

    @BeforeAll
    static void start() {
        spark = LocalSpark.start();
    }

    @AfterAll
    static void stop() {
        LocalSpark.stop();
    }

    @Test
    void tallyIsTheSameForAnyPartitioningAndEqualsTheSingleMachineRun() {
        int n = 4000;
        Tally single = Simulator.seeded(99).withNoise(NOISE.make())
                .withEngine(Simulator.Engine.TRAJECTORIES).run(CIRCUIT.make(), n);
        TrajectoryEnsemble ensemble = TrajectoryEnsemble.of(CIRCUIT, NOISE, n).withSeed(99);
        for (int p : new int[] {1, 2, 4, 7}) {
            assertEquals(single, ensemble.withPartitions(p).run(spark), p + " partitions");
        }
        assertEquals(single, ensemble.withPartitions(3).withThreads(2).run(spark));
        // More partitions than trajectories: some slices are empty.
        Tally few = Simulator.seeded(5).withNoise(NOISE.make())
                .withEngine(Simulator.Engine.TRAJECTORIES).run(CIRCUIT.make(), 5);
        assertEquals(few, TrajectoryEnsemble.of(CIRCUIT, NOISE, 5).withSeed(5)
                .withPartitions(7).run(spark));
    }

    @Test
    void theMergedTallySamplesTheExactNoisyDistribution() {
        // Reference: trajectories average to the density matrix (Dalibard, Castin and Molmer
        // 1992, Phys. Rev. Lett. 68, 580); chi-square test of Apache Commons Statistics 1.1.
        double[] p = Simulator.seeded(0).withNoise(NOISE.make()).distribution(CIRCUIT.make());
        Tally t = TrajectoryEnsemble.of(CIRCUIT, NOISE, 6000).withSeed(2024).withPartitions(4)
                .run(spark);
        double[] expected = new double[p.length];
        long[] observed = new long[p.length];
        for (int i = 0; i < p.length; i++) {
            expected[i] = Math.max(p[i], 1e-300);
            observed[i] = t.count(i);
        }
        assertTrue(ChiSquareTest.withDefaults().test(expected, observed).getPValue() > 1e-4);
        List<Row> rows = TrajectoryEnsemble.outcomes(spark, t).collectAsList();
        assertEquals(t.outcomes().size(), rows.size());
        long total = 0;
        for (int k = 0; k < rows.size(); k++) {
            Row r = rows.get(k);
            assertEquals(t.count(r.getString(0)), r.getLong(2));
            assertEquals(Long.parseLong(r.getString(0), 2), r.getLong(1));
            assertEquals(r.getLong(2) / 6000.0, r.getDouble(3), 0.0);
            total += r.getLong(2);
            if (k > 0) {
                assertTrue(rows.get(k - 1).getLong(1) < r.getLong(1));
            }
        }
        assertEquals(6000, total);
    }

    @Test
    void badEnsemblesAreRefusedOnTheDriver() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> TrajectoryEnsemble.of(CIRCUIT, NOISE, 0));
        assertTrue(e.getMessage().contains("was 0"), e.getMessage());
        Recipe<Circuit> wide = () -> Circuit.builder(1, 64).h(0).measure(0, 63).build();
        e = assertThrows(IllegalArgumentException.class,
                () -> TrajectoryEnsemble.of(wide, NOISE, 10).run(spark));
        assertTrue(e.getMessage().contains("64 classical bits"), e.getMessage());
    }
}
