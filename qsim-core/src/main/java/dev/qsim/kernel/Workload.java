package dev.qsim.kernel;

import java.util.List;

/**
 * Counts the passes over memory that a list of gates costs on a state of a given size, without
 * a state: the gates go through the same planner as a run ({@link Frame#schedule}: lazy frame,
 * conjugation, cache blocking, gathered windows), on a storage
 * that has a size but no amplitudes. Each pass is recorded by kind ({@link #KINDS} kinds) as
 * the amplitudes it touches, in units of the whole state, and the kernel work done on blocks
 * while they sit in cache is recorded apart. A cost model turns the counts into time with
 * measured rates per kind. Not thread-safe. Internal.
 */
public final class Workload {
    /** Kind: a dense single-qubit gate without controls, complex entries. */
    public static final int DENSE1 = 0;
    /**
     * Kind: a dense single-qubit gate without controls whose matrix is real (H, RY) or shaped
     * like RX (real diagonal, imaginary off-diagonal): loops with half the arithmetic.
     */
    public static final int DENSE1_HALF = 16;
    /** Kind: a dense single-qubit gate with controls (rate per touched amplitude). */
    public static final int DENSE1_CONTROLLED = 1;
    /** Kind: a dense two-qubit gate. */
    public static final int DENSE2 = 2;
    /** Kind: a dense three-qubit gate. */
    public static final int DENSE3 = 3;
    /** Kind: a dense four-qubit gate (wider ones count 2^(k-4) of these). */
    public static final int DENSE4 = 4;
    /** Kind: a diagonal gate (phases only). */
    public static final int DIAGONAL = 5;
    /** Kind: a permutation with phases (X with controls, SWAP ...). */
    public static final int PERMUTATION = 6;
    /** Kind: streaming a cache-blocked group of double-precision gates through memory once. */
    public static final int BLOCK_STREAM = 7;
    /**
     * Kind: reading and writing the windows of a single-precision group once, in runs of
     * {@code 2^}{@value #LONG_RUN_LOG} amplitudes (see {@link #WINDOW_SHORT}).
     */
    public static final int WINDOW_STREAM = 8;
    /**
     * Kind: reading and writing the windows of a double-precision group once (twice the bytes
     * of a single-precision window; see {@link Windows}), in runs of
     * {@code 2^}{@value #LONG_RUN_LOG} amplitudes.
     */
    public static final int WINDOW_STREAM_DOUBLE = 15;
    /** Kind: a lone dense single-qubit gate on single-precision storage. */
    public static final int FLOAT1 = 9;
    /** Kind: the lazy frame's phases applied in one pass. */
    public static final int PHASES = 10;
    /** Kind: copying the state (one shot's start from a simulated prefix). */
    public static final int COPY = 11;
    /** Kind: measuring or resetting one qubit (its probability, then the projection). */
    public static final int MEASURE = 12;
    /** Kind: drawing shots from the final state (block sums, then picking indices). */
    public static final int SAMPLE = 13;
    /** Kind: the reduced state of a channel's qubits (a trajectory's branch probabilities). */
    public static final int REDUCE = 14;
    /**
     * Kind: a run of diagonal gates merged into one multiplication by a table of factors
     * ({@link TableKernels}), per amplitude of the state.
     */
    public static final int TABLE_DIAGONAL = 17;
    /**
     * Kind: a run of diagonal and monomial gates with a permutation, merged into one gather
     * through a table of sources ({@link TableKernels}), per amplitude of the state.
     */
    public static final int TABLE_GATHER = 18;
    /**
     * Kind: two adjacent dense single-qubit gates with half the arithmetic run in one sweep in
     * cache ({@link GatePairs}, vector loops only), per amplitude of the state and pair.
     */
    public static final int DENSE1_HALF_PAIR = 19;
    /**
     * Kind: a run of diagonal gates with complex factors (phases other than 1 and -1) merged
     * into one multiplication by a table of complex factors, per amplitude of the state: twice
     * the arithmetic of a table of real factors, and on the vector loops an exchange of each
     * amplitude's parts (a CZ ladder's table is real, a ladder of controlled phases complex).
     */
    public static final int TABLE_COMPLEX = 20;
    /**
     * Kind: a density matrix's dense single-qubit gate with complex entries, as that engine
     * applies it (the matrix on a row qubit, its conjugate on the column qubit), per pass and
     * amplitude of the {@code 2n}-qubit storage, timed over the register's positions. The
     * density matrix kinds are timed apart because the speed of a pass depends on its target's
     * position (on the vector loops, a target inside one vector runs up to 7 times slower for
     * a 4-qubit pass) and a density matrix's passes sit in other positions than a state
     * vector's: its columns always high.
     */
    public static final int DENSITY1 = 21;
    /** Kind: as {@link #DENSITY1}, a matrix with half the arithmetic (real, or shaped like RX). */
    public static final int DENSITY1_HALF = 22;
    /**
     * Kind: a density matrix's two-qubit gate without controls on neighbouring qubits, per pass
     * (rows or columns) and amplitude of the storage.
     */
    public static final int DENSITY2 = 23;
    /**
     * Kind: a density matrix's one-qubit channel: one dense two-qubit pass of its
     * superoperator on a row qubit and its column qubit, per amplitude of the storage.
     */
    public static final int DENSITY_CHANNEL1 = 24;
    /**
     * Kind: a density matrix's two-qubit channel: one dense four-qubit pass of its
     * superoperator on two neighbouring row qubits and their column qubits.
     */
    public static final int DENSITY_CHANNEL2 = 25;
    /**
     * Kind: {@link #WINDOW_STREAM} with the window read in the shortest runs a group allows,
     * {@code 2^}{@value Windows#MIN_RUN_LOG} amplitudes. A window pass whose runs are
     * {@code 2^l} amplitudes counts as a share of a pass of each kind, linear in {@code l}
     * between the two: a group of controlled phases on random pairs of a 24-qubit register read
     * its windows in runs of 2^6 to 2^8 amplitudes at 1.9 to 2.1 ns an amplitude (thread time,
     * vector loops, two threads), against 1.5 in runs of 2^12.
     */
    public static final int WINDOW_SHORT = 26;
    /** Kind: {@link #WINDOW_STREAM_DOUBLE} in the shortest runs, as {@link #WINDOW_SHORT}. */
    public static final int WINDOW_SHORT_DOUBLE = 27;
    /** The number of kinds. */
    public static final int KINDS = 28;
    /**
     * Log2 of the runs the long window kinds ({@link #WINDOW_STREAM},
     * {@link #WINDOW_STREAM_DOUBLE}) read a window in: the two highest qubits of a full window.
     */
    public static final int LONG_RUN_LOG = Windows.WINDOW_LOG - 2;

    private static final String[] NAMES = {"dense 1-qubit", "controlled dense 1-qubit",
        "dense 2-qubit", "dense 3-qubit", "dense 4-qubit", "diagonal", "permutation",
        "cache-blocked group stream", "single-precision window stream",
        "single-precision 1-qubit", "frame phases", "state copy", "measurement or reset",
        "sampling", "reduced state", "double-precision window stream",
        "dense 1-qubit, half arithmetic", "merged diagonal run", "merged permutation run",
        "paired dense 1-qubit, half arithmetic", "merged diagonal run, complex factors",
        "density-matrix 1-qubit", "density-matrix 1-qubit, half arithmetic",
        "density-matrix 2-qubit", "density-matrix 1-qubit channel",
        "density-matrix 2-qubit channel", "short-run single-precision window stream",
        "short-run double-precision window stream"};

    private final int qubits;
    private final boolean single;
    private final Amplitudes phantom;
    private final double[] streamed = new double[KINDS];
    private final double[] cached = new double[KINDS];
    private final double[] passes = new double[KINDS];
    private double weight = 1;
    private int phaseTableLog = -1;
    private double tableWork;
    private double planned;
    private double fused;

    private Workload(int qubits, boolean single) {
        this.qubits = qubits;
        this.single = single;
        this.phantom = Amplitudes.phantom(qubits, single);
    }

    /**
     * Starts an empty count for a state of {@code qubits} qubits.
     *
     * @param qubits the qubits of the storage, 1 to 40
     * @param single whether the storage is single precision
     * @return the count
     */
    public static Workload of(int qubits, boolean single) {
        return new Workload(qubits, single);
    }

    /**
     * Returns the name of a kind, for reports.
     *
     * @param kind a kind
     * @return its name
     */
    public static String name(int kind) {
        return NAMES[kind];
    }

    /**
     * Returns the kind of the pass a gate alone costs on double storage.
     *
     * @param op the gate
     * @return its kind
     */
    public static int kindOf(GateOp op) {
        int k = op.targets.length;
        switch (op.shape) {
            case GateOp.DIAGONAL:
                return DIAGONAL;
            case GateOp.MONOMIAL:
                return PERMUTATION;
            case GateOp.TABLE: {
                boolean complex = false;
                for (GateOp part : op.parts) {
                    if (part.shape != GateOp.DIAGONAL) {
                        return TABLE_GATHER;
                    }
                    // From the gates, without building the table: a run whose complex factors
                    // multiply out real (S then S) counts as complex, a rare overestimate.
                    complex |= hasImaginary(part.data);
                }
                return complex ? TABLE_COMPLEX : TABLE_DIAGONAL;
            }
            default:
                if (k == 1) {
                    if (op.controls.length > 0) {
                        return DENSE1_CONTROLLED;
                    }
                    return op.data == null || LaneKernels.kind(op.data) == LaneKernels.COMPLEX
                            ? DENSE1 : DENSE1_HALF;
                }
                return Math.min(k, 4);
        }
    }

    /** Whether a gate's entries have an imaginary part (its table's factors are complex). */
    private static boolean hasImaginary(double[] data) {
        if (data == null) {
            return false;
        }
        for (int j = 1; j < data.length; j += 2) {
            if (data[j] != 0) {
                return true;
            }
        }
        return false;
    }

    /**
     * The work of a gate in its kind's units: the share of amplitudes where every control is 1;
     * wider dense gates count 2^(k-4) four-qubit ones; a diagonal gate on several qubits or
     * with controls skips its entries equal to 1 (so a controlled phase touches a quarter of
     * the state), as {@code DiagonalKernels} does.
     */
    private static double units(GateOp op) {
        double f = Math.scalb(1.0, -op.controls.length);
        int k = op.targets.length;
        if (op.shape == GateOp.DENSE && k > 4) {
            f *= Math.scalb(1.0, k - 4);
        }
        if (op.shape == GateOp.DIAGONAL && op.data != null && (k > 1 || op.controls.length > 0)) {
            int d = 1 << k;
            int moving = 0;
            for (int j = 0; j < d; j++) {
                moving += op.data[2 * j] == 1 && op.data[2 * j + 1] == 0 ? 0 : 1;
            }
            f *= moving / (double) d;
        }
        return f;
    }

    /**
     * Counts gates as a run applies them in one call ({@code Frame.apply}).
     *
     * @param ops the gates, in order
     * @return this count
     */
    public Workload gates(List<GateOp> ops) {
        planned += ops.size() * weight;
        Frame.schedule(phantom, ops, counter);
        return this;
    }

    /**
     * Counts gates put through gate fusion before they are planned.
     *
     * @param count the gates fusion reads
     * @return this count
     */
    public Workload fusion(int count) {
        fused += count;
        return this;
    }

    /**
     * Returns the gates handed to the planner (each costs its planning besides its passes).
     *
     * @return the count, possibly fractional for expected counts
     */
    public double planned() {
        return planned;
    }

    /**
     * Returns the gates fusion reads.
     *
     * @return the count
     */
    public double fused() {
        return fused;
    }

    /**
     * Counts gates as {@link #gates} does, each pass weighted (an expected count, such as a
     * noise branch taken with probability {@code weight}).
     *
     * @param ops the gates
     * @param w the weight, 0 to 1
     * @return this count
     */
    public Workload gates(List<GateOp> ops, double w) {
        weight = w;
        try {
            return gates(ops);
        } finally {
            weight = 1;
        }
    }

    /**
     * Counts the settling of the lazy frame (before a reader of the amplitudes).
     *
     * @return this count
     */
    public Workload settle() {
        if (phantom.framed) {
            Frame.settle(phantom, counter);
        }
        return this;
    }

    /**
     * Counts passes of a dense gate applied directly by the dense kernels (the density matrix
     * does so).
     *
     * @param targets the target count
     * @param controls the control count
     * @param w how many passes (an expected count may be fractional)
     * @return this count
     */
    public Workload dense(int targets, int controls, double w) {
        GateOp op = new GateOp(GateOp.DENSE, new int[targets], new int[controls], null, null);
        int kind = kindOf(op);
        streamed[kind] += units(op) * w;
        passes[kind] += w;
        return this;
    }

    /**
     * Counts a density matrix's gate: its matrix on the row qubits, then its conjugate on the
     * column qubits, two passes over the {@code 2n}-qubit storage this count was made for. A
     * single-qubit gate without controls or a two-qubit gate without controls counts as a
     * density matrix kind ({@link #DENSITY1}, {@link #DENSITY1_HALF}, {@link #DENSITY2});
     * other shapes as the dense kinds ({@link #dense}).
     *
     * @param m the gate's matrix on its targets (row-major, re/im interleaved), or null if
     *     not known (counted as complex)
     * @param targets the target count
     * @param controls the control count
     * @return this count
     */
    public Workload densityGate(double[] m, int targets, int controls) {
        if (controls == 0 && targets == 1) {
            int kind = m == null || LaneKernels.kind(m) == LaneKernels.COMPLEX ? DENSITY1
                    : DENSITY1_HALF;
            streamed[kind] += 2;
            passes[kind] += 2;
            return this;
        }
        if (controls == 0 && targets == 2) {
            streamed[DENSITY2] += 2;
            passes[DENSITY2] += 2;
            return this;
        }
        return dense(targets, controls, 2);
    }

    /**
     * Counts a density matrix's channel on {@code qubits} qubits: one dense pass of its
     * superoperator on {@code 2 qubits} targets of the storage ({@link #DENSITY_CHANNEL1},
     * {@link #DENSITY_CHANNEL2}, wider channels as the dense kinds).
     *
     * @param qubits the channel's qubits
     * @return this count
     */
    public Workload densityChannel(int qubits) {
        int kind = qubits == 1 ? DENSITY_CHANNEL1 : qubits == 2 ? DENSITY_CHANNEL2 : -1;
        if (kind < 0) {
            return dense(2 * qubits, 0, 1);
        }
        streamed[kind] += 1;
        passes[kind] += 1;
        return this;
    }

    /**
     * Counts passes of a kind that is not a gate (copy, measurement, sampling, reduced state).
     *
     * @param kind the kind
     * @param count how many passes (an expected count may be fractional)
     * @return this count
     */
    public Workload pass(int kind, double count) {
        add(kind, count);
        return this;
    }

    /**
     * Adds another count of the same storage size, {@code times} over.
     *
     * @param other the other count
     * @param times how many times it happens
     * @return this count
     */
    public Workload addAll(Workload other, double times) {
        for (int k = 0; k < KINDS; k++) {
            streamed[k] += other.streamed[k] * times;
            cached[k] += other.cached[k] * times;
            passes[k] += other.passes[k] * times;
        }
        phaseTableLog = Math.max(phaseTableLog, other.phaseTableLog);
        tableWork += other.tableWork * times;
        planned += other.planned * times;
        fused += other.fused * times;
        return this;
    }

    private void add(int kind, double units) {
        streamed[kind] += units;
        passes[kind] += weight == 1 ? 1 : weight;
    }

    /**
     * Returns the qubits of the storage counted.
     *
     * @return the qubits
     */
    public int qubits() {
        return qubits;
    }

    /**
     * Tells whether the storage counted is single precision.
     *
     * @return whether single precision
     */
    public boolean single() {
        return single;
    }

    /**
     * Returns the passes over memory of a kind (a blocked group or window group is one pass of
     * its stream kind).
     *
     * @param kind the kind
     * @return the pass count, possibly fractional for expected counts
     */
    public double passes(int kind) {
        return passes[kind];
    }

    /**
     * Returns the amplitudes a kind's passes touch, in units of the whole state ({@code 2^n}).
     *
     * @param kind the kind
     * @return the touched amount
     */
    public double streamed(int kind) {
        return streamed[kind];
    }

    /**
     * Returns the kernel work of a kind done inside cache-blocked groups or windows, in units
     * of the whole state.
     *
     * @param kind the kind
     * @return the amount
     */
    public double cached(int kind) {
        return cached[kind];
    }

    /**
     * Returns log2 of the entries of the largest phase table a frame settling builds (one
     * table, and one more per thread's piece when phases sit above it too), or -1 if none.
     *
     * @return the log, or -1
     */
    public int phaseTableLog() {
        return phaseTableLog;
    }

    /**
     * Returns the work of building the merged runs' tables ({@link TableKernels}): for each
     * run, the entries of its table times its gates, once per group that applies it.
     *
     * @return the count, possibly fractional for expected counts
     */
    public double tableWork() {
        return tableWork;
    }

    /**
     * Returns every pass over memory, of every kind.
     *
     * @return the total pass count
     */
    public double totalPasses() {
        double t = 0;
        for (double p : passes) {
            t += p;
        }
        return t;
    }

    /**
     * The share of a window pass read in runs of {@code 2^low} amplitudes that counts as a pass
     * of the short-run kind ({@link #WINDOW_SHORT}), the rest as the long-run kind: 0 at
     * {@value #LONG_RUN_LOG} and above, 1 at {@value Windows#MIN_RUN_LOG} and below, linear in
     * between.
     *
     * @param low log2 of the runs
     * @return the share, 0 to 1
     */
    public static double shortShare(int low) {
        if (low >= LONG_RUN_LOG) {
            return 0;
        }
        if (low <= Windows.MIN_RUN_LOG) {
            return 1;
        }
        return (LONG_RUN_LOG - low) / (double) (LONG_RUN_LOG - Windows.MIN_RUN_LOG);
    }

    private final Frame.Passes counter = new Frame.Passes() {
        @Override
        public void single(GateOp op, Plan plan) {
            add(kindOf(op), units(op) * weight);
        }

        @Override
        public void blocked(List<GateOp> ops, Plan[] plans, int blockLog) {
            add(BLOCK_STREAM, weight);
            inCache(ops, GatePairs.starts(phantom.lanes, phantom.chunkLog, ops, null));
            tables(ops, null, Math.min(qubits, phantom.chunkLog));
        }

        @Override
        public void window(List<GateOp> ops, long mask, int low) {
            // A window moves its amplitudes in and out at the storage's precision, in runs of
            // 2^low amplitudes: shorter runs cost more per amplitude.
            double share = shortShare(low);
            int longKind = single ? WINDOW_STREAM : WINDOW_STREAM_DOUBLE;
            int shortKind = single ? WINDOW_SHORT : WINDOW_SHORT_DOUBLE;
            streamed[longKind] += (1 - share) * weight;
            passes[longKind] += (1 - share) * weight;
            streamed[shortKind] += share * weight;
            passes[shortKind] += share * weight;
            int wl = low + Long.bitCount(mask >>> low);
            int[] position = Windows.positions(qubits, mask, low);
            inCache(ops, GatePairs.starts(phantom.lanes, wl, ops, position));
            tables(ops, position, wl);
        }

        /**
         * The building of a group's merged runs' tables, once per group; {@code position} null
         * for a cache-blocked group, whose qubits are their own bits.
         */
        private void tables(List<GateOp> ops, int[] position, int storageLog) {
            int[] at = position;
            for (GateOp op : ops) {
                if (op.shape == GateOp.TABLE) {
                    if (at == null) {
                        at = Windows.identity(qubits);
                    }
                    tableWork += TableKernels.buildWork(op, at, storageLog) * weight;
                }
            }
        }

        /** The kernel work of a group in cache, pairs of gates run in one sweep apart. */
        private void inCache(List<GateOp> ops, boolean[] paired) {
            for (int i = 0; i < ops.size(); i++) {
                if (paired[i]) {
                    cached[DENSE1_HALF_PAIR] += weight;
                    i++;
                } else {
                    GateOp op = ops.get(i);
                    cached[kindOf(op)] += units(op) * weight;
                }
            }
        }

        @Override
        public void floatSingle(GateOp op, double[] m2) {
            add(FLOAT1, units(op) * weight);
        }

        @Override
        public void chunkMove(GateOp op) {
            // Moves chunk references only: no pass over the amplitudes.
        }

        @Override
        public void phases(double[] p) {
            add(PHASES, weight);
            phaseTableLog = Math.max(phaseTableLog, Frame.phaseTableLog(phantom));
        }
    };
}
