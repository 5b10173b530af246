package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;

/** The README's code, run as written, with the results it states. */
class ReadmeExamplesTest {

    @Test
    void aFirstCircuit() {
        Circuit bell = Circuit.builder(2)
                .h(0).cnot(0, 1)
                .measure()
                .build();
        Tally tally = Simulator.seeded(42).run(bell, 1000);
        // About 500: binomial(1000, 1/2) within 4 standard deviations (common practice),
        // since the Bell state reads 11 with probability 1/2 (Nielsen and Chuang 2010, §1.3.6).
        assertEquals(500, tally.count("11"), 4 * Math.sqrt(250));
        assertEquals(tally, Simulator.seeded(42).run(bell, 1000));
        StateVector psi = StateVector.zero(2).apply(bell.withoutMeasurements());
        assertEquals(Math.sqrt(0.5), psi.amplitude(3).getReal(), 1e-15);
        assertEquals(0.0, psi.amplitude(3).getImaginary(), 0.0);
        // The CNOT drawn as in Nielsen and Chuang 2010, §4.3: a dot on the control, ⊕ on the
        // target.
        assertTrue(bell.diagram().contains("\u25cf") && bell.diagram().contains("\u2295"),
                bell.diagram());
    }

    @Test
    void noiseAndTheEngineAreSettingsOfTheRun() {
        Circuit bell = Circuit.builder(2).h(0).cnot(0, 1).measure().build();
        NoiseModel lab = NoiseModel.builder()
                .afterGate("cx", Channel.depolarizing(0.02))
                .readoutError(0.01, 0.03).build();
        Simulator sim = Simulator.seeded(7).withNoise(lab);
        Simulator.Choice choice = sim.explain(bell, 1000);
        assertSame(Simulator.Engine.DENSITY_MATRIX, choice.engine());
        assertTrue(choice.toString().startsWith("DENSITY_MATRIX: 2 qubits and measurements at"
                + " the end"), choice.toString());
        assertEquals(1000, sim.run(bell, 1000).shots());
        double[] p = sim.distribution(bell);
        double sum = 0;
        for (double x : p) {
            sum += x;
        }
        assertEquals(1, sum, 1e-12);
        assertTrue(p[1] > 0 && p[2] > 0, "noise puts weight on 01 and 10");
    }
}
