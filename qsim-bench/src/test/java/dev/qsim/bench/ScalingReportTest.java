package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.qsim.Precision;
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

    /** Reads options that must be accepted. */
    static ReportSettings parse(int defaultThreads, String... args) {
        return ReportOptions.parse(args, defaultThreads).orElseThrow();
    }

    @Test
    void defaultsWhenNoOptions() {
        assertEquals(new ReportSettings(10, 26, 3, KERNELS, THREE, 300,
            List.of(20, 21, 22, 23, 24, 25, 26), null, null, false, List.of(Precision.DOUBLE)),
            parse(3));
        // The fusion comparison starts at n = 20 by default, so a small range has none.
        assertEquals(List.of(), parse(1, "--max", "19").circuitQubits());
        // The default thread count is capped at the core's limit.
        assertEquals(256, parse(1000).threads());
    }

    @Test
    void everyOptionInBothForms() {
        ReportSettings o = parse(1, "--min", "4", "--max=7", "--threads", "2",
            "--kernels=diagonal,dense", "--targets", "all,low", "--millis", "15", "--circuit",
            "on", "--circuit-qubits=7,5", "--csv", "a.csv", "--svg=b.svg", "--noise", "on",
            "--precision=both");
        assertEquals(new ReportSettings(4, 7, 2, List.of("diagonal", "dense"),
            List.of("all", "low"), 15, List.of(5, 7), Path.of("a.csv"), Path.of("b.svg"), true,
            List.of(Precision.DOUBLE, Precision.SINGLE)), o);
        // --help asks for the usage instead of settings.
        assertEquals(Optional.empty(), ReportOptions.parse(new String[] {"--help"}, 1));
        assertEquals(List.of(), parse(1, "--max", "22", "--circuit", "off").circuitQubits());
        assertEquals(KERNELS, parse(1, "--kernels", "all").kernels());
        // A single size needs no controlled CNOT below 2 qubits if controlled is left out.
        assertEquals(1, parse(1, "--min", "1", "--kernels", "dense").min());
        // A value starting with @ is a file name, not a file of more arguments.
        assertEquals(Path.of("@x.csv"), parse(1, "--csv", "@x.csv").csv());
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        // arguments (space separated) | text the message must hold
        "--size 3                  | unknown option '--size'; allowed: --min, --max, --threads",
        "fast                      | unknown option 'fast'",
        "--min                     | Missing required parameter for option '--min' (N)",
        "--min --max 4             | Expected parameter for option '--min' but found '--max'",
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
        "--min 4 --min 5           | option '--min' (N) should be specified only once",
        "--help=yes                | Invalid value for option '--help': 'yes'",
        "--precision float         | --precision must be double, single or both but was 'float'",
        "--precision Single        | --precision must be double, single or both but was 'Single'",
        "--precision=              | --precision must be double, single or both but was ''",
        "--precision double,single | --precision must be double, single or both but was"
            + " 'double,single'",
        "--precision               | Missing required parameter for option '--precision' (P)",
        "--precision single --precision both | option '--precision' (P) should be specified"
            + " only once",
        "--min 4 --max 6 extra     | unknown option 'extra'; allowed: --min, --max, --threads,"
            + " --kernels, --targets, --millis, --circuit, --circuit-qubits, --noise,"
            + " --precision, --csv, --svg, --help",
    })
    void badOptionsAreNamed(String args, String expected) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> ReportOptions.parse(args.trim().split(" +"), 1));
        assertTrue(e.getMessage().contains(expected), e.getMessage());
        assertFalse(e.getMessage().contains("\n") || e.getMessage().contains("\r"),
            e.getMessage());
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
        // Single precision: a float is 4 bytes and a double 8 (IEEE 754-2019, sec. 3.6, binary32
        // and binary64), so a complex amplitude is 8 bytes instead of 16 and a gate moves
        // 2 * 8 * 2^20 = 16777216 bytes, half the double count (common practice, as above).
        assertEquals(16_777_216L, ScalingReport.bytesMoved(20, Precision.SINGLE));
        assertEquals(ScalingReport.bytesMoved(20), ScalingReport.bytesMoved(20, Precision.DOUBLE));
        assertEquals(8L << 31, ScalingReport.stateBytes(31, Precision.SINGLE.bytesPerAmplitude()));
        assertEquals(16.777216, ScalingReport.gigabytesPerSecond(20, Precision.SINGLE,
            1_000_000.0), 0.0);
    }

    @Test
    void rowFormat() {
        // 1e6 ns / 2^20 = 0.95367431640625 ns per amplitude; 33.554432 GB/s (see above);
        // 33.554432 / 40 = 0.8388608 of copy.
        assertEquals("20,dense,mid,2,1000000.0,0.95367,33.554,40.000,30.000,0.839,double",
            new ScalingReport.Row(20, "dense", "mid", 2, 1_000_000.0, 40.0, 30.0).csv());
        // 512 B / 80 ns = 6.4 GB/s; 6.4 / 3.2 = 2.
        assertEquals("4,circuit-fused,all,1,80.0,5.00000,6.400,3.200,1.000,2.000,double",
            new ScalingReport.Row(4, "circuit-fused", "all", 1, 80.0, 3.2, 1.0).csv());
        // Single precision, 8 bytes per amplitude (IEEE 754-2019, sec. 3.6: two 4-byte floats):
        // 2 * 8 * 2^20 B / 1e6 ns = 16.777216 GB/s, half the double figure above; 16.777216 / 40
        // = 0.4194304 of copy. Time per gate and per amplitude are as measured.
        assertEquals("20,dense,mid,2,1000000.0,0.95367,16.777,40.000,30.000,0.419,single",
            new ScalingReport.Row(20, "dense", "mid", 2, 1_000_000.0, 40.0, 30.0,
                Precision.SINGLE).csv());
    }

    @Test
    void probeLengthFitsTheHeap() {
        long gib = 1L << 30;
        long mib = 1L << 20;
        // Exact arithmetic on heapNeeded = B * 2^max * 9 / 8 + 256 MiB + 3 * 8 * len:
        // 1024 + 128 + 256 + 3072 MiB.
        assertEquals(4480 * mib, ScalingReport.heapNeeded(26, 1L << 27, 16));
        // n = 24: 256 + 32 + 256 + 3 * 256 MiB fit in 4 GiB, full length 2^25.
        assertEquals(1L << 25, ScalingReport.probeLength(24, 4 * gib, 16));
        // n = 26 in 4 GiB: 1408 + 3072 MiB is too much; 1408 + 1536 fits.
        assertEquals(1L << 26, ScalingReport.probeLength(26, 4 * gib, 16));
        // In 2 GiB: 1408 + 768 does not fit, 1408 + 384 does, and 2^24 is the floor.
        assertEquals(1L << 24, ScalingReport.probeLength(26, 2 * gib, 16));
        assertEquals(1L << 24, ScalingReport.probeLength(26, 1792 * mib, 16));
        assertEquals(-1, ScalingReport.probeLength(26, 1791 * mib, 16));
        // Single precision needs half the state (8 bytes per amplitude, IEEE 754-2019 sec. 3.6:
        // two 4-byte floats): 512 + 64 + 256 + 384 MiB.
        assertEquals(1216 * mib, ScalingReport.heapNeeded(26, 1L << 24, 8));
        assertEquals(1L << 24, ScalingReport.probeLength(26, 1216 * mib, 8));
        assertEquals(-1, ScalingReport.probeLength(26, 1215 * mib, 8));
        // Small states are never shortened: 2^11 doubles at n = 10; the 256 MiB of room do not
        // fit in a 256 MiB heap next to the state.
        assertEquals(1L << 11, ScalingReport.probeLength(10, 512 * mib, 16));
        assertEquals(-1, ScalingReport.probeLength(10, 256 * mib, 16));
    }

    @Test
    void heapCheck() {
        assertEquals(Optional.empty(), ScalingReport.heapProblem(24, 4L << 30, 16));
        // 16 * 2^26 B = 1 GiB; with an eighth and 256 MiB, 1408 MiB; probe 3 x 1 GiB; 4480 MiB
        // round up to 5 GiB, plus 1 GiB of room. In 1.5 GiB even the shortest probe (384 MiB)
        // does not fit beside 1408 MiB, but single precision (1216 MiB, see above) does.
        String message = ScalingReport.heapProblem(26, 3L << 29, 16).orElseThrow();
        assertAll(
            () -> assertTrue(message.contains("a 26-qubit state in double precision needs 1.0"
                + " GiB"), message),
            () -> assertTrue(message.contains("1.4 GiB with room for the collector"), message),
            () -> assertTrue(message.contains("the bandwidth probe 3 x 1.0 GiB (3 x 128.0 MiB"
                + " at least)"), message),
            () -> assertTrue(message.contains("maximum heap is 1.5 GiB"), message),
            () -> assertTrue(message.contains("-Xmx6g"), message),
            () -> assertTrue(message.contains("--precision single fits"), message));
        // In 1 GiB single precision does not fit either, and is not offered.
        String small = ScalingReport.heapProblem(26, 1L << 30, 16).orElseThrow();
        assertTrue(small.endsWith("-Xmx6g, or lower --max"), small);
    }

    @Test
    void singlePrecisionReaches31QubitsIn20GiB() {
        long heap = 20L << 30;
        // 31 qubits: 2^31 amplitudes of 8 bytes are 16 GiB in single precision, of 16 bytes
        // 32 GiB in double (IEEE 754-2019, sec. 3.6: binary32 is 4 bytes, binary64 8).
        // Single: 16384 + 2048 + 256 = 18688 MiB leaves 1792 MiB, room for 3 x 512 MiB probes.
        assertEquals(1L << 26, ScalingReport.probeLength(31, heap, 8));
        assertEquals(Optional.empty(), ScalingReport.heapProblem(31, heap, 8));
        String message = ScalingReport.heapProblem(31, heap, 16).orElseThrow();
        assertTrue(message.startsWith("a 31-qubit state in double precision needs 32.0 GiB"),
            message);
        assertTrue(message.contains("--precision single fits"), message);
        // The check takes the widest precision measured: both needs the double state.
        assertEquals(8, parse(1, "--max", "31", "--precision", "single")
            .widestBytesPerAmplitude());
        assertEquals(16, parse(1, "--max", "31", "--precision", "both")
            .widestBytesPerAmplitude());
        assertEquals(16, parse(1, "--max", "31").widestBytesPerAmplitude());
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
        assertTrue(errText.contains("# n=5 controlled high (double): "), errText);
        assertTrue(Pattern.compile("# n=6 fusion speed-up \\(double\\): \\d+\\.\\d\\dx")
            .matcher(errText).find(), errText);
        assertTrue(errText.contains("precision double, threads 1"), errText);
        assertTrue(errText.contains("(elapsed 0:00:"), errText);
        for (String line : errText.split("\\R")) {
            assertTrue(line.startsWith("#"), line);
        }
    }

    /** Checks a double-precision row; see the next method. */
    private static void checkRow(String line, int n, String kernel, String target) {
        checkRow(line, n, kernel, target, "double");
    }

    /**
     * Checks a row's cells and that its derived columns agree up to the printed digits; GB/s
     * counts 2 * 16 bytes per amplitude in double precision and 2 * 8 in single.
     */
    private static void checkRow(String line, int n, String kernel, String target,
            String precision) {
        String[] cells = line.split(",");
        assertEquals(11, cells.length, line);
        assertEquals(precision, cells[10], line);
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
        double gbPerS = (precision.equals("single") ? 16.0 : 32.0) * amplitudes / nsPerGate;
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
    void bothPrecisionsInOneRun(@TempDir Path dir) throws Exception {
        Path csv = dir.resolve("both.csv");
        Path svg = dir.resolve("both.svg");
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int status = run(out, err, "--min", "10", "--max", "11", "--precision", "both",
            "--millis", "20", "--threads", "1", "--circuit-qubits", "11", "--csv",
            csv.toString(), "--svg", svg.toString());
        String errText = err.toString(StandardCharsets.UTF_8);
        assertEquals(0, status, errText);
        List<String> lines = Files.readAllLines(csv, StandardCharsets.UTF_8);
        assertEquals(ScalingReport.HEADER, lines.get(0));
        // Per size: 4 kernels x 3 targets in double, the same in single; at n = 11 the fused
        // and unfused circuit in double and in single.
        assertEquals(1 + 2 * 24 + 4, lines.size(), lines.toString());
        int row = 1;
        for (int n = 10; n <= 11; n++) {
            for (String precision : List.of("double", "single")) {
                for (String kernel : KERNELS) {
                    for (String target : THREE) {
                        checkRow(lines.get(row++), n, kernel, target, precision);
                    }
                }
                if (n == 11) {
                    checkRow(lines.get(row++), n, "circuit-fused", "all", precision);
                    checkRow(lines.get(row++), n, "circuit-unfused", "all", precision);
                }
            }
        }
        assertEquals(lines.size(), row);
        // Byte accounting read back from the CSV: gb_per_s * ns_per_gate / 2^n / 2 is the bytes
        // of one amplitude. A float is 4 bytes and a double 8 (IEEE 754-2019, sec. 3.6), so a
        // complex amplitude is 8 bytes in single precision and 16 in double (common practice).
        // Tolerance: the relative rounding of the printed gb_per_s (3 decimals) and ns_per_gate
        // (1 decimal).
        for (String line : lines.subList(1, lines.size())) {
            String[] cells = line.split(",");
            double gb = Double.parseDouble(cells[6]);
            double ns = Double.parseDouble(cells[4]);
            double bytes = gb * ns / (1 << Integer.parseInt(cells[0])) / 2;
            double expected = cells[10].equals("single") ? 8 : 16;
            assertEquals(expected, bytes, expected * (0.5e-3 / gb + 0.05 / ns) * 1.01, line);
        }
        assertTrue(errText.contains("# n=10 dense mid (single): "), errText);
        assertTrue(errText.contains("# n=11 circuit-unfused (single): 420 gates"), errText);
        assertTrue(Pattern.compile("# n=11 fusion speed-up \\(single\\): \\d+\\.\\d\\dx")
            .matcher(errText).find(), errText);
        assertTrue(errText.contains("precision double,single"), errText);

        Document doc = parse(svg);
        List<String> series = new ArrayList<>();
        List<String> floors = new ArrayList<>();
        NodeList polylines = doc.getElementsByTagName("polyline");
        for (int i = 0; i < polylines.getLength(); i++) {
            Element p = (Element) polylines.item(i);
            if (p.getAttribute("class").equals("series")) {
                String precision = p.getAttribute("data-precision");
                series.add(p.getAttribute("data-kernel") + " " + precision);
                // Single-precision series are dashed, double ones solid.
                assertEquals(precision.equals("single"), p.hasAttribute("stroke-dasharray"),
                    precision);
            } else {
                assertEquals("floor", p.getAttribute("class"));
                floors.add(p.getAttribute("data-precision"));
            }
        }
        // In the order the series first appear in the CSV: the circuit rows only at n = 11.
        assertEquals(List.of("dense double", "diagonal double", "permutation double",
            "controlled double", "dense single", "diagonal single", "permutation single",
            "controlled single", "circuit-fused double", "circuit-unfused double",
            "circuit-fused single", "circuit-unfused single"), series);
        assertEquals(List.of("double", "single"), floors);
        String text = doc.getDocumentElement().getTextContent();
        assertTrue(text.contains("dense (single)"), text);
        assertTrue(text.contains("circuit-fused (single)"), text);
        assertTrue(text.contains("bandwidth floor (single)"), text);
        assertTrue(text.contains("double and single precision"), text);
    }

    @Test
    void singlePrecisionOnly() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int status = run(out, err, "--min", "5", "--max", "5", "--precision", "single",
            "--millis", "2", "--threads", "1", "--kernels", "dense", "--targets", "low,high");
        assertEquals(0, status, err.toString(StandardCharsets.UTF_8));
        String[] lines = out.toString(StandardCharsets.UTF_8).split("\\R");
        assertEquals(3, lines.length, String.join("\n", lines));
        checkRow(lines[1], 5, "dense", "low", "single");
        checkRow(lines[2], 5, "dense", "high", "single");
        // Probe (2) and the two kernel rows: precision counts once.
        assertEquals(4, parse(1, "--min", "5", "--max", "5", "--precision", "single", "--kernels",
            "dense", "--targets", "low,high").steps());
        assertEquals(2 + 2 * 2 + 2 * 2, parse(1, "--min", "5", "--max", "5", "--precision", "both", "--kernels",
            "dense", "--targets", "low,high", "--circuit-qubits", "5").steps());
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
        // 2 probe steps + 1 kernel step; the bar (the shared Progress of qsim-examples) shows
        // the count done before each step and the elapsed time, whatever it is.
        assertTrue(Pattern.compile("\r\\[-{28}\\] 0/3 \\d+:\\d\\d:\\d\\d  n=3 probe copy")
            .matcher(errText).find(), errText);
        assertTrue(errText.contains("\r[" + "#".repeat(18) + "-".repeat(10) + "] 2/3 "), errText);
        // Every line printed by the report ends after the bar is wiped with \r.
        for (String line : errText.split("\n")) {
            String last = line.substring(line.lastIndexOf('\r') + 1);
            assertTrue(last.startsWith("#"), line);
        }
    }

    @Test
    void badOptionsExitOneWithOneLineAndNoCsv() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        assertEquals(1, run(out, err, "--threads", "many"));
        assertEquals("", out.toString(StandardCharsets.UTF_8));
        // One line: what is wrong and where to look, not the whole usage.
        assertEquals(List.of("error: --threads must be a whole number in [1, 256] but was 'many';"
            + " see --help"), err.toString(StandardCharsets.UTF_8).lines().toList());
        err.reset();
        assertEquals(1, run(out, err, "--min", "3", "--max", "3", "--size", "4"));
        List<String> lines = err.toString(StandardCharsets.UTF_8).lines().toList();
        assertEquals(1, lines.size(), lines.toString());
        assertTrue(lines.get(0).startsWith("error: unknown option '--size'; allowed: --min,"),
            lines.get(0));
        assertTrue(lines.get(0).endsWith("; see --help"), lines.get(0));
        assertEquals("", out.toString(StandardCharsets.UTF_8));
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
        // 40 qubits need 16 TiB, more than any test heap; with an eighth and 256 MiB of room
        // 18432.25 GiB, and the probe stops at 2^30 doubles (8 GiB each): 18456.25 GiB,
        // rounded up, plus 1 GiB of room. Single precision (8 TiB) does not fit either.
        assertEquals(2, run(out, err, "--min", "40", "--max", "40"));
        assertEquals("", out.toString(StandardCharsets.UTF_8));
        String errText = err.toString(StandardCharsets.UTF_8);
        assertTrue(errText.startsWith("error: a 40-qubit state in double precision needs"
            + " 16384.0 GiB (18432.3 GiB with room"), errText);
        assertTrue(errText.contains("-Xmx18458g, or lower --max"), errText);
        err.reset();
        // In single precision: 8192 GiB + 1024 GiB + 256 MiB + 24 GiB, rounded up, plus 1 GiB.
        assertEquals(2, run(out, err, "--min", "40", "--max", "40", "--precision", "single"));
        errText = err.toString(StandardCharsets.UTF_8);
        assertTrue(errText.startsWith("error: a 40-qubit state in single precision needs"
            + " 8192.0 GiB"), errText);
        assertTrue(errText.contains("-Xmx9242g, or lower --max"), errText);
    }

    @Test
    void helpGoesToStandardOutputAndExitsZero() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        assertEquals(0, run(out, err, "--help"));
        String help = out.toString(StandardCharsets.UTF_8);
        assertTrue(help.startsWith("usage: java -Xmx8g -cp qsim-bench.jar"
            + " dev.qsim.bench.ScalingReport [options]"), help);
        assertTrue(help.contains(ScalingReport.HEADER), help);
        // Every option with its default and range, and the exit status.
        for (String text : List.of("--min=N", "(default 10; 1..40)", "--max=N",
                "(default 26; 1..40)", "--threads=T", "(default: available processors; 1..256)",
                "--kernels=K,K,...", "of dense, diagonal, permutation, controlled (default all)",
                "--targets=W,W,...", "(default low,mid,high)", "--millis=M",
                "(default 300; 1..600000)", "--circuit=on|off",
                "time a 20-layer circuit with fusion on and off (default on, at n >= 20)",
                "--circuit-qubits=N,N,...", "--noise=on|off", "density matrix of 6..14 qubits",
                "--precision=P", "double, single or both (default double)", "--csv=FILE",
                "--svg=FILE", "--help", "--name value or --name=value",
                "Exit status: 0 done, 1 bad options or unwritable file, 2 not enough heap.")) {
            assertTrue(help.contains(text), text + " in\n" + help);
        }
        assertEquals(ReportOptions.usage(), help);
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
            () -> ReportOptions.parse(new String[] {"--noise", "maybe"}, 1));
        assertTrue(e.getMessage().contains("'maybe'"), e.getMessage());
    }
}
