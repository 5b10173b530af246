package dev.qsim.text;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.ShrinkingMode;
import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Gates;
import dev.qsim.Operator;

/** Writing then reading gives the circuit back (exactly, or as an equal operator). */
class QasmWriterTest {

    private static final Operator[] CONTROLLABLE = {Gates.X, Gates.Y, Gates.Z, Gates.H, Gates.S,
        Gates.S_DAGGER, Gates.T, Gates.T_DAGGER, Gates.SQRT_X};

    private static double angle(UniformRandomProvider rng) {
        return (rng.nextDouble() - 0.5) * 20;
    }

    private static int[] distinct(UniformRandomProvider rng, int n, int k) {
        int[] all = new int[n];
        for (int i = 0; i < n; i++) {
            all[i] = i;
        }
        for (int i = 0; i < k; i++) {
            int j = i + rng.nextInt(n - i);
            int t = all[i];
            all[i] = all[j];
            all[j] = t;
        }
        return java.util.Arrays.copyOf(all, k);
    }

    /** Appends one random named gate (or measurement, reset, block) to {@code b}. */
    private static void step(UniformRandomProvider rng, Circuit.Builder b, int n, int nc,
            boolean classical, int depth) {
        int[] q = distinct(rng, n, Math.min(n, 3));
        int kind = rng.nextInt(classical ? 24 : 20);
        double a = angle(rng);
        switch (kind) {
            case 0:
                b.h(q[0]);
                break;
            case 1:
                b.x(q[0]);
                break;
            case 2:
                b.y(q[0]);
                break;
            case 3:
                b.z(q[0]);
                break;
            case 4:
                b.s(q[0]);
                break;
            case 5:
                b.sDagger(q[0]);
                break;
            case 6:
                b.t(q[0]);
                break;
            case 7:
                b.tDagger(q[0]);
                break;
            case 8:
                if (rng.nextBoolean()) {
                    b.sqrtX(q[0]);
                } else { // the inverse names it sqrtXDagger
                    b.append(Circuit.builder(n, nc).sqrtX(q[0]).build().inverse());
                }
                break;
            case 9:
                b.rx(q[0], a);
                break;
            case 10:
                b.ry(q[0], a);
                break;
            case 11:
                b.rz(q[0], rng.nextBoolean() ? a : Math.PI / 4);
                break;
            case 12:
                b.phase(q[0], a);
                break;
            case 13:
                if (n > 1) {
                    b.cnot(q[0], q[1]);
                }
                break;
            case 14:
                if (n > 1) {
                    b.cz(q[0], q[1]);
                }
                break;
            case 15:
                if (n > 1) {
                    b.cphase(q[0], q[1], a);
                }
                break;
            case 16:
                if (n > 1) {
                    b.swap(q[0], q[1]);
                }
                break;
            case 17:
                if (n > 2) {
                    b.toffoli(q[0], q[1], q[2]);
                }
                break;
            case 18:
                if (n > 2) {
                    b.fredkin(q[0], q[1], q[2]);
                }
                break;
            case 19:
                if (n > 1) {
                    b.controlled(CONTROLLABLE[rng.nextInt(CONTROLLABLE.length)],
                            java.util.Arrays.copyOf(q, q.length - 1), q[q.length - 1]);
                }
                break;
            case 20:
                b.measure(q[0], rng.nextInt(nc));
                break;
            case 21:
                b.reset(q[0]);
                break;
            default:
                if (depth < 2) {
                    b.ifBit(rng.nextInt(nc), rng.nextInt(2), inner -> {
                        int k = 1 + rng.nextInt(3);
                        for (int i = 0; i < k; i++) {
                            step(rng, inner, n, nc, true, depth + 1);
                        }
                    });
                }
        }
    }

    @Property(tries = 200, seed = "7001", shrinking = ShrinkingMode.OFF)
    void namedGateCircuitsRoundTripExactly(@ForAll long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int n = 1 + rng.nextInt(5);
        int nc = 1 + rng.nextInt(4);
        Circuit.Builder b = Circuit.builder(n, nc);
        int len = rng.nextInt(25);
        for (int i = 0; i < len; i++) {
            step(rng, b, n, nc, true, 0);
        }
        Circuit c = b.build();
        String text = QasmWriter.write(c);
        assertEquals(c, QasmReader.read(text), "seed " + seed + "\n" + text);
    }

    @Property(tries = 60, seed = "7002", shrinking = ShrinkingMode.OFF)
    void generalOperatorsRoundTripAsEqualOperators(@ForAll long seed) {
        // Unitary equality within 1e-9 after the Z-Y decomposition (Nielsen and Chuang 2010,
        // Theorem 4.1) and the rzz construction cx; rz; cx (ibid., Figure 4.19 idea).
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int n = 3;
        Circuit.Builder b = Circuit.builder(n, 0);
        for (int i = 0; i < 8; i++) {
            int[] q = distinct(rng, n, 3);
            Operator u = Gates.u(angle(rng), angle(rng), angle(rng));
            Complex g = Complex.ofCis(angle(rng));
            Operator phased = Operator.of(new Complex[][] {
                {u.get(0, 0).multiply(g), u.get(0, 1).multiply(g)},
                {u.get(1, 0).multiply(g), u.get(1, 1).multiply(g)}});
            switch (rng.nextInt(6)) {
                case 0:
                    b.apply(phased, q[0]);
                    break;
                case 1:
                    b.controlled(phased, new int[] {q[1]}, q[0]);
                    break;
                case 2:
                    b.controlled(phased, new int[] {q[1], q[2]}, q[0]);
                    break;
                case 3:
                    b.rzz(q[0], q[1], angle(rng));
                    break;
                case 4:
                    b.apply(Gates.CNOT, q[0], q[1]);
                    break;
                default:
                    b.apply(Gates.H, q[2]);
                    break;
            }
        }
        Circuit c = b.build();
        String text = QasmWriter.write(c);
        Operator expected = c.toOperator();
        Operator actual = QasmReader.read(text).toOperator();
        for (int r = 0; r < 8; r++) {
            for (int col = 0; col < 8; col++) {
                double d = expected.get(r, col).subtract(actual.get(r, col)).abs();
                assertTrue(d < 1e-9, "seed " + seed + " entry " + r + "," + col + " off by " + d
                        + "\n" + text);
            }
        }
    }

    @Test
    void writesTheDocumentedText() {
        Circuit c = Circuit.builder(2).h(0).cnot(0, 1).rz(1, Math.PI / 2).sqrtX(0)
                .measure(0, 0).ifBit(0, 1, b -> b.x(1)).build();
        assertEquals("OPENQASM 3.0;\ninclude \"stdgates.inc\";\nqubit[2] q;\nbit[2] c;\n"
                + "h q[0];\ncx q[0], q[1];\nrz(pi/2) q[1];\nsx q[0];\nc[0] = measure q[0];\n"
                + "if (c[0] == 1) {\n  x q[1];\n}\n", QasmWriter.write(c));
    }

    @Test
    void refusesAMultiQubitOperatorWithoutAName() {
        Operator cnotTimesSwap = Gates.CNOT.times(Gates.SWAP);
        Circuit c = Circuit.builder(3).h(0).apply(cnotTimesSwap, 1, 2).build();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> QasmWriter.write(c));
        assertTrue(e.getMessage().contains("instruction 1"), e.getMessage());
        assertTrue(e.getMessage().contains("2-qubit operator"), e.getMessage());
    }

    @Test
    void angleTextReadsBackBitwise() {
        // Double.toString gives a decimal that reads back to the same double (Java SE 17 API,
        // Double.toString); multiples of pi are written only when the reader's left-to-right
        // arithmetic on the text gives the same double.
        double[] xs = {Math.PI, -Math.PI / 8, 1e-300, 0.1 + 0.2, Math.nextUp(1.0),
            0.39999999999999997, 3 * Math.PI / 4, Math.nextUp(Math.PI / 2)};
        for (double x : xs) {
            Circuit c = Circuit.builder(1, 0).rz(0, x).build();
            assertEquals(c, QasmReader.read(QasmWriter.write(c)), () -> "angle " + x);
        }
        // 0.39999999999999997 is a different double from 0.4 (IEEE 754: 0.4 is the nearest
        // double to 2/5 and this is the one below it), so it stays as written.
        assertEquals("0.39999999999999997", QasmWriter.angle(Math.nextDown(0.4)));
        assertEquals("0.4", QasmWriter.angle(0.4));
    }

    @Test
    void everyWrittenMultipleOfPiReadsBackAsTheSameDouble() {
        // Each k*pi/d in lowest terms, d <= 16 and |k/d| <= 4, as the writer's own arithmetic
        // and as the naive product k * (pi / d): whichever the writer prints must read back
        // bitwise (the reader's arithmetic is the reference).
        int pi = 0;
        for (int den = 1; den <= QasmWriter.PI_DENOMINATOR; den++) {
            for (int num = -QasmWriter.PI_MULTIPLE * den; num <= QasmWriter.PI_MULTIPLE * den;
                    num++) {
                for (double x : new double[] {num * Math.PI / den, num * (Math.PI / den)}) {
                    String text = QasmWriter.angle(x);
                    Circuit c = Circuit.builder(1, 0).rz(0, x).build();
                    assertEquals(c, QasmReader.read(QasmWriter.write(c)), text);
                    if (text.contains("pi")) {
                        pi++;
                    }
                }
            }
        }
        assertTrue(pi > 500, "multiples of pi written as such: " + pi);
        assertEquals("pi", QasmWriter.angle(Math.PI));
        assertEquals("-pi/2", QasmWriter.angle(-Math.PI / 2));
        assertEquals("3*pi/4", QasmWriter.angle(3 * Math.PI / 4));
        assertEquals("2*pi", QasmWriter.angle(2 * Math.PI));
    }

    @Test
    void negativeZeroIsWrittenAsZero() {
        // -0.0 and +0.0 give the same rotation: rz(0) is the identity (Nielsen and Chuang
        // 2010, eq. 4.6), so the writer prints 0 for both and the angle reads back as +0.0.
        assertEquals("0", QasmWriter.angle(-0.0));
        assertEquals("0", QasmWriter.angle(0.0));
        Circuit c = Circuit.builder(1, 0).u(0, 0.4, 0.0, -0.0).build();
        String text = QasmWriter.write(c);
        assertTrue(text.contains("U(0.4, 0, 0) q[0];"), text);
        Circuit back = QasmReader.read(text);
        assertEquals(0.0, back.instructions().get(0).angles()[2], 0.0);
        assertEquals(Double.doubleToLongBits(0.0),
                Double.doubleToLongBits(back.instructions().get(0).angles()[2]));
        for (int r = 0; r < 2; r++) {
            for (int col = 0; col < 2; col++) {
                assertEquals(c.instructions().get(0).operator().get(r, col).getReal(),
                        back.instructions().get(0).operator().get(r, col).getReal(), 0.0);
                assertEquals(c.instructions().get(0).operator().get(r, col).getImaginary(),
                        back.instructions().get(0).operator().get(r, col).getImaginary(), 0.0);
            }
        }
    }
}
