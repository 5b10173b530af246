package dev.qsim.kernel;

/**
 * The vector kernels: {@link LaneKernels} on the incubating Vector API, in the processor's
 * preferred vector size. Loaded by {@link Lanes} through reflection, only when the module
 * {@code jdk.incubator.vector} is present; compiled from {@code src/vector/java}, apart from the
 * rest of the library, because the compiler warns about every use of an incubating module.
 * Internal.
 */
final class VectorLaneKernels extends LaneKernels {
    /**
     * Creates the kernels.
     *
     * @throws UnsupportedOperationException if the processor has no vectors of two doubles
     */
    VectorLaneKernels() {
        if (!VectorShapes.usable()) {
            throw new UnsupportedOperationException("the preferred vector holds "
                    + VectorShapes.L + " double(s); the kernels need 2 or more");
        }
    }

    @Override
    int amplitudeLog() {
        return VectorShapes.AMP_LOG;
    }

    @Override
    String describe() {
        return VectorShapes.D.vectorBitSize() + "-bit vectors: " + VectorShapes.L
                + " double lanes, " + VectorFloatPairs.L + " float lanes";
    }

    @Override
    void pairs(double[] u, int uo, double[] v, int vo, int count, double[] m, int kind) {
        VectorPairs.pairs(u, uo, v, vo, count, m, kind);
    }

    @Override
    void blocks(double[] psi, int start, int end, int q, double[] m, int kind) {
        VectorPairs.blocks(psi, start, end, q, m, kind);
    }

    @Override
    void pairBlocks(double[] psi, int start, int end, int q1, double[] m1, int kind1, int q2,
            double[] m2, int kind2) {
        VectorPairs.pairBlocks(psi, start, end, q1, m1, kind1, q2, m2, kind2);
    }

    @Override
    void pairs(float[] u, int uo, float[] v, int vo, int count, double[] m, int kind) {
        VectorFloatPairs.pairs(u, uo, v, vo, count, m, kind);
    }

    @Override
    void blocks(float[] psi, int start, int end, int q, double[] m, int kind) {
        VectorFloatPairs.blocks(psi, start, end, q, m, kind);
    }

    @Override
    Plan dense(Amplitudes a, int[] targets, int[] controls, double[] m) {
        return VectorGatePlans.dense(a, targets, controls, m);
    }

    @Override
    Plan diagonal(Amplitudes a, int[] targets, int[] controls, double[] diag) {
        return VectorGatePlans.diagonal(a, targets, controls, diag);
    }

    @Override
    Plan controlledFlip(Amplitudes a, int target, int[] controls) {
        return VectorGatePlans.controlledFlip(a, target, controls);
    }

    @Override
    void scale(double[] psi, int from, int to, double dr, double di) {
        VectorPairs.scale(psi, from, to, dr, di);
    }

    @Override
    void scale(float[] psi, int from, int to, double dr, double di) {
        VectorPairs.scale(psi, from, to, dr, di);
    }

    @Override
    void scaleByTable(double[] psi, int off, double[] table, int count) {
        VectorPairs.scaleByTable(psi, off, table, count);
    }

    @Override
    void scaleByExpanded(double[] psi, int off, double[] re2, double[] im2, int count) {
        VectorPairs.scaleByExpanded(psi, off, re2, im2, count);
    }

    @Override
    void multiply(double[] psi, int off, double[] f, int len) {
        VectorPairs.multiply(psi, off, f, len);
    }

    @Override
    void scaleByTable(float[] psi, int off, double[] table, int count) {
        VectorPairs.scaleByTable(psi, off, table, count);
    }

    @Override
    void diagonalBlocks(double[] psi, int start, int end, int q, double[] d) {
        VectorPairs.diagonalBlocks(psi, start, end, q, d);
    }

    @Override
    void swapRuns(double[] u, int uo, double[] v, int vo, int count) {
        VectorPairs.swapRuns(u, uo, v, vo, count);
    }

    @Override
    void flipBlocks(double[] psi, int start, int end, int q) {
        VectorPairs.flipBlocks(psi, start, end, q);
    }

    @Override
    void widen(float[] f, int fo, double[] out, int at, int count) {
        VectorPairs.widen(f, fo, out, at, count);
    }

    @Override
    void narrow(double[] in, int at, float[] f, int fo, int count) {
        VectorPairs.narrow(in, at, f, fo, count);
    }

    @Override
    double sumSquares(double[] psi, int from, int to) {
        return VectorSums.sumSquares(psi, from, to);
    }

    @Override
    void squares(double[] psi, int from, int to, double[] out, int at) {
        VectorSums.squares(psi, from, to, out, at);
    }

    @Override
    void innerSums(double[] u, int uo, double[] v, int vo, int count, double[] out) {
        VectorSums.innerSums(u, uo, v, vo, count, out);
    }

    @Override
    void pauliInner(double[] k, double[] b, int start, int end, int xLow, int zLow,
            double[] out) {
        VectorSums.pauliInner(k, b, start, end, xLow, zLow, out);
    }

    @Override
    void pauliAccumulate(double[] src, double[] dst, int start, int end, int xLow, int zLow,
            double ar, double ai) {
        VectorSums.pauliAccumulate(src, dst, start, end, xLow, zLow, ar, ai);
    }
}
