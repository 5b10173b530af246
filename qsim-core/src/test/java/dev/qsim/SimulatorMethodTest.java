package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class SimulatorMethodTest {

    private static Circuit ghz(int n) {
        Circuit.Builder b = Circuit.builder(n).h(0);
        for (int q = 1; q < n; q++) {
            b.cnot(q - 1, q);
        }
        return b.measure().build();
    }

    @Test
    void automaticPicksTheStabilizerEngineForLargeCliffordCircuits() {
        Simulator sim = Simulator.seeded(3);
        assertEquals(Simulator.Method.STATE_VECTOR, sim.methodFor(ghz(4)));
        assertEquals(Simulator.Method.STABILIZER, sim.methodFor(ghz(64)));
        assertEquals(Simulator.Method.STATE_VECTOR,
                sim.methodFor(Circuit.builder(20).t(0).build()));
        // A 64-qubit GHZ state reads all zeros or all ones (Greenberger, Horne, Shimony and
        // Zeilinger, Am. J. Phys. 58, 1131 (1990)); no state vector of 64 qubits could run.
        Tally t = sim.run(ghz(64), 100);
        assertEquals(100, t.count("0".repeat(64)) + t.count("1".repeat(64)));
    }

    @Test
    void eitherEngineCanBeForced() {
        Simulator sv = Simulator.seeded(3).withMethod(Simulator.Method.STATE_VECTOR);
        Simulator st = Simulator.seeded(3).withMethod(Simulator.Method.STABILIZER);
        assertEquals(Simulator.Method.STATE_VECTOR, sv.methodFor(ghz(20)));
        assertEquals(Simulator.Method.STABILIZER, st.methodFor(ghz(2)));
        Tally t = st.run(ghz(3), 200);
        assertEquals(200, t.count("000") + t.count("111"));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> st.run(Circuit.builder(2).h(0).t(1).measure().build(), 10));
        assertTrue(e.getMessage().contains("instruction 1 (t)"), e.getMessage());
        Circuit bell = Circuit.builder(2).h(0).cnot(0, 1).build();
        assertEquals(1.0, st.stateAfter(bell).fidelity(StateVector.zero(2).apply(bell)), 1e-12);
        assertTrue(st.toString().contains("STABILIZER"), st.toString());
    }
}
