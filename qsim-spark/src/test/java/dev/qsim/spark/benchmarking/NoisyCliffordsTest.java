package dev.qsim.spark.benchmarking;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.StateVector;
import dev.qsim.noise.Channel;
import dev.qsim.noise.DensityMatrix;
import dev.qsim.noise.NoiseModel;

/**
 * Average gate fidelities of noisy Cliffords against closed forms and against the Choi state
 * run on the density-matrix engine.
 */
class NoisyCliffordsTest {
    private static final TwoQubitCliffords G = TwoQubitCliffords.group();

    /** Noise on qubits 0 and 1 only, so that the reference qubits 2 and 3 stay ideal. */
    private static NoiseModel localNoise() {
        return NoiseModel.builder()
                .afterOneQubitGatesOn(0, Channel.amplitudeDamping(0.02)
                        .then(Channel.depolarizing(0.01)))
                .afterOneQubitGatesOn(1, Channel.phaseDamping(0.03))
                .afterTwoQubitGatesOn(0, 1, Channel.twoQubitDepolarizing(0.04))
                .afterTwoQubitGatesOn(1, 0, Channel.amplitudeDamping(0.05))
                .build();
    }

    @Test
    void depolarizingAfterOneGateHasTheClosedFormFidelity() {
        // A Pauli channel's entanglement fidelity is its probability of no error, F_e = 1 - p,
        // and F_avg = (d F_e + 1) / (d + 1) = 1 - 4p/5 for d = 4 (Nielsen 2002, Phys. Lett. A
        // 303, 249; Nielsen and Chuang 2010, section 9.3).
        double p = 0.03;
        NoiseModel two = NoiseModel.builder().afterTwoQubitGates(
                Channel.twoQubitDepolarizing(p)).build();
        Circuit cnot = Circuit.builder(2).cnot(1, 0).build();
        assertEquals(1 - 4 * p / 5, NoisyCliffords.averageGateFidelity(cnot, two), 1e-14);
        NoiseModel one = NoiseModel.builder().afterOneQubitGates(Channel.depolarizing(p))
                .build();
        Circuit h = Circuit.builder(2).h(1).build();
        assertEquals(1 - 4 * p / 5, NoisyCliffords.averageGateFidelity(h, one), 1e-14);
        assertEquals(1.0, NoisyCliffords.averageGateFidelity(h, NoiseModel.none()), 1e-14);
    }

    @Test
    void fidelityEqualsTheChoiStateOnTheDensityMatrixEngine() {
        // F_e(U† E) = <Phi_U| (E x I)(Phi) |Phi_U> with Phi maximally entangled between the
        // two qubits and two reference qubits (Nielsen and Chuang 2010, section 9.3, the
        // entanglement fidelity with a purification of I/d), computed by qsim's density-matrix
        // engine, which places the noise itself.
        NoiseModel model = localNoise();
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(4);
        for (int t = 0; t < 25; t++) {
            int e = G.sample(rng);
            Circuit c = G.circuit(e);
            Circuit.Builder b = Circuit.builder(4, 0).h(2).h(3).cnot(2, 0).cnot(3, 1);
            for (dev.qsim.Instruction in : c.instructions()) {
                b.gate(in.gate(), in.angles(), in.qubits());
            }
            Circuit choi = b.build();
            DensityMatrix rho = Simulator.seeded(0).withNoise(model).densityMatrixAfter(choi);
            StateVector ideal = StateVector.zero(4).apply(choi);
            double fe = rho.fidelity(ideal);
            assertEquals((4 * fe + 1) / 5, NoisyCliffords.averageGateFidelity(c, model), 1e-12,
                    "element " + e);
        }
    }

    @Test
    void weakDepolarizingNoiseGivesTheSumOfTheGateErrors() {
        // To first order in the error rates the infidelities of composed channels add (common
        // practice; the entanglement fidelity of a composition of Pauli channels is the
        // probability that no error or a cancelling pair occurs), so with Pauli-error
        // probabilities p1 per one-qubit gate and p2 per CNOT the mean error per Clifford is
        // (4/5)(n1 p1 + n2 p2) + O(p^2), n1 and n2 the mean gate counts of the group.
        double p1 = 1e-4;
        double p2 = 1e-3;
        NoiseModel model = NoiseModel.builder().afterOneQubitGates(Channel.depolarizing(p1))
                .afterTwoQubitGates(Channel.twoQubitDepolarizing(p2)).build();
        double[] n = G.meanGateCounts();
        double firstOrder = 0.8 * (n[0] * p1 + n[1] * p2);
        double r = NoisyCliffords.errorPerClifford(model);
        // The second-order terms are below (n1 p1 + n2 p2)^2 ~ 5e-6, under 0.3 % of r.
        assertEquals(firstOrder, r, 0.003 * firstOrder);
        assertTrue(r < firstOrder, "errors compound to less than their sum: " + r);
        assertEquals(0.0, NoisyCliffords.errorPerClifford(NoiseModel.none()), 1e-12);
    }

    @Test
    void wrongCircuitsAreRefused() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> NoisyCliffords.averageGateFidelity(Circuit.builder(3).h(0).build(),
                        NoiseModel.none()));
        assertTrue(e.getMessage().contains("3 qubit(s)"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoisyCliffords.averageGateFidelity(Circuit.builder(2).h(0).measure()
                        .build(), NoiseModel.none()));
        assertTrue(e.getMessage().contains("measurements"), e.getMessage());
    }
}
