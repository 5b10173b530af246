package dev.qsim.kernel;

import static dev.qsim.kernel.VectorShapes.D;
import static dev.qsim.kernel.VectorShapes.EVEN;
import static dev.qsim.kernel.VectorShapes.L;
import static dev.qsim.kernel.VectorShapes.LONGS;
import static dev.qsim.kernel.VectorShapes.ODD;
import static dev.qsim.kernel.VectorShapes.SIGN;
import static dev.qsim.kernel.VectorShapes.SWAP;

import jdk.incubator.vector.DoubleVector;
import jdk.incubator.vector.VectorMask;
import jdk.incubator.vector.VectorShuffle;

/**
 * Vector loops for single-qubit gates without controls on double storage, the frame's phases
 * and the precision conversions, on re/im-interleaved arrays. The gate loops compute the sums of
 * the scalar loop they stand for ({@link DenseSingleQubitKernels}) in the same order but with
 * fused multiply-adds (IEEE 754-2019 §5.4.1: one rounding for a product and a sum), which
 * measured 1.1-1.2 times as fast in cache; they agree with the scalar loops to a few units in
 * the last place, and leftovers shorter than a vector run the same fused formulas ({@code pair}),
 * so an amplitude's bits do not depend on which loop or thread reaches it. The phase loops give
 * the scalar loops' bits ({@link DiagonalKernels}, {@link Frame}).
 *
 * <p>Complex products on interleaved parts: for a factor {@code c = cr + i ci} and a vector
 * {@code w} of amplitudes, {@code c w = cr w + (ci * SIGN) swap(w)}, where {@code swap}
 * exchanges the two parts of each amplitude and {@code SIGN} is -1 on real lanes and +1 on
 * imaginary ones (the re lane gets {@code cr re - ci im}, the im lane {@code cr im + ci re}).
 * A target whose partners lie in the same vector (blocks shorter than a vector) takes lane
 * permutations instead of a second load: each lane reads the low and the high member of its
 * pair and multiplies them by the matrix entries of its own row. Internal.
 */
final class VectorPairs {
    /** Lane permutations for a target whose blocks fit in one vector. */
    private static final class InRegister {
        final VectorShuffle<Long> low;
        final VectorShuffle<Long> high;
        final VectorShuffle<Long> lowSwapped;
        final VectorShuffle<Long> highSwapped;
        final VectorShuffle<Long> partner;
        final VectorShuffle<Long> partnerSwapped;
        /** Whether lane i belongs to the high member of its pair. */
        final boolean[] upper = new boolean[L];

        InRegister(int q) {
            final int s = 2 << q;
            low = VectorShuffle.fromOp(LONGS, i -> i & ~s);
            high = VectorShuffle.fromOp(LONGS, i -> i | s);
            lowSwapped = VectorShuffle.fromOp(LONGS, i -> (i & ~s) ^ 1);
            highSwapped = VectorShuffle.fromOp(LONGS, i -> (i | s) ^ 1);
            partner = VectorShuffle.fromOp(LONGS, i -> i ^ s);
            partnerSwapped = VectorShuffle.fromOp(LONGS, i -> i ^ s ^ 1);
            for (int i = 0; i < L; i++) {
                upper[i] = (i & s) != 0;
            }
        }
    }

    private static final InRegister[] IN_REGISTER = new InRegister[VectorShapes.AMP_LOG];

    static {
        for (int q = 0; q < IN_REGISTER.length; q++) {
            IN_REGISTER[q] = new InRegister(q);
        }
    }

    /**
     * Runs of 64 to 1024 doubles (targets 5 to 9) read a little ahead of themselves: the two
     * halves of such short blocks share pages, and the processor's prefetchers lose track of
     * them (measured at 26 qubits: 18-30 GB/s for these targets against 50 for the others, one
     * thread). One plain load per cache line, 8 KiB ahead in address order, keeps the data
     * coming, as a prefetch instruction would in C; the loaded values only feed {@link #sink}.
     */
    static final int AHEAD_MIN = 64;
    /** See {@link #AHEAD_MIN}. */
    static final int AHEAD_MAX = 1024;
    /**
     * The read-ahead is for arrays of at least 2^21 doubles (16 MiB) only: below that the
     * state sits in the caches, where the extra loads only cost (one thread, 512-bit vectors,
     * Temurin 25, targets 4 to 10: 70-104 GB/s with them against 91-110 without at 19 qubits,
     * and at 16 qubits on two threads 150-168 against 190-204), while at 20 qubits and above
     * they still pay (at 21 qubits 38-67 GB/s with them, 23-64 without).
     */
    static final int AHEAD_ARRAY_MIN = 1 << 21;
    /** How far ahead, in array elements (8 KiB of doubles). */
    private static final int AHEAD = 1024;
    /** Where the read-ahead values go, so that the compiler keeps the loads. */
    static volatile long sink;

    private VectorPairs() {
    }

    /** Two cache lines from {@code p + AHEAD} (clamped to the array), folded into bits. */
    static long ahead(double[] a, int p, int last) {
        return Double.doubleToRawLongBits(a[Math.min(p + AHEAD, last)])
                ^ Double.doubleToRawLongBits(a[Math.min(p + AHEAD + L, last)]);
    }

    /**
     * Lanes taking {@code lo} where the lane is a low member, {@code hi} where high, as an array:
     * the loops make the vector themselves ({@code fromArray}), so that the compiler knows its
     * exact class (a vector passed in from an uninlined method is not intrinsified on JDK 17).
     */
    private static double[] byMember(InRegister r, double lo, double hi, boolean signed) {
        double[] v = new double[L];
        for (int i = 0; i < L; i++) {
            double x = r.upper[i] ? hi : lo;
            v[i] = signed && (i & 1) == 0 ? -x : x;
        }
        return v;
    }

    // ---------------------------------------------------------------- double

    /** See {@link LaneKernels#pairs(double[], int, double[], int, int, double[], int)}. */
    static void pairs(double[] u, int uo, double[] v, int vo, int count, double[] m, int kind) {
        final int len = count << 1;
        final int bound = len & -L;
        if (bound > 0) {
            runs(u, uo, v, vo, bound, 1, 0, m, kind);
        }
        for (int k = bound; k < len; k += 2) {
            pair(u, uo + k, v, vo + k, m, kind);
        }
    }

    /** See {@link LaneKernels#blocks(double[], int, int, int, double[], int)}. */
    static void blocks(double[] psi, int start, int end, int q, double[] m, int kind) {
        final int s2 = 2 << q;
        if (s2 >= L) {
            runs(psi, start, psi, start + s2, s2, (end - start) / (s2 << 1), s2 << 1, m, kind);
            return;
        }
        final InRegister r = IN_REGISTER[q];
        final int bound = start + ((end - start) & -L);
        if (bound > start) {
            if (kind == LaneKernels.REAL) {
                inRegisterReal(psi, start, bound, r, m);
            } else if (kind == LaneKernels.CROSS) {
                inRegisterCross(psi, start, bound, r, m);
            } else {
                inRegisterComplex(psi, start, bound, r, m);
            }
        }
        for (int x = bound; x < end; x += s2 << 1) {
            for (int k = 0; k < s2; k += 2) {
                pair(psi, x + k, psi, x + k + s2, m, kind);
            }
        }
    }

    /**
     * {@code blocks} runs of {@code len} doubles (a multiple of the vector), the i-th at
     * {@code uo + i * stride} and {@code vo + i * stride}, paired element by element.
     */
    private static void runs(double[] u, int uo, double[] v, int vo, int len, int blocks,
            int stride, double[] m, int kind) {
        if (kind == LaneKernels.REAL) {
            runsReal(u, uo, v, vo, len, blocks, stride, m);
        } else if (kind == LaneKernels.CROSS) {
            runsCross(u, uo, v, vo, len, blocks, stride, m);
        } else {
            runsComplex(u, uo, v, vo, len, blocks, stride, m);
        }
    }

    private static void runsReal(double[] u, int uo, double[] v, int vo, int len, int blocks,
            int stride, double[] m) {
        final DoubleVector m00 = DoubleVector.broadcast(D, m[0]);
        final DoubleVector m01 = DoubleVector.broadcast(D, m[2]);
        final DoubleVector m10 = DoubleVector.broadcast(D, m[4]);
        final DoubleVector m11 = DoubleVector.broadcast(D, m[6]);
        long touch = 0;
        final int last = u.length - 1;
        final boolean ahead = u == v && len >= AHEAD_MIN && len <= AHEAD_MAX
                && u.length >= AHEAD_ARRAY_MIN;
        for (int b = 0; b < blocks; b++) {
            final int x0 = uo + b * stride;
            final int y0 = vo + b * stride;
            for (int k = 0; k < len; k += L) {
                if (ahead) {
                    touch ^= ahead(u, x0 + 2 * k, last);
                }
                final DoubleVector a = DoubleVector.fromArray(D, u, x0 + k);
                final DoubleVector c = DoubleVector.fromArray(D, v, y0 + k);
                c.fma(m01, a.mul(m00)).intoArray(u, x0 + k);
                c.fma(m11, a.mul(m10)).intoArray(v, y0 + k);
            }
        }
        sink = touch;
    }

    private static void runsCross(double[] u, int uo, double[] v, int vo, int len, int blocks,
            int stride, double[] m) {
        final DoubleVector d0 = DoubleVector.broadcast(D, m[0]);
        final DoubleVector d1 = DoubleVector.broadcast(D, m[6]);
        final DoubleVector o01 = SIGN.mul(m[3]);
        final DoubleVector o10 = SIGN.mul(m[5]);
        long touch = 0;
        final int last = u.length - 1;
        final boolean ahead = u == v && len >= AHEAD_MIN && len <= AHEAD_MAX
                && u.length >= AHEAD_ARRAY_MIN;
        for (int b = 0; b < blocks; b++) {
            final int x0 = uo + b * stride;
            final int y0 = vo + b * stride;
            for (int k = 0; k < len; k += L) {
                if (ahead) {
                    touch ^= ahead(u, x0 + 2 * k, last);
                }
                final DoubleVector a = DoubleVector.fromArray(D, u, x0 + k);
                final DoubleVector c = DoubleVector.fromArray(D, v, y0 + k);
                c.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles().fma(o01, a.mul(d0))
                        .intoArray(u, x0 + k);
                a.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles().fma(o10, c.mul(d1))
                        .intoArray(v, y0 + k);
            }
        }
        sink = touch;
    }

    private static void runsComplex(double[] u, int uo, double[] v, int vo, int len,
            int blocks, int stride, double[] m) {
        final DoubleVector m00r = DoubleVector.broadcast(D, m[0]);
        final DoubleVector m00i = SIGN.mul(m[1]);
        final DoubleVector m01r = DoubleVector.broadcast(D, m[2]);
        final DoubleVector m01i = SIGN.mul(m[3]);
        final DoubleVector m10r = DoubleVector.broadcast(D, m[4]);
        final DoubleVector m10i = SIGN.mul(m[5]);
        final DoubleVector m11r = DoubleVector.broadcast(D, m[6]);
        final DoubleVector m11i = SIGN.mul(m[7]);
        long touch = 0;
        final int last = u.length - 1;
        final boolean ahead = u == v && len >= AHEAD_MIN && len <= AHEAD_MAX
                && u.length >= AHEAD_ARRAY_MIN;
        for (int b = 0; b < blocks; b++) {
            final int x0 = uo + b * stride;
            final int y0 = vo + b * stride;
            for (int k = 0; k < len; k += L) {
                if (ahead) {
                    touch ^= ahead(u, x0 + 2 * k, last);
                }
                final DoubleVector a = DoubleVector.fromArray(D, u, x0 + k);
                final DoubleVector c = DoubleVector.fromArray(D, v, y0 + k);
                final DoubleVector as = a.reinterpretAsLongs().rearrange(SWAP)
                        .reinterpretAsDoubles();
                final DoubleVector cs = c.reinterpretAsLongs().rearrange(SWAP)
                        .reinterpretAsDoubles();
                cs.fma(m01i, c.fma(m01r, as.fma(m00i, a.mul(m00r)))).intoArray(u, x0 + k);
                cs.fma(m11i, c.fma(m11r, as.fma(m10i, a.mul(m10r)))).intoArray(v, y0 + k);
            }
        }
        sink = touch;
    }

    /**
     * See {@link LaneKernels#pairBlocks}: two gates of the {@code REAL} or {@code CROSS} kind on
     * targets at or above a vector, in one sweep. Each step loads the four amplitudes' vectors
     * that both gates mix, applies the first gate to the two pairs along its target and the
     * second to the two pairs along its own, with the formulas of {@link #runsReal} and
     * {@link #runsCross}, and stores them: every element gets the bits the two gates give one
     * after the other, with half the loads and stores (in cache, those loops are bound by
     * moving data, not by arithmetic). The four kind combinations are spelled out as four
     * loops: a loop taking a gate's formula as a parameter would pass vectors through calls the
     * compiler need not inline, and a vector that crosses an uninlined call is not
     * intrinsified on JDK 17 (see {@link #byMember}).
     */
    static void pairBlocks(double[] psi, int start, int end, int q1, double[] m1, int kind1,
            int q2, double[] m2, int kind2) {
        final int s1 = 2 << q1;
        final int s2 = 2 << q2;
        if (kind1 == LaneKernels.REAL) {
            if (kind2 == LaneKernels.REAL) {
                pairsRealReal(psi, start, end, s1, m1, s2, m2);
            } else {
                pairsRealCross(psi, start, end, s1, m1, s2, m2);
            }
        } else if (kind2 == LaneKernels.REAL) {
            pairsCrossReal(psi, start, end, s1, m1, s2, m2);
        } else {
            pairsCrossCross(psi, start, end, s1, m1, s2, m2);
        }
    }

    private static void pairsRealReal(double[] psi, int start, int end, int s1, double[] m,
            int s2, double[] n) {
        final DoubleVector a00 = DoubleVector.broadcast(D, m[0]);
        final DoubleVector a01 = DoubleVector.broadcast(D, m[2]);
        final DoubleVector a10 = DoubleVector.broadcast(D, m[4]);
        final DoubleVector a11 = DoubleVector.broadcast(D, m[6]);
        final DoubleVector b00 = DoubleVector.broadcast(D, n[0]);
        final DoubleVector b01 = DoubleVector.broadcast(D, n[2]);
        final DoubleVector b10 = DoubleVector.broadcast(D, n[4]);
        final DoubleVector b11 = DoubleVector.broadcast(D, n[6]);
        final int lo = Math.min(s1, s2);
        final int hi = Math.max(s1, s2);
        for (int h = start; h < end; h += hi << 1) {
            for (int g = h; g < h + hi; g += lo << 1) {
                for (int k = g; k < g + lo; k += L) {
                    final DoubleVector v00 = DoubleVector.fromArray(D, psi, k);
                    final DoubleVector v01 = DoubleVector.fromArray(D, psi, k + s1);
                    final DoubleVector v10 = DoubleVector.fromArray(D, psi, k + s2);
                    final DoubleVector v11 = DoubleVector.fromArray(D, psi, k + s1 + s2);
                    final DoubleVector w00 = v01.fma(a01, v00.mul(a00));
                    final DoubleVector w01 = v01.fma(a11, v00.mul(a10));
                    final DoubleVector w10 = v11.fma(a01, v10.mul(a00));
                    final DoubleVector w11 = v11.fma(a11, v10.mul(a10));
                    w10.fma(b01, w00.mul(b00)).intoArray(psi, k);
                    w10.fma(b11, w00.mul(b10)).intoArray(psi, k + s2);
                    w11.fma(b01, w01.mul(b00)).intoArray(psi, k + s1);
                    w11.fma(b11, w01.mul(b10)).intoArray(psi, k + s1 + s2);
                }
            }
        }
    }

    private static void pairsRealCross(double[] psi, int start, int end, int s1, double[] m,
            int s2, double[] n) {
        final DoubleVector a00 = DoubleVector.broadcast(D, m[0]);
        final DoubleVector a01 = DoubleVector.broadcast(D, m[2]);
        final DoubleVector a10 = DoubleVector.broadcast(D, m[4]);
        final DoubleVector a11 = DoubleVector.broadcast(D, m[6]);
        final DoubleVector e0 = DoubleVector.broadcast(D, n[0]);
        final DoubleVector e1 = DoubleVector.broadcast(D, n[6]);
        final DoubleVector p01 = SIGN.mul(n[3]);
        final DoubleVector p10 = SIGN.mul(n[5]);
        final int lo = Math.min(s1, s2);
        final int hi = Math.max(s1, s2);
        for (int h = start; h < end; h += hi << 1) {
            for (int g = h; g < h + hi; g += lo << 1) {
                for (int k = g; k < g + lo; k += L) {
                    final DoubleVector v00 = DoubleVector.fromArray(D, psi, k);
                    final DoubleVector v01 = DoubleVector.fromArray(D, psi, k + s1);
                    final DoubleVector v10 = DoubleVector.fromArray(D, psi, k + s2);
                    final DoubleVector v11 = DoubleVector.fromArray(D, psi, k + s1 + s2);
                    final DoubleVector w00 = v01.fma(a01, v00.mul(a00));
                    final DoubleVector w01 = v01.fma(a11, v00.mul(a10));
                    final DoubleVector w10 = v11.fma(a01, v10.mul(a00));
                    final DoubleVector w11 = v11.fma(a11, v10.mul(a10));
                    w10.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                            .fma(p01, w00.mul(e0)).intoArray(psi, k);
                    w00.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                            .fma(p10, w10.mul(e1)).intoArray(psi, k + s2);
                    w11.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                            .fma(p01, w01.mul(e0)).intoArray(psi, k + s1);
                    w01.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                            .fma(p10, w11.mul(e1)).intoArray(psi, k + s1 + s2);
                }
            }
        }
    }

    private static void pairsCrossReal(double[] psi, int start, int end, int s1, double[] m,
            int s2, double[] n) {
        final DoubleVector d0 = DoubleVector.broadcast(D, m[0]);
        final DoubleVector d1 = DoubleVector.broadcast(D, m[6]);
        final DoubleVector o01 = SIGN.mul(m[3]);
        final DoubleVector o10 = SIGN.mul(m[5]);
        final DoubleVector b00 = DoubleVector.broadcast(D, n[0]);
        final DoubleVector b01 = DoubleVector.broadcast(D, n[2]);
        final DoubleVector b10 = DoubleVector.broadcast(D, n[4]);
        final DoubleVector b11 = DoubleVector.broadcast(D, n[6]);
        final int lo = Math.min(s1, s2);
        final int hi = Math.max(s1, s2);
        for (int h = start; h < end; h += hi << 1) {
            for (int g = h; g < h + hi; g += lo << 1) {
                for (int k = g; k < g + lo; k += L) {
                    final DoubleVector v00 = DoubleVector.fromArray(D, psi, k);
                    final DoubleVector v01 = DoubleVector.fromArray(D, psi, k + s1);
                    final DoubleVector v10 = DoubleVector.fromArray(D, psi, k + s2);
                    final DoubleVector v11 = DoubleVector.fromArray(D, psi, k + s1 + s2);
                    final DoubleVector w00 = v01.reinterpretAsLongs().rearrange(SWAP)
                            .reinterpretAsDoubles().fma(o01, v00.mul(d0));
                    final DoubleVector w01 = v00.reinterpretAsLongs().rearrange(SWAP)
                            .reinterpretAsDoubles().fma(o10, v01.mul(d1));
                    final DoubleVector w10 = v11.reinterpretAsLongs().rearrange(SWAP)
                            .reinterpretAsDoubles().fma(o01, v10.mul(d0));
                    final DoubleVector w11 = v10.reinterpretAsLongs().rearrange(SWAP)
                            .reinterpretAsDoubles().fma(o10, v11.mul(d1));
                    w10.fma(b01, w00.mul(b00)).intoArray(psi, k);
                    w10.fma(b11, w00.mul(b10)).intoArray(psi, k + s2);
                    w11.fma(b01, w01.mul(b00)).intoArray(psi, k + s1);
                    w11.fma(b11, w01.mul(b10)).intoArray(psi, k + s1 + s2);
                }
            }
        }
    }

    private static void pairsCrossCross(double[] psi, int start, int end, int s1, double[] m,
            int s2, double[] n) {
        final DoubleVector d0 = DoubleVector.broadcast(D, m[0]);
        final DoubleVector d1 = DoubleVector.broadcast(D, m[6]);
        final DoubleVector o01 = SIGN.mul(m[3]);
        final DoubleVector o10 = SIGN.mul(m[5]);
        final DoubleVector e0 = DoubleVector.broadcast(D, n[0]);
        final DoubleVector e1 = DoubleVector.broadcast(D, n[6]);
        final DoubleVector p01 = SIGN.mul(n[3]);
        final DoubleVector p10 = SIGN.mul(n[5]);
        final int lo = Math.min(s1, s2);
        final int hi = Math.max(s1, s2);
        for (int h = start; h < end; h += hi << 1) {
            for (int g = h; g < h + hi; g += lo << 1) {
                for (int k = g; k < g + lo; k += L) {
                    final DoubleVector v00 = DoubleVector.fromArray(D, psi, k);
                    final DoubleVector v01 = DoubleVector.fromArray(D, psi, k + s1);
                    final DoubleVector v10 = DoubleVector.fromArray(D, psi, k + s2);
                    final DoubleVector v11 = DoubleVector.fromArray(D, psi, k + s1 + s2);
                    final DoubleVector w00 = v01.reinterpretAsLongs().rearrange(SWAP)
                            .reinterpretAsDoubles().fma(o01, v00.mul(d0));
                    final DoubleVector w01 = v00.reinterpretAsLongs().rearrange(SWAP)
                            .reinterpretAsDoubles().fma(o10, v01.mul(d1));
                    final DoubleVector w10 = v11.reinterpretAsLongs().rearrange(SWAP)
                            .reinterpretAsDoubles().fma(o01, v10.mul(d0));
                    final DoubleVector w11 = v10.reinterpretAsLongs().rearrange(SWAP)
                            .reinterpretAsDoubles().fma(o10, v11.mul(d1));
                    w10.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                            .fma(p01, w00.mul(e0)).intoArray(psi, k);
                    w00.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                            .fma(p10, w10.mul(e1)).intoArray(psi, k + s2);
                    w11.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                            .fma(p01, w01.mul(e0)).intoArray(psi, k + s1);
                    w01.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                            .fma(p10, w11.mul(e1)).intoArray(psi, k + s1 + s2);
                }
            }
        }
    }

    private static void inRegisterReal(double[] psi, int start, int end, InRegister r,
            double[] m) {
        final DoubleVector ca = DoubleVector.fromArray(D, byMember(r, m[0], m[4], false), 0);
        final DoubleVector cb = DoubleVector.fromArray(D, byMember(r, m[2], m[6], false), 0);
        final VectorShuffle<Long> low = r.low;
        final VectorShuffle<Long> high = r.high;
        for (int x = start; x < end; x += L) {
            final DoubleVector w = DoubleVector.fromArray(D, psi, x);
            w.reinterpretAsLongs().rearrange(high).reinterpretAsDoubles()
                    .fma(cb, w.reinterpretAsLongs().rearrange(low).reinterpretAsDoubles().mul(ca))
                    .intoArray(psi, x);
        }
    }

    private static void inRegisterCross(double[] psi, int start, int end, InRegister r,
            double[] m) {
        final DoubleVector dd = DoubleVector.fromArray(D, byMember(r, m[0], m[6], false), 0);
        final DoubleVector oo = DoubleVector.fromArray(D, byMember(r, m[3], m[5], true), 0);
        final VectorShuffle<Long> ps = r.partnerSwapped;
        for (int x = start; x < end; x += L) {
            final DoubleVector w = DoubleVector.fromArray(D, psi, x);
            w.reinterpretAsLongs().rearrange(ps).reinterpretAsDoubles().fma(oo, w.mul(dd))
                    .intoArray(psi, x);
        }
    }

    private static void inRegisterComplex(double[] psi, int start, int end, InRegister r,
            double[] m) {
        final DoubleVector car = DoubleVector.fromArray(D, byMember(r, m[0], m[4], false), 0);
        final DoubleVector cai = DoubleVector.fromArray(D, byMember(r, m[1], m[5], true), 0);
        final DoubleVector cbr = DoubleVector.fromArray(D, byMember(r, m[2], m[6], false), 0);
        final DoubleVector cbi = DoubleVector.fromArray(D, byMember(r, m[3], m[7], true), 0);
        final VectorShuffle<Long> low = r.low;
        final VectorShuffle<Long> lowSwapped = r.lowSwapped;
        final VectorShuffle<Long> high = r.high;
        final VectorShuffle<Long> highSwapped = r.highSwapped;
        for (int x = start; x < end; x += L) {
            final DoubleVector w = DoubleVector.fromArray(D, psi, x);
            w.reinterpretAsLongs().rearrange(highSwapped).reinterpretAsDoubles().fma(cbi, w
                    .reinterpretAsLongs().rearrange(high).reinterpretAsDoubles().fma(cbr,
                    w.reinterpretAsLongs().rearrange(lowSwapped).reinterpretAsDoubles().fma(cai, w
                            .reinterpretAsLongs().rearrange(low).reinterpretAsDoubles().mul(car))))
                    .intoArray(psi, x);
        }
    }

    /**
     * {@link #pairs} with the complex formula, leaving lane i of every vector as it was where
     * {@code keep[i]} is false (low controls that are 0). Runs start on a vector.
     */
    static void pairsKeeping(double[] u, int uo, double[] v, int vo, int count, double[] m,
            boolean[] keep) {
        final int len = count << 1;
        final int bound = len & -L;
        final VectorMask<Double> k = VectorMask.fromArray(D, keep, 0);
        final DoubleVector m00r = DoubleVector.broadcast(D, m[0]);
        final DoubleVector m00i = SIGN.mul(m[1]);
        final DoubleVector m01r = DoubleVector.broadcast(D, m[2]);
        final DoubleVector m01i = SIGN.mul(m[3]);
        final DoubleVector m10r = DoubleVector.broadcast(D, m[4]);
        final DoubleVector m10i = SIGN.mul(m[5]);
        final DoubleVector m11r = DoubleVector.broadcast(D, m[6]);
        final DoubleVector m11i = SIGN.mul(m[7]);
        for (int x = 0; x < bound; x += L) {
            final DoubleVector a = DoubleVector.fromArray(D, u, uo + x);
            final DoubleVector c = DoubleVector.fromArray(D, v, vo + x);
            final DoubleVector as = a.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles();
            final DoubleVector cs = c.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles();
            a.blend(cs.fma(m01i, c.fma(m01r, as.fma(m00i, a.mul(m00r)))), k)
                    .intoArray(u, uo + x);
            c.blend(cs.fma(m11i, c.fma(m11r, as.fma(m10i, a.mul(m10r)))), k)
                    .intoArray(v, vo + x);
        }
        for (int x = bound; x < len; x += 2) {
            if (keep[x % L]) {
                pair(u, uo + x, v, vo + x, m, LaneKernels.COMPLEX);
            }
        }
    }

    /**
     * {@link #blocks} for a target inside the vector, with the complex formula, leaving lane i
     * of every vector as it was where {@code keep[i]} is false. Ranges start on a vector.
     */
    static void blocksKeeping(double[] psi, int start, int end, int q, double[] m,
            boolean[] keep) {
        final InRegister r = IN_REGISTER[q];
        final int bound = start + ((end - start) & -L);
        final VectorMask<Double> k = VectorMask.fromArray(D, keep, 0);
        final DoubleVector car = DoubleVector.fromArray(D, byMember(r, m[0], m[4], false), 0);
        final DoubleVector cai = DoubleVector.fromArray(D, byMember(r, m[1], m[5], true), 0);
        final DoubleVector cbr = DoubleVector.fromArray(D, byMember(r, m[2], m[6], false), 0);
        final DoubleVector cbi = DoubleVector.fromArray(D, byMember(r, m[3], m[7], true), 0);
        final VectorShuffle<Long> low = r.low;
        final VectorShuffle<Long> lowSwapped = r.lowSwapped;
        final VectorShuffle<Long> high = r.high;
        final VectorShuffle<Long> highSwapped = r.highSwapped;
        for (int x = start; x < bound; x += L) {
            final DoubleVector w = DoubleVector.fromArray(D, psi, x);
            w.blend(w.reinterpretAsLongs().rearrange(highSwapped).reinterpretAsDoubles().fma(cbi, w
                    .reinterpretAsLongs().rearrange(high).reinterpretAsDoubles().fma(cbr,
                    w.reinterpretAsLongs().rearrange(lowSwapped).reinterpretAsDoubles().fma(cai, w
                            .reinterpretAsLongs().rearrange(low).reinterpretAsDoubles()
                            .mul(car)))), k)
                    .intoArray(psi, x);
        }
        final int s2 = 2 << q;
        for (int x = bound; x < end; x += s2 << 1) {
            for (int j = 0; j < s2; j += 2) {
                if (keep[(x + j - start) % L]) {
                    // Both members of the pair share the control bits, so both keep or change.
                    pair(psi, x + j, psi, x + j + s2, m, LaneKernels.COMPLEX);
                }
            }
        }
    }

    /**
     * One pair by the formulas of the vector loops above, lane for lane: the same fused
     * multiply-adds in the same order, so an amplitude gets the same bits whichever loop reaches
     * it.
     */
    private static void pair(double[] u, int x, double[] v, int y, double[] m, int kind) {
        final double ar = u[x];
        final double ai = u[x + 1];
        final double br = v[y];
        final double bi = v[y + 1];
        if (kind == LaneKernels.REAL) {
            u[x] = Math.fma(br, m[2], ar * m[0]);
            u[x + 1] = Math.fma(bi, m[2], ai * m[0]);
            v[y] = Math.fma(br, m[6], ar * m[4]);
            v[y + 1] = Math.fma(bi, m[6], ai * m[4]);
        } else if (kind == LaneKernels.CROSS) {
            u[x] = Math.fma(bi, -m[3], ar * m[0]);
            u[x + 1] = Math.fma(br, m[3], ai * m[0]);
            v[y] = Math.fma(ai, -m[5], br * m[6]);
            v[y + 1] = Math.fma(ar, m[5], bi * m[6]);
        } else {
            u[x] = Math.fma(bi, -m[3], Math.fma(br, m[2], Math.fma(ai, -m[1], ar * m[0])));
            u[x + 1] = Math.fma(br, m[3], Math.fma(bi, m[2], Math.fma(ar, m[1], ai * m[0])));
            v[y] = Math.fma(bi, -m[7], Math.fma(br, m[6], Math.fma(ai, -m[5], ar * m[4])));
            v[y + 1] = Math.fma(br, m[7], Math.fma(bi, m[6], Math.fma(ar, m[5], ai * m[4])));
        }
    }

    // ---------------------------------------------------------------- phases

    /** See {@link LaneKernels#scale(double[], int, int, double, double)}. */
    static void scale(double[] psi, int from, int to, double dr, double di) {
        final DoubleVector r = DoubleVector.broadcast(D, dr);
        final DoubleVector i = SIGN.mul(di);
        int x = from;
        for (; x + L <= to; x += L) {
            final DoubleVector w = DoubleVector.fromArray(D, psi, x);
            w.mul(r).add(w.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles().mul(i))
                    .intoArray(psi, x);
        }
        for (; x < to; x += 2) {
            final double re = psi[x];
            final double im = psi[x + 1];
            psi[x] = dr * re - di * im;
            psi[x + 1] = dr * im + di * re;
        }
    }

    /** See {@link LaneKernels#scale(float[], int, int, double, double)}. */
    static void scale(float[] psi, int from, int to, double dr, double di) {
        final DoubleVector r = DoubleVector.broadcast(D, dr);
        final DoubleVector i = SIGN.mul(di);
        int x = from;
        for (; x + L <= to; x += L) {
            final DoubleVector w = VectorShapes.widen(psi, x);
            VectorShapes.narrow(w.mul(r).add(w.reinterpretAsLongs().rearrange(SWAP)
                    .reinterpretAsDoubles().mul(i)), psi, x);
        }
        for (; x < to; x += 2) {
            final double re = psi[x];
            final double im = psi[x + 1];
            psi[x] = (float) (dr * re - di * im);
            psi[x + 1] = (float) (dr * im + di * re);
        }
    }

    /** See {@link LaneKernels#scaleByTable(double[], int, double[], int)}. */
    static void scaleByExpanded(double[] psi, int off, double[] re2, double[] im2,
            int count) {
        final int len = count << 1;
        int j = 0;
        for (; j + L <= len; j += L) {
            final DoubleVector w = DoubleVector.fromArray(D, psi, off + j);
            w.mul(DoubleVector.fromArray(D, re2, j))
                    .add(w.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles()
                            .mul(DoubleVector.fromArray(D, im2, j)))
                    .intoArray(psi, off + j);
        }
        for (; j < len; j += 2) {
            final double re = psi[off + j];
            final double im = psi[off + j + 1];
            psi[off + j] = re * re2[j] + im * im2[j];
            psi[off + j + 1] = im * re2[j + 1] + re * im2[j + 1];
        }
    }

    static void scaleByTable(double[] psi, int off, double[] table, int count) {
        final int len = count << 1;
        int j = 0;
        for (; j + L <= len; j += L) {
            final DoubleVector t = DoubleVector.fromArray(D, table, j);
            final DoubleVector w = DoubleVector.fromArray(D, psi, off + j);
            w.mul(t.reinterpretAsLongs().rearrange(EVEN).reinterpretAsDoubles()).add(w
                    .reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles().mul(t
                    .reinterpretAsLongs().rearrange(ODD).reinterpretAsDoubles().mul(SIGN)))
                    .intoArray(psi, off + j);
        }
        for (; j < len; j += 2) {
            final double tr = table[j];
            final double ti = table[j + 1];
            final double re = psi[off + j];
            final double im = psi[off + j + 1];
            psi[off + j] = tr * re - ti * im;
            psi[off + j + 1] = tr * im + ti * re;
        }
    }

    /** See {@link LaneKernels#multiply(double[], int, double[], int)}. */
    static void multiply(double[] psi, int off, double[] f, int len) {
        int j = 0;
        for (; j + L <= len; j += L) {
            DoubleVector.fromArray(D, psi, off + j).mul(DoubleVector.fromArray(D, f, j))
                    .intoArray(psi, off + j);
        }
        for (; j < len; j++) {
            psi[off + j] *= f[j];
        }
    }

    /** See {@link LaneKernels#scaleByTable(float[], int, double[], int)}. */
    static void scaleByTable(float[] psi, int off, double[] table, int count) {
        final int len = count << 1;
        int j = 0;
        for (; j + L <= len; j += L) {
            final DoubleVector t = DoubleVector.fromArray(D, table, j);
            final DoubleVector w = VectorShapes.widen(psi, off + j);
            VectorShapes.narrow(w.mul(t.reinterpretAsLongs().rearrange(EVEN).reinterpretAsDoubles())
                    .add(w.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles().mul(t
                            .reinterpretAsLongs().rearrange(ODD).reinterpretAsDoubles()
                            .mul(SIGN))), psi, off + j);
        }
        for (; j < len; j += 2) {
            final double tr = table[j];
            final double ti = table[j + 1];
            final double re = psi[off + j];
            final double im = psi[off + j + 1];
            psi[off + j] = (float) (tr * re - ti * im);
            psi[off + j + 1] = (float) (tr * im + ti * re);
        }
    }

    /** See {@link LaneKernels#diagonalBlocks}. */
    static void diagonalBlocks(double[] psi, int start, int end, int q, double[] d) {
        final int s2 = 2 << q;
        final boolean skip0 = q > 0 && d[0] == 1 && d[1] == 0;
        if (s2 >= L) {
            for (int b = start; b < end; b += s2 << 1) {
                if (!skip0) {
                    scale(psi, b, b + s2, d[0], d[1]);
                }
                scale(psi, b + s2, b + (s2 << 1), d[2], d[3]);
            }
            return;
        }
        final InRegister r = IN_REGISTER[q];
        final DoubleVector cr = DoubleVector.fromArray(D, byMember(r, d[0], d[2], false), 0);
        final DoubleVector ci = DoubleVector.fromArray(D, byMember(r, d[1], d[3], true), 0);
        final VectorMask<Double> changed = skip0 ? VectorShapes.mask(r.upper) : null;
        int x = start;
        for (; x + L <= end; x += L) {
            final DoubleVector w = DoubleVector.fromArray(D, psi, x);
            final DoubleVector z = w.mul(cr)
                    .add(w.reinterpretAsLongs().rearrange(SWAP).reinterpretAsDoubles().mul(ci));
            (changed == null ? z : w.blend(z, changed)).intoArray(psi, x);
        }
        for (; x < end; x += s2 << 1) {
            if (!skip0) {
                scaleScalar(psi, x, x + s2, d[0], d[1]);
            }
            scaleScalar(psi, x + s2, x + (s2 << 1), d[2], d[3]);
        }
    }

    private static void scaleScalar(double[] psi, int from, int to, double dr, double di) {
        for (int x = from; x < to; x += 2) {
            final double re = psi[x];
            final double im = psi[x + 1];
            psi[x] = dr * re - di * im;
            psi[x + 1] = dr * im + di * re;
        }
    }

    // ---------------------------------------------------------------- moves

    /** See {@link LaneKernels#swapRuns}. */
    static void swapRuns(double[] u, int uo, double[] v, int vo, int count) {
        final int len = count << 1;
        int k = 0;
        for (; k + L <= len; k += L) {
            final DoubleVector a = DoubleVector.fromArray(D, u, uo + k);
            DoubleVector.fromArray(D, v, vo + k).intoArray(u, uo + k);
            a.intoArray(v, vo + k);
        }
        for (; k < len; k++) {
            final double t = u[uo + k];
            u[uo + k] = v[vo + k];
            v[vo + k] = t;
        }
    }

    /** See {@link LaneKernels#flipBlocks}. */
    static void flipBlocks(double[] psi, int start, int end, int q) {
        final int s2 = 2 << q;
        if (s2 >= L) {
            for (int b = start; b < end; b += s2 << 1) {
                swapRuns(psi, b, psi, b + s2, 1 << q);
            }
            return;
        }
        final VectorShuffle<Long> p = IN_REGISTER[q].partner;
        int x = start;
        for (; x + L <= end; x += L) {
            DoubleVector.fromArray(D, psi, x).reinterpretAsLongs().rearrange(p)
                    .reinterpretAsDoubles().intoArray(psi, x);
        }
        for (; x < end; x += s2 << 1) {
            for (int k = 0; k < s2; k++) {
                final double t = psi[x + k];
                psi[x + k] = psi[x + k + s2];
                psi[x + k + s2] = t;
            }
        }
    }

    /** See {@link LaneKernels#widen}. */
    static void widen(float[] f, int fo, double[] out, int at, int count) {
        final int len = count << 1;
        int k = 0;
        for (; k + L <= len; k += L) {
            VectorShapes.widen(f, fo + k).intoArray(out, at + k);
        }
        for (; k < len; k++) {
            out[at + k] = f[fo + k];
        }
    }

    /** See {@link LaneKernels#narrow}. */
    static void narrow(double[] in, int at, float[] f, int fo, int count) {
        final int len = count << 1;
        int k = 0;
        for (; k + L <= len; k += L) {
            VectorShapes.narrow(DoubleVector.fromArray(D, in, at + k), f, fo + k);
        }
        for (; k < len; k++) {
            f[fo + k] = (float) in[at + k];
        }
    }
}
