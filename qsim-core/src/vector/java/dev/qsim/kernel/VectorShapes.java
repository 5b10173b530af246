package dev.qsim.kernel;

import jdk.incubator.vector.DoubleVector;
import jdk.incubator.vector.FloatVector;
import jdk.incubator.vector.VectorMask;
import jdk.incubator.vector.VectorOperators;
import jdk.incubator.vector.VectorShape;
import jdk.incubator.vector.VectorShuffle;
import jdk.incubator.vector.VectorSpecies;

/**
 * The vector shape every vector kernel uses, and the lane patterns they share. A double vector
 * of the processor's preferred size holds {@code 2^AMP_LOG} amplitudes, re/im interleaved; single
 * precision loads a float vector of as many lanes and widens it to one double vector, so the
 * float loops run the double arithmetic of their scalar counterparts. Internal.
 */
final class VectorShapes {
    /** Doubles: the preferred species (512 bits with AVX-512, 256 with AVX2). */
    static final VectorSpecies<Double> D = DoubleVector.SPECIES_PREFERRED;
    /** Doubles per vector. */
    static final int L = D.length();
    /** Floats, as many lanes as {@link #D}: half its bits. */
    static final VectorSpecies<Float> F = L >= 2
            ? VectorSpecies.of(float.class, VectorShape.forBitSize(D.vectorBitSize() / 2)) : null;
    /**
     * Longs of the shape of {@link #D}. Every lane permutation of a double vector is made on its
     * bits viewed as long lanes, with {@code p} a long shuffle:
     * {@code v.reinterpretAsLongs().rearrange(p).reinterpretAsDoubles()}. The same lanes move,
     * but JDK 17 checks a double shuffle's indexes at every use by converting it to doubles and
     * comparing, a cost the long shuffle does not have. Measured (one thread, JDK 17.0.15,
     * 512-bit vectors): a dense complex gate in cache, 2^14 amplitudes, targets 8 and 12,
     * 0.211-0.225 ns an amplitude with the double shuffle against 0.172-0.185 with the long one
     * (three JVMs each; Temurin 25.0.3 the same either way); through {@code GateRate}, 16 qubits
     * 117-127 GB/s before and 134-148 after, targets 0-2 35 GB/s before and 134-143 after. The
     * expression is written out at each use: in a helper method it was not always inlined into
     * the larger loops, and a vector passed to a call that is not inlined is boxed on JDK 17
     * (the 20-layer 24-qubit circuit took 4.4 to 6.2 s instead of 2.5).
     */
    static final VectorSpecies<Long> LONGS = L >= 2
            ? VectorSpecies.of(long.class, D.vectorShape()) : null;
    /** Ints of the shape of {@link #D}: lane permutations of float vectors, as {@link #LONGS}. */
    static final VectorSpecies<Integer> INTS = L >= 2
            ? VectorSpecies.of(int.class, D.vectorShape()) : null;
    /** Log2 of the amplitudes per vector. */
    static final int AMP_LOG = Integer.numberOfTrailingZeros(L) - 1;
    /** Lane i takes lane i ^ 1: the parts of each amplitude exchanged. */
    static final VectorShuffle<Long> SWAP = L >= 2 ? xor(1) : null;
    /** -1 on real lanes, +1 on imaginary lanes. */
    static final DoubleVector SIGN = L >= 2 ? alternating(-1, 1) : null;
    /** Lane i takes lane i & ~1: each amplitude's real part in both lanes. */
    static final VectorShuffle<Long> EVEN = L >= 2 ? VectorShuffle.fromOp(LONGS, i -> i & ~1)
            : null;
    /** Lane i takes lane i | 1: each amplitude's imaginary part in both lanes. */
    static final VectorShuffle<Long> ODD = L >= 2 ? VectorShuffle.fromOp(LONGS, i -> i | 1) : null;

    private VectorShapes() {
    }

    /** The shuffle that makes lane i take lane {@code i ^ x}. */
    static VectorShuffle<Long> xor(int x) {
        return VectorShuffle.fromOp(LONGS, i -> i ^ x);
    }

    /** A shuffle from a table of source lanes. */
    static VectorShuffle<Long> shuffle(int[] source) {
        return VectorShuffle.fromArray(LONGS, source, 0);
    }

    /** A mask from a table of lanes. */
    static VectorMask<Double> mask(boolean[] lanes) {
        return VectorMask.fromArray(D, lanes, 0);
    }

    /** {@code re} on real lanes, {@code im} on imaginary lanes. */
    static DoubleVector alternating(double re, double im) {
        double[] v = new double[L];
        for (int i = 0; i < L; i += 2) {
            v[i] = re;
            v[i + 1] = im;
        }
        return DoubleVector.fromArray(D, v, 0);
    }

    /** A vector from a table of lanes. */
    static DoubleVector of(double[] lanes) {
        return DoubleVector.fromArray(D, lanes, 0);
    }

    /** {@code L} floats from {@code f[off]}, widened exactly. */
    static DoubleVector widen(float[] f, int off) {
        return (DoubleVector) FloatVector.fromArray(F, f, off)
                .convertShape(VectorOperators.F2D, D, 0);
    }

    /** {@code v} rounded to float lanes, written at {@code f[off]}. */
    static void narrow(DoubleVector v, float[] f, int off) {
        ((FloatVector) v.convertShape(VectorOperators.D2F, F, 0)).intoArray(f, off);
    }

    /** Whether the processor has vectors of two doubles or more. */
    static boolean usable() {
        return L >= 2 && F != null;
    }
}
