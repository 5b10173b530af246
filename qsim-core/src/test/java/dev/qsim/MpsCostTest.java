package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

import dev.qsim.internal.EngineWork;

/**
 * The matrix-product-state counter on circuits worked by hand. A unit is {@code m n min(m, n)}
 * for each {@code m x n} block a split decomposes (the SVD's operation count up to a constant,
 * Golub and Van Loan 2013, Matrix Computations, 4th ed., sec. 8.6.3); the block of bond b has
 * {@code m = 2 l}, {@code n = 2 r} for outer bonds l and r.
 */
class MpsCostTest {

    @Test
    void aGhzChainCountedByHand() {
        // H then CNOTs along 4 qubits. The GHZ state has Schmidt rank 2 across every cut
        // (Nielsen and Chuang 2010, sec. 2.5), so each bond ends at 2.
        // H on qubit 0: 2 l r = 2. CNOT(0,1): bond 0, l = r = 1: 2 * 2 * 2 = 8.
        // CNOT(1,2): bond 1, l = 2, r = 1: 4 * 2 * 2 = 16. CNOT(2,3): bond 2, l = 2, r = 1: 16.
        // Sampling: per shot, l r per site: 1*2 + 2*2 + 2*2 + 2*1 = 12; 10 shots 120.
        Circuit ghz = Circuit.builder(4).h(0).cnot(0, 1).cnot(1, 2).cnot(2, 3).measure()
                .build();
        EngineWork e = MpsCost.work(ghz, 10, 64);
        assertEquals(2 + 8 + 16 + 16 + 120, e.mpsUnits(), 1e-9);
        assertEquals(3, e.mpsUpdates());
        assertEquals(2, e.mpsLargestBond(), 0);
        assertEquals(10, e.shots(), 0);
    }

    @Test
    void aDistantGateIsRoutedBySwapsThereAndBack() {
        // CNOT(0, 2) on 3 qubits: swap on bond 1 (l = r = 1: 8 units; the bond grows to 2),
        // the gate on bond 0 (l = 1, r = 2: 2 * 4 * 2 = 16), the swap undone on bond 1 (l = 2,
        // r = 1: 16): 40 units, 3 updates. Nothing is measured, so nothing is sampled.
        Circuit c = Circuit.builder(3).cnot(0, 2).build();
        EngineWork e = MpsCost.work(c, 1, 64);
        assertEquals(40, e.mpsUnits(), 1e-9);
        assertEquals(3, e.mpsUpdates());
    }

    @Test
    void bondsStopAtTheLimitAndTheCut() {
        // A brickwork of swaps on 10 qubits: across bond b at most 2^min(b + 1, 9 - b), 32 in
        // the middle (common practice: the Schmidt rank is at most the smaller side's
        // dimension), and the bond limit.
        Circuit.Builder b = Circuit.builder(10);
        for (int layer = 0; layer < 20; layer++) {
            for (int q = layer % 2; q + 1 < 10; q += 2) {
                b.apply(Gates.SWAP, q, q + 1);
            }
        }
        assertEquals(32, MpsCost.work(b.build(), 1, 64).mpsLargestBond(), 0);
        assertEquals(8, MpsCost.work(b.build(), 1, 8).mpsLargestBond(), 0);
        RunCost cost = Simulator.seeded(1).withEngine(Simulator.Engine.MATRIX_PRODUCT)
                .forecast(b.build(), 1);
        assertEquals(Simulator.Engine.MATRIX_PRODUCT, cost.engine());
        // The tensors are double precision whatever the setting (the engine's contract).
        assertEquals(Precision.DOUBLE, Simulator.seeded(1).withPrecision(Precision.SINGLE)
                .withEngine(Simulator.Engine.MATRIX_PRODUCT).forecast(b.build(), 1).precision());
        assertTrue(cost.seconds() > 0 && cost.bytes() > 0, cost::toString);
    }
}
