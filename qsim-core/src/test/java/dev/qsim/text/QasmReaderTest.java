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
                + "rz(pi/4 + 2*sin(pi/6) - sqrt(4)**2 / -ln(euler)) q;\n"
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
        "qubit[2] q;\\nbox { }|2|1|'box' is unsupported",
        "qubit[2] q;\\nU(1, 2) q[0];|2|1|takes 3 parameter(s) but 2",
        "qubit[2] q;\\nU(1, 2, 3) q[2];|2|14|index 2 is out of range [0, 1]",
        "qubit[2] q;\\nU(1, 2, 3) r[0];|2|12|unknown qubit register 'r'",
        "include \"stdgates.inc\";\\nqubit[2] q;\\ncx q[0], q[0];|3|1|qubit 0 appears twice",
        "qubit[2] q;\\nU(1, foo, 3) q[0];|2|6|unknown name 'foo'",
        "qubit[2] q;\\nU(1, 2, 3) q[0]|2|16|expected ';'",
        "qubit[2] q;\\nU(1.0/0, 2, 3) q[0];|2|1|Infinity",
        "qubit[2] q;\\nU(1/0, 2, 3) q[0];|2|1|integer division by zero",
        "qubit[2] q;\\n/* open|2|1|unterminated comment",
        "qubit[2] q;\\nbit[1] c;\\nif (c[0] + 2.5) U(1, 2, 3) q[0];|3|10|not a condition",
        "qubit[2] q;\\nbit[1] c;\\nc[0] = measure q;|3|1|as many bits as qubits",
        "qubit[2] q; qubit q;|1|19|already in use",
        "h q;|1|1|unknown gate 'h'",
        "gate g a { measure a; }|1|12|not allowed in a gate definition",
        "qubit[0] q;|1|7|at least 1",
        "qubit[99999999999999999999] q;|1|7|larger than",
        "qubit[2000000] q;|1|7|at most 1048576",
        "bit[2] c;|1|10|declares no qubit",
        "qubit[1] q;\\n#|2|1|unexpected character '#'",
        "qubit[1] q;\\nU(1ns, 0, 0) q[0];|2|3|may appear only in delay",
        "qubit[1] q;\\nbit[1] c;\\nif (c[0] == 1) { U(0, 0, 0) q[0];|3|34|expected '}'",
        "qubit[1] q;\\ninput float theta;|2|13|input 'theta' has no value",
        "qubit[1] q;\\nint n = 2;\\nfor int i in [0:n] { }|3|17|must be known when the file",
        "qubit[1] q;\\nconst int n = 2;\\nn = 3;|3|1|the constant, which cannot be assigned",
        "qubit[1] q;\\nbreak;|2|1|'break' outside a loop",
        "qubit[1] q;\\nreturn;|2|1|'return' outside a subroutine",
        "qubit[1] q;\\nbit c;\\nwhile (c == 0) { break; }|3|18|in a while loop is unsupported",
        "qubit[1] q;\\ndelay[5dt] q;|2|7|the length of dt is not known",
        "qubit[1] q;\\nfloat[32] x;|2|7|only 64-bit floats",
        "qubit[1] q;\\nbit[2] c;\\nc = 1.5;|3|5|is a float",
        "qubit[1] q;\\ndef f(qubit a) { f(a); }\\nf(q);|3|1|recursion is unsupported",
        "include \"stdgates.inc\";\\nqubit[1] q;\\npow(0.5) @ h q;|3|1|not a whole number",
        "include \"stdgates.inc\";\\nqubit[1] q;\\npow(0.5) @ rx(7) q;|3|1|principal power",
        "include \"stdgates.inc\";\\ngate g a { g a; }|2|12|calls itself",
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
        // Problems are reported in text order from one top-level statement to the next: each
        // is read, then expanded, before the next is read (common practice for single-pass
        // readers; the reader's behaviour before its rewrite). Within one statement, syntax
        // comes before meaning (a block is read whole first).
        "bit[2] c;\\nif (c[0] == 1) { h r; }\\nx x x;|4|20|unknown qubit register 'r'",
        "bit[2] c;\\nif (c[0] == 1) { h r; x x x; }|4|27|expected ';' but found 'x'",
        "bit[2] c;\\nif (c[0] == 1) h r; else x q;|4|18|unknown qubit register 'r'",
        "qubit[3] r;\\ncx q, r;\\nh h h;|4|7|registers of one call must have equal sizes",
        "barrier r;\\nbarrier , ;|3|9|unknown qubit register 'r'",
        "barrier q[7], q;\\nh h h;|3|11|index 7 is out of range [0, 1]",
        "gate g a { foo a; }\\nh h h;|3|12|unknown gate 'foo'",
        "U(1, 2) q[0];\\nfoo(|3|1|takes 3 parameter(s) but 2",
        "foo(1,, 2) q[0];|3|7|expected a value but found ','",
        "cx q[0], q[0];\\nh h h;|3|1|qubit 0 appears twice",
        "cx q[0], q[1];\\nh q, q;|4|1|gate 'h' takes 1 qubit(s) but 2",
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
        QasmReader.Settings generous = QasmReader.Settings.defaults().withWorkBudget(1L << 40);
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(sb + "qubit q;\ng20 q;\n", generous));
        assertTrue(e.getMessage().contains("expands to more than "
                + QasmReader.MAX_INSTRUCTIONS + " instructions"), e.getMessage());
        assertTrue(e.getMessage().contains("withMaxInstructions"), e.getMessage());
        assertEquals(1 << 20, QasmReader.read(sb + "qubit q;\ng20 q;\n", generous
                .withMaxInstructions(1 << 20)).size());
    }

    @Test
    void aProblemInsideAGateIsReportedAtTheCallWithTheDefinitionInTheMessage() {
        // The rule: the position is the user's call; the definition's position is a
        // note in the message (line 3 column 1 is where gate g is defined).
        String def = HEAD + "gate g(t) a, b { cx a, b; rz(t) b; }\nqubit[3] q;\n";
        for (String call : new String[] {"g(0.0 / 0) q[0], q[1];",
            "inv @ ctrl @ g(1.0 / 0) q[1], q[0], q[2];"}) {
            CircuitFormatException e = assertThrows(CircuitFormatException.class,
                    () -> QasmReader.read(def + call));
            assertTrue(e.getMessage().contains("angle 1 of rz is"), e.getMessage());
            assertEquals(5, e.line(), e.getMessage());
            assertEquals(1, e.column(), e.getMessage());
            assertTrue(e.getMessage().contains("inside gate 'g' defined at line 3, column 1"),
                    e.getMessage());
        }
        // Two definitions deep, with a non-finite angle computed from the parameter.
        String deep = HEAD + "gate inner(t) a { rx(1.0 / t) a; }\n"
                + "gate outer(t) a { inner(t - 1) a; }\nqubit q;\nouter(1) q;\n";
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(deep));
        assertEquals(6, e.line(), e.getMessage());
        assertEquals(1, e.column(), e.getMessage());
        assertTrue(e.getMessage().contains("Infinity"), e.getMessage());
        assertTrue(e.getMessage().contains("inside gate 'outer' defined at line 4, column 1;"
                + " the problem is at line 3, column 19, 2 definitions deep"), e.getMessage());
    }
}
