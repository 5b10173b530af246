package dev.qsim.mps;

import dev.qsim.internal.Heap;
import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.TensorKernels;

/**
 * What can be read from a {@link Chain} without changing it: amplitudes, expectation values of
 * products of one-site operators, marginal probabilities, sequential samples, and the dense
 * state vector. Every read works from the mixed canonical form: sites left of the centre are
 * left-orthonormal, so a contraction that starts at or left of the centre starts from the
 * identity, and sites right of the centre are right-orthonormal, so one that ends at or right
 * of it ends with a trace (Schollwöck 2011, §4.4 and §4.2.1). Not thread-safe.
 */
final class Reads {
    private Reads() {
    }

    /**
     * Returns {@code <bits|ψ>} as {@code {re, im}}: a row vector carried through
     * {@code A_0[s_0] A_1[s_1] ...}, in {@code O(n χ²)} (Schollwöck 2011, eq. 38).
     *
     * @param c the chain
     * @param bits bit j is qubit j's value
     * @return the amplitude
     */
    static double[] amplitude(Chain c, boolean[] bits) {
        double[] v = {1, 0};
        for (int j = 0; j < c.n; j++) {
            int l = c.bond[j];
            int r = c.bond[j + 1];
            double[] w = new double[4 * r];
            TensorKernels.multiply(v, c.site[j], w, 1, l, 2 * r);
            v = java.util.Arrays.copyOfRange(w, bits[j] ? 2 * r : 0, bits[j] ? 4 * r : 2 * r);
        }
        return v;
    }

    /**
     * Returns {@code <ψ| ⊗_j op_j |ψ>} for one-site operators on sites {@code from .. to}
     * ({@code ops[j - from]}, null for the identity): the environment is carried from
     * {@code min(from, centre)} to {@code max(to, centre)} and traced.
     *
     * @param c the chain
     * @param from first site with an operator
     * @param ops 2x2 operators (null for identity)
     * @return {@code {re, im}}
     */
    static double[] product(Chain c, int from, double[][] ops) {
        int to = from + ops.length - 1;
        int lo = Math.min(from, c.center);
        int hi = Math.max(to, c.center);
        double[] e = null;
        for (int j = lo; j <= hi; j++) {
            double[] op = j >= from && j <= to ? ops[j - from] : null;
            e = transfer(c, e, j, op);
        }
        return trace(e, c.bond[hi + 1]);
    }

    /**
     * The environments of the identity on every bond, for reading many products at once (an
     * observable's terms): {@code left[j]} on bond j from the sites left of j (the identity,
     * null, up to the centre), {@code right[j]} on bond j + 1 from the sites right of j (null
     * from the centre on). A product on sites {@code from .. to} then costs only its span:
     * {@code Tr(left[from] T_from ... T_to right[to])}. Memory {@code O(n χ²)}, heap-checked.
     */
    static final class Environments {
        private final Chain c;
        private final double[][] left;
        private final double[][] right;

        /**
         * Builds the environments a set of products needs.
         *
         * @param c the chain
         * @param maxFrom the largest first site of a product
         * @param minTo the smallest last site of a product
         */
        Environments(Chain c, int maxFrom, int minTo) {
            this.c = c;
            this.left = new double[c.n][];
            this.right = new double[c.n][];
            double[] e = null;
            for (int j = c.center; j < maxFrom; j++) {
                e = transfer(c, e, j, null);
                left[j + 1] = e;
            }
            e = null;
            for (int j = c.center; j > minTo; j--) {
                int l = c.bond[j];
                int r = c.bond[j + 1];
                Heap.require(16L * (2L * l * r + (long) l * l), "a right environment of the"
                        + " matrix product state");
                double[] out = new double[2 * l * l];
                TensorKernels.transferRight(e, c.site[j], l, r, new double[4 * l * r], out);
                right[j - 1] = out;
                e = out;
            }
        }

        /**
         * Returns the product of one-site operators on sites {@code from ..}, as
         * {@link Reads#product}.
         *
         * @param from first site
         * @param ops operators (null for identity)
         * @return {@code {re, im}}
         */
        double[] product(int from, double[][] ops) {
            int to = from + ops.length - 1;
            double[] e = left[from];
            for (int j = from; j <= to; j++) {
                e = transfer(c, e, j, ops[j - from]);
            }
            int d = c.bond[to + 1];
            double[] r = right[to];
            if (r == null) {
                return trace(e, d);
            }
            double re = 0;
            double im = 0;
            for (int a = 0; a < d; a++) {
                for (int b = 0; b < d; b++) {
                    double er = e[2 * (a * d + b)];
                    double ei = e[2 * (a * d + b) + 1];
                    double rr = r[2 * (b * d + a)];
                    double ri = r[2 * (b * d + a) + 1];
                    re += er * rr - ei * ri;
                    im += er * ri + ei * rr;
                }
            }
            return new double[] {re, im};
        }
    }

    /** Carries an environment across site j with an operator (null: identity). */
    static double[] transfer(Chain c, double[] e, int j, double[] op) {
        int l = c.bond[j];
        int r = c.bond[j + 1];
        Heap.require(16L * (2L * l * r + (long) r * r), "an environment of the matrix product"
                + " state (bond dimension " + Math.max(l, r) + ")");
        double[] work = new double[4 * l * r];
        double[] out = new double[2 * r * r];
        TensorKernels.transferLeft(e, c.site[j], l, r, op, work, out);
        return out;
    }

    /** The trace of a d x d matrix as {@code {re, im}}. */
    static double[] trace(double[] e, int d) {
        double re = 0;
        double im = 0;
        for (int i = 0; i < d; i++) {
            re += e[2 * (i * d + i)];
            im += e[2 * (i * d + i) + 1];
        }
        return new double[] {re, im};
    }

    /**
     * Returns the marginal distribution of some qubits: entry {@code v} is the probability that
     * qubit {@code qubits[j]} reads bit j of v. A depth-first walk over the outcomes of the
     * qubits in site order, each branch carrying its environment with a projector, so memory
     * stays {@code O(k χ²)}; time {@code O(2^k span χ³)}.
     *
     * @param c the chain
     * @param qubits distinct qubits
     * @return {@code 2^k} probabilities
     */
    static double[] marginal(Chain c, int[] qubits) {
        int k = qubits.length;
        int[] order = new int[k];
        int[] sites = new int[k];
        Integer[] idx = new Integer[k];
        for (int i = 0; i < k; i++) {
            idx[i] = i;
        }
        java.util.Arrays.sort(idx, (a, b) -> Integer.compare(qubits[a], qubits[b]));
        for (int i = 0; i < k; i++) {
            order[i] = idx[i];
            sites[i] = qubits[idx[i]];
        }
        double[] out = new double[1 << k];
        int lo = Math.min(sites[0], c.center);
        int hi = Math.max(sites[k - 1], c.center);
        walk(c, sites, order, 0, lo, hi, null, 0, out);
        return out;
    }

    private static final double[][] PROJECTOR = {
        {1, 0, 0, 0, 0, 0, 0, 0},
        {0, 0, 0, 0, 0, 0, 1, 0},
    };

    private static void walk(Chain c, int[] sites, int[] order, int i, int from, int hi,
            double[] e, int key, double[] out) {
        if (i == sites.length) {
            for (int j = from; j <= hi; j++) {
                e = transfer(c, e, j, null);
            }
            out[key] = Math.max(0, trace(e, c.bond[hi + 1])[0]);
            return;
        }
        for (int j = from; j < sites[i]; j++) {
            e = transfer(c, e, j, null);
        }
        for (int s = 0; s < 2; s++) {
            double[] next = transfer(c, e, sites[i], PROJECTOR[s]);
            walk(c, sites, order, i + 1, sites[i] + 1, hi, next, key | (s << order[i]), out);
        }
    }

    /**
     * Draws bitstrings one qubit at a time from the exact conditional probabilities (Ferris and
     * Vidal 2012, "Perfect sampling with unitary tensor networks", Phys. Rev. B 85, 165146,
     * doi:10.1103/PhysRevB.85.165146): site j's outcome is drawn from
     * {@code p(s_j | s_<j) ∝ v_s R_j v_s^H}, {@code v_s} the carried row vector times
     * {@code A_j[s]} and {@code R_j} the right environment (the identity from the centre on).
     * Each shot costs {@code O(last χ²)} and one uniform per site up to {@code last}.
     */
    static final class Sampler {
        private final Chain c;
        private final int last;
        /** Right environments on bond j + 1 for sites j below the centre; null: identity. */
        private final double[][] right;

        /**
         * Prepares sampling of sites {@code 0 .. last}.
         *
         * @param c the chain; must not change while the sampler is used
         * @param last the last site to draw
         */
        Sampler(Chain c, int last) {
            this.c = c;
            this.last = last;
            this.right = new double[last + 1][];
            double[] e = null;
            for (int j = c.center - 1; j >= 0; j--) {
                // R_j = Σ_s A_{j+1}[s] R_{j+1} A_{j+1}[s]^H
                int l = c.bond[j + 1];
                int r = c.bond[j + 2];
                Heap.require(16L * (2L * l * r + (long) l * l), "a right environment of the"
                        + " matrix product state");
                double[] out = new double[2 * l * l];
                TensorKernels.transferRight(e, c.site[j + 1], l, r, new double[4 * l * r], out);
                if (j <= last) {
                    right[j] = out;
                }
                e = out;
            }
        }

        /**
         * Draws one shot.
         *
         * @param uniforms one uniform in [0, 1) per site up to {@code last}
         * @param bits the drawn bits, site j at index j. Modified.
         */
        void draw(java.util.function.DoubleSupplier uniforms, boolean[] bits) {
            double[] v = {1, 0};
            double[] w = new double[4 * c.maxBond()];
            for (int j = 0; j <= last; j++) {
                int l = c.bond[j];
                int r = c.bond[j + 1];
                TensorKernels.multiply(v, c.site[j], w, 1, l, 2 * r);
                double p0 = weight(w, 0, r, right[j]);
                double p1 = weight(w, 2 * r, r, right[j]);
                int s = uniforms.getAsDouble() * (p0 + p1) < p0 ? 0 : 1;
                bits[j] = s == 1;
                double scale = 1 / Math.sqrt(s == 0 ? p0 : p1);
                v = new double[2 * r];
                for (int b = 0; b < 2 * r; b++) {
                    v[b] = w[2 * r * s + b] * scale;
                }
            }
        }

        /** {@code Σ v_a R[a][a'] conj(v_a')} for the row vector v at {@code w[at ..]}. */
        private static double weight(double[] w, int at, int r, double[] env) {
            double sum = 0;
            if (env == null) {
                for (int b = at; b < at + 2 * r; b++) {
                    sum += w[b] * w[b];
                }
                return sum;
            }
            for (int a = 0; a < r; a++) {
                double vr = w[at + 2 * a];
                double vi = w[at + 2 * a + 1];
                int row = 2 * a * r;
                for (int b = 0; b < r; b++) {
                    double er = env[row + 2 * b];
                    double ei = env[row + 2 * b + 1];
                    // v_a R_ab conj(v_b), real part
                    double tr = vr * er - vi * ei;
                    double ti = vr * ei + vi * er;
                    sum += tr * w[at + 2 * b] + ti * w[at + 2 * b + 1];
                }
            }
            return sum;
        }
    }

    /**
     * Contracts the chain into a dense state vector: the sites below {@code h} into a
     * {@code 2^h x χ_h} table once, the sites from {@code h} up walked depth first carrying a
     * column vector; each leaf writes {@code 2^h} amplitudes.
     *
     * @param c the chain, at most 40 qubits
     * @return the amplitudes
     */
    static Amplitudes toAmplitudes(Chain c) {
        int n = c.n;
        Amplitudes out = Heap.allocate(Amplitudes.bytes(n), "a " + n + "-qubit state vector",
                () -> Amplitudes.allocate(n));
        int h = Math.min(n, 20);
        while (h > 1 && (1L << h) * c.bond[h] > (1L << 22)) {
            h--;
        }
        Heap.require(32L * (1L << h) * c.bond[h] + (32L << h), "contracting the matrix product"
                + " state");
        double[] table = {1, 0};
        int rows = 1;
        for (int j = 0; j < h; j++) {
            int l = c.bond[j];
            int r = c.bond[j + 1];
            double[] m = new double[2 * rows * 2 * r];
            TensorKernels.multiply(table, c.site[j], m, rows, l, 2 * r);
            double[] next = new double[2 * 2 * rows * r];
            for (int idx = 0; idx < rows; idx++) {
                System.arraycopy(m, 2 * idx * 2 * r, next, 2 * idx * r, 2 * r);
                System.arraycopy(m, 2 * idx * 2 * r + 2 * r, next, 2 * (rows + idx) * r, 2 * r);
            }
            table = next;
            rows *= 2;
        }
        fill(c, out, table, h, n - 1, new double[] {1, 0}, 0L, new double[2 << h]);
        return out;
    }

    private static void fill(Chain c, Amplitudes out, double[] table, int h, int j,
            double[] vec, long high, double[] buffer) {
        if (j < h) {
            int chi = c.bond[h];
            TensorKernels.multiply(table, vec, buffer, 1 << h, chi, 1);
            out.write(high << h, h, buffer, 0);
            return;
        }
        int l = c.bond[j];
        int r = c.bond[j + 1];
        double[] a = c.site[j];
        for (int s = 0; s < 2; s++) {
            double[] next = new double[2 * l];
            for (int x = 0; x < l; x++) {
                int row = 2 * ((x * 2 + s) * r);
                double sr = 0;
                double si = 0;
                for (int b = 0; b < r; b++) {
                    double ar = a[row + 2 * b];
                    double ai = a[row + 2 * b + 1];
                    sr += ar * vec[2 * b] - ai * vec[2 * b + 1];
                    si += ar * vec[2 * b + 1] + ai * vec[2 * b];
                }
                next[2 * x] = sr;
                next[2 * x + 1] = si;
            }
            fill(c, out, table, h, j - 1, next, high | ((long) s << (j - h)), buffer);
        }
    }
}
