package dev.qsim.spark.benchmarking;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

import org.apache.commons.numbers.complex.Complex;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.Operator;
import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;

/**
 * What a noise model predicts for randomized benchmarking of two qubits: the average gate
 * fidelity of each noisy Clifford, and the error per Clifford averaged over the group.
 * Stateless and thread-safe.
 *
 * <p>A two-qubit circuit of gates run under a noise model is the channel
 * {@code E = N_k ∘ G_k ∘ ... ∘ N_1 ∘ G_1}: each gate {@code G_j}, then the channel the model puts
 * after it ({@link NoiseModel#channelAfter(Instruction)}, placed as the engines place it: on the
 * gate's qubits in order, or a one-qubit channel on each of them). Its error against the ideal
 * unitary {@code U} is the channel {@code U† ∘ E}, whose entanglement fidelity is
 * {@code F_e = Tr(S_U† S_E) / d²} with {@code S} the superoperators (the Liouville
 * representation, {@code S_E = Σ_i conj(K_i) ⊗ K_i} for Kraus operators {@code K_i}, so that
 * {@code Tr(S_U† S_E) = Σ_i |tr(U† K_i)|²}; Nielsen and Chuang 2010, §9.3 and §8.2.3), and its
 * average gate fidelity is {@code F_avg = (d F_e + 1) / (d + 1)} (Horodecki, Horodecki and
 * Horodecki 1999, Phys. Rev. A 60, 1888; Nielsen 2002, Phys. Lett. A 303, 249), here with
 * {@code d = 4}.
 *
 * <p>Randomized benchmarking's decay {@code A p^m + B} over sequences of {@code m} random
 * Cliffords estimates the error per Clifford {@code r = (1 - p)(d - 1)/d}, which for noise that
 * does not depend on the gate is the average gate infidelity {@code 1 - F_avg} of the noise
 * (Magesan, Gambetta and Emerson 2011, "Scalable and robust randomized benchmarking of quantum
 * processes", Phys. Rev. Lett. 106, 180504, doi:10.1103/PhysRevLett.106.180504). When each
 * Clifford has its own noise (more gates, more error), {@code r} is to first order the mean of
 * the Cliffords' infidelities: {@code F_avg} is linear in the channel, and the twirl over the
 * group averages the error channels (Magesan et al. 2012, Phys. Rev. A 85, 042311, §IV;
 * Proctor et al. 2017, Phys. Rev. Lett. 119, 130502, on the size of the correction).
 * {@link #errorPerClifford(NoiseModel)} computes that mean over all 11,520 elements of
 * {@link TwoQubitCliffords}, exactly. Readout error is not a gate's error: randomized
 * benchmarking puts it into {@code A} and {@code B}.
 *
 * @since 0.1
 */
public final class NoisyCliffords {
    private static final int D = 4;
    private static final int DD = 16;

    private NoisyCliffords() {
    }

    /**
     * Returns the average gate fidelity of a two-qubit circuit of gates run under a noise
     * model, against its ideal unitary.
     *
     * @param circuit a circuit of gates on 2 qubits (no measurement, reset or condition)
     * @param model the noise model
     * @return {@code F_avg}, in [0, 1] up to rounding
     * @throws IllegalArgumentException if the circuit is not two qubits of gates only, or a
     *     noise rule's channel does not fit its gate
     */
    public static double averageGateFidelity(Circuit circuit, NoiseModel model) {
        Objects.requireNonNull(circuit, "circuit");
        Objects.requireNonNull(model, "model");
        return fidelity(circuit, model, new HashMap<>());
    }

    /**
     * Returns the error per Clifford the noise model predicts: the mean over the 11,520
     * two-qubit Cliffords of {@link TwoQubitCliffords} of {@code 1 - F_avg} of each one's noisy
     * channel (about 2 s).
     *
     * @param model the noise model
     * @return the predicted error per Clifford
     * @throws IllegalArgumentException if a noise rule's channel does not fit its gate
     */
    public static double errorPerClifford(NoiseModel model) {
        Objects.requireNonNull(model, "model");
        TwoQubitCliffords group = TwoQubitCliffords.group();
        Map<Instruction, double[]> cache = new HashMap<>();
        double sum = 0;
        for (int e = 0; e < TwoQubitCliffords.SIZE; e++) {
            sum += 1 - fidelity(group.circuit(e), model, cache);
        }
        return sum / TwoQubitCliffords.SIZE;
    }

    private static double fidelity(Circuit circuit, NoiseModel model,
            Map<Instruction, double[]> cache) {
        if (circuit.qubits() != 2 || !circuit.isGatesOnly()) {
            throw new IllegalArgumentException("the circuit must be gates on 2 qubits but has "
                    + circuit.qubits() + " qubit(s)" + (circuit.isGatesOnly() ? ""
                    : " and measurements, resets or conditions"));
        }
        double[] s = identity();
        for (Instruction in : circuit.instructions()) {
            double[] step = cache.get(in);
            if (step == null) {
                step = step(in, model);
                cache.put(in, step);
            }
            s = times(step, s);
        }
        double[] u = superoperator(List.of(embed(circuit.toOperator(), new int[] {0, 1})));
        double tr = 0;
        for (int a = 0; a < DD * DD; a++) {
            // Re(conj(S_U) S): the imaginary part of the trace is zero.
            tr += u[2 * a] * s[2 * a] + u[2 * a + 1] * s[2 * a + 1];
        }
        double fe = tr / (D * D);
        return (D * fe + 1) / (D + 1);
    }

    /** The superoperator of one gate followed by its noise. */
    private static double[] step(Instruction in, NoiseModel model) {
        int[] qs = in.qubits();
        Operator gate = Circuit.builder(2, 0).gate(in.gate(), in.angles(), qs).build()
                .toOperator();
        double[] s = superoperator(List.of(embed(gate, new int[] {0, 1})));
        Channel c = model.channelAfter(in);
        if (c == null || c.isIdentity()) {
            return s;
        }
        if (c.qubits() == qs.length) {
            return times(channel(c, qs), s);
        }
        if (c.qubits() != 1) {
            throw new IllegalArgumentException("the " + c.qubits() + "-qubit channel for gate '"
                    + in.name() + "' cannot follow it on " + qs.length + " qubit(s)");
        }
        for (int q : qs) {
            s = times(channel(c, new int[] {q}), s);
        }
        return s;
    }

    private static double[] channel(Channel c, int[] qubits) {
        List<Operator> kraus = c.kraus();
        double[][] k = new double[kraus.size()][];
        for (int i = 0; i < k.length; i++) {
            k[i] = embed(kraus.get(i), qubits);
        }
        return superoperator(List.of(k));
    }

    /**
     * An operator on the given qubits as a 4 x 4 matrix on qubits 0 and 1: bit {@code j} of
     * the operator's index is qubit {@code qubits[j]} (the package conventions of qsim).
     */
    static double[] embed(Operator op, int[] qubits) {
        double[] m = new double[2 * DD];
        for (int r = 0; r < D; r++) {
            for (int c = 0; c < D; c++) {
                int rest = ~0;
                int sr = 0;
                int sc = 0;
                for (int j = 0; j < qubits.length; j++) {
                    sr |= ((r >> qubits[j]) & 1) << j;
                    sc |= ((c >> qubits[j]) & 1) << j;
                    rest &= ~(1 << qubits[j]);
                }
                if ((r & rest & 3) != (c & rest & 3)) {
                    continue;
                }
                Complex z = op.get(sr, sc);
                m[2 * (D * r + c)] = z.getReal();
                m[2 * (D * r + c) + 1] = z.getImaginary();
            }
        }
        return m;
    }

    /**
     * {@code S[(i + 4j), (k + 4l)] = Σ K[i][k] conj(K[j][l])}: the column-stacking superoperator
     * of {@code rho -> Σ K rho K†}.
     */
    private static double[] superoperator(List<double[]> kraus) {
        double[] s = new double[2 * DD * DD];
        for (double[] k : kraus) {
            for (int i = 0; i < D; i++) {
                for (int j = 0; j < D; j++) {
                    for (int kk = 0; kk < D; kk++) {
                        double ar = k[2 * (D * i + kk)];
                        double ai = k[2 * (D * i + kk) + 1];
                        if (ar == 0 && ai == 0) {
                            continue;
                        }
                        for (int l = 0; l < D; l++) {
                            double br = k[2 * (D * j + l)];
                            double bi = -k[2 * (D * j + l) + 1];
                            int at = 2 * ((i + D * j) * DD + (kk + D * l));
                            s[at] += ar * br - ai * bi;
                            s[at + 1] += ar * bi + ai * br;
                        }
                    }
                }
            }
        }
        return s;
    }

    private static double[] identity() {
        double[] s = new double[2 * DD * DD];
        for (int a = 0; a < DD; a++) {
            s[2 * (a * DD + a)] = 1;
        }
        return s;
    }

    /** The 16 x 16 complex product {@code a b}. */
    private static double[] times(double[] a, double[] b) {
        double[] m = new double[2 * DD * DD];
        for (int r = 0; r < DD; r++) {
            for (int k = 0; k < DD; k++) {
                double ar = a[2 * (r * DD + k)];
                double ai = a[2 * (r * DD + k) + 1];
                if (ar == 0 && ai == 0) {
                    continue;
                }
                for (int c = 0; c < DD; c++) {
                    double br = b[2 * (k * DD + c)];
                    double bi = b[2 * (k * DD + c) + 1];
                    m[2 * (r * DD + c)] += ar * br - ai * bi;
                    m[2 * (r * DD + c) + 1] += ar * bi + ai * br;
                }
            }
        }
        return m;
    }
}
