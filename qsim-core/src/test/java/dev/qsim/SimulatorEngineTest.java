package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.EnumMap;
import java.util.Map;

import org.apache.commons.statistics.inference.ChiSquareTest;
import org.junit.jupiter.api.Test;

import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;

/**
 * Every engine is reached the same way, {@code seeded(seed).withThreads(t).withEngine(e)
 * .run(circuit, shots)}, and {@link Simulator#explain(Circuit, int)} says which one runs and why.
 */
class SimulatorEngineTest {

    private static Circuit ghz(int n) {
        Circuit.Builder b = Circuit.builder(n).h(0);
        for (int q = 1; q < n; q++) {
            b.cnot(q - 1, q);
        }
        return b.measure().build();
    }

    @Test
    void cheapestPicksAndExplains() {
        Simulator sim = Simulator.seeded(3);
        assertSame(Simulator.Engine.CHEAPEST, sim.engine());
        Simulator.Choice small = sim.explain(ghz(4), 100);
        assertSame(Simulator.Engine.AMPLITUDES, small.engine());
        assertTrue(small.reason().contains("below 16"), small.reason());
        Simulator.Choice big = sim.explain(ghz(64), 100);
        assertSame(Simulator.Engine.TABLEAU, big.engine());
        assertTrue(big.reason().contains("Clifford"), big.reason());
        Simulator.Choice t = sim.explain(Circuit.builder(20).h(1).t(0).build(), 100);
        assertSame(Simulator.Engine.AMPLITUDES, t.engine());
        assertTrue(t.reason().contains("instruction 1 (t"), t.reason());
        // A 64-qubit GHZ state reads all zeros or all ones (Greenberger, Horne, Shimony and
        // Zeilinger, Am. J. Phys. 58, 1131 (1990)); no state vector of 64 qubits could run.
        Tally tally = sim.run(ghz(64), 100);
        assertEquals(100, tally.count("0".repeat(64)) + tally.count("1".repeat(64)));
        // With noise: the density matrix for small circuits measured at the end,
        // trajectories for mid-circuit measurement or many qubits.
        NoiseModel noise = NoiseModel.builder().afterOneQubitGates(Channel.depolarizing(0.01))
                .build();
        Simulator noisy = sim.withNoise(noise);
        assertSame(Simulator.Engine.DENSITY_MATRIX, noisy.explain(ghz(4), 1000).engine());
        assertSame(Simulator.Engine.TRAJECTORIES, noisy.explain(ghz(12), 1000).engine());
        assertSame(Simulator.Engine.TRAJECTORIES, noisy.explain(ghz(10), 10).engine());
        Circuit feedback = Circuit.builder(2).h(0).measure(0, 0).ifBit(0, 1, b -> b.x(1))
                .measure(1, 1).build();
        Simulator.Choice fb = noisy.explain(feedback, 1000);
        assertSame(Simulator.Engine.TRAJECTORIES, fb.engine());
        assertTrue(fb.reason().contains("instruction 2"), fb.reason());
    }

    @Test
    void everyEngineRunsTheSameCircuitThroughOneShape() {
        // A Bell pair reads 00 or 11, each with probability 1/2 (Nielsen and Chuang 2010,
        // §1.3.6), on every engine; checked by a chi-square test at 1e-3 (Commons Statistics).
        Circuit bell = ghz(2);
        Map<Simulator.Engine, Tally> tallies = new EnumMap<>(Simulator.Engine.class);
        for (Simulator.Engine e : Simulator.Engine.values()) {
            CircuitRunner runner = Simulator.seeded(17).withThreads(2).withEngine(e);
            Tally t = runner.run(bell, 2000);
            tallies.put(e, t);
            assertEquals(2000, t.count("00") + t.count("11"), e + ": " + t);
            double p = ChiSquareTest.withDefaults().test(new double[] {0.5, 0.5},
                    new long[] {t.count("00"), t.count("11")}).getPValue();
            assertTrue(p > 1e-3, e + ": p = " + p + ", " + t);
        }
        // Equal calls give equal tallies; the thread count does not matter.
        for (Simulator.Engine e : Simulator.Engine.values()) {
            assertEquals(tallies.get(e), Simulator.seeded(17).withThreads(1).withEngine(e)
                    .run(bell, 2000), e.toString());
        }
    }

    @Test
    void fixedEnginesRefuseWhatTheyCannotRun() {
        Simulator tableau = Simulator.seeded(3).withEngine(Simulator.Engine.TABLEAU);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> tableau.run(Circuit.builder(2).h(0).t(1).measure().build(), 10));
        assertTrue(e.getMessage().contains("instruction 1 (t"), e.getMessage());
        NoiseModel noise = NoiseModel.builder().readoutError(0.01, 0.02).build();
        e = assertThrows(IllegalArgumentException.class,
                () -> tableau.withNoise(noise).run(ghz(3), 10));
        assertTrue(e.getMessage().contains("TRAJECTORIES"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> Simulator.seeded(3).withEngine(Simulator.Engine.AMPLITUDES).withNoise(noise)
                        .run(ghz(3), 10));
        assertTrue(e.getMessage().contains("DENSITY_MATRIX"), e.getMessage());
        Circuit feedback = Circuit.builder(2).h(0).measure(0, 0).ifBit(0, 1, b -> b.x(1))
                .build();
        e = assertThrows(IllegalArgumentException.class,
                () -> Simulator.seeded(3).withEngine(Simulator.Engine.DENSITY_MATRIX)
                        .run(feedback, 10));
        assertTrue(e.getMessage().contains("instruction 2"), e.getMessage());
        // A non-Clifford circuit too wide for a state vector says what rules the tableau out.
        Circuit wide = Circuit.builder(41).h(0).t(3).measure().build();
        e = assertThrows(IllegalArgumentException.class, () -> Simulator.seeded(3)
                .withEngine(Simulator.Engine.AMPLITUDES).run(wide, 1));
        assertTrue(e.getMessage().contains("41 qubits") && e.getMessage().contains("(t"),
                e.getMessage());
        // The matrix product state runs ideal circuits only.
        e = assertThrows(IllegalArgumentException.class, () -> Simulator.seeded(3)
                .withEngine(Simulator.Engine.MATRIX_PRODUCT).withNoise(noise).run(ghz(3), 10));
        assertTrue(e.getMessage().contains("ideal") && e.getMessage().contains("TRAJECTORIES"),
                e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> Simulator.seeded(3).run(wide, 0));
        assertTrue(e.getMessage().contains("shots"), e.getMessage());
    }

    @Test
    void stateAfterOnTheTableauEqualsTheStateVector() {
        Simulator st = Simulator.seeded(3).withEngine(Simulator.Engine.TABLEAU);
        Circuit bell = Circuit.builder(2).h(0).cnot(0, 1).build();
        assertEquals(1.0, st.stateAfter(bell).fidelity(StateVector.zero(2).apply(bell)), 1e-12);
        assertTrue(st.toString().contains("TABLEAU"), st.toString());
    }

    @Test
    void distributionIsTheRegisterOfTheFinalState() {
        // (|00> + |11>)/sqrt 2 (Nielsen and Chuang 2010, §1.3.6): outcomes 00 and 11, 1/2 each.
        assertArrayEquals(new double[] {0.5, 0, 0, 0.5}, Simulator.seeded(1).distribution(ghz(2)),
                1e-15);
        // X on qubit 0 measured into clbit 2 of 3: outcome "100" = 4 with certainty (bit order
        // of the package conventions); qubit 1 untouched, measured into clbit 0.
        Circuit c = Circuit.builder(2, 3).x(0).measure(0, 2).measure(1, 0).build();
        double[] p = Simulator.seeded(1).distribution(c);
        assertEquals(8, p.length);
        assertEquals(1.0, p[4]);
        // Deferred measurement (Nielsen and Chuang 2010, §4.4): ry(pi/2) on qubit 1 after
        // measuring qubit 0 gives P(1) = sin^2(pi/4) = 1/2 on bit 1.
        Circuit d = Circuit.builder(2).x(0).measure(0, 0).ry(1, Math.PI / 2).measure(1, 1)
                .build();
        double[] q = Simulator.seeded(1).distribution(d);
        assertEquals(0.5, q[1], 1e-15);
        assertEquals(0.5, q[3], 1e-15);
        // Bits never written read 0, as in a run.
        assertArrayEquals(new double[] {1}, Simulator.seeded(1).distribution(
                Circuit.builder(3, 0).x(2).build()));
        // Measured values used during the shot are summed over the branches: the register
        // keeps the value measured before the X (the measurement postulate, §2.2.3).
        assertArrayEquals(new double[] {1, 0}, Simulator.seeded(1).distribution(
                Circuit.builder(1).measure(0, 0).x(0).build()), 1e-15);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Simulator.seeded(1).distribution(Circuit.builder(1, 27).build()));
        assertTrue(e.getMessage().contains("27 classical bits"), e.getMessage());
    }
}
