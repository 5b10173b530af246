package dev.qsim.text;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.Circuit;
import dev.qsim.Expression;
import dev.qsim.Gate;
import dev.qsim.Gates;
import dev.qsim.Operator;
import dev.qsim.Simulator;

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
    void aBitAloneIsAConditionOnOne() {
        // OpenQASM 3 specification, "Classical types": a bit converts to bool as bit != 0, so
        // if (c[0]) means if (c[0] == 1).
        Circuit read = QasmReader.read(HEAD + "qubit[2] q;\nbit[2] c;\nc[0] = measure q[0];\n"
                + "if (c[0]) x q[1];\nif (c[1]) { z q[1]; h q[0]; }\n");
        Circuit hand = Circuit.builder(2).measure(0, 0)
                .ifThen(dev.qsim.Expression.clbit(0), b -> b.x(1))
                .ifThen(dev.qsim.Expression.clbit(1), b -> b.z(1).h(0)).build();
        assertEquals(hand, read);
        // The same distribution as the explicit comparison with 1.
        Circuit explicit = QasmReader.read(HEAD + "qubit[2] q;\nbit[2] c;\nh q[0];\n"
                + "c[0] = measure q[0];\nif (c[0] == 1) x q[1];\nc[1] = measure q[1];\n");
        Circuit alone = QasmReader.read(HEAD + "qubit[2] q;\nbit[2] c;\nh q[0];\n"
                + "c[0] = measure q[0];\nif (c[0]) x q[1];\nc[1] = measure q[1];\n");
        org.junit.jupiter.api.Assertions.assertArrayEquals(
                dev.qsim.Simulator.seeded(1).distribution(explicit),
                dev.qsim.Simulator.seeded(1).distribution(alone), 1e-15);
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(HEAD + "qubit[1] q;\nbit[1] c;\nif (c[0] x q[0];\n"));
        assertTrue(e.getMessage().contains("expected ')'"), e.getMessage());
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
        // Each gate doubles the one before: g10 is 2^10 instructions. The default limit is
        // MAX_INSTRUCTIONS; a register of one more qubit than that, broadcast, passes it.
        StringBuilder sb = new StringBuilder(HEAD + "gate g0 a { x a; }\n");
        for (int i = 1; i <= 10; i++) {
            sb.append("gate g").append(i).append(" a { g").append(i - 1).append(" a; g")
                    .append(i - 1).append(" a; }\n");
        }
        String g10 = sb + "qubit q;\ng10 q;\n";
        QasmReader.Settings s = QasmReader.Settings.defaults();
        assertEquals(1 << 10, QasmReader.read(g10, s.withMaxInstructions(1 << 10)).size());
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(g10, s.withMaxInstructions((1 << 10) - 1)));
        assertTrue(e.getMessage().contains("expands to more than 1023 instructions"),
                e.getMessage());
        assertTrue(e.getMessage().contains("withMaxInstructions"), e.getMessage());
        e = assertThrows(CircuitFormatException.class, () -> QasmReader.read(HEAD + "qubit["
                + (QasmReader.MAX_INSTRUCTIONS + 1) + "] q;\nh q;\n"));
        assertTrue(e.getMessage().contains("expands to more than "
                + QasmReader.MAX_INSTRUCTIONS + " instructions"), e.getMessage());
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

    // ---------------------------------------------------------------- the constructs added
    // Each against the circuit built by hand from the OpenQASM 3 specification (Cross et al.
    // 2022, and the live specification at openqasm.com; section named with each test, read
    // from memory).

    @Test
    void openQasm2RegistersArrowsAndDiscardedResults() {
        // "Quantum and classical registers": qreg and creg are the OpenQASM 2 spellings of
        // qubit[n] and bit[n]; "Measurement": measure q -> c, and measure q whose result is
        // dropped (here kept in one extra classical bit after the declared ones).
        Circuit read = QasmReader.read(HEAD + "qreg q[2];\ncreg c[2];\nmeasure q -> c;\n"
                + "measure q[0];\nmeasure q[1];\n");
        Circuit hand = Circuit.builder(2, 3).measure(0, 0).measure(1, 1).measure(0, 2)
                .measure(1, 2).build();
        assertEquals(hand, read);
    }

    @Test
    void rangesSetsNegativeIndicesAndAliases() {
        // "Register concatenation and slicing": ranges include both ends and take a step in
        // the middle (a:step:b), sets {i, j} keep their order, -1 is the last index; "Aliasing":
        // let joins registers with ++.
        Circuit read = QasmReader.read(HEAD + "qubit[5] q;\nh q[1:3];\nx q[0:2:4];\n"
                + "z q[{4, 1}];\ny q[-1];\nlet a = q[0:1] ++ q[4];\ncx a[2], a[0];\ns a;\n");
        Circuit hand = Circuit.builder(5, 0).h(1).h(2).h(3).x(0).x(2).x(4).z(4).z(1).y(4)
                .cnot(4, 0).s(0).s(1).s(4).build();
        assertEquals(hand, read);
    }

    @Test
    void forLoopsUnrollWithTheirVariable() {
        // "Looping and branching": for over a range (both ends included), a stepped range, a
        // set; break and continue; the loop variable in indices and angles.
        Circuit read = QasmReader.read(HEAD + "qubit[4] q;\n"
                + "for int i in [0:3] { rx(i * 0.5) q[i]; }\n"
                + "for uint j in {3, 1} { h q[j]; }\n"
                + "for int k in [3:-2:0] { x q[k]; }\n"
                + "for i in [0:5] { if (i == 1) continue; if (i == 3) break; z q[i]; }\n");
        Circuit hand = Circuit.builder(4, 0).rx(0, 0.0).rx(1, 0.5).rx(2, 1.0).rx(3, 1.5)
                .h(3).h(1).x(3).x(1).z(0).z(2).build();
        assertEquals(hand, read);
    }

    @Test
    void constantsAndInputsAreKnownWhenRead() {
        // "Compile-time constants" and "Input/output": a const is computed when read, an input
        // comes from outside the program (here the reader's settings).
        String text = HEAD + "const int n = 3;\ninput float theta;\ninput int reps;\n"
                + "qubit[n] q;\nfor int i in [1:reps] { ry(theta) q[i]; }\n";
        QasmReader.Settings s = QasmReader.Settings.defaults().withInput("theta", 0.25)
                .withInput("reps", 2);
        assertEquals(Circuit.builder(3, 0).ry(1, 0.25).ry(2, 0.25).build(),
                QasmReader.read(text, s));
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(text, s.withInput("thta", 1.0)));
        assertTrue(e.getMessage().contains("input 'thta' but the program declares no such"),
                e.getMessage());
    }

    @Test
    void classicalVariablesAndAssignments() {
        // "Classical types": int[8] wraps, uint[3] wraps, angles reduce to [0, 2pi) (all on
        // assignment, Circuit.VariableType); compound assignments such as += mean x = x + e;
        // bits take integer values, bit j of the value to bit j of the register.
        Circuit read = QasmReader.read(HEAD + "qubit q;\nbit[2] c;\nint[8] n = 250;\n"
                + "n += 10;\nuint[3] u;\nu = 9;\nfloat f = 1.5;\nf *= 2;\nangle a = 7.0;\n"
                + "bool b = c[0] == 1;\nc = 2;\nc[0] ^= 1;\nif (n == 4) x q;\n");
        Circuit.Builder h = Circuit.builder(1, 2);
        Expression n = h.declare("n", Circuit.VariableType.INT, 8, Expression.constant(250));
        h.assign("n", Expression.of(Expression.Op.ADD, n, Expression.constant(10)));
        h.declare("u", Circuit.VariableType.UINT, 3, null);
        h.assign("u", Expression.constant(9));
        Expression f = h.declare("f", Circuit.VariableType.FLOAT, 64,
                Expression.constant(1.5));
        h.assign("f", Expression.of(Expression.Op.MUL, f, Expression.constant(2)));
        h.declare("a", Circuit.VariableType.ANGLE, 64, Expression.constant(7.0));
        h.declare("b", Circuit.VariableType.BOOL, 1, Expression.of(Expression.Op.EQ,
                Expression.clbit(0), Expression.constant(1)));
        h.assignClbits(new int[] {0, 1}, Expression.constant(2));
        h.assignClbits(new int[] {0}, Expression.of(Expression.Op.BIT_XOR, Expression.clbit(0),
                Expression.constant(1)));
        h.ifThen(Expression.of(Expression.Op.EQ, n, Expression.constant(4)), t -> t.x(0));
        assertEquals(h.build(), read);
        // 250 + 10 = 260 wraps to 4 in eight signed bits, so the X runs in every shot.
        Circuit measured = QasmReader.read(HEAD + "qubit q;\nbit c;\nint[8] n = 250;\n"
                + "n += 10;\nif (n == 4) x q;\nc = measure q;\n");
        assertEquals(1.0, Simulator.seeded(3).distribution(measured)[1], 1e-15);
    }

    @Test
    void conditionsOnBitsRegistersAndExpressions() {
        // "Conditional statements": if (bit == value) without else is the circuit's one-bit
        // condition; with else, in parentheses of its own, on a whole register (read as an
        // unsigned integer) or on any expression, the general one; a condition known when read
        // chooses its block at once.
        Circuit read = QasmReader.read(HEAD + "qubit[2] q;\nbit[2] c;\nc[0] = measure q[0];\n"
                + "if (c[0] == 1) x q[1];\nif (c[0] == 1) x q[1]; else z q[1];\n"
                + "if ((c[0] == 1)) h q[1];\nif (c == 2) y q[0];\nif (c[1]) s q[0];\n"
                + "if (!c[1] && c[0] != 0) t q[0];\n"
                + "const bool debug = false;\nif (debug) x q[0]; else y q[0];\n");
        Expression c0is1 = Expression.of(Expression.Op.EQ, Expression.clbit(0),
                Expression.constant(1));
        Circuit hand = Circuit.builder(2, 2).measure(0, 0)
                .ifBit(0, 1, b -> b.x(1))
                .ifThenElse(c0is1, b -> b.x(1), b -> b.z(1))
                .ifThen(c0is1, b -> b.h(1))
                .ifThen(Expression.of(Expression.Op.EQ, Expression.clbits(0, 1),
                        Expression.constant(2)), b -> b.y(0))
                .ifThen(Expression.clbit(1), b -> b.s(0))
                .ifThen(Expression.of(Expression.Op.AND, Expression.of(Expression.Op.NOT,
                        Expression.clbit(1)), Expression.of(Expression.Op.NE,
                        Expression.clbit(0), Expression.constant(0))), b -> b.t(0))
                .y(0).build();
        assertEquals(hand, read);
    }

    @Test
    void whileLoopsTakeTheirBoundFromTheAnnotationOrTheSettings() {
        // "Looping and branching": while on a measured value; the circuit's loops need a
        // bound, @max_iterations n or the settings' loop bound.
        String text = HEAD + "qubit q;\nbit c;\nwhile (c == 0) { h q; c = measure q; }\n"
                + "@max_iterations 7\nwhile (c == 1) { x q; c = measure q; }\n";
        Expression zero = Expression.of(Expression.Op.EQ, Expression.clbit(0),
                Expression.constant(0));
        Expression one = Expression.of(Expression.Op.EQ, Expression.clbit(0),
                Expression.constant(1));
        for (int bound : new int[] {QasmReader.Settings.DEFAULT_LOOP_BOUND, 12}) {
            Circuit hand = Circuit.builder(1, 1)
                    .whileLoop(zero, bound, b -> b.h(0).measure(0, 0))
                    .whileLoop(one, 7, b -> b.x(0).measure(0, 0)).build();
            assertEquals(hand, QasmReader.read(text, QasmReader.Settings.defaults()
                    .withLoopBound(bound)));
        }
    }

    @Test
    void modifiersStackAndApplyToDefinedGates() {
        // "Quantum gate modifiers": ctrl @ g adds a control to every gate of g's body, inv @ g
        // reverses the body and inverts each gate, pow(k) @ g repeats it (a rotation's angle is
        // multiplied), pow(1/2) @ p(θ) is p(θ/2) (the principal root), and negctrl @ g is g
        // controlled on |0>: X, controlled g, X (Barenco et al. 1995, Phys. Rev. A 52, 3457).
        Circuit read = QasmReader.read(HEAD + "gate rot(t) a { rz(t) a; h a; }\nqubit[3] q;\n"
                + "ctrl @ rot(0.5) q[0], q[1];\nnegctrl @ rot(0.5) q[0], q[1];\n"
                + "ctrl @ ctrl @ x q[0], q[1], q[2];\ninv @ ctrl @ rot(0.5) q[2], q[1];\n"
                + "pow(3) @ s q[0];\npow(-2) @ rx(0.25) q[1];\npow(2) @ rot(0.1) q[2];\n"
                + "pow(0.5) @ p(1.0) q[0];\nnegctrl(2) @ x q[0], q[1], q[2];\n");
        Circuit hand = Circuit.builder(3, 0)
                .gate(Gate.CRZ, new double[] {0.5}, 0, 1).gate(Gate.CH, 0, 1)
                .x(0).gate(Gate.CRZ, new double[] {0.5}, 0, 1).gate(Gate.CH, 0, 1).x(0)
                .toffoli(0, 1, 2)
                .gate(Gate.CH, 2, 1).gate(Gate.CRZ, new double[] {-0.5}, 2, 1)
                .s(0).s(0).s(0).rx(1, -0.5)
                .rz(2, 0.1).h(2).rz(2, 0.1).h(2)
                .phase(0, 0.5)
                .x(0).x(1).toffoli(0, 1, 2).x(1).x(0).build();
        assertEquals(hand, read);
    }

    /** The 2x2 matrix of the specification's U(θ, φ, λ), times e^{iγ}. */
    private static Complex[][] u(double theta, double phi, double lambda, double gamma) {
        Complex g = Complex.ofCis(gamma);
        double c = Math.cos(theta / 2);
        double s = Math.sin(theta / 2);
        return new Complex[][] {
            {g.multiply(c), Complex.ofCis(lambda).multiply(-s).multiply(g)},
            {Complex.ofCis(phi).multiply(s).multiply(g),
                Complex.ofCis(phi + lambda).multiply(c).multiply(g)}};
    }

    private static void assertOperator(Complex[][] expected, Operator actual) {
        for (int r = 0; r < expected.length; r++) {
            for (int k = 0; k < expected.length; k++) {
                double d = expected[r][k].subtract(actual.get(r, k)).abs();
                assertTrue(d < 1e-12, "entry " + r + "," + k + " off by " + d);
            }
        }
    }

    @Test
    void theGatesStdgatesDefinesThroughOthersHaveTheirMatrices() {
        // stdgates.inc (from memory): u3(θ, φ, λ) = gphase(-(φ+λ)/2) U(θ, φ, λ);
        // u2(φ, λ) = u3(π/2, φ, λ); u1(λ) = U(0, 0, λ) = p(λ); cu(θ, φ, λ, γ) c, t =
        // p(γ) c; ctrl @ U(θ, φ, λ) c, t. With U as the specification writes it.
        double th = 0.7;
        double ph = 0.4;
        double la = -1.1;
        double ga = 0.3;
        assertOperator(u(th, ph, la, -(ph + la) / 2), QasmReader.read(HEAD + "qubit q;\nu3("
                + th + ", " + ph + ", " + la + ") q;\n").toOperator());
        assertOperator(u(Math.PI / 2, ph, la, -(ph + la) / 2), QasmReader.read(HEAD
                + "qubit q;\nu2(" + ph + ", " + la + ") q;\n").toOperator());
        assertEquals(Circuit.builder(1, 0).phase(0, la).build(), QasmReader.read(HEAD
                + "qubit q;\nu1(" + la + ") q;\n"));
        // cu on (control 0, target 1): |0><0| ⊗ I + e^{iγ} |1><1| ⊗ U, control the low bit.
        Complex[][] m = u(th, ph, la, ga);
        Complex[][] cu = new Complex[4][4];
        for (Complex[] row : cu) {
            java.util.Arrays.fill(row, Complex.ZERO);
        }
        cu[0][0] = Complex.ONE;
        cu[2][2] = Complex.ONE;
        for (int r = 0; r < 2; r++) {
            for (int k = 0; k < 2; k++) {
                cu[1 + 2 * r][1 + 2 * k] = m[r][k];
            }
        }
        assertOperator(cu, QasmReader.read(HEAD + "qubit[2] q;\ncu(" + th + ", " + ph + ", "
                + la + ", " + ga + ") q[0], q[1];\n").toOperator());
    }

    @Test
    void gateParametersAreAnglesNotIntegers() {
        // "Gates": a gate's parameters are angles, so an integer argument is a real number
        // there: t / 2 with t = 1 is 0.5, and u2(1, 2) is u2(1.0, 2.0) (whose body computes
        // (φ + λ) / 2 = 1.5).
        Circuit read = QasmReader.read(HEAD + "gate half(t) a { rx(t / 2) a; }\nqubit q;\n"
                + "half(1) q;\n");
        assertEquals(Circuit.builder(1, 0).rx(0, 0.5).build(), read);
        assertEquals(QasmReader.read(HEAD + "qubit q;\nu2(1.0, 2.0) q;\n"),
                QasmReader.read(HEAD + "qubit q;\nu2(1, 2) q;\n"));
    }

    @Test
    void globalPhasesAreExactAndControlledOnesArePhases() {
        // "Built-in gates": gphase(γ) multiplies the state by e^{iγ}; with controls it is a
        // phase on them: ctrl @ gphase(γ) c = p(γ) c, ctrl(2) @ gphase(γ) = cp(γ).
        Circuit read = QasmReader.read(HEAD + "qubit[2] q;\ngphase(0.5);\ngphase(4.0);\n"
                + "ctrl @ gphase(0.3) q[1];\nctrl(2) @ gphase(0.2) q[0], q[1];\n"
                + "inv @ gphase(0.1);\npow(3) @ gphase(0.2);\n");
        Circuit hand = Circuit.builder(2, 0).apply(Ops.globalPhase(0.5), 0)
                .apply(Ops.globalPhase(Math.IEEEremainder(4.0, 2 * Math.PI)), 0)
                .phase(1, 0.3).cphase(0, 1, 0.2).apply(Ops.globalPhase(-0.1), 0)
                .apply(Ops.globalPhase(0.2 * 3), 0).build();
        assertEquals(hand, read);
        Operator four = QasmReader.read(HEAD + "qubit q;\ngphase(4.0);\n").toOperator();
        Complex z = Complex.ofCis(4.0);
        assertOperator(new Complex[][] {{z, Complex.ZERO}, {Complex.ZERO, z}}, four);
    }

    @Test
    void subroutinesExpandWhereCalled() {
        // "Subroutines": qubit and classical arguments, return values, return measure (into a
        // bit of its own, after the bits declared before the call).
        Circuit read = QasmReader.read(HEAD + "qubit[2] q;\nbit[2] c;\n"
                + "def prep(qubit a, qubit b, float t) { ry(t) a; cx a, b; }\n"
                + "def flip(qubit x) -> bit { x x; return measure x; }\n"
                + "def twice(int n) -> int { return 2 * n; }\n"
                + "prep(q[0], q[1], 0.5);\nc[0] = flip(q[1]);\nrx(twice(3) * 0.1) q[0];\n");
        Circuit hand = Circuit.builder(2, 3).ry(0, 0.5).cnot(0, 1).x(1).measure(1, 2)
                .assignClbits(new int[] {0}, Expression.clbit(2)).rx(0, 6 * 0.1).build();
        assertEquals(hand, read);
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(HEAD + "qubit[2] q;\ndef bad() { h q[0]; }\nbad();\n"));
        assertTrue(e.getMessage().contains("pass it as an argument"), e.getMessage());
        assertEquals(5, e.line(), e.getMessage());
    }

    @Test
    void delaysAreKeptInSeconds() {
        // "Delays and durations": units ns, us or µs, ms, s, and dt (a device's sample time,
        // here given in the settings as 2 ns); a delay without operands applies to all qubits.
        Circuit read = QasmReader.read(HEAD + "qubit[2] q;\ndelay[100ns] q[0];\n"
                + "delay[2.5us] q;\ndelay[3µs] q[1];\ndelay[4ms];\ndelay[1s] q[0];\n"
                + "delay[10dt] q[1];\n", QasmReader.Settings.defaults().withTimeStep(2e-9));
        Circuit hand = Circuit.builder(2, 0).delay(100 / 1e9, 0).delay(2.5 / 1e6, 0, 1)
                .delay(3 / 1e6, 1).delay(4 / 1e3).delay(1.0, 0).delay(10 * 2e-9, 1).build();
        assertEquals(hand, read);
    }

    @Test
    void anglesComputedFromMeasuredValuesAreTheCircuitsExpressions() {
        // A gate whose angle depends on a measured bit or a variable is evaluated in each shot:
        // after x q[0] the bit reads 1, so rx(c0 π) flips q[1] (rx(π)|0> = -i|1>, Nielsen and
        // Chuang 2010, §4.2): the register always reads 11.
        String text = HEAD + "qubit[2] q;\nbit[2] c;\nx q[0];\nc[0] = measure q[0];\n"
                + "rx(c[0] * pi) q[1];\nfloat f = 0.25;\nf = f + c[0];\ncrz(f) q[0], q[1];\n"
                + "c[1] = measure q[1];\n";
        Circuit read = QasmReader.read(text);
        Circuit.Builder h = Circuit.builder(2, 2).x(0).measure(0, 0)
                .gate(Gate.RX, new Expression[] {Expression.of(Expression.Op.MUL,
                        Expression.clbit(0), Expression.constant(Math.PI))}, 1);
        Expression f = h.declare("f", Circuit.VariableType.FLOAT, 64,
                Expression.constant(0.25));
        h.assign("f", Expression.of(Expression.Op.ADD, f, Expression.clbit(0)));
        h.controlled(Gate.RZ, new Expression[] {f}, new int[] {0}, 1).measure(1, 1);
        assertEquals(h.build(), read);
        assertEquals(1.0, Simulator.seeded(5).distribution(read)[3], 1e-15);
    }

    @Test
    void namesFollowTheScopesOfTheSpecification() {
        // "Scoping": a gate sees only its parameters and qubits (and global constants); a
        // block's declarations end with it; a loop variable cannot be assigned.
        String[][] cases = {
            {"qubit q;\ngate g a { h q; }\n", "unknown qubit argument 'q'"},
            {"qubit q;\nint n = 1;\ngate g(t) a { rx(n) a; }\ng(1) q;\n",
                "declared outside gate 'g'"},
            {"qubit q;\nif (true) { int n = 1; }\nn = 2;\n", "unknown name 'n'"},
            {"qubit q;\nfor int i in [0:1] { i = 3; }\n", "the loop variable"},
        };
        for (String[] c : cases) {
            CircuitFormatException e = assertThrows(CircuitFormatException.class,
                    () -> QasmReader.read(HEAD + c[0]));
            assertTrue(e.getMessage().contains(c[1]), e.getMessage());
        }
        // A global const is visible in a gate.
        assertEquals(Circuit.builder(1, 0).rx(0, 2.0).build(), QasmReader.read(HEAD
                + "const float w = 2.0;\ngate g a { rx(w) a; }\nqubit q;\ng q;\n"));
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        // Constructs of the specification outside what a gate-level simulator can run, each
        // refused by name (docs/openqasm.md gives the reasons).
        "box { x q; }|box",
        "stretch s;|stretch",
        "duration d = 100ns;|duration",
        "rx(durationof({x q;})) q;|durationof",
        "cal { }|cal",
        "defcal x $0 { }|defcal",
        "defcalgrammar \"openpulse\";|defcalgrammar",
        "frame f;|frame",
        "port p;|port",
        "waveform w;|waveform",
        "extern f(int) -> int;|extern",
        "array[int[8], 2] a;|array",
        "switch (1) { case 1 { } }|switch",
        "complex[float] z;|complex",
        "opaque g q;|opaque",
        "end;|end",
        "nop q;|nop",
    })
    void unsupportedConstructsAreRefusedByName(String statement, String word) {
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(HEAD + "qubit q;\n" + statement + "\n"));
        assertTrue(e.getMessage().contains("'" + word + "' is unsupported"), e.getMessage());
        assertEquals(4, e.line(), e.getMessage());
    }

    @Test
    void aLocalVariableNamedLikeAStandardGateIsRenamedInTheCircuit() {
        // A block may declare a name a global gate has (scoping); the circuit's variables are
        // global, and the writer declares them at the top level, so the circuit gives it
        // another name and reads back equal.
        Circuit read = QasmReader.read(HEAD + "qubit q;\nbit c;\n"
                + "if (c == 0) { int x = 3; if (x == 3) h q; }\n"
                + "for int i in [0:2] { int n = i; uint[4] m; m += 1; }\n");
        assertEquals(List.of("x_2", "n", "m"), read.variables().stream()
                .map(Circuit.Variable::name).collect(java.util.stream.Collectors.toList()));
        assertEquals(read, QasmReader.read(QasmWriter.write(read)));
        // Each pass of the loop declares its variables again: the pass before has ended, so
        // they are the same variables of the circuit, set again (m, without a value, to 0,
        // as a new variable starts).
        Circuit.Builder h = Circuit.builder(1, 1);
        Expression x = h.declare("x_2", Circuit.VariableType.INT, 64, null);
        h.ifBit(0, 0, b -> b.assign("x_2", Expression.constant(3)).ifThen(Expression.of(
                Expression.Op.EQ, x, Expression.constant(3)), bb -> bb.h(0)));
        h.declare("n", Circuit.VariableType.INT, 64, Expression.constant(0));
        Expression m = h.declare("m", Circuit.VariableType.UINT, 4, null);
        h.assign("m", Expression.of(Expression.Op.ADD, m, Expression.constant(1)));
        for (int i = 1; i <= 2; i++) {
            h.assign("n", Expression.constant(i)).assign("m", Expression.constant(0))
                    .assign("m", Expression.of(Expression.Op.ADD, m, Expression.constant(1)));
        }
        assertEquals(h.build(), read);
    }
}
