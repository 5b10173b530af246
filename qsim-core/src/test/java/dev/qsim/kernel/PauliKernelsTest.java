package dev.qsim.kernel;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;


/**
 * The Pauli loops on storage split into many small chunks, so flips that cross chunks are
 * exercised (public states of up to 26 qubits are one chunk). Reference: the definition
 * {@code X^x Z^z |j> = (-1)^{|j∧z|} |j⊕x>} evaluated on plain arrays.
 */
class PauliKernelsTest {

    private static Amplitudes smallChunks(int n, int chunkLog) {
        return Amplitudes.allocate(n, chunkLog);
    }

    @Test
    void innerAndAccumulateAcrossChunks() {
        long seed = 4242L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int n = 7;
        int d = 1 << n;
        for (int chunkLog : new int[] {1, 2, 4, 7}) {
            Amplitudes bra = smallChunks(n, chunkLog);
            Amplitudes ket = smallChunks(n, chunkLog);
            double[] br = new double[d];
            double[] bi = new double[d];
            double[] kr = new double[d];
            double[] ki = new double[d];
            for (int j = 0; j < d; j++) {
                br[j] = rng.nextDouble() - 0.5;
                bi[j] = rng.nextDouble() - 0.5;
                kr[j] = rng.nextDouble() - 0.5;
                ki[j] = rng.nextDouble() - 0.5;
                bra.set(j, br[j], bi[j]);
                ket.set(j, kr[j], ki[j]);
            }
            for (int trial = 0; trial < 20; trial++) {
                long x = rng.nextInt(d);
                long z = rng.nextInt(d);
                double sr = 0;
                double si = 0;
                for (int j = 0; j < d; j++) {
                    int f = (int) (j ^ x);
                    double sign = (Long.bitCount(j & z) & 1) == 0 ? 1 : -1;
                    sr += sign * (br[f] * kr[j] + bi[f] * ki[j]);
                    si += sign * (br[f] * ki[j] - bi[f] * kr[j]);
                }
                double[] v = PauliKernels.inner(bra, ket, x, z, 2);
                String why = "seed " + seed + ", chunkLog " + chunkLog + ", x " + x + ", z " + z;
                assertEquals(sr, v[0], 1e-12, why);
                assertEquals(si, v[1], 1e-12, why);

                Amplitudes out = smallChunks(n, chunkLog);
                PauliKernels.accumulate(out, ket, x, z, 0.5, -0.25, 2);
                for (int j = 0; j < d; j++) {
                    int f = (int) (j ^ x);
                    double sign = (Long.bitCount(j & z) & 1) == 0 ? 1 : -1;
                    double er = sign * (0.5 * kr[j] + 0.25 * ki[j]);
                    double ei = sign * (0.5 * ki[j] - 0.25 * kr[j]);
                    assertEquals(er, out.re(f), 1e-15, why);
                    assertEquals(ei, out.im(f), 1e-15, why);
                }
            }
        }
    }
}
