package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class HydrogenGroundStateTest {

    @Test
    void integralsReproduceTheTextbookOrbitalAndHartreeFockEnergies() {
        // Szabo and Ostlund (1996), Modern Quantum Chemistry, §3.5.2, H2 STO-3G at R = 1.4 bohr
        // (values from memory): ε1 = -0.5782, ε2 = 0.6703, E(HF) = -1.1167 hartree.
        assertEquals(-0.5782, HydrogenGroundState.H11 + HydrogenGroundState.J11, 1e-4);
        assertEquals(0.6703, HydrogenGroundState.H22 + 2 * HydrogenGroundState.J12
                - HydrogenGroundState.K12, 1e-4);
        assertEquals(-1.1167, 2 * HydrogenGroundState.H11 + HydrogenGroundState.J11 + 1 / 1.4,
                1e-4);
    }

    @Test
    void variationalEnergyMatchesThePublishedFullCi() {
        Capture out = new Capture();
        HydrogenGroundState.Result r = HydrogenGroundState.run(out.stream(), 5, 20_000);
        // Full CI of minimal-basis H2 at R = 1.4 bohr: -1.1373 hartree (Szabo and Ostlund 1996,
        // §4.1, from memory; -1.137 Ha is the value usually quoted for STO-3G near 0.74 Å).
        assertEquals(-1.1373, r.energy(), 1e-4);
        // Closed form of the 2x2 CI matrix [[E00, K12], [K12, E11]] (Szabo and Ostlund 1996,
        // §4.1): E = (E00 + E11)/2 - sqrt(((E11 - E00)/2)² + K12²), plus 1/R.
        double e00 = 2 * HydrogenGroundState.H11 + HydrogenGroundState.J11;
        double e11 = 2 * HydrogenGroundState.H22 + HydrogenGroundState.J22;
        double k = HydrogenGroundState.K12;
        double closed = (e00 + e11) / 2 - Math.hypot((e11 - e00) / 2, k) + 1 / 1.4;
        assertEquals(closed, r.energy(), 1e-10);
        // Hartree-Fock at θ = 0: -1.1167 hartree (Szabo and Ostlund 1996, §3.5.2).
        assertEquals(-1.1167, r.hartreeFock(), 1e-4);
        // Shot estimate within 4 standard errors (central limit theorem, common practice).
        assertTrue(Math.abs(r.estimate().value() - r.energy())
                <= 4 * r.estimate().standardError(), r.estimate()::toString);
        assertTrue(out.text().contains("    0  -1.116"), out.text());
        // The weights by hand from the integrals above (Szabo and Ostlund 1996, §3.5.2):
        // E00 = 2 h11 + J11 = -1.831, E11 = 2 h22 + J22 = -0.2537, E01 = h11 + h22 + J12 =
        // -1.0648; c0 = ((E00 + E11)/2 + E01)/2 + 1/R = -0.3392893, c1 = (E00 - E11)/4 =
        // -0.394325, c2 = ((E00 + E11)/2 - E01)/2 = 0.011225; printed to six decimals.
        assertTrue(out.text().contains("H = -0.339289 I - 0.394325 Z0 - 0.394325 Z1"
                + " + 0.011225 Z0 Z1 + 0.1813 X0 X1\n"), out.text());
        assertTrue(out.text().contains("variational minimum        -1.1372"), out.text());
    }

    @Test
    void badArgumentsAreRefused() {
        Capture out = new Capture();
        UsageException e = assertThrows(UsageException.class,
                () -> HydrogenGroundState.fromArgs(new String[] {"1", "1"}, out.stream()));
        assertTrue(e.getMessage().contains("at least 2 for a standard error, got 1"),
                e::getMessage);
        e = assertThrows(UsageException.class,
                () -> HydrogenGroundState.fromArgs(new String[] {"x"}, out.stream()));
        assertTrue(e.getMessage().contains("'x'"), e::getMessage);
    }
}
