package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import dev.qsim.kernel.Workload;

/**
 * The calibration file: written and read back to the same rates, and hostile files (bad
 * numbers, missing keys, another format, too large, another machine) never used, each with
 * its reason. The interpolation between measured sizes is linear in the qubit count (checked
 * against the straight line through the two end points, exact arithmetic).
 */
class CalibrationTest {
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
    void theFileIsInTheFolderOfTheProperty() {
        assertEquals(folder.resolve(Calibration.FILE_NAME), Calibration.file());
    }

    @Test
    void savedRatesReadBackAndAreUsed() throws IOException {
        Calibration probe = Calibration.quickProbe();
        Path f = probe.save();
        Calibration read = Calibration.read(f);
        assertEquals(probe.text(), read.text(), "same file text after a round trip");
        Calibration now = Calibration.current();
        assertEquals(Calibration.Source.QUICK_PROBE, now.source(), "a saved probe stays one");
        assertTrue(now.describe().startsWith("quick probe ("), now.describe());
        assertTrue(!now.describe().contains("not used"), "the file was used: " + now.describe());
        Files.writeString(f, probe.text().replace("source = quick-probe", "source = calibrated"));
        now = Calibration.current();
        assertEquals(Calibration.Source.CALIBRATED, now.source(), now.describe());
        assertTrue(Calibration.saved().isPresent());
        for (int k = 0; k < Workload.KINDS; k++) {
            double a = Calibration.read(f).nanos(k, 12, 1);
            double b = Calibration.read(f).nanos(k, 20, 1);
            double mid = Calibration.read(f).nanos(k, 16, 1);
            boolean lessGates = k == Workload.BLOCK_STREAM || k == Workload.WINDOW_STREAM
                    || k == Workload.WINDOW_STREAM_DOUBLE || k == Workload.WINDOW_SHORT
                    || k == Workload.WINDOW_SHORT_DOUBLE;
            if (!lessGates) {
                // Sizes 12 and 20: 16 is half-way (to 5 significant digits as written). The
                // blocked group's stream and the windows keep their rate less their in-cache
                // gates' (at least a tenth of it), which is not linear in the size.
                assertEquals((a + b) / 2, mid, 1e-12 * Math.max(1, a + b), Workload.name(k));
            }
        }
    }

    @Test
    void hostileFilesAreNotUsedAndTheReasonIsGiven() throws IOException {
        String good = Calibration.quickProbe().text();
        String[][] cases = {
            {good.replaceFirst("rate\\.dense2\\.one = \\S+", "rate.dense2.one = NaN"), "NaN"},
            {good.replaceFirst("rate\\.dense2\\.one = \\S+", "rate.dense2.one = -3"), "-3"},
            {good.replaceFirst("format = " + Calibration.FORMAT,
                    "format = " + (Calibration.FORMAT + 1)), "format " + (Calibration.FORMAT + 1)},
            {good.replaceFirst("shot = .*\\n", ""), "'shot' is missing"},
            {good.replaceFirst("sizes = .*", "sizes = 20 12"), "ascending"},
            {good.replaceFirst("made = .*", "made = yesterday"), "yesterday"},
            {good.replaceFirst("source = .*", "source = guessed"), "guessed"},
            {"x".repeat(70_000), "larger than"},
        };
        for (String[] c : cases) {
            Files.writeString(Calibration.file(), c[0]);
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> Calibration.read(Calibration.file()), c[1]);
            assertTrue(e.getMessage().contains(c[1]), e.getMessage());
            Calibration now = Calibration.current();
            assertEquals(Calibration.Source.QUICK_PROBE, now.source());
            assertTrue(now.describe().contains("not used"), now.describe());
        }
        Files.writeString(Calibration.file(), good.replaceFirst("processors = \\d+",
                "processors = 255"));
        Calibration stale = Calibration.current();
        assertEquals(Calibration.Source.QUICK_PROBE, stale.source());
        assertTrue(stale.describe().contains("stale") && stale.describe().contains("255"),
                stale.describe());
    }
}
