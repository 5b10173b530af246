package dev.qsim.bench;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Gates;
import dev.qsim.Operator;
import dev.qsim.Precision;
import dev.qsim.StateVector;
import dev.qsim.examples.cli.Progress;
import dev.qsim.noise.Channel;
import dev.qsim.noise.DensityMatrix;
import dev.qsim.noise.NoiseModel;
import dev.qsim.noise.NoisyRunner;
import java.io.IOException;
import java.io.OutputStream;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;

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
 * up to three times if it still came out short). Before the first reported row every
 * measurement is run once at the smallest size and discarded, so the just-in-time compiler has
 * settled. Run with {@code --help} for every option.
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
 * <p>Exit status: 0 on success, 1 for bad arguments or an output file that cannot be written,
 * 2 if the heap cannot hold the largest state and the probe (the message says which {@code -Xmx}
 * would do).
 */
public final class ScalingReport {
    /** The CSV header, exactly. */
    static final String HEADER = "n,kernel,target,threads,ns_per_gate,ns_per_amplitude,gb_per_s,"
            + "copy_gb_per_s,triad_gb_per_s,fraction_of_copy,precision";

    /** Smallest density matrix timed by {@code --noise on}. */
    static final int NOISE_DM_MIN = 6;

    /** Largest density matrix timed by {@code --noise on} (4 GiB). */
    static final int NOISE_DM_MAX = 14;

    /** Smallest register whose trajectories {@code --noise on} times. */
    static final int NOISE_TRAJECTORY_MIN = 20;

    /**
     * The probe arrays are never shortened below this many doubles (128 MiB each, three times
     * that in all) to fit the heap: McCalpin asks for arrays well beyond the last-level cache.
     */
    static final long MIN_PROBE_LENGTH = 1L << 24;

    /** Longest probe array: 2^30 doubles (8 GiB), within Java's array limit. */
    static final long MAX_PROBE_LENGTH = 1L << 30;

    /**
     * Heap kept free beside the largest state and an eighth of it (256 MiB, the margin the core
     * adds to the {@code -Xmx} it suggests): for the small objects of a run (circuits, fused
     * matrices, scratch windows) and for the gaps the collector leaves between the large arrays
     * of the state and the probe. The eighth covers what the collector loses placing a state's
     * large chunks in its regions.
     */
    static final long HEAP_ROOM = 256L << 20;

    /** Repetitions are chosen for this many times the target time, so one batch is enough. */
    static final double MARGIN = 1.25;

    /** Upper bound on the repetitions of one batch. */
    static final long MAX_REPETITIONS = 1L << 40;

    /** The measured batch is repeated at most this many times if it came out too short. */
    private static final int MAX_RETRIES = 3;

    private static final long GIB = 1L << 30;
    private static final long MIB = 1L << 20;

    /** Written once per run with a sum of results, so no measured work is dead code. */
    private static volatile double blackhole;

    private ScalingReport() {
    }

    /**
     * One CSV row: a kernel (or a circuit run) at one size and target in one precision, with the
     * probe's copy and triad bandwidths at the same size.
     */
    record Row(int n, String kernel, String target, int threads, double nanosPerGate,
            double copyGbps, double triadGbps, int vectorQubits, int passes,
            Precision precision) {

        /** A row of a double-precision state-vector gate: one pass over 2^n amplitudes. */
        Row(int n, String kernel, String target, int threads, double nanosPerGate,
                double copyGbps, double triadGbps) {
            this(n, kernel, target, threads, nanosPerGate, copyGbps, triadGbps, Precision.DOUBLE);
        }

        /** A row of a state-vector gate in the given precision: one pass over 2^n amplitudes. */
        Row(int n, String kernel, String target, int threads, double nanosPerGate,
                double copyGbps, double triadGbps, Precision precision) {
            this(n, kernel, target, threads, nanosPerGate, copyGbps, triadGbps, n, 1, precision);
        }

        /** A double-precision row over a vector of {@code vectorQubits}, {@code passes} times. */
        Row(int n, String kernel, String target, int threads, double nanosPerGate,
                double copyGbps, double triadGbps, int vectorQubits, int passes) {
            this(n, kernel, target, threads, nanosPerGate, copyGbps, triadGbps, vectorQubits,
                    passes, Precision.DOUBLE);
        }

        /**
         * Bandwidth in GB/s: {@code passes * 2 * B * 2^vectorQubits} bytes per measured time,
         * {@code B} the bytes of one amplitude in this row's precision (a density matrix of n
         * qubits is streamed as a vector of 2n qubits).
         */
        double gbps() {
            return passes * gigabytesPerSecond(vectorQubits, precision, nanosPerGate);
        }

        /** Formats the row in the order of {@link #HEADER}. */
        String csv() {
            final double gbps = gbps();
            return String.format(Locale.ROOT, "%d,%s,%s,%d,%.1f,%.5f,%.3f,%.3f,%.3f,%.3f,%s", n,
                    kernel, target, threads, nanosPerGate,
                    nanosPerGate / (double) (1L << vectorQubits), gbps, copyGbps, triadGbps,
                    gbps / copyGbps, Workloads.precisionName(precision));
        }
    }

    /** Times {@code reps} repetitions of some work; returns nanoseconds. */
    @FunctionalInterface
    interface Batch {
        /**
         * Runs the work {@code reps} times.
         *
         * @param reps at least 1
         * @return the elapsed nanoseconds
         */
        long time(long reps);
    }

    /** The result of {@link #measure}: repetitions of the measured batch and its nanoseconds. */
    record Timing(long reps, long nanos) {
        /** Nanoseconds per repetition. */
        double perRep() {
            return (double) nanos / reps;
        }
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
        final long maxHeap = Runtime.getRuntime().maxMemory();
        final Optional<String> heap = heapProblem(options.max(), maxHeap,
                options.widestBytesPerAmplitude());
        if (heap.isPresent()) {
            err.println("error: " + heap.get());
            return 2;
        }
        final Optional<String> unwritable = unwritable(options.svg(), "--svg");
        if (unwritable.isPresent()) {
            err.println("error: " + unwritable.get());
            return 1;
        }
        final PrintStream csv;
        if (options.csv() == null) {
            csv = out;
        } else {
            try {
                final OutputStream file = Files.newOutputStream(options.csv());
                csv = new PrintStream(file, false, StandardCharsets.UTF_8);
            } catch (IOException | SecurityException e) {
                err.println("error: cannot write --csv file '" + options.csv() + "': " + e);
                return 1;
            }
        }
        try {
            return report(options, maxHeap, csv, err, bar);
        } finally {
            if (csv != out) {
                csv.close();
            }
        }
    }

    private static int report(ReportSettings options, long maxHeap, PrintStream csv, PrintWriter err,
            boolean bar) {
        final long probeLength = probeLength(options.max(), maxHeap,
                options.widestBytesPerAmplitude());
        final String environment = "java " + System.getProperty("java.version") + " ("
                + System.getProperty("java.vm.name") + "), cpu " + cpuModel();
        err.println("# qsim scaling report: kernels " + String.join(",", options.kernels())
                + ", targets " + String.join(",", options.targets()) + ", precision "
                + options.precisionNames() + ", threads "
                + options.threads() + ", at least " + options.millis() + " ms per measurement,"
                + " fusion comparison at n = " + (options.circuitQubits().isEmpty() ? "none"
                : options.circuitQubits().toString()));
        err.println("# " + environment + ", " + Runtime.getRuntime().availableProcessors()
                + " processors, max heap " + formatBytes(maxHeap));
        err.println("# bytes moved per gate = 2 * B * 2^n (read and write of each complex"
                + " amplitude of B bytes: 16 in double precision, 8 in single); GB = 1e9 bytes");
        err.println("# probe (McCalpin 1995): copy b[i] = a[i] moves 2 * 8 * len bytes, triad"
                + " a[i] = b[i] + s * c[i] moves 3 * 8 * len, len = 2^(n+1) doubles");
        err.println("# diagonal (rz) and permutation (X) gates go to the core's lazy frame: a"
                + " batch of them ends with one read, which applies the frame in one pass, and"
                + " the batch time includes it; their GB/s is nominal (bytes a pass per gate"
                + " would move)");
        if (probeLength < Math.min(2L << options.max(), MAX_PROBE_LENGTH)) {
            err.println("# note: the heap holds probe arrays of " + probeLength + " doubles ("
                    + formatBytes(8 * probeLength) + " each) at most, so from n = "
                    + Long.numberOfTrailingZeros(probeLength) + " the probe runs at that length,"
                    + " still far beyond the caches");
        } else if (probeLength < (2L << options.max())) {
            err.println("# note: probe arrays stop at " + probeLength + " doubles (Java's array"
                    + " limit), so from n = " + Long.numberOfTrailingZeros(probeLength)
                    + " the probe runs at that length");
        }
        final int total = options.steps();
        final List<Row> rows = new ArrayList<>();
        final BandwidthProbe probe;
        try {
            probe = new BandwidthProbe((int) probeLength, options.threads());
        } catch (OutOfMemoryError e) {
            err.println("error: the heap cannot place three probe arrays of " + formatBytes(8
                    * probeLength) + "; rerun with a larger -Xmx or lower --max");
            return 2;
        }
        try (probe; Progress progress = Progress.of(err, "", total, bar)) {
            final Runner runner = new Runner(options, probe, progress);
            // One discarded pass at the smallest size, so the first row is as warm as the rest.
            runner.size(options.min(), true);
            csv.println(HEADER);
            csv.flush();
            for (int n = options.min(); n <= options.max(); n++) {
                for (Row r : runner.size(n, false)) {
                    csv.println(r.csv());
                    rows.add(r);
                }
                csv.flush();
            }
            if (options.noise()) {
                for (Row r : runner.noise()) {
                    csv.println(r.csv());
                    rows.add(r);
                }
                csv.flush();
            }
            blackhole = runner.sink;
        } catch (IllegalStateException e) {
            err.println("error: " + e.getMessage());
            return 2;
        }
        if (csv.checkError()) {
            err.println("error: writing the CSV to " + (options.csv() == null ? "standard output"
                    : "'" + options.csv() + "'") + " failed");
            return 1;
        }
        if (options.svg() != null) {
            final String title = "qsim: time per gate against qubit count";
            final String subtitle = environment + ", " + options.threads() + " thread(s), "
                    + (options.precisions().size() > 1 ? "double and single"
                    : Workloads.precisionName(options.precisions().get(0))) + " precision";
            try {
                Files.writeString(options.svg(), ScalingPlot.svg(rows, title, subtitle),
                        StandardCharsets.UTF_8);
            } catch (IOException | SecurityException e) {
                err.println("error: cannot write --svg file '" + options.svg() + "': " + e);
                return 1;
            }
            err.println("# plot written to " + options.svg());
        }
        return 0;
    }

    /** Measures one size; holds what all sizes share. */
    private static final class Runner {
        private final ReportSettings options;
        private final BandwidthProbe probe;
        private final Progress progress;
        private final long targetNanos;
        /** Sum of values read from results, printed at the end so no work is dead. */
        double sink;

        Runner(ReportSettings options, BandwidthProbe probe, Progress progress) {
            this.options = options;
            this.probe = probe;
            this.progress = progress;
            this.targetNanos = options.targetNanos();
        }

        /**
         * Prints a measurement's line; a reported step ({@code counts}) advances the bar, a
         * warm-up line does not.
         */
        private void finished(String line, boolean counts) {
            if (counts) {
                progress.done(line);
            } else {
                progress.note(line + " (elapsed " + progress.elapsed() + ")");
            }
        }

        /**
         * Measures everything at {@code n}; with {@code warmUp}, only the first target of each
         * kernel, reported as not counted, and returns no rows.
         */
        List<Row> size(int n, boolean warmUp) {
            final String prefix = warmUp ? "# warm-up (not reported) " : "# ";
            final int len = (int) Math.min(2L << n, probe.capacity());
            progress.show("n=" + n + " probe copy");
            final Timing copy = measure(r -> probe.timeCopy(len, r), targetNanos);
            final double copyGbps = BandwidthProbe.copyBytes(len) / copy.perRep();
            finished(String.format(Locale.ROOT, "%sn=%d probe copy: %d doubles, %d"
                    + " repetitions in %.3f s, %.3f GB/s", prefix, n, len, copy.reps(),
                    copy.nanos() / 1e9, copyGbps), !warmUp);
            progress.show("n=" + n + " probe triad");
            final Timing triad = measure(r -> probe.timeTriad(len, r), targetNanos);
            final double triadGbps = BandwidthProbe.triadBytes(len) / triad.perRep();
            finished(String.format(Locale.ROOT, "%sn=%d probe triad: %d doubles, %d"
                    + " repetitions in %.3f s, %.3f GB/s", prefix, n, len, triad.reps(),
                    triad.nanos() / 1e9, triadGbps), !warmUp);
            sink += probe.sample(len - 1);

            final List<Row> rows = new ArrayList<>();
            final boolean circuit = warmUp ? !options.circuitQubits().isEmpty()
                    : options.circuitQubits().contains(n);
            for (Precision precision : options.precisions()) {
                // Each call's state is unreachable once it returns, so only one state of this
                // size is live at a time (see heapNeeded).
                rows.addAll(kernels(n, precision, copyGbps, triadGbps, prefix, warmUp));
                if (circuit) {
                    rows.addAll(circuits(n, precision, copyGbps, triadGbps, prefix, warmUp));
                }
            }
            return warmUp ? List.of() : rows;
        }

        /**
         * Times every selected kernel at every selected target (only the first target with
         * {@code warmUp}) on the seeded product state of {@code n} qubits in one precision.
         */
        private List<Row> kernels(int n, Precision precision, double copyGbps, double triadGbps,
                String prefix, boolean warmUp) {
            final String label = Workloads.precisionName(precision);
            final List<Row> rows = new ArrayList<>();
            final StateVector state = Workloads.productState(n, Workloads.STATE_SEED, precision)
                    .withThreads(options.threads());
            for (String kernel : options.kernels()) {
                for (String target : options.targets()) {
                    final Circuit[] gates = gates(kernel, target, n);
                    progress.show("n=" + n + " " + kernel + " " + target + " " + label);
                    final Timing t = measure(r -> timeGates(state, gates, r), targetNanos);
                    final Row row = new Row(n, kernel, target, options.threads(), t.perRep(),
                            copyGbps, triadGbps, precision);
                    finished(String.format(Locale.ROOT, "%sn=%d %s %s (%s): %d repetitions"
                            + " in %.3f s, %.1f ns per gate, %.3f GB/s, %.2f of copy", prefix, n,
                            kernel, target, label, t.reps(), t.nanos() / 1e9, t.perRep(),
                            row.gbps(), row.gbps() / copyGbps), !warmUp);
                    rows.add(row);
                    if (warmUp) {
                        break;
                    }
                }
            }
            sink += state.probability(0);
            return rows;
        }

        /**
         * Times the layered circuit on {@code n} qubits with fusion on and then off, each run
         * from a new {@code |0...0>} in one precision.
         */
        private List<Row> circuits(int n, Precision precision, double copyGbps,
                double triadGbps, String prefix, boolean warmUp) {
            final String label = Workloads.precisionName(precision);
            final List<Row> rows = new ArrayList<>();
            final Circuit c = Workloads.layeredCircuit(n, Workloads.CIRCUIT_LAYERS,
                    Workloads.CIRCUIT_SEED);
            final double[] perGate = new double[2];
            final Timing[] best = new Timing[2];
            // Fused, unfused, unfused, fused (ABBA): a drift of the machine over the four
            // measurements hits both modes alike; each mode keeps its faster measurement.
            final int[] order = warmUp ? new int[] {0, 1} : new int[] {0, 1, 1, 0};
            for (int f : order) {
                final boolean fused = f == 0;
                final Simulator sim = Simulator.seeded(Workloads.CIRCUIT_SEED)
                        .withThreads(options.threads()).withFusion(fused)
                        .withPrecision(precision);
                progress.show("n=" + n + " " + (fused ? "circuit-fused" : "circuit-unfused")
                        + " " + label);
                final Timing t = measure(r -> timeCircuit(sim, c, r), targetNanos);
                if (best[f] == null || t.perRep() < best[f].perRep()) {
                    best[f] = t;
                }
            }
            for (int f = 0; f < 2; f++) {
                final boolean fused = f == 0;
                final String kernel = fused ? "circuit-fused" : "circuit-unfused";
                final Timing t = best[f];
                perGate[f] = t.perRep() / c.size();
                final Row row = new Row(n, kernel, "all", options.threads(), perGate[f],
                        copyGbps, triadGbps, precision);
                finished(String.format(Locale.ROOT, "%sn=%d %s (%s): %d gates, %d runs in"
                        + " %.3f s, %.1f ns per gate", prefix, n, kernel, label, c.size(),
                        t.reps(), t.nanos() / 1e9, perGate[f]), !warmUp);
                rows.add(row);
            }
            progress.note(String.format(Locale.ROOT, "%sn=%d fusion speed-up (%s): %.2fx"
                    + " (unfused %.1f ns per gate, fused %.1f)", prefix, n, label,
                    perGate[1] / perGate[0], perGate[1], perGate[0]));
            return rows;
        }

        /**
         * Times the noise engines: one gate plus a depolarizing channel on a density matrix
         * (streamed as a 2n-qubit vector, two passes), and one Monte Carlo trajectory of a GHZ
         * chain with depolarizing noise after every gate (ns_per_gate is then the time of the
         * whole trajectory, gb_per_s counts one pass per gate).
         */
        List<Row> noise() {
            final List<Row> rows = new ArrayList<>();
            final Channel depolarizing = Channel.depolarizing(0.01);
            for (int n = NOISE_DM_MIN; n <= Math.min(NOISE_DM_MAX, options.max()); n++) {
                final int vector = 2 * n;
                final int len = (int) Math.min(2L << vector, probe.capacity());
                final double copyGbps = BandwidthProbe.copyBytes(len)
                        / measure(r -> probe.timeCopy(len, r), targetNanos).perRep();
                final double triadGbps = BandwidthProbe.triadBytes(len)
                        / measure(r -> probe.timeTriad(len, r), targetNanos).perRep();
                final DensityMatrix rho = DensityMatrix.zero(n).withThreads(options.threads());
                final int q = n / 2;
                final Operator gate = Gates.rz(0.7);
                progress.show("n=" + n + " density-matrix");
                final Timing t = measure(reps -> {
                    final long start = System.nanoTime();
                    for (long r = 0; r < reps; r++) {
                        rho.apply(gate, q).apply(depolarizing, q);
                    }
                    return System.nanoTime() - start;
                }, targetNanos);
                sink += rho.purity();
                final Row row = new Row(n, "density-matrix", "mid", options.threads(), t.perRep(),
                        copyGbps, triadGbps, vector, 2);
                finished(String.format(Locale.ROOT, "# n=%d density-matrix: gate and"
                        + " channel %.1f ns (%d repetitions), %.3f GB/s", n, t.perRep(),
                        t.reps(), row.gbps()), true);
                rows.add(row);
            }
            for (int n = Math.max(NOISE_TRAJECTORY_MIN, options.min()); n <= options.max(); n++) {
                final Circuit.Builder b = Circuit.builder(n).h(0);
                for (int k = 0; k + 1 < n; k++) {
                    b.cnot(k, k + 1);
                }
                final Circuit ghz = b.measure().build();
                final NoiseModel model = NoiseModel.builder()
                        .afterOneQubitGates(Channel.depolarizing(0.001))
                        .afterTwoQubitGates(Channel.twoQubitDepolarizing(0.01)).build();
                final NoisyRunner runner = NoisyRunner.seeded(Workloads.STATE_SEED)
                        .withThreads(options.threads());
                final int len = (int) Math.min(2L << n, probe.capacity());
                final double copyGbps = BandwidthProbe.copyBytes(len)
                        / measure(r -> probe.timeCopy(len, r), targetNanos).perRep();
                final double triadGbps = BandwidthProbe.triadBytes(len)
                        / measure(r -> probe.timeTriad(len, r), targetNanos).perRep();
                progress.show("n=" + n + " trajectory");
                final Timing t = measure(reps -> {
                    final long start = System.nanoTime();
                    sink += runner.runTrajectories(ghz, model, (int) reps).shots();
                    return System.nanoTime() - start;
                }, targetNanos);
                final Row row = new Row(n, "trajectory", "ghz", options.threads(), t.perRep(),
                        copyGbps, triadGbps, n, n);
                finished(String.format(Locale.ROOT, "# n=%d trajectory: %.3f s per"
                        + " trajectory of a %d-gate noisy GHZ chain (%d trajectories)", n,
                        t.perRep() / 1e9, n, t.reps()), true);
                rows.add(row);
            }
            return rows;
        }

        private Circuit[] gates(String kernel, String target, int n) {
            if (!target.equals("all")) {
                return new Circuit[] {Workloads.kernelCircuit(kernel, n,
                        Workloads.target(target, n))};
            }
            final Circuit[] gates = new Circuit[n];
            for (int q = 0; q < n; q++) {
                gates[q] = Workloads.kernelCircuit(kernel, n, q);
            }
            return gates;
        }

        private long timeCircuit(Simulator sim, Circuit c, long reps) {
            double s = 0;
            final long start = System.nanoTime();
            for (long r = 0; r < reps; r++) {
                s += sim.stateAfter(c).probability(0);
            }
            final long elapsed = System.nanoTime() - start;
            sink += s;
            return elapsed;
        }
    }

    /**
     * Applies the one-gate circuits {@code reps} times in turn, then reads one amplitude;
     * returns nanoseconds. The read is timed because X and single-qubit phase gates are kept
     * in the core's lazy frame: the first read after them applies the frame in one pass, and
     * that pass belongs to the gates' cost.
     */
    private static long timeGates(StateVector state, Circuit[] gates, long reps) {
        final int count = gates.length;
        int next = 0;
        final long start = System.nanoTime();
        for (long r = 0; r < reps; r++) {
            state.apply(gates[next]);
            next = next + 1 == count ? 0 : next + 1;
        }
        readSink += state.probability(0);
        return System.nanoTime() - start;
    }

    /** Keeps the timed reads from being optimised away. */
    private static volatile double readSink;

    /**
     * Warms up with doubling batches until one lasts a third of {@code targetNanos}, then times
     * a batch meant to last {@code MARGIN * targetNanos}, retried up to three times if short.
     */
    static Timing measure(Batch batch, long targetNanos) {
        long reps = 1;
        long elapsed = batch.time(reps);
        while (elapsed < targetNanos / 3 && reps < MAX_REPETITIONS) {
            reps *= 2;
            elapsed = batch.time(reps);
        }
        reps = chooseRepetitions(reps, elapsed, targetNanos);
        elapsed = batch.time(reps);
        for (int retry = 0; retry < MAX_RETRIES && elapsed < targetNanos; retry++) {
            reps = chooseRepetitions(reps, elapsed, targetNanos);
            elapsed = batch.time(reps);
        }
        return new Timing(reps, Math.max(1, elapsed));
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

    /** Bytes of a double-precision {@code n}-qubit state: {@code 16 * 2^n}. */
    static long stateBytes(int n) {
        return stateBytes(n, Precision.DOUBLE.bytesPerAmplitude());
    }

    /**
     * Bytes of an {@code n}-qubit state of {@code bytesPerAmplitude} bytes per amplitude (16 in
     * double precision, 8 in single): {@code bytesPerAmplitude * 2^n}.
     */
    static long stateBytes(int n, int bytesPerAmplitude) {
        return (long) bytesPerAmplitude << n;
    }

    /** Bytes one gate moves on a double-precision {@code n}-qubit state: {@code 2 * 16 * 2^n}. */
    static long bytesMoved(int n) {
        return bytesMoved(n, Precision.DOUBLE);
    }

    /**
     * Bytes one single-qubit gate moves on {@code n} qubits stored in the given precision: every
     * amplitude is read once and written once, {@code 2 * B * 2^n} with {@code B} =
     * {@link Precision#bytesPerAmplitude()} (16 in double precision, 8 in single), common
     * practice for the bandwidth of a streaming kernel: bytes read plus bytes written. The same
     * count is used for every kernel kind, so {@code gb_per_s} is an effective rate: a kernel
     * that touches less than the whole state (a controlled gate) can exceed the copy bandwidth.
     * The double-precision scratch window a single-precision gate is worked on in stays in the
     * cache and is not counted.
     */
    static long bytesMoved(int n, Precision precision) {
        return 2 * stateBytes(n, precision.bytesPerAmplitude());
    }

    /**
     * Returns the bandwidth in GB/s (10^9 bytes per second) of a gate on a double-precision
     * state of {@code n} qubits that took {@code nanosPerGate}.
     */
    static double gigabytesPerSecond(int n, double nanosPerGate) {
        return gigabytesPerSecond(n, Precision.DOUBLE, nanosPerGate);
    }

    /**
     * Returns the bandwidth in GB/s (10^9 bytes per second) of a gate on {@code n} qubits stored
     * in the given precision that took {@code nanosPerGate}: bytes moved per nanosecond, which is
     * the same number.
     */
    static double gigabytesPerSecond(int n, Precision precision, double nanosPerGate) {
        return bytesMoved(n, precision) / nanosPerGate;
    }

    /**
     * Heap the report needs at {@code --max maxQubits} with amplitudes of
     * {@code bytesPerAmplitude} bytes and probe arrays of {@code probeLength} doubles: the
     * largest state, an eighth of it plus {@link #HEAP_ROOM} of room, and three probe arrays.
     * One state at a time is enough: the state is built with one large allocation
     * ({@link Workloads#productState(int, long, Precision)}), each size's states are dropped
     * before the next are made, and the core runs the collector before it refuses a new state,
     * so a circuit run's new state takes the place of the previous, unreachable one.
     */
    static long heapNeeded(int maxQubits, long probeLength, int bytesPerAmplitude) {
        final long state = stateBytes(maxQubits, bytesPerAmplitude);
        return state + state / 8 + HEAP_ROOM + 3 * Double.BYTES * probeLength;
    }

    /**
     * Returns the length of the probe arrays: {@code 2^(max+1)} doubles (the bytes of the
     * double-precision state), at most {@link #MAX_PROBE_LENGTH}; if the heap cannot hold that
     * next to the state of {@code bytesPerAmplitude} bytes per amplitude, the longest power of two
     * that fits, but not below {@code min(2^(max+1), MIN_PROBE_LENGTH)}; or -1 if even that does
     * not fit.
     */
    static long probeLength(int maxQubits, long maxHeapBytes, int bytesPerAmplitude) {
        final long full = Math.min(2L << maxQubits, MAX_PROBE_LENGTH);
        final long least = Math.min(full, MIN_PROBE_LENGTH);
        long len = full;
        while (len > least && heapNeeded(maxQubits, len, bytesPerAmplitude) > maxHeapBytes) {
            len >>= 1;
        }
        return heapNeeded(maxQubits, len, bytesPerAmplitude) <= maxHeapBytes ? len : -1;
    }

    /**
     * Checks the heap can hold the largest state, of {@code bytesPerAmplitude} bytes per
     * amplitude (16 in double precision, 8 in single), with room, and the probe arrays (shorter
     * ones if need be, see {@link #probeLength}).
     *
     * @return empty if it can, otherwise a message with the bytes needed, the heap maximum and
     *     the {@code -Xmx} that would do
     */
    static Optional<String> heapProblem(int maxQubits, long maxHeapBytes, int bytesPerAmplitude) {
        if (probeLength(maxQubits, maxHeapBytes, bytesPerAmplitude) > 0) {
            return Optional.empty();
        }
        final long full = Math.min(2L << maxQubits, MAX_PROBE_LENGTH);
        final long least = Math.min(full, MIN_PROBE_LENGTH);
        final long state = stateBytes(maxQubits, bytesPerAmplitude);
        final long needed = heapNeeded(maxQubits, full, bytesPerAmplitude);
        final long suggestGib = (needed + GIB - 1) / GIB + 1;
        final int single = Precision.SINGLE.bytesPerAmplitude();
        final String precision = bytesPerAmplitude == single ? "single" : "double";
        final String alternative = bytesPerAmplitude > single
                && probeLength(maxQubits, maxHeapBytes, single) > 0
                ? ", lower --max, or measure in single precision only (--precision single fits)"
                : ", or lower --max";
        return Optional.of("a " + maxQubits + "-qubit state in " + precision + " precision"
                + " needs " + formatBytes(state) + " (" + formatBytes(state + state / 8
                + HEAP_ROOM) + " with room for the collector) and the bandwidth probe 3 x "
                + formatBytes(8 * full) + " (3 x " + formatBytes(8 * least) + " at least), but"
                + " the maximum heap is " + formatBytes(maxHeapBytes) + "; rerun with java -Xmx"
                + suggestGib + "g" + alternative);
    }

    /** Formats a byte count in MiB below 1 GiB, else in GiB, one decimal. */
    static String formatBytes(long bytes) {
        if (bytes < GIB) {
            return String.format(Locale.ROOT, "%.1f MiB", (double) bytes / MIB);
        }
        return String.format(Locale.ROOT, "%.1f GiB", (double) bytes / GIB);
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
