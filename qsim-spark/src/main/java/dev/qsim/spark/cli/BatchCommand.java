package dev.qsim.spark.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;

import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import dev.qsim.noise.DeviceProfile;
import dev.qsim.spark.CircuitBatch;
import dev.qsim.stats.ComparisonSettings;

/** {@code batch}: many OpenQASM 3 programs run for shots and compared with predictions. */
@Command(name = "batch", mixinStandardHelpOptions = true,
        versionProvider = SparkTool.VersionText.class,
        description = "Runs a folder (or a Parquet table) of OpenQASM 3 programs for a number of"
                + " shots, ideal or under a device profile's noise, and compares each tally with"
                + " the circuit's prediction. Writes the tables 'circuits' (one row per program)"
                + " and 'outcomes' (one row per outcome seen) under --out.",
        footerHeading = "%nExamples:%n",
        footer = {
            "  qsim-spark/run-local.sh batch --circuits qsim-examples/demo --shots 2000 \\",
            "      --out campaign",
            "  qsim-spark/run-local.sh batch --circuits pairs/ --shots 4000 \\",
            "      --device qsim-examples/demo/longstone-pair.json --format csv --out pairs-run",
            "%nPrograms are numbered by name and seeded by number, so results do not depend on"
                    + " the partitions. A program that cannot run is reported with its reason;"
                    + " the others still run."})
final class BatchCommand implements Callable<Integer> {
    @Spec
    CommandLine.Model.CommandSpec spec;
    @Option(names = "--circuits", paramLabel = "DIR",
            description = "a folder of .qasm files (read on the driver)")
    Path circuits;
    @Option(names = "--table", paramLabel = "PATH",
            description = "a Parquet table with string columns name and program, instead")
    String table;
    @Option(names = "--shots", defaultValue = "1000", paramLabel = "N",
            description = "shots per program, 1 to 10,000,000 (default ${DEFAULT-VALUE})")
    int shots;
    @Option(names = "--device", paramLabel = "FILE",
            description = "a device profile: check couplings and run under its noise")
    Path device;
    @Option(names = "--tolerance", defaultValue = "0.05", paramLabel = "D",
            description = "largest total variation distance that passes, in (0, 1] (default"
                    + " ${DEFAULT-VALUE})")
    double tolerance;
    @Option(names = "--seed", defaultValue = "1", paramLabel = "S",
            description = "seed of the batch (default ${DEFAULT-VALUE})")
    long seed;
    @CommandLine.Mixin
    SparkTool.SparkOptions sparkOptions = new SparkTool.SparkOptions();
    @CommandLine.Mixin
    SparkTool.OutputOptions output = new SparkTool.OutputOptions();

    @Override
    public Integer call() throws IOException {
        sparkOptions.check();
        output.check();
        if (shots < 1 || shots > 10_000_000) {
            throw new IllegalArgumentException("--shots: " + shots + " is not a whole number"
                    + " from 1 to 10,000,000");
        }
        if (!(tolerance > 0 && tolerance <= 1)) {
            throw new IllegalArgumentException("--tolerance: " + tolerance + " is not in (0, 1]");
        }
        if ((circuits == null) == (table == null)) {
            throw new IllegalArgumentException("give either --circuits DIR or --table PATH, not "
                    + (circuits == null ? "neither" : "both"));
        }
        CircuitBatch batch = CircuitBatch.of(shots).withSeed(seed)
                .withComparison(ComparisonSettings.defaults().withTolerance(tolerance))
                .withPartitions(sparkOptions.partitions).withThreads(sparkOptions.threads);
        if (device != null) {
            String profile = ToolFiles.read(device, "the device profile");
            try {
                DeviceProfile.read(profile);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(device + ": " + e.getMessage(), e);
            }
            batch = batch.withDevice(profile);
        }
        List<CircuitBatch.Program> programs = circuits == null ? null
                : CircuitBatch.readFolder(circuits);
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        long start = System.nanoTime();
        SparkSession spark = sparkOptions.session("batch");
        long ready = System.nanoTime();
        CircuitBatch.Results r = programs != null ? batch.run(spark, programs)
                : batch.run(spark, spark.read().parquet(table));
        Dataset<Row> rows = r.circuits();
        List<Row> all = rows.collectAsList();
        output.write(rows, "circuits", err);
        output.write(r.outcomes(), "outcomes", err);
        double seconds = (System.nanoTime() - ready) / 1e9;
        double startup = (ready - start) / 1e9;
        int passed = 0;
        int failed = 0;
        int problems = 0;
        Row worst = null;
        for (Row c : all) {
            if (!c.isNullAt(15)) {
                problems++;
                if (problems <= 5) {
                    out.println("not run: " + c.getString(1) + ": " + c.getString(15));
                }
            } else if (c.getBoolean(12)) {
                passed++;
            } else {
                failed++;
            }
            if (c.isNullAt(15) && (worst == null || c.getDouble(10) > worst.getDouble(10))) {
                worst = c;
            }
        }
        out.println(SparkTool.f("%,d programs in %.1f s on %s (Spark started in %.1f s): %d"
                + " pass, %d fail the tolerance %.3g, %d not run", all.size(), seconds,
                spark.sparkContext().master(), startup, passed, failed, tolerance, problems));
        if (worst != null) {
            out.println(SparkTool.f("largest distance: %s, %.4f (%.0f%% interval %.4f to %.4f)",
                    worst.getString(1), worst.getDouble(8), 100 * 0.95, worst.getDouble(9),
                    worst.getDouble(10)));
        }
        out.flush();
        r.release();
        sparkOptions.done(spark);
        return SparkTool.EXIT_OK;
    }
}
