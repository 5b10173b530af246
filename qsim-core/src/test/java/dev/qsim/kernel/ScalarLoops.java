package dev.qsim.kernel;

/**
 * {@link LaneKernels} written as plain element loops with the scalar kernels' formulas, one
 * amplitude at a time (the plans are left to the scalar kernels). Tests use it as loops that
 * are right by construction, to see the loader's check accept correct loops and refuse altered
 * ones; it is not used by the library.
 */
class ScalarLoops extends LaneKernels {
    @Override
    int amplitudeLog() {
        return 1;
    }

    @Override
    String describe() {
        return "scalar element loops (test)";
    }

    private static void pair(double[] u, int x, double[] v, int y, double[] m, int kind) {
        final double ar = u[x];
        final double ai = u[x + 1];
        final double br = v[y];
        final double bi = v[y + 1];
        if (kind == REAL) {
            u[x] = m[0] * ar + m[2] * br;
            u[x + 1] = m[0] * ai + m[2] * bi;
            v[y] = m[4] * ar + m[6] * br;
            v[y + 1] = m[4] * ai + m[6] * bi;
        } else if (kind == CROSS) {
            u[x] = m[0] * ar - m[3] * bi;
            u[x + 1] = m[0] * ai + m[3] * br;
            v[y] = m[6] * br - m[5] * ai;
            v[y + 1] = m[6] * bi + m[5] * ar;
        } else {
            u[x] = m[0] * ar - m[1] * ai + m[2] * br - m[3] * bi;
            u[x + 1] = m[0] * ai + m[1] * ar + m[2] * bi + m[3] * br;
            v[y] = m[4] * ar - m[5] * ai + m[6] * br - m[7] * bi;
            v[y + 1] = m[4] * ai + m[5] * ar + m[6] * bi + m[7] * br;
        }
    }

    private static void pair(float[] u, int x, float[] v, int y, double[] m, int kind) {
        if (kind == FLIP) {
            float r = u[x];
            float i = u[x + 1];
            u[x] = v[y];
            u[x + 1] = v[y + 1];
            v[y] = r;
            v[y + 1] = i;
            return;
        }
        double[] t = {u[x], u[x + 1], v[y], v[y + 1]};
        pair(t, 0, t, 2, m, kind);
        u[x] = (float) t[0];
        u[x + 1] = (float) t[1];
        v[y] = (float) t[2];
        v[y + 1] = (float) t[3];
    }

    @Override
    void pairs(double[] u, int uo, double[] v, int vo, int count, double[] m, int kind) {
        for (int k = 0; k < 2 * count; k += 2) {
            pair(u, uo + k, v, vo + k, m, kind);
        }
    }

    @Override
    void blocks(double[] psi, int start, int end, int q, double[] m, int kind) {
        int s2 = 2 << q;
        for (int b = start; b < end; b += 2 * s2) {
            pairs(psi, b, psi, b + s2, 1 << q, m, kind);
        }
    }

    @Override
    void pairBlocks(double[] psi, int start, int end, int q1, double[] m1, int kind1, int q2,
            double[] m2, int kind2) {
        blocks(psi, start, end, q1, m1, kind1);
        blocks(psi, start, end, q2, m2, kind2);
    }

    @Override
    void pairs(float[] u, int uo, float[] v, int vo, int count, double[] m, int kind) {
        for (int k = 0; k < 2 * count; k += 2) {
            pair(u, uo + k, v, vo + k, m, kind);
        }
    }

    @Override
    void blocks(float[] psi, int start, int end, int q, double[] m, int kind) {
        int s2 = 2 << q;
        for (int b = start; b < end; b += 2 * s2) {
            pairs(psi, b, psi, b + s2, 1 << q, m, kind);
        }
    }

    @Override
    Plan dense(Amplitudes a, int[] targets, int[] controls, double[] m) {
        return null;
    }

    @Override
    Plan diagonal(Amplitudes a, int[] targets, int[] controls, double[] diag) {
        return null;
    }

    @Override
    Plan controlledFlip(Amplitudes a, int target, int[] controls) {
        return null;
    }

    @Override
    void scale(double[] psi, int from, int to, double dr, double di) {
        for (int x = from; x < to; x += 2) {
            double re = psi[x];
            double im = psi[x + 1];
            psi[x] = dr * re - di * im;
            psi[x + 1] = dr * im + di * re;
        }
    }

    @Override
    void scale(float[] psi, int from, int to, double dr, double di) {
        for (int x = from; x < to; x += 2) {
            double re = psi[x];
            double im = psi[x + 1];
            psi[x] = (float) (dr * re - di * im);
            psi[x + 1] = (float) (dr * im + di * re);
        }
    }

    @Override
    void scaleByTable(double[] psi, int off, double[] table, int count) {
        for (int j = 0; j < 2 * count; j += 2) {
            scale(psi, off + j, off + j + 2, table[j], table[j + 1]);
        }
    }

    @Override
    void multiply(double[] psi, int off, double[] f, int len) {
        for (int x = 0; x < len; x++) {
            psi[off + x] *= f[x];
        }
    }

    @Override
    void scaleByTable(float[] psi, int off, double[] table, int count) {
        for (int j = 0; j < 2 * count; j += 2) {
            scale(psi, off + j, off + j + 2, table[j], table[j + 1]);
        }
    }

    @Override
    void diagonalBlocks(double[] psi, int start, int end, int q, double[] d) {
        int s2 = 2 << q;
        boolean skip0 = q > 0 && d[0] == 1 && d[1] == 0;
        for (int b = start; b < end; b += 2 * s2) {
            if (!skip0) {
                scale(psi, b, b + s2, d[0], d[1]);
            }
            scale(psi, b + s2, b + 2 * s2, d[2], d[3]);
        }
    }

    @Override
    void swapRuns(double[] u, int uo, double[] v, int vo, int count) {
        for (int k = 0; k < 2 * count; k++) {
            double t = u[uo + k];
            u[uo + k] = v[vo + k];
            v[vo + k] = t;
        }
    }

    @Override
    void flipBlocks(double[] psi, int start, int end, int q) {
        int s2 = 2 << q;
        for (int b = start; b < end; b += 2 * s2) {
            swapRuns(psi, b, psi, b + s2, 1 << q);
        }
    }

    @Override
    void widen(float[] f, int fo, double[] out, int at, int count) {
        for (int k = 0; k < 2 * count; k++) {
            out[at + k] = f[fo + k];
        }
    }

    @Override
    void narrow(double[] in, int at, float[] f, int fo, int count) {
        for (int k = 0; k < 2 * count; k++) {
            f[fo + k] = (float) in[at + k];
        }
    }

    @Override
    double sumSquares(double[] psi, int from, int to) {
        double s = 0;
        for (int x = from; x < to; x += 2) {
            s += psi[x] * psi[x] + psi[x + 1] * psi[x + 1];
        }
        return s;
    }

    @Override
    void squares(double[] psi, int from, int to, double[] out, int at) {
        for (int x = from, i = at; x < to; x += 2, i++) {
            out[i] = psi[x] * psi[x] + psi[x + 1] * psi[x + 1];
        }
    }

    @Override
    void innerSums(double[] u, int uo, double[] v, int vo, int count, double[] out) {
        double sr = 0;
        double si = 0;
        for (int x = 0; x < 2 * count; x += 2) {
            sr += u[uo + x] * v[vo + x] + u[uo + x + 1] * v[vo + x + 1];
            si += u[uo + x] * v[vo + x + 1] - u[uo + x + 1] * v[vo + x];
        }
        out[0] = sr;
        out[1] = si;
    }

    @Override
    void pauliInner(double[] k, double[] b, int start, int end, int xLow, int zLow,
            double[] out) {
        double sr = 0;
        double si = 0;
        for (int o = start; o < end; o++) {
            double sign = (Integer.bitCount(o & zLow) & 1) == 0 ? 1 : -1;
            int bo = (o ^ xLow) << 1;
            sr += sign * (b[bo] * k[2 * o] + b[bo + 1] * k[2 * o + 1]);
            si += sign * (b[bo] * k[2 * o + 1] - b[bo + 1] * k[2 * o]);
        }
        out[0] = sr;
        out[1] = si;
    }

    @Override
    void pauliAccumulate(double[] src, double[] dst, int start, int end, int xLow, int zLow,
            double ar, double ai) {
        for (int o = start; o < end; o++) {
            double sign = (Integer.bitCount(o & zLow) & 1) == 0 ? 1 : -1;
            double r = src[2 * o] * sign;
            double i = src[2 * o + 1] * sign;
            int d = (o ^ xLow) << 1;
            dst[d] += ar * r - ai * i;
            dst[d + 1] += ar * i + ai * r;
        }
    }
}
