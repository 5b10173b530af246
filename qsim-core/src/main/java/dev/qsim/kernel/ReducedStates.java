package dev.qsim.kernel;

import java.util.Arrays;

/**
 * The reduced density matrix of a few qubits of a pure state, {@code R[x][y] = Σ psi(x, rest)
 * conj(psi(y, rest))} over the other qubits (Nielsen and Chuang 2010, §2.4.3): what a
 * trajectory needs to choose a Kraus branch with probability {@code Tr(K† K R)}. Reads settle
 * the lazy frame first. Unchecked: callers validate. Internal.
 */
public final class ReducedStates {
    private ReducedStates() {
    }

    /**
     * Writes the reduced density matrix of {@code qubits} into {@code work}: entry (x, y) at
     * {@code 2 (x·d + y)}, re/im interleaved, {@code d = 2^k}; bit {@code j} of x is
     * {@code qubits[j]}.
     *
     * @param a the state, double precision. Not modified (its frame is settled).
     * @param qubits k distinct qubits, k small
     * @param work at least {@code 2·4^k} doubles. Modified.
     */
    public static void of(Amplitudes a, int[] qubits, double[] work) {
        a.settle();
        int d = 1 << qubits.length;
        Arrays.fill(work, 0, 2 * d * d, 0.0);
        if (qubits.length == 1 && a.chunks.length == 1) {
            oneQubitReduced(a.chunks[0], a.n, qubits[0], work);
        } else {
            generalReduced(a, qubits, work);
        }
    }

    /** The 2 x 2 reduced density matrix of qubit q of a single-chunk state, into work. */
    private static void oneQubitReduced(double[] c, int n, int q, double[] work) {
        int stride = 1 << q;
        int dim = 1 << n;
        double r00 = 0;
        double r11 = 0;
        double r01re = 0;
        double r01im = 0;
        for (int base = 0; base < dim; base += 2 * stride) {
            for (int i0 = base; i0 < base + stride; i0++) {
                int o0 = i0 << 1;
                int o1 = (i0 + stride) << 1;
                double a0 = c[o0];
                double b0 = c[o0 + 1];
                double a1 = c[o1];
                double b1 = c[o1 + 1];
                r00 += a0 * a0 + b0 * b0;
                r11 += a1 * a1 + b1 * b1;
                // psi0 conj(psi1)
                r01re += a0 * a1 + b0 * b1;
                r01im += b0 * a1 - a0 * b1;
            }
        }
        work[0] = r00;
        work[2] = r01re;
        work[3] = r01im;
        work[4] = r01re;
        work[5] = -r01im;
        work[6] = r11;
    }

    /** The reduced density matrix of any qubits of any state, into work. */
    private static void generalReduced(Amplitudes a, int[] qubits, double[] work) {
        int k = qubits.length;
        int d = 1 << k;
        long[] offset = new long[d];
        for (int x = 0; x < d; x++) {
            long o = 0;
            for (int j = 0; j < k; j++) {
                o |= (long) ((x >>> j) & 1) << qubits[j];
            }
            offset[x] = o;
        }
        int[] sorted = qubits.clone();
        Arrays.sort(sorted);
        double[][] chunks = a.chunks;
        int cl = a.chunkLog;
        long cm = (1L << cl) - 1;
        double[] vr = new double[d];
        double[] vi = new double[d];
        long count = 1L << (a.n - k);
        for (long j = 0; j < count; j++) {
            long i = j;
            for (int s : sorted) {
                i = ((i >>> s) << (s + 1)) | (i & ((1L << s) - 1));
            }
            for (int x = 0; x < d; x++) {
                long idx = i | offset[x];
                double[] c = chunks[(int) (idx >>> cl)];
                int o = (int) (idx & cm) << 1;
                vr[x] = c[o];
                vi[x] = c[o + 1];
            }
            for (int x = 0; x < d; x++) {
                double xr = vr[x];
                double xi = vi[x];
                for (int y = 0; y < d; y++) {
                    double yr = vr[y];
                    double yi = -vi[y];
                    work[2 * (x * d + y)] += xr * yr - xi * yi;
                    work[2 * (x * d + y) + 1] += xr * yi + xi * yr;
                }
            }
        }
    }

}
