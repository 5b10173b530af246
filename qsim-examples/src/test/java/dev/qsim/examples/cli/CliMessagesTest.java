package dev.qsim.examples.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import picocli.CommandLine;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;
import dev.qsim.text.QasmReader;

/**
 * What a new user meets first: the version, the defaults, one-line messages for bad options,
 * files checked before any work, and what the tool says about circuits too large to run.
 */
class CliMessagesTest {

    private static final String DEMO = "demo/";

    @TempDir
    Path dir;

    /** The project version as the pom of this module declares its parent's. */
    private static String pomVersion() throws IOException {
        String pom = Files.readString(Path.of("pom.xml"), StandardCharsets.UTF_8);
        Matcher m = Pattern.compile("(?s)<parent>.*?<version>([^<]+)</version>").matcher(pom);
        assertTrue(m.find(), "no parent version in pom.xml");
        return m.group(1);
    }

    @Test
    void versionComesFromThePomAtTheTopAndInEveryCommand() throws IOException {
        // The version is set once, in the pom (DEVELOPERS.md: every version in the parent pom).
        String line = "qsim " + pomVersion() + "\n";
        for (String flag : new String[] {"--version", "-V"}) {
            ToolRun top = new ToolRun(flag);
            assertEquals(0, top.code, top::toString);
            assertEquals(line, top.out, top::toString);
            assertEquals("", top.err);
        }
        for (String command : Cli.COMMANDS) {
            ToolRun r = new ToolRun(command, "--version");
            assertEquals(0, r.code, r::toString);
            assertEquals(line, r.out, () -> command + ": " + r);
        }
    }

    @Test
    void threadsDefaultToTheLibrarysDefaultOfEveryProcessor() {
        // Simulator.threads(): every available processor unless set (its javadoc), which the
        // JVM reports as Runtime.availableProcessors().
        int all = Runtime.getRuntime().availableProcessors();
        assertEquals(all, Simulator.seeded(0).threads());
        Cli.Run run = new Cli.Run();
        new CommandLine(run).parseArgs("any.qasm");
        assertEquals(all, run.threads());
        Cli.Scale scale = new Cli.Scale();
        new CommandLine(scale).parseArgs();
        assertEquals(all, scale.threads());
        new CommandLine(run).parseArgs("any.qasm", "--threads", "1");
        assertEquals(1, run.threads());
        ToolRun help = new ToolRun("run", "--help");
        assertTrue(help.out.replaceAll("\\s+", " ").contains("--threads=T threads of the"
                + " simulation, 1 to 256 (default: every available processor"), help::toString);
    }

    @Test
    void aBadOptionIsOneLineNamingItTheRangeAndTheHelp() {
        ToolRun r = new ToolRun("run", DEMO + "bell.qasm", "--shots", "99999999999");
        assertEquals(Cli.EXIT_BAD_INPUT, r.code, r::toString);
        assertEquals("qsim-examples run: --shots: '99999999999' is not a whole number from 1 to"
                + " 10,000,000; see 'run --help'\n", r.err);
        assertEquals("", r.out);
        String[][] cases = {
            {"run", DEMO + "bell.qasm", "--threads", "0"}, {"run", DEMO + "bell.qasm", "--seed",
                "1.5"}, {"run", DEMO + "bell.qasm", "--format", "xml"},
            {"run", DEMO + "bell.qasm", "--depolarizing", "1.5"},
            {"run", DEMO + "bell.qasm", "--precision", "half"}, {"run", DEMO + "bell.qasm",
                "--colour"}, {"run"}, {"state", DEMO + "bell.qasm", "--cutoff", "1"},
            {"compare", DEMO + "bell-pallet.json", "--circuit", DEMO + "bell.qasm", "--confidence",
                "0"}, {"compare", DEMO + "bell-pallet.json", "--circuit", DEMO + "bell.qasm",
                "--resamples", "0"}, {"scale", "--max", "31"}, {"scale", "--format", "xml"},
            {"draw"},
        };
        for (String[] args : cases) {
            ToolRun bad = new ToolRun(args);
            String shown = String.join(" ", args) + "\n" + bad;
            assertEquals(Cli.EXIT_BAD_INPUT, bad.code, shown);
            assertEquals(1, bad.err.lines().count(), shown);
            assertTrue(bad.err.startsWith("qsim-examples " + args[0] + ": "), shown);
            assertTrue(bad.err.strip().endsWith("; see '" + args[0] + " --help'"), shown);
            assertFalse(bad.err.contains("Usage:"), shown);
        }
        ToolRun typo = new ToolRun("run", DEMO + "bell.qasm", "--shot", "5");
        assertTrue(typo.err.contains("did you mean --shots?"), typo::toString);
        ToolRun range = new ToolRun("run", DEMO + "bell.qasm", "--depolarizing", "1.5");
        assertTrue(range.err.contains("--depolarizing: '1.5' is not a probability from 0 to 1"),
                range::toString);
    }

    @ParameterizedTest
    @ValueSource(strings = {"run", "state", "draw", "compare", "scale"})
    void helpExamplesNeverWrapInsideACommand(String command) {
        ToolRun r = new ToolRun(command, "--help");
        List<String> lines = r.out.lines().toList();
        int at = lines.indexOf("Examples:");
        assertTrue(at > 0, r::toString);
        boolean continued = false;
        int examples = 0;
        for (String line : lines.subList(at + 1, lines.size())) {
            if (line.isEmpty()) {
                break;
            }
            // Under 78 columns, so no terminal of 80 wraps it; a command goes on only after a
            // line that ends with a backslash, indented by six spaces.
            assertTrue(line.length() <= 78, () -> line.length() + ": " + line);
            if (continued) {
                assertTrue(line.startsWith("      ") && !line.startsWith("       "), line);
            } else {
                assertTrue(line.startsWith("  java -jar qsim-examples.jar " + command), line);
                examples++;
            }
            continued = line.endsWith(" \\");
        }
        assertFalse(continued, r::toString);
        assertTrue(examples >= 2, r::toString);
    }

    @Test
    void outputPathsAreCheckedBeforeAnyWork() throws IOException {
        Path missing = dir.resolve("no-such-dir").resolve("x.svg");
        ToolRun r = new ToolRun("run", DEMO + "bell.qasm", "--svg", missing.toString());
        assertEquals(Cli.EXIT_BAD_INPUT, r.code, r::toString);
        assertEquals("", r.out, "no tally is printed before the refusal");
        assertTrue(r.err.contains("--svg: cannot write " + missing + ": the directory "
                + missing.getParent() + " does not exist"), r::toString);
        ToolRun folder = new ToolRun("run", DEMO + "bell.qasm", "--svg", dir.toString());
        assertEquals("", folder.out);
        assertTrue(folder.err.contains("--svg: " + dir + " is a directory"), folder::toString);
        Path file = dir.resolve("plain-file");
        Files.writeString(file, "x");
        ToolRun underFile = new ToolRun("draw", DEMO + "bell.qasm", "--svg",
                file.resolve("x.svg").toString());
        assertTrue(underFile.err.contains(file + " is not a directory"), underFile::toString);
        ToolRun compare = new ToolRun("compare", DEMO + "bell-pallet.json", "--circuit",
                DEMO + "bell.qasm", "--svg", missing.toString());
        assertEquals(Cli.EXIT_BAD_INPUT, compare.code, compare::toString);
        assertEquals("", compare.out, "no report is printed before the refusal");
        try (var listing = Files.list(dir)) {
            assertEquals(List.of(file), listing.toList());
        }
    }

    @Test
    void anInputThatIsADirectorySaysSoWithItsPath() {
        String[][] cases = {{"run", dir.toString()}, {"state", dir.toString()},
            {"draw", dir.toString()}, {"compare", dir.toString(), "--circuit", DEMO + "bell.qasm"},
            {"compare", DEMO + "bell-pallet.json", "--circuit", dir.toString()}};
        for (String[] args : cases) {
            ToolRun r = new ToolRun(args);
            assertEquals(Cli.EXIT_BAD_INPUT, r.code, r::toString);
            assertTrue(r.err.contains(dir + " is a directory"), r::toString);
        }
    }

    private Path wideCircuit(int qubits) throws IOException {
        Path file = dir.resolve("wide" + qubits + ".qasm");
        Files.writeString(file, "OPENQASM 3;\ninclude \"stdgates.inc\";\nqubit[" + qubits
                + "] q;\nbit[" + qubits + "] c;\nh q;\nt q[3];\nc = measure q;\n");
        return file;
    }

    /** The noise of {@code --depolarizing p} (NoiseOptions.model). */
    private static NoiseModel depolarizing(double p) {
        return NoiseModel.builder().afterOneQubitGates(Channel.depolarizing(p))
                .afterTwoQubitGates(Channel.twoQubitDepolarizing(p)).build();
    }

    @Test
    void aCircuitBeyondTheStateVectorRunsOnTheMatrixProductStateOrGetsTheCoresRefusal()
            throws IOException {
        Path file = wideCircuit(41);
        Circuit c = QasmReader.read(file);
        // The core picks the matrix product state (Simulator.explain) and says why: the first
        // non-Clifford instruction rules out the tableau, 41 qubits the state vector.
        Simulator.Choice choice = Simulator.seeded(1).explain(c, 10);
        assertEquals(Simulator.Engine.MATRIX_PRODUCT, choice.engine());
        assertTrue(choice.reason().contains("not a Clifford gate")
                && choice.reason().contains("not 41"), choice.reason());
        ToolRun r = new ToolRun("run", file.toString(), "--shots", "10");
        assertEquals(Cli.EXIT_OK, r.code, r::toString);
        assertTrue(Pattern.compile("\\b[01]{41}\\b").matcher(r.out).find(), r::toString);
        // With noise no engine holds it: the core's refusal is passed on unchanged.
        String core = assertThrows(IllegalArgumentException.class,
                () -> Simulator.seeded(1).withNoise(depolarizing(0.01)).explain(c, 10))
                .getMessage();
        assertTrue(core.contains("41 qubits"), core);
        ToolRun noisy = new ToolRun("run", file.toString(), "--shots", "10", "--depolarizing",
                "0.01");
        assertEquals(Cli.EXIT_BAD_INPUT, noisy.code, noisy::toString);
        assertEquals("qsim-examples run: " + file + ": " + core + "\n", noisy.err);
        assertFalse(noisy.err.contains("[1, 40]"), noisy::toString);
    }

    @Test
    void aCircuitTheHeapCannotHoldSaysWhatFitsAndWhichEngineWasChosen() throws IOException {
        Path file = wideCircuit(40);
        Circuit c = QasmReader.read(file);
        // Noisy: trajectories, each a state vector of 40 qubits (2^40 amplitudes of 16 bytes are
        // 16 TiB). The reason is the core's (Simulator.explain).
        String reason = Simulator.seeded(1).withNoise(depolarizing(0.01)).explain(c, 10)
                .reason();
        ToolRun r = new ToolRun("run", file.toString(), "--shots", "10", "--depolarizing",
                "0.01");
        assertEquals(Cli.EXIT_BAD_INPUT, r.code, r::toString);
        assertEquals("", r.out);
        assertTrue(r.err.contains("a state vector of 40 qubits needs 16.0 TiB"), r::toString);
        assertTrue(r.err.contains("the simulator chose TRAJECTORIES: " + reason), r::toString);
        int fits = HeapAdvice.fits(Runtime.getRuntime().maxMemory(),
                dev.qsim.Precision.DOUBLE);
        assertTrue(Pattern.compile("holds a state vector of up to \\d+ qubits \\(\\d+ with"
                + " --precision single\\)").matcher(r.err).find(), r::toString);
        assertTrue(fits < 40, "the test heap holds less than 40 qubits");
        if (HeapAdvice.machineMemory() > 0 && HeapAdvice.machineMemory() < (16L << 40)) {
            assertFalse(r.err.contains("-Xmx"), "no heap this machine cannot give: " + r);
        }
        // When the state vector was the choice (a state within the maximum heap that the free
        // heap cannot hold), the advice names the gate that rules out the tableau, in the
        // core's words; here for a 20-qubit circuit and a refusal made up for the call.
        Circuit small = QasmReader.read(wideCircuit(20));
        String why = Simulator.seeded(1).explain(small, 10).reason();
        assertTrue(why.contains("instruction 20 (t") && why.contains("not a Clifford"), why);
        String message = HeapAdvice.message(small, Simulator.seeded(1), 10,
                new IllegalStateException("refused"));
        assertTrue(message.contains("the stabilizer engine, which runs Clifford circuits of any"
                + " width, is ruled out: " + why), message);
    }

    @Test
    void fitsCountsWholeQubitsOfAmplitudes() {
        // 2^n amplitudes of 16 (double) or 8 (single) bytes: Precision.bytesPerAmplitude().
        assertEquals(26, HeapAdvice.fits(1L << 30, dev.qsim.Precision.DOUBLE));
        assertEquals(27, HeapAdvice.fits(1L << 30, dev.qsim.Precision.SINGLE));
        assertEquals(26, HeapAdvice.fits((1L << 31) - 1, dev.qsim.Precision.DOUBLE));
        assertEquals(40, HeapAdvice.fits(Long.MAX_VALUE, dev.qsim.Precision.DOUBLE));
        assertEquals("16.0 TiB", HeapAdvice.size(16L << 40));
        assertEquals("5.5 GiB", HeapAdvice.size(11L << 29));
    }
}
