package dev.qsim.spark.benchmarking;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Gates;
import dev.qsim.Operator;
import dev.qsim.Simulator;
import dev.qsim.Tally;

/** The two-qubit Clifford group: its order, closure, inverses and gate counts. */
class TwoQubitCliffordsTest {
    private static final TwoQubitCliffords G = TwoQubitCliffords.group();

    /** |tr(A† B)| = d exactly when B = e^{iφ} A (Cauchy-Schwarz; common practice). */
    private static void assertEqualUpToPhase(Operator a, Operator b, String what) {
        Complex tr = Complex.ZERO;
        Operator p = a.dagger().times(b);
        for (int i = 0; i < 4; i++) {
            tr = tr.add(p.get(i, i));
        }
        assertEquals(4.0, tr.abs(), 1e-9, what);
    }

    @Test
    void theElementsAreTheWholeGroup() {
        // |C_n / U(1)| = 2^(n^2 + 2n) prod_{j=1..n} (4^j - 1) (Calderbank, Rains, Shor and
        // Sloane 1998; Koenig and Smolin 2014, J. Math. Phys. 55, 122202): 11,520 for n = 2.
        // Construction refuses two elements with the same Pauli images, so all are distinct.
        long order = 1L << (2 * 2 + 2 * 2);
        for (int j = 1; j <= 2; j++) {
            order *= (1L << (2 * j)) - 1;
        }
        assertEquals(order, TwoQubitCliffords.SIZE);
        for (int e = 0; e < TwoQubitCliffords.SIZE; e++) {
            assertTrue(G.circuit(e).isClifford(), "element " + e);
            assertEquals(e, G.find(G.circuit(e).toOperator()));
        }
        assertEqualUpToPhase(Operator.identity(2), G.circuit(0).toOperator(), "element 0");
    }

    @Test
    void compositionAndInversesAgreeWithTheMatrices() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(8);
        for (int t = 0; t < 300; t++) {
            int a = G.sample(rng);
            int b = G.sample(rng);
            Operator ua = G.circuit(a).toOperator();
            Operator ub = G.circuit(b).toOperator();
            assertEqualUpToPhase(ub.times(ua), G.circuit(G.compose(a, b)).toOperator(),
                    a + " then " + b);
            assertEqualUpToPhase(Operator.identity(2),
                    G.circuit(G.inverse(a)).toOperator().times(ua), "inverse of " + a);
        }
        // Textbook elements: CNOT, CZ = (I x H) CNOT (I x H) and SWAP (Nielsen and Chuang 2010,
        // §4.3, exercise 4.17 and figure 1.7).
        int cnot = G.find(Gates.CNOT);
        int swap = G.find(Gates.SWAP);
        assertEqualUpToPhase(Gates.CNOT, G.circuit(cnot).toOperator(), "cnot");
        assertEquals(swap, G.inverse(swap));
        assertEquals(G.find(Gates.CZ), G.find(Circuit.builder(2).h(1).cnot(0, 1).h(1).build()
                .toOperator()));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> G.find(Gates.T.tensor(Gates.I)));
        assertTrue(e.getMessage().contains("not a two-qubit Clifford"), e.getMessage());
        assertThrows(IndexOutOfBoundsException.class, () -> G.circuit(TwoQubitCliffords.SIZE));
    }

    @Test
    void aSequenceAndItsInverseReturnToZeroOnTheTableau() {
        // The stabilizer tableau (Aaronson and Gottesman 2004) runs the gates independently of
        // the 4 x 4 matrices: every shot of sequence + inverse must read 00.
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(21);
        for (int length : new int[] {1, 5, 40}) {
            Circuit.Builder b = Circuit.builder(2);
            int total = 0;
            for (int k = 0; k < length; k++) {
                int c = G.sample(rng);
                b.append(G.circuit(c));
                total = G.compose(total, c);
            }
            b.append(G.circuit(G.inverse(total)));
            Tally t = Simulator.seeded(length).withEngine(Simulator.Engine.TABLEAU)
                    .run(b.measure().build(), 64);
            assertEquals(64, t.count("00"), "length " + length);
        }
    }

    @Test
    void elementsAverageOneAndAHalfCnots() {
        // (5184 x 1 + 5184 x 2 + 576 x 3) / 11520 = 1.5 CNOTs (Epstein et al. 2014, Phys. Rev.
        // A 89, 062321, section II: the Corcoles decomposition).
        double[] counts = G.meanGateCounts();
        assertEquals(1.5, counts[1], 1e-12);
        // One-qubit gates, from the class description: a single-qubit Clifford has 1.5 + 0.75
        // gates on average, an S1 element 4/3.
        double single = 2 * 2.25;
        double expected = (2 * 576 * single + 2 * 5184 * (single + 2 * 4.0 / 3)) / 11520;
        assertArrayEquals(new double[] {expected, 1.5}, counts, 1e-12);
    }
}
