package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.List;
import java.util.OptionalDouble;
import java.util.TreeMap;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

import dev.qsim.Precision;

/**
 * Reading the C reference kernel's output ({@code ../shared/ceiling/ceiling.c}) and the columns
 * and plot line made from it. The good file, {@code ceiling-output.txt} beside this class, is
 * the kernel's real output (its header says the commands, machine and load); expected values are
 * its numbers and arithmetic on them with the kernel's documented byte counts: 32 bytes an
 * amplitude for a dense gate (the kernel's README, "Bytes per amplitude for a dense gate: 32"),
 * 16 bytes an element for STREAM copy (McCalpin 1995, "Memory Bandwidth and Machine Balance in
 * Current High Performance Computers", IEEE TCCA Newsletter, table 1).
 */
class CeilingReferenceTest {
    /** A good dense-gate summary line, shaped as the kernel prints it (values from the file). */
    static final String SUMMARY = "test=gate_summary\tgate=u\tvariant=fast\tn=9\tthreads=1\treps=5"
        + "\tmedian_over_t_gbs=31.45\tmedian_over_t_ns_per_amp=1.0176";

    static String captured() throws IOException {
        try (InputStream in = CeilingReferenceTest.class.getResourceAsStream(
                "ceiling-output.txt")) {
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
    }

    /** The value of {@code key} on the first line of {@code text} holding every field given. */
    static double value(String text, String key, String... fields) {
        for (String line : text.split("\n")) {
            List<String> parts = List.of(line.split("\t"));
            if (parts.containsAll(List.of(fields))) {
                for (String p : parts) {
                    if (p.startsWith(key + "=")) {
                        return Double.parseDouble(p.substring(key.length() + 1));
                    }
                }
            }
        }
        throw new AssertionError("no line with " + List.of(fields) + " and " + key);
    }

    @Test
    void goodFileGivesTheDenseGateAndStreamRates() throws IOException {
        String text = captured();
        CeilingReference r = CeilingReference.parse(text, "ceiling-output.txt");
        // The rates are the summary lines' median_over_t_gbs and the stream lines' best_gbs.
        double g9 = value(text, "median_over_t_gbs", "test=gate_summary", "gate=u", "n=9");
        double g10 = value(text, "median_over_t_gbs", "test=gate_summary", "gate=u", "n=10");
        assertEquals(OptionalDouble.of(g9), r.dense(9, 1));
        assertEquals(OptionalDouble.of(g10), r.dense(10, 1));
        assertEquals(OptionalDouble.of(value(text, "best_gbs", "test=stream", "op=copy")),
            r.copy(1));
        assertEquals(OptionalDouble.of(value(text, "best_gbs", "test=stream", "op=triad")),
            r.triad(1));
        // The phase and CNOT summaries are not the dense gate; other sizes and threads absent.
        assertTrue(g9 != value(text, "median_over_t_gbs", "test=gate_summary", "gate=phase",
            "n=9"));
        assertEquals(OptionalDouble.empty(), r.dense(11, 1));
        assertEquals(OptionalDouble.empty(), r.dense(9, 2));
        assertEquals(OptionalDouble.empty(), r.copy(2));
        // The byte count the rates rest on: with 9 targets the median is one target's, so
        // GB/s = 32 B / (ns per amplitude) (README: 32 bytes an amplitude), within the printed
        // rounding (2 decimals of GB/s, 4 of ns).
        double nspa = value(text, "median_over_t_ns_per_amp", "test=gate_summary", "gate=u",
            "n=9");
        assertEquals(32 / nspa, g9, 0.005 + 32 / nspa * 0.00005 / nspa);
        // STREAM copy: 16 bytes an element (McCalpin 1995), so bytes / min_s is best_gbs.
        double bytes = value(text, "bytes", "test=stream", "op=copy");
        assertEquals(16 * Math.round(value(text, "array_mib", "test=stream", "op=copy")
            * 1048576 / 8), bytes, 16 * 0.05 * 1048576 / 8);
        assertEquals(bytes / value(text, "min_s", "test=stream", "op=copy") / 1e9,
            r.copy(1).getAsDouble(), 0.005 + r.copy(1).getAsDouble() * 0.5e-6 / 0.000960);
        // Both sizes present at one thread; a size or thread count missing is named.
        r.requireSizes(9, 10, 1);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> r.requireSizes(8, 11, 1));
        assertTrue(e.getMessage().contains("for n = [8, 11] at threads=1 (it has threads=1: n"
            + " = [9, 10])"), e.getMessage());
        assertTrue(e.getMessage().startsWith("ceiling-output.txt has no dense-gate rate"),
            e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> r.requireSizes(9, 9, 2));
        assertTrue(e.getMessage().contains("for n = [9] at threads=2"), e.getMessage());
        assertTrue(e.getMessage().contains("CEILING_THREADS=2 ceiling gates N REPS"),
            e.getMessage());
        assertTrue(r.describe(1).contains("n = [9, 10]; STREAM copy 46.60 GB/s, triad 39.46"
            + " GB/s"), r.describe(1));
        assertTrue(r.describe(2).contains("no STREAM lines"), r.describe(2));
    }

    @Test
    void windowsLineEndsBlankLinesAndCommentsAreRead() {
        CeilingReference r = CeilingReference.parse("# a comment\r\n\r\n  \n" + SUMMARY
            + "\r\n", "x");
        assertEquals(OptionalDouble.of(31.45), r.dense(9, 1));
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', quoteCharacter = '"', value = {
        // the second line (\t is a tab) | what the message must hold
        "test=gate_summary gate=u n=9 threads=1 median_over_t_gbs=3 | line 2 is not a line of"
            + " the C kernel's output (tab-separated key=value fields, or # for a comment):"
            + " field 1 is 'test=gate_summary gate=u n=9 threads=1 m...'",
        "test=warp\\tn=9 | line 2 names an unknown test 'warp'; known: check, sweep, gate,"
            + " gate_summary, stream, fma",
        "n=9\\ttest=gate | line 2 does not start with test=",
        "test=gate\\tn=9\\tn=10 | line 2 gives n= twice",
        "test=gate\\tn= | field 2 is 'n='",
        "test=gate\\t=4 | field 2 is '=4'",
        "test=gate\\tN=4 | field 2 is 'N=4'",
        "test=gate\\t | field 2 is ''",
        "test=gate_summary\\tgate=u\\tn=abc\\tthreads=1\\tmedian_over_t_gbs=3 | line 2 has n=abc;"
            + " a whole number in [1, 40] is allowed",
        "test=gate_summary\\tgate=u\\tn=41\\tthreads=1\\tmedian_over_t_gbs=3 | line 2 has n=41,"
            + " outside [1, 40]",
        "test=gate_summary\\tgate=u\\tn=99999999999\\tthreads=1\\tmedian_over_t_gbs=3 | has"
            + " n=99999999999; a whole number",
        "test=gate_summary\\tgate=u\\tn=12\\tthreads=0\\tmedian_over_t_gbs=3 | line 2 has"
            + " threads=0, outside [1, 256]",
        "test=gate_summary\\tgate=u\\tn=12\\tthreads=1 | line 2 has no median_over_t_gbs=",
        "test=gate_summary\\tgate=u\\tn=12\\tthreads=1\\tmedian_over_t_gbs=nan | line 2 has"
            + " median_over_t_gbs=nan; a positive decimal number of GB/s is allowed",
        "test=gate_summary\\tgate=u\\tn=12\\tthreads=1\\tmedian_over_t_gbs=inf | has"
            + " median_over_t_gbs=inf; a positive",
        "test=gate_summary\\tgate=u\\tn=12\\tthreads=1\\tmedian_over_t_gbs=Infinity | has"
            + " median_over_t_gbs=Infinity; a positive",
        "test=gate_summary\\tgate=u\\tn=12\\tthreads=1\\tmedian_over_t_gbs=0x1p3 | has"
            + " median_over_t_gbs=0x1p3; a positive",
        "test=gate_summary\\tgate=u\\tn=12\\tthreads=1\\tmedian_over_t_gbs=2.5d | has"
            + " median_over_t_gbs=2.5d; a positive",
        "test=gate_summary\\tgate=u\\tn=12\\tthreads=1\\tmedian_over_t_gbs=0.00 | has"
            + " median_over_t_gbs=0.00; a positive",
        "test=gate_summary\\tgate=u\\tn=12\\tthreads=1\\tmedian_over_t_gbs=-4 | has"
            + " median_over_t_gbs=-4; a positive",
        "test=gate_summary\\tgate=u\\tn=12\\tthreads=1\\tmedian_over_t_gbs=1e999 | has"
            + " median_over_t_gbs=1e999; a positive",
        "test=gate_summary\\tgate=u\\tvariant=plain\\tn=12\\tthreads=1\\tmedian_over_t_gbs=3 |"
            + " line 2 has variant=plain",
        "test=gate_summary\\tn=12\\tthreads=1\\tmedian_over_t_gbs=3 | line 2 has no gate=",
        "test=gate_summary\\tgate=u\\tn=9\\tthreads=1\\tmedian_over_t_gbs=30 | line 2 repeats the"
            + " measurement of line 1 (gate u n=9 threads=1); keep one run of each size and"
            + " thread count",
        "test=check\\tname=HH_all_qubits\\tresult=FAIL | line 2 reports that the C kernel's own"
            + " check failed (result=FAIL)",
        "test=check\\tname=HH_all_qubits | line 2 reports that the C kernel's own check failed"
            + " (result=null)",
        "# CHECK FAILED | line 2 reports that the C kernel's own check failed; its figures are"
            + " no reference",
        "test=stream\\top=scale\\tthreads=1\\tbest_gbs=3 | line 2 has op=scale; known: copy,"
            + " triad, scale_inplace",
        "test=stream\\top=copy\\tthreads=1 | line 2 has no best_gbs=",
        "test=stream\\top=copy\\tthreads=1\\tbest_gbs=1\\ntest=stream\\top=copy\\tthreads=1"
            + "\\tbest_gbs=2 | line 3 repeats the measurement of line 2 (stream op=copy"
            + " threads=1)",
        "test=gate\\tname=a\\u0001b | field 2 is 'name=a?b': 'test=gate name=a?b'",
    })
    void malformedLinesAreNamed(String second, String expected) {
        String line = second.replace("\\t", "\t").replace("\\n", "\n")
            .replace("\\u0001", "\u0001");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> CeilingReference.parse(SUMMARY + "\n" + line + "\n", "--reference file 'r'"));
        assertTrue(e.getMessage().startsWith("--reference file 'r' line "), e.getMessage());
        assertTrue(e.getMessage().contains(expected), e.getMessage());
        assertFalse(e.getMessage().contains("\n") || e.getMessage().contains("\t")
            || e.getMessage().contains("\u0001"), e.getMessage());
    }

    @Test
    void longLinesEmptyInputAndNoDenseGate() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> CeilingReference.parse(SUMMARY + "\n# " + "x".repeat(5000), "r"));
        assertTrue(e.getMessage().startsWith("r line 2 is longer than 4096 characters: '# xxx"),
            e.getMessage());
        // The line is quoted up to 100 characters.
        assertTrue(e.getMessage().endsWith("x".repeat(98) + "...'"), e.getMessage());
        for (String text : List.of("", "# only a comment\n", "test=gate_summary\tgate=phase\tn=9"
                + "\tthreads=1\tmedian_over_t_gbs=3\n")) {
            e = assertThrows(IllegalArgumentException.class,
                () -> CeilingReference.parse(text, "r"));
            assertEquals("r has no line 'test=gate_summary gate=u' (the dense gate's rate); run"
                + " the C kernel as 'ceiling gates N REPS' for each size", e.getMessage());
        }
    }

    @Test
    void filesAreBoundedAndMustBeText(@TempDir Path dir) throws IOException {
        Path good = dir.resolve("good.txt");
        Files.writeString(good, captured(), StandardCharsets.UTF_8);
        assertEquals(OptionalDouble.of(31.45), CeilingReference.read(good).dense(9, 1));

        Path big = dir.resolve("big.txt");
        byte[] bytes = new byte[CeilingReference.MAX_BYTES + 1];
        java.util.Arrays.fill(bytes, (byte) '\n');
        Files.write(big, bytes);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> CeilingReference.read(big));
        assertEquals("--reference file '" + big + "' is larger than 16777216 bytes, the most"
            + " read; the C kernel's output of every size is far smaller", e.getMessage());

        Path binary = dir.resolve("binary.txt");
        Files.write(binary, new byte[] {'t', 'e', (byte) 0xff, (byte) 0xfe, '\n'});
        e = assertThrows(IllegalArgumentException.class, () -> CeilingReference.read(binary));
        assertTrue(e.getMessage().startsWith("--reference file '" + binary + "' is not UTF-8"
            + " text"), e.getMessage());

        assertThrows(NoSuchFileException.class,
            () -> CeilingReference.read(dir.resolve("none.txt")));
        assertThrows(IOException.class, () -> CeilingReference.read(dir));
    }

    @Test
    void fractionOfReferenceOnAWorkedExample() throws IOException {
        CeilingReference r = CeilingReference.parse(captured(), "c");
        // n = 9, 1000 ns a gate: 2 * 16 * 2^9 = 16384 B / 1000 ns = 16.384 GB/s (read and write
        // of 16-byte amplitudes, the kernel's 32 bytes an amplitude); the C kernel's dense gate
        // at n = 9 on one thread: 31.45 GB/s, so 16.384 / 31.45 = 0.52095 of it; its STREAM
        // copy 46.60 GB/s. The Java probe's columns as before: 16.384 / 40 = 0.4096 of copy.
        assertEquals("9,dense,mid,1,1000.0,1.95313,16.384,40.000,30.000,0.410,double,1000.0,"
            + "31.450,0.521,46.600",
            CsvOutput.line(new ReportRow(9, "dense", "mid", 1, 1000.0, 40.0, 30.0), r));
        // Single precision, 8 bytes an amplitude (IEEE 754-2019, sec. 3.6: two 4-byte floats):
        // 8.192 GB/s, 8.192 / 31.45 = 0.26048 of the (double-precision) C dense gate.
        assertEquals("9,dense,mid,1,1000.0,1.95313,8.192,40.000,30.000,0.205,single,1000.0,"
            + "31.450,0.260,46.600",
            CsvOutput.line(new ReportRow(9, "dense", "mid", 1, 1000.0, 40.0, 30.0,
                Precision.SINGLE), r));
        // A density matrix of 5 qubits streams a vector of 10 qubits twice (gate and channel):
        // 2 * 2 * 16 * 2^10 B / 4096 ns = 16 GB/s, against the C gate at n = 10, 48.08 GB/s:
        // 16 / 48.08 = 0.33278.
        assertEquals("5,density-matrix,mid,1,4096.0,4.00000,16.000,40.000,30.000,0.400,double,"
            + "4096.0,48.080,0.333,46.600",
            CsvOutput.line(new ReportRow(5, "density-matrix", "mid", 1, 4096.0, 40.0, 30.0,
                10, 2), r));
        // No C figure at that size or thread count: empty cells, so the columns keep places.
        assertTrue(CsvOutput.line(new ReportRow(11, "dense", "mid", 1, 1000.0, 40.0, 30.0), r)
            .endsWith(",double,1000.0,,,46.600"));
        assertTrue(CsvOutput.line(new ReportRow(9, "dense", "mid", 2, 1000.0, 40.0, 30.0), r)
            .endsWith(",double,1000.0,,,"));
        assertEquals(CsvOutput.HEADER.split(",").length + 3,
            (CsvOutput.HEADER + CsvOutput.REFERENCE_COLUMNS).split(",").length);
    }

    @Test
    void plotDrawsTheReferenceTimePerGate() throws Exception {
        CeilingReference r = CeilingReference.parse(captured(), "c");
        List<ReportRow> rows = List.of(
            new ReportRow(9, "dense", "mid", 1, 1000.0, 40.0, 30.0),
            new ReportRow(10, "dense", "mid", 1, 2000.0, 40.0, 30.0),
            new ReportRow(11, "dense", "mid", 1, 4000.0, 40.0, 30.0),
            new ReportRow(10, "dense", "mid", 1, 1000.0, 40.0, 30.0, Precision.SINGLE));
        // The C kernel's time per gate: 32 * 2^n B / (GB/s) = ns; 16384 / 31.45 = 520.95 ns at
        // n = 9, 32768 / 48.08 = 681.53 ns at n = 10; none at n = 11 (not in the file).
        TreeMap<Integer, Double> line = ScalingPlot.referenceLine(rows, r);
        assertEquals(List.of(9, 10), List.copyOf(line.keySet()));
        assertEquals(16384 / 31.45, line.get(9), 1e-9);
        assertEquals(32768 / 48.08, line.get(10), 1e-9);

        Document doc = ScalingPlotTest.parse(ScalingPlot.svg(rows, "t", "s", r));
        NodeList polylines = doc.getElementsByTagName("polyline");
        int references = 0;
        for (int i = 0; i < polylines.getLength(); i++) {
            Element p = (Element) polylines.item(i);
            if (p.getAttribute("class").equals("reference")) {
                references++;
                assertEquals(2, p.getAttribute("points").split(" ").length);
            }
        }
        assertEquals(1, references);
        String text = doc.getDocumentElement().getTextContent();
        assertTrue(text.contains("C reference dense gate"), text);
        assertTrue(text.contains("Java copy loop (scalar)"), text);
        // Without a reference there is no such line.
        assertFalse(ScalingPlot.svg(rows, "t", "s").contains("class=\"reference\""));
    }
}
