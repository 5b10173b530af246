package dev.qsim.bench;

import dev.qsim.Gates;
import dev.qsim.Operator;
import dev.qsim.StateVector;
import java.util.List;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

/**
 * The gates, target qubits and states shared by {@link SingleQubitGateBenchmark} and
 * {@link ScalingReport}, so both time the same work.
 */
final class Workloads {
    /** Gate names accepted by {@link #gate(String)}, in the order shown in messages. */
    static final List<String> GATE_NAMES = List.of("dense", "h", "ry", "t", "x");

    /** Target names accepted by {@link #target(String, int)}, in the order shown in messages. */
    static final List<String> TARGET_NAMES = List.of("low", "mid", "high");

    /** Seed of the random single-qubit states whose tensor product is the benchmark state. */
    static final long STATE_SEED = 20_240_611L;

    private Workloads() {
    }

    /**
     * Returns the single-qubit gate of the given name.
     *
     * <ul>
     *   <li>{@code dense}: {@code rz(1.1) ry(0.3) rz(0.7)}, a unitary with four nonzero complex
     *       entries, so no kernel can take a shortcut;</li>
     *   <li>{@code h}: Hadamard; {@code ry}: {@code ry(0.3)} (real dense);</li>
     *   <li>{@code t}: T (diagonal); {@code x}: X (a permutation).</li>
     * </ul>
     *
     * @throws IllegalArgumentException if the name is not one of {@link #GATE_NAMES}
     */
    static Operator gate(String name) {
        switch (name) {
            case "dense":
                return Gates.rz(1.1).times(Gates.ry(0.3)).times(Gates.rz(0.7));
            case "h":
                return Gates.H;
            case "ry":
                return Gates.ry(0.3);
            case "t":
                return Gates.T;
            case "x":
                return Gates.X;
            default:
                throw new IllegalArgumentException("gate '" + name + "' is not known; allowed: "
                        + String.join(", ", GATE_NAMES));
        }
    }

    /**
     * Returns the target qubit of the given name on {@code n} qubits: {@code low} is 0,
     * {@code mid} is {@code n / 2}, {@code high} is {@code n - 1}.
     *
     * @throws IllegalArgumentException if the name is not one of {@link #TARGET_NAMES} or
     *     {@code n < 1}
     */
    static int target(String name, int n) {
        if (n < 1) {
            throw new IllegalArgumentException("qubit count must be at least 1 but was " + n);
        }
        switch (name) {
            case "low":
                return 0;
            case "mid":
                return n / 2;
            case "high":
                return n - 1;
            default:
                throw new IllegalArgumentException("target '" + name + "' is not known; allowed: "
                        + String.join(", ", TARGET_NAMES));
        }
    }

    /**
     * Returns a normalised {@code n}-qubit product state whose amplitudes are all nonzero and
     * complex: qubit {@code k} is {@code rz(b_k) ry(a_k)|0>} with angles drawn from a generator
     * seeded with {@code seed}, angles {@code a_k} in [0.5, 2.5] so no amplitude is tiny.
     * Built by tensor products, so it costs O(2^n) rather than n passes over the state.
     *
     * @throws IllegalStateException from the core if the heap cannot hold the state
     */
    static StateVector productState(int n, long seed) {
        final UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        StateVector state = oneQubit(rng);
        for (int k = 1; k < n; k++) {
            // The new factor takes the high qubit k; the state built so far keeps qubits 0..k-1.
            state = oneQubit(rng).tensor(state);
        }
        return state;
    }

    private static StateVector oneQubit(UniformRandomProvider rng) {
        final double polar = 0.5 + 2.0 * rng.nextDouble();
        final double azimuth = 2.0 * Math.PI * rng.nextDouble();
        return StateVector.zero(1).apply(Gates.ry(polar), 0).apply(Gates.rz(azimuth), 0);
    }
}
