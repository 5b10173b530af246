package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.junit.jupiter.api.Test;

import dev.qsim.StateVector;
import dev.qsim.observable.Expectation;

class CriticalIsingChainTest {

    @Test
    void theExactEnergiesAreThoseOfSmallChainsAndTendToMinusFourOverPi() {
        // One spin: H = -X, energy -1. Two spins: H = -Z0 Z1 - X0 - X1, whose lowest
        // eigenvalue is -√5 (diagonalised by hand in the basis |00>+|11>, |01>+|10>, where the
        // 2x2 block is [[-1, -2], [-2, 1]]).
        assertEquals(-1, CriticalIsingChain.exactEnergy(1), 1e-15);
        assertEquals(-Math.sqrt(5), CriticalIsingChain.exactEnergy(2), 1e-14);
        // E0(N)/N = -4/π + (1 - 2/π)/N + O(1/N²) (Pfeuty 1970): N·(E0/N + 4/π) approaches the
        // surface energy within 1/N.
        for (int n : new int[] {20, 40, 80, 160, 1000}) {
            double surface = n * (CriticalIsingChain.exactEnergy(n) / n + 4 / Math.PI);
            assertEquals(CriticalIsingChain.SURFACE, surface, 1.0 / n, "N = " + n);
        }
    }

    @Test
    void shallowCircuitsBoundTheChainEnergiesFromAbove() {
        Capture out = new Capture();
        CriticalIsingChain.Report r = CriticalIsingChain.run(out.stream(), 3, 40);
        List<CriticalIsingChain.Depth> depths = r.depths();
        assertEquals(3, depths.size());
        for (int p = 0; p < depths.size(); p++) {
            double e = depths.get(p).energyPerSpin();
            // The variational principle (Rayleigh-Ritz; Sakurai and Napolitano 2011, Modern
            // Quantum Mechanics, §5.4): no state has less energy per spin than the ground state.
            assertTrue(e >= CriticalIsingChain.INFINITE_CHAIN, out::text);
            // A deeper circuit contains the shallower one (last layer's angles 0).
            if (p > 0) {
                assertTrue(e <= depths.get(p - 1).energyPerSpin() + 1e-9, out::text);
            }
        }
        double e3 = depths.get(2).energyPerSpin();
        assertEquals(List.of(10, 20, 40), r.chains().stream().map(CriticalIsingChain.Chain::spins)
                .toList());
        for (CriticalIsingChain.Chain c : r.chains()) {
            assertTrue(c.energyPerSpin() >= c.exactPerSpin(), out::text);
            // The middle term sees only its light cone (Farhi, Goldstone and Gutmann 2014, §3),
            // so it equals the light-cone chain's value.
            assertEquals(e3, c.middleTerm(), 1e-10, "N = " + c.spins());
            assertTrue(c.largestBond() <= 8, out::text);
        }
        // The 10-spin chain on the matrix product state equals the state vector's energy.
        double sv = Expectation.of(CriticalIsingChain.hamiltonian(10), StateVector.zero(10)
                .apply(CriticalIsingChain.ansatz(10, 3).bind(depths.get(2).angles()))) / 10;
        assertEquals(sv, r.chains().get(0).energyPerSpin(), 1e-12);
        assertTrue(r.truncated().maxBondDimension() <= CriticalIsingChain.TIGHT_BOND_LIMIT);
        assertTrue(r.truncated().fidelityLowerBound() <= r.truncated().fidelityEstimate());
        assertTrue(out.text().contains("surface energy 1 - 2/π = 0.3634"), out::text);
    }

    @Test
    void badArgumentsAreRefused() {
        Capture out = new Capture();
        UsageException e = assertThrows(UsageException.class,
                () -> CriticalIsingChain.fromArgs(new String[] {"0"}, out.stream()));
        assertTrue(e.getMessage().contains("got 0"), e::getMessage);
        e = assertThrows(UsageException.class,
                () -> CriticalIsingChain.fromArgs(new String[] {"three"}, out.stream()));
        assertTrue(e.getMessage().contains("'three'"), e::getMessage);
        e = assertThrows(UsageException.class,
                () -> CriticalIsingChain.fromArgs(new String[] {"4", "11"}, out.stream()));
        assertTrue(e.getMessage().contains("12") && e.getMessage().contains("got 11"),
                e::getMessage);
        e = assertThrows(UsageException.class,
                () -> CriticalIsingChain.fromArgs(new String[] {"4", "12", "5"}, out.stream()));
        assertTrue(e.getMessage().contains("'5'"), e::getMessage);
        assertEquals("", out.text());
    }
}
