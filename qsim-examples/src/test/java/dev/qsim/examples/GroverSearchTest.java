package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.statistics.inference.BinomialTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.StateVector;

class GroverSearchTest {

    /**
     * Success probability after k rounds with M marked among N: sin^2((2k+1) theta) with
     * sin^2(theta) = M/N (Boyer, Brassard, Hoyer and Tapp, "Tight bounds on quantum searching",
     * Fortschritte der Physik 46, 493, 1998, sec. 3).
     */
    private static double bbht(int qubits, int marked, int k) {
        double theta = Math.asin(Math.sqrt(marked / (double) (1L << qubits)));
        double s = Math.sin((2 * k + 1) * theta);
        return s * s;
    }

    @Test
    void defaultRunFollowsTheBbhtFormulaForEveryRoundCount() {
        Capture out = new Capture();
        GroverSearch.Result r = GroverSearch.run(out.stream(), 5, new int[] {0b10110}, 31_337L,
                2000);
        double[] success = r.success();
        assertEquals(2 * r.iterations() + 2, success.length);
        for (int k = 0; k < success.length; k++) {
            assertEquals(bbht(5, 1, k), success[k], 1e-10, "k = " + k);
        }
        // floor(pi/4 * sqrt(32)) = floor(4.443) = 4 (Grover 1996; hand computation).
        assertEquals(4, r.iterations());
        assertTrue(out.text().contains("<- best"), out.text());
    }

    @ParameterizedTest
    @CsvSource({
        // qubits, marked settings separated by ';'
        "2, 3",
        "3, 5",
        "4, 0",
        "4, 3;12",
        "5, 1;2;30",
        "6, 63",
    })
    void searchCircuitFollowsTheBbhtFormula(int qubits, String markedText) {
        String[] parts = markedText.split(";");
        int[] marked = new int[parts.length];
        for (int i = 0; i < parts.length; i++) {
            marked[i] = Integer.parseInt(parts[i].trim());
        }
        int best = GroverSearch.optimalIterations(qubits, marked.length);
        for (int k = 0; k <= best + 2; k++) {
            StateVector s = StateVector.zero(qubits).apply(GroverSearch.search(qubits, k, marked));
            double p = 0;
            for (int m : marked) {
                p += s.probability(m);
            }
            assertEquals(bbht(qubits, marked.length, k), p, 1e-10,
                    "qubits " + qubits + ", marked " + markedText + ", k " + k);
            // The marked settings share the success probability equally (BBHT 1998, sec. 3).
            for (int m : marked) {
                assertEquals(p / marked.length, s.probability(m), 1e-10, "setting " + m);
            }
        }
    }

    @ParameterizedTest
    @CsvSource({
        // qubits, M, floor(pi/4 sqrt(N/M)) computed by hand: pi/4 * sqrt(N/M) =
        "2, 1, 1",   // 1.571
        "4, 1, 3",   // 3.142
        "5, 1, 4",   // 4.443
        "6, 1, 6",   // 6.283
        "10, 1, 25", // 25.133
        "10, 4, 12", // 12.566
    })
    void optimalRoundCountIsTheBbhtFloor(int qubits, int marked, int expected) {
        // Boyer, Brassard, Hoyer and Tapp 1998, sec. 3: floor(pi/4 sqrt(N/M)) rounds.
        assertEquals(expected, GroverSearch.optimalIterations(qubits, marked));
    }

    @Test
    void oracleFlipsTheSignOfMarkedBasisStatesOnly() {
        int qubits = 4;
        int[] marked = {2, 9, 15};
        for (long x = 0; x < 16; x++) {
            StateVector s = StateVector.basis(qubits, x).apply(GroverSearch.oracle(qubits,
                    marked));
            // Phase oracle |x> -> (-1)^{f(x)} |x> (Nielsen & Chuang 2010, eq. 6.2).
            double expected = x == 2 || x == 9 || x == 15 ? -1.0 : 1.0;
            assertEquals(expected, s.amplitude(x).getReal(), 1e-12, "basis " + x);
            assertEquals(1.0, s.probability(x), 1e-12, "basis " + x);
        }
    }

    @Test
    void tallyAtTheBestRoundCountAgreesWithTheFormula() {
        long seed = 31_337L;
        int shots = 2000;
        GroverSearch.Result r = GroverSearch.run(new Capture().stream(), 5, new int[] {22},
                seed, shots);
        // Hits are Binomial(shots, p) with p from BBHT 1998; exact two-sided binomial test of
        // Commons Statistics at the 1e-4 level (about 4 standard errors).
        double p = bbht(5, 1, 4);
        double pValue = BinomialTest.withDefaults().test(shots, (int) r.hits(), p).getPValue();
        assertTrue(pValue > 1e-4, () -> r.hits() + " hits of " + shots + " vs p = " + p
                + ", binomial p-value " + pValue + ", seed " + seed);
        assertEquals(shots, r.tally().shots());
    }

    @Test
    void refusesRepeatedOrOutOfRangeSettings() {
        IllegalArgumentException repeated = assertThrows(IllegalArgumentException.class,
                () -> GroverSearch.oracle(3, 5, 5));
        assertTrue(repeated.getMessage().contains("5"), repeated.getMessage());
        IllegalArgumentException range = assertThrows(IllegalArgumentException.class,
                () -> GroverSearch.oracle(3, 8));
        assertTrue(range.getMessage().contains("8") && range.getMessage().contains("[0, 7]"),
                range.getMessage());
        IllegalArgumentException qubits = assertThrows(IllegalArgumentException.class,
                () -> GroverSearch.diffusion(1));
        assertTrue(qubits.getMessage().contains("got 1"), qubits.getMessage());
    }
}
