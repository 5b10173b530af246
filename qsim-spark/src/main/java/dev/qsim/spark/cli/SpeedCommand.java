package dev.qsim.spark.cli;

import java.io.PrintWriter;
import java.lang.management.ManagementFactory;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.concurrent.Callable;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;
import dev.qsim.spark.CircuitBatch;
import dev.qsim.spark.ItemSeeds;
import dev.qsim.stats.ComparisonSettings;
import dev.qsim.stats.TallyComparison;
import dev.qsim.text.QasmReader;
import dev.qsim.text.QasmWriter;

/**
 * {@code speed}: times a batch of random circuits four ways (a plain loop on one thread and on
 * two, Spark local mode on one core and on two) and prints the figures. Not a test: its numbers
 * depend on the machine and its load, which it prints too.
 */
@Command(name = "speed", mixinStandardHelpOptions = true,
        versionProvider = SparkTool.VersionText.class,
        description = "Times a batch of random circuits (run for shots, predicted, compared) as"
                + " a plain loop on 1 and 2 threads and on Spark local[1] and local[2], and"
                + " prints the times, the speed-ups and the load average. The results of all"
                + " four are checked to be identical.",
        footerHeading = "%nExample:%n",
        footer = {"  qsim-spark/run-local.sh speed --circuits 200 --qubits 16 --layers 12"})
final class SpeedCommand implements Callable<Integer> {
    @Spec
    CommandLine.Model.CommandSpec spec;
    @Option(names = "--circuits", defaultValue = "200", paramLabel = "N",
            description = "circuits in the batch, 2 to 100,000 (default ${DEFAULT-VALUE})")
    int circuits;
    @Option(names = "--qubits", defaultValue = "16", paramLabel = "Q",
            description = "qubits per circuit, 2 to 24 (default ${DEFAULT-VALUE})")
    int qubits;
    @Option(names = "--layers", defaultValue = "12", paramLabel = "L",
            description = "layers of each circuit: a random rotation on every qubit, then CNOTs"
                    + " on alternating pairs; 1 to 1,000 (default ${DEFAULT-VALUE})")
    int layers;
    @Option(names = "--shots", defaultValue = "1000", paramLabel = "S",
            description = "shots per circuit, 1 to 1,000,000 (default ${DEFAULT-VALUE})")
    int shots;
    @Option(names = "--repeats", defaultValue = "3", paramLabel = "R",
            description = "timed runs of each way, 1 to 20; the median is reported (default"
                    + " ${DEFAULT-VALUE})")
    int repeats;
    @Option(names = "--seed", defaultValue = "1", paramLabel = "S",
            description = "seed of the circuits and the batch (default ${DEFAULT-VALUE})")
    long seed;
    @Option(names = "--resamples", defaultValue = "100", paramLabel = "R",
            description = "draws per candidate distance of each comparison, 20 to 100,000; at"
                    + " 16 qubits the comparison is most of a circuit's time (default"
                    + " ${DEFAULT-VALUE})")
    int resamples;

    /** The comparison settings of every way, all equal; set in {@link #call()}. */
    private ComparisonSettings settings;

    @Override
    public Integer call() throws InterruptedException, ExecutionException {
        check(circuits, 2, 100_000, "--circuits");
        check(qubits, 2, 24, "--qubits");
        check(layers, 1, 1000, "--layers");
        check(shots, 1, 1_000_000, "--shots");
        check(repeats, 1, 20, "--repeats");
        check(resamples, ComparisonSettings.MIN_RESAMPLES, 100_000, "--resamples");
        settings = ComparisonSettings.defaults().withResamples(resamples).withThreads(1);
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        List<CircuitBatch.Program> programs = programs(circuits, qubits, layers, seed);
        List<CircuitBatch.Program> warm = programs.subList(0, Math.min(20, circuits));
        double loadBefore = load();
        err.println(SparkTool.f("speed: %d random circuits of %d qubits and %d layers, %d shots"
                + " each, %d resamples; %d processors, load average %.2f", circuits, qubits,
                layers, shots, resamples, Runtime.getRuntime().availableProcessors(),
                loadBefore));
        err.flush();
        double[][] times = new double[4][repeats];
        double[] reference = plain(warm, 1);
        plain(warm, 2);
        double[] expected = null;
        double start1 = 0;
        double start2 = 0;
        for (int r = 0; r < repeats; r++) {
            long t = System.nanoTime();
            expected = plain(programs, 1);
            times[0][r] = (System.nanoTime() - t) / 1e9;
            t = System.nanoTime();
            same(expected, plain(programs, 2), "the plain loop on 2 threads");
            times[1][r] = (System.nanoTime() - t) / 1e9;
            for (int cores = 1; cores <= 2; cores++) {
                long s = System.nanoTime();
                SparkSession spark = SparkSession.builder().master("local[" + cores + "]")
                        .appName("qsim-spark speed").config("spark.ui.enabled", "false")
                        .getOrCreate();
                spark.sparkContext().setLogLevel("WARN");
                double started = (System.nanoTime() - s) / 1e9;
                if (r == 0) {
                    same(Arrays.copyOf(reference, warm.size()), spark(spark, warm),
                            "the warm-up on Spark");
                    if (cores == 1) {
                        start1 = started;
                    } else {
                        start2 = started;
                    }
                }
                t = System.nanoTime();
                same(expected, spark(spark, programs), "Spark local[" + cores + "]");
                times[1 + cores][r] = (System.nanoTime() - t) / 1e9;
                spark.stop();
            }
            err.println(SparkTool.f("run %d: plain 1 thread %.2f s, 2 threads %.2f s; Spark"
                    + " local[1] %.2f s, local[2] %.2f s", r + 1, times[0][r], times[1][r],
                    times[2][r], times[3][r]));
            err.flush();
        }
        double p1 = median(times[0]);
        double p2 = median(times[1]);
        double s1 = median(times[2]);
        double s2 = median(times[3]);
        out.println(SparkTool.f("batch of %d circuits, %d qubits, %d layers, %d shots, %d"
                + " resamples (median of %d runs; every way gave identical results)", circuits,
                qubits, layers, shots, resamples, repeats));
        out.println(SparkTool.f("  plain loop, 1 thread     %8.2f s", p1));
        out.println(SparkTool.f("  plain loop, 2 threads    %8.2f s", p2));
        out.println(SparkTool.f("  Spark local[1]           %8.2f s  (session start %.2f s,"
                + " not included)", s1, start1));
        out.println(SparkTool.f("  Spark local[2]           %8.2f s  (session start %.2f s,"
                + " not included)", s2, start2));
        out.println(SparkTool.f("  Spark local[2] is %.2f times faster than the plain loop on 1"
                + " thread, %.2f times faster than local[1], and takes %.2f times the plain"
                + " loop on 2 threads", p1 / s2, s1 / s2, s2 / p2));
        out.println(SparkTool.f("  load average: %.2f before, %.2f after (%d processors)",
                loadBefore, load(), Runtime.getRuntime().availableProcessors()));
        out.flush();
        return SparkTool.EXIT_OK;
    }

    private static void check(int value, int min, int max, String name) {
        if (value < min || value > max) {
            throw new IllegalArgumentException(name + ": " + value + " is not a whole number"
                    + " from " + min + " to " + max);
        }
    }

    private static double load() {
        return ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage();
    }

    private static double median(double[] t) {
        double[] s = t.clone();
        Arrays.sort(s);
        return s.length % 2 == 1 ? s[s.length / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
    }

    /** Random brick-work circuits (common practice for speed tests), as OpenQASM 3 text. */
    static List<CircuitBatch.Program> programs(int count, int n, int layers, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        List<CircuitBatch.Program> out = new ArrayList<>();
        for (int k = 0; k < count; k++) {
            Circuit.Builder b = Circuit.builder(n);
            for (int l = 0; l < layers; l++) {
                for (int q = 0; q < n; q++) {
                    double a = 2 * Math.PI * rng.nextDouble();
                    switch (rng.nextInt(3)) {
                        case 0:
                            b.rx(q, a);
                            break;
                        case 1:
                            b.ry(q, a);
                            break;
                        default:
                            b.rz(q, a);
                            break;
                    }
                }
                for (int q = l % 2; q + 1 < n; q += 2) {
                    b.cnot(q, q + 1);
                }
            }
            out.add(new CircuitBatch.Program(String.format("random-%06d.qasm", k),
                    QasmWriter.write(b.measure().build())));
        }
        return out;
    }

    /** The plain loop: the batch's calls for each program, on a pool of threads. */
    private double[] plain(List<CircuitBatch.Program> programs, int threads)
            throws InterruptedException, ExecutionException {
        ExecutorService pool = Executors.newFixedThreadPool(threads);
        try {
            List<Future<Double>> futures = new ArrayList<>();
            for (int i = 0; i < programs.size(); i++) {
                int index = i;
                futures.add(pool.submit(() -> one(index, programs.get(index))));
            }
            double[] out = new double[programs.size()];
            for (int i = 0; i < out.length; i++) {
                out[i] = futures.get(i).get();
            }
            return out;
        } finally {
            pool.shutdown();
        }
    }

    /** Program {@code i} on one machine: the distance of its comparison. */
    private double one(long i, CircuitBatch.Program program) {
        Circuit c = QasmReader.read(program.text());
        long itemSeed = ItemSeeds.of(seed, i);
        Tally tally = Simulator.seeded(itemSeed).withThreads(1).run(c, shots);
        Simulator.Prediction p = Simulator.seeded(ItemSeeds.of(itemSeed, 1)).withThreads(1)
                .predict(c, 10_000);
        return TallyComparison.of(tally, p.probabilities(), settings
                .withPredictionShots(p.samples())).distance();
    }

    private double[] spark(SparkSession spark, List<CircuitBatch.Program> programs) {
        CircuitBatch.Results r = CircuitBatch.of(shots).withSeed(seed).withComparison(settings)
                .run(spark, programs);
        List<Row> rows = r.circuits().collectAsList();
        r.release();
        double[] out = new double[rows.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = rows.get(i).getDouble(8);
        }
        return out;
    }

    private static void same(double[] expected, double[] got, String what) {
        if (!Arrays.equals(expected, got)) {
            throw new IllegalStateException(what + " gave other results than the plain loop on"
                    + " 1 thread");
        }
    }
}
