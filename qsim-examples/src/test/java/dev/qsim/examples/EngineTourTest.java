package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;

import org.junit.jupiter.api.Test;

import dev.qsim.Simulator;
import dev.qsim.Tally;

class EngineTourTest {

    @Test
    void everyEngineRunsTheLanternCircuit() {
        Capture out = new Capture();
        EngineTour.Report r = EngineTour.run(out.stream(), EngineTour.DEFAULT_SEED, 2000);
        Map<Simulator.Engine, Tally> t = r.tallies();
        assertEquals(Simulator.Engine.values().length, t.size());
        // Ideal GHZ: only all-zeros and all-ones (Greenberger et al., Am. J. Phys. 58, 1131).
        for (Simulator.Engine e : new Simulator.Engine[] {Simulator.Engine.CHEAPEST,
            Simulator.Engine.AMPLITUDES, Simulator.Engine.TABLEAU,
            Simulator.Engine.MATRIX_PRODUCT}) {
            assertEquals(1.0, EngineTour.agreement(t.get(e)), 0.0, e.toString());
        }
        // Noisy engines: the all-same fraction within 4 binomial standard errors of the exact
        // density-matrix probability (binomial standard error, common practice).
        double p = r.exactNoisyAgreement();
        assertTrue(p > 0.8 && p < 0.99, "exact " + p);
        double se = Math.sqrt(p * (1 - p) / 2000);
        for (Simulator.Engine e : new Simulator.Engine[] {Simulator.Engine.DENSITY_MATRIX,
            Simulator.Engine.TRAJECTORIES}) {
            assertEquals(p, EngineTour.agreement(t.get(e)), 4 * se, e.toString());
        }
        assertSame(Simulator.Engine.TABLEAU, r.wideChoice().engine());
        assertEquals(1.0, EngineTour.agreement(r.wide()), 0.0);
        // A T gate rules the tableau out; 300 qubits rule the state vector out.
        assertTrue(out.text().contains("with a T gate added: MATRIX_PRODUCT")
                && out.text().contains("(t"), out.text());
        assertTrue(out.text().trim().endsWith("all-same fraction: 1.0000 over 2,000 shots"),
                out.text());
    }
}
