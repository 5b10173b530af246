package dev.qsim.kernel;

import static dev.qsim.kernel.VectorShapes.AMP_LOG;
import static dev.qsim.kernel.VectorShapes.D;
import static dev.qsim.kernel.VectorShapes.L;
import static dev.qsim.kernel.VectorShapes.LONGS;
import static dev.qsim.kernel.VectorShapes.SIGN;
import static dev.qsim.kernel.VectorShapes.SWAP;

import jdk.incubator.vector.DoubleVector;
import jdk.incubator.vector.VectorMask;
import jdk.incubator.vector.VectorShuffle;

/**
 * Vector loops for the sums over a state ({@link Reductions}, {@link PauliKernels}): lane-wise
 * partial sums in two accumulators, added lane by lane in index order at the end (never the
 * API's {@code reduceLanes}, whose order is left open), so a block gives the same bits on every
 * call; leftovers shorter than a vector are added last, in index order. The element-wise loops
 * (squares, the Pauli accumulation) are the scalar formulas lane by lane. Internal.
 */
final class VectorSums {
    /** Lane i takes lane 2i mod L: the real parts, in both halves. */
    private static final VectorShuffle<Long> REALS = VectorShuffle.fromOp(LONGS, i -> (2 * i) % L);
    /** Lane i takes lane 2i + 1 mod L: the imaginary parts, in both halves. */
    private static final VectorShuffle<Long> IMAGS =
            VectorShuffle.fromOp(LONGS, i -> (2 * i + 1) % L);
    /** The back half of the lanes. */
    private static final VectorMask<Double> BACK = VectorMask.fromLong(D, -1L << (L / 2));
    /** +1 on real lanes, -1 on imaginary lanes. */
    private static final DoubleVector CONJ = SIGN.neg();

    private VectorSums() {
    }

    private static double lanesInOrder(DoubleVector a, DoubleVector b) {
        final double[] t = new double[L];
        a.add(b).intoArray(t, 0);
        double s = 0;
        for (double x : t) {
            s += x;
        }
        return s;
    }

    /** See {@link LaneKernels#sumSquares}. */
    static double sumSquares(double[] psi, int from, int to) {
        DoubleVector s0 = DoubleVector.zero(D);
        DoubleVector s1 = DoubleVector.zero(D);
        int x = from;
        for (; x + 2 * L <= to; x += 2 * L) {
            final DoubleVector a = DoubleVector.fromArray(D, psi, x);
            final DoubleVector b = DoubleVector.fromArray(D, psi, x + L);
            s0 = s0.add(a.mul(a));
            s1 = s1.add(b.mul(b));
        }
        double s = lanesInOrder(s0, s1);
        for (; x < to; x += 2) {
            s += psi[x] * psi[x] + psi[x + 1] * psi[x + 1];
        }
        return s;
    }

    /** See {@link LaneKernels#squares}. */
    static void squares(double[] psi, int from, int to, double[] out, int at) {
        int x = from;
        int i = at;
        for (; x + 2 * L <= to; x += 2 * L, i += L) {
            final DoubleVector a = DoubleVector.fromArray(D, psi, x);
            final DoubleVector b = DoubleVector.fromArray(D, psi, x + L);
            final DoubleVector pa = a.mul(a);
            final DoubleVector pb = b.mul(b);
            // re² + im² of each amplitude: the even lane plus the odd lane, as the scalar loop.
            final DoubleVector front = pa.reinterpretAsLongs().rearrange(REALS)
                    .reinterpretAsDoubles()
                    .add(pa.reinterpretAsLongs().rearrange(IMAGS).reinterpretAsDoubles());
            final DoubleVector back = pb.reinterpretAsLongs().rearrange(REALS)
                    .reinterpretAsDoubles()
                    .add(pb.reinterpretAsLongs().rearrange(IMAGS).reinterpretAsDoubles());
            front.blend(back, BACK).intoArray(out, i);
        }
        for (; x < to; x += 2, i++) {
            out[i] = psi[x] * psi[x] + psi[x + 1] * psi[x + 1];
        }
    }

    /** See {@link LaneKernels#innerSums}. */
    static void innerSums(double[] u, int uo, double[] v, int vo, int count, double[] out) {
        final int len = count << 1;
        DoubleVector re = DoubleVector.zero(D);
        DoubleVector im = DoubleVector.zero(D);
        int x = 0;
        for (; x + L <= len; x += L) {
            final DoubleVector a = DoubleVector.fromArray(D, u, uo + x);
            final DoubleVector b = DoubleVector.fromArray(D, v, vo + x);
            re = re.add(a.mul(b));
            im = im.add(a.mul(b.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles())
                    .mul(CONJ));
        }
        double sr = lanesInOrder(re, DoubleVector.zero(D));
        double si = lanesInOrder(im, DoubleVector.zero(D));
        for (; x < len; x += 2) {
            final double ur = u[uo + x];
            final double ui = u[uo + x + 1];
            final double vr = v[vo + x];
            final double vi = v[vo + x + 1];
            sr += ur * vr + ui * vi;
            si += ur * vi - ui * vr;
        }
        out[0] = sr;
        out[1] = si;
    }

    /** The sign (-1)^{|c ∧ z|} of each lane's amplitude c inside a vector, as lanes. */
    private static double[] lowSigns(int z) {
        final double[] s = new double[L];
        for (int i = 0; i < L; i++) {
            s[i] = (Integer.bitCount((i >> 1) & z) & 1) == 0 ? 1 : -1;
        }
        return s;
    }

    /** See {@link LaneKernels#pauliInner}. */
    static void pauliInner(double[] k, double[] b, int start, int end, int xLow, int zLow,
            double[] out) {
        final int lowMask = (1 << AMP_LOG) - 1;
        final int xIn = xLow & lowMask;
        final int xOut = xLow & ~lowMask;
        final int zOut = zLow & ~lowMask;
        final VectorShuffle<Long> perm = VectorShapes.xor(2 * xIn);
        final DoubleVector signs = DoubleVector.fromArray(D, lowSigns(zLow & lowMask), 0);
        DoubleVector re = DoubleVector.zero(D);
        DoubleVector im = DoubleVector.zero(D);
        for (int o = start; o < end; o += 1 << AMP_LOG) {
            final DoubleVector kv = DoubleVector.fromArray(D, k, o << 1);
            final DoubleVector bv = DoubleVector.fromArray(D, b, (o ^ xOut) << 1)
                    .reinterpretAsLongs().rearrange(perm).reinterpretAsDoubles();
            final DoubleVector sg = signs.mul(1 - ((Integer.bitCount(o & zOut) & 1) << 1));
            // conj(b) k: re = br kr + bi ki, im = br ki - bi kr, each times the sign.
            re = re.add(bv.mul(kv).mul(sg));
            im = im.add(bv.mul(kv.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles())
                    .mul(CONJ).mul(sg));
        }
        out[0] = lanesInOrder(re, DoubleVector.zero(D));
        out[1] = lanesInOrder(im, DoubleVector.zero(D));
    }

    /** See {@link LaneKernels#pauliAccumulate}. */
    static void pauliAccumulate(double[] src, double[] dst, int start, int end, int xLow,
            int zLow, double ar, double ai) {
        final int lowMask = (1 << AMP_LOG) - 1;
        final int xIn = xLow & lowMask;
        final int xOut = xLow & ~lowMask;
        final int zOut = zLow & ~lowMask;
        final VectorShuffle<Long> perm = VectorShapes.xor(2 * xIn);
        final DoubleVector signs = DoubleVector.fromArray(D, lowSigns(zLow & lowMask), 0);
        final DoubleVector cr = DoubleVector.broadcast(D, ar);
        final DoubleVector ci = SIGN.mul(ai);
        for (int o = start; o < end; o += 1 << AMP_LOG) {
            final double s = 1 - ((Integer.bitCount(o & zOut) & 1) << 1);
            final DoubleVector w = DoubleVector.fromArray(D, src, o << 1).mul(signs.mul(s));
            // (ar + i ai)(r + i i): re = ar r - ai i, im = ar i + ai r, then to o ^ xLow.
            final DoubleVector t = w.mul(cr)
                    .add(w.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles().mul(ci))
                    .reinterpretAsLongs().rearrange(perm).reinterpretAsDoubles();
            final int d = (o ^ xOut) << 1;
            DoubleVector.fromArray(D, dst, d).add(t).intoArray(dst, d);
        }
    }
}
