package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;

/** Circuit structure: size, depth, append, inverse, equality, the text diagram. */
class CircuitTest {
    @Test
    void sizeCountsAConditionedBlockAsOne() {
        Circuit c = Circuit.builder(3).h(0).measure(0, 0)
                .ifBit(0, 1, b -> b.x(1).z(2)).build();
        assertEquals(3, c.size());
        assertEquals(2, c.instructions().get(2).body().size());
        assertFalse(c.isGatesOnly());
    }

    @Test
    void depthIsTheLongestChainOfSharedQubits() {
        // Depth as the number of layers of gates that share qubits: common practice
        // (e.g. Nielsen and Chuang 2010, §4.5.5 on circuit size and depth).
        assertEquals(0, Circuit.builder(2).build().depth());
        assertEquals(1, Circuit.builder(3).h(0).h(1).h(2).build().depth());
        assertEquals(3, Circuit.builder(3).h(0).cnot(0, 1).cnot(1, 2).h(0).build().depth());
        // GHZ on 4 qubits with a ladder of CNOTs: 1 + 3 layers.
        assertEquals(4, Circuit.builder(4).h(0).cnot(0, 1).cnot(1, 2).cnot(2, 3).build().depth());
        // A measurement joins its clbit: the condition waits for it.
        assertEquals(3, Circuit.builder(2).h(0).measure(0, 0).ifBit(0, 1, b -> b.x(1))
                .build().depth());
    }

    @Test
    void appendCopiesInstructionsAndChecksSize() {
        Circuit small = Circuit.builder(2).h(0).cnot(0, 1).build();
        Circuit big = Circuit.builder(3).x(2).append(small).append(small).build();
        assertEquals(5, big.size());
        assertEquals(small.instructions(), big.instructions().subList(1, 3));
    }

    @Test
    void inverseUndoesEveryGateKind() {
        Operator u = Operator.of(new Complex[][] {
            {Complex.ofCartesian(0.6, 0), Complex.ofCartesian(0, 0.8)},
            {Complex.ofCartesian(0, 0.8), Complex.ofCartesian(0.6, 0)}});
        Circuit c = Circuit.builder(3).h(0).x(1).y(2).z(0).s(1).sDagger(2).t(0).tDagger(1)
                .sqrtX(2).rx(0, 0.3).ry(1, -1.1).rz(2, 2.5).phase(0, 0.7).cnot(0, 1).cz(1, 2)
                .cphase(0, 2, 0.4).swap(0, 2).rzz(1, 2, 0.9).toffoli(0, 1, 2).fredkin(2, 0, 1)
                .apply(u, 1).controlled(u, new int[] {0}, 2).build();
        Circuit both = Circuit.builder(3).append(c).append(c.inverse()).build();
        Operator id = both.toOperator();
        // U U^{-1} = I (definition of the inverse; common practice). 1e-12: rounding only.
        for (int i = 0; i < 8; i++) {
            for (int j = 0; j < 8; j++) {
                Complex z = id.get(i, j);
                assertEquals(i == j ? 1 : 0, z.getReal(), 1e-12);
                assertEquals(0, z.getImaginary(), 1e-12);
            }
        }
        assertEquals("sDagger", c.inverse().instructions().get(c.size() - 1 - 4).name());
    }

    @Test
    void inverseOfSelfInverseGatesIsBitwiseTheSame() {
        // H, X, Y, Z, CNOT, CZ, SWAP, Toffoli, Fredkin are their own inverses (N&C 2010, §4.2).
        Circuit c = Circuit.builder(3).h(0).x(1).y(2).z(0).cnot(0, 1).cz(1, 2).swap(0, 2)
                .toffoli(0, 1, 2).fredkin(2, 0, 1).build();
        assertEquals(c.inverse().inverse(), c);
        assertEquals(Circuit.builder(1).y(0).build(), Circuit.builder(1).y(0).build().inverse());
        assertEquals(Gates.Y, Gates.Y.dagger(), "adjoint of Y is Y, zeros keep their sign");
    }

    @Test
    void equalCircuitsAreEqual() {
        Circuit a = Circuit.builder(2).h(0).rz(1, 0.5).measure().build();
        Circuit b = Circuit.builder(2).h(0).rz(1, 0.5).measure().build();
        assertEquals(a, b);
        assertEquals(a.hashCode(), b.hashCode());
        assertNotEquals(a, Circuit.builder(2).h(0).rz(1, 0.25).measure().build());
    }

    @Test
    void diagramShowsOneLinePerQubitInTimeOrder() {
        Circuit c = Circuit.builder(3).h(0).cnot(0, 2).rz(1, Math.PI / 4).measure(2, 2)
                .ifBit(2, 1, b -> b.x(0)).build();
        String d = c.diagram();
        List<String> lines = d.lines().collect(java.util.stream.Collectors.toList());
        assertEquals(5, lines.size(), d);
        assertTrue(lines.get(0).startsWith("q0: "), d);
        assertTrue(lines.get(2).startsWith("q1: "), d);
        assertTrue(lines.get(4).startsWith("q2: "), d);
        String q0 = lines.get(0);
        // Textbook symbols (Nielsen and Chuang 2010, §4.3, Figure 4.2 and the figures of
        // §4.3): a filled dot for the control, ⊕ for the NOT target.
        assertTrue(q0.indexOf("H") < q0.indexOf("\u25cf")
                && q0.indexOf("\u25cf") < q0.indexOf("X[c2=1]"), d);
        assertTrue(lines.get(2).contains("RZ(pi/4)"), d);
        assertTrue(lines.get(2).contains("|"), "the CNOT line crosses qubit 1: " + d);
        assertTrue(lines.get(4).contains("\u2295") && lines.get(4).contains("M>c2"), d);
        for (String old : new String[] {"@", "(+)"}) {
            assertTrue(!d.contains(old), d);
        }
        // Two one-qubit measurements in one column draw no line between them.
        String m = Circuit.builder(2).h(0).cnot(0, 1).measure().build().diagram();
        List<String> ml = m.lines().collect(java.util.stream.Collectors.toList());
        int at = ml.get(0).indexOf("M>c0");
        assertTrue(at > 0 && ml.get(1).length() <= at + 1 || ml.get(1).charAt(at + 1) == ' ', m);
        assertEquals(1, ml.get(1).chars().filter(ch -> ch == '|').count(), m);
        assertEquals("3pi/4", Gate.angleText(3 * Math.PI / 4));
        assertEquals("-pi/2", Gate.angleText(-Math.PI / 2));
        assertEquals("0.3", Gate.angleText(0.3));
    }

    @Test
    void diagramUsesTheTextbookSymbolsForControlsNotsAndSwaps() {
        // Nielsen and Chuang 2010, §4.3: a control is a filled dot, the target of a NOT is ⊕
        // (CNOT, Toffoli), the two ends of a swap are × joined by a line (SWAP, Fredkin);
        // controlled-Z has a dot on both qubits. The drawing layout is the one of diagram().
        Circuit c = Circuit.builder(3).cnot(0, 1).swap(1, 2).cz(0, 2).toffoli(0, 1, 2)
                .fredkin(2, 0, 1).cphase(0, 1, Math.PI / 2).build();
        // Read column by column: CNOT(0, 1), SWAP(1, 2), CZ(0, 2), Toffoli(0, 1 -> 2),
        // Fredkin(2 -> 0, 1), cphase(0, 1).
        assertEquals(String.join("\n",
                "q0: --\u25cf-----\u25cf--\u25cf--\u00d7-----\u25cf-----",
                "      |     |  |  |     |",
                "q1: --\u2295--\u00d7--|--\u25cf--\u00d7--P(pi/2)--",
                "         |  |  |  |",
                "q2: -----\u00d7--\u25cf--\u2295--\u25cf-----------"),
                c.diagram());
    }

    @Test
    void toOperatorOfCnotMatchesTheGateConstant() {
        // The builder's cnot(c, t) and apply(CNOT, c, t) are the same gate (contract).
        assertEquals(Gates.CNOT, Circuit.builder(2).cnot(0, 1).build().toOperator());
        assertEquals(Gates.CNOT, Circuit.builder(2).apply(Gates.CNOT, 0, 1).build().toOperator());
        assertEquals(Gates.TOFFOLI, Circuit.builder(3).toffoli(0, 1, 2).build().toOperator());
        assertEquals(Gates.FREDKIN, Circuit.builder(3).fredkin(0, 1, 2).build().toOperator());
    }
}
