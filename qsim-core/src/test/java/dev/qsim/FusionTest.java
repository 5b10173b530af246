package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

/**
 * Gate fusion and cache blocking change how gates are applied, never what they do: fused and
 * unfused runs agree with the independent dense-matrix path (Kronecker products of textbook
 * matrices, {@link DenseReference}; Nielsen and Chuang 2010, §4.2) to 1e-12 per amplitude.
 */
class FusionTest {
    private static final double TOL = 1e-12;

    @Test
    void fusedAndUnfusedRunsMatchTheDenseReference() {
        final long seed = 8_128L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        for (int trial = 0; trial < 40; trial++) {
            int n = 1 + trial % 8;
            List<DenseReference.Step> steps = DenseReference.randomSteps(n, 10 + rng.nextInt(40),
                    rng);
            Circuit circuit = DenseReference.build(n, steps);
            double[][] expected = DenseReference.run(n, steps,
                    DenseReference.basisState(1 << n, 0));
            for (boolean fusion : new boolean[] {true, false}) {
                // Small states: apply the fused list directly (Simulator fuses from 16 qubits).
                StateVector actual = StateVector.zero(n);
                List<Instruction> program = fusion ? Fusion.fuse(circuit.instructions())
                        : circuit.instructions();
                AmplitudeEngine.gates(actual.store(), program, 0, program.size(), 1);
                final int t = trial;
                DenseReference.assertClose(expected, actual, TOL, () -> "seed " + seed
                        + ", trial " + t + ", fusion " + fusion + ", " + steps.size() + " gates");
            }
        }
    }

    /**
     * 17-qubit states, above the 2^14-amplitude cache block, so consecutive low-qubit gates are
     * applied block by block: a 6-qubit reference circuit placed on low and high qubits.
     */
    @Test
    void cacheBlockedAndFusedLargeStatesMatchTheReference() {
        final long seed = 1_618L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int physical = 17;
        int[][] maps = {{0, 1, 2, 3, 4, 5}, {0, 13, 2, 16, 7, 14}, {12, 11, 10, 9, 15, 1}};
        for (int[] map : maps) {
            int n = map.length;
            List<DenseReference.Step> steps = DenseReference.randomSteps(n, 40, rng);
            double[][] expected = DenseReference.run(n, steps,
                    DenseReference.basisState(1 << n, 0));
            Circuit circuit = DenseReference.build(physical, steps, map);
            StateVector blocked = StateVector.zero(physical).apply(circuit);
            StateVector fused = Simulator.seeded(3).withThreads(2).stateAfter(circuit);
            for (StateVector actual : new StateVector[] {blocked, fused}) {
                double worst = 0;
                for (int v = 0; v < (1 << n); v++) {
                    long index = 0;
                    for (int j = 0; j < n; j++) {
                        index |= (long) ((v >> j) & 1) << map[j];
                    }
                    Complex a = actual.amplitude(index);
                    worst = Math.max(worst, Math.hypot(a.getReal() - expected[0][v],
                            a.getImaginary() - expected[1][v]));
                }
                assertTrue(worst <= TOL, "seed " + seed + ", map " + java.util.Arrays.toString(map)
                        + ": max amplitude distance " + worst);
                assertEquals(1.0, actual.norm(), TOL);
            }
        }
    }

    @Test
    void fusionMergesRunsIntoFewerPasses() {
        // Three rotations on each qubit become one 2x2 operator per qubit.
        Circuit.Builder single = Circuit.builder(8);
        for (int q = 0; q < 8; q++) {
            single.rx(q, 0.3).ry(q, 0.1 * q).rz(q, 0.7);
        }
        assertEquals(8, Fusion.fuse(single.build().instructions()).size());
        // Layers of rotations and a CZ ladder: fewer passes than gates.
        Circuit.Builder b = Circuit.builder(8);
        for (int layer = 0; layer < 4; layer++) {
            for (int q = 0; q < 8; q++) {
                b.ry(q, 0.1 * (q + layer)).rz(q, 0.2 * q);
            }
            for (int q = 0; q + 1 < 8; q++) {
                b.cz(q, q + 1);
            }
        }
        Circuit c = b.build();
        List<Instruction> fused = Fusion.fuse(c.instructions());
        assertTrue(fused.size() * 3 <= c.size() * 2, fused.size() + " of " + c.size());
        for (Instruction in : fused) {
            assertTrue(in.targets().length <= Fusion.MAX_QUBITS);
            assertTrue(in.operator().isUnitary(1e-12), "a product of unitaries is unitary");
        }
    }

    @Test
    void fusedResultsDoNotDependOnTheThreadCount() {
        Circuit.Builder b = Circuit.builder(16);
        for (int q = 0; q < 16; q++) {
            b.h(q).rz(q, 0.3 * q).ry(q, 0.1);
        }
        for (int q = 0; q + 1 < 16; q++) {
            b.cnot(q, q + 1).rzz(q, (q + 5) % 16, 0.2);
        }
        Circuit c = b.measure().build();
        StateVector one = Simulator.seeded(9).withThreads(1).stateAfter(c);
        StateVector two = Simulator.seeded(9).withThreads(2).stateAfter(c);
        for (long i = 0; i < one.dimension(); i++) {
            assertEquals(one.amplitude(i), two.amplitude(i), "amplitude " + i);
        }
        assertEquals(Simulator.seeded(9).withThreads(1).run(c, 500),
                Simulator.seeded(9).withThreads(2).run(c, 500));
    }
}
