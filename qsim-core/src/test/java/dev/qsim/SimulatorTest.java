package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;

import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

/** Shots, mid-circuit measurement, reset, conditions and reproducibility. */
class SimulatorTest {
    @Test
    void bellPairGivesOnlyCorrelatedOutcomes() {
        // (|00> + |11>)/√2: Nielsen and Chuang 2010, §1.3.6.
        Tally t = Simulator.seeded(11).run(Circuit.builder(2).h(0).cnot(0, 1).measure().build(),
                4000);
        assertEquals(4000, t.shots());
        assertEquals(4000, t.count("00") + t.count("11"));
        // Binomial(4000, 1/2): 4 standard deviations = 4 * sqrt(1000) ≈ 126 (common practice).
        assertTrue(Math.abs(t.count("00") - 2000) < 127, t.toString());
    }

    @Test
    void sameSeedSameTallyWhateverTheThreadCount() {
        Circuit.Builder b = Circuit.builder(15);
        for (int q = 0; q < 15; q++) {
            b.h(q).rz(q, 0.1 * q);
        }
        for (int q = 0; q < 14; q++) {
            b.cnot(q, q + 1);
        }
        Circuit c = b.measure().build();
        Tally one = Simulator.seeded(5).withThreads(1).run(c, 3000);
        Tally two = Simulator.seeded(5).withThreads(2).run(c, 3000);
        Tally three = Simulator.seeded(5).withThreads(3).run(c, 3000);
        assertEquals(one, two);
        assertEquals(one, three);
        assertEquals(one, Simulator.seeded(5).withThreads(1).run(c, 3000));
    }

    @Test
    void withSeedKeepsEverySettingAndRunsAsThatSeed() {
        Simulator base = Simulator.seeded(5).withThreads(1).withFusion(false)
                .withEngine(Simulator.Engine.TABLEAU).withPrecision(Precision.SINGLE)
                .withBondLimit(17).withTruncation(1e-9);
        Simulator other = base.withSeed(9);
        assertEquals(9, other.seed());
        assertEquals(5, base.seed(), "the original is unchanged");
        assertEquals(base.threads(), other.threads());
        assertEquals(base.fusion(), other.fusion());
        assertEquals(base.engine(), other.engine());
        assertEquals(base.precision(), other.precision());
        assertEquals(base.noise(), other.noise());
        assertEquals(base.bondLimit(), other.bondLimit());
        assertEquals(base.truncation(), other.truncation());
        // GHZ-like Clifford circuit with H on every qubit: many distinct outcomes, so two seeds
        // giving one tally would be a coincidence of probability far below 1e-9.
        Circuit.Builder b = Circuit.builder(12).h(0);
        for (int q = 1; q < 12; q++) {
            b.h(q).cnot(q - 1, q);
        }
        Circuit c = b.measure().build();
        Tally nine = Simulator.seeded(9).withThreads(1).withFusion(false)
                .withEngine(Simulator.Engine.TABLEAU).withPrecision(Precision.SINGLE)
                .withBondLimit(17).withTruncation(1e-9).run(c, 500);
        assertEquals(nine, other.run(c, 500));
        assertTrue(!nine.equals(base.run(c, 500)), "another seed, other shots");
    }

    @Test
    void measurementsAtTheEndSampleLikeShotByShot() {
        // Deferred-measurement principle (Nielsen and Chuang 2010, §4.4): sampling the final
        // state and simulating each shot give the same distribution. Compared through the
        // probabilities of the final state within 4 standard deviations.
        Circuit c = Circuit.builder(3).h(0).ry(1, 1.1).cnot(0, 2).measure().build();
        // A reset on a fresh qubit makes the run shot by shot without changing the state.
        Circuit slow = Circuit.builder(3).reset(2).append(c).build();
        assertTrue(c.measuresAtEnd());
        assertTrue(!slow.measuresAtEnd());
        int shots = 20000;
        Tally fast = Simulator.seeded(3).run(c, shots);
        Tally step = Simulator.seeded(3).run(slow, shots);
        double[] p = StateVector.zero(3).apply(Circuit.builder(3).h(0).ry(1, 1.1).cnot(0, 2)
                .build()).probabilities();
        for (int i = 0; i < 8; i++) {
            double sd = Math.sqrt(shots * p[i] * (1 - p[i]));
            assertEquals(shots * p[i], fast.count(i), 4 * sd + 1e-9, "fast " + i);
            assertEquals(shots * p[i], step.count(i), 4 * sd + 1e-9, "shot by shot " + i);
        }
    }

    @Test
    void midCircuitMeasurementAndConditionCorrectAQubit() {
        // Measure qubit 0 of a superposition, copy the outcome onto qubit 1 with a conditioned X:
        // both clbits always agree (definition of classical feed-forward; common practice).
        Circuit c = Circuit.builder(2).h(0).measure(0, 0).ifBit(0, 1, b -> b.x(1))
                .measure(1, 1).build();
        Tally t = Simulator.seeded(21).run(c, 2000);
        assertEquals(2000, t.count("00") + t.count("11"), t.toString());
        assertTrue(t.count("00") > 800 && t.count("11") > 800, t.toString());
    }

    @Test
    void resetReturnsAQubitToZero() {
        Circuit c = Circuit.builder(1).h(0).reset(0).measure().build();
        assertEquals(1000, Simulator.seeded(2).run(c, 1000).count("0"));
        Circuit d = Circuit.builder(1).x(0).reset(0).x(0).measure().build();
        assertEquals(1000, Simulator.seeded(2).run(d, 1000).count("1"));
    }

    @Test
    void unmeasuredClbitsReadZeroAndRepeatedMeasurementAgrees() {
        Circuit c = Circuit.builder(2, 4).h(0).measure(0, 3).measure(0, 1).build();
        Tally t = Simulator.seeded(4).run(c, 500);
        assertEquals(4, t.width());
        assertEquals(500, t.count("0000") + t.count("1010"), t.toString());
        Tally none = Simulator.seeded(4).run(Circuit.builder(2).h(0).build(), 7);
        assertEquals(Map.of("00", 7L), none.outcomes());
    }

    @Test
    void stateAfterCollapsesOnTheSeededOutcome() {
        Circuit c = Circuit.builder(2).h(0).cnot(0, 1).measure(0, 0).build();
        StateVector s = Simulator.seeded(8).stateAfter(c);
        // After measuring one half of a Bell pair the state is |00> or |11> (N&C 2010, §1.3.6).
        double p00 = s.probability(0);
        double p11 = s.probability(3);
        // Renormalising by 1/sqrt(1/2) leaves at most a rounding error of a few ulps.
        assertTrue((Math.abs(p00 - 1) < 1e-15 && p11 == 0)
                || (p00 == 0 && Math.abs(p11 - 1) < 1e-15), s.toString());
        assertEquals(1, s.norm(), 1e-15);
        assertEquals(s.probability(3), Simulator.seeded(8).stateAfter(c).probability(3));
    }

    @Test
    void stateVectorMeasureCollapsesWithBornProbability() {
        // P(1) = sin^2(θ/2) after ry(θ)|0> (Nielsen and Chuang 2010, eq. 4.5); 10,000 draws,
        // each from a fresh copy, within 4 standard deviations.
        double theta = 1.2;
        StateVector base = StateVector.zero(1).apply(Gates.ry(theta), 0);
        var rng = RandomSource.XO_RO_SHI_RO_128_PP.create(99L);
        int ones = 0;
        int n = 10000;
        for (int i = 0; i < n; i++) {
            StateVector s = base.copy();
            int bit = s.measure(0, rng);
            ones += bit;
            assertEquals(1.0, s.probability(bit), 1e-15);
        }
        double p = Math.pow(Math.sin(theta / 2), 2);
        assertEquals(n * p, ones, 4 * Math.sqrt(n * p * (1 - p)));
    }
}
