package dev.qsim.kernel;

/**
 * Sums over a state, read-only. Each sum is taken over fixed blocks of
 * {@code 2^}{@value #BLOCK_LOG} amplitudes, in index order within a block, and the block sums are
 * then added in block order: the result does not depend on the thread count. A block of a
 * single-precision state is first widened to double (exactly), so the sums are taken in double
 * in both precisions. Every public sum settles a pending lazy frame first (the norm does not
 * need to: the frame is unitary). With vector loops on the storage ({@link LaneKernels}) a
 * block's sum is taken lane by lane (equal within rounding, and still the same for any thread
 * count); the probabilities are the same bits. Internal.
 */
public final class Reductions {
    /** Log2 of the amplitudes per summation block. */
    public static final int BLOCK_LOG = 14;
    /** Log2 of the shortest half-block worth a vector sum when one qubit's halves are summed. */
    private static final int LANE_HALF_LOG = 5;

    private Reductions() {
    }

    private static int blockLog(Amplitudes a) {
        return Math.min(a.chunkLog, BLOCK_LOG);
    }

    /** A scratch for one block of a single-precision state, or null for double storage. */
    private static double[] buffer(Amplitudes a, int bl) {
        return a.singles == null ? null : new double[2 << bl];
    }

    /** The array holding block {@code first}: its chunk, or {@code buf} filled with it. */
    private static double[] view(Amplitudes a, long first, int bl, double[] buf) {
        if (buf == null) {
            return a.chunks[(int) (first >>> a.chunkLog)];
        }
        a.readRaw(first, bl, buf, 0);
        return buf;
    }

    /** The offset of block {@code first} in the array {@link #view} returned. */
    private static int offset(Amplitudes a, long first, double[] buf) {
        return buf == null ? (int) (first & a.chunkMask) << 1 : 0;
    }

    /**
     * Returns {@code Σ|a_i|²}.
     *
     * @param a amplitudes. Not modified.
     * @param threads threads to use
     * @return the squared norm
     */
    public static double norm2(Amplitudes a, int threads) {
        double total = 0;
        for (double p : blockSums(a, threads)) {
            total += p;
        }
        return total;
    }

    /**
     * Returns the total probability of the basis states in which qubit {@code q} is 1, or of all
     * states when {@code q < 0}.
     *
     * @param a amplitudes. Not modified.
     * @param q qubit, or -1 for all
     * @param threads threads to use
     * @return the (unnormalised) probability
     */
    static double probabilityWhere(Amplitudes a, int q, int threads) {
        final int bl = blockLog(a);
        final int blocks = 1 << (a.n - bl);
        final double[] partial = new double[blocks];
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        Parallel.forRange(threads, blocks, par, (from, to) -> {
            double[] buf = buffer(a, bl);
            for (long b = from; b < to; b++) {
                long first = b << bl;
                if (q >= bl && ((first >>> q) & 1) == 0) {
                    continue;
                }
                double[] psi = view(a, first, bl, buf);
                int start = offset(a, first, buf);
                int end = start + (2 << bl);
                double s = 0;
                final LaneKernels lanes = a.lanes;
                if (lanes != null && (q < 0 || q >= bl)) {
                    s = lanes.sumSquares(psi, start, end);
                } else if (lanes != null && q >= LANE_HALF_LOG) {
                    int s2 = 2 << q;
                    for (int blk = start + s2; blk < end; blk += s2 << 1) {
                        s += lanes.sumSquares(psi, blk, blk + s2);
                    }
                } else if (q < 0 || q >= bl) {
                    for (int x = start; x < end; x += 2) {
                        s += psi[x] * psi[x] + psi[x + 1] * psi[x + 1];
                    }
                } else {
                    int s2 = 2 << q;
                    for (int blk = start + s2; blk < end; blk += s2 << 1) {
                        int stop = blk + s2;
                        for (int x = blk; x < stop; x += 2) {
                            s += psi[x] * psi[x] + psi[x + 1] * psi[x + 1];
                        }
                    }
                }
                partial[(int) b] = s;
            }
        });
        double total = 0;
        for (double p : partial) {
            total += p;
        }
        return total;
    }

    /**
     * Returns {@code <a|b> = Σ conj(a_i) b_i} as {re, im}.
     *
     * @param a the bra. Not modified.
     * @param b the ket, same qubit count. Not modified.
     * @param threads threads to use
     * @return {re, im}
     */
    public static double[] inner(Amplitudes a, Amplitudes b, int threads) {
        a.settle();
        b.settle();
        // Any precisions and chunk sizes: blocks fit in both states' chunks.
        final int bl = Math.min(blockLog(a), blockLog(b));
        final int blocks = 1 << (a.n - bl);
        final double[] pr = new double[blocks];
        final double[] pi = new double[blocks];
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        final LaneKernels lanes = a.lanes != null && b.lanes != null ? a.lanes : null;
        Parallel.forRange(threads, blocks, par, (from, to) -> {
            double[] ua = buffer(a, bl);
            double[] vb = buffer(b, bl);
            double[] sum = new double[2];
            for (long blk = from; blk < to; blk++) {
                long first = blk << bl;
                double[] u = view(a, first, bl, ua);
                double[] v = view(b, first, bl, vb);
                int uo = offset(a, first, ua);
                int vo = offset(b, first, vb);
                if (lanes != null) {
                    lanes.innerSums(u, uo, v, vo, 1 << bl, sum);
                    pr[(int) blk] = sum[0];
                    pi[(int) blk] = sum[1];
                    continue;
                }
                double sr = 0;
                double si = 0;
                for (int x = 0; x < (2 << bl); x += 2) {
                    final double ur = u[uo + x];
                    final double ui = u[uo + x + 1];
                    final double vr = v[vo + x];
                    final double vi = v[vo + x + 1];
                    sr += ur * vr + ui * vi;
                    si += ur * vi - ui * vr;
                }
                pr[(int) blk] = sr;
                pi[(int) blk] = si;
            }
        });
        double re = 0;
        double im = 0;
        for (int i = 0; i < blocks; i++) {
            re += pr[i];
            im += pi[i];
        }
        return new double[] {re, im};
    }

    /**
     * Writes {@code |a_i|²} for every basis state.
     *
     * @param a amplitudes, at most 30 qubits. Not modified.
     * @param out length 2^n. Modified.
     * @param threads threads to use
     */
    public static void probabilities(Amplitudes a, double[] out, int threads) {
        a.settle();
        final int bl = blockLog(a);
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        Parallel.forRange(threads, 1L << (a.n - bl), par, (from, to) -> {
            double[] buf = buffer(a, bl);
            for (long b = from; b < to; b++) {
                long first = b << bl;
                double[] psi = view(a, first, bl, buf);
                int start = offset(a, first, buf);
                int end = start + (2 << bl);
                int i = (int) first;
                if (a.lanes != null) {
                    a.lanes.squares(psi, start, end, out, i);
                    continue;
                }
                for (int x = start; x < end; x += 2, i++) {
                    out[i] = psi[x] * psi[x] + psi[x + 1] * psi[x + 1];
                }
            }
        });
    }

    /**
     * Adds {@code |a_i|²} into {@code out[key(i)]} where bit {@code j} of the key is bit
     * {@code qubits[j]} of {@code i}. Single-threaded, in index order.
     *
     * @param a amplitudes. Not modified.
     * @param qubits the qubits to keep
     * @param out length 2^qubits.length, zeroed. Modified.
     */
    public static void marginal(Amplitudes a, int[] qubits, double[] out) {
        a.settle();
        final int k = qubits.length;
        final int bl = blockLog(a);
        double[] buf = buffer(a, bl);
        for (long first = 0; first < (1L << a.n); first += 1L << bl) {
            double[] psi = view(a, first, bl, buf);
            int start = offset(a, first, buf);
            int end = start + (2 << bl);
            long idx = first;
            for (int x = start; x < end; x += 2, idx++) {
                int key = 0;
                for (int j = 0; j < k; j++) {
                    key |= (int) ((idx >>> qubits[j]) & 1) << j;
                }
                out[key] += psi[x] * psi[x] + psi[x + 1] * psi[x + 1];
            }
        }
    }

    /**
     * Returns the probability mass of each fixed summation block, {@code Σ|a_i|²} over block
     * {@code b}, in index order within the block.
     *
     * @param a amplitudes. Not modified.
     * @param threads threads to use
     * @return one sum per block of {@code 2^min(chunkLog, BLOCK_LOG)} amplitudes
     */
    public static double[] blockSums(Amplitudes a, int threads) {
        a.settle();
        final int bl = blockLog(a);
        final int blocks = 1 << (a.n - bl);
        final double[] partial = new double[blocks];
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        Parallel.forRange(threads, blocks, par, (from, to) -> {
            double[] buf = buffer(a, bl);
            for (long b = from; b < to; b++) {
                long first = b << bl;
                double[] psi = view(a, first, bl, buf);
                int start = offset(a, first, buf);
                int end = start + (2 << bl);
                if (a.lanes != null) {
                    partial[(int) b] = a.lanes.sumSquares(psi, start, end);
                    continue;
                }
                double s = 0;
                for (int x = start; x < end; x += 2) {
                    s += psi[x] * psi[x] + psi[x + 1] * psi[x + 1];
                }
                partial[(int) b] = s;
            }
        });
        return partial;
    }

    /**
     * Maps sorted uniforms to basis indices: uniform {@code u[s]} in {@code [0, Σ blockSums)}
     * picks the first index whose cumulative probability exceeds it (inverse-transform
     * sampling). The uniforms are first assigned to blocks by the cumulative block sums, then
     * each block with uniforms is walked once, in parallel; cumulative sums start from the
     * block's prefix, so the result does not depend on the thread count. A uniform that rounding
     * leaves past a block's last cumulative sum picks that block's last index of non-zero
     * probability.
     *
     * @param a amplitudes. Not modified.
     * @param sums the block sums from {@link #blockSums}. Not modified.
     * @param sorted ascending uniforms. Not modified.
     * @param out picked index per uniform, same length. Modified.
     * @param threads threads to use
     */
    public static void pickIndices(Amplitudes a, double[] sums, double[] sorted, long[] out,
            int threads) {
        a.settle();
        final int bl = blockLog(a);
        final int blocks = sums.length;
        final double[] prefix = new double[blocks];
        final int[] firstShot = new int[blocks + 1];
        double cum = 0;
        int s = 0;
        int lastUsed = 0;
        for (int b = 0; b < blocks; b++) {
            prefix[b] = cum;
            firstShot[b] = s;
            cum += sums[b];
            if (sums[b] > 0) {
                lastUsed = b;
            }
            while (s < sorted.length && sorted[s] < cum) {
                s++;
            }
        }
        firstShot[blocks] = s;
        // Uniforms left over by rounding go to the last block with mass.
        for (int b = lastUsed + 1; b <= blocks; b++) {
            firstShot[b] = sorted.length;
        }
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        Parallel.forRange(threads, blocks, par, (from, to) -> {
            double[] buf = buffer(a, bl);
            for (int b = (int) from; b < to; b++) {
                int lo = firstShot[b];
                int hi = firstShot[b + 1];
                if (lo == hi) {
                    continue;
                }
                long first = (long) b << bl;
                double[] psi = view(a, first, bl, buf);
                int start = offset(a, first, buf);
                int end = start + (2 << bl);
                double c = prefix[b];
                long last = first;
                int k = lo;
                long idx = first;
                for (int x = start; x < end && k < hi; x += 2, idx++) {
                    double p = psi[x] * psi[x] + psi[x + 1] * psi[x + 1];
                    if (p == 0) {
                        continue;
                    }
                    c += p;
                    last = idx;
                    while (k < hi && sorted[k] < c) {
                        out[k++] = idx;
                    }
                }
                if (k < hi) {
                    // Rounding: find the block's last index with mass.
                    for (int x = end - 2; x >= start; x -= 2) {
                        if (psi[x] != 0 || psi[x + 1] != 0) {
                            last = first + ((x - start) >> 1);
                            break;
                        }
                    }
                    while (k < hi) {
                        out[k++] = last;
                    }
                }
            }
        });
    }
}
