package dev.qsim;

import java.util.Arrays;

import dev.qsim.kernel.KernelTimer;
import dev.qsim.kernel.Parallel;
import dev.qsim.kernel.Workload;

/**
 * A calibration's measured rates and the rates a forecast prices with: interpolated between the
 * measured sizes (linear in the qubits, the largest size's beyond it), and the rates that are a
 * difference of two timings (a stream less its gates in cache, one more gate in a blocked group)
 * taken here from timings kept apart. Immutable; internal to {@link Calibration}.
 */
final class RateTable {
    /**
     * The row of a cache-blocked group of {@value KernelTimer#LONG_GROUP_GATES} dense 1-qubit
     * gates, per amplitude ({@link KernelTimer#longGroupNanos}); with the
     * {@link Workload#BLOCK_STREAM} row (the same group of {@value KernelTimer#GROUP_GATES}) it
     * gives one more gate in the group ({@link #blockGate}).
     */
    static final int LONG_GROUP = Workload.KINDS;
    /**
     * The row of the window kinds' two gates on one window in cache, one thread, per amplitude
     * ({@link KernelTimer#windowGatesNanos}).
     */
    static final int WINDOW_GATE = Workload.KINDS + 1;
    /** The rows: every kind, then the two above. */
    static final int ROWS = Workload.KINDS + 2;

    private final int processors;
    private final int[] sizes;
    /** [row][0: one thread, 1: all processors][size index], nanoseconds per unit. */
    private final double[][][] rates;
    /** The median of the {@link #WINDOW_GATE} row, nanoseconds per amplitude. */
    private final double windowGates;

    RateTable(int processors, int[] sizes, double[][][] rates) {
        this.processors = processors;
        this.sizes = sizes;
        this.rates = rates;
        this.windowGates = median(rates[WINDOW_GATE]);
    }

    /**
     * Nanoseconds per unit of a kind of pass on a state of n qubits with the given threads.
     * Below 2^16 amplitudes the kernels run on one thread whatever is asked.
     */
    double nanos(int kind, int n, int threads) {
        if (kind == Workload.BLOCK_STREAM) {
            // The group was timed with its in-cache gates; keep the streaming part.
            double group = raw(kind, n, threads);
            double inCache = KernelTimer.GROUP_GATES * blockGate(n, threads);
            return Math.max(0.1 * group, group - inCache);
        }
        if (kind == Workload.WINDOW_STREAM || kind == Workload.WINDOW_STREAM_DOUBLE
                || kind == Workload.WINDOW_SHORT || kind == Workload.WINDOW_SHORT_DOUBLE) {
            // Timed with its two gates; keep the streaming part: the group less its gates on
            // one window in cache (the median of that row's timings, which do not depend on
            // the size), shared by the threads. Both are timings of their own, each the lower
            // of two sweeps; subtracting the gates inside the kind's timing, as before, made
            // the lower of two differences the kept one (two-thread rates from 0.29 to 1.17 ns
            // an amplitude at 2^20 and 2^23 in eleven calibrations).
            double group = raw(kind, n, threads);
            int used = n >= Parallel.MIN_PARALLEL_QUBITS ? Math.min(threads, processors) : 1;
            double inCache = windowGates / Math.max(1, used);
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
        double small = blockGate(sizes[0], 1);
        double scale = small > 0 ? blockGate(n, threads) / small : 1;
        return raw(kind, sizes[0], 1) * scale / Math.max(1, Math.min(workers, processors));
    }

    /**
     * One more dense gate in a cache-blocked group, per amplitude: the long group's time less
     * the short one's, over the gates between them; at least half the long group's time per
     * gate (a difference of two timings can come out near zero on a noisy machine, and the
     * stream is shared by the gates). Each group's time is the lower of two sweeps; the
     * difference was taken inside each sweep before, and the lower of two differences kept (at
     * 2^16 amplitudes on two threads 0.13 to 0.32 ns in four calibrations, vector loops).
     */
    private double blockGate(int n, int threads) {
        double shortGroup = raw(Workload.BLOCK_STREAM, n, threads);
        double longGroup = raw(LONG_GROUP, n, threads);
        double per = (longGroup - shortGroup)
                / (KernelTimer.LONG_GROUP_GATES - KernelTimer.GROUP_GATES);
        return Math.max(0.5 * longGroup / KernelTimer.LONG_GROUP_GATES, per);
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

    /** The median of every value of the rows (the mean of the middle two for an even count). */
    private static double median(double[][] rows) {
        int count = 0;
        for (double[] r : rows) {
            count += r.length;
        }
        double[] all = new double[count];
        int at = 0;
        for (double[] r : rows) {
            System.arraycopy(r, 0, all, at, r.length);
            at += r.length;
        }
        Arrays.sort(all);
        return count == 0 ? 0 : (all[(count - 1) / 2] + all[count / 2]) / 2;
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
}
