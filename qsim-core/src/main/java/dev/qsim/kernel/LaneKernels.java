package dev.qsim.kernel;

/**
 * The loops that a vector unit of the processor can run several lanes at a time: the inner loops
 * of the gate kernels, the frame's settling pass, the single-precision conversions and the sums.
 * The scalar kernels call these when their storage carries an implementation
 * ({@code Amplitudes.lanes}, from {@link Lanes}); the one implementation, on the incubating
 * {@code jdk.incubator.vector} API, is compiled apart from the rest of the library
 * ({@code src/vector/java}) and loaded only when that module is present. Internal.
 *
 * <p>Contract: every double-precision gate loop here computes, lane by lane, the sums of the
 * scalar loop it replaces in the same order, with fused multiply-adds, so both paths agree to a
 * few units in the last place and an element's bits do not depend on which loop or thread
 * reaches it; {@link LaneCheck} verifies this before an implementation is used. The
 * single-precision gate loops (the {@code float[]} forms of {@code pairs} and {@code blocks})
 * may compute in float lanes, within a few float roundings of the scalar loops (which compute
 * in double and round once), as long as every element gets the same bits whichever loop
 * reaches it (results independent of the thread count). Sums ({@link #sumSquares},
 * {@link #innerSums}, the Pauli sums) add in a fixed lane order instead of index order: equal to
 * the scalar sums within rounding, and the same for any thread count, since every block is
 * summed by one call. Offsets are in array elements (two per amplitude); lengths in amplitudes
 * unless said. Unchecked.
 */
abstract class LaneKernels {
    /** Kind of a 2x2 matrix: general complex entries. */
    static final int COMPLEX = 0;
    /** Kind of a 2x2 matrix: real entries (H, RY). */
    static final int REAL = 1;
    /** Kind of a 2x2 matrix: real diagonal, imaginary off-diagonal (RX). */
    static final int CROSS = 2;
    /** Kind of a 2x2 matrix, single precision only: X, floats moved without arithmetic. */
    static final int FLIP = 3;

    /** The kind of a 2x2 matrix, re/im interleaved, as the scalar loops choose it. */
    static int kind(double[] m) {
        if (DenseSingleQubitKernels.isReal(m)) {
            return REAL;
        }
        return DenseSingleQubitKernels.isCrossImaginary(m) ? CROSS : COMPLEX;
    }

    /**
     * Returns log2 of the amplitudes one double-precision vector holds; a storage whose chunks
     * are smaller than that runs the scalar loops.
     *
     * @return log2 of the complex amplitudes per vector, at least 1
     */
    abstract int amplitudeLog();

    /**
     * Returns a one-line description: the vector shape and the lanes of each precision.
     *
     * @return the description
     */
    abstract String describe();

    /**
     * {@code count} pairs {@code (u[uo + 2k], v[vo + 2k])} times a 2x2 matrix: the two halves of
     * a block, or of a chunk pair.
     *
     * @param u first half. Modified.
     * @param uo its offset
     * @param v second half (may be {@code u}). Modified.
     * @param vo its offset
     * @param count pairs
     * @param m the matrix, length 8. Not modified.
     * @param kind {@link #kind} of {@code m}
     */
    abstract void pairs(double[] u, int uo, double[] v, int vo, int count, double[] m, int kind);

    /**
     * Blocks of {@code 2^(q+1)} amplitudes over the offsets {@code [start, end)} of one array,
     * pairs {@code (i, i + 2^q)} times a 2x2 matrix; {@code start} and {@code end} are
     * multiples of the block.
     *
     * @param psi the array. Modified.
     * @param start first offset
     * @param end end offset
     * @param q the target, {@code 2^(q+1)} amplitudes per block
     * @param m the matrix, length 8. Not modified.
     * @param kind {@link #kind} of {@code m}
     */
    abstract void blocks(double[] psi, int start, int end, int q, double[] m, int kind);

    /**
     * Two single-qubit gates in one sweep: blocks of {@code 2^(max(q1, q2) + 1)} amplitudes over
     * the offsets {@code [start, end)} of one array, first {@code m1} on the pairs
     * {@code (i, i + 2^q1)}, then {@code m2} on the pairs {@code (i, i + 2^q2)}; every element
     * gets the same bits as {@link #blocks(double[], int, int, int, double[], int) blocks} with
     * {@code m1} followed by {@code blocks} with {@code m2}. {@code start} and {@code end} are
     * multiples of the block.
     *
     * @param psi the array. Modified.
     * @param start first offset
     * @param end end offset
     * @param q1 the first gate's target, at least {@link #amplitudeLog()}
     * @param m1 its matrix, length 8, of kind {@code kind1}. Not modified.
     * @param kind1 {@link #REAL} or {@link #CROSS}
     * @param q2 the second gate's target, at least {@link #amplitudeLog()}, not {@code q1}
     * @param m2 its matrix, length 8, of kind {@code kind2}. Not modified.
     * @param kind2 {@link #REAL} or {@link #CROSS}
     */
    abstract void pairBlocks(double[] psi, int start, int end, int q1, double[] m1, int kind1,
            int q2, double[] m2, int kind2);

    /**
     * {@link #pairs} on single-precision arrays, in double or in float arithmetic (see the class
     * comment).
     *
     * @param u first half. Modified.
     * @param uo its offset
     * @param v second half (may be {@code u}). Modified.
     * @param vo its offset
     * @param count pairs
     * @param m the matrix, length 8. Not modified.
     * @param kind {@link #kind} of {@code m}
     */
    abstract void pairs(float[] u, int uo, float[] v, int vo, int count, double[] m, int kind);

    /**
     * {@link #blocks} on a single-precision array.
     *
     * @param psi the array. Modified.
     * @param start first offset
     * @param end end offset
     * @param q the target
     * @param m the matrix, length 8. Not modified.
     * @param kind {@link #kind} of {@code m}
     */
    abstract void blocks(float[] psi, int start, int end, int q, double[] m, int kind);

    /**
     * Prepares a dense gate with several targets or with controls, or returns null when the
     * scalar plan should run it (the storage's chunks are shorter than a vector, or the vector
     * loop would be slower, as for several targets with one inside a vector).
     *
     * @param a double storage
     * @param targets targets, bit j of a matrix index is targets[j]
     * @param controls controls
     * @param m the matrix, length 2 * 4^k. Not modified.
     * @return the plan, or null
     */
    abstract Plan dense(Amplitudes a, int[] targets, int[] controls, double[] m);

    /**
     * Prepares a diagonal gate with several targets or with controls, or returns null.
     *
     * @param a double storage
     * @param targets targets
     * @param controls controls
     * @param diag the diagonal, length 2 * 2^k. Not modified.
     * @return the plan, or null
     */
    abstract Plan diagonal(Amplitudes a, int[] targets, int[] controls, double[] diag);

    /**
     * Prepares an X with controls (a swap of the target's halves where the controls are 1), or
     * returns null.
     *
     * @param a double storage
     * @param target the target
     * @param controls controls, at least one
     * @return the plan, or null
     */
    abstract Plan controlledFlip(Amplitudes a, int target, int[] controls);

    /**
     * Multiplies the amplitudes at offsets {@code [from, to)} by {@code dr + i di}.
     *
     * @param psi the array. Modified.
     * @param from first offset (even)
     * @param to end offset
     * @param dr real part
     * @param di imaginary part
     */
    abstract void scale(double[] psi, int from, int to, double dr, double di);

    /**
     * {@link #scale} on a single-precision array (double arithmetic, one rounding).
     *
     * @param psi the array. Modified.
     * @param from first offset (even)
     * @param to end offset
     * @param dr real part
     * @param di imaginary part
     */
    abstract void scale(float[] psi, int from, int to, double dr, double di);

    /**
     * Multiplies amplitude {@code j} from offset {@code off} by {@code table[j]}, for
     * {@code j < count}.
     *
     * @param psi the array. Modified.
     * @param off first offset
     * @param table the factors, re/im interleaved. Not modified.
     * @param count amplitudes
     */
    abstract void scaleByTable(double[] psi, int off, double[] table, int count);

    /**
     * As {@link #scaleByTable(double[], int, double[], int)} with the table given expanded
     * ({@link #expand}): {@code re2} holds each factor's real part twice, {@code im2} its
     * imaginary part negated then as is, so amplitude {@code (x, y)} becomes
     * {@code (x re2[2j] + y im2[2j], y re2[2j+1] + x im2[2j+1])}, the same bits as
     * {@code scaleByTable} gives. A vector loop then exchanges the amplitude's parts once
     * instead of also spreading the factor's (on JDK 17 each exchange is checked: a merged run
     * of phases took 1.0 ns an amplitude with three, 0.65-0.69 with one, in cache).
     *
     * @param psi the array. Modified.
     * @param off first offset
     * @param re2 the factors' real parts, each twice. Not modified.
     * @param im2 the factors' imaginary parts, negated then as is. Not modified.
     * @param count amplitudes
     */
    void scaleByExpanded(double[] psi, int off, double[] re2, double[] im2, int count) {
        final int len = count << 1;
        for (int j = 0; j < len; j += 2) {
            final double re = psi[off + j];
            final double im = psi[off + j + 1];
            psi[off + j] = re * re2[j] + im * im2[j];
            psi[off + j + 1] = im * re2[j + 1] + re * im2[j + 1];
        }
    }

    /**
     * Returns a table of complex factors expanded for {@link #scaleByExpanded}:
     * {@code {re2, im2}}.
     *
     * @param table the factors, re/im interleaved. Not modified.
     * @return the two expanded tables
     */
    static double[][] expand(double[] table) {
        final double[] re2 = new double[table.length];
        final double[] im2 = new double[table.length];
        for (int j = 0; j < table.length; j += 2) {
            re2[j] = table[j];
            re2[j + 1] = table[j];
            im2[j] = -table[j + 1];
            im2[j + 1] = table[j + 1];
        }
        return new double[][] {re2, im2};
    }

    /**
     * Multiplies {@code psi[off + x]} by {@code f[x]} for {@code x} in {@code [0, len)}: one
     * rounding per element, as the scalar loop.
     *
     * @param psi the array. Modified.
     * @param off first offset
     * @param f the factors. Not modified.
     * @param len doubles
     */
    abstract void multiply(double[] psi, int off, double[] f, int len);

    /**
     * {@link #scaleByTable} on a single-precision array.
     *
     * @param psi the array. Modified.
     * @param off first offset
     * @param table the factors, re/im interleaved. Not modified.
     * @param count amplitudes
     */
    abstract void scaleByTable(float[] psi, int off, double[] table, int count);

    /**
     * diag(d0, d1) on qubit q over the blocks at offsets {@code [start, end)} of one array; a
     * half whose entry is exactly 1 is left as it is (as the scalar loop does).
     *
     * @param psi the array. Modified.
     * @param start first offset, a multiple of the block
     * @param end end offset
     * @param q the target
     * @param d the diagonal, length 4. Not modified.
     */
    abstract void diagonalBlocks(double[] psi, int start, int end, int q, double[] d);

    /**
     * Swaps {@code count} amplitudes between two runs.
     *
     * @param u first run. Modified.
     * @param uo its offset
     * @param v second run. Modified.
     * @param vo its offset
     * @param count amplitudes
     */
    abstract void swapRuns(double[] u, int uo, double[] v, int vo, int count);

    /**
     * X on qubit q over the blocks at offsets {@code [start, end)}: the halves of each block
     * swapped.
     *
     * @param psi the array. Modified.
     * @param start first offset, a multiple of the block
     * @param end end offset
     * @param q the target
     */
    abstract void flipBlocks(double[] psi, int start, int end, int q);

    /**
     * Widens {@code 2 * count} floats to doubles, exactly.
     *
     * @param f the source. Not modified.
     * @param fo its offset
     * @param out the destination. Modified.
     * @param at its offset
     * @param count amplitudes
     */
    abstract void widen(float[] f, int fo, double[] out, int at, int count);

    /**
     * Rounds {@code 2 * count} doubles to the nearest floats.
     *
     * @param in the source. Not modified.
     * @param at its offset
     * @param f the destination. Modified.
     * @param fo its offset
     * @param count amplitudes
     */
    abstract void narrow(double[] in, int at, float[] f, int fo, int count);

    /**
     * Returns {@code Σ (re² + im²)} over the amplitudes at offsets {@code [from, to)}.
     *
     * @param psi the array. Not modified.
     * @param from first offset, even
     * @param to end offset
     * @return the sum
     */
    abstract double sumSquares(double[] psi, int from, int to);

    /**
     * Writes {@code re² + im²} of each amplitude at offsets {@code [from, to)} to
     * {@code out[at ...]}.
     *
     * @param psi the array. Not modified.
     * @param from first offset, even
     * @param to end offset
     * @param out the destination, one per amplitude. Modified.
     * @param at its first index
     */
    abstract void squares(double[] psi, int from, int to, double[] out, int at);

    /**
     * Returns {@code Σ conj(u_k) v_k} over {@code count} amplitudes as {re, im} in {@code out}.
     *
     * @param u the bra's array. Not modified.
     * @param uo its offset
     * @param v the ket's array. Not modified.
     * @param vo its offset
     * @param count amplitudes
     * @param out {re, im}. Modified.
     */
    abstract void innerSums(double[] u, int uo, double[] v, int vo, int count, double[] out);

    /**
     * Returns {@code Σ_o conj(b_{o ⊕ xLow}) (-1)^{|o ∧ zLow|} k_o} over the in-chunk amplitude
     * indices {@code o} in {@code [start, end)} as {re, im} in {@code out}.
     *
     * @param k the ket's chunk. Not modified.
     * @param b the bra's chunk. Not modified.
     * @param start first amplitude index in the chunk, a multiple of the vector
     * @param end end index
     * @param xLow the X mask's in-chunk bits
     * @param zLow the Z mask's in-chunk bits
     * @param out {re, im}. Modified.
     */
    abstract void pauliInner(double[] k, double[] b, int start, int end, int xLow, int zLow,
            double[] out);

    /**
     * Adds {@code (ar + i ai) (-1)^{|o ∧ zLow|} src_o} to {@code dst_{o ⊕ xLow}} for the in-chunk
     * amplitude indices {@code o} in {@code [start, end)}.
     *
     * @param src the source chunk. Not modified.
     * @param dst the destination chunk, not the same array. Modified.
     * @param start first amplitude index in the chunk, a multiple of the vector
     * @param end end index
     * @param xLow the X mask's in-chunk bits
     * @param zLow the Z mask's in-chunk bits
     * @param ar real part of the factor
     * @param ai imaginary part of the factor
     */
    abstract void pauliAccumulate(double[] src, double[] dst, int start, int end, int xLow,
            int zLow, double ar, double ai);
}
