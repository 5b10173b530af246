package dev.qsim.kernel;

/**
 * Loops that apply a Pauli product's bit flips and signs on the fly, on chunked re/im-interleaved
 * amplitudes, without building the product's matrix or a copy of the state. A product with masks
 * {@code (x, z)} and phase 1 before its own {@code i^{|x∧z|}} sends {@code |j>} to
 * {@code (-1)^{|j∧z|} |j⊕x>}. Sums run over fixed blocks of {@code 2^BLOCK_LOG} amplitudes added
 * in block order, so results do not depend on the thread count. With vector loops on the ket
 * ({@link LaneKernels}) and blocks of at least one vector, each block goes to them (sums equal
 * within rounding, the accumulation the same bits). Internal; unchecked.
 */
public final class PauliKernels {
    private PauliKernels() {
    }

    private static int blockLog(Amplitudes a) {
        return Math.min(Reductions.BLOCK_LOG, Math.min(a.qubits(), a.chunkLog()));
    }

    /** The storage's vector loops when a block holds whole vectors, else null. */
    private static LaneKernels vectorBlocks(Amplitudes a, int bl) {
        return a.lanes != null && bl >= a.lanes.amplitudeLog() ? a.lanes : null;
    }

    /**
     * Returns {@code Σ_j conj(bra_{j⊕x}) (-1)^{|j∧z|} ket_j} as {re, im}, that is
     * {@code <bra| X^x Z^z |ket>}.
     *
     * @param bra the bra. Not modified.
     * @param ket the ket, same size. Not modified.
     * @param x the X mask, below {@code 2^n}
     * @param z the Z mask, below {@code 2^n}
     * @param threads threads to use
     * @return {re, im}
     */
    public static double[] inner(Amplitudes bra, Amplitudes ket, long x, long z, int threads) {
        bra.settle();
        ket.settle();
        final int bl = blockLog(ket);
        final int cl = ket.chunkLog();
        final long cmask = (1L << cl) - 1;
        final int blocks = 1 << (ket.qubits() - bl);
        final double[] pr = new double[blocks];
        final double[] pi = new double[blocks];
        final double[][] bc = bra.chunks();
        final double[][] kc = ket.chunks();
        final int xHigh = (int) (x >>> cl);
        final int xLow = (int) (x & cmask);
        final boolean par = ket.qubits() >= Parallel.MIN_PARALLEL_QUBITS;
        final int zLow = (int) (z & cmask);
        final LaneKernels lanes = vectorBlocks(ket, bl);
        Parallel.forRange(threads, blocks, par, (from, to) -> {
            final double[] sum = new double[2];
            for (long blk = from; blk < to; blk++) {
                final long first = blk << bl;
                final int c = (int) (first >>> cl);
                final double[] k = kc[c];
                final double[] b = bc[c ^ xHigh];
                final int start = (int) (first & cmask);
                final int end = start + (1 << bl);
                final boolean flipped = (Long.bitCount(first & ~cmask & z) & 1) != 0;
                if (lanes != null) {
                    lanes.pauliInner(k, b, start, end, xLow, zLow, sum);
                    pr[(int) blk] = flipped ? -sum[0] : sum[0];
                    pi[(int) blk] = flipped ? -sum[1] : sum[1];
                    continue;
                }
                // Two independent pairs of sums (even and odd o) halve the add-latency chain.
                double sr = 0;
                double si = 0;
                double tr = 0;
                double ti = 0;
                for (int o = start; o < end; o += 2) {
                    final int ko = o << 1;
                    final int bo = (o ^ xLow) << 1;
                    final int bp = ((o + 1) ^ xLow) << 1;
                    final double kr = k[ko];
                    final double ki = k[ko + 1];
                    final double br = b[bo];
                    final double bi = b[bo + 1];
                    final double kr1 = k[ko + 2];
                    final double ki1 = k[ko + 3];
                    final double br1 = b[bp];
                    final double bi1 = b[bp + 1];
                    // (-1)^{|o ∧ z|}, branch-free: the parity is random for most states
                    final double sign = 1 - ((Integer.bitCount(o & zLow) & 1) << 1);
                    final double sign1 = 1 - ((Integer.bitCount((o + 1) & zLow) & 1) << 1);
                    sr += sign * (br * kr + bi * ki);
                    si += sign * (br * ki - bi * kr);
                    tr += sign1 * (br1 * kr1 + bi1 * ki1);
                    ti += sign1 * (br1 * ki1 - bi1 * kr1);
                }
                sr += tr;
                si += ti;
                pr[(int) blk] = flipped ? -sr : sr;
                pi[(int) blk] = flipped ? -si : si;
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
     * Adds {@code c · X^x Z^z |in>} to {@code out}: {@code out_{j⊕x} += c (-1)^{|j∧z|} in_j}.
     *
     * @param out the accumulator, same size, not the same storage as {@code in}. Modified.
     * @param in the source. Not modified.
     * @param x the X mask
     * @param z the Z mask
     * @param cr real part of {@code c}
     * @param ci imaginary part of {@code c}
     * @param threads threads to use
     */
    public static void accumulate(Amplitudes out, Amplitudes in, long x, long z, double cr,
            double ci, int threads) {
        final int bl = blockLog(in);
        final int cl = in.chunkLog();
        final long cmask = (1L << cl) - 1;
        final int blocks = 1 << (in.qubits() - bl);
        final double[][] oc = out.chunks();
        final double[][] ic = in.chunks();
        final int xHigh = (int) (x >>> cl);
        final int xLow = (int) (x & cmask);
        final boolean par = in.qubits() >= Parallel.MIN_PARALLEL_QUBITS;
        final int zLow = (int) (z & cmask);
        final LaneKernels lanes = vectorBlocks(in, bl);
        Parallel.forRange(threads, blocks, par, (from, to) -> {
            for (long blk = from; blk < to; blk++) {
                final long first = blk << bl;
                final int c = (int) (first >>> cl);
                final double[] src = ic[c];
                final double[] dst = oc[c ^ xHigh];
                final int start = (int) (first & cmask);
                final int end = start + (1 << bl);
                // c times the sign of the chunk's high bits, then the in-chunk sign per amplitude
                final double flip = 1 - ((Long.bitCount(first & ~cmask & z) & 1) << 1);
                final double ar = cr * flip;
                final double ai = ci * flip;
                if (lanes != null) {
                    lanes.pauliAccumulate(src, dst, start, end, xLow, zLow, ar, ai);
                    continue;
                }
                for (int o = start; o < end; o++) {
                    final int so = o << 1;
                    final int d = (o ^ xLow) << 1;
                    final double sign = 1 - ((Integer.bitCount(o & zLow) & 1) << 1);
                    final double r = src[so] * sign;
                    final double i = src[so + 1] * sign;
                    dst[d] += ar * r - ai * i;
                    dst[d + 1] += ar * i + ai * r;
                }
            }
        });
    }

    /**
     * Returns {@code i^{|x∧z|}}, the phase that makes {@code X^x Z^z} the Pauli product with
     * phase +1 (Y = iXZ), as {re, im}.
     *
     * @param x the X mask
     * @param z the Z mask
     * @return {re, im}
     */
    public static double[] ownPhase(long x, long z) {
        switch (Long.bitCount(x & z) & 3) {
            case 0:
                return new double[] {1, 0};
            case 1:
                return new double[] {0, 1};
            case 2:
                return new double[] {-1, 0};
            default:
                return new double[] {0, -1};
        }
    }
}
