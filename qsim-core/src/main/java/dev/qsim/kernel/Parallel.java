package dev.qsim.kernel;

import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

/**
 * Splits an index range into contiguous pieces and runs them on a shared pool of daemon
 * threads, the caller taking the first piece. Results must not depend on how the range is split;
 * every kernel here is either element-wise or reduces over fixed blocks. Internal.
 */
public final class Parallel {
    /** States below this many qubits always run on the calling thread. */
    public static final int MIN_PARALLEL_QUBITS = 16;
    /** The most threads one call may use. */
    public static final int MAX_THREADS = 256;

    private static final ExecutorService POOL = Executors.newCachedThreadPool(r -> {
        Thread t = new Thread(r, "qsim-worker");
        t.setDaemon(true);
        return t;
    });

    private Parallel() {
    }

    /**
     * Returns the thread count qsim uses unless told otherwise: every available processor, at
     * most {@link #MAX_THREADS}. The one default of every package.
     *
     * @return the default thread count
     */
    public static int defaultThreads() {
        return Math.max(1, Math.min(MAX_THREADS, Runtime.getRuntime().availableProcessors()));
    }

    /** A piece of work over the half-open range {@code [from, to)}. */
    @FunctionalInterface
    public interface Range {
        /**
         * Does the work for one piece.
         *
         * @param from first index, inclusive
         * @param to last index, exclusive
         */
        void run(long from, long to);
    }

    /**
     * Runs {@code body} over {@code [0, total)} split into at most {@code threads} pieces.
     *
     * @param threads requested threads, at least 1
     * @param total the size of the range
     * @param parallel whether the work is large enough to split at all
     * @param body the work
     */
    public static void forRange(int threads, long total, boolean parallel, Range body) {
        int t = (int) Math.min(Math.min(threads, MAX_THREADS), total);
        if (!parallel || t <= 1) {
            body.run(0, total);
            return;
        }
        Future<?>[] futures = new Future<?>[t - 1];
        for (int i = 1; i < t; i++) {
            long from = total * i / t;
            long to = total * (i + 1) / t;
            futures[i - 1] = POOL.submit(() -> body.run(from, to));
        }
        Throwable failure = null;
        try {
            body.run(0, total / t);
        } catch (RuntimeException | Error e) {
            failure = e;
        }
        for (Future<?> f : futures) {
            try {
                f.get();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                failure = failure == null ? e : failure;
            } catch (ExecutionException e) {
                failure = failure == null ? e.getCause() : failure;
            }
        }
        if (failure instanceof RuntimeException) {
            throw (RuntimeException) failure;
        }
        if (failure instanceof Error) {
            throw (Error) failure;
        }
        if (failure != null) {
            throw new IllegalStateException("a worker thread was interrupted", failure);
        }
    }
}
