/**
 * qsim on Apache Spark: the jobs that outgrow one machine, each a library call with the same
 * answer as the single-machine API.
 *
 * <ul>
 *   <li>{@link dev.qsim.spark.ParameterSweep}: expectation values (exact or sampled, with
 *       standard errors and gradients) of a tunable circuit over a grid or list of points
 *       ({@link dev.qsim.spark.SweepPoints});</li>
 *   <li>{@link dev.qsim.spark.CircuitBatch}: OpenQASM 3 programs run for shots (ideal, noisy
 *       or under a device profile) and compared with their predictions;</li>
 *   <li>{@link dev.qsim.spark.TrajectoryEnsemble}: the trajectories of one noisy circuit split
 *       over partitions and merged into one tally;</li>
 *   <li>{@link dev.qsim.spark.benchmarking}: randomized benchmarking of a two-qubit device
 *       profile, the example that needs all of this.</li>
 * </ul>
 *
 * <p>Same answer anywhere: every item of a job (a point, a program, a trajectory, a sequence)
 * draws from its own random stream, seeded from the job's seed and the item's index alone
 * ({@link dev.qsim.spark.ItemSeeds}), so results are identical for any partition count,
 * executor count or task retry. Sums are exact (counts) or taken in index order on the driver.
 * Values that are not serializable (circuits, observables, noise models) travel as
 * {@link dev.qsim.spark.Recipe}s and are made once per partition.
 *
 * <p>Results are Spark {@code Dataset<Row>}s with the schemas documented on each job, to write
 * as Parquet or CSV. Spark itself is a provided dependency: {@code spark-submit} supplies it on a
 * cluster, and {@code qsim-spark/run-local.sh} puts it on the class path for local runs, with
 * the JVM options Spark needs on Java 17 and later ({@code qsim-spark/spark-jvm-options}). See
 * {@code docs/spark.md}.
 */
package dev.qsim.spark;
