package dev.qsim.text;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Gates;
import dev.qsim.Operator;

/**
 * Each construct of the subset against the circuit built by hand. Syntax and meaning follow the
 * OpenQASM 3 specification (Cross et al. 2022, ACM Trans. Quantum Comput. 3(3), 12,
 * doi:10.1145/3505636; stdgates.inc as published with it).
 */
class QasmReaderTest {

    private static final String HEAD = "OPENQASM 3.0;\ninclude \"stdgates.inc\";\n";

    @Test
    void everyStandardGateMapsToTheBuilderMethod() {
        Circuit read = QasmReader.read(HEAD + "qubit[3] q;\n"
                + "h q[0]; x q[1]; y q[2]; z q[0]; s q[1]; sdg q[2]; t q[0]; tdg q[1];\n"
                + "sx q[2]; rx(0.5) q[0]; ry(0.25) q[1]; rz(-1.5) q[2]; p(0.125) q[0];\n"
                + "phase(0.75) q[1]; cx q[0], q[1]; CX q[1], q[2]; cz q[2], q[0];\n"
                + "cp(0.3) q[0], q[2]; cphase(0.4) q[1], q[0]; swap q[1], q[2];\n"
                + "ccx q[0], q[1], q[2]; cswap q[2], q[0], q[1];\n"
                + "cy q[0], q[1]; ch q[1], q[2]; crx(0.1) q[0], q[2]; cry(0.2) q[2], q[1];\n"
                + "crz(0.3) q[1], q[0];\n");
        Circuit hand = Circuit.builder(3, 0).h(0).x(1).y(2).z(0).s(1).sDagger(2).t(0).tDagger(1)
                .sqrtX(2).rx(0, 0.5).ry(1, 0.25).rz(2, -1.5).phase(0, 0.125).phase(1, 0.75)
                .cnot(0, 1).cnot(1, 2).cz(2, 0).cphase(0, 2, 0.3).cphase(1, 0, 0.4).swap(1, 2)
                .toffoli(0, 1, 2).fredkin(2, 0, 1)
                .controlled(Gates.Y, new int[] {0}, 1).controlled(Gates.H, new int[] {1}, 2)
                .gate(Gate.CRX, new double[] {0.1}, 0, 2)
                .gate(Gate.CRY, new double[] {0.2}, 2, 1)
                .gate(Gate.CRZ, new double[] {0.3}, 1, 0).build();
        // Catalogue entries: ctrl @ y is cy (Gate.withControls).
        assertEquals(Gate.CY, read.instructions().get(22).gate());
        assertEquals(hand, read);
    }

    @Test
    void theIdentityOfStdgatesReadsAsTheCatalogueIdentity() {
        Circuit read = QasmReader.read(HEAD + "qubit[2] q;\nid q[1];\nid q;\n");
        Circuit hand = Circuit.builder(2, 0).gate(Gate.I, 1).gate(Gate.I, 0).gate(Gate.I, 1)
                .build();
        assertEquals(hand, read);
    }

    @Test
    void registersTakeConsecutiveIndicesInDeclarationOrder() {
        Circuit read = QasmReader.read(HEAD + "qubit[2] a;\nqubit b;\nqubit[3] d;\n"
                + "bit[2] c;\nbit e;\n"
                + "x a[1]; x b; h d[2];\ne = measure b;\nc[1] = measure d[0];\n"
                + "measure a[0] -> c[0];\n");
        Circuit hand = Circuit.builder(6, 3).x(1).x(2).h(5).measure(2, 2).measure(3, 1)
                .measure(0, 0).build();
        assertEquals(hand, read);
    }

    @Test
    void wholeRegistersBroadcast() {
        Circuit read = QasmReader.read(HEAD + "qubit[3] q;\nqubit[3] r;\nbit[3] c;\n"
                + "h q;\ncx q, r;\ncz q[0], r;\nc = measure r;\n");
        Circuit hand = Circuit.builder(6, 3).h(0).h(1).h(2).cnot(0, 3).cnot(1, 4).cnot(2, 5)
                .cz(0, 3).cz(0, 4).cz(0, 5).measure(3, 0).measure(4, 1).measure(5, 2).build();
        assertEquals(hand, read);
    }

    @Test
    void builtInUAndGphase() {
        // U(θ, φ, λ) is the spec's built-in single-qubit gate, equal to Gates.u; gphase(γ)
        // multiplies the state by e^{iγ} (OpenQASM 3 spec, "Built-in quantum instructions").
        Circuit read = QasmReader.read("OPENQASM 3;\nqubit[2] q;\nU(0.1, 0.2, 0.3) q[1];\n"
                + "gphase(0.5);\n");
        Complex z = Complex.ofCis(0.5);
        Operator phase = Operator.of(new Complex[][] {{z, Complex.ZERO}, {Complex.ZERO, z}});
        Circuit hand = Circuit.builder(2, 0).u(1, 0.1, 0.2, 0.3).apply(phase, 0).build();
        assertEquals(Gates.u(0.1, 0.2, 0.3), read.instructions().get(0).operator());
        assertEquals(hand, read);
    }

    @Test
    void constantExpressionsFollowTheUsualPrecedence() {
        // Precedence as in the OpenQASM 3 spec (power binds tighter than unary minus, which
        // binds tighter than * and /); the expected values are the same arithmetic in Java.
        Circuit read = QasmReader.read(HEAD + "qubit q;\n"
                + "rz(pi/4 + 2*sin(pi/6) - sqrt(4)^2 / -ln(euler)) q;\n"
                + "rx(-2**3 * (1.5e-1 - .5)) q;\n"
                + "ry(cos(tau) + exp(1) - tan(0.5) + arcsin(0.5) + arccos(0.5) + arctan(2)) q;\n"
                + "p(π / 3) q; // a comment\n/* block\n comment */ rz(1E2) q;\n");
        double a = Math.PI / 4 + 2 * Math.sin(Math.PI / 6) - Math.pow(Math.sqrt(4), 2)
                / -Math.log(Math.E);
        double b = -Math.pow(2, 3) * (1.5e-1 - .5);
        double c = Math.cos(2 * Math.PI) + Math.exp(1) - Math.tan(0.5) + Math.asin(0.5)
                + Math.acos(0.5) + Math.atan(2);
        Circuit hand = Circuit.builder(1, 0).rz(0, a).rx(0, b).ry(0, c).phase(0, Math.PI / 3)
                .rz(0, 100).build();
        assertEquals(hand, read);
    }

    @Test
    void measureResetBarrierAndConditions() {
        Circuit read = QasmReader.read(HEAD + "qubit[2] q;\nbit[2] c;\n"
                + "h q[0];\nbarrier q;\nbarrier;\nc[0] = measure q[0];\n"
                + "if (c[0] == 1) x q[1];\n"
                + "if (c[0] == 0) { z q[1]; h q[0]; if (c[1] == true) { reset q[0]; } }\n"
                + "reset q;\nc = measure q;\n");
        Circuit hand = Circuit.builder(2).h(0).measure(0, 0)
                .ifBit(0, 1, b -> b.x(1))
                .ifBit(0, 0, b -> b.z(1).h(0).ifBit(1, 1, bb -> bb.reset(0)))
                .reset(0).reset(1).measure(0, 0).measure(1, 1).build();
        assertEquals(hand, read);
    }

    @Test
    void aBitAloneIsAConditionOnOne() {
        // OpenQASM 3 specification, "Classical types": a bit converts to bool as bit != 0, so
        // if (c[0]) means if (c[0] == 1).
        Circuit read = QasmReader.read(HEAD + "qubit[2] q;\nbit[2] c;\nc[0] = measure q[0];\n"
                + "if (c[0]) x q[1];\nif (c[1]) { z q[1]; h q[0]; }\n");
        Circuit hand = Circuit.builder(2).measure(0, 0).ifBit(0, 1, b -> b.x(1))
                .ifBit(1, 1, b -> b.z(1).h(0)).build();
        assertEquals(hand, read);
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(HEAD + "qubit[1] q;\nbit[1] c;\nif (c[0] x q[0];\n"));
        assertTrue(e.getMessage().contains("expected '=='"), e.getMessage());
    }

    @Test
    void aFileNameGivenAsTextSaysToReadThePath(@org.junit.jupiter.api.io.TempDir
            java.nio.file.Path dir) throws java.io.IOException {
        java.nio.file.Path file = dir.resolve("bell.txt");
        java.nio.file.Files.writeString(file, HEAD + "qubit[2] q;\nh q[0];\n");
        for (String text : new String[] {file.toString(), "circuits/bell.qasm",
            "  circuits\\bell.QASM  "}) {
            CircuitFormatException e = assertThrows(CircuitFormatException.class,
                    () -> QasmReader.read(text));
            assertTrue(e.getMessage().contains("looks like a file name")
                    && e.getMessage().contains("QasmReader.read(Path.of(...))"), e.getMessage());
            assertTrue(e.getMessage().startsWith("line 1, column "), e.getMessage());
        }
        assertEquals(QasmReader.read(file), QasmReader.read(java.nio.file.Files.readString(file)));
        // Program text that fails for another reason gets no such hint.
        CircuitFormatException other = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(HEAD + "qubit[2] q;\nfoo q[0];\n"));
        assertTrue(!other.getMessage().contains("file name"), other.getMessage());
    }

    @Test
    void userGatesExpandWithTheirParameters() {
        Circuit read = QasmReader.read(HEAD + "gate bell a, b { h a; cx a, b; }\n"
                + "gate turn(theta, phi) a { rz(theta / 2) a; ry(phi - theta) a; }\n"
                + "gate twice(x) a, b { turn(x, 2 * x) b; bell b, a; barrier a, b; }\n"
                + "qubit[2] q;\ntwice(0.5) q[0], q[1];\ninv @ bell q[0], q[1];\n");
        Circuit bell = Circuit.builder(2, 0).h(0).cnot(0, 1).build();
        Circuit hand = Circuit.builder(2, 0).rz(1, 0.5 / 2).ry(1, 2 * 0.5 - 0.5).h(1).cnot(1, 0)
                .append(bell.inverse()).build();
        assertEquals(hand, read);
    }

    @Test
    void modifiers() {
        // inv @ g is g's inverse; ctrl(k) @ g adds k controls before g's own qubits (spec,
        // "Quantum gate modifiers"); ctrl @ gphase(a) is a phase on the control.
        Circuit read = QasmReader.read(HEAD + "qubit[4] q;\ninv @ sx q[0];\ninv @ s q[1];\n"
                + "inv @ rz(0.5) q[2];\nctrl @ x q[0], q[1];\nctrl(2) @ h q[0], q[1], q[2];\n"
                + "ctrl @ cx q[3], q[0], q[1];\nctrl @ swap q[0], q[1], q[2];\n"
                + "ctrl @ U(0.1, 0.2, 0.3) q[1], q[3];\nctrl(2) @ gphase(0.7) q[0], q[1];\n"
                + "inv @ ctrl @ s q[2], q[3];\n");
        Circuit hand = Circuit.builder(4, 0)
                .append(Circuit.builder(4, 0).sqrtX(0).build().inverse()).sDagger(1).rz(2, -0.5)
                .controlled(Gates.X, new int[] {0}, 1)
                .controlled(Gates.H, new int[] {0, 1}, 2)
                .controlled(Gates.X, new int[] {3, 0}, 1)
                .controlled(Gates.SWAP, new int[] {0}, 1, 2)
                .controlled(Gate.U, new double[] {0.1, 0.2, 0.3}, new int[] {1}, 3)
                .cphase(0, 1, 0.7)
                .controlled(Gates.S.dagger(), new int[] {2}, 3).build();
        assertEquals(hand, read);
        assertEquals("sqrtXDagger", read.instructions().get(0).name());
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        // text | line | column | part of the message
        "OPENQASM 2.0;|1|10|version '2.0'",
        "qubit[2] q; h q[0];|1|13|include \"stdgates.inc\"",
        "include \"qelib1.inc\";|1|9|only include",
        "qreg q[2];|1|1|'qreg' is outside",
        "qubit[2] q;\\nfor i in [0:1] { }|2|1|'for' is outside",
        "qubit[2] q;\\nU(1, 2) q[0];|2|1|takes 3 parameter(s) but 2",
        "qubit[2] q;\\nU(1, 2, 3) q[2];|2|12|index 2 is out of range [0, 1]",
        "qubit[2] q;\\nU(1, 2, 3) r[0];|2|12|unknown qubit register 'r'",
        "include \"stdgates.inc\";\\nqubit[2] q;\\ncx q[0], q[0];|3|1|the qubits of cnot",
        "qubit[2] q;\\nU(1, foo, 3) q[0];|2|6|unknown name 'foo'",
        "qubit[2] q;\\nU(1, 2, 3) q[0]|2|16|expected ';'",
        "qubit[2] q;\\nU(1/0, 2, 3) q[0];|2|1|Infinity",
        "qubit[2] q;\\n/* open|2|1|unterminated comment",
        "qubit[2] q;\\nbit[2] c;\\nif (c == 1) U(1, 2, 3) q[0];|3|5|must test one bit",
        "qubit[2] q;\\nbit[1] c;\\nif (c[0] == 2) U(1, 2, 3) q[0];|3|13|compared only with",
        "qubit[2] q;\\nbit[1] c;\\nc[0] = measure q;|3|1|as many bits as qubits",
        "qubit[2] q; qubit q;|1|19|already in use",
        "h q;|1|1|unknown gate 'h'",
        "qubit[2] q;\\nnegctrl @ U(1, 2, 3) q[0], q[1];|2|1|'negctrl'",
        "gate g a { measure a; }|1|12|not allowed in a gate definition",
        "qubit[0] q;|1|7|at least 1",
        "qubit[99999999999999999999] q;|1|7|whole number",
        "bit[2] c;|1|10|declares no qubit",
        "qubit[1] q;\\n$|2|1|unexpected character '$'",
        "qubit[1] q;\\nU(1ns, 0, 0) q[0];|2|4|units such as ns",
        "qubit[1] q;\\nbit[1] c;\\nif (c[0] == 1) { U(0, 0, 0) q[0];|3|34|expected '}'",
        "qubit[1] q;\\nU(((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((("
            + "((((((1)))))))"
            + ")))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))), 0, 0) q[0];"
            + "|2|68|nested deeper",
    })
    void refusesWithLineAndColumn(String text, int line, int column, String part) {
        String t = text.replace("\\n", "\n");
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(t));
        assertTrue(e.getMessage().contains(part), e.getMessage());
        assertEquals(line, e.line(), e.getMessage());
        assertEquals(column, e.column(), e.getMessage());
        assertTrue(e.getMessage().startsWith("line " + line + ", column " + column + ": "),
                e.getMessage());
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        // The first problem in the text is the one reported, whether it is one of syntax or
        // of names (common practice for single-pass readers; the reader's behaviour before it
        // was split): a statement's registers are checked when the statement ends, a called
        // gate and its counts as the call is read, the registers of barrier and of a
        // condition as each operand is read.
        "bit[2] c;\\nif (c[0] == 1) { h r; x x x; }|4|20|unknown qubit register 'r'",
        "bit[2] c;\\nif (c[0] == 1) h r; else x q;|4|18|unknown qubit register 'r'",
        "qubit[3] r;\\ncx q, r;\\nh h h;|4|7|registers of one call must have equal sizes",
        "barrier r, ;|3|9|unknown qubit register 'r'",
        "barrier q[7] q;|3|9|index 7 is out of range [0, 1]",
        "gate g a { foo a;|3|12|unknown gate 'foo'",
        "U(1, 2) q[0]|3|1|takes 3 parameter(s) but 2",
        "foo(1,, 2) q[0];|3|1|unknown gate 'foo'",
        // What the circuit refuses is found once the whole text has been read.
        "cx q[0], q[0];\\nh h h;|4|5|expected ';' but found 'h'",
        "cx q[0], q[0];\\nh q, q;|4|1|gate 'h' takes 1 qubit(s) but 2",
    })
    void reportsTheFirstProblemInTheText(String text, int line, int column, String part) {
        String t = HEAD.substring(HEAD.indexOf('\n') + 1) + "qubit[2] q;\n"
                + text.replace("\\n", "\n");
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(t));
        assertTrue(e.getMessage().contains(part), e.getMessage());
        assertEquals(line, e.line(), e.getMessage());
        assertEquals(column, e.column(), e.getMessage());
    }

    @Test
    void refusesAProgramThatExpandsToTooManyInstructions() {
        // Each gate doubles the one before: g20 is 2^20 > MAX_INSTRUCTIONS instructions.
        StringBuilder sb = new StringBuilder(HEAD + "gate g0 a { x a; }\n");
        for (int i = 1; i <= 20; i++) {
            sb.append("gate g").append(i).append(" a { g").append(i - 1).append(" a; g")
                    .append(i - 1).append(" a; }\n");
        }
        String fits = sb + "qubit q;\ng19 q;\n";
        assertEquals(1 << 19, QasmReader.read(fits).instructions().size());
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(sb + "qubit q;\ng20 q;\n"));
        assertTrue(e.getMessage().contains("expands to more than "
                + QasmReader.MAX_INSTRUCTIONS + " instructions"), e.getMessage());
    }

    @Test
    void whatTheCircuitRefusesInsideAGateDefinitionIsAFormatException() {
        String def = HEAD + "gate g a, b { cx a, b; }\nqubit[2] q;\n";
        for (String call : new String[] {"g q[0], q[0];", "inv @ g q[1], q[1];"}) {
            CircuitFormatException e = assertThrows(CircuitFormatException.class,
                    () -> QasmReader.read(def + call));
            assertTrue(e.getMessage().contains("appears twice"), e.getMessage());
            assertEquals(IllegalArgumentException.class, e.getCause().getClass());
        }
    }
}
