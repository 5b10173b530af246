package dev.qsim.kernel;

import java.util.Arrays;
import java.util.List;

/**
 * Times one pass of each {@link Workload} kind on this machine, through the kernels a run uses
 * (whatever loops {@link #path()} names), for a cost model's rates. Every pass runs on a real
 * state of the given size with unitary gates, so values stay bounded. Internal.
 */
public final class KernelTimer {
    /** Gates in the group timed for the stream kinds. */
    public static final int GROUP_GATES = 8;
    /** Gates in the longer group of {@link #longGroupNanos}. */
    public static final int LONG_GROUP_GATES = 40;
    private static final double H = Math.sqrt(0.5);
    private static final int[] NONE = new int[0];

    private KernelTimer() {
    }

    /**
     * Names the loops the kernels run: the vector lanes' own description when the vector path
     * is built in, else {@code "scalar loops"}. One place, so that a calibration made on the
     * other path is known to be stale.
     *
     * @return the description
     */
    public static String path() {
        try {
            Class<?> lanes = Class.forName("dev.qsim.kernel.Lanes");
            Object d = lanes.getMethod("describe").invoke(null);
            return String.valueOf(d);
        } catch (ReflectiveOperationException | LinkageError e) {
            return "scalar loops";
        }
    }

    /**
     * Returns the median time of one pass of a kind, in nanoseconds per unit of that kind
     * (per amplitude touched, so a controlled gate's pass over half the state is divided by
     * half the state). For {@link Workload#BLOCK_STREAM} the time is that of a whole group of
     * {@value #GROUP_GATES} dense single-qubit gates on the low qubits, per amplitude (the
     * caller subtracts the in-cache part); for {@link Workload#WINDOW_STREAM} and
     * {@link Workload#WINDOW_STREAM_DOUBLE}, the time of a group on single or double storage
     * through {@link Windows} of two dense gates on the two highest qubits (a window gathered
     * from runs of 2^12 amplitudes, as for targets above the cache block), per amplitude, its
     * gates included (the caller subtracts {@link #windowGatesNanos}); for
     * {@link Workload#WINDOW_SHORT} and {@link Workload#WINDOW_SHORT_DOUBLE}, the same with the
     * window read in runs of 2^6 amplitudes. The states are kept between calls
     * of the same size until {@link #release()}.
     *
     * @param kind the kind
     * @param n qubits of the state, 4 to 30
     * @param threads threads, at least 1
     * @param minNanos how long to keep timing after a warm-up, at least
     * @return nanoseconds per unit
     */
    public static double nanosPerUnit(int kind, int n, int threads, long minNanos) {
        return nanosPerUnit(kind, n, threads, minNanos, false);
    }

    /**
     * As {@link #nanosPerUnit(int, int, int, long)}; {@code brief} times two target positions
     * (the lowest and a high one) instead of up to eight and skips the warm-up round, for a
     * quick probe whose loops were already run on a small state.
     *
     * @param kind the kind
     * @param n qubits of the state, 4 to 30
     * @param threads threads, at least 1
     * @param minNanos how long to keep timing, at least
     * @param brief whether to time two positions without a warm-up round
     * @return nanoseconds per unit
     */
    public static double nanosPerUnit(int kind, int n, int threads, long minNanos,
            boolean brief) {
        if (kind >= Workload.DENSITY1 && kind <= Workload.DENSITY_CHANNEL2) {
            return densityNanos(kind, n, threads, minNanos, brief);
        }
        boolean single = kind == Workload.WINDOW_STREAM || kind == Workload.WINDOW_SHORT
                || kind == Workload.FLOAT1;
        Amplitudes a = filled(single ? 2 : 0, n, single);
        Amplitudes other = kind == Workload.COPY ? filled(1, n, false) : null;
        double units = 1;
        // Targets spread over the whole register, low ones included: a kernel's speed depends
        // on its target's position, and circuits use them all.
        int spread = Math.min(n - 1, brief ? 2 : n >= 20 ? 4 : 8);
        if (!positional(kind)) {
            spread = 1; // the same pass whatever the position: one is enough
        }
        int[] rotate = new int[spread];
        for (int r = 0; r < spread; r++) {
            rotate[r] = r == 0 ? 0 : spread == 2 ? n / 2
                    : 1 + (int) ((long) (r - 1) * (n - 3) / Math.max(1, spread - 2));
        }
        Runnable[] step = new Runnable[rotate.length];
        for (int r = 0; r < rotate.length; r++) {
            int q = Math.min(rotate[r], n - 2);
            int[] four = distinct(n, q);
            int q2 = four[1];
            int q3 = four[2];
            switch (kind) {
                case Workload.DENSE1:
                    step[r] = planned(a, dense(new int[] {q}, NONE), threads);
                    break;
                case Workload.DENSE1_HALF:
                    step[r] = planned(a, hadamard(q), threads);
                    break;
                case Workload.DENSE1_HALF_PAIR: {
                    // Two gates in one sweep where the vector loops pair them (targets at or
                    // above a vector); the scalar loops never pair, and time them one by one.
                    int low = a.lanes == null ? 0 : a.lanes.amplitudeLog();
                    int first = Math.min(Math.max(q, low), n - 1);
                    int second = first + 1 < n ? first + 1 : first - 1;
                    GateOp h1 = hadamard(first);
                    GateOp h2 = hadamard(second);
                    if (GatePairs.pairable(a.lanes, a.chunkLog, h1, first, h2, second)) {
                        Plan p = GatePairs.plan(a, first, h1.data, second, h2.data);
                        step[r] = () -> p.apply(threads);
                    } else {
                        Runnable one = planned(a, h1, threads);
                        Runnable two = planned(a, h2, threads);
                        step[r] = () -> {
                            one.run();
                            two.run();
                        };
                    }
                    break;
                }
                case Workload.DENSE1_CONTROLLED:
                    step[r] = planned(a, dense(new int[] {q}, new int[] {q2}), threads);
                    units = 0.5;
                    break;
                case Workload.DENSE2:
                    step[r] = planned(a, dense(new int[] {q, four[2]}, NONE), threads);
                    break;
                case Workload.DENSE3:
                    step[r] = planned(a, dense(new int[] {q3, q, q2}, NONE), threads);
                    break;
                case Workload.DENSE4:
                    step[r] = planned(a, dense(four, NONE), threads);
                    break;
                case Workload.DIAGONAL:
                    step[r] = planned(a, new GateOp(GateOp.DIAGONAL, new int[] {q, four[2]},
                            NONE, phases(4), null), threads);
                    break;
                case Workload.PERMUTATION:
                    step[r] = planned(a, new GateOp(GateOp.MONOMIAL, new int[] {q},
                            new int[] {q2}, new double[] {1, 0, 1, 0}, new int[] {1, 0}), threads);
                    units = 0.5;
                    break;
                case Workload.TABLE_DIAGONAL:
                case Workload.TABLE_COMPLEX:
                case Workload.TABLE_GATHER: {
                    // A ladder on the low qubits (up to a window's); its tables are built once,
                    // as a run builds them once for all the windows of a group.
                    step[r] = planned(a, ladder(Math.min(n, TableKernels.MAX_LOG), kind),
                            threads);
                    break;
                }
                case Workload.BLOCK_STREAM: {
                    int blockLog = Math.min(Frame.CACHE_LOG, a.chunkLog);
                    Plan[] plans = new Plan[GROUP_GATES];
                    for (int g = 0; g < GROUP_GATES; g++) {
                        plans[g] = dense(new int[] {g % Math.max(1, blockLog)}, NONE).plan(a);
                    }
                    step[r] = () -> Plan.applyBlocked(a, plans, blockLog, threads);
                    break;
                }
                case Workload.WINDOW_STREAM:
                case Workload.WINDOW_STREAM_DOUBLE: {
                    // Two gates on the two highest qubits: each window is gathered from runs
                    // of 2^(WINDOW_LOG - 2) amplitudes and does little else; the two gates'
                    // own time in cache is taken off below.
                    List<GateOp> ops = List.of(dense(new int[] {n - 2}, NONE),
                            dense(new int[] {n - 1}, NONE));
                    step[r] = () -> Windows.apply(a, ops, threads);
                    break;
                }
                case Workload.WINDOW_SHORT:
                case Workload.WINDOW_SHORT_DOUBLE: {
                    // The same two gates, in windows read in the shortest runs a group
                    // allows: the window's other qubits are the highest ones below them.
                    List<GateOp> ops = List.of(dense(new int[] {n - 2}, NONE),
                            dense(new int[] {n - 1}, NONE));
                    int w = Math.min(n, Windows.WINDOW_LOG);
                    int low = Math.min(Windows.MIN_RUN_LOG, w - 2);
                    long mask = ((1L << (w - low)) - 1) << (n - (w - low));
                    step[r] = () -> Windows.applyGroup(a, ops, mask, low, threads);
                    break;
                }
                case Workload.FLOAT1: {
                    List<GateOp> ops = List.of(dense(new int[] {q}, NONE));
                    step[r] = () -> Windows.apply(a, ops, threads);
                    break;
                }
                case Workload.PHASES: {
                    double[] p = new double[4 * n];
                    for (int x = 0; x < n; x++) {
                        p[4 * x] = 1;
                        p[4 * x + 2] = Math.cos(0.1 * (x + 1));
                        p[4 * x + 3] = Math.sin(0.1 * (x + 1));
                    }
                    step[r] = () -> {
                        a.phases = p.clone();
                        a.framed = true;
                        Frame.settle(a, threads);
                    };
                    break;
                }
                case Workload.COPY:
                    step[r] = () -> a.copyFrom(other);
                    break;
                case Workload.MEASURE:
                    step[r] = () -> Measurement.measure(a, q, 0.5, threads);
                    break;
                case Workload.SAMPLE: {
                    double[] u = new double[1000];
                    for (int s = 0; s < u.length; s++) {
                        u[s] = (s + 0.5) / u.length;
                    }
                    long[] out = new long[u.length];
                    step[r] = () -> {
                        double[] sums = Reductions.blockSums(a, threads);
                        double total = 0;
                        for (double x : sums) {
                            total += x;
                        }
                        double[] scaled = u.clone();
                        for (int s = 0; s < scaled.length; s++) {
                            scaled[s] *= total;
                        }
                        Reductions.pickIndices(a, sums, scaled, out, threads);
                    };
                    break;
                }
                case Workload.REDUCE: {
                    double[] work = new double[32];
                    int[] qs = {q};
                    step[r] = () -> ReducedStates.of(a, qs, work);
                    break;
                }
                default:
                    throw new IllegalArgumentException("kind " + kind + " is not in [0, "
                            + Workload.KINDS + ")");
            }
        }
        double perUnit = roundNanos(step, minNanos, brief)
                / (units * Math.scalb(1.0, n) * step.length);
        return perUnit;
    }

    /**
     * The density matrix kinds on a storage of {@code n} qubits holding a density matrix of
     * {@code n / 2} qubits (an odd storage leaves its top qubit idle): each pass as that engine
     * makes it ({@code DensityKernels}: a gate on the row qubits and its conjugate on the
     * column qubits, a channel's superoperator on both at once), per pass and amplitude,
     * averaged over the positions of the register (a qubit, or a qubit and the next). Every
     * position is timed up to eight; beyond, the two lowest (the slowest, inside a vector) and
     * a spread of the others standing for the rest, each weighted by the positions it stands
     * for. The brief form times the lowest and a middle one.
     */
    private static double densityNanos(int kind, int n, int threads, long minNanos,
            boolean brief) {
        Amplitudes a = filled(0, n, false);
        int m = n / 2;
        boolean pair = kind == Workload.DENSITY2 || kind == Workload.DENSITY_CHANNEL2;
        int places = pair ? m - 1 : m;
        int[] at;
        double[] weight;
        if (brief) {
            at = new int[] {0, places / 2};
            weight = new double[] {1, places - 1};
        } else if (places <= 8) {
            at = new int[places];
            weight = new double[places];
            for (int i = 0; i < places; i++) {
                at[i] = i;
                weight[i] = 1;
            }
        } else {
            int spread = n <= 20 ? 8 : 4;
            at = new int[spread];
            weight = new double[spread];
            double each = (places - 2) / (double) (spread - 2);
            for (int i = 0; i < spread; i++) {
                at[i] = i < 2 ? i : 2 + (int) ((2L * (i - 2) + 1) * (places - 2)
                        / (2L * (spread - 2)));
                weight[i] = i < 2 ? 1 : each;
            }
        }
        int passes = kind == Workload.DENSITY_CHANNEL1 || kind == Workload.DENSITY_CHANNEL2
                ? 1 : 2;
        double sum = 0;
        double total = 0;
        for (int i = 0; i < at.length; i++) {
            int p = at[i];
            Runnable step;
            switch (kind) {
                case Workload.DENSITY1:
                    step = rowsAndColumns(a, dense(new int[] {p}, NONE),
                            dense(new int[] {p + m}, NONE), threads);
                    break;
                case Workload.DENSITY1_HALF:
                    step = rowsAndColumns(a, hadamard(p), hadamard(p + m), threads);
                    break;
                case Workload.DENSITY2:
                    step = rowsAndColumns(a, dense(new int[] {p, p + 1}, NONE),
                            dense(new int[] {p + m, p + m + 1}, NONE), threads);
                    break;
                case Workload.DENSITY_CHANNEL1:
                    step = planned(a, realHadamards(new int[] {p, p + m}), threads);
                    break;
                default:
                    step = planned(a, realHadamards(new int[] {p, p + 1, p + m, p + m + 1}),
                            threads);
                    break;
            }
            sum += weight[i] * roundNanos(new Runnable[] {step},
                    Math.max(1, minNanos / at.length), brief);
            total += weight[i];
        }
        return sum / total / (passes * Math.scalb(1.0, n));
    }

    /** A gate on the row qubits, then its counterpart on the column qubits. */
    private static Runnable rowsAndColumns(Amplitudes a, GateOp rows, GateOp columns,
            int threads) {
        Runnable r = planned(a, rows, threads);
        Runnable c = planned(a, columns, threads);
        return () -> {
            r.run();
            c.run();
        };
    }

    /**
     * H on each target as one dense matrix (no phases): real entries, as a channel's
     * superoperator has for the common channels (depolarizing, damping, dephasing), and
     * unitary so that the values stay bounded.
     */
    private static GateOp realHadamards(int[] targets) {
        return hadamards(targets, NONE, 0);
    }

    /**
     * Returns the time per amplitude of the two gates of the window kinds' group on one window
     * in cache: the same gates on the two highest qubits of a state of {@code 2^WINDOW_LOG}
     * amplitudes, one thread. The calibration subtracts it from the window kinds' times, shared
     * by the threads. (Subtracting a rate measured elsewhere, one more gate in a cache-blocked
     * group on other targets, mixed two measurements of different gates.)
     *
     * @param minNanos how long to keep timing, at least
     * @param brief whether to skip the warm-up round and keep the lowest round
     * @return nanoseconds per amplitude, both gates
     */
    public static double windowGatesNanos(long minNanos, boolean brief) {
        int w = Windows.WINDOW_LOG;
        Amplitudes small = Amplitudes.allocate(w);
        double v = Math.scalb(1.0, -w) * Math.sqrt(Math.scalb(1.0, w));
        for (double[] c : small.chunks) {
            Arrays.fill(c, v * H);
        }
        Runnable one = planned(small, dense(new int[] {w - 2}, NONE), 1);
        Runnable two = planned(small, dense(new int[] {w - 1}, NONE), 1);
        Runnable both = () -> {
            one.run();
            two.run();
        };
        return roundNanos(new Runnable[] {both}, minNanos, brief) / Math.scalb(1.0, w);
    }

    /**
     * The nanoseconds of one round of the steps (the kind on each of the spread targets),
     * timed for at least minNanos. A full timing warms up first and returns the median of at
     * least three rounds: what a run sees, other work on the machine included. A brief one
     * (the quick probe, which times every kind twice and keeps the lower) skips the warm-up
     * and returns the lowest of at least two rounds.
     */
    private static double roundNanos(Runnable[] step, long minNanos, boolean brief) {
        Runnable all = () -> {
            for (Runnable r : step) {
                r.run();
            }
        };
        long warm = System.nanoTime();
        int w = 0;
        while (!brief && (w < 1 || (System.nanoTime() - warm < minNanos / 4 && w < 10))) {
            all.run();
            w++;
        }
        double[] times = new double[32];
        int count = 0;
        int least = brief ? 2 : 3;
        long start = System.nanoTime();
        while (count < times.length && (count < least
                || System.nanoTime() - start < minNanos)) {
            long t0 = System.nanoTime();
            all.run();
            times[count++] = System.nanoTime() - t0;
        }
        Arrays.sort(times, 0, count);
        return brief ? times[0] : times[count / 2];
    }

    /**
     * Returns the time of a cache-blocked group of {@value #LONG_GROUP_GATES} dense
     * single-qubit gates on the low qubits, per amplitude: the same group as
     * {@link Workload#BLOCK_STREAM}'s of {@value #GROUP_GATES} gates, longer. The difference of
     * the two over the gates between them is one more gate in cache, the rate a run sees on
     * {@code threads} threads, each block in its own thread's cache (two threads need not halve
     * it: they share the memory bus and, on some machines, the cache); the calibration takes
     * it when the file is read, from each group's lower time of two sweeps.
     *
     * @param n qubits of the state, 4 to 30
     * @param threads threads, at least 1
     * @param minNanos how long to keep timing, at least
     * @param brief whether to skip the warm-up round and keep the lowest round
     * @return nanoseconds per amplitude, the whole group
     */
    public static double longGroupNanos(int n, int threads, long minNanos, boolean brief) {
        Amplitudes a = filled(0, n, false);
        int blockLog = Math.min(Frame.CACHE_LOG, a.chunkLog);
        Plan[] plans = new Plan[LONG_GROUP_GATES];
        for (int g = 0; g < plans.length; g++) {
            plans[g] = dense(new int[] {g % Math.max(1, blockLog)}, NONE).plan(a);
        }
        Runnable[] step = {() -> Plan.applyBlocked(a, plans, blockLog, threads)};
        return roundNanos(step, minNanos, brief) / Math.scalb(1.0, n);
    }

    /**
     * Returns the time of building a merged run's tables, per entry and gate
     * ({@link Workload#tableWork()}): a ladder of controlled phases on a window's qubits, as
     * the planner builds it for each group (the median of repeated builds).
     *
     * @param minNanos how long to keep timing, at least
     * @return nanoseconds per entry and gate
     */
    public static double tableBuildNanos(long minNanos) {
        int w = Windows.WINDOW_LOG;
        Amplitudes a = Amplitudes.allocate(w);
        GateOp op = ladder(w, Workload.TABLE_COMPLEX);
        Runnable[] step = {() -> op.plan(a)};
        return roundNanos(step, minNanos, false)
                / TableKernels.buildWork(op, Windows.identity(w), w);
    }


    /**
     * A merged ladder on qubits 0 to k - 1: of CZ gates ({@link Workload#TABLE_DIAGONAL}), of
     * controlled phases of angles 0.3 to 0.3 (k - 1) ({@link Workload#TABLE_COMPLEX}), or of
     * CNOT gates ({@link Workload#TABLE_GATHER}).
     */
    private static GateOp ladder(int k, int kind) {
        GateOp[] parts = new GateOp[k - 1];
        int[] qs = new int[k];
        for (int q = 0; q < k; q++) {
            qs[q] = q;
        }
        for (int q = 0; q + 1 < k; q++) {
            double angle = 0.3 * (q + 1);
            parts[q] = kind == Workload.TABLE_GATHER
                    ? new GateOp(GateOp.MONOMIAL, new int[] {q + 1}, new int[] {q},
                            new double[] {1, 0, 1, 0}, new int[] {1, 0})
                    : new GateOp(GateOp.DIAGONAL, new int[] {q + 1}, new int[] {q},
                            kind == Workload.TABLE_COMPLEX
                                    ? new double[] {1, 0, Math.cos(angle), Math.sin(angle)}
                                    : new double[] {1, 0, -1, 0}, null);
        }
        return GateOp.table(qs, parts);
    }

    /** Whether a kind's timed pass depends on the target position it is given. */
    private static boolean positional(int kind) {
        switch (kind) {
            case Workload.BLOCK_STREAM:
            case Workload.WINDOW_STREAM:
            case Workload.WINDOW_STREAM_DOUBLE:
            case Workload.WINDOW_SHORT:
            case Workload.WINDOW_SHORT_DOUBLE:
            case Workload.PHASES:
            case Workload.COPY:
            case Workload.SAMPLE:
            case Workload.TABLE_DIAGONAL:
            case Workload.TABLE_COMPLEX:
            case Workload.TABLE_GATHER:
                return false;
            default:
                return true;
        }
    }

    /** Four distinct qubits: q, q + 1, then the highest ones not taken. */
    private static int[] distinct(int n, int q) {
        int[] out = {q, q + 1, -1, -1};
        int next = n - 1;
        for (int i = 2; i < 4; i++) {
            while (next == q || next == q + 1 || next == out[2]) {
                next--;
            }
            out[i] = next--;
        }
        return out;
    }

    private static Runnable planned(Amplitudes a, GateOp op, int threads) {
        Plan p = op.plan(a);
        return () -> p.apply(threads);
    }

    /**
     * Frees the states kept between calls (call when a calibration is done: up to 2^23
     * amplitudes in each of three states).
     */
    public static synchronized void release() {
        Arrays.fill(KEPT, null);
    }

    /** States kept between calls: two double, one single. */
    private static final Amplitudes[] KEPT = new Amplitudes[3];

    /**
     * A state of equal amplitudes (norm 1): the kept one of that slot, refilled, if it has the
     * size (a pass's speed can depend on the values earlier kinds left), else a new one.
     */
    private static synchronized Amplitudes filled(int slot, int n, boolean single) {
        Amplitudes a = KEPT[slot];
        if (a == null || a.n != n || a.isSingle() != single || a.framed) {
            KEPT[slot] = null;
            a = single ? Amplitudes.allocateSingle(n) : Amplitudes.allocate(n);
            KEPT[slot] = a;
        }
        double v = Math.scalb(1.0, -n) * Math.sqrt(Math.scalb(1.0, n));
        if (single) {
            for (float[] c : a.singles) {
                Arrays.fill(c, (float) (v * H));
            }
        } else {
            for (double[] c : a.chunks) {
                Arrays.fill(c, v * H);
            }
        }
        return a;
    }

    /**
     * The Hadamard product H⊗...⊗H on the targets times a diagonal of phases
     * {@code e^{0.7 i c}} on its columns: unitary, every entry non-zero and complex, so the
     * timed loop is the general complex one. A real matrix (H alone) would time the loops with
     * half the arithmetic, which a run meets only where no frame phase has reached the gate: in
     * the validation set, rotations forecast at 0.55-0.58 of their measured time with H.
     */
    private static GateOp dense(int[] targets, int[] controls) {
        return hadamards(targets, controls, 0.7);
    }

    /** H⊗...⊗H on the targets times phases {@code e^{i phase c}} on its columns. */
    private static GateOp hadamards(int[] targets, int[] controls, double phase) {
        int d = 1 << targets.length;
        double[] m = new double[2 * d * d];
        double s = Math.scalb(1.0, 0);
        for (int k = 0; k < targets.length; k++) {
            s *= H;
        }
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                double v = (Integer.bitCount(r & c) & 1) == 0 ? s : -s;
                m[2 * (r * d + c)] = v * Math.cos(phase * c);
                m[2 * (r * d + c) + 1] = v * Math.sin(phase * c);
            }
        }
        return new GateOp(GateOp.DENSE, targets, controls, m, null);
    }

    /** H on one target: a real matrix, timed by the loops with half the arithmetic. */
    private static GateOp hadamard(int q) {
        return new GateOp(GateOp.DENSE, new int[] {q}, NONE, new double[] {H, 0, H, 0, H, 0, -H, 0},
                null);
    }

    private static double[] phases(int d) {
        double[] p = new double[2 * d];
        for (int j = 0; j < d; j++) {
            p[2 * j] = Math.cos(0.3 * (j + 1));
            p[2 * j + 1] = Math.sin(0.3 * (j + 1));
        }
        return p;
    }
}
