package dev.qsim.mps;

import java.util.Arrays;

import dev.qsim.internal.Heap;
import dev.qsim.kernel.ComplexQr;
import dev.qsim.kernel.ComplexSvd;
import dev.qsim.kernel.TensorKernels;

/**
 * The tensors of a matrix product state and the operations that change them: one tensor per
 * qubit ({@code site[j]}, indices {@code [a][s][b]} with bonds {@code bond[j]} and
 * {@code bond[j+1]}, {@code bond[0] = bond[n] = 1}), kept in mixed canonical form about an
 * orthogonality centre (Schollwöck 2011, §4.4): every site left of {@code center} is
 * left-orthonormal ({@code Σ_s A[s]^H A[s] = I}), every site right of it right-orthonormal
 * ({@code Σ_s A[s] A[s]^H = I}). So the Schmidt values across any bond of a block that holds the
 * centre are the singular values of the block, and dropping the smallest of them is the best
 * approximation of the state with fewer (Eckart and Young 1936; Schollwöck 2011, §4.5).
 *
 * <p>Costs, for the cost model: a k-site update with outer bonds {@code l}, {@code r} contracts
 * the block ({@code O(l 2^k r χ)}), applies the gate ({@code O(l 4^k r)}) and splits it with
 * {@code k - 1} SVDs, the first of a {@code (2l) x (2^{k-1} r)} matrix, about
 * {@code 20 m n min(m, n)} flops each; a gate at distance {@code d} adds {@code 2(d - 1)} swap
 * updates; moving the centre one site is one QR of a {@code (2l) x r} matrix. Not thread-safe.
 */
final class Chain {
    /** The unit roundoff of a double. */
    private static final double EPS = 0x1p-52;

    /** The swap gate in block order (its own inverse). */
    private static final double[] SWAP = {
        1, 0, 0, 0, 0, 0, 0, 0,
        0, 0, 0, 0, 1, 0, 0, 0,
        0, 0, 1, 0, 0, 0, 0, 0,
        0, 0, 0, 0, 0, 0, 1, 0,
    };

    final int n;
    final double[][] site;
    final int[] bond;
    int center;
    final int bondLimit;
    final double threshold;

    /** Sum of discarded weights. */
    double discarded;
    /** Sum of {@code log(1 - w)} over truncations. */
    double logFidelity;
    /** Sum of {@code asin(sqrt(w))}: the Fubini-Study angle the truncations can have added. */
    double angle;
    /** Splits whose bond limit or threshold dropped a Schmidt value. */
    long truncations;
    /** Block updates done (gates of two or more qubits and swaps). */
    long updates;
    /** Swap updates done for routing. */
    long swaps;

    private Chain(int n, double[][] site, int[] bond, int center, int bondLimit,
            double threshold) {
        this.n = n;
        this.site = site;
        this.bond = bond;
        this.center = center;
        this.bondLimit = bondLimit;
        this.threshold = threshold;
    }

    /** The product state |0...0>, centre at site 0. Unchecked arguments. */
    static Chain zero(int n, int bondLimit, double threshold) {
        Heap.require(64L * n + 1024, "a matrix product state of " + n + " qubits");
        double[][] site = new double[n][];
        for (int j = 0; j < n; j++) {
            site[j] = new double[4];
            site[j][0] = 1;
        }
        int[] bond = new int[n + 1];
        Arrays.fill(bond, 1);
        return new Chain(n, site, bond, 0, bondLimit, threshold);
    }

    /** A deep copy, heap-checked. */
    Chain copy() {
        need(bytes(), "a copy of the matrix product state");
        double[][] s = new double[n][];
        for (int j = 0; j < n; j++) {
            s[j] = site[j].clone();
        }
        Chain c = new Chain(n, s, bond.clone(), center, bondLimit, threshold);
        c.discarded = discarded;
        c.logFidelity = logFidelity;
        c.angle = angle;
        c.truncations = truncations;
        c.updates = updates;
        c.swaps = swaps;
        return c;
    }

    /** The bytes the tensors hold. */
    long bytes() {
        long b = 0;
        for (double[] s : site) {
            b += 8L * s.length + 16;
        }
        return b;
    }

    /** The largest bond dimension. */
    int maxBond() {
        int m = 1;
        for (int b : bond) {
            m = Math.max(m, b);
        }
        return m;
    }

    private static void need(long bytes, String what) {
        Heap.require(bytes, what);
    }

    private void needTensor(long doubles, String what) {
        Heap.require(8 * doubles, what + " (largest bond dimension " + maxBond() + ")");
    }

    /** Moves the orthogonality centre to site {@code target} by QR steps. */
    void moveCenter(int target) {
        while (center < target) {
            stepRight(center);
        }
        while (center > target) {
            stepLeft(center);
        }
    }

    /** A = QR at site j (rows (a, s), columns b); Q stays, R goes into site j + 1. */
    private void stepRight(int j) {
        int l = bond[j];
        int r = bond[j + 1];
        int r2 = bond[j + 2];
        needTensor(ComplexQr.bytes(2 * l, r) / 8 + 4L * Math.min(2 * l, r) * r2,
                "moving the centre of a matrix product state");
        ComplexQr qr = ComplexQr.of(site[j], 2 * l, r);
        int k = qr.rank();
        double[] next = new double[4 * k * r2];
        TensorKernels.multiply(qr.r(), site[j + 1], next, k, r, 2 * r2);
        site[j] = qr.q();
        site[j + 1] = next;
        bond[j + 1] = k;
        center = j + 1;
    }

    /** A^H = QR at site j (A as rows a, columns (s, b)); Q^H stays, R^H goes into site j - 1. */
    private void stepLeft(int j) {
        int l = bond[j];
        int r = bond[j + 1];
        int l0 = bond[j - 1];
        needTensor(ComplexQr.bytes(2 * r, l) / 8 + 4L * l0 * Math.min(2 * r, l) + 4L * l * r,
                "moving the centre of a matrix product state");
        double[] x = ComplexSvd.adjoint(site[j], l, 2 * r);
        ComplexQr qr = ComplexQr.of(x, 2 * r, l);
        int k = qr.rank();
        double[] prev = new double[4 * l0 * k];
        TensorKernels.multiplyAdjointRight(site[j - 1], qr.r(), prev, 2 * l0, l, k);
        site[j] = ComplexSvd.adjoint(qr.q(), 2 * r, k);
        site[j - 1] = prev;
        bond[j] = k;
        center = j - 1;
    }

    /** Applies a 2x2 matrix to one site; the canonical form is unchanged. */
    void applyOne(int q, double[] g) {
        TensorKernels.applyToMiddle(g, 2, site[q], bond[q], bond[q + 1], null);
    }

    /**
     * Applies a {@code 2^k x 2^k} matrix to the adjacent sites {@code first .. first + k - 1}
     * (block order: site {@code first} is the most significant bit of the matrix index), then
     * splits the block with SVDs, truncating each bond. The centre ends at the block's last
     * site.
     */
    void applyBlock(int first, int k, double[] g) {
        int last = first + k - 1;
        if (center < first) {
            moveCenter(first);
        } else if (center > last) {
            moveCenter(last);
        }
        int l = bond[first];
        int r = bond[last + 1];
        long dim = 1L << k;
        needTensor(2L * l * dim * r * 3 + 2L * dim * r, "a " + k + "-site block of a matrix"
                + " product state");
        double[] theta = site[first];
        int rows = 2 * l;
        for (int j = first + 1; j <= last; j++) {
            int mid = bond[j];
            int right = bond[j + 1];
            needTensor(4L * rows * right, "a " + k + "-site block of a matrix product state");
            double[] t = new double[4 * rows * right];
            TensorKernels.multiply(theta, site[j], t, rows, mid, 2 * right);
            theta = t;
            rows *= 2;
        }
        if (theta == site[first]) {
            theta = theta.clone();
        }
        TensorKernels.applyToMiddle(g, (int) dim, theta, l, r, new double[(int) (2 * dim * r)]);
        split(first, k, theta, l, r);
        updates++;
    }

    /** Splits a k-site block {@code theta[l][2^k][r]} left to right with truncated SVDs. */
    private void split(int first, int k, double[] theta, int l, int r) {
        int cur = l;
        for (int i = 0; i < k - 1; i++) {
            int j = first + i;
            int m = 2 * cur;
            int cols = (1 << (k - 1 - i)) * r;
            needTensor(ComplexSvd.bytes(m, cols) / 8, "the SVD of a " + m + " x " + cols
                    + " block");
            ComplexSvd svd = ComplexSvd.of(theta, m, cols);
            double[] s = svd.values();
            int kk = s.length;
            int keep = keep(s, m, cols);
            double[] u = svd.u();
            double[] left = new double[2 * m * keep];
            for (int row = 0; row < m; row++) {
                System.arraycopy(u, 2 * row * kk, left, 2 * row * keep, 2 * keep);
            }
            double[] vh = svd.vh();
            double[] rest = new double[2 * keep * cols];
            for (int row = 0; row < keep; row++) {
                double f = s[row];
                int at = 2 * row * cols;
                for (int c = 0; c < 2 * cols; c++) {
                    rest[at + c] = f * vh[at + c];
                }
            }
            site[j] = left;
            bond[j + 1] = keep;
            theta = rest;
            cur = keep;
        }
        site[first + k - 1] = theta;
        center = first + k - 1;
    }

    /**
     * Chooses how many Schmidt values to keep, records the discarded weight, and scales the kept
     * values in place so that their squares sum to the total (the state keeps its norm).
     * Dropped: values at or below {@code max(m, n) ε σ_1} (numerically zero: Golub and Van Loan
     * 2013, §5.4.1), values beyond the bond limit, and then the largest tail whose weight is at
     * most the threshold times the total.
     */
    int keep(double[] s, int m, int cols) {
        int kk = s.length;
        double floor = Math.max(m, cols) * EPS * s[0];
        int keep = 0;
        while (keep < kk && s[keep] > floor) {
            keep++;
        }
        keep = Math.max(1, keep);
        int numeric = keep;
        keep = Math.min(keep, bondLimit);
        double total = 0;
        for (int i = kk - 1; i >= 0; i--) {
            total += s[i] * s[i];
        }
        if (!(total > 0)) {
            throw new IllegalStateException("internal error: a block of the matrix product"
                    + " state has norm " + total);
        }
        double tail = 0;
        for (int i = kk - 1; i >= keep; i--) {
            tail += s[i] * s[i];
        }
        double allowed = threshold * total;
        while (keep > 1 && tail + s[keep - 1] * s[keep - 1] <= allowed) {
            keep--;
            tail += s[keep] * s[keep];
        }
        if (tail > 0) {
            double w = tail / total;
            discarded += w;
            logFidelity += Math.log1p(-w);
            angle += Math.asin(Math.sqrt(w));
            if (keep < numeric) {
                truncations++;
            }
            double scale = Math.sqrt(total / (total - tail));
            for (int i = 0; i < keep; i++) {
                s[i] *= scale;
            }
        }
        return keep;
    }

    /** Swaps the qubits on sites j and j + 1. */
    void swap(int j) {
        applyBlock(j, 2, SWAP);
        swaps++;
    }

    /**
     * Applies a gate given on arbitrary distinct qubits: matrix index bit {@code x} belongs to
     * {@code qubits[x]}. The qubits are gathered onto adjacent sites next to the lowest one by
     * swaps, the block is updated, and the swaps are undone, so qubit {@code q} stays on site
     * {@code q}.
     */
    void applyGate(int[] qubits, double[] matrix) {
        int k = qubits.length;
        if (k == 1) {
            applyOne(qubits[0], matrix);
            return;
        }
        int[] sorted = qubits.clone();
        Arrays.sort(sorted);
        int base = sorted[0];
        int distance = 0;
        for (int j = 1; j < k; j++) {
            distance += sorted[j] - base - j;
        }
        int[] done = new int[distance];
        int count = 0;
        for (int j = 1; j < k; j++) {
            for (int p = sorted[j] - 1; p >= base + j; p--) {
                swap(p);
                done[count++] = p;
            }
        }
        applyBlock(base, k, blockOrder(matrix, qubits, sorted));
        for (int i = count - 1; i >= 0; i--) {
            swap(done[i]);
        }
    }

    /**
     * Re-indexes a gate matrix from instruction order (bit x is {@code qubits[x]}) to block
     * order (the lowest qubit is the most significant bit).
     */
    static double[] blockOrder(double[] matrix, int[] qubits, int[] sorted) {
        int k = qubits.length;
        int dim = 1 << k;
        int[] shift = new int[k];
        for (int x = 0; x < k; x++) {
            int rank = Arrays.binarySearch(sorted, qubits[x]);
            shift[x] = k - 1 - rank;
        }
        int[] map = new int[dim];
        for (int i = 0; i < dim; i++) {
            int p = 0;
            for (int x = 0; x < k; x++) {
                p |= ((i >>> x) & 1) << shift[x];
            }
            map[i] = p;
        }
        double[] out = new double[2 * dim * dim];
        for (int i = 0; i < dim; i++) {
            for (int j = 0; j < dim; j++) {
                int at = 2 * (map[i] * dim + map[j]);
                out[at] = matrix[2 * (i * dim + j)];
                out[at + 1] = matrix[2 * (i * dim + j) + 1];
            }
        }
        return out;
    }

    /**
     * Measures qubit q in the computational basis with the uniform {@code u} in [0, 1):
     * outcome 0 when {@code u < P(0)}; the centre moves to q, the other outcome's slice is zeroed
     * and the state renormalised (Nielsen and Chuang 2010, §2.2.3).
     */
    int measure(int q, double u) {
        moveCenter(q);
        double[] a = site[q];
        int l = bond[q];
        int r = bond[q + 1];
        double p0 = 0;
        double p1 = 0;
        for (int x = 0; x < l; x++) {
            int base = 4 * x * r;
            for (int b = 0; b < 2 * r; b++) {
                p0 += a[base + b] * a[base + b];
                p1 += a[base + 2 * r + b] * a[base + 2 * r + b];
            }
        }
        int outcome = u * (p0 + p1) < p0 ? 0 : 1;
        double keep = outcome == 0 ? p0 : p1;
        double scale = 1 / Math.sqrt(keep);
        for (int x = 0; x < l; x++) {
            int base = 4 * x * r;
            int kept = base + 2 * r * outcome;
            int gone = base + 2 * r * (1 - outcome);
            for (int b = 0; b < 2 * r; b++) {
                a[kept + b] *= scale;
                a[gone + b] = 0;
            }
        }
        return outcome;
    }

    /** Resets qubit q to |0>: a measurement, then X if it gave 1. */
    void reset(int q, double u) {
        if (measure(q, u) == 1) {
            applyOne(q, new double[] {0, 0, 1, 0, 1, 0, 0, 0});
        }
    }
}
