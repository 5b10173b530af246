package dev.qsim.spark.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;

import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructField;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import dev.qsim.spark.LocalSpark;

/** The tool's commands, run in this JVM on local[2], against closed forms and by their output. */
class SparkToolTest {
    private static final Path DEMO = Path.of("..", "qsim-examples", "demo");
    private static final Path RIDGE = Path.of("demo", "ridge.tune");

    @TempDir
    Path dir;

    /** The exit code, standard output and standard error of one run of the tool. */
    private record Outcome(int code, String out, String err) {
    }

    private static Outcome tool(String... args) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int code = SparkTool.run(args, new PrintStream(out, true, StandardCharsets.UTF_8),
                new PrintStream(err, true, StandardCharsets.UTF_8));
        return new Outcome(code, out.toString(StandardCharsets.UTF_8),
                err.toString(StandardCharsets.UTF_8));
    }

    /** The data lines of the CSV part files Spark wrote, in part order. */
    private static List<String[]> csv(Path folder) throws IOException {
        List<Path> parts;
        try (Stream<Path> s = Files.list(folder)) {
            parts = s.filter(p -> p.getFileName().toString().startsWith("part-")
                    && p.getFileName().toString().endsWith(".csv")).sorted().toList();
        }
        List<String[]> rows = new ArrayList<>();
        for (Path p : parts) {
            List<String> lines = Files.readAllLines(p);
            for (int i = 1; i < lines.size(); i++) {
                rows.add(lines.get(i).split(","));
            }
        }
        return rows;
    }

    @Test
    void sweepWritesTheRingLandscapeOfItsClosedForm() throws IOException {
        // One QAOA layer on a 4-node ring: with rzz(gamma) = exp(-i gamma ZZ/2) and
        // rx(2 beta), sum over the ring's edges of <Z_u Z_v>/2 = sin(4 beta) sin(2 gamma)
        // (Wang, Hadfield, Jiang and Rieffel 2018, Phys. Rev. A 97, 022304, Theorem 1, degree 2
        // and no triangles; the sign of gamma follows our gate convention).
        Path out = dir.resolve("landscape");
        Outcome o = tool("sweep", "--circuit", RIDGE.toString(), "--observable", "0.5 Z0 Z1",
                "--observable", "0.5 Z1 Z2", "--observable", "0.5 Z2 Z3", "--observable",
                "0.5 Z3 Z0", "--grid", "gamma=0:3:7", "--grid", "beta=-1:1:5", "--gradient",
                "--master", "local[2]", "--partitions", "3", "--format", "csv", "--out",
                out.toString());
        assertEquals(0, o.code(), o.err());
        assertTrue(o.out().startsWith("35 points in"), o.out());
        assertTrue(o.out().contains("lowest value:") && o.out().contains("highest value:"));
        List<String[]> rows = csv(out);
        assertEquals(35, rows.size());
        for (int i = 0; i < rows.size(); i++) {
            String[] r = rows.get(i);
            assertEquals(i, Long.parseLong(r[0]));
            double g = Double.parseDouble(r[1]);
            double b = Double.parseDouble(r[2]);
            assertEquals(Math.sin(4 * b) * Math.sin(2 * g), Double.parseDouble(r[3]), 1e-12);
            assertEquals(0.0, Double.parseDouble(r[4]));
            assertEquals(2 * Math.sin(4 * b) * Math.cos(2 * g), Double.parseDouble(r[5]), 1e-12);
            assertEquals(4 * Math.cos(4 * b) * Math.sin(2 * g), Double.parseDouble(r[6]), 1e-12);
        }
    }

    @Test
    void batchTrajectoriesAndCliffordDecaySummariseTheirRuns() throws IOException {
        Path programs = Files.createDirectory(dir.resolve("programs"));
        Files.copy(DEMO.resolve("bell.qasm"), programs.resolve("bell.qasm"));
        Files.copy(DEMO.resolve("ghz5.qasm"), programs.resolve("ghz5.qasm"));
        Files.writeString(programs.resolve("broken.qasm"), "OPENQASM 3.0;\nqubit q;\nbar q;\n");
        Outcome o = tool("batch", "--circuits", programs.toString(), "--shots", "2000",
                "--master", "local[2]", "--out", dir.resolve("b").toString());
        assertEquals(0, o.code(), o.err());
        assertTrue(o.out().contains("3 programs in"), o.out());
        // Bell and GHZ states give only all-equal bitstrings, half and half (Nielsen and
        // Chuang 2010, section 1.3.6): both pass; the broken one is reported, not run.
        assertTrue(o.out().contains("2 pass, 0 fail the tolerance 0.0500, 1 not run"), o.out());
        assertTrue(o.out().contains("not run: broken.qasm:") && o.out().contains("bar"),
                o.out());
        assertTrue(Files.exists(dir.resolve("b").resolve("circuits").resolve("_SUCCESS")));
        assertTrue(Files.exists(dir.resolve("b").resolve("outcomes").resolve("_SUCCESS")));

        Path t = dir.resolve("t");
        o = tool("trajectories", DEMO.resolve("bell.qasm").toString(), "--device",
                DEMO.resolve("longstone-pair.json").toString(), "--trajectories", "3000",
                "--master", "local[2]", "--partitions", "7", "--format", "csv", "--out",
                t.toString());
        assertEquals(0, o.code(), o.err());
        assertTrue(o.out().startsWith("3,000 trajectories in"), o.out());
        long total = 0;
        for (String[] r : csv(t)) {
            total += Long.parseLong(r[2]);
        }
        assertEquals(3000, total);

        o = tool("clifford-decay", "--device", DEMO.resolve("longstone-pair.json").toString(),
                "--lengths", "1,5,20", "--sequences", "3", "--master", "local[2]");
        assertEquals(0, o.code(), o.err());
        assertTrue(o.out().startsWith("9 sequences in"), o.out());
        assertTrue(o.out().contains("fit: p = ") && o.out().contains("the noise model's 0.011"),
                o.out());
    }

    /** A table's columns as "name type" (Spark's simple type names), in order. */
    private static List<String> columns(Dataset<Row> table) {
        List<String> out = new ArrayList<>();
        for (StructField f : table.schema().fields()) {
            out.add(f.name() + " " + f.dataType().simpleString());
        }
        return out;
    }

    @Test
    void batchTablesReadBackFromParquetWithTheDocumentedSchema() throws IOException {
        // The programs as a Parquet table (columns name and program), written by Spark.
        Path table = dir.resolve("programs.parquet");
        Path out = dir.resolve("b");
        List<String> written = new ArrayList<>();
        SparkSession spark = LocalSpark.start();
        try {
            List<Row> programs = List.of(
                    RowFactory.create("ghz5", Files.readString(DEMO.resolve("ghz5.qasm"))),
                    RowFactory.create("bell", Files.readString(DEMO.resolve("bell.qasm"))));
            spark.createDataFrame(programs, DataTypes.createStructType(List.of(
                    DataTypes.createStructField("name", DataTypes.StringType, false),
                    DataTypes.createStructField("program", DataTypes.StringType, false))))
                    .coalesce(1).write().parquet(table.toString());
            Outcome o = tool("batch", "--table", table.toString(), "--shots", "1000",
                    "--seed", "5", "--out", out.toString());
            assertEquals(0, o.code(), o.err());
            assertTrue(o.out().contains("2 programs in"), o.out());
            Dataset<Row> circuits = spark.read().parquet(out.resolve("circuits").toString());
            Dataset<Row> outcomes = spark.read().parquet(out.resolve("outcomes").toString());
            // The schemas of docs/spark.md ("Results: schemas"), column for column.
            assertEquals(List.of("index bigint", "circuit string", "qubits int", "clbits int",
                    "shots bigint", "engine string", "prediction string",
                    "prediction_samples bigint", "distance double", "distance_low double",
                    "distance_high double", "observed_distance double", "passes boolean",
                    "impossible_rate double", "outcomes int", "problem string"),
                    columns(circuits));
            assertEquals(List.of("index bigint", "circuit string", "bits string",
                    "count bigint", "frequency double", "predicted double"), columns(outcomes));
            // One row per program, in name order; one row per outcome seen.
            List<Row> c = circuits.orderBy("index").collectAsList();
            assertEquals(List.of("bell", "ghz5"), c.stream().map(r -> r.getString(1)).toList());
            for (int i = 0; i < 2; i++) {
                Row r = c.get(i);
                assertEquals(i, r.getLong(0));
                assertEquals(1000L, r.getLong(4));
                List<Row> seen = outcomes.where("index = " + i).orderBy("bits").collectAsList();
                assertEquals(r.getInt(14), seen.size());
                // A Bell pair and a GHZ state read all zeros or all ones, each with
                // probability 1/2 (Nielsen and Chuang 2010, section 1.3.6; Greenberger, Horne
                // and Zeilinger 1989).
                int width = r.getInt(3);
                assertEquals(List.of("0".repeat(width), "1".repeat(width)),
                        seen.stream().map(x -> x.getString(2)).toList());
                long total = 0;
                for (Row x : seen) {
                    assertEquals(r.getString(1), x.getString(1));
                    assertEquals(0.5, x.getDouble(5), 1e-12);
                    assertEquals(x.getLong(3) / 1000.0, x.getDouble(4), 0.0);
                    total += x.getLong(3);
                    written.add(x.getLong(0) + "," + x.getString(1) + "," + x.getString(2)
                            + "," + x.getLong(3));
                }
                assertEquals(1000, total);
            }
        } finally {
            LocalSpark.stop();
        }
        // The same batch again, as CSV on 3 partitions, gives the same outcome rows (each
        // program seeded by its index).
        Path again = dir.resolve("again");
        Outcome o = tool("batch", "--table", table.toString(), "--shots", "1000", "--seed", "5",
                "--partitions", "3", "--format", "csv", "--out", again.toString());
        assertEquals(0, o.code(), o.err());
        List<String> read = new ArrayList<>();
        for (String[] r : csv(again.resolve("outcomes"))) {
            read.add(String.join(",", r[0], r[1], r[2], r[3]));
        }
        read.sort(null);
        written.sort(null);
        assertEquals(written, read);
    }

    @Test
    void badInputIsRefusedInOneLineBeforeSparkStarts() throws IOException {
        String ridge = RIDGE.toString();
        Outcome o = tool("sweep", "--circuit", ridge, "--observable", "1 Z0", "--grid",
                "gamma=0:1:3", "--grid", "beta=0:1:3", "--shots", "1");
        assertEquals(2, o.code());
        assertEquals("qsim-spark sweep: --shots: 1 is not 0 or a whole number from 2 to"
                + " 10,000,000\n", o.err());
        o = tool("sweep", "--circuit", ridge, "--observable", "1 Z0", "--grid", "gamma=0:1:3");
        assertTrue(o.err().contains("must be exactly the points' names [gamma]"), o.err());
        o = tool("sweep", "--circuit", "nowhere.tune", "--observable", "1 Z0", "--grid", "a=0");
        assertTrue(o.err().contains("nowhere.tune: no such file"), o.err());
        o = tool("sweep", "--circuit", ridge, "--observable", "1 Z7", "--grid", "gamma=0",
                "--grid", "beta=0");
        assertTrue(o.err().contains("acts on qubit 7 but the circuit has 4 qubits"), o.err());
        o = tool("sweep", "--circuit", ridge, "--observable", "1 Z0", "--grid", "gamma=0",
                "--grid", "beta=0", "--out", dir.toString());
        assertTrue(o.err().contains("exists already"), o.err());
        o = tool("sweep", "--circuit", ridge, "--observable", "1 Z0", "--grid", "gamma=0",
                "--grid", "beta=0", "--format", "json");
        assertTrue(o.err().contains("--format: 'json' is not parquet or csv"), o.err());
        o = tool("sweep", "--circuit", ridge, "--observable", "1 Z0", "--grid", "gamma=0",
                "--grid", "beta=0", "--partitions", "-1");
        assertTrue(o.err().contains("--partitions: -1"), o.err());
        o = tool("batch", "--shots", "10");
        assertTrue(o.err().contains("give either --circuits DIR or --table PATH, not neither"),
                o.err());
        o = tool("batch", "--circuits", dir.toString(), "--wobble");
        assertTrue(o.err().startsWith("qsim-spark batch: Unknown option: '--wobble'"), o.err());
        Path profile = dir.resolve("p.json");
        Files.writeString(profile, "{\"format\": \"qsim device profile\"}");
        o = tool("trajectories", DEMO.resolve("bell.qasm").toString(), "--device",
                profile.toString());
        assertTrue(o.err().contains("p.json"), o.err());
        o = tool("trajectories", DEMO.resolve("ghz5.qasm").toString(), "--device",
                DEMO.resolve("longstone-pair.json").toString());
        assertTrue(o.err().contains("5 qubits but device Longstone has 2"), o.err());
        o = tool("clifford-decay", "--device", DEMO.resolve("longstone-pair.json").toString(),
                "--lengths", "1,2,2");
        assertTrue(o.err().contains("at least 3 distinct lengths"), o.err());
        o = tool("speed", "--qubits", "40");
        assertTrue(o.err().contains("--qubits: 40 is not a whole number from 2 to 24"), o.err());
        o = tool("speed", "--resamples", "5");
        assertTrue(o.err().contains("--resamples: 5 is not a whole number from 20 to 100000"),
                o.err());
        o = tool("--version");
        assertTrue(o.out().startsWith("qsim-spark "), o.out());
    }
}
