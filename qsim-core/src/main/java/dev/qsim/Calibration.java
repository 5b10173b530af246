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
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Objects;
import java.util.Properties;
import java.util.function.Consumer;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.internal.TextFiles;
import dev.qsim.kernel.KernelTimer;
import dev.qsim.kernel.Parallel;
import dev.qsim.kernel.Workload;

/**
 * This machine's measured speeds, which {@link Simulator#forecast(Circuit, int)} uses to turn
 * counted work into time: nanoseconds per amplitude for each kind of pass over memory (dense
 * gates of one to four qubits, diagonal and permutation gates, cache-blocked groups, single
 * precision windows, copies, measurements, sampling) at a few state sizes in and out of cache,
 * on one thread and on every processor; nanoseconds per shot drawn; and the stabilizer
 * tableau's time per word. Immutable and thread-safe.
 *
 * <p>{@link #measure(Consumer)} takes about a minute and {@link #save()} keeps the result in a
 * small versioned text file in the user's configuration folder ({@link #file()}); without one,
 * {@link #current()} makes a {@linkplain #quickProbe() quick probe} of a second or two, once per
 * JVM. A file made on another number of processors or with other kernel loops (the scalar or
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
    public static final int FORMAT = 4;
    /** System property naming the folder of the calibration file (tests use a temporary one). */
    public static final String FOLDER_PROPERTY = "qsim.config.dir";
    /** The calibration file's name inside the folder. */
    public static final String FILE_NAME = "machine-rates.properties";

    /** How a set of rates was obtained. */
    public enum Source {
        /** Measured by {@link #measure(Consumer)}, kept in the calibration file. */
        CALIBRATED,
        /** The built-in quick probe of a second or two. */
        QUICK_PROBE
    }

    static final int[] FULL_SIZES = {12, 16, 20, 23};
    static final int[] QUICK_SIZES = {12, 20};
    private static final long FULL_NANOS = 150_000_000L;
    private static final long QUICK_NANOS = 6_000_000L;
    private static final long MAX_FILE_BYTES = 64 * 1024;
    private static final String[] KEYS = {"dense1", "dense1-controlled", "dense2", "dense3",
        "dense4", "diagonal", "permutation", "block-group", "window-group", "float1", "phases",
        "copy", "measure", "sample", "reduce", "window-group-double", "dense1-half", "block-gate"};
    /** The rate row of one more dense 1-qubit gate in a cache-blocked group, per amplitude. */
    private static final int BLOCK_GATE = Workload.KINDS;
    private static final int ROWS = Workload.KINDS + 1;

    /** Tableau rates, in the order of {@link TableauCost}'s terms. */
    private static final String[] TABLEAU_KEYS = {"tableau.run", "tableau.table.word",
        "tableau.gate", "tableau.gate.word", "tableau.measure", "tableau.measure.column",
        "tableau.measure.word", "tableau.batch.step", "tableau.batch.row", "tableau.shot"};

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
     * [kind][0: one thread, 1: all processors][size index], nanoseconds per unit; the row
     * after the kinds ({@link #BLOCK_GATE}) is one more gate in a cache-blocked group.
     */
    private final double[][][] rates;
    private final double shotNanos;
    private final double shotBitNanos;
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
                tableau = tableauNanos(nanos, true);
            }
            return tableau;
        }

        synchronized double mps() {
            if (Double.isNaN(mps)) {
                mps = mpsUnitNanos(nanos, true);
            }
            return mps;
        }
    }

    private Calibration(Source source, Instant made, String kernels, int processors, int[] sizes,
            double[][][] rates, double[] other, String note) {
        this.source = source;
        this.made = made;
        this.kernels = kernels;
        this.processors = processors;
        this.sizes = sizes;
        this.rates = rates;
        this.shotNanos = other[0];
        this.shotBitNanos = other[1];
        int t = TableauCost.TERMS;
        this.planNanos = other[2 + t];
        this.fuseNanos = other[3 + t];
        this.extras = new Extras(Arrays.copyOfRange(other, 2, 2 + t), other[4 + t]);
        this.note = note;
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
        this.shotNanos = shot[0];
        this.shotBitNanos = shot[1];
        this.planNanos = plan[0];
        this.fuseNanos = plan[1];
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
     * Returns the quick probe's rates (measured once per JVM, a second or two): every kind at
     * 2^12 and 2^20 amplitudes, on one thread and on every processor, after a warm-up of the
     * loops; the tableau's and the matrix product state's rates when a forecast first needs
     * them.
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
        // not grow), at most four times WARM_NANOS: the vector path's loops run a hundred
        // times slower until C2 has compiled them, which takes a few tenths of a second after
        // their first call on this machine. Then a round on every thread.
        java.lang.management.CompilationMXBean jit = java.lang.management.ManagementFactory
                .getCompilationMXBean();
        boolean watch = jit != null && jit.isCompilationTimeMonitoringSupported();
        long start = System.nanoTime();
        while (true) {
            long before = watch ? jit.getTotalCompilationTime() : 0;
            for (int k = 0; k < Workload.KINDS; k++) {
                KernelTimer.nanosPerUnit(k, sizes[0], 1, 0);
            }
            KernelTimer.blockGateNanos(sizes[0], 1, 0, false);
            long spent = System.nanoTime() - start;
            boolean idle = !watch || jit.getTotalCompilationTime() == before;
            if ((idle && spent >= WARM_NANOS) || spent >= 4 * WARM_NANOS) {
                break;
            }
        }
        KernelTimer.nanosPerUnit(Workload.DENSE1, Parallel.MIN_PARALLEL_QUBITS, all, 0);
        double[][][] r = new double[ROWS][2][sizes.length];
        boolean quick = source == Source.QUICK_PROBE;
        // A calibration times every size twice, a minute apart, and keeps the lower median of
        // each rate: other work on the machine only ever slows a timing down, and a burst of
        // it during one sweep (seen on the shared machine of record: one rate three times its
        // neighbours) then does not reach the file. The quick probe sweeps once.
        int sweeps = quick ? 1 : 2;
        for (int sweep = 0; sweep < sweeps; sweep++) {
            for (int s = 0; s < sizes.length; s++) {
                for (int t = 0; t < 2; t++) {
                    int threads = t == 0 ? 1 : all;
                    for (int k = 0; k < ROWS; k++) {
                        double v = k == BLOCK_GATE
                                ? KernelTimer.blockGateNanos(sizes[s], threads, nanos, quick)
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
        double[] shot = shotNanos(nanos, quick ? 20_000 : 400_000);
        double[] plan = planNanos(nanos);
        Instant now = Instant.now().truncatedTo(ChronoUnit.SECONDS);
        if (quick) {
            return new Calibration(source, now, KernelTimer.path(), all, sizes.clone(), r, shot,
                    plan, new Extras(nanos), "");
        }
        double[] tab = tableauNanos(nanos, false);
        double mps = mpsUnitNanos(nanos, false);
        progress.accept(String.format(Locale.ROOT, "tallying %.0f ns per shot and %.1f per bit;"
                + " tableau %.0f ns per gate and %.2f per word, %.0f ns per measurement, %.2f"
                + " per column and %.2f per word", shot[0], shot[1], tab[TableauCost.GATES],
                tab[TableauCost.GATE_WORDS], tab[TableauCost.MEASUREMENTS],
                tab[TableauCost.MEASURE_COLUMNS], tab[TableauCost.MEASURE_WORDS]));
        return new Calibration(source, now, KernelTimer.path(), all, sizes.clone(), r,
                others(shot, tab, plan, mps), "");
    }

    /**
     * Nanoseconds per unit of matrix-product-state work ({@link MpsCost}): two-site updates on
     * the middle bonds of a 12-qubit chain held at bond dimension 32, each a split of a
     * 64 x 64 block, {@code 64³} units.
     */
    private static double mpsUnitNanos(long nanos, boolean quick) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(31L);
        int n = 12;
        int chi = 32;
        dev.qsim.mps.MatrixProductState s = dev.qsim.mps.MatrixProductState.zero(n, chi, 0);
        for (int layer = 0; layer < 2 * n; layer++) {
            for (int q = layer % 2; q + 1 < n; q += 2) {
                s.apply(Gates.u(1 + rng.nextDouble(), rng.nextDouble(), rng.nextDouble())
                        .tensor(Gates.u(1 + rng.nextDouble(), 0.3, 0.7)).times(Gates.CNOT), q,
                        q + 1);
            }
        }
        Operator g = Gates.u(1.1, 0.2, 0.3).tensor(Gates.u(0.7, 0.4, 0.9)).times(Gates.CNOT);
        int mid = n / 2;
        Runnable eight = () -> {
            for (int r = 0; r < 8; r++) {
                s.apply(g, mid - 1 + (r & 1), mid + (r & 1));
            }
        };
        for (int warm = 0; warm < 6; warm++) {
            eight.run(); // the decomposition's loops compiled before timing
        }
        double perGate = best(eight, quick ? nanos : Math.max(nanos, 30_000_000L)) / 8;
        double block = 2.0 * chi;
        return perGate / (block * block * block);
    }

    /**
     * Nanoseconds per shot drawn from a final state and tallied beyond the sampling pass: per
     * shot, and per classical bit of a shot (from registers of 4 and 20 bits).
     */
    private static double[] shotNanos(long nanos, int many) {
        double[] per = new double[2];
        int[] widths = {4, 20};
        for (int i = 0; i < 2; i++) {
            Circuit c = spread(widths[i]).measure().build();
            Simulator sim = Simulator.seeded(1).withThreads(1).withFusion(false);
            double few = best(() -> sim.run(c, 1), nanos);
            double lots = best(() -> sim.run(c, many), nanos);
            per[i] = Math.max(1, (lots - few) / many);
        }
        double bit = Math.max(0, (per[1] - per[0]) / (widths[1] - widths[0]));
        return new double[] {Math.max(1, per[0] - bit * widths[0]), bit};
    }

    /**
     * Tableau rates, nanoseconds per unit of each of {@link TableauCost}'s terms, fitted by
     * least squares (relative residuals, no rate below zero) to runs at several sizes, chosen
     * so that each term dominates somewhere: random H, S and CNOT circuits of two lengths
     * without measurements (per run and per table word from what the lengths share, per gate
     * where the table is one word high and per gate word where it is many), the longer one
     * with every qubit measured once (per measurement, per column, per word), and that one
     * with many shots (per replayed step and row, per shot: the tableau's tally is fitted
     * with it, not priced at the state vector's shot rates).
     */
    private static double[] tableauNanos(long nanos, boolean quick) {
        int[] sizes = quick ? new int[] {32, 160, 640} : new int[] {32, 96, 256, 512, 1024};
        int shots = quick ? 640 : 3200;
        long each = Math.max(1_000_000L, quick ? nanos : nanos / 3);
        List<double[]> x = new ArrayList<>();
        List<Double> y = new ArrayList<>();
        // Through the library call a user makes: its checks and engine choice cost per gate.
        Simulator tableau = Simulator.seeded(3).withEngine(Simulator.Engine.TABLEAU);
        for (int pass = 0; pass < 2; pass++) {
            boolean warm = pass == 0;
            for (int n : sizes) {
                if (warm && n > sizes[1]) {
                    continue; // the small sizes compile the loops; no rows from them
                }
                Circuit shortRun = clifford(n, 600).build();
                Circuit.Builder longGates = clifford(n, 3000);
                Circuit longRun = longGates.build();
                Circuit measured = clifford(n, 600).measure().build();
                Object[][] runs = {{shortRun, 1}, {longRun, 1}, {measured, 1},
                    {measured, shots}};
                for (Object[] run : runs) {
                    Circuit c = (Circuit) run[0];
                    int s = (Integer) run[1];
                    double t = best(() -> tableau.run(c, s), warm ? 0 : each);
                    if (!warm) {
                        x.add(TableauCost.terms(c, s));
                        y.add(t);
                    }
                }
            }
        }
        return nonNegativeFit(x, y);
    }

    /** Random H, S and CNOT gates on n qubits, seeded. */
    private static Circuit.Builder clifford(int n, int gates) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(17L);
        Circuit.Builder b = Circuit.builder(n);
        for (int g = 0; g < gates; g++) {
            int q = rng.nextInt(n);
            int p = (q + 1 + rng.nextInt(n - 1)) % n;
            if (g % 3 == 0) {
                b.h(q);
            } else if (g % 3 == 1) {
                b.s(q);
            } else {
                b.cnot(q, p);
            }
        }
        return b;
    }

    /**
     * Least squares with no coefficient below zero, residuals relative to y: solves the
     * normal equations on the columns still in play, and while some coefficient is negative,
     * takes the most negative out (the active-set idea of C. L. Lawson and R. J. Hanson,
     * "Solving Least Squares Problems", Prentice-Hall 1974, chapter 23, in its simplest
     * form). Columns that are zero in every row, or that depend on the others, get 0.
     */
    static double[] nonNegativeFit(List<double[]> x, List<Double> y) {
        int m = x.get(0).length;
        boolean[] on = new boolean[m];
        for (double[] row : x) {
            for (int j = 0; j < m; j++) {
                on[j] |= row[j] != 0;
            }
        }
        while (true) {
            double[] c = leastSquares(x, y, on);
            int worst = -1;
            for (int j = 0; j < m; j++) {
                if (on[j] && c[j] < 0 && (worst < 0 || c[j] < c[worst])) {
                    worst = j;
                }
            }
            if (worst < 0) {
                return c;
            }
            on[worst] = false;
        }
    }

    /**
     * Weighted least squares (rows divided by |y|) over the columns marked on, by the normal
     * equations on columns scaled to unit size; a column that depends on the others (its
     * pivot vanishes) is marked off and gets 0.
     */
    private static double[] leastSquares(List<double[]> x, List<Double> y, boolean[] on) {
        int m = on.length;
        while (true) {
            int k = 0;
            int[] idx = new int[m];
            for (int j = 0; j < m; j++) {
                if (on[j]) {
                    idx[k++] = j;
                }
            }
            double[] scale = new double[k];
            for (int i = 0; i < x.size(); i++) {
                double w = 1 / Math.max(1e-9, Math.abs(y.get(i)));
                for (int j = 0; j < k; j++) {
                    scale[j] = Math.max(scale[j], Math.abs(x.get(i)[idx[j]] * w));
                }
            }
            double[][] a = new double[k][k + 1];
            for (int i = 0; i < x.size(); i++) {
                double w = 1 / Math.max(1e-9, Math.abs(y.get(i)));
                double[] row = x.get(i);
                for (int j = 0; j < k; j++) {
                    double xj = row[idx[j]] * w / scale[j];
                    for (int l = 0; l < k; l++) {
                        a[j][l] += xj * row[idx[l]] * w / scale[l];
                    }
                    a[j][k] += xj * y.get(i) * w;
                }
            }
            // Elimination without pivoting (the matrix is symmetric, positive semidefinite).
            int dependent = -1;
            for (int j = 0; j < k && dependent < 0; j++) {
                if (a[j][j] < 1e-9) {
                    dependent = idx[j];
                    break;
                }
                for (int r = j + 1; r < k; r++) {
                    double f = a[r][j] / a[j][j];
                    for (int l = j; l <= k; l++) {
                        a[r][l] -= f * a[j][l];
                    }
                }
            }
            if (dependent >= 0) {
                on[dependent] = false;
                continue;
            }
            double[] d = new double[k];
            for (int j = k - 1; j >= 0; j--) {
                double v = a[j][k];
                for (int l = j + 1; l < k; l++) {
                    v -= a[j][l] * d[l];
                }
                d[j] = v / a[j][j];
            }
            double[] c = new double[m];
            for (int j = 0; j < k; j++) {
                c[idx[j]] = d[j] / scale[j];
            }
            return c;
        }
    }

    /**
     * Nanoseconds to plan one gate (with the run's check of the circuit and choice of engine,
     * {@link Simulator#explain}), and to fuse one gate, on a random 16-qubit circuit of
     * rotation layers with CZ and CNOT gates (the planning is timed on a storage without
     * amplitudes, so no pass is included).
     */
    private static double[] planNanos(long nanos) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(29L);
        int n = 16;
        Circuit.Builder b = Circuit.builder(n);
        for (int layer = 0; layer < 40; layer++) {
            for (int q = 0; q < n; q++) {
                b.ry(q, 0.1 + rng.nextDouble());
                b.rz(q, 0.1 + rng.nextDouble());
            }
            for (int q = layer % 2; q + 1 < n; q += 2) {
                b.cz(q, q + 1);
            }
            b.cnot(rng.nextInt(n / 2), n / 2 + rng.nextInt(n / 2));
        }
        List<Instruction> gates = b.build().instructions();
        List<dev.qsim.kernel.GateOp> plans = new java.util.ArrayList<>();
        for (Instruction g : gates) {
            plans.add(g.plan());
        }
        double plan = best(() -> Workload.of(n, false).gates(plans), nanos) / plans.size();
        double fuse = best(() -> Fusion.fuse(gates), nanos) / gates.size();
        // A run also checks the circuit and chooses its engine, per gate.
        Circuit c = b.build();
        Simulator sim = Simulator.seeded(1);
        double choose = best(() -> sim.explain(c, 1000), nanos) / gates.size();
        return new double[] {plan + choose, fuse};
    }

    private static double best(Runnable r, long nanos) {
        double[] t = new double[16];
        int count = 0;
        r.run();
        long start = System.nanoTime();
        while (count < t.length && (count < 3 || System.nanoTime() - start < nanos)) {
            long t0 = System.nanoTime();
            r.run();
            t[count++] = System.nanoTime() - t0;
        }
        Arrays.sort(t, 0, count);
        return t[count / 2];
    }

    /** A layer of Hadamards on n qubits (a spread distribution to sample from). */
    static Circuit.Builder spread(int n) {
        Circuit.Builder b = Circuit.builder(n);
        for (int q = 0; q < n; q++) {
            b.h(q);
        }
        return b;
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
                    q.fuseNanos}, q.extras, why);
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
        if (kind == Workload.BLOCK_STREAM || kind == Workload.WINDOW_STREAM
                || kind == Workload.WINDOW_STREAM_DOUBLE) {
            // The group was timed with its in-cache gates; keep the streaming part.
            double group = raw(kind, n, threads);
            double inCache = KernelTimer.GROUP_GATES * raw(BLOCK_GATE, n, threads);
            return Math.max(0.1 * group, group - inCache);
        }
        return raw(kind, n, threads);
    }

    /**
     * Nanoseconds per unit of a kind done on blocks in cache, in a state of n qubits: the
     * kind's rate on a state that fits in cache, times how much slower or faster one more gate
     * in a blocked group runs at n qubits on {@code threads} threads than in that small state;
     * {@code workers} independent states at once share the processors.
     */
    double cached(int kind, int n, int threads, int workers) {
        double small = raw(BLOCK_GATE, sizes[0], 1);
        double scale = small > 0 ? raw(BLOCK_GATE, n, threads) / small : 1;
        return raw(kind, sizes[0], 1) * scale / Math.max(1, Math.min(workers, processors));
    }

    private double raw(int kind, int n, int threads) {
        double one = interpolate(rates[kind][0], n);
        if (threads <= 1 || n < Parallel.MIN_PARALLEL_QUBITS) {
            return one;
        }
        double all = interpolate(rates[kind][1], n);
        if (threads >= processors || processors == 1) {
            return all;
        }
        return one + (all - one) * (threads - 1) / (processors - 1);
    }

    private double interpolate(double[] v, int n) {
        if (n <= sizes[0]) {
            return v[0];
        }
        for (int i = 1; i < sizes.length; i++) {
            if (n <= sizes[i]) {
                double f = (n - sizes[i - 1]) / (double) (sizes[i] - sizes[i - 1]);
                return v[i - 1] + f * (v[i] - v[i - 1]);
            }
        }
        return v[v.length - 1];
    }

    private double[] others() {
        return others(new double[] {shotNanos, shotBitNanos}, extras.tableau(),
                new double[] {planNanos, fuseNanos}, extras.mps());
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
        return o;
    }

    private static String[] otherKeys() {
        String[] k = new String[TABLEAU_KEYS.length + 5];
        k[0] = "shot";
        k[1] = "shot.bit";
        System.arraycopy(TABLEAU_KEYS, 0, k, 2, TABLEAU_KEYS.length);
        k[2 + TABLEAU_KEYS.length] = "plan.gate";
        k[3 + TABLEAU_KEYS.length] = "fuse.gate";
        k[4 + TABLEAU_KEYS.length] = "mps.unit";
        return k;
    }

    /** Nanoseconds to plan one gate (frame, conjugation, kernel layout), beyond its passes. */
    double planNanos() {
        return planNanos;
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
