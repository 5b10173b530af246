package dev.qsim.spark.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;

import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import dev.qsim.observable.Observable;
import dev.qsim.observable.TunableCircuit;
import dev.qsim.spark.ParameterSweep;
import dev.qsim.spark.Recipe;
import dev.qsim.spark.SweepPoints;

/** {@code sweep}: the expectation value of an observable over a grid or list of points. */
@Command(name = "sweep", mixinStandardHelpOptions = true,
        versionProvider = SparkTool.VersionText.class,
        description = "Sweeps the parameters of a tunable circuit over a grid or a list of"
                + " points and writes one row per point: the parameters, the expectation value"
                + " of an observable, its standard error and (with --gradient) its gradient.",
        footerHeading = "%nExamples:%n",
        footer = {
            "  qsim-spark/run-local.sh sweep --circuit qsim-spark/demo/ridge.tune \\",
            "      --observable '1 Z0 Z1' --observable '0.5 X0' \\",
            "      --grid gamma=0:3.1416:100 --grid beta=0:1.5708:100 --out landscape",
            "  qsim-spark/run-local.sh sweep --circuit c.tune --observable '1 Z0' \\",
            "      --points points.csv --shots 1000 --format csv --out sampled",
            "%nThe circuit file: 'qubits N', then one gate per line (name, qubits, angles); an"
                    + " angle is a number (0.3, pi/2) or a parameter (gamma, 2*gamma,"
                    + " -beta+pi/2). A points file: a header of parameter names, then one line"
                    + " of numbers per point. Columns: point, one per parameter, value,"
                    + " standard_error, gradient_NAME (see docs/spark.md)."})
final class SweepCommand implements Callable<Integer> {
    @Spec
    CommandLine.Model.CommandSpec spec;
    @Option(names = "--circuit", required = true, paramLabel = "FILE",
            description = "the tunable circuit file")
    Path circuit;
    @Option(names = "--observable", required = true, paramLabel = "'W PAULI'",
            description = "a term of the observable, such as '0.5 Z0 Z1' (repeatable)")
    List<String> observable = new ArrayList<>();
    @Option(names = "--grid", paramLabel = "NAME=FROM:TO:COUNT",
            description = "an axis of the grid (repeatable, one per parameter)")
    List<String> grid = new ArrayList<>();
    @Option(names = "--points", paramLabel = "FILE.csv",
            description = "a CSV file of points instead of a grid")
    Path points;
    @Option(names = "--shots", defaultValue = "0", paramLabel = "N",
            description = "shots per measurement setting, 2 to 10,000,000, or 0 for exact values"
                    + " (default ${DEFAULT-VALUE})")
    int shots;
    @Option(names = "--gradient", description = "also write the gradient at each point")
    boolean gradient;
    @Option(names = "--seed", defaultValue = "1", paramLabel = "S",
            description = "seed of sampled estimates (default ${DEFAULT-VALUE})")
    long seed;
    @CommandLine.Mixin
    SparkTool.SparkOptions sparkOptions = new SparkTool.SparkOptions();
    @CommandLine.Mixin
    SparkTool.OutputOptions output = new SparkTool.OutputOptions();

    @Override
    public Integer call() throws IOException {
        sparkOptions.check();
        output.check();
        if (shots != 0 && (shots < 2 || shots > 10_000_000)) {
            throw new IllegalArgumentException("--shots: " + shots + " is not 0 or a whole"
                    + " number from 2 to 10,000,000");
        }
        if (grid.isEmpty() == (points == null)) {
            throw new IllegalArgumentException("give either --grid (one per parameter) or"
                    + " --points FILE, not " + (grid.isEmpty() ? "neither" : "both"));
        }
        String text = ToolFiles.read(circuit, "the circuit file");
        TunableCircuit made;
        try {
            made = TunableCircuitFile.read(text);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(circuit + ": " + e.getMessage(), e);
        }
        Observable h = ObservableTerms.read(observable);
        List<String> terms = List.copyOf(observable);
        SweepPoints where;
        if (points != null) {
            where = SweepPoints.read(points);
        } else {
            List<SweepPoints.Axis> axes = new ArrayList<>();
            for (String g : grid) {
                try {
                    axes.add(SweepPoints.Axis.parse(g));
                } catch (IllegalArgumentException e) {
                    throw new IllegalArgumentException("--grid: " + e.getMessage(), e);
                }
            }
            where = SweepPoints.grid(axes);
        }
        if (!where.names().containsAll(made.parameters())
                || where.names().size() != made.parameters().size()) {
            throw new IllegalArgumentException("the circuit's parameters " + made.parameters()
                    + " must be exactly the points' names " + where.names());
        }
        if (h.span() > made.qubits()) {
            throw new IllegalArgumentException("--observable: the observable acts on qubit "
                    + (h.span() - 1) + " but the circuit has " + made.qubits() + " qubits");
        }
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        err.println("sweep: " + where + " of " + made + ", " + (shots == 0 ? "exact values"
                : shots + " shots per setting"));
        err.flush();
        long start = System.nanoTime();
        SparkSession spark = sparkOptions.session("sweep");
        long ready = System.nanoTime();
        Recipe<TunableCircuit> c = () -> TunableCircuitFile.read(text);
        Recipe<Observable> o = () -> ObservableTerms.read(terms);
        Dataset<Row> rows = ParameterSweep.of(c, o, where).withShots(shots)
                .withGradient(gradient).withSeed(seed).withPartitions(sparkOptions.partitions)
                .withThreads(sparkOptions.threads).run(spark).cache();
        output.write(rows, "", err);
        Row low = rows.orderBy("value", "point").first();
        Row high = rows.orderBy(rows.col("value").desc(), rows.col("point")).first();
        double seconds = (System.nanoTime() - ready) / 1e9;
        double startup = (ready - start) / 1e9;
        out.println(SparkTool.f("%,d points in %.1f s on %s, %d partitions (Spark started in"
                + " %.1f s)", where.size(), seconds, spark.sparkContext().master(),
                rows.rdd().getNumPartitions(), startup));
        out.println("lowest value:  " + describe(low, where.names()));
        out.println("highest value: " + describe(high, where.names()));
        out.flush();
        rows.unpersist();
        sparkOptions.done(spark);
        return SparkTool.EXIT_OK;
    }

    private static String describe(Row r, List<String> names) {
        StringBuilder sb = new StringBuilder(SparkTool.f("%.6f", r.getDouble(names.size() + 1)));
        double se = r.getDouble(names.size() + 2);
        if (se > 0) {
            sb.append(SparkTool.f(" ± %.6f", se));
        }
        sb.append(" at point ").append(r.getLong(0)).append(" (");
        for (int j = 0; j < names.size(); j++) {
            sb.append(j == 0 ? "" : ", ").append(names.get(j)).append(" = ")
                    .append(SparkTool.f("%.6g", r.getDouble(1 + j)));
        }
        return sb.append(')').toString();
    }
}
