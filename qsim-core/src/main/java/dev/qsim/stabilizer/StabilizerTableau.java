package dev.qsim.stabilizer;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Objects;

import org.apache.commons.rng.UniformRandomProvider;

import dev.qsim.StateVector;
import dev.qsim.internal.Bridge;
import dev.qsim.internal.Checks;
import dev.qsim.internal.Heap;
import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.Parallel;
import dev.qsim.kernel.StabilizerStates;
import dev.qsim.observable.PauliProduct;

/**
 * A stabilizer state of n qubits held as its table of generators: mutable, not thread-safe.
 * Gates and measurements change it in place; {@link #copy()} is the way out.
 *
 * <p><b>Method.</b> The tableau of S. Aaronson and D. Gottesman, "Improved simulation of
 * stabilizer circuits", Phys. Rev. A 70, 052328 (2004), doi:10.1103/PhysRevA.70.052328: n
 * destabilizer and n stabilizer generators, each a Pauli string stored as x and z bits, and a
 * sign per stabilizer. Clifford gates update the bits column by column (their section III);
 * a measurement of qubit a is random exactly when some stabilizer has X or Y on a, and then
 * costs O(n²) bit operations, otherwise it is deterministic and its outcome is the sign of a
 * product of stabilizers, found without changing the table.
 *
 * <p><b>Storage.</b> The bits are held by qubit (column): for each qubit, one bit per generator,
 * packed 64 generators to a {@code long}, so a gate on k qubits touches k columns of n/32 words
 * and the products a measurement needs are word-parallel over generators (bit-sliced sums of the
 * phase function g of the paper). The destabilizer signs are never needed for outcomes and are
 * not kept. Memory: about n²/2 bytes.
 *
 * <p><b>Pauli products</b> in and out are {@link PauliProduct}s, with the one text format of
 * {@link PauliProduct#parse(String)} and {@link PauliProduct#toDense(int)}.
 *
 * @since 0.1
 */
public final class StabilizerTableau {
    static {
        Bridge.register(new TableauEngine());
    }

    /**
     * The largest qubit count accepted: each bit column set must fit one Java array. Memory
     * grows as n²/2 bytes, so the heap is usually the tighter limit.
     */
    public static final int MAX_QUBITS = 200_000;

    /** The largest qubit count {@link #toStateVector()} converts. */
    public static final int MAX_DENSE_QUBITS = 20;

    private final int n;
    /** Words per half column: ceil(n / 64). Destabilizers in words [0, half), stabilizers after. */
    private final int half;
    /** Words per column: 2 * half. */
    private final int stride;
    /** x bits: column q in [q * stride, (q + 1) * stride). */
    private final long[] xs;
    /** z bits, same layout. */
    private final long[] zs;
    /** Stabilizer signs, bit i = 1 for a minus sign on stabilizer i. */
    private final long[] signs;
    /** Scratch: the rows a measurement multiplies, one column long. */
    private final long[] mask;
    /** Scratch: bit 0 and bit 1 of the bit-sliced phase sums, stabilizer half. */
    private final long[] low;
    private final long[] high;

    private StabilizerTableau(int n) {
        this.n = n;
        this.half = (n + 63) >>> 6;
        this.stride = 2 * half;
        this.xs = new long[n * stride];
        this.zs = new long[n * stride];
        this.signs = new long[half];
        this.mask = new long[stride];
        this.low = new long[half];
        this.high = new long[half];
    }

    private StabilizerTableau(StabilizerTableau other) {
        this.n = other.n;
        this.half = other.half;
        this.stride = other.stride;
        this.xs = other.xs.clone();
        this.zs = other.zs.clone();
        this.signs = other.signs.clone();
        this.mask = new long[stride];
        this.low = new long[half];
        this.high = new long[half];
    }

    /**
     * Returns the bytes the table of n qubits occupies.
     *
     * @param n qubits, at least 1
     * @return about 32 n ceil(n / 64) bytes
     */
    public static long bytes(int n) {
        long words = ((long) n + 63) >>> 6;
        return 8L * (2L * n * 2 * words + 5 * words);
    }

    /**
     * Returns the state |0...0&gt; of n qubits: destabilizer i is X on qubit i and stabilizer i
     * is +Z on qubit i.
     *
     * @param n qubits, in [1, {@value #MAX_QUBITS}]
     * @return a new table
     * @throws IllegalArgumentException if {@code n} is out of range
     * @throws IllegalStateException if the heap cannot hold the table
     */
    public static StabilizerTableau zero(int n) {
        Checks.requireInRange(n, 1, MAX_QUBITS, "qubit count");
        Heap.require(bytes(n), "a " + n + "-qubit stabilizer table");
        StabilizerTableau t = new StabilizerTableau(n);
        for (int i = 0; i < n; i++) {
            int w = i >>> 6;
            long b = 1L << (i & 63);
            t.xs[i * t.stride + w] |= b;
            t.zs[i * t.stride + t.half + w] |= b;
        }
        return t;
    }

    /**
     * Returns an independent copy.
     *
     * @return the copy
     * @throws IllegalStateException if the heap cannot hold it
     */
    public StabilizerTableau copy() {
        Heap.require(bytes(n), "a copy of a " + n + "-qubit stabilizer table");
        return new StabilizerTableau(this);
    }

    /**
     * Overwrites this table with another of the same size (no allocation).
     *
     * @param other a table of as many qubits. Not modified.
     */
    void copyFrom(StabilizerTableau other) {
        System.arraycopy(other.xs, 0, xs, 0, xs.length);
        System.arraycopy(other.zs, 0, zs, 0, zs.length);
        System.arraycopy(other.signs, 0, signs, 0, signs.length);
    }

    /**
     * Returns the number of qubits.
     *
     * @return n
     */
    public int qubits() {
        return n;
    }

    // ---------------------------------------------------------------- gates (checked)

    /**
     * Applies a Hadamard gate: X and Z swap, Y changes sign.
     *
     * @param q the qubit
     * @return this table
     * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the table
     */
    public StabilizerTableau h(int q) {
        Checks.requireQubit(q, n);
        hRaw(q);
        return this;
    }

    /**
     * Applies S = diag(1, i): X becomes Y, Y becomes -X.
     *
     * @param q the qubit
     * @return this table
     * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the table
     */
    public StabilizerTableau s(int q) {
        Checks.requireQubit(q, n);
        sRaw(q);
        return this;
    }

    /**
     * Applies S† = diag(1, -i): X becomes -Y, Y becomes X.
     *
     * @param q the qubit
     * @return this table
     * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the table
     */
    public StabilizerTableau sDagger(int q) {
        Checks.requireQubit(q, n);
        sDaggerRaw(q);
        return this;
    }

    /**
     * Applies the square root of X, which equals H S H exactly.
     *
     * @param q the qubit
     * @return this table
     * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the table
     */
    public StabilizerTableau sqrtX(int q) {
        Checks.requireQubit(q, n);
        hRaw(q);
        sRaw(q);
        hRaw(q);
        return this;
    }

    /**
     * Applies Pauli X: generators with Z or Y on the qubit change sign.
     *
     * @param q the qubit
     * @return this table
     * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the table
     */
    public StabilizerTableau x(int q) {
        Checks.requireQubit(q, n);
        xRaw(q);
        return this;
    }

    /**
     * Applies Pauli Y: generators with X or Z on the qubit change sign.
     *
     * @param q the qubit
     * @return this table
     * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the table
     */
    public StabilizerTableau y(int q) {
        Checks.requireQubit(q, n);
        yRaw(q);
        return this;
    }

    /**
     * Applies Pauli Z: generators with X or Y on the qubit change sign.
     *
     * @param q the qubit
     * @return this table
     * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the table
     */
    public StabilizerTableau z(int q) {
        Checks.requireQubit(q, n);
        zRaw(q);
        return this;
    }

    /**
     * Applies a controlled NOT.
     *
     * @param control the control qubit
     * @param target the target qubit, not the control
     * @return this table
     * @throws IndexOutOfBoundsException if a qubit is not in the table
     * @throws IllegalArgumentException if {@code control == target}
     */
    public StabilizerTableau cnot(int control, int target) {
        requireDistinct(control, target, "cnot");
        cnotRaw(control, target);
        return this;
    }

    /**
     * Applies a controlled Z, diag(1, 1, 1, -1); symmetric in its qubits.
     *
     * @param a one qubit
     * @param b another qubit
     * @return this table
     * @throws IndexOutOfBoundsException if a qubit is not in the table
     * @throws IllegalArgumentException if {@code a == b}
     */
    public StabilizerTableau cz(int a, int b) {
        requireDistinct(a, b, "cz");
        czRaw(a, b);
        return this;
    }

    /**
     * Swaps two qubits.
     *
     * @param a one qubit
     * @param b another qubit
     * @return this table
     * @throws IndexOutOfBoundsException if a qubit is not in the table
     * @throws IllegalArgumentException if {@code a == b}
     */
    public StabilizerTableau swap(int a, int b) {
        requireDistinct(a, b, "swap");
        swapRaw(a, b);
        return this;
    }

    private void requireDistinct(int a, int b, String gate) {
        Checks.requireDistinctQubits(new int[] {a, b}, n, "the qubits of " + gate);
    }

    // ---------------------------------------------------------------- gates (unchecked)
    // Update rules: Aaronson and Gottesman (2004), section III; CZ, S†, X, Y, Z follow from
    // conjugating each Pauli by the gate.

    void hRaw(int q) {
        final int c = q * stride;
        for (int w = 0; w < half; w++) {
            long x = xs[c + w];
            xs[c + w] = zs[c + w];
            zs[c + w] = x;
        }
        for (int w = half; w < stride; w++) {
            long x = xs[c + w];
            long z = zs[c + w];
            signs[w - half] ^= x & z;
            xs[c + w] = z;
            zs[c + w] = x;
        }
    }

    void sRaw(int q) {
        final int c = q * stride;
        for (int w = 0; w < half; w++) {
            zs[c + w] ^= xs[c + w];
        }
        for (int w = half; w < stride; w++) {
            long x = xs[c + w];
            long z = zs[c + w];
            signs[w - half] ^= x & z;
            zs[c + w] = z ^ x;
        }
    }

    void sDaggerRaw(int q) {
        final int c = q * stride;
        for (int w = 0; w < half; w++) {
            zs[c + w] ^= xs[c + w];
        }
        for (int w = half; w < stride; w++) {
            long x = xs[c + w];
            long z = zs[c + w];
            signs[w - half] ^= x & ~z;
            zs[c + w] = z ^ x;
        }
    }

    void xRaw(int q) {
        final int c = q * stride + half;
        for (int w = 0; w < half; w++) {
            signs[w] ^= zs[c + w];
        }
    }

    void yRaw(int q) {
        final int c = q * stride + half;
        for (int w = 0; w < half; w++) {
            signs[w] ^= xs[c + w] ^ zs[c + w];
        }
    }

    void zRaw(int q) {
        final int c = q * stride + half;
        for (int w = 0; w < half; w++) {
            signs[w] ^= xs[c + w];
        }
    }

    void cnotRaw(int a, int b) {
        final int ca = a * stride;
        final int cb = b * stride;
        for (int w = 0; w < half; w++) {
            xs[cb + w] ^= xs[ca + w];
            zs[ca + w] ^= zs[cb + w];
        }
        for (int w = half; w < stride; w++) {
            long xa = xs[ca + w];
            long za = zs[ca + w];
            long xb = xs[cb + w];
            long zb = zs[cb + w];
            signs[w - half] ^= xa & zb & ~(xb ^ za);
            xs[cb + w] = xb ^ xa;
            zs[ca + w] = za ^ zb;
        }
    }

    void czRaw(int a, int b) {
        final int ca = a * stride;
        final int cb = b * stride;
        for (int w = 0; w < half; w++) {
            long xa = xs[ca + w];
            long xb = xs[cb + w];
            zs[ca + w] ^= xb;
            zs[cb + w] ^= xa;
        }
        for (int w = half; w < stride; w++) {
            long xa = xs[ca + w];
            long za = zs[ca + w];
            long xb = xs[cb + w];
            long zb = zs[cb + w];
            signs[w - half] ^= xa & xb & (za ^ zb);
            zs[ca + w] = za ^ xb;
            zs[cb + w] = zb ^ xa;
        }
    }

    void swapRaw(int a, int b) {
        final int ca = a * stride;
        final int cb = b * stride;
        for (int w = 0; w < stride; w++) {
            long x = xs[ca + w];
            xs[ca + w] = xs[cb + w];
            xs[cb + w] = x;
            long z = zs[ca + w];
            zs[ca + w] = zs[cb + w];
            zs[cb + w] = z;
        }
    }

    // ---------------------------------------------------------------- measurement

    /**
     * Measures a qubit in the computational basis and collapses the state. A random outcome
     * is 0 or 1 with probability 1/2 each, drawn from {@code rng}; a deterministic outcome draws
     * nothing.
     *
     * @param q the qubit
     * @param rng the source of random outcomes
     * @return the outcome, 0 or 1
     * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the table
     */
    public int measure(int q, UniformRandomProvider rng) {
        Checks.requireQubit(q, n);
        Objects.requireNonNull(rng, "rng");
        return measureRaw(q, rng);
    }

    /**
     * Resets a qubit to |0&gt;: measures it, then applies X if the outcome was 1.
     *
     * @param q the qubit
     * @param rng the source of a random outcome
     * @return this table
     * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the table
     */
    public StabilizerTableau reset(int q, UniformRandomProvider rng) {
        Checks.requireQubit(q, n);
        Objects.requireNonNull(rng, "rng");
        if (measureRaw(q, rng) == 1) {
            xRaw(q);
        }
        return this;
    }

    /**
     * Tells whether measuring a qubit now would give a certain outcome, that is whether
     * Z or -Z on that qubit is in the stabilizer group.
     *
     * @param q the qubit
     * @return true if the outcome is certain
     * @throws IndexOutOfBoundsException if {@code q} is not a qubit of the table
     */
    public boolean isDeterministic(int q) {
        Checks.requireQubit(q, n);
        return pivot(q) < 0;
    }

    int measureRaw(int q, UniformRandomProvider rng) {
        int p = pivot(q);
        if (p >= 0) {
            int outcome = rng.nextBoolean() ? 1 : 0;
            collapse(q, p, outcome);
            return outcome;
        }
        return deterministicOutcome(q);
    }

    /** Returns the first stabilizer with X or Y on qubit a, or -1 if none. */
    int pivot(int a) {
        final int c = a * stride + half;
        for (int w = 0; w < half; w++) {
            long v = xs[c + w];
            if (v != 0) {
                return (w << 6) + Long.numberOfTrailingZeros(v);
            }
        }
        return -1;
    }

    /**
     * The random case of a measurement of qubit a with pivot stabilizer p: every other generator
     * with X or Y on a is multiplied by stabilizer p, destabilizer p becomes the old stabilizer
     * p, and stabilizer p becomes (-1)^outcome Z_a (Aaronson and Gottesman 2004, section III,
     * case 1). Leaves in {@link #mask} (stabilizer half, words [half, stride)) the stabilizers
     * that were multiplied, and in {@link #high} the phase bit each product added beyond the
     * two signs; the signs were updated as r_i ^= r_p ^ high_i.
     */
    void collapse(int a, int p, int outcome) {
        final long[] m = mask;
        System.arraycopy(xs, a * stride, m, 0, stride);
        final int pw = half + (p >>> 6);
        final long pb = 1L << (p & 63);
        m[pw] &= ~pb;
        Arrays.fill(low, 0L);
        Arrays.fill(high, 0L);
        for (int j = 0; j < n; j++) {
            final int c = j * stride;
            final boolean xp = (xs[c + pw] & pb) != 0;
            final boolean zp = (zs[c + pw] & pb) != 0;
            if (!xp && !zp) {
                continue;
            }
            if (xp) {
                for (int w = 0; w < half; w++) {
                    xs[c + w] ^= m[w];
                }
            }
            if (zp) {
                for (int w = 0; w < half; w++) {
                    zs[c + w] ^= m[w];
                }
            }
            // Phase function g(x_p, z_p, x_i, z_i) of the paper, in {-1, 0, 1}, summed mod 4
            // per row in two bit planes (low, high): plus adds 1, minus adds 3.
            if (xp && zp) {
                for (int w = half; w < stride; w++) {
                    final long mw = m[w];
                    if (mw == 0) {
                        continue;
                    }
                    final long x2 = xs[c + w];
                    final long z2 = zs[c + w];
                    addPhase(w - half, z2 & ~x2 & mw, x2 & ~z2 & mw);
                    xs[c + w] = x2 ^ mw;
                    zs[c + w] = z2 ^ mw;
                }
            } else if (xp) {
                for (int w = half; w < stride; w++) {
                    final long mw = m[w];
                    if (mw == 0) {
                        continue;
                    }
                    final long x2 = xs[c + w];
                    final long z2 = zs[c + w];
                    addPhase(w - half, z2 & x2 & mw, z2 & ~x2 & mw);
                    xs[c + w] = x2 ^ mw;
                }
            } else {
                for (int w = half; w < stride; w++) {
                    final long mw = m[w];
                    if (mw == 0) {
                        continue;
                    }
                    final long x2 = xs[c + w];
                    final long z2 = zs[c + w];
                    addPhase(w - half, x2 & ~z2 & mw, x2 & z2 & mw);
                    zs[c + w] = z2 ^ mw;
                }
            }
        }
        final boolean rp = (signs[pw - half] & pb) != 0;
        for (int w = 0; w < half; w++) {
            signs[w] ^= high[w] ^ (rp ? m[half + w] : 0L);
        }
        // Destabilizer p := stabilizer p; stabilizer p := (-1)^outcome Z_a.
        final int dw = p >>> 6;
        for (int j = 0; j < n; j++) {
            final int c = j * stride;
            xs[c + dw] = (xs[c + dw] & ~pb) | (xs[c + pw] & pb);
            zs[c + dw] = (zs[c + dw] & ~pb) | (zs[c + pw] & pb);
            xs[c + pw] &= ~pb;
            zs[c + pw] &= ~pb;
        }
        zs[a * stride + pw] |= pb;
        if (outcome == 1) {
            signs[pw - half] |= pb;
        } else {
            signs[pw - half] &= ~pb;
        }
    }

    private void addPhase(int k, long plus, long minus) {
        long l = low[k];
        long h = high[k];
        h ^= l & plus;
        l ^= plus;
        h ^= minus;
        h ^= l & minus;
        l ^= minus;
        low[k] = l;
        high[k] = h;
    }

    /**
     * The deterministic case of a measurement of qubit a: the outcome is the sign of the
     * product of the stabilizers whose destabilizers have X or Y on a, which is +-Z_a
     * (Aaronson and Gottesman 2004, section III, case 2). Leaves the selection in
     * {@link #mask} words [0, half) and does not change the table.
     */
    int deterministicOutcome(int a) {
        int e = selectionExponent(a) + 2 * signParity(mask);
        return (e >>> 1) & 1;
    }

    /**
     * Selects into {@link #mask} words [0, half) the stabilizers whose destabilizers have X or
     * Y on qubit a, and returns the exponent of their product without signs.
     */
    int selectionExponent(int a) {
        System.arraycopy(xs, a * stride, mask, 0, half);
        return productExponent(mask, null, null);
    }

    /** Parity of the signs of the selected stabilizers. */
    int signParity(long[] select) {
        int parity = 0;
        for (int w = 0; w < half; w++) {
            parity ^= Long.bitCount(signs[w] & select[w]);
        }
        return parity & 1;
    }

    /**
     * The product, in increasing row order, of the stabilizers selected by {@code select}
     * (words [0, half), bit i for stabilizer i), without their signs: returns e mod 4 with
     * product = i^e P, P the Pauli string of x bits {@code xOut} and z bits {@code zOut}.
     * Writing each row as i^(x.z) X^x Z^z and using Z^a X^b = (-1)^(a.b) X^b Z^a,
     * e = sum_k |x_k & z_k| + 2 sum_{k &lt; l} z_k . x_l - |X & Z| (mod 4), X, Z the XOR of
     * the rows (common practice; Aaronson and Gottesman 2004, section III, for the row form).
     */
    int productExponent(long[] select, boolean[] xOut, boolean[] zOut) {
        int e = 0;
        for (int j = 0; j < n; j++) {
            final int c = j * stride + half;
            int ones = 0;
            int cross = 0;
            int xPar = 0;
            int zPar = 0;
            long carry = 0;
            for (int w = 0; w < half; w++) {
                final long s = select[w];
                if (s == 0) {
                    continue;
                }
                final long xw = xs[c + w] & s;
                final long zw = zs[c + w] & s;
                if ((xw | zw) == 0) {
                    continue;
                }
                ones += Long.bitCount(xw & zw);
                long pre = zw;
                pre ^= pre << 1;
                pre ^= pre << 2;
                pre ^= pre << 4;
                pre ^= pre << 8;
                pre ^= pre << 16;
                pre ^= pre << 32;
                // Exclusive prefix parity of z within the word, plus the words before.
                final long before = (pre ^ zw) ^ carry;
                cross ^= Long.bitCount(xw & before);
                carry ^= pre >> 63;
                xPar ^= Long.bitCount(xw);
                zPar ^= Long.bitCount(zw);
            }
            xPar &= 1;
            zPar &= 1;
            e += ones + 2 * (cross & 1) - (xPar & zPar);
            if (xOut != null) {
                xOut[j] = xPar == 1;
                zOut[j] = zPar == 1;
            }
        }
        return e & 3;
    }

    // ---------------------------------------------------------------- queries

    /**
     * Returns the n stabilizer generators as Pauli products with phase +1 or -1, such as
     * {@code XX} and {@code ZZ} (dense text {@code "XX"}, {@code "ZZ"}) for the Bell state
     * (|00&gt; + |11&gt;)/√2 made by H on qubit 0 then CNOT(0, 1). The generators are not in a
     * canonical form: equal states may give different lists.
     *
     * @return a new list of n products
     */
    public List<PauliProduct> generators() {
        List<PauliProduct> out = new ArrayList<>(n);
        char[] text = new char[n + 1];
        for (int i = 0; i < n; i++) {
            final int w = half + (i >>> 6);
            final long b = 1L << (i & 63);
            text[0] = (signs[w - half] & b) != 0 ? '-' : '+';
            for (int j = 0; j < n; j++) {
                boolean x = (xs[j * stride + w] & b) != 0;
                boolean z = (zs[j * stride + w] & b) != 0;
                text[n - j] = x ? (z ? 'Y' : 'X') : (z ? 'Z' : 'I');
            }
            out.add(PauliProduct.parse(new String(text)));
        }
        return out;
    }

    /**
     * Returns the expectation value {@code <psi|P|psi>} of a Hermitian Pauli product in this
     * stabilizer state: +1 or -1 when {@code ±P} is in the stabilizer group, 0 otherwise
     * (Aaronson and Gottesman 2004, section III: P commutes with every stabilizer exactly when
     * it is, up to sign, a product of them).
     *
     * @param pauli a Hermitian product (phase +1 or -1) on qubits below {@link #qubits()}
     * @return -1, 0 or 1
     * @throws IllegalArgumentException if the product is not Hermitian or acts on a qubit
     *     beyond the table
     */
    public int expectation(PauliProduct pauli) {
        Objects.requireNonNull(pauli, "pauli");
        if (!pauli.isHermitian()) {
            throw new IllegalArgumentException("the Pauli product " + Checks.excerpt(
                    pauli.toString()) + " has phase i or -i and is not Hermitian; give phase +1"
                    + " or -1");
        }
        if (pauli.span() > n) {
            throw new IllegalArgumentException("the Pauli product acts on qubit "
                    + (pauli.span() - 1) + " but the table has " + n + " qubit(s)");
        }
        boolean[] px = new boolean[n];
        boolean[] pz = new boolean[n];
        for (int q = 0; q < pauli.span(); q++) {
            char c = pauli.letter(q);
            px[q] = c == 'X' || c == 'Y';
            pz[q] = c == 'Z' || c == 'Y';
        }
        int sign = pauli.phase() == 2 ? -1 : 1;
        long[] acc = new long[stride];
        for (int j = 0; j < n; j++) {
            final int c = j * stride;
            if (px[j]) {
                for (int w = 0; w < stride; w++) {
                    acc[w] ^= zs[c + w];
                }
            }
            if (pz[j]) {
                for (int w = 0; w < stride; w++) {
                    acc[w] ^= xs[c + w];
                }
            }
        }
        for (int w = half; w < stride; w++) {
            if (acc[w] != 0) {
                return 0;
            }
        }
        // P commutes with every stabilizer, so it is +-(product of the stabilizers whose
        // destabilizers anticommute with P).
        boolean[] qx = new boolean[n];
        boolean[] qz = new boolean[n];
        int e = productExponent(acc, qx, qz) + 2 * signParity(acc);
        if (!Arrays.equals(px, qx) || !Arrays.equals(pz, qz)) {
            throw new IllegalStateException("internal error: the stabilizer product does not"
                    + " match " + Checks.excerpt(pauli.toString()));
        }
        return ((e >>> 1) & 1) == 0 ? sign : -sign;
    }

    /**
     * Returns the state as a state vector (normalised; its global phase is not specified), for
     * at most {@value #MAX_DENSE_QUBITS} qubits:
     * the projection of a basis state the table fixes onto the stabilizer group, {@code Π (I +
     * g_i) / 2} (Gottesman 1997, "Stabilizer codes and quantum error correction", thesis,
     * arXiv:quant-ph/9705052, §3.2).
     *
     * @return the state vector
     * @throws IllegalArgumentException if the table has more than {@value #MAX_DENSE_QUBITS}
     *     qubits
     * @throws IllegalStateException if the heap cannot hold the state
     */
    public StateVector toStateVector() {
        if (n > MAX_DENSE_QUBITS) {
            throw new IllegalArgumentException("toStateVector() needs at most " + MAX_DENSE_QUBITS
                    + " qubits but the table has " + n);
        }
        StabilizerTableau t = new StabilizerTableau(this);
        long start = 0;
        for (int q = 0; q < n; q++) {
            int p = t.pivot(q);
            int bit;
            if (p >= 0) {
                t.collapse(q, p, 0);
                bit = 0;
            } else {
                bit = t.deterministicOutcome(q);
            }
            start |= (long) bit << q;
        }
        int[] xm = new int[n];
        int[] zm = new int[n];
        boolean[] minus = new boolean[n];
        for (int i = 0; i < n; i++) {
            final int w = half + (i >>> 6);
            final long b = 1L << (i & 63);
            for (int j = 0; j < n; j++) {
                if ((xs[j * stride + w] & b) != 0) {
                    xm[i] |= 1 << j;
                }
                if ((zs[j * stride + w] & b) != 0) {
                    zm[i] |= 1 << j;
                }
            }
            minus[i] = (signs[w - half] & b) != 0;
        }
        final long fixedStart = start;
        Amplitudes amps = Heap.allocate(4 * Amplitudes.bytes(n), "the " + n + "-qubit state of"
                + " a stabilizer table", () -> StabilizerStates.project(n, xm, zm, minus,
                (int) fixedStart));
        return Bridge.states().wrap(amps, Parallel.defaultThreads());
    }

    // ---------------------------------------------------------------- runner support

    /** Words per half column. */
    int halfWords() {
        return half;
    }

    /** The live stabilizer signs, {@code halfWords()} words. */
    long[] signsRaw() {
        return signs;
    }

    /** The live scratch selection (see {@link #collapse} and {@link #deterministicOutcome}). */
    long[] maskRaw() {
        return mask;
    }

    /** The live phase bits of the last {@link #collapse}. */
    long[] highRaw() {
        return high;
    }

    /** Copies the z bits of the stabilizers on qubit q into {@code out} ({@code half} words). */
    void stabilizerZColumn(int q, long[] out) {
        System.arraycopy(zs, q * stride + half, out, 0, half);
    }

    /** Copies the x bits of the stabilizers on qubit q into {@code out} ({@code half} words). */
    void stabilizerXColumn(int q, long[] out) {
        System.arraycopy(xs, q * stride + half, out, 0, half);
    }

    /**
     * Returns a short description such as {@code "StabilizerTableau[3 qubits]"}.
     *
     * @return the text
     */
    @Override
    public String toString() {
        return "StabilizerTableau[" + n + " qubits]";
    }
}
