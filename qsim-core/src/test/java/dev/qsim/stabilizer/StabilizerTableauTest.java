package dev.qsim.stabilizer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Random;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.Circuit;
import dev.qsim.Gates;
import dev.qsim.Operator;
import dev.qsim.StateVector;

class StabilizerTableauTest {

    @Test
    void zeroStateIsStabilizedByZOnEachQubit() {
        // |0...0> is the +1 eigenstate of each Z_i (Nielsen and Chuang 2010, sec. 10.5.1).
        assertEquals(List.of("+IIZ", "+IZI", "+ZII"), Tables.texts(StabilizerTableau.zero(3)));
    }

    @Test
    void bellStateHasGeneratorsXxAndZz() {
        // (|00> + |11>)/sqrt2 is stabilized by XX and ZZ (Nielsen and Chuang 2010, sec. 10.5.1).
        StabilizerTableau t = StabilizerTableau.zero(2).h(0).cnot(0, 1);
        assertEquals(List.of("+XX", "+ZZ"), Tables.texts(t));
        assertEquals(1, Tables.expect(t, "XX"));
        assertEquals(1, Tables.expect(t, "+ZZ"));
        assertEquals(-1, Tables.expect(t, "-XX"));
        // YY = -(XX)(ZZ) on two qubits since XZ = -iY (Pauli algebra, common practice).
        assertEquals(-1, Tables.expect(t, "YY"));
        // Z on one half of a Bell pair has mean 0 (common practice).
        assertEquals(0, Tables.expect(t, "IZ"));
        assertEquals(0, Tables.expect(t, "XI"));
    }

    @Test
    void signsFollowPauliConjugation() {
        // X Z X = -Z and S X S† = Y (Pauli algebra, common practice).
        assertEquals(List.of("-Z"), Tables.texts(StabilizerTableau.zero(1).x(0)));
        assertEquals(List.of("+Y"), Tables.texts(StabilizerTableau.zero(1).h(0).s(0)));
        assertEquals(List.of("-Y"), Tables.texts(StabilizerTableau.zero(1).h(0).sDagger(0)));
        assertEquals(List.of("-X"), Tables.texts(StabilizerTableau.zero(1).x(0).h(0)));
    }

    /** Random gate sequences: the table's state vector equals the state-vector engine's. */
    @Test
    void stateVectorAgreesWithTheStateVectorEngineForRandomCircuits() {
        long seed = 20_261_201L;
        Random rnd = new Random(seed);
        for (int trial = 0; trial < 60; trial++) {
            int n = 1 + rnd.nextInt(8);
            Circuit.Builder b = Circuit.builder(n);
            StabilizerTableau t = StabilizerTableau.zero(n);
            RandomCliffords.gates(rnd, n, 5 + rnd.nextInt(40), b, t);
            Circuit c = b.build();
            StateVector expected = StateVector.zero(n).apply(c);
            StateVector actual = t.toStateVector();
            final int tr = trial;
            // Fidelity 1 means equal up to global phase (Nielsen and Chuang 2010, sec. 9.2.2).
            assertEquals(1.0, actual.fidelity(expected), 1e-12,
                    () -> "seed " + seed + " trial " + tr + ": " + c);
            assertEquals(1.0, actual.norm(), 1e-12);
        }
    }

    /**
     * Random Pauli strings: the table's expectation equals &lt;psi|P|psi&gt; computed on the
     * state-vector engine by applying the Pauli gates and taking the inner product.
     */
    @Test
    void expectationAgreesWithTheStateVectorEngine() {
        long seed = 77L;
        Random rnd = new Random(seed);
        Operator[] paulis = {Gates.I, Gates.X, Gates.Y, Gates.Z};
        String letters = "IXYZ";
        int nonzero = 0;
        for (int trial = 0; trial < 40; trial++) {
            int n = 1 + rnd.nextInt(6);
            Circuit.Builder b = Circuit.builder(n);
            StabilizerTableau t = StabilizerTableau.zero(n);
            RandomCliffords.gates(rnd, n, 30, b, t);
            StateVector psi = StateVector.zero(n).apply(b.build());
            for (int k = 0; k < 12; k++) {
                StringBuilder text = new StringBuilder();
                StateVector p = psi.copy();
                int[] kinds = new int[n];
                for (int q = n - 1; q >= 0; q--) {
                    kinds[q] = rnd.nextInt(4);
                }
                // Bias toward stabilizer elements: half the time use a generator itself.
                String given;
                if (rnd.nextBoolean()) {
                    given = Tables.texts(t).get(rnd.nextInt(n));
                    for (int q = 0; q < n; q++) {
                        kinds[q] = letters.indexOf(given.charAt(n - q));
                    }
                } else {
                    for (int q = n - 1; q >= 0; q--) {
                        text.append(letters.charAt(kinds[q]));
                    }
                    given = text.toString();
                }
                for (int q = 0; q < n; q++) {
                    p.apply(paulis[kinds[q]], q);
                }
                double sign = given.charAt(0) == '-' ? -1 : 1;
                Complex ev = psi.inner(p);
                int actual = Tables.expect(t, given);
                final int tr = trial;
                final String g = given;
                assertEquals(sign * ev.getReal(), actual, 1e-12,
                        () -> "seed " + seed + " trial " + tr + " pauli " + g);
                assertEquals(0.0, ev.getImaginary(), 1e-12);
                nonzero += actual != 0 ? 1 : 0;
            }
        }
        assertTrue(nonzero > 100, "too few stabilizer elements tried: " + nonzero);
    }

    /**
     * Single measurements: deterministic exactly when the state-vector probability is 0 or 1,
     * and then with the same outcome; collapse leaves the state the state-vector engine's
     * projection would give.
     */
    @Test
    void measurementAgreesWithBornRule() {
        long seed = 4242L;
        Random rnd = new Random(seed);
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        for (int trial = 0; trial < 60; trial++) {
            int n = 1 + rnd.nextInt(7);
            Circuit.Builder b = Circuit.builder(n);
            StabilizerTableau t = StabilizerTableau.zero(n);
            RandomCliffords.gates(rnd, n, 25, b, t);
            StateVector psi = StateVector.zero(n).apply(b.build());
            int q = rnd.nextInt(n);
            // Born rule (Nielsen and Chuang 2010, sec. 2.2.3): P(1) from the marginal.
            double p1 = psi.marginal(q)[1];
            final int tr = trial;
            if (t.isDeterministic(q)) {
                assertTrue(p1 < 1e-12 || p1 > 1 - 1e-12, () -> "seed " + seed + " trial " + tr);
                assertEquals(p1 > 0.5 ? 1 : 0, t.measure(q, rng), () -> "trial " + tr);
            } else {
                // Stabilizer states give 1/2 for a non-certain Z outcome (Aaronson and
                // Gottesman 2004, sec. III).
                assertEquals(0.5, p1, 1e-12, () -> "seed " + seed + " trial " + tr);
                int outcome = t.measure(q, rng);
                // Collapse: project psi on the outcome and renormalise.
                StateVector expected = project(psi, q, outcome);
                assertEquals(1.0, t.toStateVector().fidelity(expected), 1e-12,
                        () -> "seed " + seed + " trial " + tr);
            }
        }
    }

    private static StateVector project(StateVector psi, int q, int outcome) {
        int n = psi.qubits();
        Complex[] a = new Complex[1 << n];
        double norm = 0;
        for (int i = 0; i < a.length; i++) {
            a[i] = ((i >>> q) & 1) == outcome ? psi.amplitude(i) : Complex.ZERO;
            norm += a[i].norm();
        }
        for (int i = 0; i < a.length; i++) {
            a[i] = a[i].divide(Math.sqrt(norm));
        }
        return StateVector.of(a);
    }

    @Test
    void resetGivesZeroOnTheQubit() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(5);
        for (int k = 0; k < 20; k++) {
            StabilizerTableau t = StabilizerTableau.zero(3).h(1).cnot(1, 2).x(2);
            t.reset(2, rng);
            // After reset the qubit reads 0 with certainty (definition of reset, common practice).
            assertTrue(t.isDeterministic(2));
            assertEquals(1, Tables.expect(t, "ZII"));
        }
    }

    @Test
    void copyIsIndependent() {
        StabilizerTableau t = StabilizerTableau.zero(2).h(0);
        StabilizerTableau c = t.copy();
        c.cnot(0, 1);
        assertEquals(List.of("+IX", "+ZI"), Tables.texts(t));
        assertEquals(List.of("+XX", "+ZZ"), Tables.texts(c));
    }

    /** 130 qubits crosses two 64-bit word boundaries: a GHZ chain and its generators. */
    @Test
    void ghzAcrossWordBoundaries() {
        int n = 130;
        StabilizerTableau t = StabilizerTableau.zero(n).h(0);
        for (int q = 1; q < n; q++) {
            t.cnot(q - 1, q);
        }
        // GHZ is stabilized by X...X and each Z_i Z_{i+1} (Nielsen and Chuang 2010, ex. 10.44
        // style; common practice).
        assertEquals(1, Tables.expect(t, "X".repeat(n)));
        assertEquals(-1, Tables.expect(t, "-" + "X".repeat(n)));
        String zz = "I".repeat(n - 66) + "ZZ" + "I".repeat(64);
        assertEquals(1, Tables.expect(t, zz));
        assertEquals(0, Tables.expect(t, "I".repeat(n - 1) + "Z"));
        // Y = iXZ, so Y^n = i^n X^n Z^n = -X^n Z^n for n = 130, and X^n, Z^n (n even) both
        // stabilize GHZ, so <Y^n> = -1 (Pauli algebra, common practice).
        assertEquals(-1, Tables.expect(t, "Y".repeat(n)));
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(9);
        int first = t.measure(77, rng);
        for (int q = 0; q < n; q++) {
            assertTrue(t.isDeterministic(q));
            assertEquals(first, t.measure(q, rng), "qubit " + q);
        }
    }

    @ParameterizedTest
    @CsvSource({"0", "-1", "200001"})
    void qubitCountOutOfRangeIsRefused(int n) {
        IllegalArgumentException e =
                assertThrows(IllegalArgumentException.class, () -> StabilizerTableau.zero(n));
        assertTrue(e.getMessage().contains(Integer.toString(n)), e.getMessage());
    }

    @Test
    void qubitOutOfRangeIsRefusedAndNothingChanges() {
        StabilizerTableau t = StabilizerTableau.zero(3).h(0);
        IndexOutOfBoundsException e =
                assertThrows(IndexOutOfBoundsException.class, () -> t.cnot(0, 3));
        assertTrue(e.getMessage().contains("qubit 3"), e.getMessage());
        assertThrows(IndexOutOfBoundsException.class, () -> t.h(-1));
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(1);
        assertThrows(IndexOutOfBoundsException.class, () -> t.measure(7, rng));
        IllegalArgumentException same =
                assertThrows(IllegalArgumentException.class, () -> t.cz(1, 1));
        assertTrue(same.getMessage().contains("qubit 1"), same.getMessage());
        assertEquals(List.of("+IIX", "+IZI", "+ZII"), Tables.texts(t));
    }

    @Test
    void productsBeyondTheTableOrNotHermitianAreRefused() {
        StabilizerTableau t = StabilizerTableau.zero(3);
        // Text is read by PauliProduct, the one parser: "XZ" is X on qubit 1, Z on qubit 0.
        assertEquals(1, Tables.expect(t, "Z"));
        assertEquals(0, Tables.expect(t, "XZ"));
        IllegalArgumentException wide =
                assertThrows(IllegalArgumentException.class, () -> Tables.expect(t, "XIZZ"));
        assertTrue(wide.getMessage().contains("qubit 3") && wide.getMessage().contains("3 qubit"),
                wide.getMessage());
        IllegalArgumentException phase =
                assertThrows(IllegalArgumentException.class, () -> Tables.expect(t, "iZ"));
        assertTrue(phase.getMessage().contains("not Hermitian"), phase.getMessage());
        IllegalArgumentException ch =
                assertThrows(IllegalArgumentException.class, () -> Tables.expect(t, "+XQZ"));
        assertTrue(ch.getMessage().contains("Q"), ch.getMessage());
    }

    @Test
    void largeTablesAreRefusedByToStateVector() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> StabilizerTableau.zero(21).toStateVector());
        assertTrue(e.getMessage().contains("21"), e.getMessage());
    }
}
