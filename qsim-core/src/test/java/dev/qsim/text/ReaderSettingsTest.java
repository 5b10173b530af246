package dev.qsim.text;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;

import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;

/**
 * The reader's settings: immutable values with checked arguments (the project's validation
 * rule: a message names the bad value and what is allowed; common practice for immutable
 * configurations), and each setting's effect on a read.
 */
class ReaderSettingsTest {

    @Test
    void defaultsAreTheDocumentedOnes() {
        QasmReader.Settings d = QasmReader.Settings.defaults();
        assertEquals(QasmReader.Settings.DEFAULT_WORK_BUDGET, d.workBudget());
        assertEquals(QasmReader.Settings.DEFAULT_LOOP_BOUND, d.loopBound());
        assertEquals(QasmReader.Settings.DEFAULT_MAX_FILE_BYTES, d.maxFileBytes());
        assertEquals(QasmReader.MAX_INSTRUCTIONS, d.maxInstructions());
        assertTrue(Double.isNaN(d.timeStep()));
        assertEquals(Map.of(), d.inputs());
    }

    @Test
    void eachWithReturnsNewSettingsAndLeavesTheOldOnes() {
        QasmReader.Settings d = QasmReader.Settings.defaults();
        QasmReader.Settings s = d.withInput("theta", 0.5).withInput("n", 3L)
                .withWorkBudget(123).withLoopBound(7).withMaxFileBytes(4096)
                .withMaxInstructions(99).withTimeStep(2e-9);
        assertEquals(Map.of("theta", 0.5, "n", 3L), s.inputs());
        assertEquals(123, s.workBudget());
        assertEquals(7, s.loopBound());
        assertEquals(4096, s.maxFileBytes());
        assertEquals(99, s.maxInstructions());
        assertEquals(2e-9, s.timeStep());
        assertSame(QasmReader.Settings.defaults(), d);
        assertEquals(Map.of(), d.inputs());
        assertEquals(QasmReader.Settings.DEFAULT_WORK_BUDGET, d.workBudget());
        assertThrows(UnsupportedOperationException.class, () -> s.inputs().put("x", 1));
        assertTrue(s.toString().contains("loop bound 7"), s.toString());
    }

    @Test
    void badValuesAreRefusedWithTheValueInTheMessage() {
        QasmReader.Settings d = QasmReader.Settings.defaults();
        Object[][] cases = {
            {(Runnable) () -> d.withWorkBudget(0), "0"},
            {(Runnable) () -> d.withLoopBound(0), "0"},
            {(Runnable) () -> d.withLoopBound(Circuit.Builder.MAX_ITERATIONS + 1),
                String.valueOf(Circuit.Builder.MAX_ITERATIONS + 1)},
            {(Runnable) () -> d.withMaxFileBytes(-5), "-5"},
            {(Runnable) () -> d.withMaxFileBytes(1L << 40), String.valueOf(1L << 40)},
            {(Runnable) () -> d.withMaxInstructions(0), "0"},
            {(Runnable) () -> d.withTimeStep(-1e-9), "-1.0E-9"},
            {(Runnable) () -> d.withTimeStep(Double.NaN), "NaN"},
            {(Runnable) () -> d.withInput("theta", Double.POSITIVE_INFINITY), "Infinity"},
            {(Runnable) () -> d.withInput("two words", 1.0), "two words"},
            {(Runnable) () -> d.withInput(" ", 1L), "' '"},
        };
        for (Object[] c : cases) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    ((Runnable) c[0])::run);
            assertTrue(e.getMessage().contains((String) c[1]), e.getMessage());
        }
        assertThrows(NullPointerException.class, () -> d.withInput(null, 1L));
        assertThrows(NullPointerException.class, () -> QasmReader.read((String) null));
        assertThrows(NullPointerException.class, () -> QasmReader.read("qubit q;", null));
    }

    @Test
    void eachLimitApplies() {
        String text = "OPENQASM 3;\ninclude \"stdgates.inc\";\nqubit q;\nh q;\nx q;\n";
        QasmReader.Settings d = QasmReader.Settings.defaults();
        assertEquals(2, QasmReader.read(text, d).size());
        assertTrue(assertThrows(CircuitFormatException.class, () -> QasmReader.read(text,
                d.withMaxInstructions(1))).getMessage().contains("more than 1 instructions"));
        assertTrue(assertThrows(CircuitFormatException.class, () -> QasmReader.read(text,
                d.withWorkBudget(3))).getMessage().contains("more than 3 steps"));
        assertTrue(assertThrows(CircuitFormatException.class, () -> QasmReader.read(text,
                d.withMaxFileBytes(10))).getMessage().contains("at most 10 are read"));
        // An input may be an integer given as a long, or a bool (true when not 0).
        Circuit c = QasmReader.read("OPENQASM 3;\ninclude \"stdgates.inc\";\ninput int n;\n"
                + "input bool on;\nqubit[3] q;\nif (on) x q[n];\n", d.withInput("n", 2L)
                .withInput("on", 1L));
        assertEquals(Circuit.builder(3, 0).x(2).build(), c);
    }
}
