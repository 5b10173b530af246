package dev.qsim.bench;

import java.nio.file.InvalidPathException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.Iterator;
import java.util.List;
import java.util.Optional;
import java.util.TreeSet;

import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Model.OptionSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParameterException;
import picocli.CommandLine.Spec;
import picocli.CommandLine.UnmatchedArgumentException;

import dev.qsim.Precision;

/**
 * The command line of {@link ScalingReport}, read with picocli: every option is a setter that
 * checks its value at once, and {@link #settings(int)} checks the options against each other.
 * {@link #parse(String[], int)} turns every complaint into one {@link IllegalArgumentException}
 * whose message, a single line, names the bad option or value and what is allowed.
 */
@Command(name = "ScalingReport",
        customSynopsis = "usage: java -Xmx8g -cp qsim-bench.jar dev.qsim.bench.ScalingReport"
                + " [options]",
        synopsisHeading = "",
        description = {
            "Times each gate kernel on states of min..max qubits next to a memory-bandwidth probe",
            "(copy and triad) measured in the same run. The probe is a Java loop, itself scalar:",
            "not a ceiling. --reference adds the C reference kernel's figures.",
            "CSV (" + CsvOutput.HEADER_START,
            "     " + CsvOutput.HEADER_END + ")",
            "on standard output or --csv FILE; progress on standard error."},
        optionListHeading = "",
        sortOptions = false,
        footer = {
            "Values may be given as --name value or --name=value.",
            "Exit status: 0 done, 1 bad options, reference or unwritable file, 2 not enough heap."},
        usageHelpWidth = 124)
final class ReportOptions {
    /** Largest qubit count accepted by {@code --min} and {@code --max}. */
    static final int MAX_QUBITS = 40;

    /** Largest thread count accepted by {@code --threads} (the core's own limit). */
    static final int MAX_THREADS = 256;

    /** Largest value of {@code --millis}: ten minutes per measurement. */
    static final long MAX_MILLIS = 600_000;

    /** Smallest qubit count of the default fusion comparison. */
    static final int CIRCUIT_FROM = 20;

    /** The names {@code --targets} accepts, in the order shown in messages. */
    static final List<String> TARGETS = List.of("low", "mid", "high", "all");

    @Spec
    private CommandSpec spec;

    @Option(names = "--help", usageHelp = true, order = 15, description = "print this and exit")
    private boolean help;

    private int min = 10;
    private int max = 26;
    private int threads;
    private List<String> kernels = Workloads.KERNEL_NAMES;
    private List<String> targets = List.of("low", "mid", "high");
    private long millis = 300;
    private Boolean circuit;
    private String circuitQubitsText;
    private List<Integer> circuitQubits;
    private boolean noise;
    private boolean mps;
    private List<Precision> precisions = List.of(Precision.DOUBLE);
    private Path csv;
    private Path svg;
    private Path reference;

    private ReportOptions() {
    }

    /** The kernel names, for the help text of {@code --kernels}. */
    static final class KernelNames implements Iterable<String> {
        @Override
        public Iterator<String> iterator() {
            return Workloads.KERNEL_NAMES.iterator();
        }
    }

    @Option(names = "--min", paramLabel = "N", order = 1,
            description = "smallest qubit count (default 10; 1.." + MAX_QUBITS + ")")
    private void min(String value) {
        min = (int) whole("--min", value, 1, MAX_QUBITS);
    }

    @Option(names = "--max", paramLabel = "N", order = 2,
            description = "largest qubit count (default 26; 1.." + MAX_QUBITS + ")")
    private void max(String value) {
        max = (int) whole("--max", value, 1, MAX_QUBITS);
    }

    @Option(names = "--threads", paramLabel = "T", order = 3,
            description = "threads of the kernels and the probe (default: available processors;"
                    + " 1.." + MAX_THREADS + ")")
    private void threads(String value) {
        threads = (int) whole("--threads", value, 1, MAX_THREADS);
    }

    @Option(names = "--kernels", paramLabel = "K,K,...", order = 4,
            completionCandidates = KernelNames.class,
            description = "of ${COMPLETION-CANDIDATES} (default all)")
    private void kernels(String value) {
        kernels = value.equals("all") ? Workloads.KERNEL_NAMES
                : names("--kernels", value, Workloads.KERNEL_NAMES);
    }

    @Option(names = "--targets", paramLabel = "W,W,...", order = 5,
            description = {"of low (qubit 0), mid (n/2), high (n-1), all (each qubit in turn)",
                "(default low,mid,high)"})
    private void targets(String value) {
        targets = names("--targets", value, TARGETS);
    }

    @Option(names = "--millis", paramLabel = "M", order = 6,
            description = "least measured time per measurement, in ms (default 300; 1.."
                    + MAX_MILLIS + ")")
    private void millis(String value) {
        millis = whole("--millis", value, 1, MAX_MILLIS);
    }

    @Option(names = "--circuit", paramLabel = "on|off", order = 7,
            description = "time a " + Workloads.CIRCUIT_LAYERS + "-layer circuit with fusion on"
                    + " and off (default on, at n >= " + CIRCUIT_FROM + ")")
    private void circuit(String value) {
        circuit = onOff("--circuit", value);
    }

    @Option(names = "--circuit-qubits", paramLabel = "N,N,...", order = 8,
            description = "the qubit counts of that comparison, within --min..--max")
    private void circuitQubits(String value) {
        final List<Integer> sizes = new ArrayList<>();
        for (String part : value.split(",", -1)) {
            final int q = (int) whole("--circuit-qubits", part, 1, MAX_QUBITS);
            if (sizes.contains(q)) {
                throw bad("--circuit-qubits lists " + q + " twice in '" + value + "'");
            }
            sizes.add(q);
        }
        circuitQubitsText = value;
        circuitQubits = sizes;
    }

    @Option(names = "--noise", paramLabel = "on|off", order = 9,
            description = {"also time the noise engines (default off): a gate plus a depolarizing",
                "channel on a density matrix of " + NoiseRows.NOISE_DM_MIN + ".."
                    + NoiseRows.NOISE_DM_MAX + " qubits (up to --max), and one trajectory",
                "of a noisy GHZ chain at " + NoiseRows.NOISE_TRAJECTORY_MIN
                    + "..--max qubits"})
    private void noise(String value) {
        noise = onOff("--noise", value);
    }

    @Option(names = "--mps", paramLabel = "on|off", order = 10,
            description = {"also time the matrix-product-state engine (default off): a two-qubit",
                "gate on a " + BondRows.CHAIN + "-qubit chain at bond dimension 8 to 128, with the",
                "fitted exponent of the bond dimension (3 in theory)"})
    private void mps(String value) {
        mps = onOff("--mps", value);
    }

    @Option(names = "--precision", paramLabel = "P", order = 11,
            description = {"double, single or both (default double): amplitudes of 16 or 8 bytes;",
                "both measures every kernel and circuit row in each (noise rows: double only)"})
    private void precision(String value) {
        switch (value) {
            case "double":
                precisions = List.of(Precision.DOUBLE);
                break;
            case "single":
                precisions = List.of(Precision.SINGLE);
                break;
            case "both":
                precisions = List.of(Precision.DOUBLE, Precision.SINGLE);
                break;
            default:
                throw bad("--precision must be double, single or both but was '" + value + "'");
        }
    }

    @Option(names = "--csv", paramLabel = "FILE", order = 12,
            description = "write the CSV to FILE instead of standard output")
    private void csv(String value) {
        csv = path("--csv", value);
    }

    @Option(names = "--svg", paramLabel = "FILE", order = 13,
            description = "also draw time per gate against n, with the bandwidth floor")
    private void svg(String value) {
        svg = path("--svg", value);
    }

    @Option(names = "--reference", paramLabel = "FILE", order = 14,
            description = {"the C reference kernel's output (../shared/ceiling: 'ceiling gates N'"
                + " for each n,", "'ceiling stream MIB'): adds reference_gb_per_s,"
                + " fraction_of_reference and", "reference_copy_gb_per_s, and its dense gate to"
                + " the plot; qsim-bench/scaling-with-reference.sh", "makes one in the same run"})
    private void reference(String value) {
        reference = path("--reference", value);
    }

    /**
     * Reads the command line.
     *
     * @param args the arguments of {@code main}
     * @param defaultThreads the thread count when {@code --threads} is not given (at most
     *     {@link #MAX_THREADS} of it is used)
     * @return the checked settings, or empty when {@code --help} asks for the usage instead
     * @throws IllegalArgumentException with a one-line message naming the bad option or value
     *     and what is allowed
     */
    static Optional<ReportSettings> parse(String[] args, int defaultThreads) {
        final ReportOptions options = new ReportOptions();
        final CommandLine line = commandLine(options);
        try {
            line.parseArgs(args);
        } catch (UnmatchedArgumentException e) {
            final List<String> unmatched = e.getUnmatched();
            throw new IllegalArgumentException("unknown option '" + (unmatched.isEmpty() ? ""
                    : unmatched.get(0)) + "'; allowed: " + String.join(", ", names(line)), e);
        } catch (ParameterException e) {
            throw new IllegalArgumentException(oneLine(e.getMessage()), e);
        }
        if (line.isUsageHelpRequested()) {
            return Optional.empty();
        }
        return Optional.of(options.settings(defaultThreads));
    }

    /**
     * Returns the text {@code --help} prints: the command, what the report does, every option
     * with its default and the exit status.
     */
    static String usage() {
        return commandLine(new ReportOptions()).getUsageMessage(CommandLine.Help.Ansi.OFF);
    }

    private static CommandLine commandLine(ReportOptions options) {
        final CommandLine line = new CommandLine(options);
        // A value starting with @ is a value, not a file of more arguments.
        line.setExpandAtFiles(false);
        return line;
    }

    /** The option names, in the order of the help text. */
    private static List<String> names(CommandLine line) {
        final List<OptionSpec> options = new ArrayList<>(line.getCommandSpec().options());
        options.sort(Comparator.comparingInt(OptionSpec::order));
        final List<String> names = new ArrayList<>();
        for (OptionSpec o : options) {
            names.add(o.longestName());
        }
        return names;
    }

    /** Checks the options against each other and fills in what was not given. */
    private ReportSettings settings(int defaultThreads) {
        if (min > max) {
            throw new IllegalArgumentException("--min " + min + " is greater than --max " + max
                    + "; the range must not be empty");
        }
        if (min < 2 && kernels.contains("controlled")) {
            throw new IllegalArgumentException("--min " + min + " is too small for the"
                    + " controlled kernel, a CNOT on two qubits; use --min 2 or more, or leave"
                    + " controlled out of --kernels");
        }
        if (csv != null && csv.equals(svg)) {
            throw new IllegalArgumentException("--csv and --svg name the same file '" + csv
                    + "'");
        }
        if (reference != null && (reference.equals(csv) || reference.equals(svg))) {
            throw new IllegalArgumentException("--reference names the file '" + reference
                    + "' that " + (reference.equals(csv) ? "--csv" : "--svg") + " would"
                    + " overwrite");
        }
        final TreeSet<Integer> sizes = new TreeSet<>();
        if (circuitQubits != null) {
            if (Boolean.FALSE.equals(circuit)) {
                throw new IllegalArgumentException("--circuit-qubits " + circuitQubitsText
                        + " contradicts --circuit off");
            }
            for (int q : circuitQubits) {
                if (q < min || q > max) {
                    throw new IllegalArgumentException("--circuit-qubits " + q + " is outside"
                            + " --min..--max = [" + min + ", " + max + "]");
                }
                sizes.add(q);
            }
        } else if (!Boolean.FALSE.equals(circuit)) {
            for (int n = Math.max(min, CIRCUIT_FROM); n <= max; n++) {
                sizes.add(n);
            }
        }
        final int t = threads > 0 ? threads : Math.min(defaultThreads, MAX_THREADS);
        return new ReportSettings(min, max, t, kernels, targets, millis, List.copyOf(sizes), csv,
                svg, noise, precisions, mps, reference);
    }

    private ParameterException bad(String message) {
        return new ParameterException(spec.commandLine(), message);
    }

    private long whole(String name, String value, long low, long high) {
        final long parsed;
        try {
            parsed = Long.parseLong(value.trim());
        } catch (NumberFormatException e) {
            throw bad(name + " must be a whole number in [" + low + ", " + high + "] but was '"
                    + value + "'");
        }
        if (parsed < low || parsed > high) {
            throw bad(name + " must be in [" + low + ", " + high + "] but was " + parsed);
        }
        return parsed;
    }

    private boolean onOff(String name, String value) {
        if (!value.equals("on") && !value.equals("off")) {
            throw bad(name + " must be on or off but was '" + value + "'");
        }
        return value.equals("on");
    }

    private List<String> names(String name, String value, List<String> allowed) {
        final List<String> names = new ArrayList<>();
        for (String part : value.split(",", -1)) {
            final String p = part.trim();
            if (!allowed.contains(p)) {
                throw bad(name + " '" + p + "' is not known; allowed: "
                        + String.join(", ", allowed) + " (comma separated)");
            }
            if (names.contains(p)) {
                throw bad(name + " lists '" + p + "' twice in '" + value + "'");
            }
            names.add(p);
        }
        return List.copyOf(names);
    }

    private Path path(String name, String value) {
        if (value.isBlank()) {
            throw bad(name + " needs a file name but was empty");
        }
        try {
            return Path.of(value);
        } catch (InvalidPathException e) {
            throw bad(name + " '" + value + "' is not a valid file name: " + e.getMessage());
        }
    }

    /** Joins the lines of a message with spaces, so an error is one line. */
    private static String oneLine(String message) {
        return String.valueOf(message).strip().replaceAll("\\s*\\R\\s*", " ");
    }
}
