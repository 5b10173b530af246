package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.util.Optional;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/** Tests of the report's own code: options, repetitions, bandwidth arithmetic, CSV, a tiny run. */
class ScalingReportTest {

    @Test
    void defaultsWhenNoOptions() {
        ScalingReport.Options o = ScalingReport.parse(new String[0], 3);
        assertEquals(new ScalingReport.Options(10, 26, 3, "dense", "mid", 300, false), o);
    }

    @Test
    void everyOptionInBothForms() {
        ScalingReport.Options o = ScalingReport.parse(new String[] {"--min", "4", "--max=7",
            "--threads", "2", "--gate=h", "--target", "all", "--millis", "15"}, 1);
        assertEquals(new ScalingReport.Options(4, 7, 2, "h", "all", 15, false), o);
        assertTrue(ScalingReport.parse(new String[] {"--help"}, 1).help());
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        // arguments (space separated) | text the message must hold
        "--size 3              | unknown option '--size'; allowed: --min, --max",
        "fast                  | unknown option 'fast'",
        "--min                 | option --min needs a value",
        "--min abc             | --min must be a whole number in [1, 40] but was 'abc'",
        "--max 41              | --max must be in [1, 40] but was 41",
        "--min 0               | --min must be in [1, 40] but was 0",
        "--threads 0           | --threads must be in [1, 1024] but was 0",
        "--millis 0            | --millis must be in [1, 600000] but was 0",
        "--min 12 --max 10     | --min 12 is greater than --max 10",
        "--gate cz             | --gate 'cz' is not known; allowed: dense, h, ry, t, x",
        "--target top          | --target 'top' is not known; allowed: low, mid, high, all",
        "--min 4 --min 5       | option --min is given twice",
        "--help=yes            | option --help takes no value but got 'yes'",
    })
    void badOptionsAreNamed(String args, String expected) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> ScalingReport.parse(args.split(" "), 1));
        assertTrue(e.getMessage().contains(expected), e.getMessage());
    }

    @Test
    void repetitionsCoverTheTargetWithMargin() {
        // Exact arithmetic: 100 reps in 1 ms is 1e4 ns each; 1.25 * 3e8 / 1e4 = 37500.
        assertEquals(37_500, ScalingReport.chooseRepetitions(100, 1_000_000, 300_000_000));
        // A pilot measured as 0 ns counts as 1 ns: ceil(1.25 * 10 / 1) = 13.
        assertEquals(13, ScalingReport.chooseRepetitions(1, 0, 10));
        // A slow pilot still gives one repetition.
        assertEquals(1, ScalingReport.chooseRepetitions(1, 5_000_000_000L, 300_000_000));
        // Capped.
        assertEquals(ScalingReport.MAX_REPETITIONS,
            ScalingReport.chooseRepetitions(1L << 40, 1, 1_000_000_000));
    }

    @Test
    void bandwidthArithmetic() {
        // Bytes moved = read + write of every 16-byte amplitude (common practice for a streaming
        // kernel): 2 * 16 * 2^20 = 33554432 bytes; in 1 ms that is 33554432 / 1e6 GB/s exactly.
        assertEquals(33_554_432L, ScalingReport.bytesMoved(20));
        assertEquals(16L << 26, ScalingReport.stateBytes(26));
        assertEquals(33.554432, ScalingReport.gigabytesPerSecond(20, 1_000_000.0), 0.0);
    }

    @Test
    void rowFormat() {
        // 1e6 ns / 2^20 = 0.95367431640625 ns per amplitude; 33.554432 GB/s (see above).
        assertEquals("20,1000000.0,0.95367,33.554", ScalingReport.row(20, 1_000_000.0));
        assertEquals("4,80.0,5.00000,6.400", ScalingReport.row(4, 80.0)); // 512 B / 80 ns
    }

    @Test
    void heapCheck() {
        assertEquals(Optional.empty(), ScalingReport.heapProblem(24, 4L << 30));
        // 16 * 2^26 B = 1 GiB, twice while built = 2 GiB; suggestion 2 GiB + 1 GiB of room.
        String message = ScalingReport.heapProblem(26, 512L << 20).orElseThrow();
        assertAll(
            () -> assertTrue(message.contains("a 26-qubit state needs 1.0 GiB"), message),
            () -> assertTrue(message.contains("2.0 GiB while it is built"), message),
            () -> assertTrue(message.contains("maximum heap is 512.0 MiB"), message),
            () -> assertTrue(message.contains("-Xmx3g"), message));
    }

    @Test
    void tinyRunPrintsOneRowPerQubitCount() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int status = run(out, err, "--min", "4", "--max", "6", "--millis", "10", "--threads",
            "1", "--target", "all");
        String errText = err.toString(StandardCharsets.UTF_8);
        assertEquals(0, status, errText);
        String[] lines = out.toString(StandardCharsets.UTF_8).split("\\R");
        assertEquals(4, lines.length, () -> String.join("\n", lines));
        assertEquals(ScalingReport.HEADER, lines[0]);
        Pattern number = Pattern.compile("\\d+\\.\\d+");
        for (int i = 1; i < lines.length; i++) {
            String[] cells = lines[i].split(",");
            assertEquals(4, cells.length, lines[i]);
            int n = 3 + i;
            assertEquals(Integer.toString(n), cells[0], lines[i]);
            for (int c = 1; c < 4; c++) {
                assertTrue(number.matcher(cells[c]).matches(), lines[i]);
            }
            double nsPerGate = Double.parseDouble(cells[1]);
            assertTrue(nsPerGate > 0, lines[i]);
            // The columns agree with each other up to the printed digits: ns_per_gate has one
            // decimal (error <= 0.05), ns_per_amplitude five, gb_per_s three.
            double amplitudes = 1 << n;
            assertEquals(nsPerGate / amplitudes, Double.parseDouble(cells[2]),
                0.5e-5 + 0.05 / amplitudes + 1e-12, lines[i]);
            double gbPerS = 32.0 * amplitudes / nsPerGate;
            assertEquals(gbPerS, Double.parseDouble(cells[3]),
                0.5e-3 + gbPerS * 0.05 / (nsPerGate - 0.05) + 1e-12, lines[i]);
        }
        assertTrue(errText.contains("# bytes moved per gate = 2 * 16 * 2^n"), errText);
        assertTrue(errText.contains("# warm-up (not reported) n=4: "), errText);
        for (String line : errText.split("\\R")) {
            assertTrue(line.startsWith("#"), line);
        }
    }

    @Test
    void badArgumentsExitOneWithNoCsv() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        assertEquals(1, run(out, err, "--threads", "many"));
        assertEquals("", out.toString(StandardCharsets.UTF_8));
        String errText = err.toString(StandardCharsets.UTF_8);
        assertTrue(errText.startsWith("error: --threads must be a whole number"), errText);
        assertTrue(errText.contains("usage:"), errText);
    }

    @Test
    void stateTooLargeForTheHeapExitsTwo() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        // 40 qubits need 16 TiB, more than any test heap.
        assertEquals(2, run(out, err, "--min", "40", "--max", "40"));
        assertEquals("", out.toString(StandardCharsets.UTF_8));
        String errText = err.toString(StandardCharsets.UTF_8);
        assertTrue(errText.startsWith("error: a 40-qubit state needs 16384.0 GiB"), errText);
        assertTrue(errText.contains("-Xmx32769g"), errText);
    }

    @Test
    void helpGoesToStandardOutput() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        assertEquals(0, run(out, err, "--help"));
        assertTrue(out.toString(StandardCharsets.UTF_8).startsWith("usage:"));
        assertFalse(err.size() > 0, () -> err.toString(StandardCharsets.UTF_8));
    }

    private static int run(ByteArrayOutputStream out, ByteArrayOutputStream err, String... args) {
        try (PrintStream o = new PrintStream(out, true, StandardCharsets.UTF_8);
             PrintStream e = new PrintStream(err, true, StandardCharsets.UTF_8)) {
            return ScalingReport.run(args, o, e);
        }
    }
}
