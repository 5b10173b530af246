package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

import dev.qsim.Precision;

/**
 * Tests of the SVG plot. The rows are made up to exercise the drawing (not measurements): the
 * checks are on structure and on the plot's own arithmetic.
 */
class ScalingPlotTest {

    private static ReportRow row(int n, String kernel, String target, double nanos,
            double copy) {
        return new ReportRow(n, kernel, target, 2, nanos, copy, copy * 0.9);
    }

    private static List<ReportRow> rows() {
        List<ReportRow> rows = new ArrayList<>();
        for (int n = 10; n <= 14; n++) {
            double base = 4.0 * (1 << n);
            double copy = n < 12 ? 40.0 : 12.0;
            rows.add(row(n, "dense", "low", base, copy));
            rows.add(row(n, "dense", "mid", base * 1.5, copy));
            rows.add(row(n, "dense", "high", base * 2, copy));
            rows.add(row(n, "diagonal", "low", base / 2, copy));
            rows.add(row(n, "diagonal", "high", base, copy));
        }
        rows.add(row(14, "circuit-fused", "all", 1000.0, 12.0));
        return rows;
    }

    @Test
    void oneSeriesPerKernelMidOrMean() {
        Map<String, TreeMap<Integer, Double>> series = ScalingPlot.series(rows());
        assertEquals(List.of("dense", "diagonal", "circuit-fused"),
            new ArrayList<>(series.keySet()));
        // dense has a mid row: its value. diagonal has none: the mean of low and high,
        // (2048 + 4096) / 2 = 3072 at n = 10 (exact).
        assertEquals(1.5 * 4 * 1024, series.get("dense").get(10), 0.0);
        assertEquals(3072.0, series.get("diagonal").get(10), 0.0);
        assertEquals(Map.of(14, 1000.0), series.get("circuit-fused"));
    }

    @Test
    void floorIsTheCopyTimeOfTheGateBytes() {
        // 32 * 2^10 bytes at 40 GB/s (= 40 bytes/ns) is 819.2 ns; 32 * 2^14 at 12 is
        // 43690.666... ns (exact arithmetic).
        TreeMap<Integer, Double> floor = ScalingPlot.floor(rows(), Precision.DOUBLE);
        assertEquals(819.2, floor.get(10), 1e-9);
        assertEquals(32.0 * 16384 / 12.0, floor.get(14), 1e-9);
        assertEquals(5, floor.size());
        // No single-precision rows, no single-precision floor.
        assertTrue(ScalingPlot.floor(rows(), Precision.SINGLE).isEmpty());
    }

    @Test
    void singlePrecisionRowsMakeTheirOwnDashedSeriesAndFloor() throws Exception {
        List<ReportRow> rows = new ArrayList<>(rows());
        for (int n = 12; n <= 14; n++) {
            rows.add(new ReportRow(n, "dense", "mid", 2, 3.0 * (1 << n), 12.0, 10.8,
                Precision.SINGLE));
        }
        // A density-matrix row (a 2n-qubit vector, two passes) sets no floor point.
        rows.add(new ReportRow(9, "density-matrix", "mid", 2, 1e6, 30.0, 27.0, 18, 2));
        Map<String, TreeMap<Integer, Double>> series = ScalingPlot.series(rows);
        assertEquals(List.of("dense", "diagonal", "circuit-fused", "dense (single)",
            "density-matrix"), new ArrayList<>(series.keySet()));
        assertEquals(3.0 * 4096, series.get("dense (single)").get(12), 0.0);
        // The double series is untouched by the single rows: 1.5 * 4 * 2^12.
        assertEquals(1.5 * 4 * 4096, series.get("dense").get(12), 0.0);
        // Single floor: 2 * 8 * 2^12 bytes at 12 GB/s = 65536 / 12 ns, half the double floor
        // (8-byte amplitudes: two 4-byte floats, IEEE 754-2019 sec. 3.6; exact arithmetic).
        TreeMap<Integer, Double> single = ScalingPlot.floor(rows, Precision.SINGLE);
        assertEquals(List.of(12, 13, 14), new ArrayList<>(single.keySet()));
        assertEquals(16.0 * 4096 / 12.0, single.get(12), 1e-9);
        assertEquals(ScalingPlot.floor(rows, Precision.DOUBLE).get(14) / 2, single.get(14),
            1e-9);
        assertEquals(List.of(10, 11, 12, 13, 14),
            new ArrayList<>(ScalingPlot.floor(rows, Precision.DOUBLE).keySet()));

        Document doc = parse(ScalingPlot.svg(rows, "t", "s"));
        NodeList polylines = doc.getElementsByTagName("polyline");
        String denseDoubleColour = null;
        String denseSingleColour = null;
        List<String> floors = new ArrayList<>();
        for (int i = 0; i < polylines.getLength(); i++) {
            Element p = (Element) polylines.item(i);
            Element group = (Element) p.getParentNode();
            if (p.getAttribute("class").equals("floor")) {
                floors.add(p.getAttribute("data-precision") + " "
                    + p.getAttribute("stroke-dasharray"));
            } else if (p.getAttribute("data-kernel").equals("dense")) {
                boolean dashed = p.getAttribute("data-precision").equals("single");
                assertEquals(dashed, p.hasAttribute("stroke-dasharray"));
                if (dashed) {
                    denseSingleColour = group.getAttribute("stroke");
                    // Hollow markers: white fill.
                    assertEquals("#ffffff", group.getAttribute("fill"));
                } else {
                    denseDoubleColour = group.getAttribute("stroke");
                }
            }
        }
        assertEquals(List.of("double 7 5", "single 2 4"), floors);
        assertEquals(denseDoubleColour, denseSingleColour);
        String text = doc.getDocumentElement().getTextContent();
        assertTrue(text.contains("dense (single)"), text);
        assertTrue(text.contains("Java copy (single)"), text);
        assertTrue(text.contains("16 bytes each, 8 in single precision"), text);
    }

    @Test
    void svgIsWellFormedWithOnePolylinePerKernelAndTheFloor() throws Exception {
        String svg = ScalingPlot.svg(rows(), "time & <size>", "java \"17\", cpu 'x'");
        Document doc = parse(svg);
        Element root = doc.getDocumentElement();
        assertEquals("svg", root.getLocalName());
        assertEquals("http://www.w3.org/2000/svg", root.getNamespaceURI());
        List<String> kernels = new ArrayList<>();
        int floors = 0;
        NodeList polylines = doc.getElementsByTagName("polyline");
        for (int i = 0; i < polylines.getLength(); i++) {
            Element p = (Element) polylines.item(i);
            if (p.getAttribute("class").equals("series")) {
                kernels.add(p.getAttribute("data-kernel"));
            } else {
                assertEquals("floor", p.getAttribute("class"));
                assertTrue(p.hasAttribute("stroke-dasharray"));
                assertEquals(5, p.getAttribute("points").split(" ").length);
                floors++;
            }
        }
        assertEquals(List.of("dense", "diagonal", "circuit-fused"), kernels);
        assertEquals(1, floors);
        // The title survives escaping; the legend names every kernel and the floor.
        String text = root.getTextContent();
        assertTrue(text.contains("time & <size>"), text);
        assertTrue(text.contains("java \"17\", cpu 'x'"), text);
        for (String k : kernels) {
            assertTrue(text.contains(k), text);
        }
        assertTrue(text.contains("Java copy loop (scalar)"), text);
        // Decade ticks: the plotted values run from 819.2 ns (the floor at n = 10) to 98304 ns
        // (dense mid at n = 14), so the axis spans the decades 100 ns .. 100 us.
        assertTrue(text.contains("100 ns") && text.contains("1 \u00b5s")
            && text.contains("10 \u00b5s") && text.contains("100 \u00b5s"), text);
    }

    @Test
    void oneSizeStillDraws() throws Exception {
        List<ReportRow> one = List.of(row(5, "dense", "mid", 100.0, 10.0));
        Document doc = parse(ScalingPlot.svg(one, "t", "s"));
        assertEquals(2, doc.getElementsByTagName("polyline").getLength());
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> ScalingPlot.svg(List.of(), "t", "s"));
        assertEquals("there are no rows to plot", e.getMessage());
    }

    @Test
    void decadeLabelsAndEscaping() {
        assertEquals("1 ns", ScalingPlot.decadeLabel(0));
        assertEquals("100 ns", ScalingPlot.decadeLabel(2));
        assertEquals("1 \u00b5s", ScalingPlot.decadeLabel(3));
        assertEquals("10 ms", ScalingPlot.decadeLabel(7));
        assertEquals("1 s", ScalingPlot.decadeLabel(9));
        assertEquals("100 s", ScalingPlot.decadeLabel(11));
        assertEquals("1e-1 ns", ScalingPlot.decadeLabel(-1));
        assertEquals("a&amp;b&lt;c&gt;&quot;&apos;", ScalingPlot.escape("a&b<c>\"'"));
    }

    static Document parse(String svg) throws Exception {
        DocumentBuilderFactory f = DocumentBuilderFactory.newInstance();
        f.setNamespaceAware(true);
        f.setFeature("http://apache.org/xml/features/disallow-doctype-decl", true);
        return f.newDocumentBuilder().parse(new ByteArrayInputStream(
            svg.getBytes(StandardCharsets.UTF_8)));
    }
}
