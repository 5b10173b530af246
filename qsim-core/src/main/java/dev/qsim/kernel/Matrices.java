package dev.qsim.kernel;

import java.util.List;

/**
 * Dense matrices of gate lists, for small registers: column {@code j} is the state the gates
 * make from basis state {@code j}. Internal.
 */
public final class Matrices {
    private Matrices() {
    }

    /**
     * Returns the {@code 2^n x 2^n} matrix of a list of gates, row-major, re/im interleaved.
     * Unchecked: {@code n} is small enough for the matrix to fit an array (at most 12).
     *
     * @param n qubits
     * @param ops the gates, in order
     * @return the matrix
     */
    public static double[] ofGates(int n, List<GateOp> ops) {
        int d = 1 << n;
        double[] m = new double[2 * d * d];
        Amplitudes a = Amplitudes.allocate(n);
        for (int col = 0; col < d; col++) {
            a.clear();
            a.chunks[0][2 * col] = 1;
            Frame.apply(a, ops, 1);
            Frame.settle(a, 1);
            double[] c = a.chunks[0];
            for (int row = 0; row < d; row++) {
                m[2 * (row * d + col)] = c[2 * row];
                m[2 * (row * d + col) + 1] = c[2 * row + 1];
            }
        }
        return m;
    }
}
