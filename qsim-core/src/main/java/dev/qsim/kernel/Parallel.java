package dev.qsim.kernel;

import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicReference;
import java.util.concurrent.locks.LockSupport;

/**
 * Splits an index range into contiguous pieces and runs them on worker threads, the caller
 * taking the first piece. Results must not depend on how the range is split; every kernel here
 * is either element-wise or reduces over fixed blocks. Internal.
 *
 * <p>The workers are a team of daemon threads that, after a piece, wait for the next one by
 * spinning for {@value #SPIN_NANOS} ns before they park: a gate on a state in cache takes some
 * microseconds, and waking a parked thread for each gate (as an executor does) cost more than
 * the gate's half on the machine of record (two threads ran a 16-qubit gate at half the speed of
 * one). A caller that has done its own piece runs any piece no worker has started yet, so a
 * worker the system has not scheduled (a busy machine) delays nothing. One caller uses the team
 * at a time; a concurrent or nested call goes to a plain pool.
 */
public final class Parallel {
    /** States below this many qubits always run on the calling thread. */
    public static final int MIN_PARALLEL_QUBITS = 16;
    /** The most threads one call may use. */
    public static final int MAX_THREADS = 256;
    /** How long a worker, or a caller waiting for workers, spins before it parks. */
    static final long SPIN_NANOS = 100_000;

    private static final ExecutorService POOL = Executors.newCachedThreadPool(r -> {
        Thread t = new Thread(r, "qsim-worker");
        t.setDaemon(true);
        return t;
    });

    private static final AtomicBoolean TEAM_BUSY = new AtomicBoolean();
    /** The team's workers, grown on demand; only the caller holding the team touches it. */
    private static Worker[] team = new Worker[0];

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
        if (TEAM_BUSY.compareAndSet(false, true)) {
            try {
                onTeam(t, total, body);
            } finally {
                TEAM_BUSY.set(false);
            }
            return;
        }
        onPool(t, total, body);
    }

    /** One call's shared state: pieces left, the first failure, the caller to wake. */
    private static final class Call {
        final Range body;
        final Thread caller = Thread.currentThread();
        final AtomicInteger remaining;
        final AtomicReference<Throwable> failure = new AtomicReference<>();
        volatile boolean callerParked;

        Call(Range body, int pieces) {
            this.body = body;
            this.remaining = new AtomicInteger(pieces);
        }

        void finished() {
            if (remaining.decrementAndGet() == 0 && callerParked) {
                LockSupport.unpark(caller);
            }
        }
    }

    /** A piece for a worker; whoever claims it first (the worker or the caller) runs it. */
    private static final class Piece {
        final Call call;
        final long from;
        final long to;
        final AtomicBoolean claimed = new AtomicBoolean();

        Piece(Call call, long from, long to) {
            this.call = call;
            this.from = from;
            this.to = to;
        }

        /** Runs the piece if nobody has claimed it yet; returns whether this call ran it. */
        boolean runIfUnclaimed() {
            if (!claimed.compareAndSet(false, true)) {
                return false;
            }
            try {
                call.body.run(from, to);
            } catch (Throwable e) {
                call.failure.compareAndSet(null, e);
            }
            call.finished();
            return true;
        }
    }

    /** A team thread: runs the pieces handed to it, spinning a while between them. */
    private static final class Worker extends Thread {
        final AtomicReference<Piece> piece = new AtomicReference<>();
        volatile boolean parked;

        Worker(int index) {
            super("qsim-worker-" + index);
            setDaemon(true);
        }

        void hand(Piece p) {
            piece.set(p);
            if (parked) {
                LockSupport.unpark(this);
            }
        }

        @Override
        public void run() {
            for (;;) {
                Piece p = piece.get();
                long since = System.nanoTime();
                while (p == null) {
                    if (System.nanoTime() - since < SPIN_NANOS) {
                        Thread.onSpinWait();
                    } else {
                        parked = true;
                        if (piece.get() == null) {
                            LockSupport.park(this);
                        }
                        parked = false;
                        since = System.nanoTime();
                    }
                    p = piece.get();
                }
                // Cleared before the work ends, so the caller's next piece cannot be lost; a
                // piece the caller took over in the meantime is simply skipped.
                piece.compareAndSet(p, null);
                p.runIfUnclaimed();
            }
        }
    }

    private static void onTeam(int t, long total, Range body) {
        if (team.length < t - 1) {
            Worker[] grown = java.util.Arrays.copyOf(team, t - 1);
            for (int i = team.length; i < grown.length; i++) {
                grown[i] = new Worker(i + 1);
                grown[i].start();
            }
            team = grown;
        }
        Call call = new Call(body, t - 1);
        Piece[] pieces = new Piece[t - 1];
        for (int i = 1; i < t; i++) {
            pieces[i - 1] = new Piece(call, total * i / t, total * (i + 1) / t);
            team[i - 1].hand(pieces[i - 1]);
        }
        try {
            body.run(0, total / t);
        } catch (RuntimeException | Error e) {
            call.failure.compareAndSet(null, e);
        }
        for (int i = pieces.length - 1; i >= 0; i--) {
            pieces[i].runIfUnclaimed();
        }
        long since = System.nanoTime();
        while (call.remaining.get() > 0) {
            if (System.nanoTime() - since < SPIN_NANOS) {
                Thread.onSpinWait();
                continue;
            }
            call.callerParked = true;
            if (call.remaining.get() > 0) {
                LockSupport.park(call);
            }
            call.callerParked = false;
        }
        rethrow(call.failure.get());
    }

    private static void onPool(int t, long total, Range body) {
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
        rethrow(failure);
    }

    private static void rethrow(Throwable failure) {
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
