package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.Circuit;
import dev.qsim.Gates;
import dev.qsim.Instruction;
import dev.qsim.Operator;
import dev.qsim.Precision;
import dev.qsim.Simulator;
import dev.qsim.StateVector;

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
        // In single precision each rounding of the state to float moves every part by at most
        // 2^-24 of its size (binary32 has a 24-bit significand, round to nearest: IEEE 754-2019,
        // sec. 3.6 and 4.3.1), so the state by at most 2^-24 in norm; unitaries keep the norm of
        // that error (Nielsen & Chuang 2010, sec. 2.1.6). At most one rounding per gate and one
        // for |0000>: 181 * 2^-24 (about 1.1e-5), plus the double-precision 1e-12.
        Circuit c = Workloads.layeredCircuit(4, 20, Workloads.CIRCUIT_SEED);
        Operator u = c.toOperator();
        FusionBenchmark bench = new FusionBenchmark();
        for (String precision : new String[] {"double", "single"}) {
            double tolerance = precision.equals("double") ? 1e-12
                : 181 * Math.scalb(1.0, -24) + 1e-12;
            for (String fusion : new String[] {"true", "false"}) {
                for (int threads = 1; threads <= 2; threads++) {
                    FusionBenchmark.Workload w = new FusionBenchmark.Workload();
                    w.n = 4;
                    w.fusion = Boolean.parseBoolean(fusion);
                    w.threads = threads;
                    w.precision = precision;
                    w.setUp();
                    assertEquals(w.fusion, w.simulator.fusion());
                    assertEquals(Workloads.precision(precision), w.simulator.precision());
                    StateVector s = bench.run(w);
                    assertEquals(Workloads.precision(precision), s.precision());
                    for (int i = 0; i < 16; i++) {
                        Complex diff = s.amplitude(i).subtract(u.get(i, 0));
                        assertTrue(diff.abs() < tolerance, precision + ", fusion " + fusion
                            + ", amplitude " + i + ", seed " + Workloads.CIRCUIT_SEED);
                    }
                }
            }
        }
        assertEquals(Simulator.seeded(1).withFusion(false).stateAfter(c).amplitude(5),
            StateVector.zero(4).apply(c).amplitude(5));
    }

    @ParameterizedTest
    @CsvSource({
        "dense,       low,  1, double",
        "diagonal,    high, 2, double",
        "permutation, low,  2, double",
        "controlled,  high, 1, double",
        "dense,       high, 2, single",
        "diagonal,    low,  1, single",
        "permutation, high, 1, single",
        "controlled,  low,  2, single",
    })
    void kernelBenchmarkKeepsTheNorm(String kernel, String target, int threads,
            String precision) {
        KernelBenchmark.Workload w = new KernelBenchmark.Workload();
        w.n = 6;
        w.kernel = kernel;
        w.target = target;
        w.threads = threads;
        w.precision = precision;
        w.setUp();
        assertEquals(Workloads.precision(precision), w.state.precision());
        assertEquals(1, w.gate.size());
        assertEquals(Workloads.target(target, 6), w.gate.instructions().get(0).targets()[0]);
        KernelBenchmark bench = new KernelBenchmark();
        StateVector after = null;
        for (int i = 0; i < 3; i++) {
            after = bench.applyGate(w);
        }
        assertSame(w.state, after);
        // A unitary keeps the norm (Nielsen & Chuang 2010, sec. 2.1.6). In single precision
        // each of the 4 roundings to float (the state, then each gate) changes the norm by at
        // most a factor 1 + 2^-24 (IEEE 754-2019, sec. 4.3.1): 4 * 2^-24 < 2.4e-7.
        double tolerance = precision.equals("double") ? 1e-12 : 4 * Math.scalb(1.0, -24) + 1e-12;
        assertEquals(1.0, after.norm(), tolerance);
    }

    @ParameterizedTest
    @CsvSource({"1", "2", "7", "12"})
    void singlePrecisionProductStateIsTheDoubleOneRounded(int n) {
        // Tensor products of unit vectors are unit vectors (Nielsen & Chuang 2010, sec. 2.1.7),
        // and the same seed gives the same factors. The single-precision state rounds the low
        // half to float, multiplies and rounds again: each part moves by at most 2^-24 of the
        // amplitude's modulus per rounding (IEEE 754-2019, sec. 3.6 and 4.3.1; the two rounded
        // low parts enter a part of the product at most as |low| |high| = |a| by
        // Cauchy-Schwarz), so |single - double| <= 2 sqrt(2) 2^-24 |a| < 3 * 2^-24 |a|.
        StateVector d = Workloads.productState(n, Workloads.STATE_SEED, Precision.DOUBLE);
        StateVector f = Workloads.productState(n, Workloads.STATE_SEED, Precision.SINGLE);
        assertEquals(Precision.DOUBLE, d.precision());
        assertEquals(Precision.SINGLE, f.precision());
        assertEquals(n, f.qubits());
        assertEquals(Workloads.productState(n, Workloads.STATE_SEED).amplitude(0),
            d.amplitude(0));
        double u = Math.scalb(1.0, -24);
        for (long i = 0; i < d.dimension(); i++) {
            Complex a = d.amplitude(i);
            double diff = f.amplitude(i).subtract(a).abs();
            assertTrue(diff <= 3 * u * a.abs() + 1e-15, "n " + n + ", index " + i + ": "
                + f.amplitude(i) + " against " + a + ", seed " + Workloads.STATE_SEED);
        }
        assertEquals(1.0, d.norm(), 1e-12);
    }

    @Test
    void productStateRefusesBadSizesAndPrecisionNames() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> Workloads.productState(0, 1, Precision.SINGLE));
        assertEquals("qubit count must be in [1, 40] but was 0", e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> Workloads.precision("half"));
        assertEquals("precision 'half' is not known; allowed: double, single", e.getMessage());
        assertEquals(Precision.SINGLE, Workloads.precision("single"));
        assertEquals("single", Workloads.precisionName(Precision.SINGLE));
        assertEquals("double", Workloads.precisionName(Precision.DOUBLE));
        KernelBenchmark.Workload w = new KernelBenchmark.Workload();
        w.n = 4;
        w.kernel = "dense";
        w.target = "low";
        w.threads = 1;
        w.precision = "quad";
        e = assertThrows(IllegalArgumentException.class, w::setUp);
        assertTrue(e.getMessage().contains("'quad'"), e.getMessage());
    }
}
