package dev.qsim.spark.cli;

import java.io.IOException;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Objects;
import java.util.concurrent.Callable;

import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SaveMode;
import org.apache.spark.sql.SparkSession;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * The command-line tool of qsim-spark: parameter sweeps, circuit batches, trajectory ensembles
 * and randomized benchmarking on Apache Spark, and a speed check. Run it with
 * {@code qsim-spark/run-local.sh COMMAND ...} (local mode, Spark on the class path) or
 * {@code spark-submit --class dev.qsim.spark.cli.SparkTool qsim-spark.jar COMMAND ...}.
 *
 * <p>Every option value and input file is checked before Spark starts; a bad one is refused in
 * one line on standard error that names it, such as
 * {@code qsim-spark sweep: --shots: 1 is not 0 or a whole number from 2 to 10,000,000}.
 * Results go to the {@code --out} folder (Parquet or CSV) and a summary to standard output;
 * progress to standard error.
 *
 * <p>Exit codes: {@value #EXIT_OK} success, {@value #EXIT_BAD_INPUT} bad input (unknown option,
 * bad value, unreadable or malformed file, an output folder that exists).
 */
@Command(name = "qsim-spark", mixinStandardHelpOptions = true,
        versionProvider = SparkTool.VersionText.class,
        description = "Runs qsim jobs that outgrow one machine on Apache Spark: parameter"
                + " sweeps, circuit batches, trajectory ensembles and randomized benchmarking.",
        subcommands = {SweepCommand.class, BatchCommand.class, TrajectoriesCommand.class,
            CliffordDecayCommand.class, SpeedCommand.class})
public final class SparkTool implements Callable<Integer> {
    /** Exit code of success. */
    public static final int EXIT_OK = 0;
    /** Exit code of bad input. */
    public static final int EXIT_BAD_INPUT = 2;

    @Spec
    private CommandLine.Model.CommandSpec spec;

    private SparkTool() {
    }

    /**
     * Runs the tool and exits the JVM with its exit code.
     *
     * @param args a command and its options
     */
    public static void main(String[] args) {
        System.exit(run(args, System.out, System.err));
    }

    /**
     * Runs the tool without exiting the JVM.
     *
     * @param args a command and its options
     * @param out where results go
     * @param err where messages and progress go
     * @return the exit code
     */
    public static int run(String[] args, PrintStream out, PrintStream err) {
        Objects.requireNonNull(args, "args");
        PrintWriter o = new PrintWriter(out, true);
        PrintWriter e = new PrintWriter(err, true);
        CommandLine cl = new CommandLine(new SparkTool());
        cl.setOut(o).setErr(e);
        cl.setParameterExceptionHandler((ex, a) -> {
            CommandLine line = ex.getCommandLine();
            String what = ex.getMessage();
            if (ex.getCause() instanceof CommandLine.TypeConversionException
                    && ex.getArgSpec() != null && ex.getArgSpec().isOption()) {
                what = ((CommandLine.Model.OptionSpec) ex.getArgSpec()).longestName() + ": "
                        + ex.getCause().getMessage();
            }
            boolean top = line.getParent() == null;
            line.getErr().println("qsim-spark" + (top ? "" : " " + line.getCommandName())
                    + ": " + what + "; see '" + (top ? "" : line.getCommandName() + " ")
                    + "--help'");
            line.getErr().flush();
            return EXIT_BAD_INPUT;
        });
        cl.setExecutionExceptionHandler((ex, line, parsed) -> {
            line.getErr().println("qsim-spark " + line.getCommandName() + ": " + message(ex));
            line.getErr().flush();
            return EXIT_BAD_INPUT;
        });
        int code = cl.execute(args);
        o.flush();
        e.flush();
        return code;
    }

    private static String message(Exception ex) {
        if (ex instanceof IOException || ex instanceof UncheckedIOException) {
            return "cannot read or write a file: " + ex.getMessage();
        }
        if (ex instanceof IllegalArgumentException || ex instanceof IllegalStateException) {
            return ex.getMessage();
        }
        return ex.toString();
    }

    /**
     * Prints the usage (no command given).
     *
     * @return {@value #EXIT_BAD_INPUT}
     */
    @Override
    public Integer call() {
        spec.commandLine().usage(spec.commandLine().getErr());
        return EXIT_BAD_INPUT;
    }

    /** The version: the qsim-spark jar's, from its manifest, or "development". */
    static final class VersionText implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            String v = SparkTool.class.getPackage().getImplementationVersion();
            return new String[] {"qsim-spark " + (v == null ? "(development build)" : v)
                    + ", Spark " + org.apache.spark.package$.MODULE$.SPARK_VERSION()};
        }
    }

    /** The Spark options every job command shares. */
    static final class SparkOptions {
        @Option(names = "--master", paramLabel = "URL",
                description = "Spark master (default: local[*] unless spark-submit set one)")
        String master;
        @Option(names = "--partitions", defaultValue = "0", paramLabel = "P",
                description = "partitions of the job, 1 to 1,048,576, or 0 for three per core of"
                        + " Spark's default parallelism, at most one per item (default"
                        + " ${DEFAULT-VALUE}); results do not depend on it")
        int partitions;
        @Option(names = "--threads", defaultValue = "1", paramLabel = "T",
                description = "threads of each simulation within a task, 1 to 256 (default"
                        + " ${DEFAULT-VALUE}); results do not depend on it")
        int threads;
        @Option(names = "--conf", paramLabel = "KEY=VALUE",
                description = "a Spark setting, such as spark.executor.memory=4g (repeatable)")
        List<String> conf = new ArrayList<>();

        void check() {
            if (partitions < 0 || partitions > (1 << 20)) {
                throw new IllegalArgumentException("--partitions: " + partitions + " is not 0 or"
                        + " a whole number from 1 to 1,048,576");
            }
            if (threads < 1 || threads > 256) {
                throw new IllegalArgumentException("--threads: " + threads + " is not a whole"
                        + " number from 1 to 256");
            }
            for (String c : conf) {
                int eq = c.indexOf('=');
                if (eq <= 0 || !c.startsWith("spark.")) {
                    throw new IllegalArgumentException("--conf: '" + ToolFiles.excerpt(c)
                            + "' is not KEY=VALUE with a key starting 'spark.'");
                }
            }
        }

        /** Whether {@link #session(String)} started the session (so the command stops it). */
        boolean started;

        /** Starts (or joins) the session: quiet, no web UI unless asked for. */
        SparkSession session(String command) {
            started = SparkSession.getActiveSession().isEmpty()
                    && SparkSession.getDefaultSession().isEmpty();
            SparkSession.Builder b = SparkSession.builder().appName("qsim-spark " + command)
                    .config("spark.ui.enabled", "false");
            if (master != null) {
                b.master(master);
            } else if (System.getProperty("spark.master") == null) {
                b.master("local[*]");
            }
            for (String c : conf) {
                int eq = c.indexOf('=');
                b.config(c.substring(0, eq), c.substring(eq + 1));
            }
            SparkSession s = b.getOrCreate();
            s.sparkContext().setLogLevel("WARN");
            return s;
        }

        /** Stops the session if this command started it. */
        void done(SparkSession spark) {
            if (started) {
                spark.stop();
            }
        }
    }

    /** Where and how a command writes its tables. */
    static final class OutputOptions {
        @Option(names = "--out", paramLabel = "DIR",
                description = "folder to write the results to (must not exist); a local path"
                        + " or a Spark location such as hdfs://...")
        String out;
        @Option(names = "--format", defaultValue = "parquet", paramLabel = "parquet|csv",
                description = "format of the written tables (default ${DEFAULT-VALUE})")
        String format;

        void check() {
            if (!format.equals("parquet") && !format.equals("csv")) {
                throw new IllegalArgumentException("--format: '" + ToolFiles.excerpt(format)
                        + "' is not parquet or csv");
            }
            if (out != null) {
                ToolFiles.requireNewOutput(out);
            }
        }

        /** Writes a table to {@code out/name} (or {@code out} when name is empty). */
        void write(Dataset<Row> table, String name, PrintWriter err) {
            if (out == null) {
                return;
            }
            String where = name.isEmpty() ? out : out + "/" + name;
            table.write().mode(SaveMode.ErrorIfExists).option("header", "true").format(format)
                    .save(where);
            err.println("wrote " + where + " (" + format + ")");
            err.flush();
        }
    }

    static String f(String format, Object... args) {
        return String.format(Locale.ROOT, format, args);
    }
}
