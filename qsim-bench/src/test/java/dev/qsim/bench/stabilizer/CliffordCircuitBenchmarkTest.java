package dev.qsim.bench.stabilizer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.Tally;

/** Tests of the benchmark's workload, on a small size. */
class CliffordCircuitBenchmarkTest {

    @Test
    void workloadIsARandomCliffordCircuitEndingInAFullMeasurement() {
        CliffordCircuitBenchmark.Workload w = new CliffordCircuitBenchmark.Workload();
        w.n = 40;
        w.gates = 500;
        w.shots = 3;
        w.setUp();
        Circuit c = w.circuit;
        assertEquals(40, c.qubits());
        assertEquals(540, c.size());
        assertTrue(c.isClifford());
        for (int k = 0; k < 500; k++) {
            assertEquals(Instruction.Kind.GATE, c.instructions().get(k).kind());
        }
        for (int k = 500; k < 540; k++) {
            assertEquals(Instruction.Kind.MEASURE, c.instructions().get(k).kind());
        }
        // Same seed, same circuit (the setup is seeded).
        assertEquals(c, CliffordCircuitBenchmark.randomCircuit(40, 500,
                CliffordCircuitBenchmark.CIRCUIT_SEED));
        Tally t = new CliffordCircuitBenchmark().run(w);
        assertEquals(3, t.shots());
        assertEquals(40, t.width());
    }
}
