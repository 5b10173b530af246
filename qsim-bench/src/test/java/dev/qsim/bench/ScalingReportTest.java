package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Pattern;

import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

/** Whole runs of the report on tiny states: rows, files, plot, progress, exit statuses. */
class ScalingReportTest {
    static final List<String> KERNELS = List.of("dense", "diagonal", "permutation",
        "controlled");
    static final List<String> THREE = List.of("low", "mid", "high");

    private static final Pattern NUMBER = Pattern.compile("\\d+\\.\\d+");

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
        assertEquals(CsvOutput.HEADER, lines[0]);
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
        // The probe runs beyond the caches at every n: 2^24 doubles, not the 2^(n+1) of the
        // state (McCalpin 1995 asks for arrays well beyond the last-level cache).
        assertTrue(errText.contains("# warm-up (not reported) n=4 probe copy: 16777216 doubles"),
            errText);
        assertTrue(errText.contains("# n=6 probe triad: 16777216 doubles"), errText);
        assertTrue(errText.contains("# n=5 diagonal mid (double): ") && errText.contains(
            "ns per gate (kept in the lazy frame; gate and the read that settles it: "), errText);
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
        assertEquals(12, cells.length, line);
        assertEquals(precision, cells[10], line);
        assertEquals(List.of(Integer.toString(n), kernel, target, "1"),
            List.of(cells[0], cells[1], cells[2], cells[3]), line);
        for (int c : new int[] {4, 5, 6, 7, 8, 9, 11}) {
            assertTrue(NUMBER.matcher(cells[c]).matches(), line);
        }
        double nsPerGate = Double.parseDouble(cells[4]);
        double nsPerPass = Double.parseDouble(cells[11]);
        assertTrue(nsPerGate > 0, line);
        // ns_per_gate has one decimal (error <= 0.05), ns_per_amplitude five, GB/s three.
        double amplitudes = 1 << n;
        assertEquals(nsPerGate / amplitudes, Double.parseDouble(cells[5]),
            0.5e-5 + 0.05 / amplitudes + 1e-12, line);
        // The pass the bandwidth counts: the gate's own for gates applied at once; for X and rz,
        // kept in the lazy frame (docs/architecture.md), the gate with the read that settles it,
        // which takes at least one pass over the state and so longer than the frame update.
        boolean frame = kernel.equals("diagonal") || kernel.equals("permutation");
        if (frame) {
            assertTrue(nsPerPass > 0, line);
        } else {
            assertEquals(cells[4], cells[11], line);
        }
        double gbPerS = (precision.equals("single") ? 16.0 : 32.0) * amplitudes / nsPerPass;
        double gbError = 0.5e-3 + gbPerS * 0.05 / (nsPerPass - 0.05) + 1e-12;
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
        assertEquals(CsvOutput.HEADER, lines.get(0));
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
        // Byte accounting read back from the CSV: gb_per_s * ns_per_pass / 2^n / 2 is the bytes
        // of one amplitude. A float is 4 bytes and a double 8 (IEEE 754-2019, sec. 3.6), so a
        // complex amplitude is 8 bytes in single precision and 16 in double (common practice).
        // Tolerance: the relative rounding of the printed gb_per_s (3 decimals) and ns_per_gate
        // (1 decimal) and ns_per_pass (1 decimal).
        for (String line : lines.subList(1, lines.size())) {
            String[] cells = line.split(",");
            double gb = Double.parseDouble(cells[6]);
            double ns = Double.parseDouble(cells[11]);
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
        assertTrue(text.contains("Java copy (single)"), text);
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
        // Without --reference: the columns as before, and the comment lines say what the Java
        // probe is not and how to get the C reference.
        assertEquals(CsvOutput.HEADER, lines[0]);
        String errText = err.toString(StandardCharsets.UTF_8);
        assertTrue(errText.contains("# the probe is a Java loop that the JIT compiles to scalar"
            + " code: a lower bound on this machine's bandwidth, not a ceiling"), errText);
        assertTrue(errText.contains("pass --reference FILE"), errText);
        checkRow(lines[1], 5, "dense", "low", "single");
        checkRow(lines[2], 5, "dense", "high", "single");
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
        assertEquals(CsvOutput.HEADER, lines.get(0));
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
    void stateTooLargeForTheHeapExitsTwoBeforeMeasuring(@TempDir Path dir) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        Path csv = dir.resolve("never.csv");
        // 40 qubits need 16 TiB in double precision (16 bytes an amplitude) and 8 TiB in single,
        // more than any test heap: the core refuses the state, and its message (bytes needed,
        // maximum heap, the -Xmx that would do) is the one line printed.
        assertEquals(2, run(out, err, "--min", "40", "--max", "40", "--csv", csv.toString()));
        assertEquals("", out.toString(StandardCharsets.UTF_8));
        List<String> lines = err.toString(StandardCharsets.UTF_8).lines().toList();
        assertEquals(1, lines.size(), lines.toString());
        String line = lines.get(0);
        assertTrue(line.startsWith("error: a 40-qubit state needs 16384.0 GiB"), line);
        assertTrue(Pattern.compile("-Xmx\\d+g").matcher(line).find(), line);
        assertTrue(line.endsWith("; or lower --max"), line);
        // Nothing was measured, so no CSV file was made.
        assertFalse(Files.exists(csv), csv.toString());
        err.reset();
        assertEquals(2, run(out, err, "--min", "40", "--max", "40", "--precision", "single"));
        line = err.toString(StandardCharsets.UTF_8).strip();
        assertTrue(line.startsWith("error: a 40-qubit state in single precision needs 8192.0"
            + " GiB"), line);
        assertTrue(line.contains("-Xmx"), line);
        assertTrue(line.endsWith("; or lower --max"), line);
        assertEquals("", out.toString(StandardCharsets.UTF_8));
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
        ReportRow row = new ReportRow(6, "density-matrix", "mid", 1, 1e6, 1, 1,
            12, 2);
        assertEquals(2 * 2 * 16 * 4096 / 1e6, row.gbps(), 1e-12);
    }

    @Test
    void mpsRowsAndTheBondExponent() {
        // --mps on adds one row per bond dimension 8..128 of a 24-qubit chain and the fitted
        // exponent; a two-site update costs O(chi^3) (Schollwöck 2011, Annals of Physics 326,
        // 96, sec. 4.5), so the time must at least grow with chi. The block streamed is
        // 4 chi^2 complex entries, a vector of 2 + 2 log2 chi qubits (chi = 8: 8 qubits).
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        assertEquals(0, run(out, err, "--min", "4", "--max", "4", "--millis", "5", "--kernels",
            "dense", "--targets", "mid", "--circuit", "off", "--mps", "on"), err::toString);
        List<String> rows = out.toString(StandardCharsets.UTF_8).lines()
            .filter(l -> l.contains(",mps-two-qubit,"))
            .collect(java.util.stream.Collectors.toList());
        assertEquals(BondRows.CHIS.length, rows.size(), out::toString);
        double previous = 0;
        for (int i = 0; i < rows.size(); i++) {
            String[] f = rows.get(i).split(",");
            assertEquals("24", f[0]);
            assertEquals("chi=" + BondRows.CHIS[i], f[2]);
            double ns = Double.parseDouble(f[4]);
            assertTrue(ns > 0 && (i < 2 || ns > previous), rows::toString);
            previous = ns;
        }
        String e = err.toString(StandardCharsets.UTF_8);
        assertTrue(e.matches("(?s).*# mps: time per two-qubit gate grows as"
            + " chi\\^\\d+\\.\\d\\d.*"), e);
        assertEquals(2 * 16 * 256 / 1e6, new ReportRow(24, "mps-two-qubit", "chi=8", 1, 1e6,
            1, 1, 8, 1).gbps(), 1e-12);
    }

    @Test
    void referenceColumnsFromTheCKernel(@TempDir Path dir) throws Exception {
        // The C kernel's real output at n = 9 and 10 on one thread (CeilingReferenceTest has
        // its source): the reference columns are its dense gate (31.45 and 48.08 GB/s) and
        // STREAM copy (46.60 GB/s), and fraction_of_reference = gb_per_s / reference_gb_per_s.
        Path reference = dir.resolve("ceiling.txt");
        Files.writeString(reference, CeilingReferenceTest.captured(), StandardCharsets.UTF_8);
        Path svg = dir.resolve("plot.svg");
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int status = run(out, err, "--min", "9", "--max", "10", "--threads", "1", "--kernels",
            "dense", "--targets", "mid", "--millis", "5", "--circuit", "off", "--reference",
            reference.toString(), "--svg", svg.toString());
        String errText = err.toString(StandardCharsets.UTF_8);
        assertEquals(0, status, errText);
        String[] lines = out.toString(StandardCharsets.UTF_8).split("\\R");
        assertEquals(CsvOutput.HEADER + CsvOutput.REFERENCE_COLUMNS, lines[0]);
        assertEquals(3, lines.length, String.join("\n", lines));
        List<String> expected = List.of("31.450", "48.080");
        for (int i = 1; i <= 2; i++) {
            String[] cells = lines[i].split(",", -1);
            assertEquals(15, cells.length, lines[i]);
            assertEquals(String.valueOf(8 + i), cells[0]);
            assertEquals(expected.get(i - 1), cells[12], lines[i]);
            double gb = Double.parseDouble(cells[6]);
            // Tolerance: gb_per_s and the fraction are printed with 3 decimals.
            assertEquals(gb / Double.parseDouble(cells[12]), Double.parseDouble(cells[13]),
                0.0005 + 0.0005 / Double.parseDouble(cells[12]), lines[i]);
            assertEquals("46.600", cells[14], lines[i]);
        }
        assertTrue(errText.contains("# reference: --reference file '" + reference + "': C dense"
            + " gate at threads=1, n = [9, 10]; STREAM copy 46.60 GB/s, triad 39.46 GB/s"),
            errText);
        assertTrue(errText.contains("fraction_of_reference = gb_per_s / reference_gb_per_s"),
            errText);
        assertFalse(errText.contains("pass --reference FILE"), errText);
        assertTrue(Files.readString(svg, StandardCharsets.UTF_8).contains("<polyline"
            + " class=\"reference\""));
    }

    @Test
    void badReferenceExitsOneBeforeMeasuring(@TempDir Path dir) throws Exception {
        Path reference = dir.resolve("ceiling.txt");
        Files.writeString(reference, CeilingReferenceTest.captured(), StandardCharsets.UTF_8);
        Path csv = dir.resolve("never.csv");
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        // n = 11 was not measured by the C kernel, nor were two threads.
        assertEquals(1, run(out, err, "--min", "9", "--max", "11", "--threads", "1",
            "--reference", reference.toString(), "--csv", csv.toString()));
        String line = err.toString(StandardCharsets.UTF_8).strip();
        assertTrue(line.startsWith("error: --reference file '" + reference + "' has no"
            + " dense-gate rate ('test=gate_summary gate=u') for n = [11] at threads=1"), line);
        assertFalse(line.contains("\n"), line);
        err.reset();
        assertEquals(1, run(out, err, "--min", "9", "--max", "10", "--threads", "2",
            "--reference", reference.toString(), "--csv", csv.toString()));
        assertTrue(err.toString(StandardCharsets.UTF_8).contains("for n = [9, 10] at"
            + " threads=2"), err::toString);
        // A malformed file names the line; a folder cannot be read.
        Files.writeString(reference, "# run 1\nn=9 gbs=31.45\n", StandardCharsets.UTF_8);
        err.reset();
        assertEquals(1, run(out, err, "--min", "9", "--max", "9", "--reference",
            reference.toString()));
        assertEquals("error: --reference file '" + reference + "' line 2 is not a line of the C"
            + " kernel's output (tab-separated key=value fields, or # for a comment): field 1 is"
            + " 'n=9 gbs=31.45': 'n=9 gbs=31.45'", err.toString(StandardCharsets.UTF_8).strip());
        err.reset();
        assertEquals(1, run(out, err, "--min", "9", "--max", "9", "--reference",
            dir.toString()));
        assertTrue(err.toString(StandardCharsets.UTF_8).startsWith("error: cannot read"
            + " --reference file '" + dir + "': "), err::toString);
        assertEquals("", out.toString(StandardCharsets.UTF_8));
        assertFalse(Files.exists(csv), csv.toString());
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
}
