package dev.qsim.bench;

import java.io.IOException;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

import dev.qsim.Precision;
import dev.qsim.Simulator;
import dev.qsim.examples.cli.Progress;

/**
 * Prints, as CSV, the time of each gate kernel against qubit count, next to a memory-bandwidth
 * probe measured in the same run and the same JVM: a plain {@code main}, no JMH.
 *
 * <p>For each {@code n} from {@code --min} to {@code --max} it
 *
 * <ol>
 *   <li>times McCalpin's copy and triad kernels ({@link BandwidthProbe}) over {@code double}
 *       arrays of {@code 2^(n+1)} elements, as many bytes as the state, on the same number of
 *       threads as the gate kernels;</li>
 *   <li>builds a seeded product state of {@code n} qubits (every amplitude nonzero) and times
 *       each selected kernel kind ({@code dense}, {@code diagonal}, {@code permutation},
 *       {@code controlled}; see {@link Workloads#kernelCircuit}) at each selected target
 *       ({@code low} = qubit 0, {@code mid} = {@code n / 2}, {@code high} = {@code n - 1}, or
 *       {@code all}: every qubit in turn, so the time is the mean over targets);</li>
 *   <li>where selected (by default {@code n >= 20}), times the 20-layer circuit of
 *       {@link Workloads#layeredCircuit} with {@code Simulator.stateAfter} with gate fusion on
 *       and off.</li>
 * </ol>
 *
 * <p>Every measurement warms up with batches of doubling size until one batch lasts a third of
 * {@code --millis}, then times one batch long enough to last at least {@code --millis} (repeated
 * up to three times if it still came out short; {@link BatchTimer}). Before the first reported
 * row every measurement is run once at the smallest size and discarded, so the just-in-time
 * compiler has settled. Run with {@code --help} for every option ({@link ReportOptions}).
 *
 * <p>The work is split by concept: {@link ReportOptions} reads the command line into
 * {@link ReportSettings}; {@link HeapBudget} sizes the probe to the heap; {@link ReportRunner}
 * runs the measurement loop with {@link KernelRows}, {@link CircuitRows} and {@link NoiseRows};
 * {@link CsvOutput} writes the rows ({@link ReportRow}) and {@link ScalingPlot} draws them.
 * Progress goes through the command-line tool's {@link Progress}.
 *
 * <p>With {@code --precision single} the kernels and the circuit run on states stored in single
 * precision ({@link Precision#SINGLE}, 8 bytes per amplitude); with {@code --precision both}
 * every kernel and circuit row is measured in double and then in single precision, in the same
 * run and JVM, next to the same probe. The default is double precision only.
 *
 * <p>Columns: {@code n}; {@code kernel}; {@code target}; {@code threads}; {@code ns_per_gate},
 * wall time of one gate (for circuit rows the time of one run divided by its gate count);
 * {@code ns_per_amplitude}, that divided by 2^n; {@code gb_per_s}, {@code 2 * B * 2^n} bytes
 * (every complex amplitude of {@code B} bytes read once and written once: {@code B} = 16 in
 * double precision, 8 in single, {@link Precision#bytesPerAmplitude()}) divided by the time,
 * GB = 10^9 bytes; {@code copy_gb_per_s} and {@code triad_gb_per_s}, the probe at the same
 * {@code n}; {@code fraction_of_copy} = {@code gb_per_s / copy_gb_per_s}; {@code precision},
 * {@code double} or {@code single}. Progress and comment lines (starting {@code #}) go to
 * standard error, so the CSV stays clean.
 *
 * <p>The probe is a Java loop, which the just-in-time compiler turns into scalar code: its
 * rate is a lower bound on the machine's bandwidth, not a ceiling. The ceiling comes from the C
 * reference kernel of {@code ../shared/ceiling} (vectorised, {@code -O3 -march=native}): with
 * {@code --reference FILE}, a file of its output lines ({@link CeilingReference}: one
 * {@code ceiling gates N} run for each {@code n} from {@code --min} to {@code --max} at the
 * report's thread count, and optionally {@code ceiling stream}), read and checked before
 * anything is measured, three columns follow {@code ns_per_pass}:
 * {@code reference_gb_per_s}, the C kernel's dense 2x2 gate at that size and thread count
 * (median over targets, 32 bytes an amplitude as in {@code gb_per_s}); {@code
 * fraction_of_reference} = {@code gb_per_s / reference_gb_per_s}; {@code
 * reference_copy_gb_per_s}, its STREAM copy (best of its repetitions, empty without a stream
 * line). The plot draws the C dense gate's time per gate, {@code 32 * 2^n / reference_gb_per_s}
 * ns, as a line of its own. {@code qsim-bench/scaling-with-reference.sh} runs the C kernel and
 * this report back to back, so the reference comes from the same run. Without
 * {@code --reference} the columns are as before.
 *
 * <p>Exit status: 0 on success, 1 for bad arguments, a reference file that cannot be read or
 * is malformed, or an output file that cannot be written,
 * 2 if the heap cannot hold the largest state next to the probe. Before measuring, the largest
 * state is allocated once through the core's public API: the core checks the heap and refuses a
 * state that does not fit with a message naming the bytes needed, the maximum heap and the
 * {@code -Xmx} that would do, which the report prints ({@link HeapBudget}).
 */
public final class ScalingReport {
    /** Written once per run with a sum of results, so no measured work is dead code. */
    private static volatile double blackhole;

    private ScalingReport() {
    }

    /**
     * Runs the report with the given arguments and exits with its status. A progress bar is
     * drawn on standard error when the JVM has a console.
     *
     * @param args the options; {@code --help} lists them
     */
    public static void main(String[] args) {
        final int status = run(args, System.out, System.err, System.console() != null);
        System.out.flush();
        if (status != 0) {
            System.exit(status);
        }
    }

    /**
     * Runs the report without a progress bar: CSV to {@code out} (or the {@code --csv} file),
     * progress and errors to {@code err}.
     *
     * @return the exit status: 0 success, 1 bad arguments or unwritable file, 2 not enough heap
     */
    static int run(String[] args, PrintStream out, PrintStream err) {
        return run(args, out, err, false);
    }

    /**
     * Runs the report: CSV to {@code out} (or the {@code --csv} file), progress and errors to
     * {@code err}; with {@code bar} a single progress line is redrawn with carriage returns.
     *
     * @return the exit status: 0 success, 1 bad arguments or unwritable file, 2 not enough heap
     */
    static int run(String[] args, PrintStream out, PrintStream err, boolean bar) {
        final PrintWriter log = new PrintWriter(err, true);
        try {
            return run(args, out, log, bar);
        } finally {
            log.flush();
        }
    }

    private static int run(String[] args, PrintStream out, PrintWriter err, boolean bar) {
        final Optional<ReportSettings> parsed;
        try {
            parsed = ReportOptions.parse(args, Runtime.getRuntime().availableProcessors());
        } catch (IllegalArgumentException e) {
            err.println("error: " + e.getMessage() + "; see --help");
            return 1;
        }
        if (parsed.isEmpty()) {
            out.print(ReportOptions.usage());
            out.flush();
            return 0;
        }
        final ReportSettings options = parsed.get();
        final Optional<String> unwritable = unwritable(options.svg(), "--svg")
                .or(() -> unwritable(options.csv(), "--csv"));
        if (unwritable.isPresent()) {
            err.println("error: " + unwritable.get());
            return 1;
        }
        // The reference is read and checked before anything is measured.
        CeilingReference reference = null;
        if (options.reference() != null) {
            try {
                reference = CeilingReference.read(options.reference());
                reference.requireSizes(options.min(), options.max(), options.threads());
            } catch (IOException | SecurityException e) {
                err.println("error: cannot read --reference file '" + options.reference() + "': "
                        + e);
                return 1;
            } catch (IllegalArgumentException e) {
                err.println("error: " + e.getMessage());
                return 1;
            }
        }
        // The probe first, then the largest state next to it, so that the core's answer (and
        // the -Xmx it suggests) counts the probe's arrays.
        final long maxHeap = Runtime.getRuntime().maxMemory();
        final long probeLength = HeapBudget.probeLength(options.max(), maxHeap,
                options.widestBytesPerAmplitude());
        final BandwidthProbe probe;
        try {
            probe = new BandwidthProbe((int) probeLength, options.threads());
        } catch (OutOfMemoryError e) {
            err.println("error: the heap cannot place three probe arrays of "
                    + HeapBudget.formatBytes(8 * probeLength) + " (maximum heap "
                    + HeapBudget.formatBytes(maxHeap) + "); rerun with a larger -Xmx or lower"
                    + " --max");
            return 2;
        }
        try (probe) {
            final Optional<String> refused = HeapBudget.largestStateRefused(options.max(),
                    options.widestPrecision());
            if (refused.isPresent()) {
                err.println("error: " + refused.get());
                return 2;
            }
            final CsvOutput csv;
            try {
                csv = CsvOutput.open(options.csv(), out, reference);
            } catch (IOException | SecurityException e) {
                err.println("error: cannot write --csv file '" + options.csv() + "': " + e);
                return 1;
            }
            try (csv) {
                return report(options, maxHeap, probe, reference, csv, err, bar);
            }
        }
    }

    private static int report(ReportSettings options, long maxHeap, BandwidthProbe probe,
            CeilingReference reference, CsvOutput csv, PrintWriter err, boolean bar) {
        final long probeLength = probe.capacity();
        final String environment = "java " + System.getProperty("java.version") + " ("
                + System.getProperty("java.vm.name") + "), cpu " + cpuModel() + ", "
                + Simulator.kernels() + " loops";
        err.println("# qsim scaling report: kernels " + String.join(",", options.kernels())
                + ", targets " + String.join(",", options.targets()) + ", precision "
                + options.precisionNames() + ", threads " + options.threads() + ", at least "
                + options.millis() + " ms per measurement, fusion comparison at n = "
                + (options.circuitQubits().isEmpty() ? "none"
                : options.circuitQubits().toString()));
        err.println("# " + environment + ", " + Runtime.getRuntime().availableProcessors()
                + " processors, max heap " + HeapBudget.formatBytes(maxHeap));
        err.println("# bytes moved per gate = 2 * B * 2^n (read and write of each complex"
                + " amplitude of B bytes: 16 in double precision, 8 in single); GB = 1e9 bytes");
        err.println("# probe (McCalpin 1995): copy b[i] = a[i] moves 2 * 8 * len bytes, triad"
                + " a[i] = b[i] + s * c[i] moves 3 * 8 * len, len = 2^(n+1) doubles");
        err.println("# the probe is a Java loop that the JIT compiles to scalar code: a lower"
                + " bound on this machine's bandwidth, not a ceiling");
        if (reference == null) {
            err.println("# for the C reference kernel's figures beside it, pass --reference FILE"
                    + " of its output (../shared/ceiling; qsim-bench/scaling-with-reference.sh"
                    + " runs both)");
        } else {
            err.println("# reference: " + reference.describe(options.threads()));
            err.println("# reference_gb_per_s: the C dense gate at the row's size and thread"
                    + " count (32 bytes an amplitude, median over targets); fraction_of_reference"
                    + " = gb_per_s / reference_gb_per_s");
        }
        err.println("# diagonal (rz) and permutation (X) gates go to the core's lazy frame: a"
                + " batch of them ends with one read, which applies the frame in one pass, and"
                + " the batch time includes it; their GB/s is nominal (bytes a pass per gate"
                + " would move)");
        if (probeLength < Math.min(2L << options.max(), HeapBudget.MAX_PROBE_LENGTH)) {
            err.println("# note: the heap holds probe arrays of " + probeLength + " doubles ("
                    + HeapBudget.formatBytes(8 * probeLength) + " each) at most, so from n = "
                    + Long.numberOfTrailingZeros(probeLength) + " the probe runs at that length,"
                    + " still far beyond the caches");
        } else if (probeLength < (2L << options.max())) {
            err.println("# note: probe arrays stop at " + probeLength + " doubles (Java's array"
                    + " limit), so from n = " + Long.numberOfTrailingZeros(probeLength)
                    + " the probe runs at that length");
        }
        if (!HeapBudget.roomy(options.max(), probeLength, maxHeap,
                options.widestBytesPerAmplitude())) {
            err.println("# note: the heap holds the largest state next to the probe, but with"
                    + " less room than the report keeps (an eighth of the state and 256 MiB);"
                    + " should the collector fail to place a state, the run stops with exit"
                    + " status 2");
        }
        final List<ReportRow> rows = new ArrayList<>();
        try (Progress progress = Progress.of(err, "", options.steps(), bar)) {
            final ReportRunner runner = new ReportRunner(options, probe, progress);
            // One discarded pass at the smallest size, so the first row is as warm as the rest.
            runner.size(options.min(), true);
            csv.header();
            for (int n = options.min(); n <= options.max(); n++) {
                for (ReportRow r : runner.size(n, false)) {
                    csv.write(r);
                    rows.add(r);
                }
                csv.flush();
            }
            if (options.noise()) {
                for (ReportRow r : runner.noise()) {
                    csv.write(r);
                    rows.add(r);
                }
                csv.flush();
            }
            if (options.mps()) {
                // Rows against the bond dimension, not the qubit count: in the CSV only.
                for (ReportRow r : runner.bonds()) {
                    csv.write(r);
                }
                csv.flush();
                err.println(String.format(java.util.Locale.ROOT, "# mps: time per two-qubit gate"
                        + " grows as chi^%.2f (least squares over chi >= %d; 3 in theory)",
                        runner.bondExponent(), BondRows.FIT_FROM));
            }
            blackhole = runner.sink();
        } catch (IllegalStateException e) {
            err.println("error: " + e.getMessage());
            return 2;
        }
        if (csv.failed()) {
            err.println("error: writing the CSV to " + csv.where() + " failed");
            return 1;
        }
        if (options.svg() != null) {
            final String title = "qsim: time per gate against qubit count";
            final String subtitle = environment + ", " + options.threads() + " thread(s), "
                    + (options.precisions().size() > 1 ? "double and single"
                    : Workloads.precisionName(options.precisions().get(0))) + " precision";
            try {
                Files.writeString(options.svg(), ScalingPlot.svg(rows, title, subtitle,
                        reference),
                        StandardCharsets.UTF_8);
            } catch (IOException | SecurityException e) {
                err.println("error: cannot write --svg file '" + options.svg() + "': " + e);
                return 1;
            }
            err.println("# plot written to " + options.svg());
        }
        return 0;
    }

    /** Checks before measuring that a file can be written later: its folder exists. */
    private static Optional<String> unwritable(Path file, String option) {
        if (file == null) {
            return Optional.empty();
        }
        if (Files.isDirectory(file)) {
            return Optional.of("cannot write " + option + " file '" + file + "': it is a"
                    + " directory");
        }
        final Path parent = file.toAbsolutePath().getParent();
        if (parent != null && !Files.isDirectory(parent)) {
            return Optional.of("cannot write " + option + " file '" + file + "': directory '"
                    + parent + "' does not exist");
        }
        return Optional.empty();
    }

    /** The CPU model from /proc/cpuinfo, or "unknown". */
    static String cpuModel() {
        try {
            for (String line : Files.readAllLines(Path.of("/proc/cpuinfo"),
                    StandardCharsets.UTF_8)) {
                if (line.startsWith("model name")) {
                    final int colon = line.indexOf(':');
                    return colon < 0 ? "unknown" : line.substring(colon + 1).trim();
                }
            }
        } catch (IOException | SecurityException e) {
            return "unknown";
        }
        return "unknown";
    }
}
