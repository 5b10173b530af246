package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.ArrayList;
import java.util.List;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

/**
 * X and single-qubit phase gates are kept in a lazy frame by the engine (see the kernel
 * package's {@code Frame}); every public reader sees the state as if each gate had been
 * applied. Checked against the independent dense-matrix path ({@link DenseReference}: Kronecker
 * products of textbook matrices, Nielsen and Chuang 2010, §4.2) on circuits rich in frame gates,
 * read only at the end and read in between, and against textbook measurement outcomes.
 */
class LazyFrameTest {
    private static final double TOL = 1e-12;
    private static final List<String> FRAME_HEAVY = List.of(
            "x", "x", "y", "z", "s", "sDagger", "t", "tDagger", "rz", "rz", "phase",
            "h", "rx", "cnot", "cz", "cphase", "swap", "rzz", "toffoli", "fredkin", "apply",
            "controlled");

    private static List<DenseReference.Step> frameHeavySteps(int n, int count,
            UniformRandomProvider rng) {
        List<DenseReference.Step> steps = new ArrayList<>();
        while (steps.size() < count) {
            String kind = FRAME_HEAVY.get(rng.nextInt(FRAME_HEAVY.size()));
            if (DenseReference.minQubits(kind) <= n) {
                steps.add(DenseReference.randomStep(kind, n, rng));
            }
        }
        return steps;
    }

    @Test
    void gateByGateRunsMatchTheDenseReferenceWhetherReadOrNot() {
        final long seed = 4_711L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        for (int trial = 0; trial < 40; trial++) {
            int n = 1 + trial % 7;
            List<DenseReference.Step> steps = frameHeavySteps(n, 20 + rng.nextInt(40), rng);
            double[][] expected = DenseReference.run(n, steps,
                    DenseReference.basisState(1 << n, 0));
            StateVector quiet = StateVector.zero(n);
            StateVector watched = StateVector.zero(n);
            for (int i = 0; i < steps.size(); i++) {
                Circuit one = DenseReference.build(n, steps.subList(i, i + 1));
                quiet.apply(one);
                watched.apply(one);
                if (i % 3 == 0) {
                    // A read settles the frame in the middle of the run.
                    watched.probability(0);
                }
            }
            final int t = trial;
            DenseReference.assertClose(expected, quiet, TOL, () -> "seed " + seed + ", trial "
                    + t + ", read at the end");
            DenseReference.assertClose(expected, watched, TOL, () -> "seed " + seed + ", trial "
                    + t + ", read in between");
        }
    }

    /**
     * 17 qubits, 1 and 2 threads: the same amplitudes to the bit, and the same as the
     * reference for a 6-qubit circuit spread over low, middle and high qubits.
     */
    @Test
    void largeStatesAgreeAcrossThreadCountsToTheBit() {
        final long seed = 2_718L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int[] map = {0, 14, 2, 16, 9, 15};
        List<DenseReference.Step> steps = frameHeavySteps(map.length, 60, rng);
        double[][] expected = DenseReference.run(map.length, steps,
                DenseReference.basisState(1 << map.length, 0));
        Circuit circuit = DenseReference.build(17, steps, map);
        StateVector one = StateVector.zero(17).setThreads(1).apply(circuit);
        StateVector two = StateVector.zero(17).setThreads(2).apply(circuit);
        for (int v = 0; v < (1 << map.length); v++) {
            long index = 0;
            for (int j = 0; j < map.length; j++) {
                index |= (long) ((v >> j) & 1) << map[j];
            }
            Complex a = one.amplitude(index);
            assertEquals(a, two.amplitude(index), "index " + index);
            assertEquals(expected[0][v], a.getReal(), TOL, "index " + index);
            assertEquals(expected[1][v], a.getImaginary(), TOL, "index " + index);
        }
    }

    /**
     * Two threads reading a state with a frame pending, at the same moment, both see the state
     * the gates define: H and CNOT make (|0...0> + |1...1>)/sqrt 2 on qubits 0 and 15, X flips
     * qubit 3, rz(0.3) multiplies by e^(-0.15i) or e^(0.15i) by qubit 15, T leaves qubit 7 at 0
     * alone (textbook definitions; common practice). The frame is applied once.
     */
    @Test
    void concurrentFirstReadsSeeTheSameState() throws Exception {
        int n = 16;
        Circuit c = Circuit.builder(n).h(0).cnot(0, 15).x(3).rz(15, 0.3).t(7).build();
        long low = 1L << 3;
        long high = 1L | (1L << 3) | (1L << 15);
        double r = 1 / Math.sqrt(2);
        java.util.concurrent.ExecutorService pool =
                java.util.concurrent.Executors.newFixedThreadPool(2);
        try {
            for (int trial = 0; trial < 20; trial++) {
                StateVector s = StateVector.zero(n).setThreads(2).apply(c);
                java.util.concurrent.CyclicBarrier start = new java.util.concurrent.CyclicBarrier(
                        2);
                java.util.concurrent.Callable<Complex[]> read = () -> {
                    start.await();
                    return new Complex[] {s.amplitude(low), s.amplitude(high)};
                };
                java.util.concurrent.Future<Complex[]> f1 = pool.submit(read);
                java.util.concurrent.Future<Complex[]> f2 = pool.submit(read);
                for (Complex[] got : new Complex[][] {f1.get(), f2.get()}) {
                    assertEquals(r * Math.cos(0.15), got[0].getReal(), TOL, "trial " + trial);
                    assertEquals(-r * Math.sin(0.15), got[0].getImaginary(), TOL);
                    assertEquals(r * Math.cos(0.15), got[1].getReal(), TOL);
                    assertEquals(r * Math.sin(0.15), got[1].getImaginary(), TOL);
                }
                assertEquals(1.0, s.norm(), TOL);
            }
        } finally {
            pool.shutdownNow();
        }
    }

    /**
     * Measurement, reset and conditions read flipped qubits correctly (X|0> = |1>, and the
     * Born rule; common practice): every shot is determined.
     */
    @Test
    void measurementsResetsAndConditionsSeeFlippedQubits() {
        Circuit c = Circuit.builder(3, 3)
                .x(0).rz(0, 0.4).t(1).x(1).x(1).x(2)
                .measure(0, 0)
                .ifBit(0, 1, b -> b.x(1))
                .reset(2)
                .measure(1, 1).measure(2, 2)
                .build();
        for (boolean fusion : new boolean[] {true, false}) {
            Tally t = Simulator.seeded(5).withFusion(fusion).run(c, 200);
            assertEquals(200, t.count("011"), t.toString());
        }
        StateVector s = StateVector.zero(2).apply(Circuit.builder(2).x(1).s(1).build());
        assertEquals(1, s.measure(1, RandomSource.XO_RO_SHI_RO_128_PP.create(1L)));
        assertEquals(Complex.ofCartesian(0, 1), s.amplitude(2));
    }
}
