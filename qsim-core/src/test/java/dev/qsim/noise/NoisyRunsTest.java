package dev.qsim.noise;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Gates;
import dev.qsim.Operator;
import dev.qsim.Simulator;
import dev.qsim.StateVector;
import dev.qsim.Tally;

/** The noise engines, reached through the run facade ({@link Simulator#withNoise}). */
class NoisyRunsTest {
    private static final double TOL = 1e-12;

    private static Simulator noisy(long seed, NoiseModel model) {
        return Simulator.seeded(seed).withNoise(model);
    }

    private static Simulator trajectories(long seed, NoiseModel model) {
        return noisy(seed, model).withEngine(Simulator.Engine.TRAJECTORIES);
    }

    private static Simulator densityMatrix(long seed, NoiseModel model) {
        return noisy(seed, model).withEngine(Simulator.Engine.DENSITY_MATRIX);
    }

    private static Circuit measuredRandom(int n, int gates, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        return NoiseFixtures.randomGates(Circuit.builder(n), n, gates, rng).measure().build();
    }

    /**
     * Checks a tally against exact probabilities: every outcome with p >= 5/N and every
     * one-bit marginal within 4 binomial standard errors, and no outcome of probability 0
     * (binomial standard error sqrt(p(1-p)/N): common practice).
     */
    private static void assertAgrees(double[] p, Tally t, String what) {
        long shots = t.shots();
        int width = t.width();
        for (int i = 0; i < p.length; i++) {
            double f = t.count(i) / (double) shots;
            if (p[i] < 1e-15) {
                assertEquals(0, t.count(i), what + ": outcome " + i + " has probability 0");
            } else if (p[i] >= 5.0 / shots) {
                double se = Math.sqrt(Math.max(0, p[i] * (1 - p[i])) / shots);
                assertEquals(p[i], f, 4 * se, what + ": outcome " + i);
            }
        }
        for (int b = 0; b < width; b++) {
            double pb = 0;
            long cb = 0;
            for (int i = 0; i < p.length; i++) {
                if ((i >>> b & 1) == 1) {
                    pb += p[i];
                    cb += t.count(i);
                }
            }
            double se = Math.sqrt(Math.max(0, pb * (1 - pb)) / shots);
            assertEquals(pb, cb / (double) shots, 4 * se + 1e-12, what + ": bit " + b);
        }
    }

    @Test
    void withoutNoiseBothEnginesAgreeWithTheStateVector() {
        // No channel and no readout error: the noisy engines must reproduce the ideal Born
        // probabilities of the state-vector engine (Nielsen and Chuang 2010, §2.2.3).
        for (long seed = 21; seed <= 23; seed++) {
            int n = 4 + (int) (seed % 3);
            Circuit c = measuredRandom(n, 40, seed);
            double[] ideal = StateVector.zero(n).apply(c.withoutMeasurements()).probabilities();
            double[] exact = densityMatrix(seed, NoiseModel.none()).distribution(c);
            for (int i = 0; i < ideal.length; i++) {
                assertEquals(ideal[i], exact[i], TOL, "seed " + seed);
            }
            Tally t = trajectories(seed, NoiseModel.none()).run(c, 3000);
            assertAgrees(ideal, t, "trajectories without noise, seed " + seed);
            // Identity channels are no noise either.
            NoiseModel off = NoiseModel.builder().afterOneQubitGates(Channel.identity(1))
                    .afterTwoQubitGates(Channel.identity(2)).build();
            assertEquals(trajectories(seed, NoiseModel.none()).run(c, 500),
                    trajectories(seed, off).run(c, 500), "seed " + seed);
            assertTrue(off.isIdeal());
        }
    }

    @Test
    void trajectoriesAgreeWithTheDensityMatrix() {
        // Averaged over trajectories, the Monte Carlo wave-function method reproduces the
        // density-matrix evolution (Dalibard, Castin and Mølmer 1992, Phys. Rev. Lett. 68, 580).
        long[] seeds = {31, 32, 33};
        int[] sizes = {6, 7, 8};
        for (int k = 0; k < seeds.length; k++) {
            Circuit c = measuredRandom(sizes[k], 35, seeds[k]);
            NoiseModel model = NoiseFixtures.richModel();
            double[] exact = noisy(seeds[k], model).withThreads(2).distribution(c);
            double sum = 0;
            for (double x : exact) {
                sum += x;
            }
            assertEquals(1, sum, TOL, "seed " + seeds[k]);
            assertAgrees(exact, trajectories(seeds[k], model).withThreads(2).run(c, 3000),
                    "trajectories, seed " + seeds[k]);
            assertAgrees(exact, densityMatrix(seeds[k], model).withThreads(2).run(c, 3000),
                    "density-matrix tally, seed " + seeds[k]);
        }
    }

    @Test
    void resultsDependOnTheSeedOnlyNotOnThreads() {
        // Reproducibility whatever the thread count (common practice for seeded simulators).
        Circuit c = measuredRandom(5, 30, 41);
        NoiseModel model = NoiseFixtures.richModel();
        Tally one = trajectories(41, model).withThreads(1).run(c, 400);
        Tally two = trajectories(41, model).withThreads(2).run(c, 400);
        Tally three = trajectories(41, model).withThreads(3).run(c, 400);
        assertEquals(one, two);
        assertEquals(one, three);
        assertEquals(densityMatrix(41, model).run(c, 300),
                densityMatrix(41, model).withThreads(1).run(c, 300));
    }

    @Test
    void readoutErrorIsTheConfusionMatrix() {
        // X on qubit 0 and H on qubit 1 give the ideal distribution P(c1 c0) = 1/2 on "01" and
        // "11". Each bit then passes through [[1-e0, e1], [e0, 1-e1]] independently (the
        // confusion-matrix model; Nation et al. 2021, PRX Quantum 2, 040326): exact products.
        double a0 = 0.02;
        double b0 = 0.07;
        double a1 = 0.11;
        double b1 = 0.04;
        NoiseModel model = NoiseModel.builder().readoutError(0, a0, b0).readoutError(1, a1, b1)
                .build();
        Circuit c = Circuit.builder(2).x(0).h(1).measure(0, 0).measure(1, 1).build();
        double[] p = noisy(1, model).distribution(c);
        double c0is1 = 1 - b0;
        double c1is1 = 0.5 * a1 + 0.5 * (1 - b1);
        assertEquals((1 - c0is1) * (1 - c1is1), p[0], 1e-15);
        assertEquals(c0is1 * (1 - c1is1), p[1], 1e-15);
        assertEquals((1 - c0is1) * c1is1, p[2], 1e-15);
        assertEquals(c0is1 * c1is1, p[3], 1e-15);
        // The trajectory engine flips measured bits with the same probabilities.
        assertAgrees(p, trajectories(2, model).run(c, 4000), "readout");
        // A bit that is never written reads 0, and clbits follow the measure targets.
        Circuit wide = Circuit.builder(2, 3).x(0).measure(0, 2).build();
        double[] q = noisy(1, model).distribution(wide);
        assertEquals(1 - b0, q[4], 1e-15);
        assertEquals(b0, q[0], 1e-15);
    }

    @Test
    void resetsAndMidCircuitMeasurements() {
        // Reset returns a qubit to |0> (common practice): X then reset measures 0 for sure.
        Circuit reset = Circuit.builder(2).x(0).h(1).reset(0).reset(1).measure().build();
        DensityMatrix rho = Simulator.seeded(3).densityMatrixAfter(reset);
        assertEquals(1, rho.probabilities()[0], TOL);
        assertEquals(Tally.of(2, java.util.Map.of("00", 50L)),
                trajectories(3, NoiseModel.none()).run(reset, 50));
        // Trajectories run conditioned blocks: copy a random bit by measurement and feedback.
        Circuit copy = Circuit.builder(2).h(0).measure(0, 0)
                .ifBit(0, 1, b -> b.x(1)).measure(1, 1).build();
        Tally t = trajectories(4, NoiseModel.none()).run(copy, 400);
        assertEquals(400, t.count("00") + t.count("11"));
        // The density-matrix engine refuses them, naming what it cannot do.
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> densityMatrix(4, NoiseModel.none()).run(copy, 10));
        assertTrue(e.getMessage().contains("instruction 2"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> Simulator.seeded(4).densityMatrixAfter(copy));
        assertTrue(e.getMessage().contains("c0 == 1"), e.getMessage());
        // An unread measurement in a density matrix is the loss of coherence it causes
        // (Nielsen and Chuang 2010, §2.4.1): H, measure, H leaves the maximally mixed state.
        Circuit after = Circuit.builder(1).h(0).measure(0, 0).h(0).build();
        DensityMatrix mixed = Simulator.seeded(4).densityMatrixAfter(after);
        assertEquals(0.5, mixed.purity(), TOL);
        assertEquals(0.5, mixed.probabilities()[1], TOL);
        // Its register is the one measured bit, 0 or 1 with probability 1/2 each (Born rule).
        assertArrayEquals(new double[] {0.5, 0.5}, Simulator.seeded(4).distribution(after), TOL);
        // With feedback the exact distribution sums the branches; the copy reads 00 or 11.
        assertArrayEquals(new double[] {0.5, 0, 0, 0.5}, Simulator.seeded(4).distribution(copy),
                TOL);
    }

    @Test
    void branchProbabilitiesUseCoherences() {
        // Dephasing in the X basis, Kraus operators |+><+| and |-><-|, on ry(a)|0> picks |->
        // with probability (1 - sin a)/2 (projective measurement, Born rule: Nielsen and Chuang
        // 2010, §2.2.5); H then maps |+> to |0> and |-> to |1>. Weights that ignored the
        // coherences would give 1/2. Checked within 4 binomial standard errors, for the
        // one-qubit path and the two-qubit path (tensor with the identity).
        Complex h = Complex.ofCartesian(0.5, 0);
        Complex mh = h.negate();
        Channel xDephase = Channel.of(Operator.of(new Complex[][] {{h, h}, {h, h}}),
                Operator.of(new Complex[][] {{h, mh}, {mh, h}}));
        double a = Math.PI / 3;
        double want = (1 - Math.sin(a)) / 2;
        int shots = 2000;
        double se = Math.sqrt(want * (1 - want) / shots);
        NoiseModel one = NoiseModel.builder().afterGate(Gate.I, xDephase).build();
        Circuit c = Circuit.builder(3).ry(1, a).x(0).apply(Gates.I, 1).h(1).measure().build();
        Tally t = trajectories(6, one).run(c, shots);
        assertEquals(shots, t.count("001") + t.count("011"), t.toString());
        assertEquals(want, t.count("011") / (double) shots, 4 * se, "seed 6");
        NoiseModel two = NoiseModel.builder()
                .afterGateOn(Gate.UNITARY, Channel.identity(1).tensor(xDephase), 1, 2).build();
        // X on qubit 2 must always read 1: a badly normalised branch would lose it.
        Circuit d = Circuit.builder(3).ry(1, a).apply(Operator.identity(2), 1, 2).h(1).x(2)
                .measure().build();
        Tally u = trajectories(7, two).run(d, shots);
        assertEquals(shots, u.count("100") + u.count("110"), u.toString());
        assertEquals(want, u.count("110") / (double) shots, 4 * se, "seed 7");
    }

    @Test
    void rulesResolveFromSpecificToGeneral() {
        // The documented order of NoiseModel (our own specification).
        Channel named = Channel.bitFlip(0.1);
        Channel namedOn = Channel.bitFlip(0.2);
        Channel countOn = Channel.bitFlip(0.3);
        Channel count = Channel.bitFlip(0.4);
        NoiseModel m = NoiseModel.builder().afterGate("h", named).afterGateOn("h", namedOn, 1)
                .afterOneQubitGatesOn(2, countOn).afterOneQubitGates(count).build();
        Circuit c = Circuit.builder(3).h(1).h(0).x(2).x(0).cnot(0, 1).build();
        assertSame(namedOn, m.channelAfter(c.instructions().get(0)));
        assertSame(named, m.channelAfter(c.instructions().get(1)));
        assertSame(countOn, m.channelAfter(c.instructions().get(2)));
        assertSame(count, m.channelAfter(c.instructions().get(3)));
        assertNull(m.channelAfter(c.instructions().get(4)));
        // A named rule whose channel does not fit its gate is refused when it is made.
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> NoiseModel.builder().afterGate("h", Channel.twoQubitDepolarizing(0.1)));
        assertTrue(e.getMessage().contains("2-qubit channel cannot follow gate h"),
                e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseModel.builder().readoutError(0, 1.2, 0));
        assertTrue(e.getMessage().contains("1.2"), e.getMessage());
        Circuit h = Circuit.builder(2).h(0).measure().build();
        e = assertThrows(IllegalArgumentException.class,
                () -> trajectories(1, NoiseFixtures.richModel()).run(h, 0));
        assertTrue(e.getMessage().contains("0"), e.getMessage());
    }
}
