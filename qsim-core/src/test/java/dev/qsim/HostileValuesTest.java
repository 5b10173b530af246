package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;

import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;

import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;
import dev.qsim.observable.Observable;
import dev.qsim.observable.PauliProduct;

/**
 * Values that used to overflow after validation, and sizes that used to end in an
 * OutOfMemoryError: each is now refused with a message, or computed correctly.
 */
class HostileValuesTest {

    @Test
    void theGeneralGateStaysUnitaryForHugePhases() {
        // u(θ, φ, λ) is unitary for all real angles (Nielsen and Chuang 2010, Theorem 4.1);
        // a rounded φ + λ used to break that for large φ.
        for (double phi : new double[] {123456789.1, 1e15, -3.7e12}) {
            Operator u = Gates.u(1.0, phi, 0.3);
            assertTrue(u.isUnitary(Operator.UNITARY_TOLERANCE), "phi " + phi);
            Circuit.builder(1).apply(u, 0).build();
        }
    }

    @Test
    void operatorProductsThatOverflowAreRefused() {
        // A product's entry is a sum of products of entries (matrix multiplication, common
        // practice): 1e200 * 1e200 passes the largest double, about 1.8e308 (IEEE 754).
        Operator big = Operator.of(new Complex[][] {{Complex.ofCartesian(1e200, 0), Complex.ZERO},
            {Complex.ZERO, Complex.ONE}});
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> big.times(big));
        assertTrue(e.getMessage().contains("entry (0, 0)"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> big.tensor(big));
        assertTrue(e.getMessage().contains("overflows"), e.getMessage());
        assertEquals(1e200, big.times(Operator.identity(1)).get(0, 0).getReal());
    }

    @Test
    void observableWeightsThatOverflowAreRefused() {
        Observable h = Observable.of(1e300, "Z0");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> h.times(1e300));
        assertTrue(e.getMessage().contains("Infinity") && e.getMessage().contains("Z0"),
                e.getMessage());
        Observable twice = Observable.of(1e308, "Z0").plus(1e308, "Z0");
        e = assertThrows(IllegalArgumentException.class, twice::simplified);
        assertTrue(e.getMessage().contains("finite"), e.getMessage());
    }

    @Test
    void messagesQuoteABoundedExcerpt() {
        String huge = "X0 ".repeat(3_000_000) + "?";
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> PauliProduct.parse(huge));
        assertTrue(e.getMessage().length() < 300, "message of " + e.getMessage().length()
                + " characters");
    }

    @Test
    void shotTotalsThatOverflowAreRefused() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Tally.of(1, Map.of("0", Long.MAX_VALUE, "1", 1L)));
        assertTrue(e.getMessage().contains(Long.toString(Long.MAX_VALUE)), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> Tally.ofCounts(1,
                new long[] {0, 1}, new long[] {Long.MAX_VALUE, 1}));
        assertTrue(e.getMessage().contains("more than"), e.getMessage());
        assertEquals(Long.MAX_VALUE, Tally.of(1, Map.of("0", Long.MAX_VALUE)).shots());
    }

    @Test
    void hugeTrajectoryCountsAreRefusedBeforeAllocation() {
        // 2^31 - 1 trajectories need 16 GiB of outcomes alone: a heap refusal naming -Xmx.
        NoiseModel noise = NoiseModel.builder().afterOneQubitGates(Channel.depolarizing(0.1))
                .build();
        Circuit c = Circuit.builder(1).h(0).measure().build();
        IllegalStateException e = assertThrows(IllegalStateException.class,
                () -> Simulator.seeded(1).withNoise(noise)
                        .withEngine(Simulator.Engine.TRAJECTORIES).run(c, Integer.MAX_VALUE));
        assertTrue(e.getMessage().contains("-Xmx"), e.getMessage());
    }

    @Test
    void aDensityMatrixRefusesANonUnitaryOperatorAndKeepsItsTrace() {
        // diag(2, 1/2) is not unitary: applied as U rho U^dagger it made the trace of |0><0|
        // 4 (2.5 on a mixed state); a density matrix has trace 1 (Nielsen and Chuang 2010,
        // Theorem 2.5), so the call is refused and the matrix left as it was.
        Operator stretch = Operator.of(new Complex[][] {
            {Complex.ofCartesian(2, 0), Complex.ZERO},
            {Complex.ZERO, Complex.ofCartesian(0.5, 0)}});
        dev.qsim.noise.DensityMatrix rho = dev.qsim.noise.DensityMatrix.zero(1);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> rho.apply(stretch, 0));
        assertTrue(e.getMessage().contains("not unitary"), e.getMessage());
        assertEquals(1.0, rho.trace(), 0.0);
        assertEquals(1.0, rho.get(0, 0).getReal(), 0.0);
    }

    @Test
    void aPredictionOverTwentySixBitsIsComputedOrRefusedByHeap() {
        // A |+> qubit measured into 26 bits: every bit copies the one outcome, so the register
        // reads all 0 or all 1 with probability 1/2 each (Born rule, Nielsen and Chuang 2010,
        // sec. 2.2.3). The 2^26 probabilities (512 MiB) either fit the heap or the call says
        // how much it needs; 27 bits are refused by count, before any allocation.
        Circuit.Builder b = Circuit.builder(1, 26).h(0);
        for (int k = 0; k < 26; k++) {
            b.measure(0, k);
        }
        Circuit c = b.build();
        try {
            double[] p = Simulator.seeded(1).predict(c, 1).probabilities();
            assertEquals(1 << 26, p.length);
            assertEquals(0.5, p[0], 1e-15);
            assertEquals(0.5, p[(1 << 26) - 1], 1e-15);
        } catch (IllegalStateException heap) {
            assertTrue(heap.getMessage().contains("-Xmx"), heap.getMessage());
        }
        Circuit.Builder wider = Circuit.builder(1, 27).h(0);
        for (int k = 0; k < 27; k++) {
            wider.measure(0, k);
        }
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Simulator.seeded(1).predict(wider.build(), 1));
        assertTrue(e.getMessage().contains("27 classical bits"), e.getMessage());
    }
}
