package dev.qsim.kernel;

/**
 * A gate prepared for one state: its index layout and kernel chosen once. The work is
 * {@link #units()} independent units; {@link #run(long, long)} does a range of them, so
 * ranges may go to different threads. Internal.
 *
 * <p>One kernel per gate shape, chosen once per instruction: dense single-qubit
 * ({@link DenseSingleQubitKernels}), dense k-qubit ({@link DenseKernels}), diagonal (phases only,
 * {@link DiagonalKernels}) and monomial (permutation with phases, {@link PermutationKernels}),
 * each with optional control qubits that restrict the work to the subspace where every control
 * is 1. Every kernel is element-wise over independent groups of amplitudes, so its result does
 * not depend on the thread count. Method: M. Smelyanskiy, N. P. D. Sawaya, A. Aspuru-Guzik,
 * "qHiPSTER: the quantum high performance software testing environment", arXiv:1601.07195
 * (2016), §3 (pairwise amplitude updates with strided indexing).
 */
abstract class Plan {
    final Amplitudes a;

    Plan(Amplitudes a) {
        if (a.chunks == null) {
            throw new IllegalStateException("the kernels work on double storage; single"
                    + " precision goes through Windows");
        }
        this.a = a;
    }

    /**
     * Returns the number of independent work units.
     *
     * @return the unit count
     */
    abstract long units();

    /**
     * Does the units {@code [from, to)}.
     *
     * @param from first unit
     * @param to end unit, exclusive
     */
    abstract void run(long from, long to);

    /**
     * Returns the number of units in each aligned block of {@code 2^blockLog} amplitudes
     * when every qubit the gate touches is below {@code blockLog} (units are then ordered
     * block by block), or -1 when the gate reaches a qubit at or above it.
     *
     * @param blockLog log2 of the block size, at most the chunk log
     * @return units per block, or -1
     */
    abstract long unitsPerBlock(int blockLog);

    /**
     * Applies the whole gate.
     *
     * @param threads threads to use
     */
    void apply(int threads) {
        Parallel.forRange(threads, units(), parallel(a), this::run);
    }

    /**
     * Applies several gates whose qubits are all below {@code blockLog}, block by block: each
     * block of {@code 2^blockLog} amplitudes gets every gate in order while it sits in cache, so
     * the state is streamed once for the group. Same result as applying them one by one.
     *
     * @param a amplitudes. Modified.
     * @param plans plans for {@code a}, each with {@code unitsPerBlock(blockLog) > 0}
     * @param blockLog log2 of the block size, at most the chunk log
     * @param threads threads to use
     */
    static void applyBlocked(Amplitudes a, Plan[] plans, int blockLog, int threads) {
        final long[] per = new long[plans.length];
        for (int i = 0; i < plans.length; i++) {
            per[i] = plans[i].unitsPerBlock(blockLog);
        }
        Parallel.forRange(threads, 1L << (a.n - blockLog), parallel(a), (from, to) -> {
            for (long b = from; b < to; b++) {
                for (int i = 0; i < plans.length; i++) {
                    plans[i].run(b * per[i], (b + 1) * per[i]);
                }
            }
        });
    }

    private static boolean parallel(Amplitudes a) {
        return a.n >= Parallel.MIN_PARALLEL_QUBITS;
    }
}
