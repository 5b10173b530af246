package dev.qsim.spark.benchmarking;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

import dev.qsim.Simulator;
import dev.qsim.noise.DeviceProfile;
import dev.qsim.noise.NoiseModel;
import dev.qsim.spark.ItemSeeds;
import dev.qsim.spark.LocalSpark;
import dev.qsim.spark.Recipe;

/**
 * Randomized benchmarking of the invented Longstone pair on local Spark: the fitted error per
 * Clifford against the noise model's average gate infidelity (Magesan, Gambetta and Emerson
 * 2011), and the same sequences for any partitioning.
 */
class RandomizedBenchmarkingTest {
    private static SparkSession spark;
    private static String profile;

    @BeforeAll
    static void start() throws IOException {
        spark = LocalSpark.start();
        profile = Files.readString(Path.of("..", "qsim-examples", "demo",
                "longstone-pair.json"));
    }

    @AfterAll
    static void stop() {
        LocalSpark.stop();
    }

    @Test
    void sequencesAreTheSameForAnyPartitioningAndEqualTheSingleMachineRun() {
        RandomizedBenchmarking rb = RandomizedBenchmarking.of(Recipe.deviceNoise(profile),
                new int[] {1, 4, 12}, 3).withSeed(17);
        RandomizedBenchmarking.Results one = rb.withPartitions(1).run(spark);
        List<Row> rows = one.sequences().collectAsList();
        for (int p : new int[] {2, 4, 7}) {
            RandomizedBenchmarking.Results r = rb.withPartitions(p).run(spark);
            assertEquals(rows, r.sequences().collectAsList(), p + " partitions");
            assertEquals(one.fit(), r.fit(), p + " partitions");
        }
        NoiseModel model = DeviceProfile.read(profile).noiseModel();
        int[] lengths = {1, 4, 12};
        for (int i = 0; i < rows.size(); i++) {
            Row row = rows.get(i);
            int m = lengths[i / 3];
            assertEquals(i, row.getLong(0));
            assertEquals(m, row.getInt(1));
            double single = Simulator.seeded(0).withNoise(model).distribution(
                    RandomizedBenchmarking.circuit(RandomizedBenchmarking.draw(17, i, m)))[0];
            assertEquals(single, row.getDouble(2), 0.0, "sequence " + i);
        }
        // Sampled survival: the same for 1 and 7 partitions, and the single-machine run.
        RandomizedBenchmarking sampled = rb.withShots(300);
        List<Row> s1 = sampled.withPartitions(1).run(spark).sequences().collectAsList();
        assertEquals(s1, sampled.withPartitions(7).run(spark).sequences().collectAsList());
        long hits = Simulator.seeded(ItemSeeds.of(ItemSeeds.of(17, 5), 1)).withNoise(model)
                .run(RandomizedBenchmarking.circuit(RandomizedBenchmarking.draw(17, 5, 4)), 300)
                .count(0);
        assertEquals(hits / 300.0, s1.get(5).getDouble(2), 0.0);
    }

    @Test
    void fittedErrorPerCliffordAgreesWithTheNoiseModel() {
        // Reference: r = (1 - p)(d - 1)/d from the decay equals the average gate infidelity of
        // the noise (Magesan, Gambetta and Emerson 2011, Phys. Rev. Lett. 106, 180504), here
        // the mean over the group of each noisy Clifford's infidelity (Nielsen 2002). Allowed:
        // 4 standard errors of the fit (the spread of random sequences) plus 3 % for the gate
        // dependence of the device's noise, a second-order effect (Proctor et al. 2017, Phys.
        // Rev. Lett. 119, 130502).
        RandomizedBenchmarking.Results r = RandomizedBenchmarking.of(Recipe.deviceNoise(profile),
                new int[] {1, 10, 25, 50, 100, 150}, 20).withSeed(1).withPartitions(2)
                .run(spark);
        DecayFit fit = r.fit();
        double predicted = r.predictedErrorPerClifford();
        assertEquals(predicted, fit.errorPerClifford(), 4 * fit.errorPerCliffordError()
                + 0.03 * predicted, fit + " against " + predicted);
        // The Longstone profile's gate errors (0.0003 per one-qubit gate, 0.006 per CNOT) and
        // the group's 6.9 one-qubit gates and 1.5 CNOTs per element: about 0.0111 to first
        // order (errors add).
        double[] n = TwoQubitCliffords.group().meanGateCounts();
        assertEquals(n[0] * 0.0003 + n[1] * 0.006, predicted, 0.05 * predicted);
        // B tends to the survival of the completely mixed state through the readout errors:
        // about 1/4; A + B is the survival at m = 0, below 1 by the readout errors.
        assertEquals(0.25, fit.b(), 0.02);
        assertTrue(fit.a() + fit.b() < 1 && fit.a() + fit.b() > 0.95, fit.toString());
        double[] means = r.meanSurvival();
        for (int k = 1; k < means.length; k++) {
            assertTrue(means[k] < means[k - 1], "survival decays with length");
        }
    }

    @Test
    void badSettingsAreRefusedByValue() {
        Recipe<NoiseModel> noise = Recipe.deviceNoise(profile);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> RandomizedBenchmarking.of(noise, new int[] {1, 2, 2}, 5));
        assertTrue(e.getMessage().contains("[1, 2, 2]"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> RandomizedBenchmarking.of(noise, new int[] {1, 2, 0}, 5));
        assertTrue(e.getMessage().contains("length 0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> RandomizedBenchmarking.of(noise, new int[] {1, 2, 3}, 1_000_000));
        assertTrue(e.getMessage().contains("3000000 sequences"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> RandomizedBenchmarking.of(noise, new int[] {1, 2, 3}, 5).withShots(-1));
        assertTrue(e.getMessage().contains("-1"), e.getMessage());
    }
}
