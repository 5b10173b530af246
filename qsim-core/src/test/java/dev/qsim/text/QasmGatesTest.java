package dev.qsim.text;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

import dev.qsim.Gate;

/**
 * The reader's name table against the catalogue and the OpenQASM 3 specification (built-ins
 * {@code U} and {@code gphase}; {@code stdgates.inc} with its aliases {@code CX},
 * {@code phase}, {@code cphase} and {@code u1}, and the gates it defines through others,
 * {@code u2}, {@code u3} and {@code cu}; the file's contents from memory).
 */
class QasmGatesTest {

    @Test
    void everyCatalogueGateWithAnOpenQasmNameIsKnownByItWithTheCatalogueCounts() {
        int named = 0;
        for (Gate g : Gate.values()) {
            if (g.qasmName() == null) {
                assertNull(QasmGates.find(g.id()), g.id() + " has no OpenQASM name");
                continue;
            }
            named++;
            QasmGates.Entry e = QasmGates.find(g.qasmName());
            assertNotNull(e, g.qasmName());
            assertSame(g, e.gate());
            assertEquals(g.qasmName(), e.name());
            assertEquals(g.parameters(), e.parameters(), g.qasmName());
            assertEquals(g.qubits(), e.qubits(), g.qasmName());
            assertFalse(e.globalPhase());
            // U is the language's built-in; every other name comes from stdgates.inc.
            assertEquals(g != Gate.U, e.standard(), g.qasmName());
        }
        assertTrue(named > 20, "only " + named + " catalogue gates have an OpenQASM name");
    }

    @ParameterizedTest
    @CsvSource({"CX, CNOT", "phase, PHASE", "cphase, CPHASE", "u1, PHASE"})
    void theAliasesOfStdgatesAreStandardNamesOfTheirCatalogueGates(String name, Gate gate) {
        QasmGates.Entry e = QasmGates.find(name);
        assertSame(gate, e.gate());
        assertTrue(e.standard());
        assertEquals(gate.parameters(), e.parameters());
        assertEquals(gate.qubits(), e.qubits());
    }

    @Test
    void gphaseIsABuiltInWithOneParameterAndNoQubit() {
        QasmGates.Entry e = QasmGates.find("gphase");
        assertTrue(e.globalPhase());
        assertNull(e.gate());
        assertFalse(e.standard());
        assertEquals(1, e.parameters());
        assertEquals(0, e.qubits());
    }

    @Test
    void standardNamesNeedTheIncludeAndBuiltInsDoNot() {
        assertNull(QasmGates.callable("h", false));
        assertSame(Gate.H, QasmGates.callable("h", true).gate());
        assertSame(Gate.U, QasmGates.callable("U", false).gate());
        assertTrue(QasmGates.callable("gphase", false).globalPhase());
        assertNull(QasmGates.callable("nothing", true));
    }

    @ParameterizedTest
    @ValueSource(strings = {"cnot", "toffoli", "fredkin", "sDagger", "rzz", "unitary", "Cx", "H",
        "u", "GPHASE", ""})
    void namesAreTheOpenQasmOnesAsWritten(String name) {
        // Catalogue identifiers and other spellings are not OpenQASM names.
        assertNull(QasmGates.find(name), name);
    }

    @ParameterizedTest
    @CsvSource({"u2, 2, 1", "u3, 3, 1", "cu, 4, 2"})
    void gatesDefinedThroughOthersAreStandardWithTheirCounts(String name, int parameters,
            int qubits) {
        QasmGates.Entry e = QasmGates.find(name);
        assertNull(e.gate());
        assertNotNull(e.definition());
        assertFalse(e.globalPhase());
        assertTrue(e.standard());
        assertEquals(parameters, e.parameters());
        assertEquals(qubits, e.qubits());
        assertNull(QasmGates.callable(name, false));
    }
}
