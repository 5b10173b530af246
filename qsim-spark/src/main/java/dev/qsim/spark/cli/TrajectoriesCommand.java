package dev.qsim.spark.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Map;
import java.util.concurrent.Callable;

import org.apache.spark.sql.SparkSession;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import dev.qsim.Circuit;
import dev.qsim.Tally;
import dev.qsim.noise.DeviceProfile;
import dev.qsim.noise.NoiseModel;
import dev.qsim.spark.Recipe;
import dev.qsim.spark.TrajectoryEnsemble;
import dev.qsim.text.QasmReader;

/** {@code trajectories}: one noisy circuit's trajectories over partitions, one tally. */
@Command(name = "trajectories", mixinStandardHelpOptions = true,
        versionProvider = SparkTool.VersionText.class,
        description = "Runs N Monte Carlo trajectories of one OpenQASM 3 circuit under a device"
                + " profile's noise, split over partitions, and merges them into one tally: the"
                + " same, count for count, as the single-machine run with the same seed.",
        footerHeading = "%nExample:%n",
        footer = {
            "  qsim-spark/run-local.sh trajectories qsim-examples/demo/bell.qasm \\",
            "      --device qsim-examples/demo/longstone-pair.json --trajectories 100000"})
final class TrajectoriesCommand implements Callable<Integer> {
    @Spec
    CommandLine.Model.CommandSpec spec;
    @Parameters(paramLabel = "FILE", description = "the OpenQASM 3 circuit file")
    Path file;
    @Option(names = "--device", required = true, paramLabel = "FILE",
            description = "the device profile whose noise the circuit runs under")
    Path device;
    @Option(names = "--trajectories", defaultValue = "10000", paramLabel = "N",
            description = "trajectories, 1 to 2,147,483,647 (default ${DEFAULT-VALUE})")
    int trajectories;
    @Option(names = "--seed", defaultValue = "1", paramLabel = "S",
            description = "seed of the ensemble (default ${DEFAULT-VALUE})")
    long seed;
    @CommandLine.Mixin
    SparkTool.SparkOptions sparkOptions = new SparkTool.SparkOptions();
    @CommandLine.Mixin
    SparkTool.OutputOptions output = new SparkTool.OutputOptions();

    @Override
    public Integer call() throws IOException {
        sparkOptions.check();
        output.check();
        if (trajectories < 1) {
            throw new IllegalArgumentException("--trajectories: " + trajectories + " is not a"
                    + " whole number from 1 to 2,147,483,647");
        }
        String program = ToolFiles.read(file, "the circuit file");
        Circuit c;
        try {
            c = QasmReader.read(program);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(file + ": " + e.getMessage(), e);
        }
        String profile = ToolFiles.read(device, "the device profile");
        try {
            DeviceProfile.read(profile).requireCouplings(c);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(device + ": " + e.getMessage(), e);
        }
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        long start = System.nanoTime();
        SparkSession spark = sparkOptions.session("trajectories");
        long ready = System.nanoTime();
        Recipe<Circuit> circuit = Recipe.qasm(program);
        Recipe<NoiseModel> noise = Recipe.deviceNoise(profile);
        Tally t = TrajectoryEnsemble.of(circuit, noise, trajectories).withSeed(seed)
                .withPartitions(sparkOptions.partitions).withThreads(sparkOptions.threads)
                .run(spark);
        output.write(TrajectoryEnsemble.outcomes(spark, t), "", err);
        double seconds = (System.nanoTime() - ready) / 1e9;
        double startup = (ready - start) / 1e9;
        out.println(SparkTool.f("%,d trajectories in %.1f s on %s (Spark started in %.1f s),"
                + " %,d distinct outcomes", t.shots(), seconds, spark.sparkContext().master(),
                startup, t.outcomes().size()));
        int shown = 0;
        for (Map.Entry<String, Long> e : t.outcomes().entrySet()) {
            if (shown++ == 32) {
                out.println("... (" + (t.outcomes().size() - 32) + " more)");
                break;
            }
            out.println(SparkTool.f("%-8s %12d %9.5f", e.getKey(), e.getValue(),
                    e.getValue() / (double) t.shots()));
        }
        out.flush();
        sparkOptions.done(spark);
        return SparkTool.EXIT_OK;
    }
}
