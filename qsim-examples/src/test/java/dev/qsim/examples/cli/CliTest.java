package dev.qsim.examples.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;
import dev.qsim.examples.Main;
import dev.qsim.stats.TallyFiles;
import dev.qsim.text.QasmReader;

/** The tool end to end through {@link Main#run}: outputs, files, exit codes. */
class CliTest {

    private static final String DEMO = "demo/";

    @TempDir
    Path dir;

    /** One run of the launcher with captured streams. */
    private static final class Run {
        final int code;
        final String out;
        final String err;

        Run(String... args) {
            ByteArrayOutputStream o = new ByteArrayOutputStream();
            ByteArrayOutputStream e = new ByteArrayOutputStream();
            code = Main.run(args, new PrintStream(o, true, StandardCharsets.UTF_8),
                    new PrintStream(e, true, StandardCharsets.UTF_8));
            out = o.toString(StandardCharsets.UTF_8);
            err = e.toString(StandardCharsets.UTF_8);
        }

        @Override
        public String toString() {
            return "exit " + code + "\nout:\n" + out + "\nerr:\n" + err;
        }
    }

    @Test
    void runPrintsTheSeededTallyInEveryFormat() throws IOException {
        Run csv = new Run("run", DEMO + "bell.qasm", "--shots", "500", "--seed", "7", "--format",
                "csv");
        assertEquals(0, csv.code, csv::toString);
        Tally fromCsv = TallyFiles.read(csv.out);
        // Same seed, same tally (Simulator contract); a Bell pair reads only 00 or 11
        // (Nielsen and Chuang 2010, sec. 1.3.6).
        Circuit bell = QasmReader.read(Path.of(DEMO + "bell.qasm"));
        assertEquals(Simulator.seeded(7).run(bell, 500), fromCsv);
        assertEquals(500, fromCsv.count("00") + fromCsv.count("11"));
        Run json = new Run("run", DEMO + "bell.qasm", "--shots", "500", "--seed", "7",
                "--format", "json");
        assertEquals(fromCsv, TallyFiles.read(json.out), json::toString);
        Run table = new Run("run", DEMO + "bell.qasm", "--shots", "500", "--seed", "7");
        assertTrue(table.out.contains("500 shots, 2 distinct outcomes"), table::toString);
        assertTrue(table.out.contains(String.valueOf(fromCsv.count("00"))), table::toString);
        assertEquals("", table.err);
    }

    @Test
    void runWithNoiseOptions() throws IOException {
        Path file = dir.resolve("flip.qasm");
        Files.writeString(file, "OPENQASM 3;\ninclude \"stdgates.inc\";\nqubit[2] q;\n"
                + "bit[2] c;\nx q[0];\nc = measure q;\n");
        // Readout error 1 misreads every bit: |01> ("01") always reads "10" (definition of the
        // readout confusion matrix, common practice); on a density matrix and on trajectories.
        Run flipped = new Run("run", file.toString(), "--shots", "300", "--readout-error", "1",
                "--format", "csv");
        assertEquals(0, flipped.code, flipped::toString);
        assertEquals(300, TallyFiles.read(flipped.out).count("10"), flipped::toString);
        // Depolarizing noise spreads the Bell outcomes beyond 00 and 11 (N&C 2010, sec. 8.3.4).
        Run noisy = new Run("run", DEMO + "bell.qasm", "--shots", "4000", "--depolarizing",
                "0.2", "--format", "csv");
        assertEquals(0, noisy.code, noisy::toString);
        Tally t = TallyFiles.read(noisy.out);
        assertTrue(t.count("01") + t.count("10") > 0, noisy::toString);
        Run bad = new Run("run", DEMO + "bell.qasm", "--depolarizing", "1.5");
        assertEquals(2, bad.code, bad::toString);
        assertTrue(bad.err.contains("1.5"), bad::toString);
    }

    @Test
    void runInSinglePrecision() throws IOException {
        // A Bell pair reads only 00 or 11 (Nielsen and Chuang 2010, sec. 1.3.6), whatever the
        // storage; the tally equals the library's for the same seed and precision.
        Run single = new Run("run", DEMO + "bell.qasm", "--shots", "400", "--seed", "3",
                "--precision", "single", "--format", "csv");
        assertEquals(0, single.code, single::toString);
        Tally t = TallyFiles.read(single.out);
        assertEquals(400, t.count("00") + t.count("11"), single::toString);
        Circuit bell = QasmReader.read(Path.of(DEMO + "bell.qasm"));
        assertEquals(Simulator.seeded(3).withPrecision(dev.qsim.Precision.SINGLE).run(bell, 400),
                t);
        Run bad = new Run("run", DEMO + "bell.qasm", "--precision", "half");
        assertEquals(2, bad.code, bad::toString);
        assertTrue(bad.err.contains("'half'") && bad.err.contains("double or single"),
                bad::toString);
        Run noisy = new Run("run", DEMO + "bell.qasm", "--precision", "single",
                "--depolarizing", "0.1");
        assertEquals(2, noisy.code, noisy::toString);
        assertTrue(noisy.err.contains("noiseless"), noisy::toString);
    }

    @Test
    void runWritesAHistogramWithThePrediction() throws IOException {
        Path svg = dir.resolve("h.svg");
        Run r = new Run("run", DEMO + "ghz5.qasm", "--shots", "400", "--svg", svg.toString());
        assertEquals(0, r.code, r::toString);
        String text = Files.readString(svg);
        assertTrue(text.startsWith("<?xml") && text.trim().endsWith("</svg>"), text);
        assertTrue(text.contains("ideal prediction"), text);
        // GHZ: ideal 1/2 on 00000 and 11111 (Greenberger, Horne and Zeilinger 1989).
        assertTrue(text.contains("<title>00000 ideal 0.5000</title>"), text);
        assertTrue(text.contains("<title>11111 ideal 0.5000</title>"), text);
    }

    @Test
    void compareGatesOnTheResultOnlyWhenAsked() {
        Run fail = new Run("compare", DEMO + "ghz5-marlin.csv", "--circuit", DEMO + "ghz5.qasm",
                "--require-match");
        assertEquals(Cli.EXIT_MISMATCH, fail.code, fail::toString);
        assertTrue(fail.out.contains("FAIL"), fail::toString);
        assertTrue(fail.out.contains("shots on impossible        335"), fail::toString);
        Run report = new Run("compare", DEMO + "ghz5-marlin.csv", "--circuit",
                DEMO + "ghz5.qasm");
        assertEquals(0, report.code, report::toString);
        Run pass = new Run("compare", DEMO + "bell-marlin.json", "--circuit", DEMO + "bell.qasm",
                "--require-match", "--alpha", "0.05");
        assertEquals(0, pass.code, pass::toString);
        assertTrue(pass.out.contains("PASS"), pass::toString);
    }

    @Test
    void compareWritesTheFitPicture() throws IOException {
        Path svg = dir.resolve("fit.svg");
        Run r = new Run("compare", DEMO + "ghz5-marlin.csv", "--circuit", DEMO + "ghz5.qasm",
                "--svg", svg.toString());
        assertEquals(0, r.code, r::toString);
        String text = Files.readString(svg);
        assertTrue(text.contains("fail at alpha 0.01"), text);
        assertTrue(text.contains("<title>00001 measured 0.0103</title>"), text); // 41 / 4000
    }

    @Test
    void stateAndDraw() throws IOException {
        Run s = new Run("state", DEMO + "bell.qasm");
        assertEquals(0, s.code, s::toString);
        // (|00> + |11>)/sqrt 2: amplitudes 1/sqrt 2 = 0.70710678 (Nielsen and Chuang 2010,
        // eq. 1.23).
        assertTrue(s.out.contains("00     +0.70710678  +0.00000000   0.50000000"), s::toString);
        assertTrue(s.out.contains("2 of 4 basis states shown"), s::toString);
        Run p = new Run("state", DEMO + "bell.qasm", "--probabilities");
        assertTrue(p.out.matches("(?s).*\\n11 +0\\.50000000\\n.*"), p::toString);
        Run d = new Run("draw", DEMO + "teleport.qasm");
        assertEquals(0, d.code, d::toString);
        assertEquals(QasmReader.read(Path.of(DEMO + "teleport.qasm")).diagram() + "\n", d.out);
        Path svg = dir.resolve("c.svg");
        Run ds = new Run("draw", DEMO + "teleport.qasm", "--svg", svg.toString());
        assertEquals(0, ds.code, ds::toString);
        String text = Files.readString(svg);
        assertTrue(text.contains("if c1=1") && text.contains("if c0=1"), text);
        assertTrue(text.contains("RY(2\u03c0/3)"), text);
    }

    @Test
    void scalePrintsOneRowPerQubitCount() {
        Run r = new Run("scale", "--from", "2", "--to", "4", "--format", "csv");
        assertEquals(0, r.code, r::toString);
        String[] lines = r.out.split("\n");
        assertEquals(4, lines.length, r::toString);
        assertEquals("qubits,gates,ns_per_gate,ns_per_amplitude", lines[0]);
        assertTrue(lines[3].startsWith("4,"), r::toString);
    }

    @ParameterizedTest
    @ValueSource(strings = {"run", "state", "draw", "compare", "scale"})
    void everyCommandHasHelpWithExamples(String command) {
        Run r = new Run(command, "--help");
        assertEquals(0, r.code, r::toString);
        assertTrue(r.out.contains("Usage: java -jar qsim-examples.jar " + command), r::toString);
        assertTrue(r.out.contains("Examples:"), r::toString);
    }

    @Test
    void badInputExitsWithTwoAndSaysWhy() throws IOException {
        Path bad = dir.resolve("bad.qasm");
        Files.writeString(bad, "OPENQASM 3;\nqubit[2] q;\nbit[2] c;\nfoo q[0];\n");
        Path badTally = dir.resolve("bad.csv");
        Files.writeString(badTally, "bits,count\n00,5\n0x,3\n");
        Path wide = dir.resolve("wide.json");
        Files.writeString(wide, "{\"width\": 3, \"counts\": {\"000\": 5}}");
        Object[][] cases = {
            {new String[] {"run", "missing.qasm"}, "file not found"},
            {new String[] {"run", bad.toString()}, "line 4, column 1: unknown gate 'foo'"},
            {new String[] {"run", DEMO + "bell.qasm", "--shots", "0"}, "was 0"},
            {new String[] {"run", DEMO + "bell.qasm", "--shots", "many"}, "'many'"},
            {new String[] {"run", DEMO + "bell.qasm", "--format", "xml"}, "xml"},
            {new String[] {"run", DEMO + "bell.qasm", "--colour"}, "--colour"},
            {new String[] {"run"}, "FILE"},
            {new String[] {"compare", badTally.toString(), "--circuit", DEMO + "bell.qasm"},
                "'0x'"},
            {new String[] {"compare", wide.toString(), "--circuit", DEMO + "bell.qasm"},
                "3 bits"},
            {new String[] {"compare", DEMO + "bell-marlin.json"}, "--circuit"},
            {new String[] {"compare", DEMO + "bell-marlin.json", "--circuit",
                DEMO + "teleport.qasm"}, "predicts outcomes of 3 bits"},
            {new String[] {"compare", DEMO + "bell-marlin.json", "--circuit", DEMO + "bell.qasm",
                "--alpha", "1.5"}, "1.5"},
            {new String[] {"state", DEMO + "bell.qasm", "--cutoff", "-1"}, "-1"},
            {new String[] {"scale", "--from", "9", "--to", "3"}, "--from 9"},
        };
        for (Object[] c : cases) {
            String[] args = (String[]) c[0];
            Run r = new Run(args);
            assertEquals(Cli.EXIT_BAD_INPUT, r.code, () -> String.join(" ", args) + "\n" + r);
            assertTrue(r.err.contains((String) c[1]), () -> String.join(" ", args) + "\n" + r);
        }
    }

    @Test
    void runReadsTalliesWrittenByItselfBackForCompare() throws IOException {
        Path json = dir.resolve("t.json");
        Run r = new Run("run", DEMO + "ghz5.qasm", "--shots", "3000", "--seed", "3", "--format",
                "json");
        Files.writeString(json, r.out);
        // A noiseless simulated GHZ tally agrees with its own ideal prediction.
        Run c = new Run("compare", json.toString(), "--circuit", DEMO + "ghz5.qasm",
                "--require-match");
        assertEquals(0, c.code, c::toString);
        assertEquals(Map.of("00000", true, "11111", true), Map.of(
                "00000", TallyFiles.read(json).count("00000") > 0,
                "11111", TallyFiles.read(json).count("11111") > 0));
    }
}
