package dev.qsim.bench;

import dev.qsim.Operator;
import dev.qsim.StateVector;
import java.io.IOException;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.Set;

/**
 * Prints, as CSV on standard output, the time of one single-qubit gate against qubit count:
 * a plain {@code main}, no JMH, for a quick look at how the cost grows with the state size.
 *
 * <p>For each {@code n} from {@code --min} to {@code --max} it builds a seeded product state of
 * {@code n} qubits (every amplitude nonzero), warms up by applying the gate in batches of
 * doubling size until one batch takes a third of the measuring time, then times enough
 * applications in one batch for at least {@code --millis} milliseconds (300 by default). The
 * smallest size is first measured once more and discarded, so the just-in-time compiler has
 * settled before the first reported row. The
 * target is {@code n / 2} by default; {@code --target all} cycles through every qubit in turn,
 * so the time is the average over targets. Run with {@code --help} for every option.
 *
 * <p>Columns: {@code n}; {@code ns_per_gate}, wall time of one application; {@code
 * ns_per_amplitude}, that divided by 2^n; {@code gb_per_s}, bytes moved divided by time, where a
 * gate moves {@code 2 * 16 * 2^n} bytes (each double-precision complex amplitude read once and
 * written once) and a GB is 10^9 bytes. Progress and comment lines (starting {@code #}) go to
 * standard error, so standard output is plain CSV.
 *
 * <p>Exit status: 0 on success, 1 for bad arguments, 2 if the heap cannot hold the largest
 * state (the message says which {@code -Xmx} would do).
 */
public final class ScalingReport {
    /** The CSV header, exactly. */
    static final String HEADER = "n,ns_per_gate,ns_per_amplitude,gb_per_s";

    /** Bytes of one double-precision complex amplitude. */
    static final long BYTES_PER_AMPLITUDE = 16;

    /** Largest qubit count accepted by {@code --min} and {@code --max}. */
    static final int MAX_QUBITS = 40;

    /** Largest thread count accepted by {@code --threads}. */
    static final int MAX_THREADS = 1024;

    /** Largest value of {@code --millis}: ten minutes per qubit count. */
    static final long MAX_MILLIS = 600_000;

    /** Repetitions are chosen for this many times the target time, so one batch is enough. */
    static final double MARGIN = 1.25;

    /** Upper bound on the repetitions of one batch. */
    static final long MAX_REPETITIONS = 1L << 40;

    /** The measured batch is repeated at most this many times if it came out too short. */
    private static final int MAX_RETRIES = 3;

    private static final long GIB = 1L << 30;
    private static final long MIB = 1L << 20;

    /** The usage text printed by {@code --help} and after bad arguments. */
    static final String USAGE = String.join("\n",
            "usage: java -Xmx4g -cp qsim-bench.jar dev.qsim.bench.ScalingReport [options]",
            "Times one single-qubit gate on states of min..max qubits.",
            "CSV (" + HEADER + ") on standard output; progress on standard error.",
            "  --min N          smallest qubit count (default 10; 1.." + MAX_QUBITS + ")",
            "  --max N          largest qubit count (default 26; 1.." + MAX_QUBITS + ")",
            "  --threads T      kernel threads (default: available processors; 1.."
                    + MAX_THREADS + ")",
            "  --gate NAME      " + String.join(", ", Workloads.GATE_NAMES)
                    + " (default dense: a generic complex 2x2 unitary)",
            "  --target WHERE   low (qubit 0), mid (n/2, default), high (n-1),"
                    + " all (each qubit in turn)",
            "  --millis M       least measured time per qubit count, in ms (default 300; 1.."
                    + MAX_MILLIS + ")",
            "  --help           print this and exit",
            "Values may also be given as --name=value.");

    private ScalingReport() {
    }

    /** The settings of one run, after validation. */
    record Options(int min, int max, int threads, String gate, String target, long millis,
            boolean help) {
    }

    /**
     * Runs the report with the given arguments and exits with its status.
     *
     * @param args the options; {@code --help} lists them
     */
    public static void main(String[] args) {
        final int status = run(args, System.out, System.err);
        System.out.flush();
        if (status != 0) {
            System.exit(status);
        }
    }

    /**
     * Runs the report: CSV to {@code out}, progress and errors to {@code err}.
     *
     * @return the exit status: 0 success, 1 bad arguments, 2 not enough heap
     */
    static int run(String[] args, PrintStream out, PrintStream err) {
        final Options options;
        try {
            options = parse(args, Runtime.getRuntime().availableProcessors());
        } catch (IllegalArgumentException e) {
            err.println("error: " + e.getMessage());
            err.println(USAGE);
            return 1;
        }
        if (options.help()) {
            out.println(USAGE);
            return 0;
        }
        final long maxHeap = Runtime.getRuntime().maxMemory();
        final Optional<String> heap = heapProblem(options.max(), maxHeap);
        if (heap.isPresent()) {
            err.println("error: " + heap.get());
            return 2;
        }
        final Operator op = Workloads.gate(options.gate());
        err.println("# qsim scaling report: gate " + options.gate() + ", target "
                + options.target() + ", threads " + options.threads() + ", at least "
                + options.millis() + " ms per qubit count");
        err.println("# java " + System.getProperty("java.version") + " ("
                + System.getProperty("java.vm.name") + "), cpu " + cpuModel() + ", "
                + Runtime.getRuntime().availableProcessors() + " processors, max heap "
                + formatBytes(maxHeap));
        err.println("# bytes moved per gate = 2 * 16 * 2^n (read and write of each"
                + " double-precision complex amplitude); GB = 1e9 bytes");
        out.println(HEADER);
        try {
            // One discarded pass at the smallest size, so the first row is as warm as the rest.
            measure(options.min(), op, options, err, "# warm-up (not reported) ");
            for (int n = options.min(); n <= options.max(); n++) {
                final double nanosPerGate = measure(n, op, options, err, "# ");
                out.println(row(n, nanosPerGate));
                out.flush();
            }
        } catch (IllegalStateException e) {
            err.println("error: " + e.getMessage());
            return 2;
        }
        return 0;
    }

    /**
     * Parses the command-line options.
     *
     * @param defaultThreads the thread count when {@code --threads} is not given
     * @return the validated options
     * @throws IllegalArgumentException naming the bad option or value and what is allowed
     */
    static Options parse(String[] args, int defaultThreads) {
        int min = 10;
        int max = 26;
        int threads = defaultThreads;
        String gate = "dense";
        String target = "mid";
        long millis = 300;
        boolean help = false;
        final Set<String> seen = new HashSet<>();
        for (int i = 0; i < args.length; i++) {
            String name = args[i];
            String value = null;
            final int eq = name.indexOf('=');
            if (name.startsWith("--") && eq > 0) {
                value = name.substring(eq + 1);
                name = name.substring(0, eq);
            }
            if (!List.of("--min", "--max", "--threads", "--gate", "--target", "--millis",
                    "--help").contains(name)) {
                throw new IllegalArgumentException("unknown option '" + args[i]
                        + "'; allowed: --min, --max, --threads, --gate, --target, --millis,"
                        + " --help");
            }
            if (!seen.add(name)) {
                throw new IllegalArgumentException("option " + name + " is given twice");
            }
            if (name.equals("--help")) {
                if (value != null) {
                    throw new IllegalArgumentException("option --help takes no value but got '"
                            + value + "'");
                }
                help = true;
                continue;
            }
            if (value == null) {
                if (i + 1 >= args.length) {
                    throw new IllegalArgumentException("option " + name + " needs a value");
                }
                value = args[++i];
            }
            switch (name) {
                case "--min":
                    min = parseWhole(name, value, 1, MAX_QUBITS);
                    break;
                case "--max":
                    max = parseWhole(name, value, 1, MAX_QUBITS);
                    break;
                case "--threads":
                    threads = parseWhole(name, value, 1, MAX_THREADS);
                    break;
                case "--millis":
                    millis = parseWhole(name, value, 1, MAX_MILLIS);
                    break;
                case "--gate":
                    if (!Workloads.GATE_NAMES.contains(value)) {
                        throw new IllegalArgumentException("--gate '" + value
                                + "' is not known; allowed: "
                                + String.join(", ", Workloads.GATE_NAMES));
                    }
                    gate = value;
                    break;
                default: // --target
                    if (!value.equals("all") && !Workloads.TARGET_NAMES.contains(value)) {
                        throw new IllegalArgumentException("--target '" + value
                                + "' is not known; allowed: "
                                + String.join(", ", Workloads.TARGET_NAMES) + ", all");
                    }
                    target = value;
                    break;
            }
        }
        if (min > max) {
            throw new IllegalArgumentException("--min " + min + " is greater than --max " + max
                    + "; the range must not be empty");
        }
        return new Options(min, max, threads, gate, target, millis, help);
    }

    private static int parseWhole(String name, String value, long low, long high) {
        final long parsed;
        try {
            parsed = Long.parseLong(value.trim());
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException(name + " must be a whole number in [" + low + ", "
                    + high + "] but was '" + value + "'", e);
        }
        if (parsed < low || parsed > high) {
            throw new IllegalArgumentException(name + " must be in [" + low + ", " + high
                    + "] but was " + parsed);
        }
        return (int) parsed;
    }

    /**
     * Returns the repetitions of a batch meant to last at least {@code targetNanos}, from a
     * pilot batch of {@code pilotReps} that took {@code pilotNanos}: {@code ceil(MARGIN *
     * targetNanos * pilotReps / pilotNanos)}, at least 1 and at most {@link #MAX_REPETITIONS}.
     * A pilot time below 1 ns counts as 1 ns.
     */
    static long chooseRepetitions(long pilotReps, long pilotNanos, long targetNanos) {
        final double nanosPerRep = (double) Math.max(1, pilotNanos) / Math.max(1, pilotReps);
        final double reps = Math.ceil(MARGIN * targetNanos / nanosPerRep);
        return (long) Math.max(1, Math.min(MAX_REPETITIONS, reps));
    }

    /** Bytes of an {@code n}-qubit state: {@code 16 * 2^n}. */
    static long stateBytes(int n) {
        return BYTES_PER_AMPLITUDE << n;
    }

    /**
     * Bytes one dense single-qubit gate moves on {@code n} qubits: every amplitude is read once
     * and written once, {@code 2 * 16 * 2^n} (common practice for the bandwidth of a streaming
     * kernel: bytes read plus bytes written).
     */
    static long bytesMoved(int n) {
        return 2 * stateBytes(n);
    }

    /**
     * Returns the bandwidth in GB/s (10^9 bytes per second) of a gate on {@code n} qubits that
     * took {@code nanosPerGate}: bytes moved per nanosecond, which is the same number.
     */
    static double gigabytesPerSecond(int n, double nanosPerGate) {
        return bytesMoved(n) / nanosPerGate;
    }

    /** Formats one CSV row: {@code n,ns_per_gate,ns_per_amplitude,gb_per_s}. */
    static String row(int n, double nanosPerGate) {
        final double nanosPerAmplitude = nanosPerGate / (double) (1L << n);
        return String.format(Locale.ROOT, "%d,%.1f,%.5f,%.3f", n, nanosPerGate,
                nanosPerAmplitude, gigabytesPerSecond(n, nanosPerGate));
    }

    /**
     * Checks the heap can hold the largest state while it is built (the state plus the half-size
     * state it is built from, rounded up to twice the state).
     *
     * @return empty if it can, otherwise a message with the bytes needed, the heap maximum and
     *     the {@code -Xmx} that would do
     */
    static Optional<String> heapProblem(int maxQubits, long maxHeapBytes) {
        final long needed = 2 * stateBytes(maxQubits);
        if (needed <= maxHeapBytes) {
            return Optional.empty();
        }
        final long suggestGib = (needed + GIB - 1) / GIB + 1;
        return Optional.of("a " + maxQubits + "-qubit state needs " + formatBytes(stateBytes(
                maxQubits)) + " (" + formatBytes(needed) + " while it is built) but the maximum"
                + " heap is " + formatBytes(maxHeapBytes) + "; rerun with java -Xmx" + suggestGib
                + "g, or lower --max");
    }

    /** Formats a byte count in MiB below 1 GiB, else in GiB, one decimal. */
    static String formatBytes(long bytes) {
        if (bytes < GIB) {
            return String.format(Locale.ROOT, "%.1f MiB", (double) bytes / MIB);
        }
        return String.format(Locale.ROOT, "%.1f GiB", (double) bytes / GIB);
    }

    /** Warms up and measures one qubit count; returns nanoseconds per gate. */
    private static double measure(int n, Operator op, Options options, PrintStream err,
            String prefix) {
        final int[][] targets;
        if (options.target().equals("all")) {
            targets = new int[n][];
            for (int q = 0; q < n; q++) {
                targets[q] = new int[] {q};
            }
        } else {
            targets = new int[][] {{Workloads.target(options.target(), n)}};
        }
        final StateVector state = Workloads.productState(n, Workloads.STATE_SEED)
                .withThreads(options.threads());
        final long targetNanos = options.millis() * 1_000_000L;

        // Warm-up: doubling batches until one lasts a third of the target; the last is the pilot.
        long reps = 1;
        long elapsed = timeBatch(state, op, targets, reps);
        while (elapsed < targetNanos / 3 && reps < MAX_REPETITIONS) {
            reps *= 2;
            elapsed = timeBatch(state, op, targets, reps);
        }
        reps = chooseRepetitions(reps, elapsed, targetNanos);
        elapsed = timeBatch(state, op, targets, reps);
        for (int retry = 0; retry < MAX_RETRIES && elapsed < targetNanos; retry++) {
            reps = chooseRepetitions(reps, elapsed, targetNanos);
            elapsed = timeBatch(state, op, targets, reps);
        }
        err.println(String.format(Locale.ROOT, "%sn=%d: %d repetitions in %.3f s", prefix, n,
                reps, elapsed / 1e9));
        return (double) elapsed / reps;
    }

    /** Applies the gate {@code reps} times, cycling through the targets; returns nanoseconds. */
    private static long timeBatch(StateVector state, Operator op, int[][] targets, long reps) {
        final int count = targets.length;
        int next = 0;
        final long start = System.nanoTime();
        for (long r = 0; r < reps; r++) {
            state.apply(op, targets[next]);
            next = next + 1 == count ? 0 : next + 1;
        }
        return System.nanoTime() - start;
    }

    /** The CPU model from /proc/cpuinfo, or "unknown". */
    private static String cpuModel() {
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
