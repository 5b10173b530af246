package dev.qsim.examples;

import java.io.Console;
import java.io.FileDescriptor;
import java.io.FileOutputStream;
import java.io.PrintStream;
import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.List;
import java.util.Objects;

import dev.qsim.Simulator;
import dev.qsim.examples.cli.Cli;

/**
 * Command-line launcher of the qsim examples.
 *
 * <p>{@code java -jar qsim-examples.jar} runs the main demo ({@link UniformSuperposition});
 * {@code java -jar qsim-examples.jar NAME [ARGS...]} runs one example by its short name;
 * {@code list} prints the names with a line on each; {@code --help} prints the usage;
 * {@code --version} the version ({@link Version#text()});
 * {@code run}, {@code state}, {@code draw}, {@code compare} and {@code scale} are the
 * subcommands of the circuit-file tool ({@link Cli}), each with its own {@code --help}. An unknown
 * name or a bad argument prints a message on standard error and ends with exit code
 * {@value #EXIT_USAGE}.
 *
 * <p>All the work is in {@link #run(String[], PrintStream, PrintStream)}, which returns the exit
 * code; only {@link #main(String[])} calls {@link System#exit(int)}, so the dispatch can be tested
 * in the same JVM.
 */
public final class Main {

    /** Exit code of a successful run. */
    public static final int EXIT_OK = 0;

    /** Exit code of an unknown example name or a bad argument. */
    public static final int EXIT_USAGE = 2;

    /** Name of the example run when no name is given. */
    public static final String DEFAULT_EXAMPLE = "uniform";

    /** Runs one example with its remaining arguments, writing its report to {@code out}. */
    @FunctionalInterface
    private interface Runner {
        void run(String[] args, PrintStream out);
    }

    /** An example known to the launcher. */
    private record Entry(String name, String arguments, String description, Runner runner) {
    }

    private static final List<Entry> EXAMPLES = List.of(
            new Entry("uniform", "[seed [shots]]",
                    "main demo: H on 5 qubits, histogram, chi-square test of fairness",
                    UniformSuperposition::fromArgs),
            new Entry("bell", "[seed [shots]]",
                    "a Bell pair, then a 6-qubit GHZ state: amplitudes and tallies",
                    BellAndGhz::bothFromArgs),
            new Entry("ghz", "[seed [shots]]",
                    "the 6-qubit GHZ state alone: only all-0 or all-1 reads",
                    BellAndGhz::ghzFromArgs),
            new Entry("teleport", "[seed [shots]]",
                    "teleportation: mid-circuit measurement, conditioned corrections",
                    Teleportation::fromArgs),
            new Entry("grover", "[seed [shots]]",
                    "Grover search of 32 settings, success per round vs the formula",
                    GroverSearch::fromArgs),
            new Entry("fourier", "",
                    "Fourier transform of a period-4 state: peaks at multiples of 8",
                    FourierTransform::fromArgs),
            new Entry("hydrogen", "[seed [shots]]",
                    "variational ground state of H2 (STO-3G, 2 qubits): energy per iteration",
                    HydrogenGroundState::fromArgs),
            new Entry("maxcut", "[layers [seed [shots]]]",
                    "QAOA max cut on a 6-node graph: convergence, best cut vs brute force",
                    MaxCutQaoa::fromArgs),
            new Entry("memory", "[seed [shots]]",
                    "repetition-code memory on an 801-qubit line: syndrome statistics (stabilizer)",
                    RepetitionMemory::fromArgs),
            new Entry("noisy-ghz", "[seed [shots]]",
                    "GHZ on an invented noisy 6-qubit chip: ideal, density-matrix, trajectories",
                    NoisyGhz::fromArgs),
            new Entry("engines", "[seed [shots]]",
                    "one circuit on every engine through one call, and why each was chosen",
                    EngineTour::fromArgs),
            new Entry("ising", "[layers [longest chain]]",
                    "critical Ising chain: energy per spin on up to 160 spins (matrix product)",
                    CriticalIsingChain::fromArgs));

    private Main() {
    }

    /**
     * Runs the launcher and exits the JVM with its exit code if that code is not zero.
     *
     * @param args an example name and its arguments, {@code list}, {@code --help}, or nothing
     */
    public static void main(String[] args) {
        Charset charset = outputCharset();
        PrintStream out = new PrintStream(new FileOutputStream(FileDescriptor.out), true,
                charset);
        PrintStream err = new PrintStream(new FileOutputStream(FileDescriptor.err), true,
                charset);
        int code = run(args, out, err);
        out.flush();
        err.flush();
        if (code != EXIT_OK) {
            System.exit(code);
        }
    }

    /**
     * The encoding of the output: the console's when it can write the drawings' symbols (a
     * filled dot, a circled plus, a cross), otherwise UTF-8 (output to a file or pipe, or a
     * console whose locale claims plain ASCII, as a POSIX "C" locale does).
     */
    static Charset outputCharset() {
        Console console = System.console();
        if (console != null && console.charset().newEncoder().canEncode("\u25cf\u2295\u00d7")) {
            return console.charset();
        }
        return StandardCharsets.UTF_8;
    }

    /**
     * Runs the launcher without ever exiting the JVM.
     *
     * @param args an example name and its arguments, {@code list}, {@code --help} (or
     *     {@code -h}, {@code help}), or nothing for the main demo
     * @param out where reports, the list and the usage go
     * @param err where error messages go
     * @return {@value #EXIT_OK} on success, {@value #EXIT_USAGE} for an unknown name or a bad
     *     argument
     */
    public static int run(String[] args, PrintStream out, PrintStream err) {
        Objects.requireNonNull(args, "args");
        Objects.requireNonNull(out, "out");
        Objects.requireNonNull(err, "err");
        if (args.length > 0 && Cli.COMMANDS.contains(args[0])) {
            return Cli.run(args, out, err);
        }
        String name = args.length == 0 ? DEFAULT_EXAMPLE : args[0];
        String[] rest = args.length == 0 ? args : Arrays.copyOfRange(args, 1, args.length);
        switch (name) {
            case "--help":
            case "-h":
            case "help":
                usage(out);
                return EXIT_OK;
            case "list":
                list(out);
                return EXIT_OK;
            case "--version":
            case "-V":
                out.println(Version.text());
                return EXIT_OK;
            default:
                break;
        }
        Entry entry = find(name);
        if (entry == null) {
            err.println("qsim-examples: unknown example '" + name + "'; valid names: "
                    + names() + " (or list, --help, or a tool command: " + commands() + ")");
            return EXIT_USAGE;
        }
        try {
            entry.runner().run(rest, out);
        } catch (UsageException e) {
            err.println("qsim-examples " + entry.name() + ": " + e.getMessage());
            return EXIT_USAGE;
        }
        out.flush();
        return EXIT_OK;
    }

    /**
     * Runs one example by name with the system streams, exiting the JVM on a non-zero code.
     * Each example's own {@code main} comes here, so all share one argument handling.
     */
    static void launch(String name, String[] args) {
        String[] all = new String[args.length + 1];
        all[0] = name;
        System.arraycopy(args, 0, all, 1, args.length);
        main(all);
    }

    private static Entry find(String name) {
        for (Entry e : EXAMPLES) {
            if (e.name().equals(name)) {
                return e;
            }
        }
        return null;
    }

    private static String names() {
        StringBuilder text = new StringBuilder();
        for (Entry e : EXAMPLES) {
            text.append(text.length() == 0 ? "" : ", ").append(e.name());
        }
        return text.toString();
    }

    private static String commands() {
        return String.join(", ", new java.util.TreeSet<>(Cli.COMMANDS));
    }

    private static int nameWidth() {
        int width = 0;
        for (Entry e : EXAMPLES) {
            width = Math.max(width, (e.name() + " " + e.arguments()).trim().length());
        }
        return width;
    }

    private static void list(PrintStream out) {
        int width = nameWidth();
        for (Entry e : EXAMPLES) {
            out.println(Text.f("%-" + width + "s  %s", (e.name() + " " + e.arguments()).trim(),
                    e.description()));
        }
    }

    private static void usage(PrintStream out) {
        out.println("Usage: java -jar qsim-examples.jar [NAME [ARGS...]]");
        out.println("       java -jar qsim-examples.jar list");
        out.println("       java -jar qsim-examples.jar --help | --version");
        out.println("       java -jar qsim-examples.jar COMMAND [OPTIONS] (COMMAND --help for"
                + " details)");
        out.println();
        out.println("Runs one qsim example and prints its report. With no NAME, runs '"
                + DEFAULT_EXAMPLE + "'.");
        out.println("Seeds are whole numbers; shots run from 1 to "
                + Text.f("%,d", Args.MAX_SHOTS) + ". Equal seeds give equal reports.");
        out.println();
        out.println("Examples:");
        int width = nameWidth();
        for (Entry e : EXAMPLES) {
            out.println(Text.f("  %-" + width + "s  %s", (e.name() + " " + e.arguments()).trim(),
                    e.description()));
        }
        out.println();
        out.println("Tool commands, for circuit files in OpenQASM 3 and tally files:");
        out.println("  run      run a circuit file, print the tally (table, CSV, JSON, SVG)");
        out.println("  state    print the state vector or probabilities of a small circuit");
        out.println("  draw     draw a circuit as text or SVG");
        out.println("  compare  compare a tally file with a circuit's ideal prediction");
        out.println("  scale    time per gate against qubit count (--min, --max)");
        out.println();
        out.println("Kernels in this JVM: " + Simulator.kernels() + ".");
        out.println("The vector kernels need java --add-modules jdk.incubator.vector: the launcher"
                + " script qsim-examples/qsim");
        out.println("adds it, or set JDK_JAVA_OPTIONS=--add-modules=jdk.incubator.vector.");
        out.println();
        out.println("Exit codes: " + EXIT_OK + " success, " + Cli.EXIT_MISMATCH
                + " comparison failed (compare --require-match), " + EXIT_USAGE
                + " unknown name, bad argument or bad file.");
    }
}
