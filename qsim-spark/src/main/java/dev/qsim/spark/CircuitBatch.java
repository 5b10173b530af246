package dev.qsim.spark;

import java.io.IOException;
import java.io.Serializable;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.stream.Stream;

import org.apache.spark.api.java.JavaRDD;
import org.apache.spark.api.java.function.FlatMapFunction;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataType;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructField;
import org.apache.spark.sql.types.StructType;
import org.apache.spark.storage.StorageLevel;
import scala.Tuple2;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;
import dev.qsim.noise.DeviceProfile;
import dev.qsim.noise.NoiseModel;
import dev.qsim.stats.ComparisonSettings;
import dev.qsim.stats.TallyComparison;
import dev.qsim.text.QasmReader;

/**
 * A batch of OpenQASM 3 programs on Spark: each is read ({@link QasmReader}), run for a number
 * of shots (ideal, under a noise model, or under a device profile's noise after its couplings
 * are checked), and its tally compared with the circuit's prediction ({@link Simulator#predict},
 * {@link TallyComparison}). Immutable; each {@code with...} method returns a new batch.
 *
 * <p>Programs are numbered {@code 0 .. n-1} in ascending order of name (then of text, for
 * equal names); program {@code i} runs with seed {@link ItemSeeds#of(long, long)
 * ItemSeeds.of(seed, i)}, and its prediction, when it must be sampled, with
 * {@code ItemSeeds.of(ItemSeeds.of(seed, i), 1)}. So the results are the same for any
 * partition count, executor count or task retry, and equal to the single-machine calls
 * <pre>{@code
 * Simulator sim = Simulator.seeded(ItemSeeds.of(seed, i)).withThreads(threads).withNoise(model);
 * Tally tally = sim.run(circuit, shots);
 * Simulator.Prediction p = Simulator.seeded(ItemSeeds.of(ItemSeeds.of(seed, i), 1))
 *         .withThreads(threads).withNoise(model).predict(circuit, predictionSamples);
 * TallyComparison c = TallyComparison.of(tally, p.probabilities(),
 *         settings.withPredictionShots(p.samples()).withThreads(threads));
 * }</pre>
 * A program that cannot be read or run (malformed text, a gate on a pair the device cannot
 * couple, too many qubits for the heap, a register wider than 26 bits) does not stop the batch:
 * its row says why in {@code problem}, and its other result columns are null.
 *
 * <p>The results ({@link Results}) are two tables:
 * <table>
 *   <caption>{@link Results#circuits()}: one row per program</caption>
 *   <tr><th>column</th><th>type</th><th>meaning</th></tr>
 *   <tr><td>{@code index}</td><td>long</td><td>the program's number</td></tr>
 *   <tr><td>{@code circuit}</td><td>string</td><td>its name</td></tr>
 *   <tr><td>{@code qubits}, {@code clbits}</td><td>int</td><td>the circuit's size</td></tr>
 *   <tr><td>{@code shots}</td><td>long</td><td>the shots of the tally</td></tr>
 *   <tr><td>{@code engine}</td><td>string</td><td>the engine that ran it
 *       ({@link Simulator#explain})</td></tr>
 *   <tr><td>{@code prediction}</td><td>string</td><td>how the prediction was made</td></tr>
 *   <tr><td>{@code prediction_samples}</td><td>long</td><td>0 for an exact prediction, else
 *       its shots</td></tr>
 *   <tr><td>{@code distance}, {@code distance_low}, {@code distance_high}</td><td>double</td>
 *       <td>the total variation distance between the device-like tally and the prediction:
 *       estimate and confidence interval ({@link TallyComparison#distance()})</td></tr>
 *   <tr><td>{@code observed_distance}</td><td>double</td><td>the plain distance of the
 *       frequencies</td></tr>
 *   <tr><td>{@code passes}</td><td>boolean</td><td>the tolerance verdict
 *       ({@link TallyComparison#passes()})</td></tr>
 *   <tr><td>{@code impossible_rate}</td><td>double</td><td>the share of shots on outcomes the
 *       prediction calls impossible</td></tr>
 *   <tr><td>{@code outcomes}</td><td>int</td><td>distinct outcomes seen</td></tr>
 *   <tr><td>{@code problem}</td><td>string</td><td>null, or why the program was not run</td></tr>
 * </table>
 * <table>
 *   <caption>{@link Results#outcomes()}: one row per outcome seen per program</caption>
 *   <tr><th>column</th><th>type</th><th>meaning</th></tr>
 *   <tr><td>{@code index}, {@code circuit}</td><td>long, string</td><td>the program</td></tr>
 *   <tr><td>{@code bits}</td><td>string</td><td>the outcome, highest clbit leftmost</td></tr>
 *   <tr><td>{@code count}</td><td>long</td><td>its count</td></tr>
 *   <tr><td>{@code frequency}</td><td>double</td><td>count over shots</td></tr>
 *   <tr><td>{@code predicted}</td><td>double</td><td>its predicted probability</td></tr>
 * </table>
 *
 * @since 0.1
 */
public final class CircuitBatch {
    /** The most programs a folder may hold: {@value}. */
    public static final int MAX_FOLDER_FILES = 1_000_000;
    /** The largest program file: {@value} bytes. */
    public static final long MAX_PROGRAM_BYTES = Text.MAX_PROGRAM_BYTES;

    private final int shots;
    private final Recipe<NoiseModel> noise;
    private final String device;
    private final Settings settings;
    private final int predictionSamples;
    private final long seed;
    private final int partitions;
    private final int threads;

    private CircuitBatch(int shots, Recipe<NoiseModel> noise, String device, Settings settings,
            int predictionSamples, long seed, int partitions, int threads) {
        this.shots = shots;
        this.noise = noise;
        this.device = device;
        this.settings = settings;
        this.predictionSamples = predictionSamples;
        this.seed = seed;
        this.partitions = partitions;
        this.threads = threads;
    }

    /**
     * Returns an ideal batch of {@code shots} shots per program: comparison settings
     * {@link ComparisonSettings#defaults()}, 10,000 samples for a prediction that must be
     * sampled, seed 0, the job's partition count (three per core), one thread per task.
     *
     * @param shots the shots per program, from 1 to 10,000,000
     * @return the batch
     * @throws IllegalArgumentException if {@code shots} is out of range
     */
    public static CircuitBatch of(int shots) {
        requireShots(shots, "shots per program");
        return new CircuitBatch(shots, () -> NoiseModel.none(), null,
                new Settings(ComparisonSettings.defaults()), 10_000, 0, 0, 1);
    }

    private static void requireShots(int shots, String what) {
        if (shots < 1 || shots > Slices.MAX_SHOTS) {
            throw new IllegalArgumentException("the " + what + " must be from 1 to "
                    + Slices.MAX_SHOTS + " but were " + shots);
        }
    }

    /**
     * Returns this batch run under a noise model (and no device profile).
     *
     * @param model the recipe of the noise model; made once here to check it
     * @return the new batch
     */
    public CircuitBatch withNoise(Recipe<NoiseModel> model) {
        Objects.requireNonNull(model, "model");
        Objects.requireNonNull(model.make(), "the noise recipe made null");
        return new CircuitBatch(shots, model, null, settings, predictionSamples, seed,
                partitions, threads);
    }

    /**
     * Returns this batch run under a device profile: each circuit's gates are checked against
     * the device's couplings ({@link DeviceProfile#requireCouplings(Circuit)}, a misfit is the
     * circuit's {@code problem}) and it runs under the profile's noise model.
     *
     * @param profile the profile's JSON text ({@link DeviceProfile#read(String)})
     * @return the new batch
     * @throws IllegalArgumentException if the profile is malformed
     */
    public CircuitBatch withDevice(String profile) {
        Objects.requireNonNull(profile, "profile");
        DeviceProfile.read(profile);
        return new CircuitBatch(shots, Recipe.deviceNoise(profile), profile, settings,
                predictionSamples, seed, partitions, threads);
    }

    /**
     * Returns this batch with other comparison settings (tolerance, confidence, draws and their
     * seed; the prediction shots and threads are set per program).
     *
     * @param comparison the settings
     * @return the new batch
     */
    public CircuitBatch withComparison(ComparisonSettings comparison) {
        Objects.requireNonNull(comparison, "comparison");
        return new CircuitBatch(shots, noise, device, new Settings(comparison),
                predictionSamples, seed, partitions, threads);
    }

    /**
     * Returns this batch with another number of shots for predictions that cannot be exact
     * (noisy circuits beyond the density matrix's reach).
     *
     * @param samples from 1 to 10,000,000
     * @return the new batch
     * @throws IllegalArgumentException if {@code samples} is out of range
     */
    public CircuitBatch withPredictionSamples(int samples) {
        requireShots(samples, "prediction samples");
        return new CircuitBatch(shots, noise, device, settings, samples, seed, partitions,
                threads);
    }

    /**
     * Returns this batch with another seed.
     *
     * @param seed the job's seed
     * @return the new batch
     */
    public CircuitBatch withSeed(long seed) {
        return new CircuitBatch(shots, noise, device, settings, predictionSamples, seed,
                partitions, threads);
    }

    /**
     * Returns this batch split into another number of partitions; results do not depend on it.
     *
     * @param partitions 0 for three per core of Spark's default parallelism (at most one per
     *     item), or from 1 to 2^20
     * @return the new batch
     * @throws IllegalArgumentException if the count is out of range
     */
    public CircuitBatch withPartitions(int partitions) {
        return new CircuitBatch(shots, noise, device, settings, predictionSamples, seed,
                Slices.requirePartitions(partitions), threads);
    }

    /**
     * Returns this batch with another thread count per task; results do not depend on it.
     *
     * @param threads from 1 to 256
     * @return the new batch
     * @throws IllegalArgumentException if the count is out of range
     */
    public CircuitBatch withThreads(int threads) {
        return new CircuitBatch(shots, noise, device, settings, predictionSamples, seed,
                partitions, Slices.requireThreads(threads));
    }

    /**
     * Reads the programs of a folder on the driver's file system: every regular file whose
     * name ends in {@code .qasm}, named by its file name, in ascending order of name. Each
     * file's size is checked before it is read; the text is read as strict UTF-8. The program
     * text itself is checked when the batch runs (a malformed one becomes its row's
     * {@code problem}).
     *
     * @param folder the folder
     * @return the programs, in the order they will be numbered
     * @throws IOException if the folder or a file cannot be read
     * @throws IllegalArgumentException if the path is not a folder, it holds no program or more
     *     than {@value #MAX_FOLDER_FILES}, or a file is larger than
     *     {@value #MAX_PROGRAM_BYTES} bytes or not UTF-8
     */
    public static List<Program> readFolder(Path folder) throws IOException {
        Objects.requireNonNull(folder, "folder");
        if (!Files.isDirectory(folder)) {
            throw new IllegalArgumentException(folder + " is not a folder; give a folder of"
                    + " .qasm files");
        }
        List<Path> files = new ArrayList<>();
        try (Stream<Path> s = Files.list(folder)) {
            Iterator<Path> it = s.iterator();
            while (it.hasNext()) {
                Path f = it.next();
                if (f.getFileName().toString().endsWith(".qasm") && Files.isRegularFile(f)) {
                    if (files.size() == MAX_FOLDER_FILES) {
                        throw new IllegalArgumentException(folder + " holds more than "
                                + MAX_FOLDER_FILES + " .qasm files; split the batch");
                    }
                    files.add(f);
                }
            }
        }
        if (files.isEmpty()) {
            throw new IllegalArgumentException(folder + " holds no .qasm file");
        }
        files.sort((a, b) -> a.getFileName().toString().compareTo(b.getFileName().toString()));
        List<Program> out = new ArrayList<>(files.size());
        for (Path f : files) {
            out.add(new Program(f.getFileName().toString(),
                    Text.read(f, MAX_PROGRAM_BYTES, "the program")));
        }
        return out;
    }

    /**
     * A named OpenQASM 3 program.
     *
     * @param name the name, not null
     * @param text the program text, not null
     * @since 0.1
     */
    public record Program(String name, String text) implements Serializable {
        private static final long serialVersionUID = 1L;

        /**
         * Checks the fields.
         *
         * @param name the name
         * @param text the text
         */
        public Program {
            Objects.requireNonNull(name, "name");
            Objects.requireNonNull(text, "text");
        }
    }

    /**
     * Runs the batch on programs given on the driver, numbered in ascending order of name (then
     * text). The results are computed when first asked for, once: later actions reuse them
     * (until {@link Results#release()}).
     *
     * @param spark the session
     * @param programs the programs, at least one
     * @return the results
     * @throws IllegalArgumentException if there is no program
     */
    public Results run(SparkSession spark, List<Program> programs) {
        Objects.requireNonNull(spark, "spark");
        Objects.requireNonNull(programs, "programs");
        if (programs.isEmpty()) {
            throw new IllegalArgumentException("a batch needs at least one program");
        }
        List<Program> sorted = new ArrayList<>(programs);
        sorted.sort(CircuitBatch::compare);
        List<Item> indexed = new ArrayList<>(sorted.size());
        for (int i = 0; i < sorted.size(); i++) {
            indexed.add(new Item(i, sorted.get(i)));
        }
        int p = Slices.partitions(spark, partitions, indexed.size());
        // parallelize cuts a list into contiguous slices, as Slices.of does.
        return results(spark, Slices.context(spark).parallelize(indexed, p));
    }

    /**
     * Runs the batch on a table of programs with string columns {@code name} and
     * {@code program} (other columns are ignored), numbered in ascending order of name (then
     * program text); the table may be any size and is never collected to the driver. The
     * results are computed when first asked for, once: later actions reuse them (until
     * {@link Results#release()}).
     *
     * @param spark the session
     * @param programs the table
     * @return the results
     * @throws IllegalArgumentException if the table lacks a string column {@code name} or
     *     {@code program}
     */
    public Results run(SparkSession spark, Dataset<Row> programs) {
        Objects.requireNonNull(spark, "spark");
        Objects.requireNonNull(programs, "programs");
        for (String c : List.of("name", "program")) {
            DataType type = null;
            for (StructField f : programs.schema().fields()) {
                if (f.name().equals(c)) {
                    type = f.dataType();
                }
            }
            if (!DataTypes.StringType.equals(type)) {
                throw new IllegalArgumentException("the table of programs needs a string column"
                        + " '" + c + "' but its columns are " + Text.excerpt(
                        programs.schema().simpleString()));
            }
        }
        long n = programs.count();
        if (n == 0) {
            throw new IllegalArgumentException("a batch needs at least one program; the table"
                    + " is empty");
        }
        int p = Slices.partitions(spark, partitions, n);
        JavaRDD<Item> items = programs.select("name", "program").orderBy("name", "program")
                .javaRDD().zipWithIndex()
                .mapToPair(t -> new Tuple2<Long, Item>(t._2(), new Item(t._2(), new Program(
                        t._1().isNullAt(0) ? "" : t._1().getString(0),
                        t._1().isNullAt(1) ? "" : t._1().getString(1)))))
                .partitionBy(new Slices.ByIndex(n, p))
                .values()
                .mapPartitions(it -> {
                    List<Item> out = new ArrayList<>();
                    it.forEachRemaining(out::add);
                    out.sort((a, b) -> Long.compare(a.index(), b.index()));
                    return out.iterator();
                }, true);
        return results(spark, items);
    }

    private static int compare(Program a, Program b) {
        int c = a.name().compareTo(b.name());
        return c != 0 ? c : a.text().compareTo(b.text());
    }

    /** A program and its number. */
    record Item(long index, Program program) implements Serializable {
        private static final long serialVersionUID = 1L;
    }

    private Results results(SparkSession spark, JavaRDD<Item> items) {
        JavaRDD<Outcome> done = items.mapPartitions(new Worker(shots, noise, device, settings,
                predictionSamples, seed, threads)).persist(StorageLevel.MEMORY_AND_DISK());
        return new Results(spark, done);
    }

    /** {@link ComparisonSettings}' fields, serializable. */
    static final class Settings implements Serializable {
        private static final long serialVersionUID = 1L;
        private final double tolerance;
        private final double confidence;
        private final int resamples;
        private final long seed;

        Settings(ComparisonSettings s) {
            this.tolerance = s.tolerance();
            this.confidence = s.confidence();
            this.resamples = s.resamples();
            this.seed = s.seed();
        }

        ComparisonSettings make(long predictionShots, int threads) {
            return new ComparisonSettings(tolerance, confidence, resamples, seed,
                    predictionShots, threads);
        }
    }

    /** The result of one program, as shipped back from an executor. */
    static final class Outcome implements Serializable {
        private static final long serialVersionUID = 1L;
        long index;
        String name;
        int qubits;
        int clbits;
        long shots;
        String engine;
        String prediction;
        long predictionSamples;
        double distance;
        double distanceLow;
        double distanceHigh;
        double observedDistance;
        boolean passes;
        double impossibleRate;
        String problem;
        String[] bits = new String[0];
        long[] counts = new long[0];
        double[] predicted = new double[0];
    }

    /** The work of one partition: reads, runs and compares its programs in index order. */
    static final class Worker implements FlatMapFunction<Iterator<Item>, Outcome>,
            Serializable {
        private static final long serialVersionUID = 1L;
        private final int shots;
        private final Recipe<NoiseModel> noise;
        private final String device;
        private final Settings settings;
        private final int predictionSamples;
        private final long seed;
        private final int threads;
        private transient NoiseModel model;
        private transient DeviceProfile profile;

        Worker(int shots, Recipe<NoiseModel> noise, String device, Settings settings,
                int predictionSamples, long seed, int threads) {
            this.shots = shots;
            this.noise = noise;
            this.device = device;
            this.settings = settings;
            this.predictionSamples = predictionSamples;
            this.seed = seed;
            this.threads = threads;
        }

        @Override
        public Iterator<Outcome> call(Iterator<Item> items) {
            if (model == null) {
                model = Objects.requireNonNull(noise.make(), "the noise recipe made null");
                profile = device == null ? null : DeviceProfile.read(device);
            }
            return new Iterator<Outcome>() {
                @Override
                public boolean hasNext() {
                    return items.hasNext();
                }

                @Override
                public Outcome next() {
                    Item item = items.next();
                    return one(item.index(), item.program());
                }
            };
        }

        /** Runs program {@code i}. */
        Outcome one(long i, Program program) {
            Outcome o = new Outcome();
            o.index = i;
            o.name = program.name();
            try {
                Circuit c = QasmReader.read(program.text());
                if (profile != null) {
                    profile.requireCouplings(c);
                }
                long itemSeed = ItemSeeds.of(seed, i);
                Simulator sim = Simulator.seeded(itemSeed).withThreads(threads)
                        .withNoise(model);
                o.engine = sim.explain(c, shots).engine().name();
                Tally tally = sim.run(c, shots);
                Simulator.Prediction p = Simulator.seeded(ItemSeeds.of(itemSeed, 1))
                        .withThreads(threads).withNoise(model).predict(c, predictionSamples);
                double[] predicted = p.probabilities();
                TallyComparison cmp = TallyComparison.of(tally, predicted,
                        settings.make(p.samples(), threads));
                o.qubits = c.qubits();
                o.clbits = c.clbits();
                o.shots = tally.shots();
                o.prediction = p.method();
                o.predictionSamples = p.samples();
                o.distance = cmp.distance();
                o.distanceLow = cmp.distanceLow();
                o.distanceHigh = cmp.distanceHigh();
                o.observedDistance = cmp.observedDistance();
                o.passes = cmp.passes();
                o.impossibleRate = cmp.impossibleRate();
                Map<String, Long> seen = tally.outcomes();
                o.bits = new String[seen.size()];
                o.counts = new long[seen.size()];
                o.predicted = new double[seen.size()];
                int k = 0;
                for (Map.Entry<String, Long> e : seen.entrySet()) {
                    o.bits[k] = e.getKey();
                    o.counts[k] = e.getValue();
                    o.predicted[k] = predicted[e.getKey().isEmpty() ? 0
                            : Integer.parseInt(e.getKey(), 2)];
                    k++;
                }
            } catch (IllegalArgumentException | IllegalStateException e) {
                o.problem = e.getMessage() == null ? e.toString() : e.getMessage();
                o.engine = null;
            }
            return o;
        }
    }

    /**
     * The results of a batch: a table with one row per program and one with one row per
     * outcome seen (schemas {@link #CIRCUITS} and {@link #OUTCOMES}, described at
     * {@link CircuitBatch}). Both come from one computation, kept by Spark (memory, then disk)
     * until {@link #release()}.
     *
     * @since 0.1
     */
    public static final class Results {
        /** The schema of {@link #circuits()}. */
        public static final StructType CIRCUITS = DataTypes.createStructType(List.of(
                DataTypes.createStructField("index", DataTypes.LongType, false),
                DataTypes.createStructField("circuit", DataTypes.StringType, false),
                DataTypes.createStructField("qubits", DataTypes.IntegerType, true),
                DataTypes.createStructField("clbits", DataTypes.IntegerType, true),
                DataTypes.createStructField("shots", DataTypes.LongType, true),
                DataTypes.createStructField("engine", DataTypes.StringType, true),
                DataTypes.createStructField("prediction", DataTypes.StringType, true),
                DataTypes.createStructField("prediction_samples", DataTypes.LongType, true),
                DataTypes.createStructField("distance", DataTypes.DoubleType, true),
                DataTypes.createStructField("distance_low", DataTypes.DoubleType, true),
                DataTypes.createStructField("distance_high", DataTypes.DoubleType, true),
                DataTypes.createStructField("observed_distance", DataTypes.DoubleType, true),
                DataTypes.createStructField("passes", DataTypes.BooleanType, true),
                DataTypes.createStructField("impossible_rate", DataTypes.DoubleType, true),
                DataTypes.createStructField("outcomes", DataTypes.IntegerType, true),
                DataTypes.createStructField("problem", DataTypes.StringType, true)));

        /** The schema of {@link #outcomes()}. */
        public static final StructType OUTCOMES = DataTypes.createStructType(List.of(
                DataTypes.createStructField("index", DataTypes.LongType, false),
                DataTypes.createStructField("circuit", DataTypes.StringType, false),
                DataTypes.createStructField("bits", DataTypes.StringType, false),
                DataTypes.createStructField("count", DataTypes.LongType, false),
                DataTypes.createStructField("frequency", DataTypes.DoubleType, false),
                DataTypes.createStructField("predicted", DataTypes.DoubleType, false)));

        private final SparkSession spark;
        private final JavaRDD<Outcome> done;

        Results(SparkSession spark, JavaRDD<Outcome> done) {
            this.spark = spark;
            this.done = done;
        }

        /**
         * Returns one row per program, in index order, schema {@link #CIRCUITS}.
         *
         * @return the table
         */
        public Dataset<Row> circuits() {
            return spark.createDataFrame(done.map(Results::circuitRow), CIRCUITS);
        }

        /**
         * Returns one row per outcome seen per program, by index then bitstring, schema
         * {@link #OUTCOMES}.
         *
         * @return the table
         */
        public Dataset<Row> outcomes() {
            return spark.createDataFrame(done.flatMap(o -> {
                List<Row> rows = new ArrayList<>(o.bits.length);
                for (int k = 0; k < o.bits.length; k++) {
                    rows.add(RowFactory.create(o.index, o.name, o.bits[k], o.counts[k],
                            o.counts[k] / (double) o.shots, o.predicted[k]));
                }
                return rows.iterator();
            }), OUTCOMES);
        }

        /** Lets Spark drop the kept results; the tables recompute them if used again. */
        public void release() {
            done.unpersist(false);
        }

        private static Row circuitRow(Outcome o) {
            if (o.problem != null) {
                return RowFactory.create(o.index, o.name, null, null, null, null, null, null,
                        null, null, null, null, null, null, null, o.problem);
            }
            return RowFactory.create(o.index, o.name, o.qubits, o.clbits, o.shots, o.engine,
                    o.prediction, o.predictionSamples, o.distance, o.distanceLow,
                    o.distanceHigh, o.observedDistance, o.passes, o.impossibleRate,
                    o.bits.length, null);
        }
    }
}
