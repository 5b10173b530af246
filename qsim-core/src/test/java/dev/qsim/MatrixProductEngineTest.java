package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.statistics.inference.ChiSquareTest;
import org.junit.jupiter.api.Test;

import dev.qsim.mps.MatrixProductState;
import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;
import dev.qsim.observable.Observable;

/**
 * The matrix-product engine through the run facade: chosen by {@link Simulator.Engine#CHEAPEST}
 * for non-Clifford circuits too wide for a state vector, shots at the end, mid-circuit
 * measurement, reset and classical control through the shared interpreter, and the settings.
 */
class MatrixProductEngineTest {
    private static final Simulator MPS = Simulator.seeded(7).withEngine(
            Simulator.Engine.MATRIX_PRODUCT);

    @Test
    void cheapestRunsWideNonCliffordCircuitsOnTheMatrixProductState() {
        // 41 qubits: more than a state vector may hold. A GHZ chain with a T on qubit 0 before
        // the chain reads all zeros or all ones, half each (T only adds a phase to |1>:
        // Nielsen and Chuang 2010, §4.2); chi-square at 1e-3 (Commons Statistics).
        int n = 41;
        Circuit.Builder b = Circuit.builder(n).h(0).t(0);
        for (int q = 1; q < n; q++) {
            b.cnot(q - 1, q);
        }
        Circuit c = b.measure().build();
        Simulator sim = Simulator.seeded(3);
        Simulator.Choice choice = sim.explain(c, 1000);
        assertSame(Simulator.Engine.MATRIX_PRODUCT, choice.engine());
        assertTrue(choice.reason().contains("instruction 1 (t") && choice.reason()
                .contains("at most 40 qubits, not 41") && choice.reason().contains("bond limit"),
                choice.reason());
        Tally t = sim.run(c, 1000);
        long zeros = t.count("0".repeat(n));
        long ones = t.count("1".repeat(n));
        assertEquals(1000, zeros + ones, t.toString());
        double p = ChiSquareTest.withDefaults().test(new double[] {0.5, 0.5},
                new long[] {zeros, ones}).getPValue();
        assertTrue(p > 1e-3, "p = " + p);
        // 36 qubits fit a state vector's limit but not the test heap (2^36 x 16 bytes = 1 TiB).
        Simulator.Choice heap = sim.explain(Circuit.builder(36).t(0).build(), 1);
        assertSame(Simulator.Engine.MATRIX_PRODUCT, heap.engine());
        assertTrue(heap.reason().contains("needs 1024 GiB") && heap.reason()
                .contains("maximum heap"), heap.reason());
        // Clifford circuits that wide still go to the tableau, small ones to the state vector.
        assertSame(Simulator.Engine.TABLEAU, sim.explain(Circuit.builder(41).h(0).build(), 1)
                .engine());
        assertSame(Simulator.Engine.AMPLITUDES, sim.explain(Circuit.builder(20).t(0).build(), 1)
                .engine());
    }

    @Test
    void teleportationRunsShotByShot() {
        // Teleportation (Nielsen and Chuang 2010, §1.3.7): qubit 0's state ry(θ)|0> arrives on
        // qubit 2 whatever the two measured bits, after the corrections X^m1 Z^m0. So each
        // shot's final state has <Z2> = cos θ, and qubit 2 reads 1 with probability
        // sin²(θ/2); binomial check at 4 standard errors (common practice).
        double theta = 1.1;
        Circuit c = Circuit.builder(3).ry(0, theta).h(1).cnot(1, 2).cnot(0, 1).h(0)
                .measure(0, 0).measure(1, 1)
                .ifBit(1, 1, x -> x.x(2)).ifBit(0, 1, z -> z.z(2))
                .measure(2, 2).build();
        for (long seed = 0; seed < 6; seed++) {
            MatrixProductState s = Simulator.seeded(seed).matrixProductStateAfter(
                    Circuit.builder(3).ry(0, theta).h(1).cnot(1, 2).cnot(0, 1).h(0)
                            .measure(0, 0).measure(1, 1)
                            .ifBit(1, 1, x -> x.x(2)).ifBit(0, 1, z -> z.z(2)).build());
            assertEquals(Math.cos(theta), s.expectation(Observable.of(1, "Z2")), 1e-12,
                    "seed " + seed);
        }
        int shots = 4000;
        Tally t = MPS.run(c, shots);
        long ones = 0;
        for (var e : t.outcomes().entrySet()) {
            if (e.getKey().charAt(0) == '1') {
                ones += e.getValue();
            }
        }
        double p = Math.pow(Math.sin(theta / 2), 2);
        assertEquals(p, ones / (double) shots, 4 * Math.sqrt(p * (1 - p) / shots), t.toString());
        assertEquals(t, MPS.withThreads(1).run(c, shots), "same seed, same tally");
    }

    @Test
    void resetsAndGatesWithMeasuredAnglesRun() {
        // A reset leaves |0> (Nielsen and Chuang 2010, §2.2.3 then X); ry(π·c0) after measuring
        // |1> into c0 turns qubit 1 to |1>: cos(π/2) amplitude 0 on |0>.
        Expression angle = Expression.of(Expression.Op.MUL, Expression.constant(Math.PI),
                Expression.clbit(0));
        Circuit c = Circuit.builder(3).x(0).h(2).measure(0, 0).reset(0)
                .gate(Gate.RY, new Expression[] {angle}, 1)
                .measure(0, 2).measure(1, 1).build();
        Tally t = MPS.run(c, 200);
        assertEquals(200, t.count("011"), t.toString());
    }

    @Test
    void stateAfterAndSettings() {
        Circuit c = Circuit.builder(5).h(0).t(0).cnot(0, 3).rx(4, 0.3).cphase(4, 1, 0.8)
                .toffoli(0, 4, 2).build();
        StateVector exact = StateVector.zero(5).apply(c);
        assertEquals(1, MPS.stateAfter(c).fidelity(exact), 1e-12);
        assertEquals(1, MPS.withPrecision(Precision.SINGLE).stateAfter(c).fidelity(exact), 1e-6);
        Simulator tight = MPS.withBondLimit(1).withTruncation(0.25);
        assertEquals(1, tight.bondLimit());
        assertEquals(0.25, tight.truncation());
        assertTrue(tight.toString().contains("bond limit 1, truncation 0.25"), tight.toString());
        MatrixProductState s = tight.matrixProductStateAfter(c);
        assertEquals(1, s.maxBondDimension());
        assertEquals(0.25, s.truncation());
        // The product state kept has fidelity at least the bound with the exact state.
        assertTrue(s.toStateVector().fidelity(exact) >= s.fidelityLowerBound() - 1e-12);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> MPS.withBondLimit(0));
        assertTrue(e.getMessage().contains("bond limit") && e.getMessage().contains("0"),
                e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> MPS.withTruncation(-0.5));
        assertTrue(e.getMessage().contains("-0.5"), e.getMessage());
        NoiseModel noise = NoiseModel.builder().afterOneQubitGates(Channel.depolarizing(0.1))
                .build();
        e = assertThrows(IllegalArgumentException.class,
                () -> MPS.withNoise(noise).matrixProductStateAfter(c));
        assertTrue(e.getMessage().contains("noise"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> MPS.withNoise(noise).stateAfter(c));
        assertTrue(e.getMessage().contains("ideal"), e.getMessage());
    }
}
