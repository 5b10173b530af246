package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Path;

import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;
import dev.qsim.noise.DeviceProfile;
import dev.qsim.stats.TallyComparison;

/** The demo device profiles: they read, fit the circuits meant for them, and run. */
class DemoProfilesTest {
    private static final Path LINE = Path.of("demo/skerryvore-line5.json");
    private static final Path PAIR = Path.of("demo/longstone-pair.json");

    @Test
    void bothDemoProfilesReadAndSayTheyAreInvented() throws IOException {
        // Format of docs/device-profile.md; the demos must not pass for real devices.
        DeviceProfile line = DeviceProfile.read(LINE);
        DeviceProfile pair = DeviceProfile.read(PAIR);
        assertEquals(5, line.qubitCount());
        assertEquals(4, line.couplings().size());
        assertEquals(2, pair.qubitCount());
        assertTrue(pair.canCouple(0, 1));
        for (DeviceProfile p : new DeviceProfile[] {line, pair}) {
            assertTrue(p.note().contains("Invented") && p.note().contains("no real device"),
                    p::note);
        }
    }

    @Test
    void aGhzCircuitAlongTheLineFitsAndOneAcrossItDoesNot() throws IOException {
        // Rule of DeviceProfile.requireCouplings: two-qubit gates only on coupled pairs.
        DeviceProfile line = DeviceProfile.read(LINE);
        Circuit along = Circuit.builder(5).h(0).cnot(0, 1).cnot(1, 2).cnot(2, 3).cnot(3, 4)
                .measure().build();
        assertSame(along, line.requireCouplings(along));
        Circuit across = Circuit.builder(5).h(0).cnot(0, 4).build();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> line.requireCouplings(across));
        assertTrue(e.getMessage().startsWith("instruction 1 (cnot on qubits 0, 4) needs a"
                + " coupling between qubits 0 and 4, which device Skerryvore does not have"),
                e.getMessage());
    }

    @Test
    void aGhzCircuitRunsUnderTheLinesNoise() throws IOException {
        // Simulator.seeded(s).withNoise(profile.noiseModel()): the seeded tally agrees with the
        // exact noisy distribution by Pearson's chi-square (TallyComparison), and the noise
        // puts weight outside the two ideal GHZ outcomes (Greenberger, Horne, Shimony and
        // Zeilinger 1990: ideal weight 1/2 each on 00000 and 11111).
        DeviceProfile line = DeviceProfile.read(LINE);
        Circuit ghz = line.requireCouplings(Circuit.builder(5).h(0).cnot(0, 1).cnot(1, 2)
                .cnot(2, 3).cnot(3, 4).measure().build());
        Simulator sim = Simulator.seeded(2024).withNoise(line.noiseModel());
        double[] exact = sim.distribution(ghz);
        double ghzWeight = exact[0] + exact[31];
        assertTrue(ghzWeight < 0.99 && ghzWeight > 0.5, "GHZ weight " + ghzWeight);
        Tally t = sim.run(ghz, 5000);
        double pValue = TallyComparison.of(t, exact).chiSquarePValue();
        assertTrue(pValue > 1e-4, "p = " + pValue);
    }

    @Test
    void thePairsReadoutErrorsGiveTheIdleDistribution() throws IOException {
        // With no gates only readout error acts, independently per qubit (NoiseModel javadoc):
        // P(00) = (1 - P0(1|0)) (1 - P1(1|0)), P(01) = P0(1|0) (1 - P1(1|0)), and so on.
        DeviceProfile pair = DeviceProfile.read(PAIR);
        double[] d = Simulator.seeded(1).withNoise(pair.noiseModel())
                .distribution(pair.requireCouplings(Circuit.builder(2).measure().build()));
        double a = pair.readoutP1Given0(0);
        double b = pair.readoutP1Given0(1);
        assertEquals((1 - a) * (1 - b), d[0], 1e-12);
        assertEquals(a * (1 - b), d[1], 1e-12);
        assertEquals((1 - a) * b, d[2], 1e-12);
        assertEquals(a * b, d[3], 1e-12);
    }
}
