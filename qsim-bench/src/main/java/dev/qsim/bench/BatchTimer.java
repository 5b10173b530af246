package dev.qsim.bench;

/**
 * How the scaling report times one measurement: warm up with batches of doubling size until one
 * lasts a third of the target time, then time one batch meant to last {@link #MARGIN} times the
 * target, repeated up to {@link #MAX_RETRIES} times if it still came out short. The same for
 * the probe, the kernels, the circuits and the noise engines, so their figures compare.
 */
final class BatchTimer {
    /** Repetitions are chosen for this many times the target time, so one batch is enough. */
    static final double MARGIN = 1.25;

    /** Upper bound on the repetitions of one batch. */
    static final long MAX_REPETITIONS = 1L << 40;

    /** The measured batch is repeated at most this many times if it came out too short. */
    static final int MAX_RETRIES = 3;

    private BatchTimer() {
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

    /**
     * The result of {@link #measure}: repetitions of the measured batch and its nanoseconds.
     *
     * @param reps the repetitions of the measured batch
     * @param nanos its elapsed nanoseconds, at least 1
     */
    record Timing(long reps, long nanos) {
        /** Nanoseconds per repetition. */
        double perRep() {
            return (double) nanos / reps;
        }
    }

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
}
