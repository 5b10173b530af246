package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class MainTest {

    private static final String[] NAMES = {
        "uniform", "bell", "ghz", "teleport", "grover", "fourier", "hydrogen", "maxcut",
        "memory", "noisy-ghz", "engines", "ising",
    };

    private static final class Run {
        final Capture out = new Capture();
        final Capture err = new Capture();
        final int code;

        Run(String... args) {
            code = Main.run(args, out.stream(), err.stream());
        }
    }

    @Test
    void unknownNameGivesExitCodeTwoAndListsTheValidNames() {
        Run r = new Run("warp-drive");
        assertEquals(Main.EXIT_USAGE, r.code);
        assertEquals(2, r.code, "exit code for an unknown name (brief of the launcher)");
        String err = r.err.text();
        assertTrue(err.contains("warp-drive"), err);
        for (String name : NAMES) {
            assertTrue(err.contains(name), () -> name + " missing from: " + err);
        }
        assertEquals("", r.out.text());
    }

    @Test
    void noArgumentsRunsTheMainDemo() {
        Run r = new Run();
        assertEquals(0, r.code, r.err.text());
        Capture direct = new Capture();
        UniformSuperposition.run(direct.stream(), UniformSuperposition.DEFAULT_SEED,
                UniformSuperposition.DEFAULT_SHOTS);
        assertEquals(direct.text(), r.out.text());
        assertEquals("", r.err.text());
    }

    @Test
    void seedAndShotsArePassedToTheExample() {
        Run r = new Run("uniform", "7", "320");
        assertEquals(0, r.code, r.err.text());
        Capture direct = new Capture();
        UniformSuperposition.run(direct.stream(), 7L, 320);
        assertEquals(direct.text(), r.out.text());
    }

    @Test
    void listNamesEveryExampleWithADescription() {
        Run r = new Run("list");
        assertEquals(0, r.code);
        String[] lines = r.out.text().split("\\R");
        assertEquals(NAMES.length, lines.length, r.out.text());
        for (int i = 0; i < NAMES.length; i++) {
            assertTrue(lines[i].startsWith(NAMES[i] + " "), lines[i]);
            assertTrue(lines[i].trim().length() > NAMES[i].length() + 10, lines[i]);
        }
    }

    @Test
    void helpPrintsTheUsage() {
        for (String flag : new String[] {"--help", "-h", "help"}) {
            Run r = new Run(flag);
            assertEquals(0, r.code, flag);
            assertTrue(r.out.text().startsWith("Usage: java -jar qsim-examples.jar"),
                    r.out.text());
            for (String name : NAMES) {
                assertTrue(r.out.text().contains(name), name);
            }
        }
    }

    @ParameterizedTest
    @CsvSource({
        "uniform, abc, 'abc'",
        "uniform, 1 0, got 0",
        "uniform, 1 2000000, got 2000000",
        "bell, 1 2 3, '3'",
        "fourier, 5, '5'",
        "grover, 1.5, '1.5'",
    })
    void badArgumentsGiveExitCodeTwoAndNameTheValue(String name, String args, String shown) {
        String[] all = (name + " " + args).split(" ");
        Run r = new Run(all);
        assertEquals(Main.EXIT_USAGE, r.code, r.out.text());
        assertTrue(r.err.text().contains(shown), r.err.text());
        assertTrue(r.err.text().contains(name), r.err.text());
    }

    @ParameterizedTest
    @CsvSource({"bell, 3, 200", "ghz, 3, 200", "teleport, 3, 200", "grover, 3, 200"})
    void everyExampleRunsByName(String name, String seed, String shots) {
        Run r = new Run(name, seed, shots);
        assertEquals(0, r.code, r.err.text());
        assertTrue(r.out.text().length() > 200, r.out.text());
        assertEquals("", r.err.text());
    }

    @ParameterizedTest
    @CsvSource({"uniform", "bell", "ghz", "teleport", "grover", "memory", "noisy-ghz",
        "engines"})
    void oneShotIsSingular(String name) {
        // English plurals (common practice): "1 shot", never "1 shots".
        Run r = new Run(name, "1", "1");
        assertEquals(0, r.code, r.err.text());
        java.util.regex.Matcher m = java.util.regex.Pattern.compile("\\b1 (shots|settings|runs"
                + "|rounds|trajectories|iterations|outcomes)\\b").matcher(r.out.text());
        assertTrue(!m.find(), () -> m.group() + " in " + r.out.text());
        assertTrue(r.out.text().contains("1 shot"), r.out.text());
    }

    @Test
    void versionIsPrintedAtTheTop() {
        Run r = new Run("--version");
        assertEquals(0, r.code, r.err.text());
        assertEquals(Version.text() + "\n", r.out.text());
        assertTrue(r.out.text().matches("qsim \\d+\\.\\d+\\.\\d+(-SNAPSHOT)?\\n"),
                r.out.text());
    }

    @Test
    void bellRunsThePairThenTheRing() {
        Run r = new Run("bell", "5", "300");
        assertEquals(0, r.code, r.err.text());
        Capture direct = new Capture();
        BellAndGhz.bell(direct.stream(), 5L, 300);
        direct.stream().println();
        BellAndGhz.ghz(direct.stream(), BellAndGhz.RING_QUBITS, 5L, 300);
        assertEquals(direct.text(), r.out.text());
    }

    @Test
    void fourierRunsByName() {
        Run r = new Run("fourier");
        assertEquals(0, r.code, r.err.text());
        assertTrue(r.out.text().contains("Peaks at y = 0, 8, 16, 24"), r.out.text());
    }
}
