package dev.qsim.kernel;

/**
 * The amplitudes of a stabilizer state, built by projecting a basis state it contains onto the
 * stabilizer group: {@code |psi> ∝ Π_i (I + g_i)/2 |start>} (Gottesman 1997, "Stabilizer codes
 * and quantum error correction", thesis, arXiv:quant-ph/9705052, §3.2). Unchecked. Internal.
 */
public final class StabilizerStates {
    private StabilizerStates() {
    }

    /**
     * Projects basis state {@code start} onto the group of n generators {@code g_i = ±
     * i^{#Y} X^{xm_i} Z^{zm_i}} and normalises.
     *
     * @param n qubits, at most 20
     * @param xm x bits of each generator (bit j: qubit j)
     * @param zm z bits of each generator
     * @param minus whether each generator has sign -1
     * @param start a basis state with a non-zero amplitude in the state
     * @return the normalised amplitudes
     */
    public static Amplitudes project(int n, int[] xm, int[] zm, boolean[] minus, int start) {
        final int dim = 1 << n;
        double[] re = new double[dim];
        double[] im = new double[dim];
        double[] re2 = new double[dim];
        double[] im2 = new double[dim];
        re[start] = 1;
        for (int i = 0; i < n; i++) {
            final int x = xm[i];
            final int z = zm[i];
            final int sign = minus[i] ? 1 : 0;
            final int ys = Integer.bitCount(x & z) & 3;
            // g|k> = (-1)^(r + |z & k|) i^(#Y) |k ^ x>.
            for (int k = 0; k < dim; k++) {
                double a = re[k];
                double c = im[k];
                if (((Integer.bitCount(z & k) + sign) & 1) == 1) {
                    a = -a;
                    c = -c;
                }
                for (int y = 0; y < ys; y++) {
                    double t0 = a;
                    a = -c;
                    c = t0;
                }
                re2[k ^ x] = a;
                im2[k ^ x] = c;
            }
            for (int k = 0; k < dim; k++) {
                re[k] = 0.5 * (re[k] + re2[k]);
                im[k] = 0.5 * (im[k] + im2[k]);
            }
        }
        double norm = 0;
        for (int k = 0; k < dim; k++) {
            norm += re[k] * re[k] + im[k] * im[k];
        }
        final double scale = 1 / Math.sqrt(norm);
        Amplitudes amps = Amplitudes.allocate(n);
        for (int k = 0; k < dim; k++) {
            if (re[k] != 0 || im[k] != 0) {
                amps.set(k, re[k] * scale, im[k] * scale);
            }
        }
        return amps;
    }
}
