package dev.qsim.kernel;

import java.util.List;

/**
 * Measurement and reset of one qubit in the computational basis, in place, with the lazy frame
 * left pending: a flipped qubit reads the stored bit negated, and the projection goes through
 * the gate path like any diagonal gate. Results do not depend on the thread count. Internal.
 */
public final class Measurement {
    private static final int[] NONE = new int[0];

    private Measurement() {
    }

    /**
     * Returns the probability that qubit {@code q} reads 1 (clamped to [0, 1]).
     *
     * @param a the state. Not modified.
     * @param q the qubit; unchecked
     * @param threads threads to use
     * @return the probability
     */
    public static double probabilityOfOne(Amplitudes a, int q, int threads) {
        double stored = Reductions.probabilityWhere(a, q, threads);
        // A flipped qubit (lazy X) reads 1 where its stored bit is 0.
        return Math.min(1, Math.max(0, Frame.flipped(a, q) ? 1 - stored : stored));
    }

    /**
     * Measures qubit {@code q}: outcome 1 when {@code u} is below its probability of reading 1,
     * then projects and renormalises (Nielsen and Chuang 2010, §2.2.3, postulate 3).
     *
     * @param a the state. Modified.
     * @param q the qubit; unchecked
     * @param u a uniform number in [0, 1)
     * @param threads threads to use
     * @return the outcome, 0 or 1
     */
    public static int measure(Amplitudes a, int q, double u, int threads) {
        double p1 = probabilityOfOne(a, q, threads);
        int outcome = u < p1 ? 1 : 0;
        project(a, q, outcome, outcome == 1 ? p1 : 1 - p1, threads);
        return outcome;
    }

    /**
     * Projects qubit {@code q} onto {@code outcome} and divides by the square root of that
     * outcome's probability.
     *
     * @param a the state. Modified.
     * @param q the qubit; unchecked
     * @param outcome 0 or 1
     * @param probability the outcome's probability, positive
     * @param threads threads to use
     */
    public static void project(Amplitudes a, int q, int outcome, double probability,
            int threads) {
        double s = 1 / Math.sqrt(probability);
        double[] diag = outcome == 1 ? new double[] {0, 0, s, 0} : new double[] {s, 0, 0, 0};
        Frame.apply(a, List.of(new GateOp(GateOp.DIAGONAL, new int[] {q}, NONE, diag, null)),
                threads);
    }

    /**
     * Resets qubit {@code q} to 0: measures it with {@code u}, then flips it if it read 1.
     *
     * @param a the state. Modified.
     * @param q the qubit; unchecked
     * @param u a uniform number in [0, 1)
     * @param threads threads to use
     * @return the outcome the measurement gave before the flip
     */
    public static int reset(Amplitudes a, int q, double u, int threads) {
        int outcome = measure(a, q, u, threads);
        if (outcome == 1) {
            flip(a, q, threads);
        }
        return outcome;
    }

    /**
     * Applies X to qubit {@code q} (a frame update, no pass over the state).
     *
     * @param a the state. Modified.
     * @param q the qubit; unchecked
     * @param threads threads to use
     */
    public static void flip(Amplitudes a, int q, int threads) {
        Frame.apply(a, List.of(Frame.xOp(q)), threads);
    }
}
