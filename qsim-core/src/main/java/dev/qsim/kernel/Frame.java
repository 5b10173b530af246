package dev.qsim.kernel;

import java.util.ArrayList;
import java.util.List;

/**
 * Runs gates on a storage with a lazy frame: X gates and single-qubit diagonal gates (Z, S, T,
 * RZ, phase, and their products) without controls are not applied to the amplitudes but kept
 * as a frame {@code F = X^m D}, where {@code m} is a set of flipped qubits and {@code D} a
 * product of one unitary 2x2 diagonal per qubit; the state is {@code F} times the stored
 * amplitudes. Such a gate costs a few arithmetic operations instead of a pass over the state.
 *
 * <p>Every other gate {@code G} is applied to the stored amplitudes as
 * {@code F^-1 G F}, which has the same shape as {@code G} and costs the same: its matrix,
 * diagonal or permutation is re-indexed by the flipped targets and its entries multiplied by
 * the frame phases of its targets ({@code G'[r][c] = conj(d_r) G[r ^ f][c ^ f] d_c}). A
 * diagonal gate commutes with {@code D}; so does a control, whose frame phases stay put. A
 * control on a flipped qubit is the one case that needs data moved: that X is applied to the
 * amplitudes first. Measurement reads the flipped outcome; probabilities do not see {@code D}.
 * {@link #settle} applies the frame to the amplitudes in one pass (plus moves for flips) and
 * clears it; every reader of amplitudes outside the gate path settles first.
 *
 * <p>Method: keeping Pauli gates as a frame instead of applying them is the Pauli frame of
 * E. Knill, "Quantum computing with realistically noisy devices", Nature 434 (2005) 39, used
 * there for error correction (citation from memory); extending it to diagonal phases and
 * absorbing the frame into later gates by conjugation is our own arrangement, exact up to
 * rounding. Internal.
 */
public final class Frame {
    /** Log2 of the amplitudes of a cache block for grouped double-precision gates (256 KiB). */
    public static final int CACHE_LOG = 14;
    /** How far from 1 a frame phase's squared modulus may be (unitary gates only). */
    static final double UNIT_TOLERANCE = 1e-13;
    private static final int[] NONE = new int[0];
    private static final double[] X_PHASES = {1, 0, 1, 0};
    private static final int[] X_PERM = {1, 0};

    private Frame() {
    }

    /**
     * Applies gates in order: frame gates go to the frame, the rest (conjugated by the frame)
     * to the amplitudes, with cache blocking for double precision and windows for single.
     *
     * @param a the storage. Modified.
     * @param ops the gates
     * @param threads threads to use
     */
    public static void apply(Amplitudes a, List<GateOp> ops, int threads) {
        schedule(a, ops, new Runner(a, threads));
    }

    /**
     * The one planner of the gate path: takes frame gates into the frame, conjugates the rest
     * and hands each pass over the amplitudes to {@code passes}, which runs it
     * ({@link #apply}) or counts it ({@link Workload}).
     */
    static void schedule(Amplitudes a, List<GateOp> ops, Passes passes) {
        List<GateOp> out = new ArrayList<>(ops.size());
        for (GateOp op : ops) {
            if (!absorb(a, op)) {
                out.add(conjugate(a, op, out));
            }
        }
        a.framed = a.flips != 0 || a.phases != null;
        execute(a, out, passes);
    }

    /**
     * Receives the passes over the amplitudes that the planner decides on, in order. Internal.
     */
    interface Passes {
        /** One gate alone, on double storage. */
        void single(GateOp op, Plan plan);

        /** A group of gates applied block by block while each block sits in cache. */
        void blocked(List<GateOp> ops, Plan[] plans, int blockLog);

        /** A group of gates gathered into windows, either precision (see {@link Windows}). */
        void window(List<GateOp> ops, long mask, int low);

        /** A lone single-qubit gate on single-precision storage. */
        void floatSingle(GateOp op, double[] m2);

        /** A permutation that moves chunk references only. */
        void chunkMove(GateOp op);

        /** The frame's phases applied in one pass. */
        void phases(double[] p);
    }

    /** Returns the passes that run on the amplitudes of {@code a}. */
    static Passes runner(Amplitudes a, int threads) {
        return new Runner(a, threads);
    }

    /** The passes run on the amplitudes. */
    private static final class Runner implements Passes {
        private final Amplitudes a;
        private final int threads;

        Runner(Amplitudes a, int threads) {
            this.a = a;
            this.threads = threads;
        }

        @Override
        public void single(GateOp op, Plan plan) {
            plan.apply(threads);
        }

        @Override
        public void blocked(List<GateOp> ops, Plan[] plans, int blockLog) {
            Plan.applyBlocked(a, GatePairs.pairUp(a, ops, plans), blockLog, threads);
        }

        @Override
        public void window(List<GateOp> ops, long mask, int low) {
            Windows.applyGroup(a, ops, mask, low, threads);
        }

        @Override
        public void floatSingle(GateOp op, double[] m2) {
            long controls = 0;
            for (int c : op.controls) {
                controls |= 1L << c;
            }
            FloatSingleQubitKernels.dense1(a, op.targets[0], m2, controls, threads);
        }

        @Override
        public void chunkMove(GateOp op) {
            Object[] table = a.singles != null ? a.singles : a.chunks;
            PermutationKernels.permuteChunks(table, a.chunkLog, op.targets, op.controls,
                    op.perm);
        }

        @Override
        public void phases(double[] p) {
            applyPhases(a, p, threads);
        }
    }

    /**
     * Whether qubit {@code q} is flipped by the frame: its measured value is the stored bit
     * negated.
     *
     * @param a the storage
     * @param q the qubit
     * @return whether q is flipped
     */
    public static boolean flipped(Amplitudes a, int q) {
        return ((a.flips >>> q) & 1) != 0;
    }

    /**
     * Applies the frame to the amplitudes and clears it; nothing happens without a frame.
     * Safe to call from several threads at once.
     *
     * @param a the storage. Modified.
     * @param threads threads to use
     */
    public static void settle(Amplitudes a, int threads) {
        if (!a.framed) {
            return;
        }
        synchronized (a) {
            if (!a.framed) {
                return;
            }
            settle(a, new Runner(a, threads));
        }
    }

    /** Settles the frame through {@code passes}: a phase pass if any phase is left, then moves. */
    static void settle(Amplitudes a, Passes passes) {
        if (a.phases != null && anyPhased(a)) {
            // Phases that cancelled (S then S-dagger) cost no pass.
            passes.phases(a.phases);
        }
        List<GateOp> moves = new ArrayList<>();
        for (int q = 0; q < a.n; q++) {
            if (flipped(a, q)) {
                moves.add(xOp(q));
            }
        }
        execute(a, moves, passes);
        a.flips = 0;
        a.phases = null;
        a.framed = false;
    }

    /** Applies gates to the amplitudes as they are (no frame). */
    static void execute(Amplitudes a, List<GateOp> ops, int threads) {
        execute(a, ops, new Runner(a, threads));
    }

    /**
     * Hands the passes of gates on the amplitudes as they are (no frame) to {@code passes}: gates
     * grouped for cache blocking or windows ({@link Windows#schedule}); a double-precision state
     * that fits one cache block runs gate by gate.
     */
    static void execute(Amplitudes a, List<GateOp> ops, Passes passes) {
        if (ops.isEmpty()) {
            return;
        }
        if (a.isSingle() || a.n > Math.min(CACHE_LOG, a.chunkLog)) {
            Windows.schedule(a, ops, passes);
            return;
        }
        // One block holds the whole state: a merged run's table would serve it once, and
        // building it costs more than the gates (see TableKernels), so gates run one by one.
        for (GateOp op : ops) {
            if (PermutationKernels.movesChunks(a, op)) {
                passes.chunkMove(op);
            } else {
                passes.single(op, op.plan(a));
            }
        }
    }

    static GateOp xOp(int q) {
        return new GateOp(GateOp.MONOMIAL, new int[] {q}, NONE, X_PHASES, X_PERM);
    }

    private static boolean unit(double re, double im) {
        return Math.abs(re * re + im * im - 1) <= UNIT_TOLERANCE;
    }

    /**
     * Takes a single-qubit diagonal or permutation gate without controls into the frame, if
     * its entries are unit phases; returns whether it did.
     */
    private static boolean absorb(Amplitudes a, GateOp op) {
        if (op.targets.length != 1 || op.controls.length != 0 || op.shape == GateOp.DENSE) {
            return false;
        }
        double[] g = op.data;
        if (!unit(g[0], g[1]) || !unit(g[2], g[3])) {
            return false;
        }
        int q = op.targets[0];
        boolean swaps = op.shape == GateOp.MONOMIAL && op.perm[0] == 1;
        // X^m G X^m on qubit q: the entries swap where q is flipped; G = X diag(g0, g1) when
        // it swaps. The diagonal part multiplies the frame phases of q.
        int b = flipped(a, q) ? 1 : 0;
        double d0r = g[2 * b], d0i = g[2 * b + 1];
        double d1r = g[2 - 2 * b], d1i = g[3 - 2 * b];
        if (!(d0r == 1 && d0i == 0 && d1r == 1 && d1i == 0)) {
            if (a.phases == null) {
                a.phases = new double[4 * a.n];
                for (int x = 0; x < a.n; x++) {
                    a.phases[4 * x] = 1;
                    a.phases[4 * x + 2] = 1;
                }
            }
            double[] p = a.phases;
            int o = 4 * q;
            double r0 = d0r * p[o] - d0i * p[o + 1];
            double i0 = d0r * p[o + 1] + d0i * p[o];
            double r1 = d1r * p[o + 2] - d1i * p[o + 3];
            double i1 = d1r * p[o + 3] + d1i * p[o + 2];
            p[o] = r0;
            p[o + 1] = i0;
            p[o + 2] = r1;
            p[o + 3] = i1;
        }
        if (swaps) {
            a.flips ^= 1L << q;
        }
        return true;
    }

    private static boolean phased(Amplitudes a, int q) {
        double[] p = a.phases;
        if (p == null) {
            return false;
        }
        int o = 4 * q;
        return !(p[o] == 1 && p[o + 1] == 0 && p[o + 2] == 1 && p[o + 3] == 0);
    }

    /**
     * Returns {@code F^-1 G F} for the stored amplitudes. A flipped control is first unflipped
     * by a physical X, added to {@code out}.
     */
    private static GateOp conjugate(Amplitudes a, GateOp op, List<GateOp> out) {
        for (int c : op.controls) {
            if (flipped(a, c)) {
                out.add(xOp(c));
                a.flips ^= 1L << c;
                if (a.phases != null) {
                    // X_c D X_c: the two phases of c trade places.
                    double[] p = a.phases;
                    int o = 4 * c;
                    double r = p[o], i = p[o + 1];
                    p[o] = p[o + 2];
                    p[o + 1] = p[o + 3];
                    p[o + 2] = r;
                    p[o + 3] = i;
                }
            }
        }
        int k = op.targets.length;
        int f = 0;
        boolean phased = false;
        for (int t = 0; t < k; t++) {
            if (flipped(a, op.targets[t])) {
                f |= 1 << t;
            }
            phased |= phased(a, op.targets[t]);
        }
        if (f == 0 && (!phased || op.shape == GateOp.DIAGONAL)) {
            return op;
        }
        int dim = 1 << k;
        double[] d = phased ? targetPhases(a, op.targets) : null;
        // Without controls, a non-diagonal gate takes the targets' frame phases into its
        // columns and they leave the frame: G X^m D = X^m D_rest (X^f G X^f D_T). With
        // controls the phases must stay (they act where a control is 0 too): F^-1 G F.
        boolean take = d != null && op.controls.length == 0 && op.shape != GateOp.DIAGONAL;
        if (take) {
            for (int t : op.targets) {
                int o = 4 * t;
                a.phases[o] = 1;
                a.phases[o + 1] = 0;
                a.phases[o + 2] = 1;
                a.phases[o + 3] = 0;
            }
            if (!anyPhased(a)) {
                a.phases = null;
            }
        }
        // Rows are multiplied by conj(d_r) unless the phases were taken.
        double[] left = take ? null : d;
        double[] g = op.data;
        switch (op.shape) {
            case GateOp.DIAGONAL: {
                double[] x = new double[2 * dim];
                for (int j = 0; j < dim; j++) {
                    x[2 * j] = g[2 * (j ^ f)];
                    x[2 * j + 1] = g[2 * (j ^ f) + 1];
                }
                return new GateOp(GateOp.DIAGONAL, op.targets, op.controls, x, null);
            }
            case GateOp.MONOMIAL: {
                int[] perm = new int[dim];
                double[] x = new double[2 * dim];
                for (int c = 0; c < dim; c++) {
                    perm[c] = op.perm[c ^ f] ^ f;
                    double re = g[2 * (c ^ f)];
                    double im = g[2 * (c ^ f) + 1];
                    if (d != null) {
                        double[] z = sandwich(left, perm[c], d, c, re, im);
                        re = z[0];
                        im = z[1];
                    }
                    x[2 * c] = re;
                    x[2 * c + 1] = im;
                }
                return new GateOp(GateOp.MONOMIAL, op.targets, op.controls, x, perm);
            }
            default: {
                double[] x = new double[2 * dim * dim];
                for (int r = 0; r < dim; r++) {
                    for (int c = 0; c < dim; c++) {
                        int src = 2 * ((r ^ f) * dim + (c ^ f));
                        double re = g[src];
                        double im = g[src + 1];
                        if (d != null) {
                            double[] z = sandwich(left, r, d, c, re, im);
                            re = z[0];
                            im = z[1];
                        }
                        x[2 * (r * dim + c)] = re;
                        x[2 * (r * dim + c) + 1] = im;
                    }
                }
                return new GateOp(GateOp.DENSE, op.targets, op.controls, x, null);
            }
        }
    }

    private static boolean anyPhased(Amplitudes a) {
        for (int q = 0; q < a.n; q++) {
            if (phased(a, q)) {
                return true;
            }
        }
        return false;
    }

    /** conj(left_r) (re + i im) d_c; without {@code left}, (re + i im) d_c. */
    private static double[] sandwich(double[] left, int r, double[] d, int c, double re,
            double im) {
        double cr = d[2 * c], ci = d[2 * c + 1];
        double xr = re * cr - im * ci;
        double xi = re * ci + im * cr;
        if (left == null) {
            return new double[] {xr, xi};
        }
        double rr = left[2 * r], ri = -left[2 * r + 1];
        return new double[] {rr * xr - ri * xi, rr * xi + ri * xr};
    }

    /** The frame phase of each combination j of the targets (bit t of j is targets[t]). */
    private static double[] targetPhases(Amplitudes a, int[] targets) {
        int dim = 1 << targets.length;
        double[] d = new double[2 * dim];
        double[] p = a.phases;
        for (int j = 0; j < dim; j++) {
            double re = 1;
            double im = 0;
            for (int t = 0; t < targets.length; t++) {
                int o = 4 * targets[t] + 2 * ((j >>> t) & 1);
                double nr = re * p[o] - im * p[o + 1];
                im = re * p[o + 1] + im * p[o];
                re = nr;
            }
            d[2 * j] = re;
            d[2 * j + 1] = im;
        }
        return d;
    }

    /** Log2 of the amplitudes of one phase-table row at least, and at most. */
    private static final int ROW_LOG = 12;
    private static final int MAX_ROW_LOG = 16;

    /**
     * Multiplies amplitude i by the product over qubits of its frame phase, in one pass: a
     * table for the low qubits (up to the highest phased one, within 2^16 entries), times one
     * product per row for phased qubits above the table, if any.
     */
    private static void applyPhases(Amplitudes a, double[] p, int threads) {
        final int n = a.n;
        int top = topPhased(a);
        final int rl = phaseTableLog(a);
        final double[] table = tableOf(p, rl);
        final boolean rowPhases = top >= rl;
        boolean lowPhased = false;
        for (int q = 0; q < rl; q++) {
            lowPhased |= phased(a, q);
        }
        final boolean tablePhases = lowPhased;
        Parallel.forRange(threads, 1L << (n - rl), n >= Parallel.MIN_PARALLEL_QUBITS,
                (from, to) -> {
                    // Both parts phased: the row's own table, the low table times its constant.
                    final double[] own = rowPhases && tablePhases ? new double[table.length]
                            : null;
                    for (long row = from; row < to; row++) {
                        double hr = 1;
                        double hi = 0;
                        for (int q = rl; q < n && rowPhases; q++) {
                            int o = 4 * q + 2 * (int) ((row >>> (q - rl)) & 1);
                            double nr = hr * p[o] - hi * p[o + 1];
                            hi = hr * p[o + 1] + hi * p[o];
                            hr = nr;
                        }
                        double[] t = table;
                        if (own != null && a.lanes != null) {
                            // The same products: own[j] = table[j] (hr + i hi).
                            System.arraycopy(table, 0, own, 0, own.length);
                            a.lanes.scale(own, 0, own.length, hr, hi);
                            t = own;
                        } else if (own != null) {
                            for (int j = 0; j < own.length; j += 2) {
                                own[j] = table[j] * hr - table[j + 1] * hi;
                                own[j + 1] = table[j] * hi + table[j + 1] * hr;
                            }
                            t = own;
                        }
                        long first = row << rl;
                        int c = (int) (first >>> a.chunkLog);
                        int off = (int) (first & a.chunkMask) << 1;
                        boolean constant = rowPhases && !tablePhases;
                        final LaneKernels lanes = a.lanes;
                        if (lanes != null && a.singles != null) {
                            if (constant) {
                                lanes.scale(a.singles[c], off, off + (2 << rl), hr, hi);
                            } else {
                                lanes.scaleByTable(a.singles[c], off, t, 1 << rl);
                            }
                        } else if (lanes != null) {
                            if (constant) {
                                lanes.scale(a.chunks[c], off, off + (2 << rl), hr, hi);
                            } else {
                                lanes.scaleByTable(a.chunks[c], off, t, 1 << rl);
                            }
                        } else if (a.singles != null) {
                            if (constant) {
                                scaleRow(a.singles[c], off, hr, hi, 1 << rl);
                            } else {
                                scaleRow(a.singles[c], off, t, 1 << rl);
                            }
                        } else if (constant) {
                            scaleRow(a.chunks[c], off, hr, hi, 1 << rl);
                        } else {
                            scaleRow(a.chunks[c], off, t, 1 << rl);
                        }
                    }
                });
    }

    private static int topPhased(Amplitudes a) {
        int top = -1;
        for (int q = 0; q < a.n; q++) {
            if (phased(a, q)) {
                top = q;
            }
        }
        return top;
    }

    /**
     * Log2 of the entries of the phase table that settling builds: the low qubits up to the
     * highest phased one, within 2^16 entries; each piece of the pass builds its own copy too
     * when phased qubits lie above the table as well as in it.
     */
    static int phaseTableLog(Amplitudes a) {
        return Math.min(a.chunkLog, Math.max(Math.min(ROW_LOG, a.n), Math.min(topPhased(a) + 1,
                MAX_ROW_LOG)));
    }

    /** The product of the frame phases of qubits 0 to count-1 for each of their combinations. */
    private static double[] tableOf(double[] p, int count) {
        int dim = 1 << count;
        double[] t = new double[2 * dim];
        t[0] = 1;
        for (int j = 0; j < count; j++) {
            int o = 4 * j;
            int half = 1 << j;
            for (int x = half - 1; x >= 0; x--) {
                double re = t[2 * x];
                double im = t[2 * x + 1];
                t[2 * (x + half)] = re * p[o + 2] - im * p[o + 3];
                t[2 * (x + half) + 1] = re * p[o + 3] + im * p[o + 2];
                t[2 * x] = re * p[o] - im * p[o + 1];
                t[2 * x + 1] = re * p[o + 1] + im * p[o];
            }
        }
        return t;
    }

    private static void scaleRow(double[] psi, int off, double hr, double hi, int count) {
        final int end = off + 2 * count;
        for (int x = off; x < end; x += 2) {
            final double re = psi[x];
            final double im = psi[x + 1];
            psi[x] = hr * re - hi * im;
            psi[x + 1] = hr * im + hi * re;
        }
    }

    /** Multiplies {@code count} amplitudes at {@code off} by a table of factors (scalar loop). */
    static void scaleRow(double[] psi, int off, double[] table, int count) {
        final int end = 2 * count;
        for (int j = 0; j < end; j += 2) {
            final double tr = table[j];
            final double ti = table[j + 1];
            final double re = psi[off + j];
            final double im = psi[off + j + 1];
            psi[off + j] = tr * re - ti * im;
            psi[off + j + 1] = tr * im + ti * re;
        }
    }

    private static void scaleRow(float[] psi, int off, double hr, double hi, int count) {
        final int end = off + 2 * count;
        for (int x = off; x < end; x += 2) {
            final double re = psi[x];
            final double im = psi[x + 1];
            psi[x] = (float) (hr * re - hi * im);
            psi[x + 1] = (float) (hr * im + hi * re);
        }
    }

    private static void scaleRow(float[] psi, int off, double[] table, int count) {
        final int end = 2 * count;
        for (int j = 0; j < end; j += 2) {
            final double tr = table[j];
            final double ti = table[j + 1];
            final double re = psi[off + j];
            final double im = psi[off + j + 1];
            psi[off + j] = (float) (tr * re - ti * im);
            psi[off + j + 1] = (float) (tr * im + ti * re);
        }
    }
}
