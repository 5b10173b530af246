package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;

import org.junit.jupiter.api.Test;

/**
 * The layers of docs/architecture.md, checked on the sources (common practice: an
 * architecture rule that a build enforces instead of a reviewer remembering it).
 */
class LayersTest {
    private static final Path MAIN = Path.of("src/main/java/dev/qsim");
    /** The vector kernels, compiled apart (see DEVELOPERS.md, "Vector kernels"). */
    private static final Path VECTOR = Path.of("src/vector/java/dev/qsim/kernel");
    private static final Pattern IMPORT = Pattern.compile("^import (?:static )?([\\w.]+);",
            Pattern.MULTILINE);

    /** The model types: they know no engine and no state. */
    private static final List<String> MODEL = List.of("Circuit", "Instruction", "Operator", "Gate",
            "Gates", "CliffordSteps", "Tally", "Precision", "CircuitRunner", "Diagram");

    private static String code(Path file) throws IOException {
        String text = Files.readString(file, StandardCharsets.UTF_8);
        // Comments and javadoc may name anything; only code counts.
        return text.replaceAll("(?s)/\\*.*?\\*/", "").replaceAll("//[^\\n]*", "");
    }

    private static List<String> imports(String code) {
        List<String> out = new ArrayList<>();
        Matcher m = IMPORT.matcher(code);
        while (m.find()) {
            out.add(m.group(1));
        }
        return out;
    }

    private static List<Path> sources(Path dir) throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.filter(p -> p.toString().endsWith(".java")).sorted().toList();
        }
    }

    @Test
    void theKernelImportsNothingFromAbove() throws IOException {
        List<String> bad = new ArrayList<>();
        List<Path> kernel = new ArrayList<>(sources(MAIN.resolve("kernel")));
        kernel.addAll(sources(VECTOR));
        for (Path f : kernel) {
            for (String imp : imports(code(f))) {
                if (imp.startsWith("dev.qsim.") && !imp.startsWith("dev.qsim.kernel.")) {
                    bad.add(f.getFileName() + ": " + imp);
                }
            }
        }
        assertEquals(List.of(), bad);
    }

    @Test
    void onlyTheVectorUnitUsesTheIncubatingModule() throws IOException {
        // The library compiles with -Werror, and javac warns about any use of an incubating
        // module: jdk.incubator.vector belongs to src/vector/java alone.
        List<String> bad = new ArrayList<>();
        try (Stream<Path> all = Files.walk(MAIN)) {
            for (Path f : all.filter(p -> p.toString().endsWith(".java")).toList()) {
                for (String imp : imports(code(f))) {
                    if (imp.startsWith("jdk.incubator.")) {
                        bad.add(MAIN.relativize(f) + ": " + imp);
                    }
                }
            }
        }
        assertEquals(List.of(), bad);
        assertTrue(sources(VECTOR).size() > 0, "no vector unit at " + VECTOR);
    }

    @Test
    void modelTypesKnowNoEngine() throws IOException {
        Pattern engines = Pattern.compile("\\b(Simulator|StateVector|AmplitudeEngine|Fusion"
                + "|Bridge|Frame|Measurement)\\b");
        List<String> bad = new ArrayList<>();
        for (String type : MODEL) {
            String code = code(MAIN.resolve(type + ".java"));
            for (String imp : imports(code)) {
                boolean allowed = imp.startsWith("java.") || imp.startsWith("org.apache.commons.")
                        || imp.equals("dev.qsim.internal.Checks")
                        || imp.equals("dev.qsim.internal.Heap")
                        || imp.equals("dev.qsim.kernel.GateOp")
                        || imp.equals("dev.qsim.kernel.Matrices");
                if (!allowed) {
                    bad.add(type + " imports " + imp);
                }
            }
            // Messages may point users to the facade; only code counts.
            Matcher m = engines.matcher(code.replaceAll("\"(?:\\\\.|[^\"\\\\])*\"", "\"\""));
            while (m.find()) {
                bad.add(type + " uses " + m.group(1));
            }
        }
        assertEquals(List.of(), bad);
    }

    @Test
    void theCheckHelpersImportOnlyTheKernel() throws IOException {
        for (String helper : List.of("Checks", "Heap")) {
            for (String imp : imports(code(MAIN.resolve("internal/" + helper + ".java")))) {
                assertTrue(!imp.startsWith("dev.qsim.") || imp.startsWith("dev.qsim.kernel."),
                        helper + " imports " + imp);
            }
        }
    }

    @Test
    void noCodeSwitchesOnGateNameStrings() throws IOException {
        // Gate identity is a catalogue entry: no switch or equals on gate names outside it and
        // the reader's name table.
        Pattern names = Pattern.compile("(case|equals\\()\\s*\"(h|x|y|z|s|t|sDagger|tDagger|sqrtX"
                + "|cnot|cx|cz|swap|toffoli|fredkin|rx|ry|rz|phase|cphase|rzz|apply|controlled)\"");
        List<String> bad = new ArrayList<>();
        try (Stream<Path> all = Files.walk(MAIN)) {
            for (Path f : all.filter(p -> p.toString().endsWith(".java")).toList()) {
                if (f.getFileName().toString().equals("Gate.java")) {
                    continue;
                }
                Matcher m = names.matcher(code(f));
                while (m.find()) {
                    bad.add(MAIN.relativize(f) + ": " + m.group());
                }
            }
        }
        assertEquals(List.of(), bad);
    }
}
