package dev.qsim.spark;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;
import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;
import dev.qsim.stats.ComparisonSettings;
import dev.qsim.stats.TallyComparison;
import dev.qsim.text.QasmReader;
import dev.qsim.text.QasmWriter;

/** Circuit batches on local Spark against textbook outcomes and the single-machine API. */
class CircuitBatchTest {
    private static final Path DEMO = Path.of("..", "qsim-examples", "demo");
    private static SparkSession spark;

    @BeforeAll
    static void start() {
        spark = LocalSpark.start();
    }

    @AfterAll
    static void stop() {
        LocalSpark.stop();
    }

    /** Random circuits of 2 to 4 qubits (common practice: random circuits as test inputs). */
    private static List<CircuitBatch.Program> programs(int count, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        List<CircuitBatch.Program> out = new ArrayList<>();
        for (int k = 0; k < count; k++) {
            int n = 2 + rng.nextInt(3);
            Circuit.Builder b = Circuit.builder(n);
            for (int g = 0; g < 12; g++) {
                int q = rng.nextInt(n);
                int r = (q + 1 + rng.nextInt(n - 1)) % n;
                switch (rng.nextInt(4)) {
                    case 0:
                        b.h(q);
                        break;
                    case 1:
                        b.ry(q, rng.nextDouble() * Math.PI);
                        break;
                    case 2:
                        b.cnot(q, r);
                        break;
                    default:
                        b.rz(q, rng.nextDouble() * Math.PI);
                        break;
                }
            }
            out.add(new CircuitBatch.Program(String.format("random-%02d.qasm", k),
                    QasmWriter.write(b.measure().build())));
        }
        return out;
    }

    private static List<Row> rows(Dataset<Row> d) {
        return new ArrayList<>(d.collectAsList());
    }

    @Test
    void resultsAreTheSameForAnyPartitioningAndEqualTheSingleMachineCalls() {
        NoiseModel model = NoiseModel.builder().afterTwoQubitGates(
                Channel.twoQubitDepolarizing(0.03)).readoutError(0.01, 0.02).build();
        Recipe<NoiseModel> noise = () -> NoiseModel.builder().afterTwoQubitGates(
                Channel.twoQubitDepolarizing(0.03)).readoutError(0.01, 0.02).build();
        List<CircuitBatch.Program> programs = programs(9, 5);
        ComparisonSettings settings = ComparisonSettings.defaults().withResamples(100);
        CircuitBatch batch = CircuitBatch.of(300).withNoise(noise).withSeed(41)
                .withComparison(settings);
        CircuitBatch.Results first = batch.withPartitions(1).run(spark, programs);
        List<Row> circuits = rows(first.circuits());
        List<Row> outcomes = rows(first.outcomes());
        for (int p : new int[] {2, 4, 7}) {
            CircuitBatch.Results r = batch.withPartitions(p).run(spark, programs);
            assertEquals(circuits, rows(r.circuits()), p + " partitions");
            assertEquals(outcomes, rows(r.outcomes()), p + " partitions");
            r.release();
        }
        // The same from a table in another order, on 3 partitions.
        List<Row> table = new ArrayList<>();
        for (int k = programs.size() - 1; k >= 0; k--) {
            table.add(RowFactory.create(programs.get(k).text(), programs.get(k).name()));
        }
        Dataset<Row> df = spark.createDataFrame(table, DataTypes.createStructType(List.of(
                DataTypes.createStructField("program", DataTypes.StringType, false),
                DataTypes.createStructField("name", DataTypes.StringType, false))));
        CircuitBatch.Results fromTable = batch.withPartitions(3).run(spark, df);
        assertEquals(circuits, rows(fromTable.circuits()));
        assertEquals(outcomes, rows(fromTable.outcomes()));

        // Program i (in name order) equals the single-machine calls with ItemSeeds.of(41, i).
        int o = 0;
        for (int i = 0; i < programs.size(); i++) {
            Circuit c = QasmReader.read(programs.get(i).text());
            long seed = ItemSeeds.of(41, i);
            Tally tally = Simulator.seeded(seed).withThreads(1).withNoise(model).run(c, 300);
            Simulator.Prediction p = Simulator.seeded(ItemSeeds.of(seed, 1)).withThreads(1)
                    .withNoise(model).predict(c, 10_000);
            TallyComparison cmp = TallyComparison.of(tally, p.probabilities(),
                    settings.withPredictionShots(p.samples()).withThreads(1));
            Row r = circuits.get(i);
            assertEquals(i, r.getLong(0));
            assertEquals(programs.get(i).name(), r.getString(1));
            assertEquals(cmp.distance(), r.getDouble(8), 0.0);
            assertEquals(cmp.distanceHigh(), r.getDouble(10), 0.0);
            assertEquals(cmp.passes(), r.getBoolean(12));
            assertEquals(tally.outcomes().size(), r.getInt(14));
            for (var e : tally.outcomes().entrySet()) {
                Row out = outcomes.get(o++);
                assertEquals(i, out.getLong(0));
                assertEquals(e.getKey(), out.getString(2));
                assertEquals((long) e.getValue(), out.getLong(3));
                assertEquals(p.probabilities()[Integer.parseInt(e.getKey(), 2)],
                        out.getDouble(5), 0.0);
            }
        }
        assertEquals(outcomes.size(), o);
        first.release();
        fromTable.release();
    }

    @Test
    void demoProgramsGiveTheirTextbookOutcomesAndBadOnesSayWhy(@TempDir Path dir)
            throws IOException {
        for (String name : List.of("bell.qasm", "ghz5.qasm", "teleport.qasm")) {
            Files.copy(DEMO.resolve(name), dir.resolve(name));
        }
        Files.writeString(dir.resolve("broken.qasm"), "OPENQASM 3.0;\nqubit[2] q;\nfoo q[0];\n",
                StandardCharsets.UTF_8);
        Files.writeString(dir.resolve("notes.txt"), "not a program", StandardCharsets.UTF_8);
        List<CircuitBatch.Program> programs = CircuitBatch.readFolder(dir);
        assertEquals(List.of("bell.qasm", "broken.qasm", "ghz5.qasm", "teleport.qasm"),
                programs.stream().map(CircuitBatch.Program::name).toList());
        CircuitBatch.Results r = CircuitBatch.of(2000).withSeed(3).withPartitions(2)
                .run(spark, programs);
        List<Row> circuits = rows(r.circuits());
        assertEquals(4, circuits.size());
        // A Bell pair and a GHZ state read all-equal bits, half 0s and half 1s (Nielsen and
        // Chuang 2010, §1.3.6; Greenberger, Horne and Zeilinger 1989).
        for (int i : new int[] {0, 2}) {
            Row c = circuits.get(i);
            assertNull(c.get(15), c.getString(1));
            assertEquals(2, c.getInt(14));
            assertTrue(c.getBoolean(12), c.getString(1));
            assertEquals(0.0, c.getDouble(13));
        }
        Row broken = circuits.get(1);
        assertTrue(broken.getString(15).contains("foo"), broken.getString(15));
        assertTrue(broken.isNullAt(2) && broken.isNullAt(8));
        // Teleportation moves P(1) = sin^2(pi/3) = 3/4 to qubit 2 (Bennett et al. 1993).
        Row teleport = circuits.get(3);
        assertEquals("exact, summed over the measurement branches", teleport.getString(6));
        List<Row> outcomes = rows(r.outcomes().where("index = 3"));
        assertEquals(8, outcomes.size());
        long ones = 0;
        for (Row o : outcomes) {
            // c0 and c1 are fair coins, c2 reads 1 with probability 3/4.
            boolean one = o.getString(2).charAt(0) == '1';
            assertEquals(one ? 0.75 / 4 : 0.25 / 4, o.getDouble(5), 1e-12, o.getString(2));
            if (one) {
                ones += o.getLong(3);
            }
        }
        assertEquals(0.75, ones / 2000.0, 4 * Math.sqrt(0.75 * 0.25 / 2000));
        r.release();
    }

    @Test
    void aDeviceProfileChecksCouplingsPerCircuit() throws IOException {
        String profile = Files.readString(DEMO.resolve("longstone-pair.json"));
        List<CircuitBatch.Program> programs = List.of(
                new CircuitBatch.Program("a-bell", Files.readString(DEMO.resolve("bell.qasm"))),
                new CircuitBatch.Program("b-ghz", Files.readString(DEMO.resolve("ghz5.qasm"))));
        CircuitBatch.Results r = CircuitBatch.of(500).withDevice(profile).withPartitions(2)
                .run(spark, programs);
        List<Row> circuits = rows(r.circuits());
        assertNull(circuits.get(0).get(15));
        assertEquals("exact, from the density matrix", circuits.get(0).getString(6));
        assertTrue(circuits.get(1).getString(15).contains("5 qubits"),
                circuits.get(1).getString(15));
        r.release();
    }

    @Test
    void badInputIsRefusedBeforeAnyWork(@TempDir Path dir) throws IOException {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> CircuitBatch.of(0));
        assertTrue(e.getMessage().contains("were 0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> CircuitBatch.of(10).withDevice("{\"format\": 1}"));
        assertTrue(e.getMessage().contains("format"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> CircuitBatch.readFolder(dir));
        assertTrue(e.getMessage().contains("no .qasm file"), e.getMessage());
        Files.write(dir.resolve("bad.qasm"), new byte[] {(byte) 0xC3, (byte) 0x28});
        e = assertThrows(IllegalArgumentException.class, () -> CircuitBatch.readFolder(dir));
        assertTrue(e.getMessage().contains("not UTF-8"), e.getMessage());
        Dataset<Row> noName = spark.createDataFrame(List.of(RowFactory.create("x")),
                DataTypes.createStructType(List.of(DataTypes.createStructField("program",
                        DataTypes.StringType, false))));
        e = assertThrows(IllegalArgumentException.class,
                () -> CircuitBatch.of(10).run(spark, noName));
        assertTrue(e.getMessage().contains("'name'"), e.getMessage());
        assertFalse(e.getMessage().isEmpty());
    }
}
