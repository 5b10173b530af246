package dev.qsim.examples.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Tally;
import dev.qsim.text.QasmReader;

/** The SVG pictures of the tool: histograms ({@code run}, {@code compare}) and circuits. */
class SvgPicturesTest {

    private static final String DEMO = "demo/";

    @TempDir
    Path dir;

    private static Document parse(String svg) throws Exception {
        return DocumentBuilderFactory.newInstance().newDocumentBuilder()
                .parse(new ByteArrayInputStream(svg.getBytes(StandardCharsets.UTF_8)));
    }

    private static List<Element> elements(Document d, String tag, String cls) {
        List<Element> out = new ArrayList<>();
        NodeList all = d.getElementsByTagName(tag);
        for (int i = 0; i < all.getLength(); i++) {
            Element e = (Element) all.item(i);
            if (cls == null || (" " + e.getAttribute("class") + " ").contains(" " + cls + " ")) {
                out.add(e);
            }
        }
        return out;
    }

    private static double num(Element e, String attribute) {
        return Double.parseDouble(e.getAttribute(attribute));
    }

    @Test
    void runLabelsSimulatedShotsNamesTheNoiseAndSaysWhatItWrote() throws IOException {
        Path svg = dir.resolve("ghz.svg");
        ToolRun r = new ToolRun("run", DEMO + "ghz5.qasm", "--shots", "400", "--seed", "7",
                "--depolarizing", "0.01", "--readout-error", "0.02", "--format", "csv",
                "--svg", svg.toString());
        assertEquals(0, r.code, r::toString);
        String text = Files.readString(svg);
        assertTrue(text.contains(">simulated<"), text);
        assertFalse(text.contains("measured"), text);
        assertTrue(text.contains("ghz5.qasm, seed 7, depolarizing 0.01, readout error 0.02"),
                text);
        // Depolarizing noise gives every one of the 2^5 outcomes a probability above 0
        // (Nielsen and Chuang 2010, sec. 8.3.4), so the noisy prediction has 32 bars.
        assertTrue(r.err.contains("wrote " + svg + " (histogram of 32 outcomes, one row each,"
                + " simulated beside the noisy prediction)"), r::toString);
        assertTrue(text.contains(">noisy prediction<"), text);
        ToolRun ideal = new ToolRun("run", DEMO + "bell.qasm", "--svg", svg.toString());
        assertTrue(ideal.err.contains("wrote " + svg + " (histogram of 2 outcomes, simulated"
                + " beside the ideal prediction)"), ideal::toString);
        assertTrue(Files.readString(svg).contains("bell.qasm, seed 1, noiseless"));
    }

    @Test
    void compareLabelsTheTallyMeasuredAndSaysWhatItWrote() throws IOException {
        Path svg = dir.resolve("fit.svg");
        ToolRun r = new ToolRun("compare", DEMO + "ghz5-pallet.csv", "--circuit",
                DEMO + "ghz5.qasm", "--svg", svg.toString());
        assertEquals(0, r.code, r::toString);
        assertTrue(Files.readString(svg).contains(">measured<"));
        assertTrue(r.err.contains("wrote " + svg + " (histogram of "), r::toString);
    }

    @Test
    void noBarHidesAValueLabel() throws Exception {
        // A tally whose ideal bar is taller than its simulated one, beside outcomes of other
        // heights: each label must lie above every bar of its outcome, and be drawn after
        // all bars (SVG paints in document order: SVG 1.1, section 3.3).
        Tally tally = Tally.of(2, java.util.Map.of("00", 10L, "01", 300L, "11", 690L));
        double[] ideal = {0.5, 0.25, 0, 0.25};
        for (int extra : new int[] {0, 1}) {
            Tally t = extra == 0 ? tally : Tally.of(5, wide());
            double[] p = extra == 0 ? ideal : uniform(32);
            Document d = parse(SvgHistogram.draw(t, p, "t", "simulated", "ideal").svg());
            List<Element> bars = elements(d, "rect", "bar");
            List<Element> values = elements(d, "text", "value");
            assertEquals(t.outcomes().size(), values.size());
            String svg = SvgHistogram.draw(t, p, "t", "simulated", "ideal").svg();
            assertTrue(svg.lastIndexOf("class=\"bar") < svg.indexOf("class=\"value\""), svg);
            boolean rows = extra == 1;
            for (Element v : values) {
                double x = num(v, "x");
                double y = num(v, "y");
                for (Element b : bars) {
                    double bx = num(b, "x");
                    double by = num(b, "y");
                    double bw = num(b, "width");
                    double bh = num(b, "height");
                    if (!rows && x >= bx && x <= bx + bw) {
                        assertTrue(y < by, "label at " + y + " inside a bar from " + by);
                    }
                    if (rows && y - 8 < by + bh && y > by) {
                        assertTrue(x >= bx + bw, "label at " + x + " on a bar to " + (bx + bw));
                    }
                }
            }
        }
    }

    private static java.util.Map<String, Long> wide() {
        java.util.Map<String, Long> counts = new java.util.HashMap<>();
        for (int i = 0; i < 32; i++) {
            counts.put(Cli.bits(i, 5), 10L + 7 * i);
        }
        return counts;
    }

    private static double[] uniform(int n) {
        double[] p = new double[n];
        java.util.Arrays.fill(p, 1.0 / n);
        return p;
    }

    @Test
    void manyOutcomesLieAsRowsOfFixedWidth() throws Exception {
        Path file = dir.resolve("u7.qasm");
        Files.writeString(file, "OPENQASM 3;\ninclude \"stdgates.inc\";\nqubit[7] q;\n"
                + "bit[7] c;\nh q;\nc = measure q;\n");
        Path svg = dir.resolve("u7.svg");
        ToolRun r = new ToolRun("run", file.toString(), "--shots", "20000", "--svg",
                svg.toString());
        assertEquals(0, r.code, r::toString);
        // H on 7 qubits: 128 outcomes, each of probability 1/128 (Nielsen and Chuang 2010,
        // §1.4.4), so the ideal prediction alone has 128 bars.
        assertTrue(r.err.contains("(histogram of 128 outcomes, one row each"), r::toString);
        Document d = parse(Files.readString(svg));
        Element root = d.getDocumentElement();
        assertTrue(num(root, "width") <= 800, root.getAttribute("width"));
        List<Element> ideal = elements(d, "rect", "predicted");
        assertEquals(128, ideal.size());
        Set<Double> ys = new HashSet<>();
        for (Element b : ideal) {
            ys.add(num(b, "y"));
        }
        assertEquals(128, ys.size(), "one row per outcome");
    }

    @Test
    void circuitGatesCarryTheCataloguesLabelsOnTheirOwnWires() throws Exception {
        Path file = dir.resolve("mix.qasm");
        Files.writeString(file, "OPENQASM 3;\ninclude \"stdgates.inc\";\nqubit[4] q;\n"
                + "bit[4] c;\ncrx(0.3) q[0], q[2];\nU(0.4, 0, 0) q[1];\n"
                + "ctrl(2) @ rz(0.5) q[0], q[1], q[3];\ncp(pi/4) q[0], q[2];\n"
                + "swap q[1], q[3];\nbarrier q;\nc[0] = measure q[0];\n"
                + "if (c[0] == 1) { x q[1]; z q[2]; }\nc = measure q;\n");
        Circuit c = QasmReader.read(file);
        String svg = SvgCircuit.draw(c, "mix.qasm");
        Document d = parse(svg);
        // The catalogue's labels with their angles (Gate.targetLabels), with pi as π.
        String[] expected = {"RX(0.3)", "U(0.4,0,0)", "RZ(0.5)", "P(\u03c0/4)", "X", "Z"};
        List<Element> labels = elements(d, "text", "label");
        List<String> texts = new ArrayList<>();
        for (Element e : labels) {
            texts.add(e.getTextContent());
        }
        for (String e : expected) {
            assertTrue(texts.contains(e), e + " not in " + texts);
        }
        assertEquals("P(pi/4)", Gate.CPHASE.targetLabels(new double[] {Math.PI / 4}, 2)[1]);
        // Every label lies on the wire of a qubit its gate acts on: cp(pi/4) on q0, q2 labels
        // q2, never q1 between them.
        double[] wireY = new double[4];
        for (Element w : elements(d, "line", "wire")) {
            wireY[Integer.parseInt(w.getAttribute("data-qubit"))] = num(w, "y1");
        }
        for (Element e : labels) {
            double y = num(e, "y") - 4;
            int on = -1;
            for (int q = 0; q < 4; q++) {
                if (Math.abs(wireY[q] - y) < 1) {
                    on = q;
                }
            }
            assertTrue(on >= 0, e.getTextContent() + " is off every wire");
            if (e.getTextContent().startsWith("P(")) {
                assertEquals(2, on);
            }
        }
    }

    @Test
    void circuitHasOneLinePerBitMeasurementTagsAndConditionFrames() throws Exception {
        Circuit c = QasmReader.read(Path.of(DEMO + "teleport.qasm"));
        String svg = SvgCircuit.draw(c, "teleport.qasm");
        Document d = parse(svg);
        List<Element> bits = elements(d, "line", "bit");
        assertEquals(c.clbits(), bits.size(), "one line per classical bit");
        List<String> texts = new ArrayList<>();
        for (Element e : elements(d, "text", null)) {
            texts.add(e.getTextContent());
        }
        for (int b = 0; b < c.clbits(); b++) {
            assertTrue(texts.contains("c" + b), texts::toString);
            assertTrue(texts.contains("\u2192c" + b), "measurement tag of c" + b);
        }
        assertTrue(texts.contains("if c1=1") && texts.contains("if c0=1"), texts::toString);
        List<Element> frames = elements(d, "rect", "condition");
        assertEquals(2, frames.size());
        for (Element f : frames) {
            assertFalse(f.getAttribute("stroke-dasharray").isEmpty());
        }
        // No arrowheads and no bundled classical line.
        assertEquals(0, d.getElementsByTagName("polygon").getLength());
        assertTrue(!texts.contains("c"), texts::toString);
        assertTrue(texts.contains("RY(2\u03c0/3)"), texts::toString);
    }

    @Test
    void drawSaysWhatItWroteAndTheHelpNamesTheBarrier() throws IOException {
        Path svg = dir.resolve("t.svg");
        ToolRun r = new ToolRun("draw", DEMO + "teleport.qasm", "--svg", svg.toString());
        assertEquals(0, r.code, r::toString);
        assertEquals("wrote " + svg + " (circuit of 3 qubits, 3 classical bits, 10 instructions,"
                + " depth 7)\n", r.err);
        ToolRun help = new ToolRun("draw", "--help");
        assertTrue(help.out.replaceAll("\\s+", " ").contains("barrier statements are read but"
                + " not kept"), help::toString);
    }

    @Test
    void circuitDrawsLoopsBranchesDelaysAndDynamicAngles() throws Exception {
        Circuit c = QasmReader.read("OPENQASM 3;\ninclude \"stdgates.inc\";\nqubit[2] q;\n"
                + "bit[2] c;\nh q[0];\nc[0] = measure q[0];\nif (c[0] == 1) { x q[1]; } else"
                + " { z q[1]; }\nwhile (c[1] == 0) { h q[1]; c[1] = measure q[1]; }\n"
                + "delay[2us] q[0];\nrx(c[1] * 0.5) q[0];\n");
        Document d = parse(SvgCircuit.draw(c, "knots.qasm"));
        List<String> tags = new ArrayList<>();
        for (Element e : elements(d, "text", "tag")) {
            tags.add(e.getTextContent());
        }
        assertTrue(tags.stream().anyMatch(t -> t.startsWith("if ") && t.contains("c[0]")),
                tags::toString);
        assertTrue(tags.stream().anyMatch(t -> t.startsWith("else of ")), tags::toString);
        assertTrue(tags.stream().anyMatch(t -> t.startsWith("while ")), tags::toString);
        assertEquals(3, elements(d, "rect", "condition").size());
        List<String> labels = new ArrayList<>();
        for (Element e : elements(d, "text", "label")) {
            labels.add(e.getTextContent());
        }
        assertTrue(labels.contains("wait(2us)"), labels::toString);
        assertTrue(labels.stream().anyMatch(t -> t.startsWith("RX(") && t.contains("c[1]")),
                labels::toString);
    }

    @Test
    void circuitsTooLargeForAPictureAreRefusedByName() {
        // One gate across 2^20 qubits (an input of the fuzzing harness): no picture of a
        // million wires, a refusal that names the count and the text drawing instead.
        Circuit wide = Circuit.builder(Circuit.MAX_QUBITS).cnot(0, Circuit.MAX_QUBITS - 1)
                .build();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> SvgCircuit.draw(wide, "wide.qasm"));
        assertTrue(e.getMessage().contains(Circuit.MAX_QUBITS + " qubits")
                && e.getMessage().contains("as text"), e.getMessage());
        Circuit.Builder deep = Circuit.builder(2);
        for (int k = 0; k <= SvgCircuit.MAX_SHAPES; k++) {
            deep.h(k % 2);
        }
        e = assertThrows(IllegalArgumentException.class, () -> SvgCircuit.draw(deep.build(),
                "deep.qasm"));
        assertTrue(e.getMessage().contains("more than " + SvgCircuit.MAX_SHAPES), e.getMessage());
    }
}
