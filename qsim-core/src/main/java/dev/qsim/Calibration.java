package dev.qsim;

import java.io.IOException;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.nio.file.StandardCopyOption;
import java.time.Instant;
import java.time.format.DateTimeParseException;
import java.time.temporal.ChronoUnit;
import java.util.Arrays;
import java.util.Locale;
import java.util.Objects;
import java.util.Properties;
import java.util.function.Consumer;

import dev.qsim.internal.TextFiles;
import dev.qsim.kernel.KernelTimer;
import dev.qsim.kernel.Parallel;
import dev.qsim.kernel.Workload;

/**
 * This machine's measured speeds, which {@link Simulator#forecast(Circuit, int)} uses to turn
 * counted work into time: nanoseconds per amplitude for each kind of pass over memory (dense
 * gates of one to four qubits, diagonal and permutation gates, cache-blocked groups, single
 * precision windows, copies, measurements, sampling, and a density matrix's gate and channel
 * passes as that engine makes them) at a few state sizes in and out of cache,
 * on one thread and on every processor; nanoseconds per shot drawn; and the stabilizer
 * tableau's time per word. Immutable and thread-safe.
 *
 * <p>{@link #measure(Consumer)} takes about a minute and {@link #save()} keeps the result in a
 * small versioned text file in the user's configuration folder ({@link #file()}); without one,
 * {@link #current()} makes a {@linkplain #quickProbe() quick probe} of two to three seconds, once
 * per JVM. A file made on another number of processors or with other kernel loops (the scalar or
 * the vector path) is reported stale and not used. Between measured sizes, rates are
 * interpolated linearly in the qubit count; beyond them the nearest is used.
 *
 * <p>Method: counting passes over memory and pricing each with a measured rate is the
 * bandwidth-or-compute bound reasoning of S. Williams, A. Waterman and D. Patterson,
 * "Roofline: an insightful visual performance model for multicore architectures", Commun. ACM
 * 52 (2009) 65, doi:10.1145/1498765.1498785, with rates measured per kernel instead of derived
 * from peak figures.
 *
 * @since 0.1
 */
public final class Calibration {
    /** The file format's version; a file of another version is ignored, with the reason. */
    public static final int FORMAT = 13;
    /** System property naming the folder of the calibration file (tests use a temporary one). */
    public static final String FOLDER_PROPERTY = "qsim.config.dir";
    /** The calibration file's name inside the folder. */
    public static final String FILE_NAME = "machine-rates.properties";

    /** How a set of rates was obtained. */
    public enum Source {
        /** Measured by {@link #measure(Consumer)}, kept in the calibration file. */
        CALIBRATED,
        /** The built-in quick probe of two to three seconds. */
        QUICK_PROBE
    }

    static final int[] FULL_SIZES = {12, 16, 20, 23};
    static final int[] QUICK_SIZES = {12, 20};
    private static final long FULL_NANOS = 150_000_000L;
    private static final long QUICK_NANOS = 3_000_000L;
    private static final long MAX_FILE_BYTES = 64 * 1024;
    private static final String[] KEYS = {"dense1", "dense1-controlled", "dense2", "dense3",
        "dense4", "diagonal", "permutation", "block-group", "window-group", "float1", "phases",
        "copy", "measure", "sample", "reduce", "window-group-double", "dense1-half",
        "table-diagonal", "table-gather", "dense1-half-pair", "table-complex", "density1",
        "density1-half", "density2", "density-channel1", "density-channel2", "window-short",
        "window-short-double", "block-group-long", "window-gate"};
    private static final int LONG_GROUP = RateTable.LONG_GROUP;
    private static final int WINDOW_GATE = RateTable.WINDOW_GATE;
    private static final int ROWS = RateTable.ROWS;

    /** Tableau rates, in the order of {@link TableauCost}'s terms. */
    private static final String[] TABLEAU_KEYS = {"tableau.run", "tableau.table.word",
        "tableau.gate", "tableau.gate.word", "tableau.measure", "tableau.measure.column",
        "tableau.measure.word", "tableau.batch.step", "tableau.batch.row", "tableau.shot",
        "tableau.shot.wide-bit"};

    private static final String[] OTHER_KEYS = otherKeys();

    private static Calibration probe;

    /** Wall time the kernels are run on small states before any is timed (the JIT's work). */
    private static final long WARM_NANOS = 300_000_000L;

    private final Source source;
    private final Instant made;
    private final String kernels;
    private final int processors;
    private final int[] sizes;
    /**
     * [kind][0: one thread, 1: all processors][size index], nanoseconds per unit; the rows
     * after the kinds are a longer cache-blocked group and the window kinds' gates
     * ({@link RateTable}).
     */
    private final double[][][] rates;
    private final RateTable table;
    private final double shotNanos;
    private final double shotBitNanos;
    /** Nanoseconds to build a merged run's tables, per entry and gate. */
    private final double tableNanos;
    private final double planNanos;
    private final double fuseNanos;
    /** The tableau's and the matrix product state's rates, measured when first asked for. */
    private final Extras extras;
    private final String note;

    /**
     * The rates of the engines other than the state vector: given (a calibration) or measured
     * on first use (the quick probe, so that a forecast of a state-vector run does not pay for
     * the tableau's and the matrix product state's timing). Thread-safe.
     */
    private static final class Extras {
        private final long nanos;
        private double[] tableau;
        private double mps;

        Extras(double[] tableau, double mps) {
            this.nanos = 0;
            this.tableau = tableau;
            this.mps = mps;
        }

        Extras(long nanos) {
            this.nanos = nanos;
            this.mps = Double.NaN;
        }

        synchronized double[] tableau() {
            if (tableau == null) {
                tableau = EngineRates.tableauNanos(nanos, true);
            }
            return tableau;
        }

        synchronized double mps() {
            if (Double.isNaN(mps)) {
                mps = EngineRates.mpsUnitNanos(nanos, true);
            }
            return mps;
        }
    }

    /** Rates with every other rate measured: {@code other} in the order of the file's keys. */
    private Calibration(Source source, Instant made, String kernels, int processors, int[] sizes,
            double[][][] rates, double[] other, String note) {
        this(source, made, kernels, processors, sizes, rates, new double[] {other[0], other[1]},
                new double[] {other[2 + TableauCost.TERMS], other[3 + TableauCost.TERMS],
                    other[5 + TableauCost.TERMS]},
                new Extras(Arrays.copyOfRange(other, 2, 2 + TableauCost.TERMS),
                        other[4 + TableauCost.TERMS]), note);
    }

    /** The quick probe's rates, its other engines' rates measured on first use. */
    private Calibration(Source source, Instant made, String kernels, int processors, int[] sizes,
            double[][][] rates, double[] shot, double[] plan, Extras extras, String note) {
        this.source = source;
        this.made = made;
        this.kernels = kernels;
        this.processors = processors;
        this.sizes = sizes;
        this.rates = rates;
        this.table = new RateTable(processors, sizes, rates);
        this.shotNanos = shot[0];
        this.shotBitNanos = shot[1];
        this.planNanos = plan[0];
        this.fuseNanos = plan[1];
        this.tableNanos = plan[2];
        this.extras = extras;
        this.note = note;
    }

    /**
     * Measures this machine's rates: every kind of pass at 2^12, 2^16, 2^20 and 2^23 amplitudes
     * (in cache to well out of it), on one thread and on every processor. About a minute;
     * allocates up to 256 MiB.
     *
     * @param progress receives a line per size measured (may ignore it)
     * @return the rates, {@link Source#CALIBRATED}, not yet saved
     * @throws IllegalStateException if the heap cannot hold the 2^23-amplitude states
     */
    public static Calibration measure(Consumer<String> progress) {
        Objects.requireNonNull(progress, "progress");
        return run(Source.CALIBRATED, FULL_SIZES, FULL_NANOS, progress);
    }

    /**
     * Returns the quick probe's rates (measured once per JVM, two to three seconds): every kind
     * at 2^12 and 2^20 amplitudes, on one thread and on every processor, after a warm-up of the
     * loops, in two sweeps keeping the lower time of each (the first sweep can catch a loop
     * the JIT compiler is still compiling); the tableau's and the matrix product state's rates
     * when a forecast first needs them.
     *
     * @return the rates, {@link Source#QUICK_PROBE}
     */
    public static synchronized Calibration quickProbe() {
        if (probe == null) {
            probe = run(Source.QUICK_PROBE, QUICK_SIZES, QUICK_NANOS, line -> { });
        }
        return probe;
    }

    private static Calibration run(Source source, int[] sizes, long nanos,
            Consumer<String> progress) {
        try {
            return timeEveryRate(source, sizes, nanos, progress);
        } finally {
            KernelTimer.release();
        }
    }

    private static Calibration timeEveryRate(Source source, int[] sizes, long nanos,
            Consumer<String> progress) {
        int all = Parallel.defaultThreads();
        // Every kind round after round on the smallest size for at least WARM_NANOS and until
        // the JIT compiler has been idle for a whole round (its total compilation time did
        // not grow), at most four times WARM_NANOS (twice for the quick probe): the vector
        // path's loops run a hundred times slower until C2 has compiled them, which takes a few
        // tenths of a second after their first call on this machine. Then a round on every
        // thread.
        java.lang.management.CompilationMXBean jit = java.lang.management.ManagementFactory
                .getCompilationMXBean();
        boolean watch = jit != null && jit.isCompilationTimeMonitoringSupported();
        boolean quick = source == Source.QUICK_PROBE;
        long start = System.nanoTime();
        while (true) {
            long before = watch ? jit.getTotalCompilationTime() : 0;
            for (int k = 0; k < Workload.KINDS; k++) {
                KernelTimer.nanosPerUnit(k, sizes[0], 1, 0);
            }
            KernelTimer.longGroupNanos(sizes[0], 1, 0, false);
            KernelTimer.windowGatesNanos(0, false);
            long spent = System.nanoTime() - start;
            boolean idle = !watch || jit.getTotalCompilationTime() == before;
            if ((idle && spent >= WARM_NANOS) || spent >= (quick ? 2 : 4) * WARM_NANOS) {
                break;
            }
        }
        KernelTimer.nanosPerUnit(Workload.DENSE1, Parallel.MIN_PARALLEL_QUBITS, all, 0);
        double[][][] r = new double[ROWS][2][sizes.length];
        // A calibration times every size twice, a minute apart, and keeps the lower median of
        // each rate: other work on the machine only ever slows a timing down, and a burst of
        // it during one sweep (seen on the shared machine of record: one rate three times its
        // neighbours) then does not reach the file. The quick probe sweeps twice too, right
        // after each other: with the vector path's loops its first sweep caught loops still
        // being compiled (rates of 50 to 200 ns an amplitude at 2^12 against 0.4 to 5, so a
        // 4 s run was forecast at 1.5 to 4 minutes); its second sweep finds them compiled.
        for (int sweep = 0; sweep < 2; sweep++) {
            for (int s = 0; s < sizes.length; s++) {
                for (int t = 0; t < 2; t++) {
                    int threads = t == 0 ? 1 : all;
                    for (int k = 0; k < ROWS; k++) {
                        double v = k == LONG_GROUP
                                ? KernelTimer.longGroupNanos(sizes[s], threads, nanos, quick)
                                : k == WINDOW_GATE ? KernelTimer.windowGatesNanos(nanos, quick)
                                : KernelTimer.nanosPerUnit(k, sizes[s], threads, nanos, quick);
                        r[k][t][s] = sweep == 0 ? v : Math.min(r[k][t][s], v);
                    }
                }
                progress.accept(String.format(Locale.ROOT, "%s2^%d amplitudes: dense 1-qubit"
                        + " %.2f ns per amplitude on 1 thread, %.2f on %d", sweep == 0 ? ""
                        : "again, ", sizes[s], r[Workload.DENSE1][0][s],
                        r[Workload.DENSE1][1][s], all));
            }
        }
        double[] shot = EngineRates.shotNanos(nanos, quick ? 20_000 : 400_000);
        double[] plan = EngineRates.planNanos(nanos);
        Instant now = Instant.now().truncatedTo(ChronoUnit.SECONDS);
        if (quick) {
            return new Calibration(source, now, KernelTimer.path(), all, sizes.clone(), r, shot,
                    plan, new Extras(nanos), "");
        }
        double[] tab = EngineRates.tableauNanos(nanos, false);
        double mps = EngineRates.mpsUnitNanos(nanos, false);
        progress.accept(String.format(Locale.ROOT, "tallying %.0f ns per shot and %.1f per bit;"
                + " tableau %.0f ns per gate and %.2f per word, %.0f ns per measurement, %.2f"
                + " per column and %.2f per word", shot[0], shot[1], tab[TableauCost.GATES],
                tab[TableauCost.GATE_WORDS], tab[TableauCost.MEASUREMENTS],
                tab[TableauCost.MEASURE_COLUMNS], tab[TableauCost.MEASURE_WORDS]));
        return new Calibration(source, now, KernelTimer.path(), all, sizes.clone(), r,
                others(shot, tab, plan, mps), "");
    }


    /**
     * Returns the rates {@link Simulator#forecast} uses: the calibration file's when it exists,
     * reads and matches this machine (processors and kernel loops), else the quick probe's,
     * whose {@link #describe()} then says why the file was not used.
     *
     * @return the rates
     */
    public static Calibration current() {
        Path f = file();
        String why;
        if (!Files.exists(f)) {
            why = "no calibration file at " + f + "; run the calibrate command for better"
                    + " figures";
        } else {
            try {
                Calibration c = read(f);
                String stale = c.staleness();
                if (stale == null) {
                    return c;
                }
                why = "the calibration file " + f + " is stale: " + stale + "; calibrate again";
            } catch (IOException | IllegalArgumentException e) {
                why = "the calibration file " + f + " was not used: " + e.getMessage();
            }
        }
        Calibration q = quickProbe();
        return new Calibration(q.source, q.made, q.kernels, q.processors, q.sizes, q.rates,
                new double[] {q.shotNanos, q.shotBitNanos}, new double[] {q.planNanos,
                    q.fuseNanos, q.tableNanos}, q.extras, why);
    }

    /**
     * Returns the calibration file's rates when the file exists, reads and matches this machine;
     * never probes.
     *
     * @return the saved rates, or empty
     */
    public static java.util.Optional<Calibration> saved() {
        Path f = file();
        if (!Files.exists(f)) {
            return java.util.Optional.empty();
        }
        try {
            Calibration c = read(f);
            return c.staleness() == null ? java.util.Optional.of(c) : java.util.Optional.empty();
        } catch (IOException | IllegalArgumentException e) {
            return java.util.Optional.empty();
        }
    }

    /** Why this calibration does not describe the machine as it runs now, or null. */
    String staleness() {
        String now = KernelTimer.path();
        if (!kernels.equals(now)) {
            return "made with " + kernels + ", the kernels now run " + now;
        }
        int all = Parallel.defaultThreads();
        if (processors != all) {
            return "made on " + processors + " processor(s), this JVM has " + all;
        }
        return null;
    }

    /**
     * Returns the calibration file: {@code machine-rates.properties} in the folder named by the
     * system property {@value #FOLDER_PROPERTY}, else {@code $XDG_CONFIG_HOME/qsim}, else
     * {@code ~/.config/qsim}.
     *
     * @return the path (the file may not exist)
     */
    public static Path file() {
        String dir = System.getProperty(FOLDER_PROPERTY);
        if (dir != null && !dir.isBlank()) {
            return Paths.get(dir).resolve(FILE_NAME);
        }
        String xdg = System.getenv("XDG_CONFIG_HOME");
        Path base = xdg != null && !xdg.isBlank() && Paths.get(xdg).isAbsolute() ? Paths.get(xdg)
                : Paths.get(System.getProperty("user.home"), ".config");
        return base.resolve("qsim").resolve(FILE_NAME);
    }

    /**
     * Writes these rates to {@link #file()} (folders made as needed, the old file replaced in
     * one move).
     *
     * @return the file written
     * @throws IOException if it cannot be written
     */
    public Path save() throws IOException {
        Path f = file().toAbsolutePath();
        Files.createDirectories(f.getParent());
        Path tmp = Files.createTempFile(f.getParent(), FILE_NAME, ".tmp");
        try {
            Files.writeString(tmp, text(), StandardCharsets.UTF_8);
            Files.move(tmp, f, StandardCopyOption.REPLACE_EXISTING,
                    StandardCopyOption.ATOMIC_MOVE);
        } finally {
            Files.deleteIfExists(tmp);
        }
        return f;
    }

    /** The file's text: a comment, then key = value lines. */
    String text() {
        StringBuilder sb = new StringBuilder();
        sb.append("# qsim machine rates: nanoseconds per amplitude of each kind of pass\n");
        sb.append("# (columns: the sizes, in qubits), on one thread and on every processor\n");
        sb.append("format = ").append(FORMAT).append('\n');
        sb.append("source = ").append(source == Source.CALIBRATED ? "calibrated" : "quick-probe")
                .append('\n');
        sb.append("made = ").append(made).append('\n');
        sb.append("kernels = ").append(kernels).append('\n');
        sb.append("processors = ").append(processors).append('\n');
        sb.append("sizes =");
        for (int s : sizes) {
            sb.append(' ').append(s);
        }
        sb.append('\n');
        for (int k = 0; k < ROWS; k++) {
            for (int t = 0; t < 2; t++) {
                sb.append("rate.").append(KEYS[k]).append(t == 0 ? ".one" : ".all").append(" =");
                for (double v : rates[k][t]) {
                    sb.append(' ').append(String.format(Locale.ROOT, "%.5g", v));
                }
                sb.append('\n');
            }
        }
        double[] o = others();
        for (int i = 0; i < OTHER_KEYS.length; i++) {
            sb.append(OTHER_KEYS[i]).append(" = ").append(String.format(Locale.ROOT, "%.5g",
                    o[i])).append('\n');
        }
        return sb.toString();
    }

    /**
     * Reads a calibration file; every value is checked (finite, positive, sizes ascending).
     *
     * @param f the file
     * @return the rates it holds
     * @throws IOException if it cannot be read
     * @throws IllegalArgumentException if it is not a calibration file of this format; the
     *     message names the key and the value
     */
    static Calibration read(Path f) throws IOException {
        String text = TextFiles.withoutBom(TextFiles.readUtf8(f, MAX_FILE_BYTES,
                "a calibration file"));
        Properties p = new Properties();
        try {
            p.load(new StringReader(text));
        } catch (IllegalArgumentException | IOException e) {
            throw new IllegalArgumentException("it is not a properties file: " + e.getMessage());
        }
        int format = (int) number(p, "format", 1, 1000);
        if (format != FORMAT) {
            throw new IllegalArgumentException("it has format " + format + ", this version reads"
                    + " format " + FORMAT);
        }
        Instant made;
        try {
            made = Instant.parse(value(p, "made"));
        } catch (DateTimeParseException e) {
            throw new IllegalArgumentException("'made' is not a time: "
                    + dev.qsim.internal.Checks.excerpt(value(p, "made")));
        }
        String kernels = value(p, "kernels");
        int processors = (int) number(p, "processors", 1, Parallel.MAX_THREADS);
        double[] s = numbers(p, "sizes", 1, 40, -1);
        if (s.length < 1 || s.length > 16) {
            throw new IllegalArgumentException("'sizes' has " + s.length + " values; 1 to 16"
                    + " are allowed");
        }
        int[] sizes = new int[s.length];
        for (int i = 0; i < s.length; i++) {
            sizes[i] = (int) s[i];
            if (sizes[i] != s[i] || (i > 0 && sizes[i] <= sizes[i - 1])) {
                throw new IllegalArgumentException("'sizes' must be whole qubit counts in"
                        + " ascending order");
            }
        }
        double[][][] r = new double[ROWS][2][];
        for (int k = 0; k < ROWS; k++) {
            for (int t = 0; t < 2; t++) {
                r[k][t] = numbers(p, "rate." + KEYS[k] + (t == 0 ? ".one" : ".all"), 0, 1e9,
                        sizes.length);
            }
        }
        double[] other = new double[OTHER_KEYS.length];
        for (int i = 0; i < other.length; i++) {
            other[i] = number(p, OTHER_KEYS[i], 0, 1e9);
        }
        String from = p.getProperty("source", "calibrated").trim();
        if (!from.equals("calibrated") && !from.equals("quick-probe")) {
            throw new IllegalArgumentException("'source' holds " + dev.qsim.internal.Checks
                    .excerpt(from) + "; calibrated or quick-probe are allowed");
        }
        return new Calibration(from.equals("calibrated") ? Source.CALIBRATED : Source.QUICK_PROBE,
                made, kernels, processors, sizes, r, other, "");
    }

    private static String value(Properties p, String key) {
        String v = p.getProperty(key);
        if (v == null) {
            throw new IllegalArgumentException("the key '" + key + "' is missing");
        }
        return v.trim();
    }

    private static double number(Properties p, String key, double min, double max) {
        return numbers(p, key, min, max, 1)[0];
    }

    /** Whitespace-separated numbers in [min, max]; {@code count} of them unless negative. */
    private static double[] numbers(Properties p, String key, double min, double max,
            int count) {
        String v = value(p, key);
        String[] parts = v.isEmpty() ? new String[0] : v.split("\\s+", 20);
        if (count >= 0 && parts.length != count) {
            throw new IllegalArgumentException("'" + key + "' has " + parts.length
                    + " value(s); " + count + " expected");
        }
        double[] out = new double[parts.length];
        for (int i = 0; i < parts.length; i++) {
            double x;
            try {
                x = Double.parseDouble(parts[i]);
            } catch (NumberFormatException e) {
                x = Double.NaN;
            }
            if (!(x >= min && x <= max)) {
                throw new IllegalArgumentException("'" + key + "' holds "
                        + dev.qsim.internal.Checks.excerpt(parts[i]) + "; numbers from " + min
                        + " to " + max + " are allowed");
            }
            out[i] = x;
        }
        return out;
    }

    /**
     * Nanoseconds per unit of a kind of pass on a state of n qubits with the given threads.
     * Below 2^16 amplitudes the kernels run on one thread whatever is asked.
     */
    double nanos(int kind, int n, int threads) {
        return table.nanos(kind, n, threads);
    }

    /**
     * Nanoseconds per unit of a kind done on blocks in cache, in a state of n qubits
     * ({@link RateTable#cached}).
     */
    double cached(int kind, int n, int threads, int workers) {
        return table.cached(kind, n, threads, workers);
    }

    private double[] others() {
        return others(new double[] {shotNanos, shotBitNanos}, extras.tableau(),
                new double[] {planNanos, fuseNanos, tableNanos}, extras.mps());
    }

    /** The values of {@link #OTHER_KEYS} in order. */
    private static double[] others(double[] shot, double[] tab, double[] plan, double mps) {
        double[] o = new double[OTHER_KEYS.length];
        o[0] = shot[0];
        o[1] = shot[1];
        System.arraycopy(tab, 0, o, 2, TableauCost.TERMS);
        o[2 + TableauCost.TERMS] = plan[0];
        o[3 + TableauCost.TERMS] = plan[1];
        o[4 + TableauCost.TERMS] = mps;
        o[5 + TableauCost.TERMS] = plan[2];
        return o;
    }

    private static String[] otherKeys() {
        String[] k = new String[TABLEAU_KEYS.length + 6];
        k[0] = "shot";
        k[1] = "shot.bit";
        System.arraycopy(TABLEAU_KEYS, 0, k, 2, TABLEAU_KEYS.length);
        k[2 + TABLEAU_KEYS.length] = "plan.gate";
        k[3 + TABLEAU_KEYS.length] = "fuse.gate";
        k[4 + TABLEAU_KEYS.length] = "mps.unit";
        k[5 + TABLEAU_KEYS.length] = "table.entry";
        return k;
    }

    /** Nanoseconds to plan one gate (frame, conjugation, kernel layout), beyond its passes. */
    double planNanos() {
        return planNanos;
    }

    /** Nanoseconds to build a merged run's tables, per entry and gate. */
    double tableNanos() {
        return tableNanos;
    }

    /** Nanoseconds per gate read by gate fusion (grouping and multiplying matrices). */
    double fuseNanos() {
        return fuseNanos;
    }

    /** Nanoseconds per unit of matrix-product-state work ({@link MpsCost}). */
    double mpsUnitNanos() {
        return extras.mps();
    }

    /** Nanoseconds per shot drawn and tallied. */
    double shotNanos() {
        return shotNanos;
    }

    /** Nanoseconds per classical bit of a shot tallied. */
    double shotBitNanos() {
        return shotBitNanos;
    }

    /** Tableau rates, nanoseconds per unit of each of {@link TableauCost}'s terms. */
    double[] tableauRates() {
        return extras.tableau().clone();
    }

    /**
     * Returns how these rates were obtained.
     *
     * @return the source
     */
    public Source source() {
        return source;
    }

    /**
     * Returns when the rates were measured (to the second).
     *
     * @return the time
     */
    public Instant made() {
        return made;
    }

    /**
     * Returns the kernel loops the rates were measured with, as {@code "scalar loops"} or the
     * vector path's description.
     *
     * @return the description
     */
    public String kernels() {
        return kernels;
    }

    /**
     * Returns the processor count the rates were measured on.
     *
     * @return the processors
     */
    public int processors() {
        return processors;
    }

    /**
     * Says in words which rates these are, such as {@code "calibrated 2026-12-05T05:01:10Z
     * (scalar loops, 2 processors)"} or {@code "quick probe (no calibration file at ...)"}.
     *
     * @return the description
     */
    public String describe() {
        String what = (source == Source.CALIBRATED ? "calibrated " + made : "quick probe") + " ("
                + kernels + ", " + processors + " processor" + (processors == 1 ? "" : "s")
                + ")";
        return note.isEmpty() ? what : what + "; " + note;
    }

    /**
     * Returns {@link #describe()}.
     *
     * @return the text
     */
    @Override
    public String toString() {
        return describe();
    }
}
