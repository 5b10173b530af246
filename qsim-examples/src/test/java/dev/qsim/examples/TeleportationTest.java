package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Locale;
import java.util.Map;

import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class TeleportationTest {

    @ParameterizedTest
    @CsvSource({
        // theta, phi, seed: angles spread over the sphere, including theta > pi where
        // cos(theta/2) < 0.
        "1.1,  0.7,  4096",
        "0.0,  0.0,  11",
        "3.141592653589793, 1.3, 12",
        "2.4, -2.9,  13",
        "4.0,  5.5,  14",
    })
    void receiverHoldsTheMessageInEveryBranch(double theta, double phi, long seed) {
        Teleportation.Result r = Teleportation.run(new Capture().stream(), theta, phi, seed,
                500);
        // Each of the four (m0, m1) outcomes has probability 1/4 whatever the message
        // (Nielsen & Chuang 2010, sec. 1.3.7), so 64 consecutive seeds miss one with
        // probability below 4 * (3/4)^64 < 1e-7.
        assertEquals(4, r.branches().size(), () -> "branches seen from seed " + seed);
        // The message rz(phi) ry(theta)|0> = (cos(theta/2) e^{-i phi/2}, sin(theta/2) e^{i phi/2})
        // from the rotation matrices of Nielsen & Chuang 2010, eqs. 4.5 and 4.6; teleportation
        // leaves exactly this state on qubit 2, up to a global phase (Bennett et al. 1993,
        // Phys. Rev. Lett. 70, 1895).
        double e0r = Math.cos(theta / 2) * Math.cos(phi / 2);
        double e0i = -Math.cos(theta / 2) * Math.sin(phi / 2);
        double e1r = Math.sin(theta / 2) * Math.cos(phi / 2);
        double e1i = Math.sin(theta / 2) * Math.sin(phi / 2);
        for (Teleportation.Branch b : r.branches()) {
            Complex z = b.zero();
            Complex o = b.one();
            // <e|psi> written out by hand.
            double re = e0r * z.getReal() + e0i * z.getImaginary()
                    + e1r * o.getReal() + e1i * o.getImaginary();
            double im = e0r * z.getImaginary() - e0i * z.getReal()
                    + e1r * o.getImaginary() - e1i * o.getReal();
            double fidelity = re * re + im * im;
            String where = "theta " + theta + ", phi " + phi + ", seed " + b.seed()
                    + ", branch m0=" + b.bit0() + " m1=" + b.bit1();
            assertEquals(1.0, fidelity, 1e-10, where);
            assertEquals(fidelity, b.fidelity(), 1e-12, where);
            assertEquals(1.0, z.abs() * z.abs() + o.abs() * o.abs(), 1e-10, where);
        }
    }

    @ParameterizedTest
    @CsvSource({
        "1.1, 0.7, 4096",
        "2.0, 0.3, 77",
        "0.5, 1.9, 78",
    })
    void tallyOfTheReceiverMatchesTheMessageProbability(double theta, double phi, long seed) {
        int shots = 4000;
        Teleportation.Result r = Teleportation.run(new Capture().stream(), theta, phi, seed,
                shots);
        // P(1) = |sin(theta/2)|^2 for ry(theta)|0> (Nielsen & Chuang 2010, eq. 4.5), unchanged
        // by rz and carried over by teleportation; binomial standard error sqrt(p(1-p)/n).
        double p = Math.pow(Math.sin(theta / 2), 2);
        double se = Math.sqrt(p * (1 - p) / shots);
        double measured = (double) r.receivedOnes() / shots;
        assertTrue(Math.abs(measured - p) <= 4 * se, () -> "P(1) " + measured + " vs " + p
                + " (4 SE = " + 4 * se + "), seed " + seed);
        assertEquals(shots, r.tally().shots());
        // The sent bits are uniform whatever the message (Nielsen & Chuang 2010, sec. 1.3.7):
        // each of clbits 0 and 1 reads 1 with probability 1/2.
        double seHalf = Math.sqrt(0.25 / shots);
        for (int clbit = 0; clbit < 2; clbit++) {
            long ones = 0;
            for (Map.Entry<String, Long> e : r.tally().outcomes().entrySet()) {
                if (e.getKey().charAt(2 - clbit) == '1') {
                    ones += e.getValue();
                }
            }
            double f = (double) ones / shots;
            int c = clbit;
            assertTrue(Math.abs(f - 0.5) <= 4 * seHalf, () -> "clbit " + c + " P(1) " + f
                    + ", seed " + seed);
        }
    }

    @Test
    void reportShowsTheExpectedProbabilityAndEveryBranch() {
        Capture out = new Capture();
        Teleportation.Result r = Teleportation.run(out.stream(), 1.1, 0.7, 4096, 1000);
        String text = out.text();
        String expected = String.format(Locale.ROOT, "%.4f", Math.pow(Math.sin(0.55), 2));
        assertTrue(text.contains(expected), text);
        assertTrue(text.contains("Branches seen: " + r.branches().size() + " of 4"), text);
    }

    @Test
    void circuitUsesMidCircuitMeasurementAndConditions() {
        // 2 gates for the message, 2 for the pair, 2 for the rotation, 2 measurements and
        // 2 ifBit blocks (each counts as one instruction by the contract in DESIGN.md).
        assertEquals(10, Teleportation.circuit(0.3, 0.2, false).size());
        assertEquals(11, Teleportation.circuit(0.3, 0.2, true).size());
        assertEquals(3, Teleportation.circuit(0.3, 0.2, true).clbits());
    }

    @Test
    void refusesAnAngleThatIsNotFinite() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Teleportation.circuit(Double.NaN, 0.0, true));
        assertTrue(e.getMessage().contains("theta") && e.getMessage().contains("NaN"),
                e.getMessage());
    }
}
