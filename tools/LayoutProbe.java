import java.util.Arrays;
import java.util.Locale;

import jdk.incubator.vector.DoubleVector;
import jdk.incubator.vector.VectorShuffle;
import jdk.incubator.vector.VectorSpecies;

/**
 * Storage layout probe for the vector kernels (docs/decisions.md, "Vector kernels"): a dense
 * 2x2 complex gate on every target from 3 up (above any vector), written three ways on the
 * incubating Vector API: re/im interleaved in one array (a lane swap per vector, products then
 * sums, as qsim's loops), the same with fused multiply-adds, and split real and imaginary arrays
 * (no swap, as the C reference kernel). Prints nanoseconds per amplitude, the median of REPS
 * passes summed over the targets, in three rounds (the first after a warm-up). Not part of the
 * build; run in source-file mode:
 *
 * <pre>java --add-modules jdk.incubator.vector tools/LayoutProbe.java 16 20</pre>
 */
public final class LayoutProbe {
    static final VectorSpecies<Double> S = DoubleVector.SPECIES_PREFERRED;
    static final int L = S.length();
    static final VectorShuffle<Double> SWAP = VectorShuffle.fromOp(S, i -> i ^ 1);

    private LayoutProbe() {
    }

    static double[] pattern(double re, double im) {
        double[] v = new double[L];
        for (int i = 0; i < L; i += 2) {
            v[i] = re;
            v[i + 1] = im;
        }
        return v;
    }

    static DoubleVector of(double re, double im) {
        return DoubleVector.fromArray(S, pattern(re, im), 0);
    }

    static void interleaved(double[] psi, int n, int q, double[] m, boolean fma) {
        DoubleVector a0r = of(m[0], m[0]);
        DoubleVector a0i = of(-m[1], m[1]);
        DoubleVector a1r = of(m[2], m[2]);
        DoubleVector a1i = of(-m[3], m[3]);
        DoubleVector b0r = of(m[4], m[4]);
        DoubleVector b0i = of(-m[5], m[5]);
        DoubleVector b1r = of(m[6], m[6]);
        DoubleVector b1i = of(-m[7], m[7]);
        int half = 2 << q;
        int len = 2 << n;
        for (int blk = 0; blk < len; blk += 2 * half) {
            for (int x = blk; x < blk + half; x += L) {
                DoubleVector u = DoubleVector.fromArray(S, psi, x);
                DoubleVector v = DoubleVector.fromArray(S, psi, x + half);
                DoubleVector us = u.rearrange(SWAP);
                DoubleVector vs = v.rearrange(SWAP);
                if (fma) {
                    vs.fma(a1i, v.fma(a1r, us.fma(a0i, u.mul(a0r)))).intoArray(psi, x);
                    vs.fma(b1i, v.fma(b1r, us.fma(b0i, u.mul(b0r)))).intoArray(psi, x + half);
                } else {
                    u.mul(a0r).add(us.mul(a0i)).add(v.mul(a1r)).add(vs.mul(a1i))
                            .intoArray(psi, x);
                    u.mul(b0r).add(us.mul(b0i)).add(v.mul(b1r)).add(vs.mul(b1i))
                            .intoArray(psi, x + half);
                }
            }
        }
    }

    static void split(double[] re, double[] im, int n, int q, double[] m) {
        int half = 1 << q;
        int len = 1 << n;
        for (int blk = 0; blk < len; blk += 2 * half) {
            for (int x = blk; x < blk + half; x += L) {
                DoubleVector ur = DoubleVector.fromArray(S, re, x);
                DoubleVector ui = DoubleVector.fromArray(S, im, x);
                DoubleVector vr = DoubleVector.fromArray(S, re, x + half);
                DoubleVector vi = DoubleVector.fromArray(S, im, x + half);
                ur.mul(m[0]).sub(ui.mul(m[1])).add(vr.mul(m[2])).sub(vi.mul(m[3]))
                        .intoArray(re, x);
                ui.mul(m[0]).add(ur.mul(m[1])).add(vi.mul(m[2])).add(vr.mul(m[3]))
                        .intoArray(im, x);
                ur.mul(m[4]).sub(ui.mul(m[5])).add(vr.mul(m[6])).sub(vi.mul(m[7]))
                        .intoArray(re, x + half);
                ui.mul(m[4]).add(ur.mul(m[5])).add(vi.mul(m[6])).add(vr.mul(m[7]))
                        .intoArray(im, x + half);
            }
        }
    }

    private static long median(long[] t) {
        long[] s = t.clone();
        Arrays.sort(s);
        return s[s.length / 2];
    }

    public static void main(String[] args) {
        int n = Integer.parseInt(args[0]);
        int reps = Integer.parseInt(args[1]);
        double c = Math.cos(0.3);
        double s = Math.sin(0.3);
        double[] m = {c, 0.1, -s, 0.2, s, -0.2, c, 0.1};
        double[] psi = new double[2 << n];
        double[] re = new double[1 << n];
        double[] im = new double[1 << n];
        Arrays.fill(psi, 0.01);
        Arrays.fill(re, 0.01);
        Arrays.fill(im, 0.01);
        final int q0 = 3;
        for (int round = 0; round < 3; round++) {
            long ti = 0;
            long tf = 0;
            long ts = 0;
            for (int q = q0; q < n; q++) {
                for (int w = 0; w < (round == 0 ? 20 : 1); w++) {
                    interleaved(psi, n, q, m, false);
                    interleaved(psi, n, q, m, true);
                    split(re, im, n, q, m);
                }
                long[] t1 = new long[reps];
                long[] t2 = new long[reps];
                long[] t3 = new long[reps];
                for (int r = 0; r < reps; r++) {
                    long t = System.nanoTime();
                    interleaved(psi, n, q, m, false);
                    t1[r] = System.nanoTime() - t;
                    t = System.nanoTime();
                    interleaved(psi, n, q, m, true);
                    t2[r] = System.nanoTime() - t;
                    t = System.nanoTime();
                    split(re, im, n, q, m);
                    t3[r] = System.nanoTime() - t;
                }
                ti += median(t1);
                tf += median(t2);
                ts += median(t3);
            }
            double per = (double) (n - q0) * (1 << n);
            System.out.printf(Locale.ROOT, "round=%d n=%d double_lanes=%d interleaved=%.3f"
                    + " interleaved_fma=%.3f split=%.3f ns/amp; split %.2fx, fma %.2fx%n",
                    round, n, L, ti / per, tf / per, ts / per, ti / (double) ts,
                    ti / (double) tf);
        }
    }
}
