package dev.qsim.stats;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.qsim.Circuit;
import org.junit.jupiter.api.Test;

class IdealPredictionTest {

    @Test
    void bellPairGivesHalfOnAgreeingOutcomes() {
        // (|00> + |11>)/sqrt 2 (Nielsen and Chuang 2010, sec. 1.3.6): outcomes 00 and 11, 1/2 each.
        double[] p = IdealPrediction.outcomes(Circuit.builder(2).h(0).cnot(0, 1).measure().build());
        assertArrayEquals(new double[] {0.5, 0, 0, 0.5}, p, 1e-15);
    }

    @Test
    void measurementsMapQubitsToTheirClbits() {
        // X on qubit 0 measured into clbit 2 of 3: outcome "100" = 4 with certainty
        // (bit order of the package conventions); qubit 1 untouched, measured into clbit 0.
        Circuit c = Circuit.builder(2, 3).x(0).measure(0, 2).measure(1, 0).build();
        double[] p = IdealPrediction.outcomes(c);
        assertEquals(8, p.length);
        assertEquals(1.0, p[4]);
    }

    @Test
    void gatesOnOtherQubitsMayFollowAMeasurement() {
        // Deferred measurement (Nielsen and Chuang 2010, sec. 4.4): ry(pi/2) on qubit 1 after
        // measuring qubit 0 gives P(1) = sin^2(pi/4) = 1/2 on bit 1.
        Circuit c = Circuit.builder(2).x(0).measure(0, 0).ry(1, Math.PI / 2).measure(1, 1).build();
        double[] p = IdealPrediction.outcomes(c);
        assertEquals(0.5, p[1], 1e-15);
        assertEquals(0.5, p[3], 1e-15);
    }

    @Test
    void withoutMeasurementsTheQubitsAreTheOutcomes() {
        double[] p = IdealPrediction.outcomes(Circuit.builder(3, 0).x(2).build());
        assertEquals(1.0, p[4]); // "100" = qubit 2 set
    }

    @Test
    void refusesWhatItCannotPredict() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> IdealPrediction.outcomes(Circuit.builder(1).measure(0, 0).x(0).build()));
        assertTrue(e.getMessage().contains("instruction 1"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> IdealPrediction.outcomes(Circuit.builder(1).reset(0).build()));
        assertTrue(e.getMessage().contains("reset"), e.getMessage());
    }
}
