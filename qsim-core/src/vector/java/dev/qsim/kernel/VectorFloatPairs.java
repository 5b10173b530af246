package dev.qsim.kernel;

import static dev.qsim.kernel.VectorShapes.INTS;

import jdk.incubator.vector.FloatVector;
import jdk.incubator.vector.VectorShuffle;
import jdk.incubator.vector.VectorSpecies;

/**
 * Vector loops for a single-qubit gate on single-precision storage, in float lanes: a vector
 * holds twice the amplitudes of a double vector, and a gate costs half the arithmetic per
 * amplitude, which is what lets single precision run at the speed of its memory traffic (the
 * scalar loops widen every pair to double, which the processor cannot keep up with). The matrix
 * entries are rounded to float once; products and sums are rounded to float at each step, in the
 * order of the double loops of {@link VectorPairs}: within a few float roundings (about 1e-7
 * on amplitudes of size 1) of the scalar loop, which computes in double and rounds once.
 * Leftovers shorter than a vector run the same float operations in the same order, so every
 * element gets the same bits whichever loop reaches it, and the result does not depend on how
 * the work is split over threads. X moves floats without arithmetic. Internal.
 */
final class VectorFloatPairs {
    /** Floats: the shape of the double vectors, twice the lanes. */
    static final VectorSpecies<Float> S = VectorSpecies.of(float.class,
            VectorShapes.D.vectorShape());
    /** Floats per vector. */
    static final int L = S.length();
    private static final VectorShuffle<Integer> SWAP = VectorShuffle.fromOp(INTS, i -> i ^ 1);
    private static final FloatVector SIGN = alternating(-1, 1);

    /** Lane permutations for a target whose blocks fit in one vector (see VectorPairs). */
    private static final class InRegister {
        final VectorShuffle<Integer> low;
        final VectorShuffle<Integer> high;
        final VectorShuffle<Integer> lowSwapped;
        final VectorShuffle<Integer> highSwapped;
        final VectorShuffle<Integer> partner;
        final VectorShuffle<Integer> partnerSwapped;
        final boolean[] upper = new boolean[L];

        InRegister(int q) {
            final int s = 2 << q;
            low = VectorShuffle.fromOp(INTS, i -> i & ~s);
            high = VectorShuffle.fromOp(INTS, i -> i | s);
            lowSwapped = VectorShuffle.fromOp(INTS, i -> (i & ~s) ^ 1);
            highSwapped = VectorShuffle.fromOp(INTS, i -> (i | s) ^ 1);
            partner = VectorShuffle.fromOp(INTS, i -> i ^ s);
            partnerSwapped = VectorShuffle.fromOp(INTS, i -> i ^ s ^ 1);
            for (int i = 0; i < L; i++) {
                upper[i] = (i & s) != 0;
            }
        }
    }

    private static final InRegister[] IN_REGISTER =
            new InRegister[Integer.numberOfTrailingZeros(L) - 1];

    static {
        for (int q = 0; q < IN_REGISTER.length; q++) {
            IN_REGISTER[q] = new InRegister(q);
        }
    }

    /** Runs of 512 B to 8 KiB read ahead of themselves, as in {@link VectorPairs#AHEAD_MIN}. */
    private static final int AHEAD_MIN = 2 * VectorPairs.AHEAD_MIN;
    private static final int AHEAD_MAX = 2 * VectorPairs.AHEAD_MAX;
    /** Arrays of 16 MiB and more only, as {@link VectorPairs#AHEAD_ARRAY_MIN}. */
    private static final int AHEAD_ARRAY_MIN = 2 * VectorPairs.AHEAD_ARRAY_MIN;
    /** How far ahead, in array elements (8 KiB of floats). */
    private static final int AHEAD = 2048;
    /** Where the read-ahead values go, so that the compiler keeps the loads. */
    static volatile int sink;

    private VectorFloatPairs() {
    }

    /** Two cache lines from {@code p + AHEAD} (clamped to the array), folded into bits. */
    private static int ahead(float[] a, int p, int last) {
        return Float.floatToRawIntBits(a[Math.min(p + AHEAD, last)])
                ^ Float.floatToRawIntBits(a[Math.min(p + AHEAD + 16, last)]);
    }

    private static FloatVector alternating(float re, float im) {
        float[] v = new float[L];
        for (int i = 0; i < L; i += 2) {
            v[i] = re;
            v[i + 1] = im;
        }
        return FloatVector.fromArray(S, v, 0);
    }

    /** Per-lane entries as an array (see {@code VectorPairs.byMember}). */
    private static float[] byMember(InRegister r, double lo, double hi, boolean signed) {
        float[] v = new float[L];
        for (int i = 0; i < L; i++) {
            float x = (float) (r.upper[i] ? hi : lo);
            v[i] = signed && (i & 1) == 0 ? -x : x;
        }
        return v;
    }

    /** See {@link LaneKernels#pairs(float[], int, float[], int, int, double[], int)}. */
    static void pairs(float[] u, int uo, float[] v, int vo, int count, double[] m, int kind) {
        final int len = count << 1;
        final int bound = len & -L;
        if (bound > 0) {
            runs(u, uo, v, vo, bound, 1, 0, m, kind);
        }
        for (int k = bound; k < len; k += 2) {
            pair(u, uo + k, v, vo + k, m, kind);
        }
    }

    /** See {@link LaneKernels#blocks(float[], int, int, int, double[], int)}. */
    static void blocks(float[] psi, int start, int end, int q, double[] m, int kind) {
        final int s2 = 2 << q;
        if (s2 >= L) {
            runs(psi, start, psi, start + s2, s2, (end - start) / (s2 << 1), s2 << 1, m, kind);
            return;
        }
        final InRegister r = IN_REGISTER[q];
        final int bound = start + ((end - start) & -L);
        if (bound > start) {
            if (kind == LaneKernels.FLIP) {
                inRegisterFlip(psi, start, bound, r);
            } else if (kind == LaneKernels.REAL) {
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

    private static void runs(float[] u, int uo, float[] v, int vo, int len, int blocks,
            int stride, double[] m, int kind) {
        if (kind == LaneKernels.FLIP) {
            runsFlip(u, uo, v, vo, len, blocks, stride);
        } else if (kind == LaneKernels.REAL) {
            runsReal(u, uo, v, vo, len, blocks, stride, m);
        } else if (kind == LaneKernels.CROSS) {
            runsCross(u, uo, v, vo, len, blocks, stride, m);
        } else {
            runsComplex(u, uo, v, vo, len, blocks, stride, m);
        }
    }

    private static void runsFlip(float[] u, int uo, float[] v, int vo, int len, int blocks,
            int stride) {
        for (int b = 0; b < blocks; b++) {
            final int x0 = uo + b * stride;
            final int y0 = vo + b * stride;
            for (int k = 0; k < len; k += L) {
                final FloatVector a = FloatVector.fromArray(S, u, x0 + k);
                FloatVector.fromArray(S, v, y0 + k).intoArray(u, x0 + k);
                a.intoArray(v, y0 + k);
            }
        }
    }

    private static void runsReal(float[] u, int uo, float[] v, int vo, int len, int blocks,
            int stride, double[] m) {
        final FloatVector m00 = FloatVector.broadcast(S, (float) m[0]);
        final FloatVector m01 = FloatVector.broadcast(S, (float) m[2]);
        final FloatVector m10 = FloatVector.broadcast(S, (float) m[4]);
        final FloatVector m11 = FloatVector.broadcast(S, (float) m[6]);
        int touch = 0;
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
                final FloatVector a = FloatVector.fromArray(S, u, x0 + k);
                final FloatVector c = FloatVector.fromArray(S, v, y0 + k);
                a.mul(m00).add(c.mul(m01)).intoArray(u, x0 + k);
                a.mul(m10).add(c.mul(m11)).intoArray(v, y0 + k);
            }
        }
        sink = touch;
    }

    private static void runsCross(float[] u, int uo, float[] v, int vo, int len, int blocks,
            int stride, double[] m) {
        final FloatVector d0 = FloatVector.broadcast(S, (float) m[0]);
        final FloatVector d1 = FloatVector.broadcast(S, (float) m[6]);
        final FloatVector o01 = SIGN.mul((float) m[3]);
        final FloatVector o10 = SIGN.mul((float) m[5]);
        int touch = 0;
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
                final FloatVector a = FloatVector.fromArray(S, u, x0 + k);
                final FloatVector c = FloatVector.fromArray(S, v, y0 + k);
                a.mul(d0).add(c.reinterpretAsInts().rearrange(SWAP).reinterpretAsFloats().mul(o01))
                        .intoArray(u, x0 + k);
                c.mul(d1).add(a.reinterpretAsInts().rearrange(SWAP).reinterpretAsFloats().mul(o10))
                        .intoArray(v, y0 + k);
            }
        }
        sink = touch;
    }

    private static void runsComplex(float[] u, int uo, float[] v, int vo, int len, int blocks,
            int stride, double[] m) {
        final FloatVector m00r = FloatVector.broadcast(S, (float) m[0]);
        final FloatVector m00i = SIGN.mul((float) m[1]);
        final FloatVector m01r = FloatVector.broadcast(S, (float) m[2]);
        final FloatVector m01i = SIGN.mul((float) m[3]);
        final FloatVector m10r = FloatVector.broadcast(S, (float) m[4]);
        final FloatVector m10i = SIGN.mul((float) m[5]);
        final FloatVector m11r = FloatVector.broadcast(S, (float) m[6]);
        final FloatVector m11i = SIGN.mul((float) m[7]);
        int touch = 0;
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
                final FloatVector a = FloatVector.fromArray(S, u, x0 + k);
                final FloatVector c = FloatVector.fromArray(S, v, y0 + k);
                final FloatVector as = a.reinterpretAsInts().rearrange(SWAP).reinterpretAsFloats();
                final FloatVector cs = c.reinterpretAsInts().rearrange(SWAP).reinterpretAsFloats();
                a.mul(m00r).add(as.mul(m00i)).add(c.mul(m01r)).add(cs.mul(m01i))
                        .intoArray(u, x0 + k);
                a.mul(m10r).add(as.mul(m10i)).add(c.mul(m11r)).add(cs.mul(m11i))
                        .intoArray(v, y0 + k);
            }
        }
        sink = touch;
    }

    private static void inRegisterFlip(float[] psi, int start, int end, InRegister r) {
        final VectorShuffle<Integer> p = r.partner;
        for (int x = start; x < end; x += L) {
            FloatVector.fromArray(S, psi, x).reinterpretAsInts().rearrange(p).reinterpretAsFloats()
                    .intoArray(psi, x);
        }
    }

    private static void inRegisterReal(float[] psi, int start, int end, InRegister r,
            double[] m) {
        final FloatVector ca = FloatVector.fromArray(S, byMember(r, m[0], m[4], false), 0);
        final FloatVector cb = FloatVector.fromArray(S, byMember(r, m[2], m[6], false), 0);
        final VectorShuffle<Integer> low = r.low;
        final VectorShuffle<Integer> high = r.high;
        for (int x = start; x < end; x += L) {
            final FloatVector w = FloatVector.fromArray(S, psi, x);
            w.reinterpretAsInts().rearrange(low).reinterpretAsFloats().mul(ca)
                    .add(w.reinterpretAsInts().rearrange(high).reinterpretAsFloats().mul(cb))
                    .intoArray(psi, x);
        }
    }

    private static void inRegisterCross(float[] psi, int start, int end, InRegister r,
            double[] m) {
        final FloatVector dd = FloatVector.fromArray(S, byMember(r, m[0], m[6], false), 0);
        final FloatVector oo = FloatVector.fromArray(S, byMember(r, m[3], m[5], true), 0);
        final VectorShuffle<Integer> ps = r.partnerSwapped;
        for (int x = start; x < end; x += L) {
            final FloatVector w = FloatVector.fromArray(S, psi, x);
            w.mul(dd).add(w.reinterpretAsInts().rearrange(ps).reinterpretAsFloats().mul(oo))
                    .intoArray(psi, x);
        }
    }

    private static void inRegisterComplex(float[] psi, int start, int end, InRegister r,
            double[] m) {
        final FloatVector car = FloatVector.fromArray(S, byMember(r, m[0], m[4], false), 0);
        final FloatVector cai = FloatVector.fromArray(S, byMember(r, m[1], m[5], true), 0);
        final FloatVector cbr = FloatVector.fromArray(S, byMember(r, m[2], m[6], false), 0);
        final FloatVector cbi = FloatVector.fromArray(S, byMember(r, m[3], m[7], true), 0);
        final VectorShuffle<Integer> low = r.low;
        final VectorShuffle<Integer> lowSwapped = r.lowSwapped;
        final VectorShuffle<Integer> high = r.high;
        final VectorShuffle<Integer> highSwapped = r.highSwapped;
        for (int x = start; x < end; x += L) {
            final FloatVector w = FloatVector.fromArray(S, psi, x);
            w.reinterpretAsInts().rearrange(low).reinterpretAsFloats().mul(car).add(w
                    .reinterpretAsInts().rearrange(lowSwapped).reinterpretAsFloats().mul(cai))
                    .add(w.reinterpretAsInts().rearrange(high).reinterpretAsFloats().mul(cbr)).add(w
                            .reinterpretAsInts().rearrange(highSwapped).reinterpretAsFloats()
                            .mul(cbi))
                    .intoArray(psi, x);
        }
    }

    /** One pair with the lanes' float operations, in their order. */
    private static void pair(float[] u, int x, float[] v, int y, double[] m, int kind) {
        final float ar = u[x];
        final float ai = u[x + 1];
        final float br = v[y];
        final float bi = v[y + 1];
        if (kind == LaneKernels.FLIP) {
            u[x] = br;
            u[x + 1] = bi;
            v[y] = ar;
            v[y + 1] = ai;
        } else if (kind == LaneKernels.REAL) {
            final float m00 = (float) m[0];
            final float m01 = (float) m[2];
            final float m10 = (float) m[4];
            final float m11 = (float) m[6];
            u[x] = ar * m00 + br * m01;
            u[x + 1] = ai * m00 + bi * m01;
            v[y] = ar * m10 + br * m11;
            v[y + 1] = ai * m10 + bi * m11;
        } else if (kind == LaneKernels.CROSS) {
            final float d0 = (float) m[0];
            final float o01 = (float) m[3];
            final float o10 = (float) m[5];
            final float d1 = (float) m[6];
            u[x] = ar * d0 + bi * -o01;
            u[x + 1] = ai * d0 + br * o01;
            v[y] = br * d1 + ai * -o10;
            v[y + 1] = bi * d1 + ar * o10;
        } else {
            final float m00r = (float) m[0];
            final float m00i = (float) m[1];
            final float m01r = (float) m[2];
            final float m01i = (float) m[3];
            final float m10r = (float) m[4];
            final float m10i = (float) m[5];
            final float m11r = (float) m[6];
            final float m11i = (float) m[7];
            u[x] = ar * m00r + ai * -m00i + br * m01r + bi * -m01i;
            u[x + 1] = ai * m00r + ar * m00i + bi * m01r + br * m01i;
            v[y] = ar * m10r + ai * -m10i + br * m11r + bi * -m11i;
            v[y + 1] = ai * m10r + ar * m10i + bi * m11r + br * m11i;
        }
    }
}
