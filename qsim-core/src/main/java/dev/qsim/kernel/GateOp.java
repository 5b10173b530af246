package dev.qsim.kernel;

/**
 * One gate as the kernels see it: its shape (dense, diagonal or monomial), target and control
 * qubits, and matrix data; turned into a {@link Plan} for a given storage. Immutable by
 * convention (arrays are shared, never modified). Internal.
 */
public final class GateOp {
    /** Shape: a dense {@code 2^k x 2^k} matrix. */
    public static final int DENSE = 0;
    /** Shape: a diagonal matrix. */
    public static final int DIAGONAL = 1;
    /** Shape: a monomial matrix (one non-zero per column). */
    public static final int MONOMIAL = 2;
    /**
     * Shape: a run of diagonal and monomial gates merged by the planner into one monomial on
     * all their qubits, applied from full tables ({@link TableKernels}).
     */
    public static final int TABLE = 3;

    final int shape;
    final int[] targets;
    final int[] controls;
    final double[] data;
    final int[] perm;
    final long targetMask;
    /** The gates of a {@link #TABLE} run, in order; else null. */
    final GateOp[] parts;

    /**
     * Describes a gate; see {@link DenseKernels#plan}, {@link DiagonalKernels#plan} and
     * {@link PermutationKernels#plan} for the data of each shape.
     *
     * @param shape {@link #DENSE}, {@link #DIAGONAL} or {@link #MONOMIAL}
     * @param targets target qubits. Not copied.
     * @param controls control qubits, possibly empty. Not copied.
     * @param data matrix, diagonal or phases, re/im interleaved. Not copied.
     * @param perm the permutation of a monomial gate, else null. Not copied.
     */
    public GateOp(int shape, int[] targets, int[] controls, double[] data, int[] perm) {
        this(shape, targets, controls, data, perm, null);
    }

    private GateOp(int shape, int[] targets, int[] controls, double[] data, int[] perm,
            GateOp[] parts) {
        this.shape = shape;
        this.parts = parts;
        this.targets = targets;
        this.controls = controls;
        this.data = data;
        this.perm = perm;
        long m = 0;
        for (int t : targets) {
            m |= 1L << t;
        }
        this.targetMask = m;
    }

    /**
     * Whether this is a dense single-qubit gate without controls whose matrix is real (H, RY)
     * or shaped like RX (real diagonal, imaginary off-diagonal): its loops do half the
     * arithmetic of a complex one.
     *
     * @return whether it is
     */
    public boolean halfArithmetic() {
        return shape == DENSE && targets.length == 1 && controls.length == 0
                && LaneKernels.kind(data) != LaneKernels.COMPLEX;
    }

    /**
     * Returns the shape: {@link #DENSE}, {@link #DIAGONAL}, {@link #MONOMIAL} or {@link #TABLE}.
     *
     * @return the shape
     */
    public int shape() {
        return shape;
    }

    /**
     * Returns a copy of the target qubits.
     *
     * @return the targets
     */
    public int[] targets() {
        return targets.clone();
    }

    /**
     * Describes a (controlled) gate by its matrix, choosing the cheapest exact shape: diagonal
     * when every off-diagonal entry is zero, monomial when every row and column holds one
     * non-zero entry, dense otherwise.
     *
     * @param m the matrix on the targets, {@code 2^k x 2^k}, row-major, re/im interleaved. Not
     *     modified; a dense description keeps a reference to it.
     * @param targets the targets. Kept, not copied.
     * @param controls the controls. Kept, not copied.
     * @return the description
     */
    public static GateOp of(double[] m, int[] targets, int[] controls) {
        int d = 1 << targets.length;
        boolean diagonal = true;
        boolean monomial = true;
        int[] perRow = new int[d];
        int[] perm = new int[d];
        double[] phase = new double[2 * d];
        for (int c = 0; c < d; c++) {
            int inColumn = 0;
            for (int r = 0; r < d; r++) {
                double re = m[2 * (r * d + c)];
                double im = m[2 * (r * d + c) + 1];
                if (re != 0 || im != 0) {
                    diagonal &= r == c;
                    inColumn++;
                    perRow[r]++;
                    perm[c] = r;
                    phase[2 * c] = re;
                    phase[2 * c + 1] = im;
                }
            }
            monomial &= inColumn == 1;
        }
        for (int r = 0; r < d && monomial; r++) {
            monomial = perRow[r] == 1;
        }
        if (diagonal) {
            double[] diag = new double[2 * d];
            for (int i = 0; i < d; i++) {
                diag[2 * i] = m[2 * (i * d + i)];
                diag[2 * i + 1] = m[2 * (i * d + i) + 1];
            }
            return new GateOp(DIAGONAL, targets, controls, diag, null);
        }
        if (monomial) {
            return new GateOp(MONOMIAL, targets, controls, phase, perm);
        }
        return new GateOp(DENSE, targets, controls, m, null);
    }

    /**
     * Describes a run of diagonal and monomial gates as one {@link #TABLE} gate on the given
     * qubits, every one a target or control of some part, without controls of its own.
     *
     * @param qubits the qubits of the parts, ascending. Kept, not copied.
     * @param parts the gates in order, each {@link #DIAGONAL} or {@link #MONOMIAL}. Kept.
     * @return the run
     */
    static GateOp table(int[] qubits, GateOp[] parts) {
        return new GateOp(TABLE, qubits, new int[0], null, null, parts);
    }

    /**
     * Prepares the gate for a storage, with given qubit numbers (the gate's own, or its
     * qubits renumbered inside a window).
     *
     * @param a double-precision storage
     * @param t target qubits in {@code a}
     * @param c control qubits in {@code a}
     * @return the plan
     */
    Plan plan(Amplitudes a, int[] t, int[] c) {
        switch (shape) {
            case DIAGONAL:
                return DiagonalKernels.plan(a, t, c, data);
            case MONOMIAL:
                return PermutationKernels.plan(a, t, c, perm, data);
            case TABLE:
                return TableKernels.plan(a, t, this);
            default:
                return DenseKernels.plan(a, t, c, data);
        }
    }

    /**
     * Prepares the gate for a double-precision storage with its own qubit numbers.
     *
     * @param a the storage
     * @return the plan
     */
    Plan plan(Amplitudes a) {
        return plan(a, targets, controls);
    }
}
