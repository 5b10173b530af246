package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

import dev.qsim.internal.Bridge;
import dev.qsim.kernel.Amplitudes;

/**
 * Single-precision storage: amplitudes are rounded to {@code float} (IEEE 754-2019, binary32,
 * unit roundoff 2^-24 ≈ 6e-8) once per run of gates, so results must agree with the independent
 * dense-matrix path ({@link DenseReference}, Nielsen and Chuang 2010, §4.2) to 1e-5 per
 * amplitude, fused or not, whatever the thread count and chunk layout.
 */
class SinglePrecisionTest {
    private static final double TOL = 1e-5;

    private static StateVector single(int n) {
        return StateVector.zero(n, Precision.SINGLE);
    }

    @Test
    void randomCircuitsMatchTheDenseReferenceFusedAndUnfused() {
        final long seed = 27_182L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        for (int trial = 0; trial < 40; trial++) {
            int n = 1 + trial % 8;
            List<DenseReference.Step> steps = DenseReference.randomSteps(n, 10 + rng.nextInt(40),
                    rng);
            Circuit circuit = DenseReference.build(n, steps);
            double[][] expected = DenseReference.run(n, steps,
                    DenseReference.basisState(1 << n, 0));
            for (boolean fusion : new boolean[] {true, false}) {
                List<Instruction> program = fusion ? Fusion.fuse(circuit.instructions())
                        : circuit.instructions();
                // Whole program at once (one window), and gate by gate (rounded every gate).
                StateVector whole = single(n);
                AmplitudeEngine.gates(whole.store(), program, 0, program.size(), 1);
                StateVector each = single(n);
                for (Instruction in : program) {
                    AmplitudeEngine.gates(each.store(), List.of(in), 0, 1, 1);
                }
                final int t = trial;
                for (StateVector actual : new StateVector[] {whole, each}) {
                    assertEquals(Precision.SINGLE, actual.precision());
                    DenseReference.assertClose(expected, actual, TOL, () -> "seed " + seed
                            + ", trial " + t + ", fusion " + fusion + ", " + steps.size()
                            + " gates");
                }
            }
        }
    }

    /**
     * 17 and 19 qubits, above one 2^14-amplitude window, so gates on high qubits are gathered
     * into windows and controls outside a window select windows: a 6-qubit reference circuit is
     * placed on low and high qubits.
     */
    @Test
    void largeStatesMatchTheReferenceThroughWindows() {
        final long seed = 31_415L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int[][] maps = {{0, 1, 2, 3, 4, 5}, {0, 13, 2, 16, 7, 14}, {12, 11, 10, 9, 15, 1},
            {18, 17, 16, 15, 14, 13}};
        for (int[] map : maps) {
            int physical = map[0] == 18 ? 19 : 17;
            int n = map.length;
            List<DenseReference.Step> steps = DenseReference.randomSteps(n, 40, rng);
            double[][] expected = DenseReference.run(n, steps,
                    DenseReference.basisState(1 << n, 0));
            Circuit circuit = DenseReference.build(physical, steps, map);
            StateVector plain = single(physical).setThreads(2).apply(circuit);
            StateVector fused = Simulator.seeded(3).withThreads(2)
                    .withPrecision(Precision.SINGLE).stateAfter(circuit);
            StateVector oneThread = single(physical).setThreads(1).apply(circuit);
            for (StateVector actual : new StateVector[] {plain, fused}) {
                assertEquals(Precision.SINGLE, actual.precision());
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
                assertTrue(worst <= TOL, "seed " + seed + ", map "
                        + java.util.Arrays.toString(map) + ": max amplitude distance " + worst);
                assertEquals(1.0, actual.norm(), TOL);
            }
            // Windows are disjoint: the thread count cannot change a bit.
            for (long i = 0; i < plain.dimension(); i++) {
                assertEquals(oneThread.amplitude(i), plain.amplitude(i), "amplitude " + i);
            }
        }
    }

    @Test
    void smallChunksAndManyControlsGiveTheSameState() {
        // Chunks of 2^3 amplitudes force short runs; a gate with controls on both sides of the
        // window tests windows skipped by an outer control. Reference: the same circuit in
        // double precision with default chunks (itself checked against DenseReference above).
        Circuit.Builder b = Circuit.builder(9);
        for (int q = 0; q < 9; q++) {
            b.h(q).rz(q, 0.1 + q).ry(q, 0.3 * q);
        }
        b.controlled(Gates.ry(0.7), new int[] {0, 8, 5}, 3).toffoli(8, 1, 6).swap(0, 8)
                .cphase(2, 7, 0.4).rzz(1, 8, 1.1);
        Circuit c = b.build();
        StateVector reference = StateVector.zero(9).apply(c);
        Amplitudes small = Amplitudes.allocateSingle(9, 3);
        small.set(0, 1, 0);
        StateVector chunked = Bridge.states().wrap(small, 1).apply(c);
        assertEquals(Precision.SINGLE, chunked.precision());
        for (long i = 0; i < 512; i++) {
            Complex d = chunked.amplitude(i).subtract(reference.amplitude(i));
            assertTrue(d.abs() <= TOL, "amplitude " + i + " off by " + d.abs());
        }
    }

    @Test
    void readingsAgreeWithDoublePrecision() {
        Circuit.Builder b = Circuit.builder(17);
        for (int q = 0; q < 17; q++) {
            b.h(q).ry(q, 0.05 * q).rz(q, 0.2);
        }
        for (int q = 0; q + 1 < 17; q++) {
            b.cnot(q, q + 1);
        }
        Circuit c = b.build();
        StateVector d = StateVector.zero(17).apply(c);
        StateVector s = single(17).apply(c);
        assertEquals(1.0, s.norm(), 1e-6);
        double[] pd = d.probabilities();
        double[] ps = s.probabilities();
        for (int i = 0; i < pd.length; i++) {
            assertEquals(pd[i], ps[i], 1e-7, "probability " + i);
        }
        double[] md = d.marginal(16, 3, 0);
        double[] ms = s.marginal(16, 3, 0);
        for (int i = 0; i < md.length; i++) {
            assertEquals(md[i], ms[i], 1e-6, "marginal " + i);
        }
        assertEquals(1.0, s.fidelity(d), 1e-6);
        assertEquals(1.0, d.fidelity(s), 1e-6);
        assertEquals(1.0, s.toPrecision(Precision.DOUBLE).fidelity(d), 1e-6);
        // Shots from the two precisions follow the same law: compare with a loose chi-square
        // bound on the 3-qubit marginal (10,000 shots, 7 df; 24.3 is the 0.999 quantile,
        // handbook table, from memory; checked in TallyComparisonTest's sources).
        Tally t = s.sample(10_000, RandomSource.XO_RO_SHI_RO_128_PP.create(5), 16, 3, 0);
        double chi = 0;
        for (int k = 0; k < 8; k++) {
            double e = 10_000 * md[k];
            double o = t.count(k);
            chi += (o - e) * (o - e) / e;
        }
        assertTrue(chi < 24.3, "chi-square " + chi);
    }

    @Test
    void measurementResetAndConditionsRunInSinglePrecision() {
        // Teleportation-style feed-forward: qubit 2 ends in the state prepared on qubit 0
        // (Nielsen and Chuang 2010, §1.3.7), so its marginal is cos²(0.6/2), sin²(0.6/2).
        Circuit c = Circuit.builder(3, 2)
                .ry(0, 0.6).h(1).cnot(1, 2).cnot(0, 1).h(0)
                .measure(0, 0).measure(1, 1)
                .ifBit(1, 1, body -> body.x(2)).ifBit(0, 1, body -> body.z(2))
                .build();
        for (long seed = 1; seed <= 20; seed++) {
            StateVector s = Simulator.seeded(seed).withPrecision(Precision.SINGLE).stateAfter(c);
            assertEquals(Precision.SINGLE, s.precision());
            double[] m = s.marginal(2);
            assertEquals(Math.cos(0.3) * Math.cos(0.3), m[0], 1e-6, "seed " + seed);
            assertEquals(1.0, s.norm(), 1e-6);
        }
        Circuit r = Circuit.builder(2, 1).h(0).cnot(0, 1).reset(0).measure(1, 0).build();
        Tally t = Simulator.seeded(4).withPrecision(Precision.SINGLE).run(r, 2000);
        assertEquals(2000, t.shots());
        assertTrue(t.count(0) > 850 && t.count(1) > 850, t.toString());
    }

    @Test
    void singleHalvesTheMemoryAndConvertsBothWays() {
        assertEquals(8, Precision.SINGLE.bytesPerAmplitude());
        assertEquals(16, Precision.DOUBLE.bytesPerAmplitude());
        StateVector s = single(3).apply(Circuit.builder(3).h(0).t(0).h(1).build());
        StateVector d = s.toPrecision(Precision.DOUBLE);
        assertEquals(Precision.DOUBLE, d.precision());
        StateVector back = d.toPrecision(Precision.SINGLE);
        for (long i = 0; i < 8; i++) {
            // Widening is exact, so narrowing again returns the very same floats.
            assertEquals(s.amplitude(i), d.amplitude(i));
            assertEquals(s.amplitude(i), back.amplitude(i));
        }
        assertEquals(Precision.SINGLE, s.copy().precision());
        assertEquals(Precision.SINGLE, s.tensor(StateVector.zero(1)).precision());
        assertEquals(Precision.DOUBLE, Simulator.seeded(1).precision());
        assertThrows(NullPointerException.class, () -> StateVector.zero(2, null));
        assertThrows(NullPointerException.class, () -> Simulator.seeded(1).withPrecision(null));
        assertThrows(IllegalArgumentException.class, () -> StateVector.zero(0, Precision.SINGLE));
        // 1/sqrt(2) is not a float: single storage really rounds.
        Complex h = single(1).apply(Circuit.builder(1).h(0).build()).amplitude(0);
        assertEquals((float) (1 / Math.sqrt(2)), h.getReal(), 0.0);
        assertNotEquals(1 / Math.sqrt(2), h.getReal());
    }

    @Test
    void observablesAndGradientsReadASingleStateInDouble() {
        StateVector s = single(4).apply(Circuit.builder(4).h(0).cnot(0, 1).ry(2, 0.4).build());
        StateVector d = s.toPrecision(Precision.DOUBLE);
        dev.qsim.observable.Observable zz = dev.qsim.observable.Observable.of(1.5, "Z0 Z1")
                .plus(0.5, "X2");
        assertEquals(dev.qsim.observable.Expectation.of(zz, d),
                dev.qsim.observable.Expectation.of(zz, s), 0.0);
        assertSame(Precision.SINGLE, s.precision());
    }
}
