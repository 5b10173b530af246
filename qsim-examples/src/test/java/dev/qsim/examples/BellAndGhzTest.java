package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.statistics.inference.BinomialTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import dev.qsim.StateVector;

class BellAndGhzTest {

    private static final double TOL = 1e-12;
    private static final long SEED = BellAndGhz.DEFAULT_SEED;
    private static final int SHOTS = BellAndGhz.DEFAULT_SHOTS;

    @Test
    void bellPairHasTheTextbookAmplitudesAndOnlyAgreeingReads() {
        Capture out = new Capture();
        BellAndGhz.Report r = BellAndGhz.bell(out.stream(), SEED, SHOTS);
        // Bell state (|00> + |11>)/sqrt(2): Nielsen & Chuang 2010, sec. 1.3.6, eq. 1.98.
        checkCatState(r.state(), 2);
        checkTally(r, 2);
        String text = out.text();
        assertTrue(text.contains("|00>") && text.contains("|11>"), text);
        assertTrue(!text.contains("|01>") && !text.contains("|10>"), text);
    }

    @ParameterizedTest
    @ValueSource(ints = {3, 4, 6, 9})
    void ghzStateHasTwoEqualAmplitudesAndOnlyAllZeroOrAllOneReads(int qubits) {
        Capture out = new Capture();
        BellAndGhz.Report r = BellAndGhz.ghz(out.stream(), qubits, SEED, SHOTS);
        // GHZ state (|0..0> + |1..1>)/sqrt(2): Greenberger, Horne, Shimony and Zeilinger,
        // "Bell's theorem without inequalities", Am. J. Phys. 58, 1131 (1990).
        checkCatState(r.state(), qubits);
        checkTally(r, qubits);
        assertTrue(out.text().contains("|" + "1".repeat(qubits) + ">"), out.text());
    }

    private static void checkCatState(StateVector state, int qubits) {
        assertEquals(qubits, state.qubits());
        long last = (1L << qubits) - 1;
        double half = Math.sqrt(0.5);
        for (long i = 0; i <= last; i++) {
            Complex a = state.amplitude(i);
            double expected = i == 0 || i == last ? half : 0.0;
            assertEquals(expected, a.getReal(), TOL, "real part of amplitude " + i);
            assertEquals(0.0, a.getImaginary(), TOL, "imaginary part of amplitude " + i);
        }
    }

    private static void checkTally(BellAndGhz.Report r, int qubits) {
        assertEquals(SHOTS, r.tally().shots());
        assertEquals(qubits, r.tally().width());
        // Only |0..0> and |1..1> have nonzero amplitude (same sources as above).
        assertEquals(0, r.mixed(), () -> "mixed reads for seed " + SEED + ": " + r.tally()
                .outcomes());
        // Each has probability 1/2: the all-zeros count must pass an exact two-sided binomial
        // test (Commons Statistics BinomialTest) at the 1e-4 level, about 4 standard errors.
        double p = BinomialTest.withDefaults().test(SHOTS, (int) r.allZeros(), 0.5).getPValue();
        assertTrue(p > 1e-4, () -> "binomial p-value " + p + " for " + r.allZeros()
                + " all-zero reads of " + SHOTS + ", seed " + SEED);
    }

    @Test
    void refusesTooFewQubits() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> BellAndGhz.ghz(new Capture().stream(), 1, SEED, SHOTS));
        assertTrue(e.getMessage().contains("got 1"), e.getMessage());
    }
}
