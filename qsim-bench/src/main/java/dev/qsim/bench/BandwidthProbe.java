package dev.qsim.bench;

import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

/**
 * A memory-bandwidth probe: McCalpin's copy ({@code b[i] = a[i]}) and triad ({@code a[i] = b[i]
 * + s * c[i]}) kernels over three {@code double} arrays, split into contiguous ranges over the
 * same number of threads as the gate kernels (J. D. McCalpin, "Memory Bandwidth and Machine
 * Balance in Current High Performance Computers", IEEE Computer Society Technical Committee on
 * Computer Architecture (TCCA) Newsletter, December 1995).
 *
 * <p>The arrays are allocated once at the largest length needed and reused for every shorter
 * length. Bytes moved follow McCalpin's counting: copy reads one array and writes one, {@code 2
 * * 8 * len}; triad reads two and writes one, {@code 3 * 8 * len}; the extra read a
 * write-allocate cache performs is not counted. Lengths below {@link #MIN_PARALLEL_LENGTH} run
 * on the calling thread only, as the gate kernels do for states under 14 qubits. Not
 * thread-safe; {@link #close()} stops the worker threads.
 */
final class BandwidthProbe implements AutoCloseable {
    /** Shortest length split over threads: the doubles of a 14-qubit state (2^15). */
    static final int MIN_PARALLEL_LENGTH = 1 << 15;

    /** The triad's scalar, as in McCalpin's code. */
    static final double SCALAR = 3.0;

    private final double[] a;
    private final double[] b;
    private final double[] c;
    private final int threads;
    private final ExecutorService pool;

    /**
     * Allocates three arrays of {@code capacity} doubles and, for {@code threads > 1}, a pool of
     * {@code threads - 1} daemon workers (the caller runs the first range).
     *
     * @throws IllegalArgumentException if {@code capacity < 1} or {@code threads < 1}
     * @throws OutOfMemoryError if the heap cannot hold the arrays
     */
    BandwidthProbe(int capacity, int threads) {
        if (capacity < 1 || threads < 1) {
            throw new IllegalArgumentException("probe capacity and threads must be at least 1 but"
                    + " were " + capacity + " and " + threads);
        }
        a = new double[capacity];
        b = new double[capacity];
        c = new double[capacity];
        java.util.Arrays.fill(a, 1.0);
        java.util.Arrays.fill(b, 2.0);
        java.util.Arrays.fill(c, 0.5);
        this.threads = threads;
        pool = threads > 1 ? Executors.newFixedThreadPool(threads - 1, r -> {
            final Thread t = new Thread(r, "qsim-bench-probe");
            t.setDaemon(true);
            return t;
        }) : null;
    }

    /** Returns the length of each array. */
    int capacity() {
        return a.length;
    }

    /**
     * The length the probe runs at next to a vector of {@code vectorQubits} qubits: the
     * doubles of that vector, {@code 2^(vectorQubits+1)}, but at least
     * {@link HeapBudget#MIN_PROBE_LENGTH} so that it measures main memory and not a cache, and
     * at most {@link #capacity()}.
     */
    int lengthFor(int vectorQubits) {
        return (int) lengthFor(vectorQubits, capacity());
    }

    /** {@link #lengthFor(int)} for a probe of {@code capacity} doubles. */
    static long lengthFor(int vectorQubits, long capacity) {
        final long state = vectorQubits >= 62 ? Long.MAX_VALUE : 2L << vectorQubits;
        return Math.min(Math.max(state, HeapBudget.MIN_PROBE_LENGTH), capacity);
    }

    /** Bytes one copy over {@code len} doubles moves: {@code 2 * 8 * len} (McCalpin 1995). */
    static long copyBytes(long len) {
        return 2 * Double.BYTES * len;
    }

    /** Bytes one triad over {@code len} doubles moves: {@code 3 * 8 * len} (McCalpin 1995). */
    static long triadBytes(long len) {
        return 3 * Double.BYTES * len;
    }

    /**
     * Runs the copy {@code reps} times over the first {@code len} elements and returns the
     * elapsed nanoseconds.
     *
     * @throws IllegalArgumentException if {@code len} is not in [1, capacity]
     */
    long timeCopy(int len, long reps) {
        return time(len, reps, false);
    }

    /**
     * Runs the triad {@code reps} times over the first {@code len} elements and returns the
     * elapsed nanoseconds.
     *
     * @throws IllegalArgumentException if {@code len} is not in [1, capacity]
     */
    long timeTriad(int len, long reps) {
        return time(len, reps, true);
    }

    /** Returns an element of the first array, so no result of the probe is unused. */
    double sample(int i) {
        return a[i];
    }

    private long time(int len, long reps, boolean triad) {
        if (len < 1 || len > a.length) {
            throw new IllegalArgumentException("probe length " + len + " is out of range [1, "
                    + a.length + "]");
        }
        final int t = len < MIN_PARALLEL_LENGTH ? 1 : threads;
        final long start = System.nanoTime();
        for (long r = 0; r < reps; r++) {
            if (t == 1) {
                range(0, len, triad);
            } else {
                split(len, t, triad);
            }
        }
        return System.nanoTime() - start;
    }

    private void split(int len, int t, boolean triad) {
        final Future<?>[] futures = new Future<?>[t - 1];
        for (int i = 1; i < t; i++) {
            final int from = (int) ((long) len * i / t);
            final int to = (int) ((long) len * (i + 1) / t);
            futures[i - 1] = pool.submit(() -> range(from, to, triad));
        }
        range(0, (int) ((long) len / t), triad);
        for (Future<?> f : futures) {
            try {
                f.get();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted while waiting for a probe thread", e);
            } catch (ExecutionException e) {
                throw new IllegalStateException("a probe thread failed", e.getCause());
            }
        }
    }

    private void range(int from, int to, boolean triad) {
        if (triad) {
            final double[] x = a;
            final double[] y = b;
            final double[] z = c;
            final double s = SCALAR;
            for (int i = from; i < to; i++) {
                x[i] = y[i] + s * z[i];
            }
        } else {
            System.arraycopy(a, from, b, from, to - from);
        }
    }

    /** Stops the worker threads. */
    @Override
    public void close() {
        if (pool != null) {
            pool.shutdownNow();
        }
    }
}
