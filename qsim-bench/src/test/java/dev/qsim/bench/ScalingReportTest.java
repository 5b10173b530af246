package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.regex.Pattern;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

/** Tests of the report's own code: options, repetitions, arithmetic, CSV, SVG, tiny runs. */
class ScalingReportTest {

    private static final List<String> KERNELS = List.of("dense", "diagonal", "permutation",
        "controlled");
    private static final List<String> THREE = List.of("low", "mid", "high");
    private static final Pattern NUMBER = Pattern.compile("\\d+\\.\\d+");

    @Test
    void defaultsWhenNoOptions() {
        ScalingReport.Options o = ScalingReport.parse(new String[0], 3);
        assertEquals(new ScalingReport.Options(10, 26, 3, KERNELS, THREE, 300,
            List.of(20, 21, 22, 23, 24, 25, 26), null, null, false, false), o);
        // The fusion comparison starts at n = 20 by default, so a small range has none.
        assertEquals(List.of(), ScalingReport.parse(new String[] {"--max", "19"}, 1)
            .circuitQubits());
    }

    @Test
    void everyOptionInBothForms() {
        ScalingReport.Options o = ScalingReport.parse(new String[] {"--min", "4", "--max=7",
            "--threads", "2", "--kernels=diagonal,dense", "--targets", "all,low", "--millis",
            "15", "--circuit", "on", "--circuit-qubits=7,5", "--csv", "a.csv", "--svg=b.svg",
            "--noise", "on"}, 1);
        assertEquals(new ScalingReport.Options(4, 7, 2, List.of("diagonal", "dense"),
            List.of("all", "low"), 15, List.of(5, 7), Path.of("a.csv"), Path.of("b.svg"), false,
            true), o);
        assertTrue(ScalingReport.parse(new String[] {"--help"}, 1).help());
        assertEquals(List.of(), ScalingReport.parse(new String[] {"--max", "22", "--circuit",
            "off"}, 1).circuitQubits());
        assertEquals(KERNELS, ScalingReport.parse(new String[] {"--kernels", "all"}, 1)
            .kernels());
        // A single size needs no controlled CNOT below 2 qubits if controlled is left out.
        assertEquals(1, ScalingReport.parse(new String[] {"--min", "1", "--kernels", "dense"}, 1)
            .min());
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        // arguments (space separated) | text the message must hold
        "--size 3                  | unknown option '--size'; allowed: --min, --max, --threads",
        "fast                      | unknown option 'fast'",
        "--min                     | option --min needs a value",
        "--min abc                 | --min must be a whole number in [1, 40] but was 'abc'",
        "--max 41                  | --max must be in [1, 40] but was 41",
        "--min 0                   | --min must be in [1, 40] but was 0",
        "--threads 0               | --threads must be in [1, 256] but was 0",
        "--threads 257             | --threads must be in [1, 256] but was 257",
        "--millis 0                | --millis must be in [1, 600000] but was 0",
        "--min 12 --max 10         | --min 12 is greater than --max 10",
        "--kernels dense,cz        | --kernels 'cz' is not known; allowed: dense, diagonal,"
            + " permutation, controlled",
        "--kernels dense,,x        | --kernels '' is not known",
        "--kernels dense,dense     | --kernels lists 'dense' twice in 'dense,dense'",
        "--targets top             | --targets 'top' is not known; allowed: low, mid, high, all",
        "--min 1                   | --min 1 is too small for the controlled kernel",
        "--circuit yes             | --circuit must be on or off but was 'yes'",
        "--circuit-qubits 5,x      | --circuit-qubits must be a whole number in [1, 40] but was"
            + " 'x'",
        "--circuit-qubits 9        | --circuit-qubits 9 is outside --min..--max = [10, 26]",
        "--circuit-qubits 12,12    | --circuit-qubits lists 12 twice in '12,12'",
        "--circuit off --circuit-qubits 12 | --circuit-qubits 12 contradicts --circuit off",
        "--csv x --svg x           | --csv and --svg name the same file 'x'",
        "--min 4 --min 5           | option --min is given twice",
        "--help=yes                | option --help takes no value but got 'yes'",
    })
    void badOptionsAreNamed(String args, String expected) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> ScalingReport.parse(args.trim().split(" +"), 1));
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
    void measureDoublesThenTimesOneLongBatch() {
        // A batch that "takes" 10 ns per repetition (a fake clock, exact arithmetic): doubling
        // from 1 stops at the first reps with 10 * reps >= 1000 / 3, i.e. 64 (640 ns); then
        // ceil(1.25 * 1000 / 10) = 125 repetitions, 1250 ns >= 1000, no retry.
        List<Long> calls = new ArrayList<>();
        ScalingReport.Timing t = ScalingReport.measure(reps -> {
            calls.add(reps);
            return 10 * reps;
        }, 1000);
        assertEquals(List.of(1L, 2L, 4L, 8L, 16L, 32L, 64L, 125L), calls);
        assertEquals(new ScalingReport.Timing(125, 1250), t);
        assertEquals(10.0, t.perRep(), 0.0);
    }

    @Test
    void bandwidthArithmetic() {
        // Bytes moved = read + write of every 16-byte amplitude (common practice for a streaming
        // kernel): 2 * 16 * 2^20 = 33554432 bytes; in 1 ms that is 33554432 / 1e6 GB/s exactly.
        assertEquals(33_554_432L, ScalingReport.bytesMoved(20));
        assertEquals(16L << 26, ScalingReport.stateBytes(26));
        assertEquals(33.554432, ScalingReport.gigabytesPerSecond(20, 1_000_000.0), 0.0);
        // The probe over 2^(n+1) doubles copies exactly the bytes a gate moves (McCalpin 1995:
        // copy counts 2 * 8 bytes per element).
        assertEquals(ScalingReport.bytesMoved(20), BandwidthProbe.copyBytes(2L << 20));
    }

    @Test
    void rowFormat() {
        // 1e6 ns / 2^20 = 0.95367431640625 ns per amplitude; 33.554432 GB/s (see above);
        // 33.554432 / 40 = 0.8388608 of copy.
        assertEquals("20,dense,mid,2,1000000.0,0.95367,33.554,40.000,30.000,0.839",
            new ScalingReport.Row(20, "dense", "mid", 2, 1_000_000.0, 40.0, 30.0).csv());
        // 512 B / 80 ns = 6.4 GB/s; 6.4 / 3.2 = 2.
        assertEquals("4,circuit-fused,all,1,80.0,5.00000,6.400,3.200,1.000,2.000",
            new ScalingReport.Row(4, "circuit-fused", "all", 1, 80.0, 3.2, 1.0).csv());
    }

    @Test
    void probeLengthFitsTheHeap() {
        long gib = 1L << 30;
        // Exact arithmetic on heapNeeded = 2 * 16 * 2^max + 3 * 8 * len.
        assertEquals(2 * (16L << 26) + 3 * 8 * (1L << 27), ScalingReport.heapNeeded(26, 1L << 27));
        // n = 24: 512 MiB + 3 * 256 MiB fit in 4 GiB, full length 2^25.
        assertEquals(1L << 25, ScalingReport.probeLength(24, 4 * gib));
        // n = 26 in 4 GiB: 2 GiB + 3 GiB is too much; 2 GiB + 1.5 GiB fits.
        assertEquals(1L << 26, ScalingReport.probeLength(26, 4 * gib));
        // In 2.5 GiB: 2 + 0.75 does not fit, 2 + 0.375 does, and 2^24 is the floor.
        assertEquals(1L << 24, ScalingReport.probeLength(26, 5 * gib / 2));
        assertEquals(-1, ScalingReport.probeLength(26, 2 * gib));
        // Small states are never shortened: 2^11 doubles at n = 10.
        assertEquals(1L << 11, ScalingReport.probeLength(10, 1L << 20));
        assertEquals(-1, ScalingReport.probeLength(10, 50_000));
    }

    @Test
    void heapCheck() {
        assertEquals(Optional.empty(), ScalingReport.heapProblem(24, 4L << 30));
        // 16 * 2^26 B = 1 GiB, twice while built; probe 3 x 1 GiB; 5 GiB + 1 GiB of room.
        String message = ScalingReport.heapProblem(26, 2L << 30).orElseThrow();
        assertAll(
            () -> assertTrue(message.contains("a 26-qubit state needs 1.0 GiB"), message),
            () -> assertTrue(message.contains("2.0 GiB while it is built"), message),
            () -> assertTrue(message.contains("the bandwidth probe 3 x 1.0 GiB (3 x 128.0 MiB"
                + " at least)"), message),
            () -> assertTrue(message.contains("maximum heap is 2.0 GiB"), message),
            () -> assertTrue(message.contains("-Xmx6g"), message));
    }

    @Test
    void tinyRunPrintsEveryKernelTargetAndTheFusionRows() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int status = run(out, err, "--min", "4", "--max", "6", "--millis", "4", "--threads",
            "1", "--circuit-qubits", "6");
        String errText = err.toString(StandardCharsets.UTF_8);
        assertEquals(0, status, errText);
        String[] lines = out.toString(StandardCharsets.UTF_8).split("\\R");
        // 3 sizes x 4 kernels x 3 targets, plus the fused and unfused circuit at n = 6.
        assertEquals(1 + 36 + 2, lines.length, () -> String.join("\n", lines));
        assertEquals(ScalingReport.HEADER, lines[0]);
        int row = 1;
        for (int n = 4; n <= 6; n++) {
            for (String kernel : KERNELS) {
                for (String target : THREE) {
                    checkRow(lines[row++], n, kernel, target);
                }
            }
        }
        checkRow(lines[row++], 6, "circuit-fused", "all");
        checkRow(lines[row], 6, "circuit-unfused", "all");
        assertTrue(errText.contains("# warm-up (not reported) n=4 probe copy: 32 doubles"),
            errText);
        assertTrue(errText.contains("# n=6 probe triad: 128 doubles"), errText);
        assertTrue(errText.contains("# n=5 controlled high: "), errText);
        assertTrue(Pattern.compile("# n=6 fusion speed-up: \\d+\\.\\d\\dx").matcher(errText)
            .find(), errText);
        assertTrue(errText.contains("(elapsed 0:00:"), errText);
        for (String line : errText.split("\\R")) {
            assertTrue(line.startsWith("#"), line);
        }
    }

    /** Checks a row's cells and that its derived columns agree up to the printed digits. */
    private static void checkRow(String line, int n, String kernel, String target) {
        String[] cells = line.split(",");
        assertEquals(10, cells.length, line);
        assertEquals(List.of(Integer.toString(n), kernel, target, "1"),
            List.of(cells[0], cells[1], cells[2], cells[3]), line);
        for (int c = 4; c < 10; c++) {
            assertTrue(NUMBER.matcher(cells[c]).matches(), line);
        }
        double nsPerGate = Double.parseDouble(cells[4]);
        assertTrue(nsPerGate > 0, line);
        // ns_per_gate has one decimal (error <= 0.05), ns_per_amplitude five, GB/s three.
        double amplitudes = 1 << n;
        assertEquals(nsPerGate / amplitudes, Double.parseDouble(cells[5]),
            0.5e-5 + 0.05 / amplitudes + 1e-12, line);
        double gbPerS = 32.0 * amplitudes / nsPerGate;
        double gbError = 0.5e-3 + gbPerS * 0.05 / (nsPerGate - 0.05) + 1e-12;
        assertEquals(gbPerS, Double.parseDouble(cells[6]), gbError, line);
        double copy = Double.parseDouble(cells[7]);
        assertTrue(copy > 0 && Double.parseDouble(cells[8]) > 0, line);
        // fraction = gb / copy: off by at most its own rounding (0.5e-3), the GB/s rounding
        // divided by copy, and the relative rounding of copy.
        double fraction = Double.parseDouble(cells[6]) / copy;
        assertEquals(fraction, Double.parseDouble(cells[9]),
            0.5e-3 + 0.5e-3 / copy + fraction * 0.5e-3 / (copy - 0.5e-3) + 1e-9, line);
    }

    @Test
    void csvAndSvgFilesWithTwoThreads(@TempDir Path dir) throws Exception {
        Path csv = dir.resolve("scaling.csv");
        Path svg = dir.resolve("scaling.svg");
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        // n = 14 and 15: probe lengths 2^15 and 2^16 are split over the two threads.
        int status = run(out, err, "--min", "14", "--max", "15", "--millis", "4", "--threads",
            "2", "--kernels", "dense,permutation", "--targets", "mid", "--circuit-qubits",
            "15", "--csv", csv.toString(), "--svg", svg.toString());
        String errText = err.toString(StandardCharsets.UTF_8);
        assertEquals(0, status, errText);
        assertEquals("", out.toString(StandardCharsets.UTF_8));
        List<String> lines = Files.readAllLines(csv, StandardCharsets.UTF_8);
        assertEquals(ScalingReport.HEADER, lines.get(0));
        assertEquals(1 + 4 + 2, lines.size(), lines.toString());
        assertTrue(lines.get(1).startsWith("14,dense,mid,2,"), lines.get(1));
        assertTrue(lines.get(6).startsWith("15,circuit-unfused,all,2,"), lines.get(6));
        assertTrue(errText.contains("# plot written to " + svg), errText);

        Document doc = parse(svg);
        List<String> kernels = new ArrayList<>();
        int floors = 0;
        NodeList polylines = doc.getElementsByTagName("polyline");
        for (int i = 0; i < polylines.getLength(); i++) {
            Element p = (Element) polylines.item(i);
            if (p.getAttribute("class").equals("series")) {
                String kernel = p.getAttribute("data-kernel");
                kernels.add(kernel);
                // Kernels at n = 14 and 15, the circuit at n = 15 only.
                assertEquals(kernel.startsWith("circuit") ? 1 : 2,
                    p.getAttribute("points").split(" ").length, p.getAttribute("points"));
            } else if (p.getAttribute("class").equals("floor")) {
                floors++;
            }
        }
        assertEquals(List.of("dense", "permutation", "circuit-fused", "circuit-unfused"),
            kernels);
        assertEquals(1, floors);
    }

    @Test
    void progressBarRedrawsOneLine() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        try (PrintStream o = new PrintStream(out, true, StandardCharsets.UTF_8);
             PrintStream e = new PrintStream(err, true, StandardCharsets.UTF_8)) {
            assertEquals(0, ScalingReport.run(new String[] {"--min", "3", "--max", "3",
                "--millis", "2", "--threads", "1", "--kernels", "dense", "--targets", "low"}, o,
                e, true));
        }
        String errText = err.toString(StandardCharsets.UTF_8);
        // 2 probe steps + 1 kernel step; the bar shows the count done before each step.
        assertTrue(errText.contains("\r[" + "-".repeat(28) + "] 0/3 0:00:00  n=3 probe copy"),
            errText);
        assertTrue(errText.contains("\r[" + "#".repeat(18) + "-".repeat(10) + "] 2/3 "), errText);
        // Every line printed by the report ends after the bar is wiped with \r.
        for (String line : errText.split("\n")) {
            String last = line.substring(line.lastIndexOf('\r') + 1);
            assertTrue(last.startsWith("#"), line);
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
    void unwritableFilesExitOneBeforeMeasuring(@TempDir Path dir) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        Path missing = dir.resolve("no-such-folder").resolve("plot.svg");
        assertEquals(1, run(out, err, "--min", "3", "--max", "3", "--svg", missing.toString()));
        String errText = err.toString(StandardCharsets.UTF_8);
        assertTrue(errText.startsWith("error: cannot write --svg file '" + missing
            + "': directory"), errText);
        assertEquals("", out.toString(StandardCharsets.UTF_8));

        err.reset();
        Path csvMissing = dir.resolve("no-such-folder").resolve("a.csv");
        assertEquals(1, run(out, err, "--min", "3", "--max", "3", "--csv",
            csvMissing.toString()));
        errText = err.toString(StandardCharsets.UTF_8);
        assertTrue(errText.startsWith("error: cannot write --csv file '" + csvMissing + "'"),
            errText);
        assertEquals("", out.toString(StandardCharsets.UTF_8));
    }

    @Test
    void stateTooLargeForTheHeapExitsTwo() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        // 40 qubits need 16 TiB, more than any test heap; the probe stops at 2^30 doubles
        // (8 GiB each): 32768 + 24 GiB, plus 1 GiB of room.
        assertEquals(2, run(out, err, "--min", "40", "--max", "40"));
        assertEquals("", out.toString(StandardCharsets.UTF_8));
        String errText = err.toString(StandardCharsets.UTF_8);
        assertTrue(errText.startsWith("error: a 40-qubit state needs 16384.0 GiB"), errText);
        assertTrue(errText.contains("-Xmx32793g"), errText);
    }

    @Test
    void helpGoesToStandardOutput() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        assertEquals(0, run(out, err, "--help"));
        String help = out.toString(StandardCharsets.UTF_8);
        assertTrue(help.startsWith("usage:"), help);
        assertTrue(help.contains(ScalingReport.HEADER), help);
        assertFalse(err.size() > 0, () -> err.toString(StandardCharsets.UTF_8));
    }

    static Document parse(Path svg) throws Exception {
        DocumentBuilderFactory f = DocumentBuilderFactory.newInstance();
        f.setNamespaceAware(true);
        f.setFeature("http://apache.org/xml/features/disallow-doctype-decl", true);
        return f.newDocumentBuilder().parse(svg.toFile());
    }

    private static int run(ByteArrayOutputStream out, ByteArrayOutputStream err, String... args) {
        try (PrintStream o = new PrintStream(out, true, StandardCharsets.UTF_8);
             PrintStream e = new PrintStream(err, true, StandardCharsets.UTF_8)) {
            return ScalingReport.run(args, o, e);
        }
    }

    @Test
    void noiseRowsForTheDensityMatrixEngine() {
        // --noise on adds one density-matrix row per size from 6 up to --max (trajectories
        // start at 20 qubits, so none here). Bytes of a density-matrix step: gate and channel
        // each stream the 2n-qubit vector, 2 * 2 * 16 * 4^n (common practice).
        java.io.ByteArrayOutputStream out = new java.io.ByteArrayOutputStream();
        java.io.ByteArrayOutputStream err = new java.io.ByteArrayOutputStream();
        int code = ScalingReport.run(new String[] {"--min", "4", "--max", "7", "--millis", "5",
            "--kernels", "dense", "--targets", "mid", "--circuit", "off", "--noise", "on"},
            new java.io.PrintStream(out, true), new java.io.PrintStream(err, true), false);
        assertEquals(0, code, err.toString());
        List<String> dm = out.toString().lines().filter(l -> l.contains(",density-matrix,"))
            .collect(java.util.stream.Collectors.toList());
        assertEquals(2, dm.size(), out.toString());
        assertTrue(dm.get(0).startsWith("6,density-matrix,mid,"), dm.get(0));
        assertTrue(dm.get(1).startsWith("7,density-matrix,mid,"), dm.get(1));
        ScalingReport.Row row = new ScalingReport.Row(6, "density-matrix", "mid", 1, 1e6, 1, 1,
            12, 2);
        assertEquals(2 * 2 * 16 * 4096 / 1e6, row.gbps(), 1e-12);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> ScalingReport.parse(new String[] {"--noise", "maybe"}, 1));
        assertTrue(e.getMessage().contains("'maybe'"), e.getMessage());
    }
}
