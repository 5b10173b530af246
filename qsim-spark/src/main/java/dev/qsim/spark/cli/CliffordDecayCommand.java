package dev.qsim.spark.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;

import org.apache.spark.sql.SparkSession;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import dev.qsim.noise.DeviceProfile;
import dev.qsim.spark.Recipe;
import dev.qsim.spark.benchmarking.DecayFit;
import dev.qsim.spark.benchmarking.RandomizedBenchmarking;

/** {@code clifford-decay}: randomized benchmarking of a two-qubit device profile. */
@Command(name = "clifford-decay", mixinStandardHelpOptions = true,
        versionProvider = SparkTool.VersionText.class,
        description = "Randomized benchmarking of a two-qubit device profile: random Clifford"
                + " sequences of many lengths, each followed by its inverse, run under the"
                + " profile's noise; fits the survival A p^m + B and compares the error per"
                + " Clifford r = 3(1 - p)/4 with the noise model's own.",
        footerHeading = "%nExample:%n",
        footer = {
            "  qsim-spark/run-local.sh clifford-decay \\",
            "      --device qsim-examples/demo/longstone-pair.json \\",
            "      --lengths 1,10,25,50,100,150,200 --sequences 40 --out longstone-rb"})
final class CliffordDecayCommand implements Callable<Integer> {
    @Spec
    CommandLine.Model.CommandSpec spec;
    @Option(names = "--device", required = true, paramLabel = "FILE",
            description = "the device profile (its qubits 0 and 1 are benchmarked)")
    Path device;
    @Option(names = "--lengths", split = ",", paramLabel = "M,M,...",
            defaultValue = "1,10,25,50,100,150,200",
            description = "sequence lengths, at least three distinct (default ${DEFAULT-VALUE})")
    int[] lengths;
    @Option(names = "--sequences", defaultValue = "30", paramLabel = "K",
            description = "random sequences per length (default ${DEFAULT-VALUE})")
    int sequences;
    @Option(names = "--shots", defaultValue = "0", paramLabel = "N",
            description = "shots per sequence, or 0 for the exact survival probability"
                    + " (default ${DEFAULT-VALUE})")
    int shots;
    @Option(names = "--seed", defaultValue = "1", paramLabel = "S",
            description = "seed of the sequences (default ${DEFAULT-VALUE})")
    long seed;
    @CommandLine.Mixin
    SparkTool.SparkOptions sparkOptions = new SparkTool.SparkOptions();
    @CommandLine.Mixin
    SparkTool.OutputOptions output = new SparkTool.OutputOptions();

    @Override
    public Integer call() throws IOException {
        sparkOptions.check();
        output.check();
        String profile = ToolFiles.read(device, "the device profile");
        try {
            DeviceProfile p = DeviceProfile.read(profile);
            if (p.qubitCount() < 2 || !p.canCouple(0, 1)) {
                throw new IllegalArgumentException("device " + p.name() + " must have qubits 0"
                        + " and 1 coupled to be benchmarked as a pair");
            }
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(device + ": " + e.getMessage(), e);
        }
        RandomizedBenchmarking rb = RandomizedBenchmarking.of(Recipe.deviceNoise(profile),
                lengths, sequences).withShots(shots).withSeed(seed)
                .withPartitions(sparkOptions.partitions);
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        long start = System.nanoTime();
        SparkSession spark = sparkOptions.session("clifford-decay");
        long ready = System.nanoTime();
        RandomizedBenchmarking.Results r = rb.run(spark);
        output.write(r.sequences(), "", err);
        double seconds = (System.nanoTime() - ready) / 1e9;
        double startup = (ready - start) / 1e9;
        out.println(SparkTool.f("%,d sequences in %.1f s on %s (Spark started in %.1f s)",
                lengths.length * sequences, seconds, spark.sparkContext().master(), startup));
        out.println("length  mean survival");
        double[] means = r.meanSurvival();
        for (int k = 0; k < lengths.length; k++) {
            out.println(SparkTool.f("%6d  %.5f", lengths[k], means[k]));
        }
        DecayFit fit = r.fit();
        out.println("fit: " + fit);
        out.println(SparkTool.f("error per Clifford: fitted %.5f ± %.5f, the noise model's"
                + " %.5f", fit.errorPerClifford(), fit.errorPerCliffordError(),
                r.predictedErrorPerClifford()));
        out.flush();
        sparkOptions.done(spark);
        return SparkTool.EXIT_OK;
    }
}
