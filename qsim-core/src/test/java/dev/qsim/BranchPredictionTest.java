package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

import dev.qsim.internal.Bridge;
import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;

/** Exact predictions of circuits that use measured values during the shot. */
class BranchPredictionTest {
    private static final double TOL = 1e-12;

    /** Teleports ry(theta)|0> from qubit 0 to qubit 2 and measures it into clbit 2. */
    static Circuit teleport(double theta) {
        return Circuit.builder(3).ry(0, theta).h(1).cnot(1, 2).cnot(0, 1).h(0)
                .measure(0, 0).measure(1, 1)
                .ifBit(1, 1, b -> b.x(2)).ifBit(0, 1, b -> b.z(2))
                .measure(2, 2).build();
    }

    @Test
    void teleportationDeliversTheStateWhateverTheCorrections() {
        // Nielsen and Chuang 2010, §1.3.7: after the corrections qubit 2 holds ry(θ)|0>, so it
        // reads 1 with probability sin²(θ/2); the two measured bits are uniform and
        // independent of it.
        double theta = 1.1;
        double p1 = Math.pow(Math.sin(theta / 2), 2);
        double[] p = Simulator.seeded(1).distribution(teleport(theta));
        for (int v = 0; v < 8; v++) {
            double want = 0.25 * ((v >> 2) == 1 ? p1 : 1 - p1);
            assertEquals(want, p[v], TOL, "register " + v);
        }
    }

    @Test
    void resetAndOverwrittenBitsFollowTheShot() {
        // X, measure into c0 (reads 1), reset (common practice: back to |0>), measure into c1
        // (reads 0), then measure again into c0: the register ends "00".
        Circuit c = Circuit.builder(1, 2).x(0).measure(0, 0).reset(0).measure(0, 1)
                .measure(0, 0).build();
        assertFalse(c.measuresAtEnd());
        double[] p = Simulator.seeded(1).distribution(c);
        assertEquals(1.0, p[0], TOL);
    }

    @Test
    void conditionsReadTheRecordedBitWithItsReadoutError() {
        // H on qubit 0, measured into c0 with readout error (P(1|0) = e0, P(0|1) = e1); X on
        // qubit 1 when c0 reads 1; qubit 1 measured into c1 without error. The condition sees
        // the recorded bit, so c1 = c0 always, and c0 reads 1 with probability
        // (1 - e1)/2 + e0/2 (confusion-matrix model, Nation et al. 2021, PRX Quantum 2, 040326).
        double e0 = 0.04;
        double e1 = 0.09;
        NoiseModel model = NoiseModel.builder().readoutError(0, e0, e1).build();
        Circuit c = Circuit.builder(2).h(0).measure(0, 0).ifBit(0, 1, b -> b.x(1))
                .measure(1, 1).build();
        double[] p = Simulator.seeded(1).withNoise(model).distribution(c);
        double read1 = 0.5 * (1 - e1) + 0.5 * e0;
        assertEquals(1 - read1, p[0], TOL);
        assertEquals(read1, p[3], TOL);
        assertEquals(0, p[1] + p[2], TOL);
    }

    @Test
    void pureBranchesAndDensityMatrixBranchesAgree() {
        // Two independent exact methods: one pure state per measurement history, and one
        // density matrix per register value (Nielsen and Chuang 2010, §2.4.1: a measured
        // ensemble is the sum of its branches).
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(77);
        for (int trial = 0; trial < 12; trial++) {
            int n = 2 + rng.nextInt(4);
            int nc = 1 + rng.nextInt(3);
            Circuit.Builder b = Circuit.builder(n, nc);
            for (int k = 0; k < 14; k++) {
                int q = rng.nextInt(n);
                switch (rng.nextInt(7)) {
                    case 0:
                        b.ry(q, rng.nextDouble() * 3);
                        break;
                    case 1:
                        b.h(q);
                        break;
                    case 2:
                        if (n > 1) {
                            b.cnot(q, (q + 1) % n);
                        }
                        break;
                    case 3:
                        b.measure(q, rng.nextInt(nc));
                        break;
                    case 4:
                        b.reset(q);
                        break;
                    case 5:
                        int t = (q + 1) % n;
                        double a = rng.nextDouble() * 3;
                        b.ifBit(rng.nextInt(nc), rng.nextInt(2), body -> body.rx(t, a));
                        break;
                    default:
                        b.t(q);
                        break;
                }
            }
            Circuit c = b.measure(0, 0).build();
            double[] pure = BranchEngine.distribution(c, 1, 1L << 26);
            double[] mixed = Bridge.noise().branchDistribution(c, NoiseModel.none(), 1,
                    1L << 26);
            for (int v = 0; v < pure.length; v++) {
                assertEquals(mixed[v], pure[v], TOL, "trial " + trial + " register " + v);
            }
        }
    }

    @Test
    void predictionsSayWhetherTheyAreExact() {
        Simulator.Prediction exact = Simulator.seeded(1).predict(teleport(0.4), 100);
        assertTrue(exact.exact(), exact.method());
        // 16 qubits with noise and a condition: too large for a density matrix per register
        // value, so the prediction samples trajectories and says how many.
        Circuit.Builder b = Circuit.builder(16).h(0).measure(0, 0).ifBit(0, 1, x -> x.x(15));
        Circuit wide = b.measure().build();
        NoiseModel noise = NoiseModel.builder().afterOneQubitGates(Channel.depolarizing(0.01))
                .build();
        Simulator.Prediction sampled = Simulator.seeded(1).withNoise(noise).predict(wide, 400);
        assertFalse(sampled.exact());
        assertEquals(400, sampled.samples());
        double sum = 0;
        for (double x : sampled.probabilities()) {
            sum += x;
        }
        assertEquals(1, sum, 1e-12);
        assertTrue(sampled.method().contains("TRAJECTORIES"), sampled.method());
    }
}
