package dev.qsim.spark;

import java.io.Serializable;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Objects;

import org.apache.spark.api.java.JavaRDD;
import org.apache.spark.api.java.function.FlatMapFunction;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructField;
import org.apache.spark.sql.types.StructType;

import dev.qsim.Circuit;
import dev.qsim.StateVector;
import dev.qsim.observable.Estimate;
import dev.qsim.observable.Expectation;
import dev.qsim.observable.Gradients;
import dev.qsim.observable.Observable;
import dev.qsim.observable.TunableCircuit;

/**
 * A parameter sweep on Spark: the expectation value of an {@link Observable} in the state a
 * {@link TunableCircuit} makes from {@code |0...0>}, at every point of a grid or list
 * ({@link SweepPoints}), with its standard error and, if asked, its gradient. Immutable; each
 * {@code with...} method returns a new sweep.
 *
 * <p>Per point {@code i} with values {@code θ}, the result is what the single-machine API gives:
 * <ul>
 *   <li>exact ({@code withShots(0)}, the default): {@code value =}
 *       {@link Expectation#of(Observable, StateVector)} of
 *       {@code StateVector.zero(n).apply(circuit.bind(θ))}, {@code standard_error = 0};</li>
 *   <li>sampled ({@code withShots(s)}, {@code s >= 2} shots per measurement setting):
 *       {@link Expectation#sampled(Observable, StateVector, int, long)} of that state with
 *       the seed {@link ItemSeeds#of(long, long) ItemSeeds.of(seed, i)}, its value and
 *       standard error;</li>
 *   <li>gradient ({@code withGradient(true)}): {@link Gradients#adjoint(TunableCircuit,
 *       double[], Observable, StateVector)}, exact in both cases.</li>
 * </ul>
 * A point's result depends only on the circuit, the observable, its values, the seed and its
 * index, so it is the same for any partition count, executor count or task retry.
 *
 * <p>The result, {@link #run(SparkSession)}, has one row per point, schema
 * {@link #schema(List, boolean)}:
 * <table>
 *   <caption>Columns of a sweep's result</caption>
 *   <tr><th>column</th><th>type</th><th>meaning</th></tr>
 *   <tr><td>{@code point}</td><td>long</td><td>the point's number in {@link SweepPoints}</td></tr>
 *   <tr><td>one per parameter, named as it</td><td>double</td><td>the parameter's value, in the
 *       order of {@link SweepPoints#names()}</td></tr>
 *   <tr><td>{@code value}</td><td>double</td><td>the expectation value</td></tr>
 *   <tr><td>{@code standard_error}</td><td>double</td><td>its standard error (0 when
 *       exact)</td></tr>
 *   <tr><td>{@code gradient_NAME}, one per parameter</td><td>double</td><td>{@code dE/dNAME},
 *       only with {@code withGradient(true)}</td></tr>
 * </table>
 *
 * @since 0.1
 */
public final class ParameterSweep {
    private final Recipe<TunableCircuit> circuit;
    private final Recipe<Observable> observable;
    private final SweepPoints points;
    private final int shots;
    private final boolean gradient;
    private final long seed;
    private final int partitions;
    private final int threads;

    private ParameterSweep(Recipe<TunableCircuit> circuit, Recipe<Observable> observable,
            SweepPoints points, int shots, boolean gradient, long seed, int partitions,
            int threads) {
        this.circuit = circuit;
        this.observable = observable;
        this.points = points;
        this.shots = shots;
        this.gradient = gradient;
        this.seed = seed;
        this.partitions = partitions;
        this.threads = threads;
    }

    /**
     * Returns an exact sweep without gradients, seed 0, the job's partition count (three per
     * core) and one thread per task.
     *
     * @param circuit the recipe of the circuit; its parameters must be exactly the points'
     *     names
     * @param observable the recipe of the observable, on qubits of the circuit
     * @param points the points
     * @return the sweep
     */
    public static ParameterSweep of(Recipe<TunableCircuit> circuit, Recipe<Observable> observable,
            SweepPoints points) {
        Objects.requireNonNull(circuit, "circuit");
        Objects.requireNonNull(observable, "observable");
        Objects.requireNonNull(points, "points");
        return new ParameterSweep(circuit, observable, points, 0, false, 0, 0, 1);
    }

    /**
     * Returns this sweep with sampled estimates: {@code shots} shots per measurement setting at
     * each point, or exact values for 0.
     *
     * @param shots 0, or from 2 to 10,000,000
     * @return the new sweep
     * @throws IllegalArgumentException if {@code shots} is 1, negative or too large
     */
    public ParameterSweep withShots(int shots) {
        if (shots != 0 && (shots < 2 || shots > Slices.MAX_SHOTS)) {
            throw new IllegalArgumentException("the shots per measurement setting must be 0"
                    + " (exact values) or from 2 to " + Slices.MAX_SHOTS + " but were " + shots);
        }
        return new ParameterSweep(circuit, observable, points, shots, gradient, seed,
                partitions, threads);
    }

    /**
     * Returns this sweep with or without the gradient at each point.
     *
     * @param on whether to compute gradients
     * @return the new sweep
     */
    public ParameterSweep withGradient(boolean on) {
        return new ParameterSweep(circuit, observable, points, shots, on, seed, partitions,
                threads);
    }

    /**
     * Returns this sweep with another seed (used by sampled estimates only).
     *
     * @param seed the job's seed
     * @return the new sweep
     */
    public ParameterSweep withSeed(long seed) {
        return new ParameterSweep(circuit, observable, points, shots, gradient, seed,
                partitions, threads);
    }

    /**
     * Returns this sweep split into another number of partitions; results do not depend on it.
     *
     * @param partitions 0 for three per core of Spark's default parallelism (at most one per
     *     item), or from 1 to 2^20
     * @return the new sweep
     * @throws IllegalArgumentException if the count is out of range
     */
    public ParameterSweep withPartitions(int partitions) {
        return new ParameterSweep(circuit, observable, points, shots, gradient, seed,
                Slices.requirePartitions(partitions), threads);
    }

    /**
     * Returns this sweep with another thread count for each point's simulation within a task
     * (match it to {@code spark.task.cpus}); results do not depend on it.
     *
     * @param threads from 1 to 256
     * @return the new sweep
     * @throws IllegalArgumentException if the count is out of range
     */
    public ParameterSweep withThreads(int threads) {
        return new ParameterSweep(circuit, observable, points, shots, gradient, seed,
                partitions, Slices.requireThreads(threads));
    }

    /**
     * Returns the schema of a sweep's result for the given parameter names.
     *
     * @param names the parameter names, in column order
     * @param gradient whether gradient columns follow
     * @return the schema: {@code point}, the parameters, {@code value},
     *     {@code standard_error}, then {@code gradient_NAME} per parameter if asked
     */
    public static StructType schema(List<String> names, boolean gradient) {
        List<StructField> fields = new ArrayList<>();
        fields.add(DataTypes.createStructField("point", DataTypes.LongType, false));
        for (String n : names) {
            fields.add(DataTypes.createStructField(n, DataTypes.DoubleType, false));
        }
        fields.add(DataTypes.createStructField("value", DataTypes.DoubleType, false));
        fields.add(DataTypes.createStructField("standard_error", DataTypes.DoubleType, false));
        if (gradient) {
            for (String n : names) {
                fields.add(DataTypes.createStructField(SweepPoints.GRADIENT_PREFIX + n,
                        DataTypes.DoubleType, false));
            }
        }
        return DataTypes.createStructType(fields);
    }

    /**
     * Runs the sweep. First, on the driver, the recipes are made, the circuit's parameters
     * matched to the points' names and the first point computed, so that bad input fails here
     * with its own exception before any work is sent out. The result is lazy: Spark computes
     * it when an action (a write, {@code collect}, {@code count}) asks.
     *
     * @param spark the session
     * @return one row per point, in the schema {@link #schema(List, boolean)} with the points'
     *     names; points in index order within and across partitions
     * @throws IllegalArgumentException if the circuit's parameters are not the points' names,
     *     the observable acts outside the circuit, or a value is refused by the circuit
     * @throws IllegalStateException if the driver's heap cannot hold the states of one point
     */
    public Dataset<Row> run(SparkSession spark) {
        Objects.requireNonNull(spark, "spark");
        Evaluator eval = new Evaluator(circuit, observable, points, shots, gradient, seed,
                threads);
        eval.prepare();
        eval.row(0); // on the driver: bad input fails here, before any work is sent out
        int p = Slices.partitions(spark, partitions, points.size());
        JavaRDD<long[]> slices = Slices.context(spark).parallelize(Slices.of(points.size(), p),
                p);
        JavaRDD<Row> rows = slices.mapPartitions(eval);
        return spark.createDataFrame(rows, schema(points.names(), gradient));
    }

    /**
     * The work of one partition: makes the recipes once, then computes the rows of its slice.
     * Serializable; the made values are transient and remade on each executor.
     */
    static final class Evaluator implements FlatMapFunction<Iterator<long[]>, Row>,
            Serializable {
        private static final long serialVersionUID = 1L;
        private final Recipe<TunableCircuit> circuitRecipe;
        private final Recipe<Observable> observableRecipe;
        private final SweepPoints points;
        private final int shots;
        private final boolean gradient;
        private final long seed;
        private final int threads;
        private transient TunableCircuit circuit;
        private transient Observable observable;
        /** {@code order[k]}: the column of the circuit's parameter {@code k}. */
        private transient int[] order;

        Evaluator(Recipe<TunableCircuit> circuit, Recipe<Observable> observable,
                SweepPoints points, int shots, boolean gradient, long seed, int threads) {
            this.circuitRecipe = circuit;
            this.observableRecipe = observable;
            this.points = points;
            this.shots = shots;
            this.gradient = gradient;
            this.seed = seed;
            this.threads = threads;
        }

        /** Makes the recipes and matches the parameters to the columns. */
        void prepare() {
            circuit = Objects.requireNonNull(circuitRecipe.make(), "the circuit recipe made"
                    + " null");
            observable = Objects.requireNonNull(observableRecipe.make(), "the observable"
                    + " recipe made null");
            List<String> params = circuit.parameters();
            List<String> names = points.names();
            if (params.size() != names.size() || !names.containsAll(params)) {
                throw new IllegalArgumentException("the circuit's parameters "
                        + Text.excerpt(params.toString()) + " must be exactly the points'"
                        + " names " + Text.excerpt(names.toString()) + " (in any order)");
            }
            if (observable.span() > circuit.qubits()) {
                throw new IllegalArgumentException("the observable acts on qubit "
                        + (observable.span() - 1) + " but the circuit has " + circuit.qubits()
                        + " qubits");
            }
            order = new int[params.size()];
            for (int k = 0; k < order.length; k++) {
                order[k] = names.indexOf(params.get(k));
            }
        }

        @Override
        public Iterator<Row> call(Iterator<long[]> slices) {
            if (circuit == null) {
                prepare();
            }
            return Slices.items(slices, this::row);
        }

        /** The row of point {@code i}. */
        Row row(long i) {
            double[] p = points.point(i);
            double[] theta = new double[p.length];
            for (int k = 0; k < theta.length; k++) {
                theta[k] = p[order[k]];
            }
            int n = circuit.qubits();
            Circuit bound = circuit.bind(theta);
            StateVector psi = StateVector.zero(n).setThreads(threads).apply(bound);
            double value;
            double error;
            if (shots == 0) {
                value = Expectation.of(observable, psi);
                error = 0;
            } else {
                Estimate e = Expectation.sampled(observable, psi, shots, ItemSeeds.of(seed, i));
                value = e.value();
                error = e.standardError();
            }
            Object[] cells = new Object[1 + p.length + 2 + (gradient ? p.length : 0)];
            int c = 0;
            cells[c++] = i;
            for (double v : p) {
                cells[c++] = v;
            }
            cells[c++] = value;
            cells[c++] = error;
            if (gradient) {
                double[] g = Gradients.adjoint(circuit, theta, observable,
                        StateVector.zero(n).setThreads(threads));
                double[] byColumn = new double[p.length];
                for (int k = 0; k < g.length; k++) {
                    byColumn[order[k]] = g[k];
                }
                for (double v : byColumn) {
                    cells[c++] = v;
                }
            }
            return RowFactory.create(cells);
        }
    }
}
