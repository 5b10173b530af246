package dev.qsim.examples.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;
import dev.qsim.noise.DeviceProfile;
import dev.qsim.stats.TallyFiles;
import dev.qsim.text.QasmReader;

/**
 * The device check through the tool: {@code compare} against ideal and noisy predictions with a
 * tolerance verdict, {@code --device}, {@code --fit}, circuits with mid-circuit measurement, and
 * the refusals a user meets.
 */
class DeviceCheckTest {
    private static final String DEMO = "demo/";

    @TempDir
    Path dir;

    private static ToolRun tool(String... args) {
        return new ToolRun(args);
    }

    @Test
    void aBellTallyWithOneStrayShotPassesAtTheToleranceAndFailsAtATighterOne()
            throws IOException {
        // 5,000 x 00, 4,999 x 11, 1 x 01 against the ideal 1/2, 1/2: the total variation
        // distance is (|0.5 - 0.5| + |0.5 - 0.4999| + |0 - 0.0001|) / 2 = 0.0001 (its
        // definition, common practice). A tolerance test passes when the interval's upper end
        // is at most the tolerance (Wellek 2010, "Testing Statistical Hypotheses of
        // Equivalence and Noninferiority", 2nd ed.).
        Path tally = dir.resolve("bell-device.csv");
        Files.writeString(tally, "bits,count\n00,5000\n11,4999\n01,1\n");
        ToolRun pass = tool("compare", tally.toString(), "--circuit", DEMO + "bell.qasm",
                "--require-match");
        assertEquals(0, pass.code, pass::toString);
        assertTrue(pass.out.contains("(observed 0.0001)"), pass::toString);
        assertTrue(pass.out.contains("verdict                    PASS"), pass::toString);
        assertTrue(pass.out.contains("shots on impossible        1 of 10000"), pass::toString);
        ToolRun fail = tool("compare", tally.toString(), "--circuit", DEMO + "bell.qasm",
                "--require-match", "--tolerance", "0.0005");
        assertEquals(Cli.EXIT_MISMATCH, fail.code, fail::toString);
        assertTrue(fail.out.contains("FAIL"), fail::toString);
    }

    @Test
    void aDevicesTallyIsComparedWithItsProfilesNoisyPrediction() throws IOException {
        // The demo tally has 335 of 4,000 shots on outcomes a GHZ state never gives (Greenberger,
        // Horne and Zeilinger 1989: only 00000 and 11111), so against the ideal prediction it
        // is far off; against the chip's own profile it is within 0.05.
        String[] base = {"compare", DEMO + "ghz5-pallet.csv", "--circuit", DEMO + "ghz5.qasm",
            "--require-match"};
        ToolRun ideal = tool(base);
        assertEquals(Cli.EXIT_MISMATCH, ideal.code, ideal::toString);
        assertTrue(ideal.out.contains("335 of 4000"), ideal::toString);
        ToolRun device = tool(concat(base, "--device", DEMO + "pallet5.json"));
        assertEquals(0, device.code, device::toString);
        assertTrue(device.out.contains("noise       device profile pallet5.json")
                && device.out.contains("exact, from the density matrix")
                && device.out.contains("PASS"), device::toString);
    }

    @Test
    void fitPrintsRatesWithIntervals() {
        ToolRun fit = tool("compare", DEMO + "ghz5-pallet.csv", "--circuit", DEMO + "ghz5.qasm",
                "--fit", "depolarizing2,readout");
        assertEquals(0, fit.code, fit::toString);
        assertTrue(fit.out.contains("parameter      estimate  95% interval"), fit::toString);
        // Single-bit flips on about 1.7 % of the bits read explain the tally: the symmetric
        // readout estimate lies near the share of flipped bits, 335 / (4000 * 5) = 0.0168
        // (each stray outcome here is one bit away from 00000 or 11111).
        String line = fit.out.lines().filter(l -> l.startsWith("readout ")).findFirst()
                .orElseThrow();
        double estimate = Double.parseDouble(line.split("\\s+")[1]);
        assertEquals(335.0 / 20000, estimate, 0.002, fit::toString);
    }

    @Test
    void runTakesADeviceAndRefusesAnUncoupledPair() throws IOException {
        DeviceProfile pair = DeviceProfile.read(Path.of(DEMO + "longstone-pair.json"));
        Circuit bell = QasmReader.read(Path.of(DEMO + "bell.qasm"));
        ToolRun run = tool("run", DEMO + "bell.qasm", "--device", DEMO + "longstone-pair.json",
                "--shots", "4000", "--seed", "11", "--format", "csv");
        assertEquals(0, run.code, run::toString);
        Tally t = TallyFiles.read(run.out);
        // The library with the profile's model gives the same seeded tally.
        assertEquals(Simulator.seeded(11).withNoise(pair.noiseModel()).run(bell, 4000), t);
        // Readout errors of about 1-2 % put some shots on 01 and 10.
        assertTrue(t.count("01") + t.count("10") > 0, run::toString);

        Path across = dir.resolve("across.qasm");
        Files.writeString(across, "OPENQASM 3;\ninclude \"stdgates.inc\";\nqubit[5] q;\n"
                + "bit[5] c;\nh q[0];\ncx q[0], q[4];\nc = measure q;\n");
        ToolRun refused = tool("run", across.toString(), "--device", DEMO + "pallet5.json");
        assertEquals(Cli.EXIT_BAD_INPUT, refused.code, refused::toString);
        assertTrue(refused.err.contains("qubits 0 and 4") && refused.err.contains("Pallet-5"),
                refused::toString);
    }

    @Test
    void aCircuitWithMidCircuitMeasurementIsPredictedAndCompared() throws IOException {
        // Teleportation (Bennett et al. 1993, Phys. Rev. Lett. 70, 1895) delivers ry(2 pi / 3)|0>
        // to qubit 2 whatever the Bell outcomes: P(c2 = 1) = sin^2(pi / 3) = 3/4.
        ToolRun state = tool("state", DEMO + "teleport.qasm");
        assertEquals(0, state.code, state::toString);
        double one = 0;
        for (String line : state.out.lines().toList()) {
            if (line.matches("1[01]{2} +[0-9.]+")) {
                one += Double.parseDouble(line.split("\\s+")[1]);
            }
        }
        assertEquals(0.75, one, 1e-8, state::toString);
        ToolRun run = tool("run", DEMO + "teleport.qasm", "--shots", "3000", "--seed", "5",
                "--format", "csv");
        Path tally = dir.resolve("teleport.csv");
        Files.writeString(tally, run.out);
        ToolRun cmp = tool("compare", tally.toString(), "--circuit", DEMO + "teleport.qasm",
                "--require-match");
        assertEquals(0, cmp.code, cmp::toString);
        assertTrue(cmp.out.contains("summed over the measurement branches"), cmp::toString);
    }

    @Test
    void badCombinationsAreRefusedInOneLine() {
        String[][] cases = {
            {"compare", DEMO + "bell-pallet.json", "--circuit", DEMO + "bell.qasm", "--device",
                DEMO + "longstone-pair.json", "--depolarizing", "0.01"},
            {"compare", DEMO + "bell-pallet.json", "--circuit", DEMO + "bell.qasm", "--fit",
                "gremlins"},
            {"compare", DEMO + "bell-pallet.json", "--circuit", DEMO + "bell.qasm", "--fit",
                "scale"},
            {"compare", DEMO + "bell-pallet.json", "--circuit", DEMO + "bell.qasm",
                "--confidence", "0.3"},
            {"compare", DEMO + "bell-pallet.json", "--circuit", DEMO + "bell.qasm",
                "--tolerance", "0"},
            {"compare", DEMO + "bell-pallet.json", "--circuit", DEMO + "bell.qasm", "--fit",
                "readout", "--device", DEMO + "longstone-pair.json"},
        };
        String[] expected = {"give it alone", "'gremlins' is not 'scale' or a kind",
            "both are 0", "'0.3' is not a confidence level between 0.5 and 1",
            "'0' is not a distance", "cannot start from --device"};
        for (int i = 0; i < cases.length; i++) {
            ToolRun r = tool(cases[i]);
            assertEquals(Cli.EXIT_BAD_INPUT, r.code, r::toString);
            assertTrue(r.err.contains(expected[i]), r::toString);
            assertEquals(1, r.err.strip().lines().count(), r::toString);
        }
    }

    private static String[] concat(String[] a, String... b) {
        String[] out = java.util.Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, out, a.length, b.length);
        return out;
    }
}
