package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.Operator;
import dev.qsim.StateVector;

/** Tests of the benchmark's setup and of the workloads it shares with the scaling report. */
class SingleQubitGateBenchmarkTest {

    private static SingleQubitGateBenchmark.Workload workload(int n, String target, int threads,
            String gate) {
        SingleQubitGateBenchmark.Workload w = new SingleQubitGateBenchmark.Workload();
        w.n = n;
        w.target = target;
        w.threads = threads;
        w.gate = gate;
        w.setUp();
        return w;
    }

    @ParameterizedTest
    @CsvSource({
        // n, target, gate
        "1,  low,  dense",
        "6,  mid,  dense",
        "10, high, dense",
        "10, mid,  h",
        "10, low,  ry",
        "10, high, t",
        "10, mid,  x",
    })
    void setUpGivesANormalisedStateThatStaysNormalised(int n, String target, String gate) {
        SingleQubitGateBenchmark.Workload w = workload(n, target, 1, gate);
        assertEquals(n, w.state.qubits());
        // A tensor product of unit vectors is a unit vector, ||a (x) b|| = ||a|| ||b|| (textbook
        // identity, Nielsen & Chuang 2010, sec. 2.1.7); a unitary keeps the norm (sec. 2.1.6).
        assertEquals(1.0, w.state.norm(), 1e-12);
        SingleQubitGateBenchmark bench = new SingleQubitGateBenchmark();
        StateVector after = null;
        for (int i = 0; i < 50; i++) {
            after = bench.applyGate(w);
        }
        assertSame(w.state, after);
        assertEquals(1.0, after.norm(), 1e-12);
    }

    @Test
    void setUpStateHasEveryAmplitudeNonzero() {
        // Documented in Workloads.productState: ry angles in [0.5, 2.5] keep |cos|, |sin| of the
        // half angle at least sin(0.25) > 0.24, so each amplitude is at least 0.24^n in modulus.
        SingleQubitGateBenchmark.Workload w = workload(8, "mid", 1, "dense");
        double floor = Math.pow(Math.sin(0.25), 8);
        for (long i = 0; i < w.state.dimension(); i++) {
            assertTrue(w.state.probability(i) >= floor * floor * (1 - 1e-9),
                "amplitude " + i + " is too small, seed " + Workloads.STATE_SEED);
        }
    }

    @Test
    void setUpIsReproducible() {
        StateVector a = workload(7, "low", 1, "dense").state;
        StateVector b = workload(7, "low", 1, "dense").state;
        for (long i = 0; i < a.dimension(); i++) {
            assertEquals(a.amplitude(i), b.amplitude(i), "index " + i);
        }
    }

    @Test
    void resultDoesNotDependOnThreads() {
        // Design rule "same seed, same results, whatever the thread count"; 2^16 amplitudes so a
        // parallel kernel is likely to engage.
        SingleQubitGateBenchmark bench = new SingleQubitGateBenchmark();
        SingleQubitGateBenchmark.Workload one = workload(16, "mid", 1, "dense");
        SingleQubitGateBenchmark.Workload two = workload(16, "mid", 2, "dense");
        StateVector a = bench.applyGate(one);
        StateVector b = bench.applyGate(two);
        for (long i = 0; i < a.dimension(); i++) {
            assertEquals(a.amplitude(i), b.amplitude(i), "index " + i);
        }
    }

    @Test
    void denseGateIsAGenericUnitary() {
        Operator u = Workloads.gate("dense");
        assertTrue(u.isUnitary(1e-12));
        // rz(a) ry(t) rz(b) with rz(l) = diag(e^{-il/2}, e^{il/2}) and ry(t) = [[c, -s], [s, c]],
        // c = cos(t/2), s = sin(t/2) (Nielsen & Chuang 2010, eq. 4.5 and Theorem 4.1): entries
        // c e^{-i(a+b)/2}, -s e^{-i(a-b)/2}, s e^{i(a-b)/2}, c e^{i(a+b)/2}; a = 1.1, b = 0.7.
        // Tolerance 1e-14: two 2x2 products of entries below 1 in modulus, a few roundings.
        double c = Math.cos(0.15);
        double s = Math.sin(0.15);
        Complex[][] expected = {
            {Complex.ofPolar(c, -0.9), Complex.ofPolar(s, -0.2).negate()},
            {Complex.ofPolar(s, 0.2), Complex.ofPolar(c, 0.9)},
        };
        for (int r = 0; r < 2; r++) {
            for (int col = 0; col < 2; col++) {
                Complex diff = u.get(r, col).subtract(expected[r][col]);
                assertTrue(diff.abs() < 1e-14, "entry " + r + "," + col + ": " + u.get(r, col)
                    + ", expected " + expected[r][col]);
            }
        }
        for (int r = 0; r < 2; r++) {
            for (int col = 0; col < 2; col++) {
                Complex z = u.get(r, col);
                assertNotEquals(0.0, z.abs(), "entry " + r + "," + col);
                assertNotEquals(0.0, z.getImaginary(), "entry " + r + "," + col);
            }
        }
    }

    @ParameterizedTest
    @CsvSource({"low, 9, 0", "mid, 9, 4", "high, 9, 8", "mid, 1, 0", "mid, 26, 13"})
    void targetNames(String name, int n, int expected) {
        assertEquals(expected, Workloads.target(name, n));
    }

    @Test
    void badNamesAreRefused() {
        IllegalArgumentException gate = assertThrows(IllegalArgumentException.class,
            () -> workload(4, "mid", 1, "swap"));
        assertEquals("gate 'swap' is not known; allowed: dense, h, rx, ry, t, x",
                gate.getMessage());
        IllegalArgumentException target = assertThrows(IllegalArgumentException.class,
            () -> Workloads.target("middle", 4));
        assertEquals("target 'middle' is not known; allowed: low, mid, high", target.getMessage());
    }

    @Test
    void baselineReturnsTheField() {
        SingleQubitGateBenchmark.Light light = new SingleQubitGateBenchmark.Light();
        light.value = 7;
        assertEquals(7, new SingleQubitGateBenchmark().baseline(light));
    }
}
