package dev.qsim.examples.cli;

import java.io.IOException;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
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
import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;
import dev.qsim.stats.TallyComparison;
import dev.qsim.stats.TallyFiles;
import dev.qsim.text.QasmReader;

/**
 * The command-line tool: runs OpenQASM 3 circuit files, prints states, draws circuits and
 * compares a device's tally file with a circuit's ideal prediction. {@code Main} hands it the
 * arguments when the first one is a subcommand name ({@link #COMMANDS}).
 *
 * <p>Exit codes: {@value #EXIT_OK} success, {@value #EXIT_MISMATCH} a comparison failed and
 * {@code --require-match} was given, {@value #EXIT_BAD_INPUT} bad input (unknown option, bad
 * value, unreadable or malformed file).
 */
@Command(name = "java -jar qsim-examples.jar", mixinStandardHelpOptions = true,
        version = "qsim-examples tool 0.2",
        description = "Runs, draws and checks circuits written in OpenQASM 3.",
        subcommands = {Cli.Run.class, Cli.State.class, Cli.Draw.class, Cli.Compare.class,
            Cli.Scale.class})
public final class Cli implements Callable<Integer> {

    /** Exit code of success. */
    public static final int EXIT_OK = 0;
    /** Exit code of a comparison that failed when asked to gate on it. */
    public static final int EXIT_MISMATCH = 1;
    /** Exit code of bad input. */
    public static final int EXIT_BAD_INPUT = 2;
    /** The subcommand names. */
    public static final Set<String> COMMANDS = Set.of("run", "state", "draw", "compare", "scale");
    /** The most shots one run takes. */
    public static final int MAX_SHOTS = 10_000_000;
    /** The most qubits whose state {@code state} prints. */
    public static final int MAX_STATE_QUBITS = 16;

    @Spec
    private CommandLine.Model.CommandSpec spec;

    private Cli() {
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
        cl.setExecutionExceptionHandler((ex, line, parsed) -> {
            String name = line.getCommandName();
            line.getErr().println("qsim-examples " + name + ": " + message(ex));
            line.getErr().flush();
            return EXIT_BAD_INPUT;
        });
        int code = cl.execute(args);
        o.flush();
        e.flush();
        return code;
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

    static Circuit readCircuit(Path file) throws IOException {
        try {
            return QasmReader.read(file);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(file + ": " + e.getMessage(), e);
        }
    }

    static void write(Path file, String text) throws IOException {
        Files.writeString(file, text, StandardCharsets.UTF_8);
    }

    static String f(String format, Object... args) {
        return String.format(Locale.ROOT, format, args);
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
                out.println(f("%d shots, %d distinct outcomes", tally.shots(),
                        tally.outcomes().size()));
        }
        out.flush();
    }

    /** {@code run}: simulate a circuit file. */
    @Command(name = "run", mixinStandardHelpOptions = true,
            description = "Runs an OpenQASM 3 circuit file for a number of shots and prints the"
                    + " tally of its classical bits.",
            footerHeading = "%nExamples:%n",
            footer = {
                "  java -jar qsim-examples.jar run qsim-examples/demo/bell.qasm --shots 2000"
                        + " --seed 7",
                "  java -jar qsim-examples.jar run circuit.qasm --format json > tally.json",
                "  java -jar qsim-examples.jar run circuit.qasm --svg histogram.svg",
                "  java -jar qsim-examples.jar run qsim-examples/demo/ghz5.qasm --depolarizing"
                        + " 0.01 --readout-error 0.02",
                "%nWith noise, circuits of up to 10 qubits that measure only at the end run on"
                        + " a density matrix, others by trajectories, one per shot.",
                "%nThe same seed gives the same tally. With --svg, bars of the ideal"
                        + " probabilities stand beside the measured frequencies when the circuit"
                        + " measures only at the end."})
    static final class Run implements Callable<Integer> {
        @Spec
        CommandLine.Model.CommandSpec spec;
        @Parameters(paramLabel = "FILE", description = "the OpenQASM 3 circuit file")
        Path file;
        @Option(names = "--shots", defaultValue = "1000",
                description = "number of shots, 1 to 10,000,000 (default ${DEFAULT-VALUE})")
        int shots;
        @Option(names = "--seed", defaultValue = "1",
                description = "seed of the simulation (default ${DEFAULT-VALUE})")
        long seed;
        @Option(names = "--format", defaultValue = "table",
                description = "table, csv or json (default ${DEFAULT-VALUE})")
        Format format;
        @Option(names = "--svg", paramLabel = "OUT.svg",
                description = "also write the tally as an SVG histogram")
        Path svg;
        @Option(names = "--threads", defaultValue = "1",
                description = "threads of the simulation (default ${DEFAULT-VALUE})")
        int threads;
        @Option(names = "--depolarizing", defaultValue = "0", paramLabel = "P",
                description = "noise: a depolarizing channel of probability P after every one-"
                        + "and two-qubit gate (default ${DEFAULT-VALUE}: none)")
        double depolarizing;
        @Option(names = "--readout-error", defaultValue = "0", paramLabel = "P",
                description = "noise: each measured bit reads wrong with probability P"
                        + " (default ${DEFAULT-VALUE}: none)")
        double readoutError;
        @Option(names = "--precision", defaultValue = "double",
                description = "double or single: how amplitudes are stored; single halves the"
                        + " memory (31 qubits in 16 GiB) at about seven digits (default"
                        + " ${DEFAULT-VALUE}; noiseless runs only)")
        String precision;

        @Override
        public Integer call() throws IOException {
            final Precision storage;
            if (precision.equals("double")) {
                storage = Precision.DOUBLE;
            } else if (precision.equals("single")) {
                storage = Precision.SINGLE;
            } else {
                throw new IllegalArgumentException("--precision must be double or single but was '"
                        + precision + "'");
            }
            if (storage == Precision.SINGLE && (depolarizing != 0 || readoutError != 0)) {
                throw new IllegalArgumentException("--precision single applies to noiseless runs;"
                        + " noisy runs (--depolarizing, --readout-error) are in double precision");
            }
            if (shots < 1 || shots > MAX_SHOTS) {
                throw new IllegalArgumentException("--shots must be from 1 to " + MAX_SHOTS
                        + " but was " + shots);
            }
            Circuit c = readCircuit(file);
            if (c.clbits() == 0) {
                throw new IllegalArgumentException(file + ": the circuit declares no bit to"
                        + " measure into; add 'bit[n] c;' and 'c = measure q;'");
            }
            Tally tally;
            Progress progress = Progress.start(spec.commandLine().getErr(), "running " + shots
                    + " shots");
            try {
                if (depolarizing != 0 || readoutError != 0) {
                    tally = noisyRun(c, depolarizing, readoutError, seed, threads, shots);
                } else {
                    tally = Simulator.seeded(seed).withThreads(threads).withPrecision(storage)
                            .run(c, shots);
                }
            } finally {
                progress.close();
            }
            printTally(spec.commandLine().getOut(), tally, format);
            if (svg != null) {
                double[] predicted = null;
                try {
                    predicted = Simulator.seeded(seed).withThreads(threads).distribution(c);
                } catch (IllegalArgumentException e) {
                    predicted = null; // mid-circuit measurement: no exact prediction to draw
                }
                write(svg, SvgHistogram.draw(tally, predicted, file.getFileName()
                        + ", " + shots + " shots, seed " + seed));
            }
            return EXIT_OK;
        }
    }

    /**
     * Runs with the noise options on the engine the simulator picks (a density matrix when the
     * circuit is small and measures only at the end, otherwise Monte Carlo trajectories).
     */
    private static Tally noisyRun(Circuit c, double depolarizing, double readoutError, long seed,
            int threads, int shots) {
        NoiseModel model = NoiseModel.builder()
                .afterOneQubitGates(Channel.depolarizing(depolarizing))
                .afterTwoQubitGates(Channel.twoQubitDepolarizing(depolarizing))
                .readoutError(readoutError, readoutError)
                .build();
        return Simulator.seeded(seed).withThreads(threads).withNoise(model).run(c, shots);
    }

    /** {@code state}: amplitudes or probabilities. */
    @Command(name = "state", mixinStandardHelpOptions = true,
            description = "Prints the state vector (or the probabilities) that a circuit's"
                    + " gates make from |0...0>, leaving out measurements at its end.",
            footerHeading = "%nExamples:%n",
            footer = {
                "  java -jar qsim-examples.jar state qsim-examples/demo/bell.qasm",
                "  java -jar qsim-examples.jar state qsim-examples/demo/bell.qasm -p",
                "%nOnly basis states whose probability exceeds --cutoff are listed; circuits of"
                        + " up to 16 qubits."})
    static final class State implements Callable<Integer> {
        @Spec
        CommandLine.Model.CommandSpec spec;
        @Parameters(paramLabel = "FILE", description = "the OpenQASM 3 circuit file")
        Path file;
        @Option(names = {"-p", "--probabilities"}, description = "print probabilities only")
        boolean probabilities;
        @Option(names = "--cutoff", defaultValue = "1e-12",
                description = "hide basis states of smaller probability (default"
                        + " ${DEFAULT-VALUE})")
        double cutoff;

        @Override
        public Integer call() throws IOException {
            if (!(cutoff >= 0 && cutoff < 1)) {
                throw new IllegalArgumentException("--cutoff must be in [0, 1) but was "
                        + cutoff);
            }
            Circuit c = readCircuit(file);
            if (c.qubits() > MAX_STATE_QUBITS) {
                throw new IllegalArgumentException(file + ": 'state' prints circuits of at most "
                        + MAX_STATE_QUBITS + " qubits but this one has " + c.qubits());
            }
            StateVector s;
            try {
                s = StateVector.zero(c.qubits()).apply(c.withoutMeasurements());
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(file + ": " + e.getMessage(), e);
            }
            PrintWriter out = spec.commandLine().getOut();
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
            out.println(f("%d of %d basis states shown", shown, s.dimension()));
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
            description = "Draws a circuit file as text, or as an SVG picture with --svg.",
            footerHeading = "%nExamples:%n",
            footer = {
                "  java -jar qsim-examples.jar draw qsim-examples/demo/teleport.qasm",
                "  java -jar qsim-examples.jar draw qsim-examples/demo/teleport.qasm --svg t.svg"})
    static final class Draw implements Callable<Integer> {
        @Spec
        CommandLine.Model.CommandSpec spec;
        @Parameters(paramLabel = "FILE", description = "the OpenQASM 3 circuit file")
        Path file;
        @Option(names = "--svg", paramLabel = "OUT.svg",
                description = "write an SVG picture instead of printing text")
        Path svg;

        @Override
        public Integer call() throws IOException {
            Circuit c = readCircuit(file);
            PrintWriter out = spec.commandLine().getOut();
            if (svg != null) {
                write(svg, SvgCircuit.draw(c, file.getFileName().toString()));
                out.println("wrote " + svg);
            } else {
                out.println(c.diagram());
            }
            out.flush();
            return EXIT_OK;
        }
    }

    /** {@code compare}: a tally file against a circuit's prediction. */
    @Command(name = "compare", mixinStandardHelpOptions = true,
            description = "Compares a tally file (CSV 'bits,count' or JSON) with the ideal"
                    + " outcome probabilities of a circuit file: total variation distance with a"
                    + " bootstrap interval, Hellinger fidelity, chi-square and G-test p-values,"
                    + " and the outcomes that deviate most.",
            footerHeading = "%nExamples:%n",
            footer = {
                "  java -jar qsim-examples.jar compare qsim-examples/demo/ghz5-marlin.csv"
                        + " --circuit qsim-examples/demo/ghz5.qasm",
                "  java -jar qsim-examples.jar compare tally.json --circuit c.qasm --alpha 0.05"
                        + " --require-match",
                "  java -jar qsim-examples.jar compare tally.csv --circuit c.qasm --svg fit.svg",
                "%nWith --require-match the exit code is 1 when the tally does not agree with"
                        + " the prediction at --alpha."})
    static final class Compare implements Callable<Integer> {
        @Spec
        CommandLine.Model.CommandSpec spec;
        @Parameters(paramLabel = "TALLY", description = "the tally file, CSV or JSON")
        Path tallyFile;
        @Option(names = "--circuit", required = true, paramLabel = "FILE",
                description = "the OpenQASM 3 circuit whose prediction to compare with")
        Path circuitFile;
        @Option(names = "--alpha", defaultValue = "0.01",
                description = "significance level of the tests (default ${DEFAULT-VALUE})")
        double alpha;
        @Option(names = "--seed", defaultValue = "1",
                description = "seed of the bootstrap (default ${DEFAULT-VALUE})")
        long seed;
        @Option(names = "--resamples", defaultValue = "1000",
                description = "bootstrap resamples (default ${DEFAULT-VALUE})")
        int resamples;
        @Option(names = "--top", defaultValue = "8",
                description = "how many deviating outcomes to list (default ${DEFAULT-VALUE})")
        int top;
        @Option(names = "--require-match",
                description = "exit with code 1 when the comparison fails")
        boolean requireMatch;
        @Option(names = "--svg", paramLabel = "OUT.svg",
                description = "also write measured and predicted as an SVG histogram")
        Path svg;

        @Override
        public Integer call() throws IOException {
            if (!(alpha > 0 && alpha < 1)) {
                throw new IllegalArgumentException("--alpha must be in (0, 1) but was " + alpha);
            }
            if (top < 0) {
                throw new IllegalArgumentException("--top must be at least 0 but was " + top);
            }
            Tally tally = TallyFiles.read(tallyFile);
            Circuit c = readCircuit(circuitFile);
            double[] predicted;
            try {
                predicted = Simulator.seeded(seed).distribution(c);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(circuitFile + ": " + e.getMessage(), e);
            }
            int width = Integer.numberOfTrailingZeros(predicted.length);
            if (width != tally.width()) {
                throw new IllegalArgumentException(tallyFile + " has outcomes of "
                        + tally.width() + " bits but " + circuitFile + " predicts outcomes of "
                        + width + " bits");
            }
            TallyComparison cmp;
            Progress progress = Progress.start(spec.commandLine().getErr(), "comparing");
            try {
                cmp = TallyComparison.of(tally, predicted, seed, resamples, 0.95);
            } finally {
                progress.close();
            }
            PrintWriter out = spec.commandLine().getOut();
            out.println("tally    " + tallyFile);
            out.println("circuit  " + circuitFile);
            out.print(cmp.report(alpha, top));
            out.flush();
            if (svg != null) {
                write(svg, SvgHistogram.draw(tally, predicted, tallyFileName() + " vs "
                        + circuitFile.getFileName() + f(" (TVD %.3f, %s at alpha %s)",
                        cmp.totalVariation(), cmp.passes(alpha) ? "pass" : "fail", alpha)));
            }
            return requireMatch && !cmp.passes(alpha) ? EXIT_MISMATCH : EXIT_OK;
        }

        private String tallyFileName() {
            return String.valueOf(tallyFile.getFileName());
        }
    }

    /** {@code scale}: time per gate against qubit count. */
    @Command(name = "scale", mixinStandardHelpOptions = true,
            description = "Times Hadamard layers on states of growing size and prints the time"
                    + " per gate against the qubit count (a quick scaling report; qsim-bench has"
                    + " the careful JMH one).",
            footerHeading = "%nExamples:%n",
            footer = {
                "  java -jar qsim-examples.jar scale",
                "  java -jar qsim-examples.jar scale --from 10 --to 24 --threads 2"})
    static final class Scale implements Callable<Integer> {
        @Spec
        CommandLine.Model.CommandSpec spec;
        @Option(names = "--from", defaultValue = "4",
                description = "smallest qubit count (default ${DEFAULT-VALUE})")
        int from;
        @Option(names = "--to", defaultValue = "20",
                description = "largest qubit count, at most 30 (default ${DEFAULT-VALUE})")
        int to;
        @Option(names = "--threads", defaultValue = "1",
                description = "threads of the state (default ${DEFAULT-VALUE})")
        int threads;
        @Option(names = "--format", defaultValue = "table",
                description = "table or csv (default ${DEFAULT-VALUE})")
        String format;

        @Override
        public Integer call() {
            if (from < 1 || to > 30 || from > to) {
                throw new IllegalArgumentException("need 1 <= --from <= --to <= 30 but got"
                        + " --from " + from + " --to " + to);
            }
            if (!format.equals("table") && !format.equals("csv")) {
                throw new IllegalArgumentException("--format must be table or csv but was '"
                        + format + "'");
            }
            PrintWriter out = spec.commandLine().getOut();
            boolean csv = format.equals("csv");
            // Which loops the times are of; on standard error with CSV, so the file stays data.
            PrintWriter note = csv ? spec.commandLine().getErr() : out;
            note.println("kernels: " + Simulator.kernels());
            out.println(csv ? "qubits,gates,ns_per_gate,ns_per_amplitude"
                    : f("%6s %8s %14s %18s", "qubits", "gates", "ns per gate",
                    "ns per amplitude"));
            try (Progress p = Progress.start(spec.commandLine().getErr(), "timing", to - from
                    + 1)) {
                for (int n = from; n <= to; n++) {
                    Circuit.Builder b = Circuit.builder(n, 0);
                    for (int q = 0; q < n; q++) {
                        b.h(q);
                    }
                    Circuit layer = b.build();
                    StateVector s = StateVector.zero(n).setThreads(threads);
                    long warm = System.nanoTime();
                    // Warm-up, so the timing sees compiled code: longer at the first size, since
                    // the vector loops run about 100 times slower until the JIT compiles them.
                    long warmUp = n == from ? 400_000_000L : 20_000_000L;
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
