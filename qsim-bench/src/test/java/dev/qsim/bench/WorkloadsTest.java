package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.qsim.Circuit;
import dev.qsim.Gates;
import dev.qsim.Instruction;
import dev.qsim.Operator;
import dev.qsim.Simulator;
import dev.qsim.StateVector;
import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/** Tests of the kernel gates, the layered circuit and the two JMH benchmarks' set-up. */
class WorkloadsTest {

    @Test
    void kernelGatesHaveTheirShape() {
        Operator diagonal = Workloads.kernelGate("diagonal");
        // rz(0.7) = diag(e^{-0.35i}, e^{0.35i}) (Nielsen & Chuang 2010, eq. 4.6): diagonal, and
        // neither entry is 1, so no half of the state can be skipped.
        assertEquals(0.0, diagonal.get(0, 1).abs(), 0.0);
        assertEquals(0.0, diagonal.get(1, 0).abs(), 0.0);
        assertTrue(diagonal.get(0, 0).subtract(Complex.ofPolar(1, -0.35)).abs() < 1e-15);
        assertTrue(diagonal.get(1, 1).subtract(Complex.ofPolar(1, 0.35)).abs() < 1e-15);
        assertSame(Gates.X, Workloads.kernelGate("permutation"));
        assertTrue(Workloads.kernelGate("dense").isUnitary(1e-12));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> Workloads.kernelGate("sparse"));
        assertEquals("kernel 'sparse' is not known; allowed: dense, diagonal, permutation,"
            + " controlled", e.getMessage());
    }

    @ParameterizedTest
    @CsvSource({"0, 5, 1", "2, 5, 3", "4, 5, 3", "1, 2, 0", "0, 2, 1"})
    void controlIsTheNeighbour(int target, int n, int control) {
        assertEquals(control, Workloads.controlFor(target, n));
    }

    @Test
    void controlledKernelIsCnot() {
        // CNOT |c, t> = |c, t xor c> (Nielsen & Chuang 2010, sec. 1.3.2). Target 0, control 1
        // on 3 qubits: index 2 (q1 = 1) goes to 3, index 1 (q1 = 0) stays, index 7 goes to 6.
        Circuit c = Workloads.kernelCircuit("controlled", 3, 0);
        Instruction gate = c.instructions().get(0);
        assertEquals(1, gate.controls().length);
        assertEquals(1, gate.controls()[0]);
        assertEquals(0, gate.targets()[0]);
        long[][] cases = {{2, 3}, {1, 1}, {7, 6}, {0, 0}};
        for (long[] io : cases) {
            StateVector s = StateVector.basis(3, io[0]).apply(c);
            assertEquals(1.0, s.probability(io[1]), 0.0, "basis " + io[0]);
        }
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> Workloads.kernelCircuit("controlled", 1, 0));
        assertTrue(e.getMessage().contains("needs at least 2 qubits but the state has 1"),
            e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> Workloads.controlFor(2, 2));
    }

    @Test
    void layeredCircuitShape() {
        Circuit c = Workloads.layeredCircuit(5, 20, 7);
        // 20 layers of 5 rotations and 4 ladder gates.
        assertEquals(20 * (2 * 5 - 1), c.size());
        int cz = 0;
        int cnot = 0;
        for (int i = 0; i < c.size(); i++) {
            Instruction in = c.instructions().get(i);
            int layer = i / 9;
            int slot = i % 9;
            if (slot < 5) {
                assertTrue(in.name().matches("r[xyz]"), in.toString());
                assertEquals(slot, in.targets()[0]);
            } else {
                assertEquals(layer % 2 == 0 ? "cz" : "cnot", in.name(), in.toString());
                cz += in.name().equals("cz") ? 1 : 0;
                cnot += in.name().equals("cnot") ? 1 : 0;
            }
        }
        assertEquals(40, cz);
        assertEquals(40, cnot);
        assertEquals(c, Workloads.layeredCircuit(5, 20, 7));
        assertThrows(IllegalArgumentException.class, () -> Workloads.layeredCircuit(0, 20, 7));
    }

    @Test
    void fusedAndUnfusedRunsMatchTheCircuitMatrix() {
        // Reference: column 0 of the circuit's own matrix (Circuit.toOperator, a dense product
        // of the gate matrices) is the state the circuit makes from |0...0>. Tolerance 1e-12:
        // 180 gates, each adding a few ulps of rounding to unit-modulus sums.
        Circuit c = Workloads.layeredCircuit(4, 20, Workloads.CIRCUIT_SEED);
        Operator u = c.toOperator();
        FusionBenchmark bench = new FusionBenchmark();
        for (String fusion : new String[] {"true", "false"}) {
            for (int threads = 1; threads <= 2; threads++) {
                FusionBenchmark.Workload w = new FusionBenchmark.Workload();
                w.n = 4;
                w.fusion = Boolean.parseBoolean(fusion);
                w.threads = threads;
                w.setUp();
                assertEquals(w.fusion, w.simulator.fusion());
                StateVector s = bench.run(w);
                for (int i = 0; i < 16; i++) {
                    Complex diff = s.amplitude(i).subtract(u.get(i, 0));
                    assertTrue(diff.abs() < 1e-12, "fusion " + fusion + ", amplitude " + i
                        + ", seed " + Workloads.CIRCUIT_SEED);
                }
            }
        }
        assertEquals(Simulator.seeded(1).withFusion(false).stateAfter(c).amplitude(5),
            StateVector.zero(4).apply(c).amplitude(5));
    }

    @ParameterizedTest
    @CsvSource({
        "dense,       low,  1",
        "diagonal,    high, 2",
        "permutation, low,  2",
        "controlled,  high, 1",
    })
    void kernelBenchmarkKeepsTheNorm(String kernel, String target, int threads) {
        KernelBenchmark.Workload w = new KernelBenchmark.Workload();
        w.n = 6;
        w.kernel = kernel;
        w.target = target;
        w.threads = threads;
        w.setUp();
        assertEquals(1, w.gate.size());
        assertEquals(Workloads.target(target, 6), w.gate.instructions().get(0).targets()[0]);
        KernelBenchmark bench = new KernelBenchmark();
        StateVector after = null;
        for (int i = 0; i < 3; i++) {
            after = bench.applyGate(w);
        }
        assertSame(w.state, after);
        // A unitary keeps the norm (Nielsen & Chuang 2010, sec. 2.1.6).
        assertEquals(1.0, after.norm(), 1e-12);
    }
}
