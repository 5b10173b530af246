package dev.qsim.bench.text;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Instruction;

/** Tests of the benchmark's workload, on a small size. */
class QasmReadBenchmarkTest {

    @Test
    void workloadReadsIntoOneGatePerStatement() {
        QasmReadBenchmark.Workload w = new QasmReadBenchmark.Workload();
        w.gates = 2000;
        w.setUp();
        Circuit c = new QasmReadBenchmark().read(w);
        assertEquals(20, c.qubits());
        assertEquals(2000, c.size());
        for (Instruction i : c.instructions()) {
            assertEquals(Instruction.Kind.GATE, i.kind());
        }
        // Same seed, same text (the setup is seeded).
        assertEquals(w.text, QasmReadBenchmark.program(2000, QasmReadBenchmark.PROGRAM_SEED));
    }
}
