package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.Map;
import java.util.TreeMap;

import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;

/** Tally values and StateVector queries against closed forms. */
class TallyAndStateTest {
    @Test
    void tallyCountsProbabilitiesAndCsv() {
        Map<String, Long> m = new TreeMap<>(Map.of("101", 3L, "000", 1L, "011", 0L));
        Tally t = Tally.of(3, m);
        assertEquals(4, t.shots());
        assertEquals(3, t.count("101"));
        assertEquals(3, t.count(5L)); // "101" is index 5: bitstring convention of the contract.
        assertEquals(0, t.count("011"));
        assertEquals(0.75, t.probability("101"));
        assertEquals("bits,count\n000,1\n101,3\n", t.toCsv());
        assertEquals(2, t.outcomes().size());
        assertThrows(UnsupportedOperationException.class, () -> t.outcomes().put("111", 1L));
        assertEquals(t, Tally.of(3, Map.of("000", 1L, "101", 3L)));
    }

    @Test
    void bitOrderHighestQubitLeftmost() {
        // "110" on 3 qubits is index 6: qubits 1 and 2 are 1 (the contract's convention).
        StateVector s = StateVector.zero(3).apply(Gates.X, 1).apply(Gates.X, 2);
        assertEquals(1.0, s.probability(6));
        Tally t = s.sample(10, org.apache.commons.rng.simple.RandomSource.XO_RO_SHI_RO_128_PP
                .create(1L));
        assertEquals(10, t.count("110"));
        // marginal: bit j of the key is qubits[j].
        assertArrayEquals(new double[] {0, 0, 1, 0}, s.marginal(0, 2));
        assertArrayEquals(new double[] {0, 1}, s.marginal(1));
    }

    @Test
    void tensorPutsTheArgumentOnTheLowQubits() {
        StateVector a = StateVector.basis(1, 1);   // |1>
        StateVector b = StateVector.basis(2, 0);   // |00>
        StateVector ab = a.tensor(b);              // |1>⊗|00> = |100> = index 4
        assertEquals(3, ab.qubits());
        assertEquals(1.0, ab.probability(4));
        Operator ox = Gates.X.tensor(Gates.I);     // X on qubit 1, I on qubit 0
        assertEquals(Complex.ONE, ox.get(2, 0));
    }

    @Test
    void innerProductAndFidelity() {
        // <+|0> = 1/√2, fidelity 1/2 (Nielsen and Chuang 2010, §1.2).
        StateVector plus = StateVector.zero(1).apply(Gates.H, 0);
        StateVector zero = StateVector.zero(1);
        assertEquals(Math.sqrt(0.5), plus.inner(zero).getReal(), 1e-16);
        assertEquals(0.5, plus.fidelity(zero), 1e-15);
        // <ψ|φ> is conjugate-linear in ψ: <i0|0> = -i.
        StateVector i0 = StateVector.of(Complex.ofCartesian(0, 1), Complex.ZERO);
        assertEquals(Complex.ofCartesian(0, -1), i0.inner(zero));
    }

    @Test
    void toStringShowsNonZeroAmplitudes() {
        StateVector bell = StateVector.zero(2).apply(Circuit.builder(2).h(0).cnot(0, 1).build());
        assertEquals("0.7071|00> + 0.7071|11>", bell.toString());
    }

    @Test
    void widthsBeyondALongWork() {
        // 70 classical bits: outcomes are kept as bitstrings (common practice for wide registers).
        Circuit c = Circuit.builder(1, 70).x(0).measure(0, 69).build();
        Tally t = Simulator.seeded(1).run(c, 25);
        String one = "1" + "0".repeat(69);
        assertEquals(70, t.width());
        assertEquals(25, t.count(one));
        assertEquals(0, t.count(0L));
        assertEquals("bits,count\n" + one + ",25\n", t.toCsv());
        assertEquals(t, Tally.of(70, Map.of(one, 25L)));
    }
}
