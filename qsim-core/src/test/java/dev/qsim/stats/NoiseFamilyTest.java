package dev.qsim.stats;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;

class NoiseFamilyTest {
    private static final Circuit GHZ = Circuit.builder(3).h(0).cnot(0, 1).cnot(1, 2).measure()
            .build();

    private static double[] distribution(NoiseModel model, Circuit circuit) {
        return Simulator.seeded(0).withThreads(1).withNoise(model).distribution(circuit);
    }

    @Test
    void errorRatesBuildTheModelTheyName() {
        // The model is defined as depolarizing after one-qubit gates, two-qubit depolarizing
        // after two-qubit gates and one readout error on every qubit (definition, by hand with
        // the builder).
        ErrorRates r = new ErrorRates(0.01, 0.04, 0.02, 0.03);
        NoiseModel byHand = NoiseModel.builder()
                .afterOneQubitGates(Channel.depolarizing(0.01))
                .afterTwoQubitGates(Channel.twoQubitDepolarizing(0.04))
                .readoutError(0.02, 0.03).build();
        assertArrayEquals(distribution(byHand, GHZ), distribution(r.model(), GHZ), 1e-15);
        assertTrue(ErrorRates.none().model().isIdeal());
        assertTrue(ErrorRates.none().isZero());
    }

    @Test
    void readoutRatesGiveTheConfusionOfOneBit() {
        // x then measure: the device reports 0 with probability P(0|1) (definition of the
        // readout error, NoiseModel javadoc); no gate noise on the x since the depolarizing rate
        // is 0 here.
        Circuit flip = Circuit.builder(1).x(0).measure().build();
        double[] p = distribution(new ErrorRates(0, 0, 0.1, 0.07).model(), flip);
        assertEquals(0.07, p[0], 1e-15);
        assertEquals(0.93, p[1], 1e-15);
    }

    @Test
    void theScaleFamilyMultipliesEveryRate() {
        // lambda = 0 is the ideal model and lambda = 1 the base (definition); lambda = 2 doubles
        // every rate.
        ErrorRates base = new ErrorRates(0.01, 0.04, 0.02, 0.03);
        NoiseFamily f = NoiseFamily.scaled(base);
        assertEquals(List.of("scale"), f.names());
        assertEquals(0, f.lower(0));
        // The range ends where a rate reaches its kind's limit: 0.5 / 0.03 for P(0|1).
        assertEquals(0.5 / 0.03, f.upper(0), 1e-12);
        assertTrue(f.model(0).isIdeal());
        assertArrayEquals(distribution(base.model(), GHZ), distribution(f.model(1), GHZ), 1e-15);
        assertArrayEquals(distribution(new ErrorRates(0.02, 0.08, 0.04, 0.06).model(), GHZ),
                distribution(f.model(2), GHZ), 1e-15);
        assertEquals(0.5, base.scaled(base.maxScale()).readoutZeroGivenOne(), 1e-15);
    }

    @Test
    void theKindFamilySetsTheChosenRatesAndKeepsTheOthers() {
        // Parameters in the order given, the other rates from the fixed ones (definition).
        ErrorRates fixed = new ErrorRates(0.01, 0.3, 0.02, 0.03);
        NoiseFamily f = NoiseFamily.ofKinds(fixed, ErrorKind.READOUT_SYMMETRIC,
                ErrorKind.TWO_QUBIT_DEPOLARIZING);
        assertEquals(List.of("readout", "depolarizing2"), f.names());
        assertEquals(0.5, f.upper(0));
        assertEquals(15 / 16.0, f.upper(1));
        assertArrayEquals(distribution(new ErrorRates(0.01, 0.06, 0.04, 0.04).model(), GHZ),
                distribution(f.model(0.04, 0.06), GHZ), 1e-15);
        NoiseFamily oneWay = NoiseFamily.ofKinds(ErrorRates.none(),
                ErrorKind.READOUT_ZERO_GIVEN_ONE, ErrorKind.READOUT_ONE_GIVEN_ZERO,
                ErrorKind.ONE_QUBIT_DEPOLARIZING, ErrorKind.TWO_QUBIT_DEPOLARIZING);
        assertEquals(4, oneWay.size());
        assertArrayEquals(distribution(new ErrorRates(0.05, 0.06, 0.02, 0.01).model(), GHZ),
                distribution(oneWay.model(0.01, 0.02, 0.05, 0.06), GHZ), 1e-15);
    }

    @Test
    void aFamilyOfOurOwnGetsACopyOfTheVector() {
        double[] seen = new double[1];
        NoiseFamily f = NoiseFamily.of(List.of("flip"), new double[] {0}, new double[] {0.5},
                theta -> {
                    seen[0] = theta[0];
                    theta[0] = 99; // must not reach the caller's array
                    return NoiseModel.none();
                });
        double[] theta = {0.25};
        f.model(theta);
        assertEquals(0.25, seen[0]);
        assertEquals(0.25, theta[0]);
        assertTrue(f.toString().contains("flip in [0, 0.5]"), f.toString());
    }

    @Test
    void badRatesAreRefusedNamingTheRateAndItsRange() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new ErrorRates(0.8, 0, 0, 0));
        assertTrue(e.getMessage().contains("depolarizing1") && e.getMessage().contains("0.8")
                && e.getMessage().contains("[0, 0.75]"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> new ErrorRates(0, 0, Double.NaN, 0));
        assertTrue(e.getMessage().contains("readout1given0") && e.getMessage().contains("NaN"),
                e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> new ErrorRates(0, -0.1, 0, 0));
        assertTrue(e.getMessage().contains("-0.1"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> ErrorRates.none().with(ErrorKind.READOUT_SYMMETRIC, 0.6));
        assertTrue(e.getMessage().contains("readout") && e.getMessage().contains("0.6"),
                e.getMessage());
        ErrorRates base = new ErrorRates(0.01, 0, 0, 0);
        e = assertThrows(IllegalArgumentException.class, () -> base.scaled(76));
        assertTrue(e.getMessage().contains("76") && e.getMessage().contains("75"),
                e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseFamily.scaled(ErrorRates.none()));
        assertTrue(e.getMessage().contains("all zero"), e.getMessage());
    }

    @Test
    void badKindsAreRefusedNamingTheKind() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> NoiseFamily.ofKinds(ErrorRates.none()));
        assertTrue(e.getMessage().contains("at least one"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseFamily.ofKinds(ErrorRates.none(), ErrorKind.READOUT_SYMMETRIC,
                        ErrorKind.READOUT_SYMMETRIC));
        assertTrue(e.getMessage().contains("READOUT_SYMMETRIC is given twice"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseFamily.ofKinds(ErrorRates.none(), ErrorKind.READOUT_ZERO_GIVEN_ONE,
                        ErrorKind.READOUT_SYMMETRIC));
        assertTrue(e.getMessage().contains("READOUT_ZERO_GIVEN_ONE"), e.getMessage());
    }

    @Test
    void badFamiliesAreRefusedNamingTheParameter() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> NoiseFamily.of(List.of(), new double[0], new double[0],
                        t -> NoiseModel.none()));
        assertTrue(e.getMessage().contains("[1, 4]") && e.getMessage().contains("but was 0"),
                e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseFamily.of(List.of("a", "b", "c", "d", "e"), new double[5],
                        new double[] {1, 1, 1, 1, 1}, t -> NoiseModel.none()));
        assertTrue(e.getMessage().contains("but was 5"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseFamily.of(List.of("a", "a"), new double[2], new double[] {1, 1},
                        t -> NoiseModel.none()));
        assertTrue(e.getMessage().contains("'a' is given twice"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseFamily.of(List.of("a b"), new double[1], new double[] {1},
                        t -> NoiseModel.none()));
        assertTrue(e.getMessage().contains("'a b'"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseFamily.of(List.of("a", "b"), new double[2], new double[] {1, -0.5},
                        t -> NoiseModel.none()));
        assertTrue(e.getMessage().contains("'b'") && e.getMessage().contains("[0.0, -0.5]"),
                e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseFamily.of(List.of("b"), new double[] {0}, new double[] {0},
                        t -> NoiseModel.none()));
        assertTrue(e.getMessage().contains("[0.0, 0.0]"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseFamily.of(List.of("c"), new double[] {0},
                        new double[] {Double.POSITIVE_INFINITY}, t -> NoiseModel.none()));
        assertTrue(e.getMessage().contains("Infinity"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseFamily.of(List.of("a", "b"), new double[1], new double[2],
                        t -> NoiseModel.none()));
        assertTrue(e.getMessage().contains("2 parameter names but 1 lower"), e.getMessage());
    }

    @Test
    void badParameterVectorsAreRefusedNamingTheValue() {
        NoiseFamily f = NoiseFamily.ofKinds(ErrorRates.none(), ErrorKind.TWO_QUBIT_DEPOLARIZING,
                ErrorKind.READOUT_SYMMETRIC);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> f.model(0.1));
        assertTrue(e.getMessage().contains("2 parameter(s)")
                && e.getMessage().contains("1 value(s)"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> f.model(0.1, 0.7));
        assertTrue(e.getMessage().contains("'readout'") && e.getMessage().contains("0.7")
                && e.getMessage().contains("[0.0, 0.5]"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> f.model(Double.NaN, 0.1));
        assertTrue(e.getMessage().contains("'depolarizing2'") && e.getMessage().contains("NaN"),
                e.getMessage());
        NoiseFamily nothing = NoiseFamily.of(List.of("x"), new double[] {0}, new double[] {1},
                t -> null);
        e = assertThrows(IllegalArgumentException.class, () -> nothing.model(0.5));
        assertTrue(e.getMessage().contains("[0.5]"), e.getMessage());
        assertThrows(IndexOutOfBoundsException.class, () -> f.lower(2));
    }
}
