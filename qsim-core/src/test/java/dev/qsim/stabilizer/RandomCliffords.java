package dev.qsim.stabilizer;

import java.util.Random;

import dev.qsim.Circuit;

/** Random Clifford gates recorded both in a circuit builder and on a table (test helper). */
final class RandomCliffords {
    private RandomCliffords() {
    }

    /** Appends {@code count} random gates from h x y z s sDagger sqrtX cnot cz swap. */
    static void gates(Random rnd, int n, int count, Circuit.Builder b, StabilizerTableau t) {
        for (int k = 0; k < count; k++) {
            int kind = n == 1 ? rnd.nextInt(7) : rnd.nextInt(10);
            int q = rnd.nextInt(n);
            int r = n == 1 ? 0 : (q + 1 + rnd.nextInt(n - 1)) % n;
            switch (kind) {
                case 0:
                    b.h(q);
                    if (t != null) {
                        t.h(q);
                    }
                    break;
                case 1:
                    b.x(q);
                    if (t != null) {
                        t.x(q);
                    }
                    break;
                case 2:
                    b.y(q);
                    if (t != null) {
                        t.y(q);
                    }
                    break;
                case 3:
                    b.z(q);
                    if (t != null) {
                        t.z(q);
                    }
                    break;
                case 4:
                    b.s(q);
                    if (t != null) {
                        t.s(q);
                    }
                    break;
                case 5:
                    b.sDagger(q);
                    if (t != null) {
                        t.sDagger(q);
                    }
                    break;
                case 6:
                    b.sqrtX(q);
                    if (t != null) {
                        t.sqrtX(q);
                    }
                    break;
                case 7:
                    b.cnot(q, r);
                    if (t != null) {
                        t.cnot(q, r);
                    }
                    break;
                case 8:
                    b.cz(q, r);
                    if (t != null) {
                        t.cz(q, r);
                    }
                    break;
                default:
                    b.swap(q, r);
                    if (t != null) {
                        t.swap(q, r);
                    }
                    break;
            }
        }
    }
}
