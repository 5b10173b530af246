package dev.qsim.observable;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.Gates;
import dev.qsim.Operator;

class PauliProductTest {

    @Test
    void sparseAndDenseFormsAgree() {
        // Bit order: highest qubit leftmost in dense text, as dev.qsim bitstrings ("110" = 6).
        PauliProduct sparse = PauliProduct.parse("X2 Z0");
        PauliProduct dense = PauliProduct.parse("XIZ");
        assertEquals(sparse, dense);
        assertEquals('X', dense.letter(2));
        assertEquals('I', dense.letter(1));
        assertEquals('Z', dense.letter(0));
        assertEquals(3, dense.span());
        assertEquals(2, dense.weight());
        assertEquals("Z0 X2", dense.toString());
        assertEquals("XIZ", dense.toDense(3));
        assertEquals("IXIZ", dense.toDense(4));
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        // text | phase (power of i) | printed form
        "X0 Z3        | 0 | X0 Z3",
        "-Y1          | 2 | -Y1",
        "- i  Z0      | 3 | -iZ0",
        "+i X5 Y0     | 1 | iY0 X5",
        "iXY          | 1 | iY0 X1",
        "  IIII       | 0 | I",
        "Z100 X70 Y64 | 0 | Y64 X70 Z100",
    })
    void parsesPrintsAndReadsBack(String text, int phase, String printed) {
        PauliProduct p = PauliProduct.parse(text.strip());
        assertEquals(phase, p.phase());
        assertEquals(printed, p.toString());
        assertEquals(p, PauliProduct.parse(p.toString()));
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        // text | position in the message | a word of what was expected
        "X0 Q3   | 3 | Pauli letter",
        "''      | 0 | Pauli letter",
        "-       | 1 | Pauli letter",
        "X0 Z    | 4 | qubit index",
        "X0Z1    | 2 | whitespace",
        "X0 Z0   | 4 | appears twice",
        "XIZ3    | 3 | Pauli letter",
        "XI Z    | 3 | end of the dense form",
        "x0      | 0 | Pauli letter",
        "X99999999 | 1 | qubit index in",
    })
    void malformedTextSaysWhereAndWhat(String text, int position, String expected) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> PauliProduct.parse(text));
        assertTrue(e.getMessage().contains("at position " + position), e::getMessage);
        assertTrue(e.getMessage().contains(expected), e::getMessage);
        assertTrue(e.getMessage().contains("\"" + text + "\""), e::getMessage);
    }

    @ParameterizedTest
    @CsvSource({
        // a, b, a·b: XY = iZ, YZ = iX, ZX = iY and reversed orders with -i
        // (Nielsen and Chuang 2010, exercise 2.41 / eq. 2.40 for the commutators).
        "X0, Y0, iZ0",
        "Y0, Z0, iX0",
        "Z0, X0, iY0",
        "Y0, X0, -iZ0",
        "Z0, Y0, -iX0",
        "X0, Z0, -iY0",
        "X0, X0, I",
        "iY0, iY0, -I",
        "X0 Z1, Z0 Z1, -iY0",
    })
    void singleQubitProductTable(String a, String b, String product) {
        assertEquals(PauliProduct.parse(product),
                PauliProduct.parse(a).times(PauliProduct.parse(b)));
    }

    /** Dense matrix of a product from the textbook 2x2 matrices of Gates (Kronecker order). */
    private static Operator dense(PauliProduct p, int n) {
        Operator m = null;
        for (int q = n - 1; q >= 0; q--) {
            Operator f = switch (p.letter(q)) {
                case 'X' -> Gates.X;
                case 'Y' -> Gates.Y;
                case 'Z' -> Gates.Z;
                default -> Gates.I;
            };
            m = m == null ? f : m.tensor(f);
        }
        Complex phase = new Complex[] {Complex.ONE, Complex.I, Complex.ONE.negate(),
            Complex.I.negate()}[p.phase()];
        Complex[][] rows = new Complex[m.dimension()][m.dimension()];
        for (int r = 0; r < rows.length; r++) {
            for (int c = 0; c < rows.length; c++) {
                rows[r][c] = m.get(r, c).multiply(phase);
            }
        }
        return Operator.of(rows);
    }

    private static PauliProduct random(UniformRandomProvider rng, int n) {
        StringBuilder sb = new StringBuilder(new String[] {"", "i", "-", "-i"}[rng.nextInt(4)]);
        for (int q = 0; q < n; q++) {
            sb.append("IXYZ".charAt(rng.nextInt(4)));
        }
        return PauliProduct.parse(sb.toString());
    }

    private static double maxDiff(Operator a, Operator b) {
        double m = 0;
        for (int r = 0; r < a.dimension(); r++) {
            for (int c = 0; c < a.dimension(); c++) {
                m = Math.max(m, a.get(r, c).subtract(b.get(r, c)).abs());
            }
        }
        return m;
    }

    @Test
    void productsAndCommutationMatchDenseMatrices() {
        // Reference: matrix product of Kronecker products of the textbook Pauli matrices.
        long seed = 20260412L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int n = 3;
        for (int trial = 0; trial < 200; trial++) {
            PauliProduct a = random(rng, n);
            PauliProduct b = random(rng, n);
            Operator ab = dense(a, n).times(dense(b, n));
            Operator ba = dense(b, n).times(dense(a, n));
            String why = "seed " + seed + ", trial " + trial + ": " + a + " · " + b;
            assertEquals(0, maxDiff(ab, dense(a.times(b), n)), 1e-15, why);
            assertEquals(maxDiff(ab, ba) == 0, a.commutesWith(b), why);
            boolean qubitWise = true;
            for (int q = 0; q < n; q++) {
                char x = a.letter(q);
                char y = b.letter(q);
                qubitWise &= x == 'I' || y == 'I' || x == y;
            }
            assertEquals(qubitWise, a.commutesQubitWise(b), why);
        }
    }

    @Test
    void productsBeyondSixtyFourQubits() {
        PauliProduct a = PauliProduct.parse("X130 Z1");
        PauliProduct b = PauliProduct.parse("Y130 Z1");
        // X·Y = iZ on qubit 130, Z·Z = I on qubit 1 (Nielsen and Chuang 2010, ex. 2.41).
        assertEquals(PauliProduct.parse("iZ130"), a.times(b));
        assertFalse(a.commutesWith(b));
        assertFalse(a.commutesQubitWise(b));
        // Anticommuting on two qubits means commuting (Nielsen and Chuang 2010, §10.5.1).
        PauliProduct c = PauliProduct.parse("Z130 X1");
        assertTrue(a.commutesWith(c));
        assertFalse(a.commutesQubitWise(c));
        assertEquals(131, a.span());
        assertEquals(PauliProduct.single('Y', 64), PauliProduct.parse("Y64"));
    }

    @Test
    void badArguments() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> PauliProduct.single('Q', 0));
        assertTrue(e.getMessage().contains("'Q'"), e::getMessage);
        IndexOutOfBoundsException o = assertThrows(IndexOutOfBoundsException.class,
                () -> PauliProduct.single('X', -2));
        assertTrue(o.getMessage().contains("-2"), o::getMessage);
        e = assertThrows(IllegalArgumentException.class,
                () -> PauliProduct.parse("X4").toDense(3));
        assertTrue(e.getMessage().contains("3"), e::getMessage);
    }
}
