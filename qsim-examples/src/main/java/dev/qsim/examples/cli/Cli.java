package dev.qsim.examples.cli;

import java.io.IOException;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.concurrent.Callable;

import org.apache.commons.numbers.complex.Complex;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import dev.qsim.Circuit;
import dev.qsim.Precision;
import dev.qsim.Simulator;
import dev.qsim.StateVector;
import dev.qsim.Tally;
import dev.qsim.examples.Version;
import dev.qsim.noise.NoiseModel;
import dev.qsim.stats.ComparisonSettings;
import dev.qsim.stats.ErrorKind;
import dev.qsim.stats.FittedNoise;
import dev.qsim.stats.NoiseFamily;
import dev.qsim.stats.NoiseFit;
import dev.qsim.stats.TallyComparison;
import dev.qsim.stats.TallyFiles;

/**
 * The command-line tool: runs OpenQASM 3 circuit files, prints states, draws circuits and
 * compares a device's tally file with a circuit's ideal prediction. {@code Main} hands it the
 * arguments when the first one is a subcommand name ({@link #COMMANDS}).
 *
 * <p>Every option value is checked as the command line is read ({@link OptionValues}) and every
 * file before any work ({@link FileChecks}); a bad one is refused with one line on standard
 * error that names it, says what is allowed and where to read more, such as
 * {@code qsim-examples run: --shots: '0' is not a whole number from 1 to 10,000,000; see 'run
 * --help'}. Results go to standard output; progress and what a command wrote to a file
 * ({@code wrote h.svg (histogram of 2 outcomes)}) go to standard error.
 *
 * <p>Exit codes: {@value #EXIT_OK} success, {@value #EXIT_MISMATCH} a comparison failed and
 * {@code --require-match} was given, {@value #EXIT_BAD_INPUT} bad input (unknown option, bad
 * value, unreadable or malformed file, a circuit too large to run).
 */
@Command(name = "java -jar qsim-examples.jar", mixinStandardHelpOptions = true,
        versionProvider = Cli.VersionText.class,
        description = "Runs, draws and checks circuits written in OpenQASM 3.",
        subcommands = {Cli.Run.class, Cli.State.class, Cli.Draw.class, Cli.Compare.class,
            Cli.Scale.class, CalibrateCommand.class})
public final class Cli implements Callable<Integer> {

    /** Exit code of success. */
    public static final int EXIT_OK = 0;
    /** Exit code of a comparison that failed when asked to gate on it. */
    public static final int EXIT_MISMATCH = 1;
    /** Exit code of bad input. */
    public static final int EXIT_BAD_INPUT = 2;
    /** The subcommand names. */
    public static final Set<String> COMMANDS = Set.of("run", "state", "draw", "compare", "scale",
            "calibrate");
    /** The most shots one run takes. */
    public static final int MAX_SHOTS = 10_000_000;
    /** The most qubits whose state {@code state} prints. */
    public static final int MAX_STATE_QUBITS = 16;

    /** The widest register whose exact prediction a histogram draws beside the bars. */
    static final int MAX_PICTURE_CLBITS = 20;

    /** The most shots a sampled prediction may take. */
    static final int MAX_PREDICTION_SHOTS = 10_000_000;
    /** The most threads {@code --threads} takes (the core's limit). */
    static final int MAX_THREADS = 256;
    /** The most bootstrap resamples {@code compare --resamples} takes. */
    static final int MAX_RESAMPLES = 1_000_000;
    /** The most deviating outcomes {@code compare --top} lists. */
    static final int MAX_TOP = 1_000;
    /** The largest qubit count {@code scale} times. */
    static final int MAX_SCALE_QUBITS = 30;

    @Spec
    private CommandLine.Model.CommandSpec spec;

    private Cli() {
    }

    /** The version every command prints for {@code --version}: {@link Version#text()}. */
    static final class VersionText implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            return new String[] {Version.text()};
        }
    }

    /**
     * Runs the tool without exiting the JVM.
     *
     * @param args a subcommand and its options
     * @param out where results go
     * @param err where messages and progress go
     * @return the exit code
     */
    public static int run(String[] args, PrintStream out, PrintStream err) {
        Objects.requireNonNull(args, "args");
        PrintWriter o = new PrintWriter(out, true);
        PrintWriter e = new PrintWriter(err, true);
        CommandLine cl = new CommandLine(new Cli());
        cl.setOut(o).setErr(e);
        cl.setParameterExceptionHandler(Cli::badOption);
        cl.setExecutionExceptionHandler((ex, line, parsed) -> {
            line.getErr().println("qsim-examples " + line.getCommandName() + ": " + message(ex));
            line.getErr().flush();
            return EXIT_BAD_INPUT;
        });
        int code = cl.execute(args);
        o.flush();
        e.flush();
        return code;
    }

    /**
     * One line for a bad option or value: what is wrong, and the command's help to read; never
     * the whole usage.
     */
    private static int badOption(CommandLine.ParameterException ex, String[] args) {
        CommandLine line = ex.getCommandLine();
        String name = line.getCommandName();
        String what = ex.getMessage();
        CommandLine.Model.ArgSpec arg = ex.getArgSpec();
        if (ex.getCause() instanceof CommandLine.TypeConversionException && arg != null) {
            String label = arg.isOption() ? ((CommandLine.Model.OptionSpec) arg).longestName()
                    : arg.paramLabel();
            what = label + ": " + ex.getCause().getMessage();
        } else if (ex instanceof CommandLine.UnmatchedArgumentException) {
            List<String> close = ((CommandLine.UnmatchedArgumentException) ex).getSuggestions();
            List<String> unmatched = ((CommandLine.UnmatchedArgumentException) ex).getUnmatched();
            if (name.equals("scale") && (unmatched.contains("--from")
                    || unmatched.contains("--to"))) {
                what += " (scale takes --min and --max, as the scaling report does)";
            } else if (!close.isEmpty()) {
                what += " (did you mean " + String.join(" or ", close) + "?)";
            }
        }
        boolean top = line.getParent() == null;
        line.getErr().println("qsim-examples" + (top ? "" : " " + name) + ": " + what
                + "; see '" + (top ? "" : name + " ") + "--help'");
        line.getErr().flush();
        return EXIT_BAD_INPUT;
    }

    private static String message(Exception ex) {
        if (ex instanceof NoSuchFileException) {
            return "file not found: " + ex.getMessage();
        }
        if (ex instanceof UncheckedIOException && ex.getCause() instanceof NoSuchFileException) {
            return "file not found: " + ex.getCause().getMessage();
        }
        if (ex instanceof IOException || ex instanceof UncheckedIOException) {
            return "cannot read or write a file: " + ex.getMessage();
        }
        if (ex instanceof IllegalArgumentException || ex instanceof IllegalStateException) {
            return ex.getMessage();
        }
        return ex.toString();
    }

    /**
     * Prints the usage (no subcommand given).
     *
     * @return {@value #EXIT_BAD_INPUT}
     */
    @Override
    public Integer call() {
        spec.commandLine().usage(spec.commandLine().getErr());
        return EXIT_BAD_INPUT;
    }

    static void write(Path file, String text) throws IOException {
        Files.writeString(file, text, StandardCharsets.UTF_8);
    }

    /** Writes an SVG picture and says on standard error what was written. */
    static void writePicture(CommandLine.Model.CommandSpec spec, Path file, String svg,
            String what) throws IOException {
        write(file, svg);
        spec.commandLine().getErr().println("wrote " + file + " (" + what + ")");
        spec.commandLine().getErr().flush();
    }

    /** At most 60 characters of a user's text, for messages. */
    static String excerpt(String text) {
        return text.length() <= 60 ? text : text.substring(0, 57) + "...";
    }

    static String f(String format, Object... args) {
        return String.format(Locale.ROOT, format, args);
    }

    /** A count with its noun, plural when the count is not 1: "1 outcome", "2 outcomes". */
    static String count(long n, String noun) {
        return f("%,d %s", n, n == 1 ? noun : noun + "s");
    }

    /** The library's thread count: every available processor. */
    static int defaultThreads() {
        return Simulator.seeded(0).threads();
    }

    /** Output formats of a tally. */
    enum Format { table, csv, json }

    /** Prints a tally in a format. */
    static void printTally(PrintWriter out, Tally tally, Format format) {
        switch (format) {
            case csv:
                out.print(tally.toCsv());
                break;
            case json:
                out.print(TallyFiles.toJson(tally));
                break;
            default:
                int w = Math.max(4, tally.width());
                long max = 0;
                for (long c : tally.outcomes().values()) {
                    max = Math.max(max, c);
                }
                out.println(f("%-" + w + "s %10s %9s", "bits", "count", "freq"));
                for (Map.Entry<String, Long> e : tally.outcomes().entrySet()) {
                    int len = (int) Math.round(40.0 * e.getValue() / max);
                    out.println(f("%-" + w + "s %10d %9.4f  %s", e.getKey(), e.getValue(),
                            e.getValue() / (double) tally.shots(),
                            "#".repeat(Math.max(1, len))));
                }
                out.println(count(tally.shots(), "shot") + ", "
                        + count(tally.outcomes().size(), "distinct outcome"));
        }
        out.flush();
    }

    /** {@code run}: simulate a circuit file. */
    @Command(name = "run", mixinStandardHelpOptions = true,
            versionProvider = Cli.VersionText.class,
            description = "Runs an OpenQASM 3 circuit file for a number of shots and prints the"
                    + " tally of its classical bits.",
            footerHeading = "%nExamples:%n",
            footer = {
                "  java -jar qsim-examples.jar run qsim-examples/demo/bell.qasm \\",
                "      --shots 2000 --seed 7",
                "  java -jar qsim-examples.jar run circuit.qasm --format json > tally.json",
                "  java -jar qsim-examples.jar run circuit.qasm --svg histogram.svg",
                "  java -jar qsim-examples.jar run qsim-examples/demo/ghz5.qasm \\",
                "      --depolarizing 0.01 --readout-error 0.02",
                "  java -jar qsim-examples.jar run qsim-examples/demo/bell.qasm \\",
                "      --device qsim-examples/demo/longstone-pair.json",
                "  java -jar qsim-examples.jar run circuit.qasm --plan-only",
                "  java -jar qsim-examples.jar run circuit.qasm --budget-time 5min \\",
                "      --budget-memory 8GiB",
                "%nWith noise, circuits of up to 10 qubits that measure only at the end run on"
                        + " a density matrix, others by trajectories, one per shot.",
                "%nThe same seed gives the same tally. With --svg, bars of the exact"
                        + " prediction (with the same noise) stand beside the simulated"
                        + " frequencies where it can be computed; the picture's title gives the"
                        + " file, the seed and the noise."})
    static final class Run implements Callable<Integer> {
        @Spec
        CommandLine.Model.CommandSpec spec;
        @CommandLine.Mixin
        CircuitOptions circuitOptions = new CircuitOptions();
        @Parameters(paramLabel = "FILE", description = "the OpenQASM 3 circuit file")
        Path file;
        @Option(names = "--shots", defaultValue = "1000", paramLabel = "N",
                converter = OptionValues.Shots.class,
                description = "number of shots, 1 to 10,000,000 (default ${DEFAULT-VALUE})")
        int shots;
        @Option(names = "--seed", defaultValue = "1", converter = OptionValues.Seed.class,
                description = "seed of the simulation, any 64-bit whole number (default"
                        + " ${DEFAULT-VALUE})")
        long seed;
        @Option(names = "--format", defaultValue = "table", paramLabel = "F",
                converter = OptionValues.TallyFormat.class,
                description = "table, csv or json (default ${DEFAULT-VALUE})")
        Format format;
        @Option(names = "--svg", paramLabel = "OUT.svg",
                description = "also write the tally as an SVG histogram")
        Path svg;
        @Option(names = "--threads", paramLabel = "T", converter = OptionValues.Threads.class,
                description = "threads of the simulation, 1 to 256 (default: every available"
                        + " processor, as the library)")
        Integer threads;
        @CommandLine.Mixin
        NoiseOptions noise = new NoiseOptions();
        @Option(names = "--precision", defaultValue = "double", paramLabel = "double|single",
                converter = OptionValues.Storage.class,
                description = "how amplitudes are stored; single halves the memory (31 qubits"
                        + " in 16 GiB) at about seven digits (default ${DEFAULT-VALUE};"
                        + " noiseless runs only)")
        Precision precision;
        @CommandLine.Mixin
        RunBudget budget = new RunBudget();

        /** The thread count of the run: {@code --threads}, or the library's default. */
        int threads() {
            return threads == null ? defaultThreads() : threads;
        }

        @Override
        public Integer call() throws IOException {
            boolean noisy = noise.noisy();
            if (precision == Precision.SINGLE && noisy) {
                throw new IllegalArgumentException("--precision single applies to noiseless runs;"
                        + " noisy runs (--depolarizing, --readout-error, --device) are in double"
                        + " precision");
            }
            noise.check();
            FileChecks.requireInput(file, "a circuit file (OpenQASM 3, .qasm)");
            if (svg != null) {
                FileChecks.requireOutput(svg, "--svg");
            }
            Circuit c = circuitOptions.read(file);
            if (c.clbits() == 0) {
                throw new IllegalArgumentException(file + ": the circuit declares no bit to"
                        + " measure into; add 'bit[n] c;' and 'c = measure q;'");
            }
            int t = threads();
            NoiseModel model = noise.model(c, file);
            Simulator sim = Simulator.seeded(seed).withThreads(t);
            if (noisy) {
                sim = sim.withNoise(model);
            } else {
                sim = sim.withPrecision(precision);
            }
            Progress progress = budget.check(spec, file, c, sim, shots, "running "
                    + count(shots, "shot"));
            if (progress == null) {
                return EXIT_OK; // --plan-only: the forecast was printed
            }
            Tally tally;
            try {
                tally = sim.run(c, shots);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(file + ": " + e.getMessage(), e);
            } catch (IllegalStateException e) {
                throw new IllegalArgumentException(file + ": " + HeapAdvice.message(c, sim, shots,
                        e), e);
            } finally {
                progress.close();
            }
            printTally(spec.commandLine().getOut(), tally, format);
            if (svg != null) {
                double[] predicted = null;
                if (c.clbits() <= MAX_PICTURE_CLBITS) {
                    try {
                        predicted = Simulator.seeded(seed).withThreads(t).withNoise(model)
                                .distribution(c);
                    } catch (IllegalArgumentException e) {
                        predicted = null; // too large for an exact prediction: bars alone
                    }
                }
                SvgHistogram.Picture picture = SvgHistogram.draw(tally, predicted,
                        file.getFileName() + ", seed " + seed + ", " + noise.describe(),
                        "simulated", noisy ? "noisy" : "ideal");
                writePicture(spec, svg, picture.svg(), picture.summary());
            }
            return EXIT_OK;
        }
    }

    /** A number as typed: {@code 0.01}, not {@code 1.0E-2}. */
    static String plain(double x) {
        return java.math.BigDecimal.valueOf(x).stripTrailingZeros().toPlainString();
    }

    /** {@code state}: amplitudes or probabilities. */
    @Command(name = "state", mixinStandardHelpOptions = true,
            versionProvider = Cli.VersionText.class,
            description = "Prints the state vector (or the probabilities) that a circuit's"
                    + " gates make from |0...0>, leaving out measurements at its end.",
            footerHeading = "%nExamples:%n",
            footer = {
                "  java -jar qsim-examples.jar state qsim-examples/demo/bell.qasm",
                "  java -jar qsim-examples.jar state qsim-examples/demo/bell.qasm -p",
                "  java -jar qsim-examples.jar state qsim-examples/demo/teleport.qasm",
                "%nOnly basis states whose probability exceeds --cutoff are listed; circuits of"
                        + " up to 16 qubits. A circuit that uses measured values during the"
                        + " shot (mid-circuit measurement, reset, conditions) has no one final"
                        + " state: its classical bits' exact distribution is printed instead."})
    static final class State implements Callable<Integer> {
        @Spec
        CommandLine.Model.CommandSpec spec;
        @CommandLine.Mixin
        CircuitOptions circuitOptions = new CircuitOptions();
        @Parameters(paramLabel = "FILE", description = "the OpenQASM 3 circuit file")
        Path file;
        @Option(names = {"-p", "--probabilities"}, description = "print probabilities only")
        boolean probabilities;
        @Option(names = "--cutoff", defaultValue = "1e-12", paramLabel = "P",
                converter = OptionValues.Cutoff.class,
                description = "hide basis states of this probability or less, from 0 up to"
                        + " (not including) 1 (default ${DEFAULT-VALUE})")
        double cutoff;

        @Override
        public Integer call() throws IOException {
            Circuit c = circuitOptions.read(file);
            if (c.qubits() > MAX_STATE_QUBITS) {
                throw new IllegalArgumentException(file + ": 'state' prints circuits of at most "
                        + MAX_STATE_QUBITS + " qubits but this one has " + c.qubits());
            }
            PrintWriter out = spec.commandLine().getOut();
            if (!c.measuresAtEnd()) {
                return printRegister(out, c);
            }
            StateVector s;
            try {
                s = StateVector.zero(c.qubits()).apply(c.withoutMeasurements());
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(file + ": " + e.getMessage(), e);
            }
            int n = c.qubits();
            int w = Math.max(n, 5);
            out.println(probabilities ? f("%-" + w + "s %12s", "basis", "probability")
                    : f("%-" + w + "s %12s %12s %12s", "basis", "real", "imaginary",
                    "probability"));
            int shown = 0;
            for (long i = 0; i < s.dimension(); i++) {
                double p = s.probability(i);
                if (p <= cutoff) {
                    continue;
                }
                shown++;
                String bits = bits(i, n);
                if (probabilities) {
                    out.println(f("%-" + w + "s %12.8f", bits, p));
                } else {
                    Complex a = s.amplitude(i);
                    out.println(f("%-" + w + "s %+12.8f %+12.8f %12.8f", bits, a.getReal(),
                            a.getImaginary(), p));
                }
            }
            out.println(f("%d of %s shown", shown, count(s.dimension(), "basis state")));
            out.flush();
            return EXIT_OK;
        }

        /**
         * A circuit that uses measured values has no one final state: prints the exact
         * distribution of its classical register instead.
         */
        private int printRegister(PrintWriter out, Circuit c) {
            double[] p;
            try {
                p = Simulator.seeded(0).distribution(c);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(file + ": " + e.getMessage(), e);
            }
            int w = Math.max(c.clbits(), 8);
            out.println("The circuit uses measured values during the shot, so its final state"
                    + " depends on the outcomes. The exact distribution of its classical bits,"
                    + " summed over the measurement branches:");
            out.println(f("%-" + w + "s %12s", "register", "probability"));
            int shown = 0;
            for (int v = 0; v < p.length; v++) {
                if (p[v] > cutoff) {
                    shown++;
                    out.println(f("%-" + w + "s %12.8f", bits(v, c.clbits()), p[v]));
                }
            }
            out.println(f("%d of %s shown", shown, count(p.length, "register value")));
            out.flush();
            return EXIT_OK;
        }
    }

    static String bits(long value, int width) {
        char[] ch = new char[width];
        for (int j = 0; j < width; j++) {
            ch[width - 1 - j] = ((value >>> j) & 1) == 1 ? '1' : '0';
        }
        return new String(ch);
    }

    /** {@code draw}: text or SVG diagram. */
    @Command(name = "draw", mixinStandardHelpOptions = true,
            versionProvider = Cli.VersionText.class,
            description = "Draws a circuit file as text, or as an SVG picture with --svg.",
            footerHeading = "%nExamples:%n",
            footer = {
                "  java -jar qsim-examples.jar draw qsim-examples/demo/teleport.qasm",
                "  java -jar qsim-examples.jar draw qsim-examples/demo/teleport.qasm \\",
                "      --svg teleport.svg",
                "%nSymbols: a control is a filled dot, a NOT target a circled plus, the ends of"
                        + " a swap two crosses (Nielsen and Chuang 2010, section 4.3). In the SVG"
                        + " picture each classical bit has a thin line of its own; a measurement"
                        + " is a gauge on its qubit tagged with the bit it writes (->c2), and"
                        + " gates run only when a bit has a value stand in a dashed frame tagged"
                        + " with the condition (if c1=1).",
                "%nThe text uses UTF-8 symbols. barrier statements are read but not kept: the"
                        + " circuit model has no barrier, so no drawing shows one."})
    static final class Draw implements Callable<Integer> {
        @Spec
        CommandLine.Model.CommandSpec spec;
        @CommandLine.Mixin
        CircuitOptions circuitOptions = new CircuitOptions();
        @Parameters(paramLabel = "FILE", description = "the OpenQASM 3 circuit file")
        Path file;
        @Option(names = "--svg", paramLabel = "OUT.svg",
                description = "write an SVG picture instead of printing text")
        Path svg;

        @Override
        public Integer call() throws IOException {
            FileChecks.requireInput(file, "a circuit file (OpenQASM 3, .qasm)");
            if (svg != null) {
                FileChecks.requireOutput(svg, "--svg");
            }
            Circuit c = circuitOptions.read(file);
            if (svg != null) {
                writePicture(spec, svg, SvgCircuit.draw(c, file.getFileName().toString()),
                        "circuit of " + SvgCircuit.summary(c));
            } else {
                spec.commandLine().getOut().println(c.diagram());
                spec.commandLine().getOut().flush();
            }
            return EXIT_OK;
        }
    }

    /** {@code compare}: a tally file against a circuit's prediction. */
    @Command(name = "compare", mixinStandardHelpOptions = true,
            versionProvider = Cli.VersionText.class,
            description = "Checks a device's tally file (CSV 'bits,count' or JSON) against what"
                    + " a circuit file should give on a device like it: the distance between"
                    + " the tally and the prediction (ideal, or with the noise given), its"
                    + " confidence interval, and a verdict against a tolerance; with --fit, the"
                    + " device's error rates fitted to the tally.",
            footerHeading = "%nExamples:%n",
            footer = {
                "  java -jar qsim-examples.jar compare qsim-examples/demo/bell-pallet.json \\",
                "      --circuit qsim-examples/demo/bell.qasm",
                "  java -jar qsim-examples.jar compare qsim-examples/demo/ghz5-pallet.csv \\",
                "      --circuit qsim-examples/demo/ghz5.qasm \\",
                "      --device qsim-examples/demo/skerryvore-line5.json",
                "  java -jar qsim-examples.jar compare qsim-examples/demo/ghz5-pallet.csv \\",
                "      --circuit qsim-examples/demo/ghz5.qasm --fit depolarizing2,readout",
                "  java -jar qsim-examples.jar compare tally.csv --circuit c.qasm \\",
                "      --tolerance 0.02 --require-match --svg check.svg",
                "%nThe distance is the total variation distance: the largest difference, over"
                        + " all sets of outcomes, between the tally's frequency and the predicted"
                        + " probability. The tally passes when the upper end of the distance's"
                        + " interval at --confidence is at most --tolerance (an equivalence test,"
                        + " Wellek 2010). Goodness-of-fit p-values and shots on outcomes the"
                        + " prediction forbids are reported for information.",
                "%nThe prediction is exact where the engines can compute it (the final state,"
                        + " one density matrix, or a sum over measurement branches for circuits"
                        + " that use measured values); otherwise it is estimated from"
                        + " --prediction-shots simulated shots, and the interval accounts for"
                        + " their sampling error.",
                "%n--fit KINDS fits error rates by maximum likelihood with likelihood-ratio"
                        + " intervals (circuits of up to 10 qubits). KINDS is 'scale' (one"
                        + " factor on the rates of --depolarizing and --readout-error) or a"
                        + " comma list of depolarizing1, depolarizing2, readout,"
                        + " readout1given0, readout0given1 (the other rates fixed at the"
                        + " options' values)."})
    static final class Compare implements Callable<Integer> {
        @Spec
        CommandLine.Model.CommandSpec spec;
        @CommandLine.Mixin
        CircuitOptions circuitOptions = new CircuitOptions();
        @Parameters(paramLabel = "TALLY", description = "the tally file, CSV or JSON")
        Path tallyFile;
        @Option(names = "--circuit", required = true, paramLabel = "FILE",
                description = "the OpenQASM 3 circuit the device ran")
        Path circuitFile;
        @CommandLine.Mixin
        NoiseOptions noise = new NoiseOptions();
        @Option(names = "--tolerance", paramLabel = "D", converter = OptionValues.Tolerance.class,
                description = "the largest distance that passes, above 0 and at most 1"
                        + " (default 0.05: no set of outcomes off by more than 5 points)")
        Double tolerance;
        @Option(names = "--confidence", paramLabel = "C",
                converter = OptionValues.Confidence.class,
                description = "confidence level of the distance's interval, between 0.5 and 1"
                        + " (default 0.95)")
        Double confidence;
        @Option(names = "--seed", defaultValue = "1", converter = OptionValues.Seed.class,
                description = "seed of the interval's simulated tallies and of a sampled"
                        + " prediction (default ${DEFAULT-VALUE})")
        long seed;
        @Option(names = "--resamples", paramLabel = "N", converter = OptionValues.Resamples.class,
                description = "simulated tallies per candidate distance, 20 to 1,000,000"
                        + " (default 400)")
        Integer resamples;
        @Option(names = "--prediction-shots", defaultValue = "100000", paramLabel = "M",
                converter = OptionValues.PredictionShots.class,
                description = "shots of a sampled prediction, when no exact one can be"
                        + " computed, 1 to 10,000,000 (default ${DEFAULT-VALUE})")
        int predictionShots;
        @Option(names = "--fit", paramLabel = "KINDS", converter = OptionValues.FitKinds.class,
                description = "also fit error rates to the tally: 'scale' or a comma list of"
                        + " kinds (see below)")
        FitRequest fit;
        @Option(names = "--threads", paramLabel = "T", converter = OptionValues.Threads.class,
                description = "threads, 1 to 256 (default: every available processor)")
        Integer threads;
        @Option(names = "--top", defaultValue = "8", paramLabel = "K",
                converter = OptionValues.Top.class,
                description = "how many deviating outcomes to list, 0 to 1,000 (default"
                        + " ${DEFAULT-VALUE})")
        int top;
        @Option(names = "--require-match",
                description = "exit with code 1 when the tally does not pass")
        boolean requireMatch;
        @Option(names = "--svg", paramLabel = "OUT.svg",
                description = "also write measured and predicted as an SVG histogram")
        Path svg;

        @Override
        public Integer call() throws IOException {
            noise.check();
            FileChecks.requireInput(tallyFile, "a tally file (CSV 'bits,count' or JSON)");
            FileChecks.requireInput(circuitFile, "a circuit file (OpenQASM 3, .qasm)");
            if (svg != null) {
                FileChecks.requireOutput(svg, "--svg");
            }
            ComparisonSettings settings = ComparisonSettings.defaults().withSeed(seed);
            if (tolerance != null) {
                settings = settings.withTolerance(tolerance);
            }
            if (confidence != null) {
                settings = settings.withConfidence(confidence);
            }
            if (resamples != null) {
                settings = settings.withResamples(resamples);
            }
            int t = threads == null ? defaultThreads() : threads;
            settings = settings.withThreads(t);
            NoiseFamily family = fit == null ? null : fit.family(noise);
            Tally tally = TallyFiles.read(tallyFile);
            Circuit c = circuitOptions.read(circuitFile);
            if (c.clbits() != tally.width()) {
                throw new IllegalArgumentException(tallyFile + " has outcomes of "
                        + tally.width() + " bits but " + circuitFile + " predicts outcomes of "
                        + c.clbits() + " bits");
            }
            NoiseModel model = noise.model(c, circuitFile);
            Simulator sim = Simulator.seeded(seed).withThreads(t).withNoise(model);
            Simulator.Prediction prediction;
            TallyComparison cmp;
            Progress progress = Progress.start(spec.commandLine().getErr(), "comparing");
            try {
                prediction = sim.predict(c, predictionShots);
                settings = settings.withPredictionShots(prediction.samples());
                cmp = TallyComparison.of(tally, prediction.probabilities(), settings);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(circuitFile + ": " + e.getMessage(), e);
            } catch (IllegalStateException e) {
                throw new IllegalArgumentException(circuitFile + ": " + HeapAdvice.message(c, sim,
                        predictionShots, e), e);
            } finally {
                progress.close();
            }
            PrintWriter out = spec.commandLine().getOut();
            out.println("tally       " + tallyFile);
            out.println("circuit     " + circuitFile);
            out.println("noise       " + noise.describe());
            out.println("prediction  " + prediction.method());
            out.print(cmp.report(top));
            out.flush();
            if (family != null) {
                FittedNoise fitted;
                Progress fitting = Progress.start(spec.commandLine().getErr(), "fitting");
                try {
                    fitted = NoiseFit.of(family).withThreads(t).fit(c, tally);
                } catch (IllegalArgumentException e) {
                    throw new IllegalArgumentException("--fit: " + e.getMessage(), e);
                } finally {
                    fitting.close();
                }
                out.println();
                out.print(fitted.report());
                out.flush();
            }
            if (svg != null) {
                SvgHistogram.Picture picture = SvgHistogram.draw(tally,
                        c.clbits() <= MAX_PICTURE_CLBITS ? prediction.probabilities() : null,
                        tallyFile.getFileName() + " vs " + circuitFile.getFileName() + ", "
                        + noise.describe() + f(" (distance %.3f, %s at tolerance %s)",
                        cmp.distance(), cmp.passes() ? "pass" : "fail",
                        plain(cmp.tolerance())), "measured", noise.noisy() ? "noisy" : "ideal");
                writePicture(spec, svg, picture.svg(), picture.summary());
            }
            return requireMatch && !cmp.passes() ? EXIT_MISMATCH : EXIT_OK;
        }
    }

    /** What {@code --fit} asks for: one scale of the given rates, or kinds of rates. */
    record FitRequest(boolean scale, List<ErrorKind> kinds) {
        /** The family to fit, given the noise options. */
        NoiseFamily family(NoiseOptions noise) {
            if (noise.device != null) {
                throw new IllegalArgumentException("--fit fits uniform error rates and cannot"
                        + " start from --device; give the starting rates with --depolarizing and"
                        + " --readout-error (or none)");
            }
            if (scale) {
                if (noise.depolarizing == 0 && noise.readoutError == 0) {
                    throw new IllegalArgumentException("--fit scale multiplies the rates of"
                            + " --depolarizing and --readout-error, and both are 0; give them,"
                            + " or fit kinds such as --fit depolarizing2,readout");
                }
                return NoiseFamily.scaled(noise.rates());
            }
            return NoiseFamily.ofKinds(noise.rates(), kinds.toArray(new ErrorKind[0]));
        }
    }

    /** {@code scale}: time per gate against qubit count. */
    @Command(name = "scale", mixinStandardHelpOptions = true,
            versionProvider = Cli.VersionText.class,
            description = "Times Hadamard layers on states of growing size and prints the time"
                    + " per gate against the qubit count (a quick scaling report; qsim-bench has"
                    + " the careful one, ScalingReport, with the same --min and --max).",
            footerHeading = "%nExamples:%n",
            footer = {
                "  java -jar qsim-examples.jar scale",
                "  java -jar qsim-examples.jar scale --min 10 --max 24 --threads 2"})
    static final class Scale implements Callable<Integer> {
        @Spec
        CommandLine.Model.CommandSpec spec;
        @Option(names = "--min", defaultValue = "4", paramLabel = "N",
                converter = OptionValues.ScaleQubits.class,
                description = "smallest qubit count, 1 to 30 (default ${DEFAULT-VALUE})")
        int min;
        @Option(names = "--max", defaultValue = "20", paramLabel = "N",
                converter = OptionValues.ScaleQubits.class,
                description = "largest qubit count, 1 to 30 (default ${DEFAULT-VALUE})")
        int max;
        @Option(names = "--threads", paramLabel = "T", converter = OptionValues.Threads.class,
                description = "threads of the state, 1 to 256 (default: every available"
                        + " processor, as the library)")
        Integer threads;
        @Option(names = "--format", defaultValue = "table", paramLabel = "F",
                converter = OptionValues.TableFormat.class,
                description = "table or csv (default ${DEFAULT-VALUE})")
        String format;

        /** The thread count of the states: {@code --threads}, or the library's default. */
        int threads() {
            return threads == null ? defaultThreads() : threads;
        }

        @Override
        public Integer call() {
            if (min > max) {
                throw new IllegalArgumentException("--min " + min + " is greater than --max "
                        + max + "; give --min at most --max");
            }
            int t = threads();
            boolean csv = format.equals("csv");
            PrintWriter out = spec.commandLine().getOut();
            // Which loops the times are of; on standard error with CSV, so the file stays data.
            PrintWriter note = csv ? spec.commandLine().getErr() : out;
            note.println("kernels: " + Simulator.kernels());
            out.println(csv ? "qubits,gates,ns_per_gate,ns_per_amplitude"
                    : f("%6s %8s %14s %18s", "qubits", "gates", "ns per gate",
                    "ns per amplitude"));
            try (Progress p = Progress.start(spec.commandLine().getErr(), "timing", max - min
                    + 1)) {
                for (int n = min; n <= max; n++) {
                    Circuit.Builder b = Circuit.builder(n, 0);
                    for (int q = 0; q < n; q++) {
                        b.h(q);
                    }
                    Circuit layer = b.build();
                    StateVector s = StateVector.zero(n).setThreads(t);
                    long warm = System.nanoTime();
                    // Warm-up, so the timing sees compiled code: longer at the first size, since
                    // the vector loops run about 100 times slower until the JIT compiles them.
                    long warmUp = n == min ? 400_000_000L : 20_000_000L;
                    do {
                        s.apply(layer);
                    } while (System.nanoTime() - warm < warmUp);
                    long gates = 0;
                    long start = System.nanoTime();
                    long budget = 50_000_000L; // 50 ms per size
                    do {
                        s.apply(layer);
                        gates += n;
                    } while (System.nanoTime() - start < budget);
                    double perGate = (System.nanoTime() - start) / (double) gates;
                    out.println(csv ? f("%d,%d,%.1f,%.4f", n, gates, perGate,
                            perGate / Math.pow(2, n))
                            : f("%6d %8d %14.1f %18.4f", n, gates, perGate,
                            perGate / Math.pow(2, n)));
                    out.flush();
                    p.step();
                }
            }
            return EXIT_OK;
        }
    }
}
