package dev.qsim.examples.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import dev.qsim.Calibration;

/**
 * {@code run --plan-only}, the budgets and {@code calibrate --show}, with the calibration
 * folder in a temporary directory (system property {@value Calibration#FOLDER_PROPERTY}). The
 * figures checked are the run's own: the state of a 5-qubit circuit is 2^5 amplitudes of 16
 * bytes (common practice), so the memory budget of 1 KiB must refuse the plan's 16 KiB.
 */
class ForecastToolTest {
    private static final String DEMO = "demo/";
    @TempDir
    Path folder;
    private String before;

    @BeforeEach
    void useTemporaryFolder() {
        before = System.getProperty(Calibration.FOLDER_PROPERTY);
        System.setProperty(Calibration.FOLDER_PROPERTY, folder.toString());
    }

    @AfterEach
    void restore() {
        if (before == null) {
            System.clearProperty(Calibration.FOLDER_PROPERTY);
        } else {
            System.setProperty(Calibration.FOLDER_PROPERTY, before);
        }
    }

    @Test
    void planOnlyPrintsTheForecastAndRunsNothing() {
        ToolRun r = new ToolRun("run", DEMO + "ghz5.qasm", "--plan-only", "--threads", "1");
        assertEquals(0, r.code, r.toString());
        assertTrue(r.out.contains("engine     AMPLITUDES"), r.toString());
        assertTrue(r.out.contains("memory     "), r.toString());
        assertTrue(r.out.contains("quick probe"), "no calibration file yet: " + r);
        // A run of the 5-qubit GHZ circuit would tally the outcome 11111 (a GHZ state is all
        // zeros or all ones; common practice).
        assertTrue(!r.out.contains("11111"), "no tally printed: " + r);
    }

    @Test
    void budgetsRefuseWithTheFigures() {
        ToolRun mem = new ToolRun("run", DEMO + "ghz5.qasm", "--budget-memory", "1KiB");
        assertEquals(Cli.EXIT_BAD_INPUT, mem.code, mem.toString());
        assertTrue(mem.err.contains("predicted to hold") && mem.err.contains("1.0 KiB"),
                mem.toString());
        ToolRun time = new ToolRun("run", DEMO + "ghz5.qasm", "--budget-time", "1ms",
                "--shots", "10000000");
        assertEquals(Cli.EXIT_BAD_INPUT, time.code, time.toString());
        assertTrue(time.err.contains("predicted to take") && time.err.contains("--budget-time"),
                time.toString());
        ToolRun ok = new ToolRun("run", DEMO + "ghz5.qasm", "--budget-time", "10min",
                "--budget-memory", "1GiB", "--shots", "100");
        assertEquals(0, ok.code, ok.toString());
    }

    @Test
    void badBudgetValuesAreRefusedByName() {
        for (String[] bad : new String[][] {{"--budget-time", "5"}, {"--budget-time", "-1s"},
            {"--budget-time", "NaNs"}, {"--budget-memory", "0GiB"}, {"--budget-memory", "lots"},
            {"--budget-memory", "2PiB"}}) {
            ToolRun r = new ToolRun("run", DEMO + "ghz5.qasm", bad[0], bad[1]);
            assertEquals(Cli.EXIT_BAD_INPUT, r.code, r.toString());
            assertTrue(r.err.contains(bad[0]) && r.err.contains("'" + bad[1] + "'"),
                    r.toString());
        }
    }

    @Test
    void calibrateShowNamesTheFileAndAStaleFileIsReported() throws IOException {
        ToolRun show = new ToolRun("calibrate", "--show");
        assertEquals(0, show.code, show.toString());
        assertTrue(show.out.contains(folder.resolve(Calibration.FILE_NAME).toString()),
                show.toString());
        // A file made with other kernel loops is stale: the quick probe is used, and said so.
        Path f = Calibration.quickProbe().save();
        String text = Files.readString(f).replaceFirst("kernels = .*", "kernels = other loops");
        Files.writeString(f, text);
        ToolRun stale = new ToolRun("calibrate", "--show");
        assertTrue(stale.out.contains("stale") && stale.out.contains("other loops"),
                stale.toString());
    }
}
