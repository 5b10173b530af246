package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

import dev.qsim.Tally;

class NoisyGhzTest {

    private static final long SEED = NoisyGhz.DEFAULT_SEED;
    private static final int SHOTS = NoisyGhz.DEFAULT_SHOTS;

    @Test
    void threePredictionsAgreeWhereTheyShould() {
        Capture out = new Capture();
        NoisyGhz.Report r = NoisyGhz.predict(out.stream(), SEED, SHOTS);
        double[] ideal = r.ideal();
        double[] exact = r.exact();
        int all = (1 << NoisyGhz.QUBITS) - 1;
        // Ideal GHZ state: only all zeros and all ones, each 1/2 (Greenberger, Horne, Shimony
        // and Zeilinger, Am. J. Phys. 58, 1131, 1990).
        assertEquals(0.5, ideal[0], 1e-12);
        assertEquals(0.5, ideal[all], 1e-12);
        double sum = 0;
        for (double p : exact) {
            sum += p;
        }
        // A channel preserves the trace (Nielsen and Chuang 2010, §8.2.3): probabilities sum to 1.
        assertEquals(1, sum, 1e-12);
        // Readout errors alone already make a mixed read possible: every one of the 64
        // outcomes has positive probability (confusion matrices with nonzero off-diagonals).
        for (int i = 0; i <= all; i++) {
            assertTrue(exact[i] > 0, "outcome " + i);
        }
        // Trajectory and density-matrix tallies both sample the exact distribution (Dalibard,
        // Castin and Mølmer 1992): the two GHZ outcomes within 4 binomial standard errors.
        for (Tally t : new Tally[] {r.densityTally(), r.trajectoryTally()}) {
            assertEquals(SHOTS, t.shots());
            for (int i : new int[] {0, all}) {
                double se = Math.sqrt(exact[i] * (1 - exact[i]) / SHOTS);
                assertEquals(exact[i], t.count(i) / (double) SHOTS, 4 * se,
                        "outcome " + i + ", seed " + SEED);
            }
        }
        assertTrue(r.fidelity() > 0 && r.fidelity() < 1, "fidelity " + r.fidelity());
        String text = out.text();
        assertTrue(text.contains("density matrix") && text.contains("trajectories")
                && text.contains("ideal") && text.contains("111111"), text);
    }

    @Test
    void argumentsAreChecked() {
        Capture out = new Capture();
        NoisyGhz.fromArgs(new String[] {"5", "300"}, out.stream());
        assertTrue(out.text().contains("300 shots"), out.text());
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> NoisyGhz.fromArgs(new String[] {"1", "0"}, new Capture().stream()));
        assertTrue(e.getMessage().contains("got 0"), e.getMessage());
    }
}
