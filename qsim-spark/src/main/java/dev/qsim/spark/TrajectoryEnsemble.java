package dev.qsim.spark;

import java.io.Serializable;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.Objects;

import org.apache.spark.api.java.function.FlatMapFunction;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructType;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;
import dev.qsim.noise.NoiseModel;

/**
 * A trajectory ensemble on Spark: {@code n} Monte Carlo wave-function trajectories of one noisy
 * circuit, split over partitions and merged into one {@link Tally}. Immutable; each
 * {@code with...} method returns a new ensemble.
 *
 * <p>Trajectory {@code t} draws from its own generator seeded from the seed and {@code t}
 * ({@link Simulator#runTrajectories(Circuit, long, int)}); each partition runs a contiguous
 * slice of the indices, and the driver adds the counts exactly (whole numbers). So the tally
 * is the same for any partition count, executor count or task retry, and equal, count for count,
 * to the single-machine run
 * {@code Simulator.seeded(seed).withNoise(model).withEngine(Simulator.Engine.TRAJECTORIES)
 * .run(circuit, n)}.
 *
 * <p>{@link #outcomes(SparkSession, Tally)} turns a tally into rows, one per outcome seen, in the
 * schema {@link #OUTCOMES}: {@code bits} (string, highest clbit leftmost), {@code value} (long,
 * the register value), {@code count} (long), {@code frequency} (double, count over shots).
 *
 * @since 0.1
 */
public final class TrajectoryEnsemble {
    /** The schema of {@link #outcomes(SparkSession, Tally)}. */
    public static final StructType OUTCOMES = DataTypes.createStructType(List.of(
            DataTypes.createStructField("bits", DataTypes.StringType, false),
            DataTypes.createStructField("value", DataTypes.LongType, false),
            DataTypes.createStructField("count", DataTypes.LongType, false),
            DataTypes.createStructField("frequency", DataTypes.DoubleType, false)));

    /** The most trajectories one call of the core runs at once (bounds a task's memory). */
    static final int CHUNK = 1 << 20;

    private final Recipe<Circuit> circuit;
    private final Recipe<NoiseModel> noise;
    private final int trajectories;
    private final long seed;
    private final int partitions;
    private final int threads;

    private TrajectoryEnsemble(Recipe<Circuit> circuit, Recipe<NoiseModel> noise,
            int trajectories, long seed, int partitions, int threads) {
        this.circuit = circuit;
        this.noise = noise;
        this.trajectories = trajectories;
        this.seed = seed;
        this.partitions = partitions;
        this.threads = threads;
    }

    /**
     * Returns an ensemble of {@code trajectories} trajectories with seed 0, the job's
     * partition count (three per core) and one thread per task.
     *
     * @param circuit the recipe of the circuit (at most 63 classical bits)
     * @param noise the recipe of the noise model
     * @param trajectories the number of trajectories, at least 1
     * @return the ensemble
     * @throws IllegalArgumentException if {@code trajectories < 1}
     */
    public static TrajectoryEnsemble of(Recipe<Circuit> circuit, Recipe<NoiseModel> noise,
            int trajectories) {
        Objects.requireNonNull(circuit, "circuit");
        Objects.requireNonNull(noise, "noise");
        if (trajectories < 1) {
            throw new IllegalArgumentException("the number of trajectories must be at least 1"
                    + " but was " + trajectories);
        }
        return new TrajectoryEnsemble(circuit, noise, trajectories, 0, 0, 1);
    }

    /**
     * Returns this ensemble with another seed.
     *
     * @param seed the seed, as {@link Simulator#seeded(long)} takes it
     * @return the new ensemble
     */
    public TrajectoryEnsemble withSeed(long seed) {
        return new TrajectoryEnsemble(circuit, noise, trajectories, seed, partitions, threads);
    }

    /**
     * Returns this ensemble split into another number of partitions; the tally does not
     * depend on it.
     *
     * @param partitions 0 for three per core of Spark's default parallelism (at most one per
     *     item), or from 1 to 2^20
     * @return the new ensemble
     * @throws IllegalArgumentException if the count is out of range
     */
    public TrajectoryEnsemble withPartitions(int partitions) {
        return new TrajectoryEnsemble(circuit, noise, trajectories, seed,
                Slices.requirePartitions(partitions), threads);
    }

    /**
     * Returns this ensemble with another thread count per task; the tally does not depend on
     * it.
     *
     * @param threads from 1 to 256
     * @return the new ensemble
     * @throws IllegalArgumentException if the count is out of range
     */
    public TrajectoryEnsemble withThreads(int threads) {
        return new TrajectoryEnsemble(circuit, noise, trajectories, seed, partitions,
                Slices.requireThreads(threads));
    }

    /**
     * Runs the ensemble and returns the merged tally. First, on the driver, the recipes are
     * made and one trajectory is run, so that a circuit the engine refuses fails here with
     * its own exception before any work is sent out.
     *
     * @param spark the session
     * @return the tally of all trajectories, {@code circuit.clbits()} wide
     * @throws IllegalArgumentException if trajectories cannot run the circuit (more than 63
     *     classical bits, too many qubits) or a noise rule does not fit a gate
     * @throws IllegalStateException if the driver's heap cannot hold one trajectory's state
     */
    public Tally run(SparkSession spark) {
        Objects.requireNonNull(spark, "spark");
        Runner runner = new Runner(circuit, noise, seed, threads);
        runner.prepare();
        runner.simulator.runTrajectories(runner.made, 0, 1);
        int p = Slices.partitions(spark, partitions, trajectories);
        List<long[][]> parts = Slices.context(spark).parallelize(Slices.of(trajectories, p), p)
                .mapPartitions(runner).collect();
        Map<Long, Long> sum = new HashMap<>();
        for (long[][] part : parts) {
            for (int k = 0; k < part[0].length; k++) {
                sum.merge(part[0][k], part[1][k], Math::addExact);
            }
        }
        long[] values = new long[sum.size()];
        long[] counts = new long[sum.size()];
        int k = 0;
        for (Map.Entry<Long, Long> e : sum.entrySet()) {
            values[k] = e.getKey();
            counts[k++] = e.getValue();
        }
        return Tally.ofCounts(runner.made.clbits(), values, counts);
    }

    /**
     * Returns a tally as rows, one per outcome seen, in ascending order of value, in the schema
     * {@link #OUTCOMES}.
     *
     * @param spark the session
     * @param tally the tally
     * @return the rows
     */
    public static Dataset<Row> outcomes(SparkSession spark, Tally tally) {
        Objects.requireNonNull(spark, "spark");
        Objects.requireNonNull(tally, "tally");
        List<Row> rows = new ArrayList<>();
        for (Map.Entry<String, Long> e : tally.outcomes().entrySet()) {
            long value = e.getKey().isEmpty() ? 0 : Long.parseUnsignedLong(e.getKey(), 2);
            rows.add(RowFactory.create(e.getKey(), value, e.getValue(),
                    e.getValue() / (double) tally.shots()));
        }
        return spark.createDataFrame(rows, OUTCOMES).orderBy("value");
    }

    /**
     * The work of one partition: runs the trajectories of its slice in chunks and returns the
     * counts as {@code {values, counts}}.
     */
    static final class Runner implements FlatMapFunction<Iterator<long[]>, long[][]>,
            Serializable {
        private static final long serialVersionUID = 1L;
        private final Recipe<Circuit> circuit;
        private final Recipe<NoiseModel> noise;
        private final long seed;
        private final int threads;
        private transient Circuit made;
        private transient Simulator simulator;

        Runner(Recipe<Circuit> circuit, Recipe<NoiseModel> noise, long seed, int threads) {
            this.circuit = circuit;
            this.noise = noise;
            this.seed = seed;
            this.threads = threads;
        }

        void prepare() {
            made = Objects.requireNonNull(circuit.make(), "the circuit recipe made null");
            simulator = Simulator.seeded(seed).withThreads(threads).withNoise(
                    Objects.requireNonNull(noise.make(), "the noise recipe made null"));
        }

        @Override
        public Iterator<long[][]> call(Iterator<long[]> slices) {
            if (made == null) {
                prepare();
            }
            Map<Long, Long> counts = new HashMap<>();
            while (slices.hasNext()) {
                long[] s = slices.next();
                for (long t = s[0]; t < s[1]; t += CHUNK) {
                    int count = (int) Math.min(CHUNK, s[1] - t);
                    Tally part = simulator.runTrajectories(made, t, count);
                    for (Map.Entry<String, Long> e : part.outcomes().entrySet()) {
                        long value = e.getKey().isEmpty() ? 0
                                : Long.parseUnsignedLong(e.getKey(), 2);
                        counts.merge(value, e.getValue(), Math::addExact);
                    }
                }
            }
            long[][] out = new long[2][counts.size()];
            int k = 0;
            for (Map.Entry<Long, Long> e : counts.entrySet()) {
                out[0][k] = e.getKey();
                out[1][k++] = e.getValue();
            }
            return List.<long[][]>of(out).iterator();
        }
    }
}
