package dev.qsim.spark.benchmarking;

import java.io.Serializable;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Iterator;
import java.util.List;
import java.util.Objects;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.apache.spark.api.java.JavaRDD;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.api.java.function.FlatMapFunction;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructType;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.noise.NoiseModel;
import dev.qsim.spark.ItemSeeds;
import dev.qsim.spark.Recipe;

/**
 * Randomized benchmarking of two qubits on Spark (Magesan, Gambetta and Emerson 2011, Phys. Rev.
 * Lett. 106, 180504): for each length {@code m}, many sequences of {@code m} Cliffords drawn
 * uniformly from {@link TwoQubitCliffords}, each followed by the Clifford that inverts the
 * sequence, run from {@code |00>} under a noise model; the probability of reading {@code 00}
 * again (the survival) decays as {@code A p^m + B} ({@link DecayFit}), and the error per
 * Clifford {@code r = 3(1 - p)/4} is compared with what the noise model predicts
 * ({@link NoisyCliffords#errorPerClifford(NoiseModel)}). Immutable; each {@code with...} method
 * returns a new job.
 *
 * <p>Sequence {@code i} (numbered length by length: sequences {@code 0 .. s-1} have the first
 * length, and so on) draws its Cliffords from a generator seeded with
 * {@link ItemSeeds#of(long, long) ItemSeeds.of(seed, i)}; its survival is the exact probability
 * of {@code 00} ({@link Simulator#distribution(Circuit)}, the density matrix with readout error)
 * or, with {@code withShots(k)}, the frequency of {@code 00} in {@code k} shots run with seed
 * {@code ItemSeeds.of(ItemSeeds.of(seed, i), 1)}. So the results are the same for any partition
 * count, and the means per length are summed in sequence order on the driver.
 *
 * <p>{@link Results#sequences()} has one row per sequence, schema {@link #SEQUENCES}:
 * {@code sequence} (long), {@code length} (int, Cliffords before the inverse),
 * {@code survival} (double).
 *
 * @since 0.1
 */
public final class RandomizedBenchmarking {
    /** The schema of {@link Results#sequences()}. */
    public static final StructType SEQUENCES = DataTypes.createStructType(List.of(
            DataTypes.createStructField("sequence", DataTypes.LongType, false),
            DataTypes.createStructField("length", DataTypes.IntegerType, false),
            DataTypes.createStructField("survival", DataTypes.DoubleType, false)));

    /** The longest sequence: {@value} Cliffords. */
    public static final int MAX_LENGTH = 20_000;
    /** The most lengths: {@value}. */
    public static final int MAX_LENGTHS = 1000;
    /** The most sequences in all (lengths times sequences per length): {@value}. */
    public static final int MAX_SEQUENCES = 1_000_000;

    private final Recipe<NoiseModel> noise;
    private final int[] lengths;
    private final int sequences;
    private final int shots;
    private final long seed;
    private final int partitions;

    private RandomizedBenchmarking(Recipe<NoiseModel> noise, int[] lengths, int sequences,
            int shots, long seed, int partitions) {
        this.noise = noise;
        this.lengths = lengths;
        this.sequences = sequences;
        this.shots = shots;
        this.seed = seed;
        this.partitions = partitions;
    }

    /**
     * Returns a benchmark with exact survival probabilities, seed 0 and the job's
     * partition count (three per core).
     *
     * @param noise the recipe of the noise model (such as
     *     {@link Recipe#deviceNoise(String)}); made once here to check it
     * @param lengths the sequence lengths, at least three distinct and at most
     *     {@value #MAX_LENGTHS}, each from 1 to {@value #MAX_LENGTH}
     * @param sequences the sequences per length, at least 1, with from 4 to
     *     {@value #MAX_SEQUENCES} sequences in all
     * @return the benchmark
     * @throws IllegalArgumentException if a length or the count is out of range
     */
    public static RandomizedBenchmarking of(Recipe<NoiseModel> noise, int[] lengths,
            int sequences) {
        Objects.requireNonNull(noise, "noise");
        Objects.requireNonNull(lengths, "lengths");
        Objects.requireNonNull(noise.make(), "the noise recipe made null");
        if (lengths.length > MAX_LENGTHS) {
            throw new IllegalArgumentException(lengths.length + " sequence lengths are more"
                    + " than the " + MAX_LENGTHS + " allowed");
        }
        if (Arrays.stream(lengths).distinct().count() < 3) {
            throw new IllegalArgumentException("randomized benchmarking needs at least 3"
                    + " distinct lengths to fit A p^m + B but was given "
                    + Arrays.toString(lengths));
        }
        for (int m : lengths) {
            if (m < 1 || m > MAX_LENGTH) {
                throw new IllegalArgumentException("sequence length " + m + " is out of range"
                        + " [1, " + MAX_LENGTH + "]");
            }
        }
        long total = (long) sequences * lengths.length;
        if (sequences < 1 || total < 4 || total > MAX_SEQUENCES) {
            throw new IllegalArgumentException(sequences + " sequences per length make "
                    + total + " sequences in all; allowed are at least 1 per length and from 4"
                    + " to " + MAX_SEQUENCES + " in all");
        }
        return new RandomizedBenchmarking(noise, lengths.clone(), sequences, 0, 0, 0);
    }

    /**
     * Returns this benchmark with survival estimated from {@code shots} shots per sequence, or
     * exact for 0.
     *
     * @param shots 0, or from 1 to 10,000,000
     * @return the new benchmark
     * @throws IllegalArgumentException if {@code shots} is out of range
     */
    public RandomizedBenchmarking withShots(int shots) {
        if (shots < 0 || shots > 10_000_000) {
            throw new IllegalArgumentException("the shots per sequence must be 0 (exact"
                    + " survival) or from 1 to 10,000,000 but were " + shots);
        }
        return new RandomizedBenchmarking(noise, lengths, sequences, shots, seed, partitions);
    }

    /**
     * Returns this benchmark with another seed.
     *
     * @param seed the job's seed
     * @return the new benchmark
     */
    public RandomizedBenchmarking withSeed(long seed) {
        return new RandomizedBenchmarking(noise, lengths, sequences, shots, seed, partitions);
    }

    /**
     * Returns this benchmark split into another number of partitions; results do not depend
     * on it.
     *
     * @param partitions 0 for three per core of Spark's default parallelism (at most one per
     *     item), or from 1 to 2^20
     * @return the new benchmark
     * @throws IllegalArgumentException if the count is out of range
     */
    public RandomizedBenchmarking withPartitions(int partitions) {
        if (partitions < 0 || partitions > (1 << 20)) {
            throw new IllegalArgumentException("the partition count must be 0 (three per core,"
                    + " chosen by the job) or from 1 to " + (1 << 20) + " but was " + partitions);
        }
        return new RandomizedBenchmarking(noise, lengths, sequences, shots, seed, partitions);
    }

    /**
     * Returns the sequence of Cliffords of sequence {@code i} (before its inverse): what the
     * job draws, for checking it on one machine.
     *
     * @param seed the job's seed
     * @param i the sequence's number
     * @param length its length
     * @return the elements of {@link TwoQubitCliffords}, in the order applied
     */
    public static int[] draw(long seed, long i, int length) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(ItemSeeds.of(seed,
                i));
        TwoQubitCliffords group = TwoQubitCliffords.group();
        int[] out = new int[length];
        for (int k = 0; k < length; k++) {
            out[k] = group.sample(rng);
        }
        return out;
    }

    /**
     * Returns the circuit of a sequence: its Cliffords, the inverting Clifford, then both
     * qubits measured.
     *
     * @param elements the Cliffords, in the order applied
     * @return the circuit on 2 qubits and 2 clbits
     */
    public static Circuit circuit(int[] elements) {
        TwoQubitCliffords group = TwoQubitCliffords.group();
        Circuit.Builder b = Circuit.builder(2);
        int total = 0;
        for (int e : elements) {
            b.append(group.circuit(e));
            total = group.compose(total, e);
        }
        return b.append(group.circuit(group.inverse(total))).measure().build();
    }

    /**
     * Runs the benchmark: the sequences on Spark, then on the driver the means per length (in
     * sequence order), the fit and the noise model's prediction.
     *
     * @param spark the session
     * @return the results
     * @throws IllegalArgumentException if the fit does not converge
     */
    public Results run(SparkSession spark) {
        Objects.requireNonNull(spark, "spark");
        long n = (long) lengths.length * sequences;
        // Left to the job: three partitions per core, at most one per sequence, as the other
        // jobs (Slices.TASKS_PER_CORE).
        int p = partitions > 0 ? partitions : (int) Math.max(1, Math.min(n,
                3L * Math.max(1, spark.sparkContext().defaultParallelism())));
        List<long[]> slices = new ArrayList<>();
        for (int k = 0; k < p; k++) {
            slices.add(new long[] {(n / p) * k + (n % p) * k / p,
                (n / p) * (k + 1) + (n % p) * (k + 1) / p});
        }
        JavaRDD<Row> rows = JavaSparkContext.fromSparkContext(spark.sparkContext())
                .parallelize(slices, p)
                .mapPartitions(new Runner(noise, lengths, sequences, shots, seed));
        Dataset<Row> table = spark.createDataFrame(rows, SEQUENCES);
        List<Row> all = table.collectAsList();
        int[] m = new int[all.size()];
        double[] y = new double[all.size()];
        double[] sums = new double[lengths.length];
        for (int i = 0; i < all.size(); i++) {
            Row r = all.get(i);
            m[i] = r.getInt(1);
            y[i] = r.getDouble(2);
            sums[i / sequences] += y[i];
        }
        double[] means = new double[lengths.length];
        for (int k = 0; k < means.length; k++) {
            means[k] = sums[k] / sequences;
        }
        DecayFit fit = DecayFit.of(m, y, 2);
        return new Results(spark.createDataFrame(all, SEQUENCES), lengths.clone(), means, fit,
                noise);
    }

    /**
     * The results of a benchmark.
     *
     * @since 0.1
     */
    public static final class Results {
        private final Dataset<Row> sequences;
        private final int[] lengths;
        private final double[] means;
        private final DecayFit fit;
        private final Recipe<NoiseModel> noise;
        private double predicted = Double.NaN;

        Results(Dataset<Row> sequences, int[] lengths, double[] means, DecayFit fit,
                Recipe<NoiseModel> noise) {
            this.sequences = sequences;
            this.lengths = lengths;
            this.means = means;
            this.fit = fit;
            this.noise = noise;
        }

        /**
         * Returns one row per sequence, schema {@link #SEQUENCES}.
         *
         * @return the table
         */
        public Dataset<Row> sequences() {
            return sequences;
        }

        /**
         * Returns the lengths, in the order given.
         *
         * @return a copy
         */
        public int[] lengths() {
            return lengths.clone();
        }

        /**
         * Returns the mean survival per length, in the order of {@link #lengths()}, each summed
         * in sequence order.
         *
         * @return a copy
         */
        public double[] meanSurvival() {
            return means.clone();
        }

        /**
         * Returns the fit of {@code A p^m + B} to every sequence's survival.
         *
         * @return the fit
         */
        public DecayFit fit() {
            return fit;
        }

        /**
         * Returns the error per Clifford the noise model predicts
         * ({@link NoisyCliffords#errorPerClifford(NoiseModel)}), computed on the driver on
         * first call (about 2 s) and kept. Thread-safe.
         *
         * @return the prediction
         */
        public synchronized double predictedErrorPerClifford() {
            if (Double.isNaN(predicted)) {
                predicted = NoisyCliffords.errorPerClifford(noise.make());
            }
            return predicted;
        }
    }

    /** The work of one partition: draws, builds and runs the sequences of its slice. */
    static final class Runner implements FlatMapFunction<Iterator<long[]>, Row>, Serializable {
        private static final long serialVersionUID = 1L;
        private final Recipe<NoiseModel> noise;
        private final int[] lengths;
        private final int sequences;
        private final int shots;
        private final long seed;
        private transient NoiseModel model;

        Runner(Recipe<NoiseModel> noise, int[] lengths, int sequences, int shots, long seed) {
            this.noise = noise;
            this.lengths = lengths;
            this.sequences = sequences;
            this.shots = shots;
            this.seed = seed;
        }

        @Override
        public Iterator<Row> call(Iterator<long[]> slices) {
            if (model == null) {
                model = noise.make();
            }
            List<Row> out = new ArrayList<>();
            while (slices.hasNext()) {
                long[] s = slices.next();
                for (long i = s[0]; i < s[1]; i++) {
                    out.add(row(i));
                }
            }
            return out.iterator();
        }

        private Row row(long i) {
            int length = lengths[(int) (i / sequences)];
            Circuit c = circuit(draw(seed, i, length));
            double survival;
            if (shots == 0) {
                survival = Simulator.seeded(0).withThreads(1).withNoise(model)
                        .distribution(c)[0];
            } else {
                survival = Simulator.seeded(ItemSeeds.of(ItemSeeds.of(seed, i), 1))
                        .withThreads(1).withNoise(model).run(c, shots).count(0)
                        / (double) shots;
            }
            return RowFactory.create(i, length, survival);
        }
    }
}
