package dev.qsim.kernel;

/**
 * Sums over a state, read-only. Each sum is taken over fixed blocks of
 * {@code 2^}{@value #BLOCK_LOG} amplitudes, in index order within a block, and the block sums are
 * then added in block order: the result does not depend on the thread count. Internal.
 */
public final class Reductions {
    /** Log2 of the amplitudes per summation block. */
    public static final int BLOCK_LOG = 14;

    private Reductions() {
    }

    private static int blockLog(Amplitudes a) {
        return Math.min(a.chunkLog, BLOCK_LOG);
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
    public static double probabilityWhere(Amplitudes a, int q, int threads) {
        final int bl = blockLog(a);
        final int blocks = 1 << (a.n - bl);
        final double[] partial = new double[blocks];
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        Parallel.forRange(threads, blocks, par, (from, to) -> {
            for (long b = from; b < to; b++) {
                long first = b << bl;
                if (q >= bl && ((first >>> q) & 1) == 0) {
                    continue;
                }
                double[] psi = a.chunks[(int) (first >>> a.chunkLog)];
                int start = (int) (first & a.chunkMask) << 1;
                int end = start + (2 << bl);
                double s = 0;
                if (q < 0 || q >= bl) {
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
        final int bl = blockLog(a);
        final int blocks = 1 << (a.n - bl);
        final double[] pr = new double[blocks];
        final double[] pi = new double[blocks];
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        Parallel.forRange(threads, blocks, par, (from, to) -> {
            for (long blk = from; blk < to; blk++) {
                long first = blk << bl;
                int c = (int) (first >>> a.chunkLog);
                double[] u = a.chunks[c];
                double[] v = b.chunks[c];
                int start = (int) (first & a.chunkMask) << 1;
                int end = start + (2 << bl);
                double sr = 0;
                double si = 0;
                for (int x = start; x < end; x += 2) {
                    sr += u[x] * v[x] + u[x + 1] * v[x + 1];
                    si += u[x] * v[x + 1] - u[x + 1] * v[x];
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
        final int bl = blockLog(a);
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        Parallel.forRange(threads, 1L << (a.n - bl), par, (from, to) -> {
            for (long b = from; b < to; b++) {
                long first = b << bl;
                double[] psi = a.chunks[(int) (first >>> a.chunkLog)];
                int start = (int) (first & a.chunkMask) << 1;
                int end = start + (2 << bl);
                int i = (int) first;
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
        final int k = qubits.length;
        final int cl = a.chunkLog;
        for (int c = 0; c < a.chunks.length; c++) {
            double[] psi = a.chunks[c];
            long base = (long) c << cl;
            for (int i = 0, x = 0; x < psi.length; i++, x += 2) {
                long idx = base + i;
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
        final int bl = blockLog(a);
        final int blocks = 1 << (a.n - bl);
        final double[] partial = new double[blocks];
        final boolean par = a.n >= Parallel.MIN_PARALLEL_QUBITS;
        Parallel.forRange(threads, blocks, par, (from, to) -> {
            for (long b = from; b < to; b++) {
                long first = b << bl;
                double[] psi = a.chunks[(int) (first >>> a.chunkLog)];
                int start = (int) (first & a.chunkMask) << 1;
                int end = start + (2 << bl);
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
            for (int b = (int) from; b < to; b++) {
                int lo = firstShot[b];
                int hi = firstShot[b + 1];
                if (lo == hi) {
                    continue;
                }
                long first = (long) b << bl;
                double[] psi = a.chunks[(int) (first >>> a.chunkLog)];
                int start = (int) (first & a.chunkMask) << 1;
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
