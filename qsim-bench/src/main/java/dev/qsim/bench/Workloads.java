package dev.qsim.bench;

import java.util.List;
import java.util.Objects;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.Circuit;
import dev.qsim.Gates;
import dev.qsim.Operator;
import dev.qsim.Precision;
import dev.qsim.StateVector;

/**
 * The gates, target qubits, states and circuits shared by {@link SingleQubitGateBenchmark},
 * {@link KernelBenchmark}, {@link FusionBenchmark} and {@link ScalingReport}, so all of them time
 * the same work.
 */
final class Workloads {
    /** Gate names accepted by {@link #gate(String)}, in the order shown in messages. */
    static final List<String> GATE_NAMES = List.of("dense", "h", "rx", "ry", "t", "x");

    /** Target names accepted by {@link #target(String, int)}, in the order shown in messages. */
    static final List<String> TARGET_NAMES = List.of("low", "mid", "high");

    /** Kernel kinds accepted by {@link #kernelGate(String)}, in the order shown in messages. */
    static final List<String> KERNEL_NAMES = List.of("dense", "diagonal", "permutation",
            "controlled");

    /** Precision names accepted by {@link #precision(String)}, in the order shown in messages. */
    static final List<String> PRECISION_NAMES = List.of("double", "single");

    /** Seed of the random single-qubit states whose tensor product is the benchmark state. */
    static final long STATE_SEED = 20_240_611L;

    /** Seed of the gate kinds and angles of {@link #layeredCircuit(int, int, long)}. */
    static final long CIRCUIT_SEED = 20_261_201L;

    /** Layers of the circuit that compares fused and unfused runs. */
    static final int CIRCUIT_LAYERS = 20;

    private Workloads() {
    }

    /**
     * Returns the single-qubit gate of the given name.
     *
     * <ul>
     *   <li>{@code dense}: {@code rz(1.1) ry(0.3) rz(0.7)}, a unitary with four nonzero complex
     *       entries, so no kernel can take a shortcut;</li>
     *   <li>{@code h}: Hadamard; {@code ry}: {@code ry(0.3)} (real dense); {@code rx}:
     *       {@code rx(0.3)} (real diagonal, imaginary off-diagonal);</li>
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
            case "rx":
                return Gates.rx(0.3);
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
     * Returns the storage precision of the given name: {@code double} is
     * {@link Precision#DOUBLE}, {@code single} is {@link Precision#SINGLE}.
     *
     * @throws IllegalArgumentException if the name is not one of {@link #PRECISION_NAMES}
     */
    static Precision precision(String name) {
        switch (name) {
            case "double":
                return Precision.DOUBLE;
            case "single":
                return Precision.SINGLE;
            default:
                throw new IllegalArgumentException("precision '" + name + "' is not known;"
                        + " allowed: " + String.join(", ", PRECISION_NAMES));
        }
    }

    /** Returns the name of a precision as {@link #precision(String)} reads it. */
    static String precisionName(Precision precision) {
        return precision == Precision.SINGLE ? "single" : "double";
    }

    /**
     * Returns the one-gate circuit that times a kernel kind on {@code n} qubits at target qubit
     * {@code target}:
     *
     * <ul>
     *   <li>{@code dense}: the generic unitary {@code gate("dense")} (dense 2x2 kernel);</li>
     *   <li>{@code diagonal}: {@code rz(0.7)}, both diagonal entries complex and not 1, so the
     *       diagonal kernel cannot skip half the state;</li>
     *   <li>{@code permutation}: X (amplitudes swapped, no arithmetic);</li>
     *   <li>{@code controlled}: CNOT with control {@link #controlFor(int, int)} and this target,
     *       recorded with {@code Circuit.Builder.cnot}, so the engine applies X on the target
     *       only where the control is 1 (the controlled kernel).</li>
     * </ul>
     *
     * @throws IllegalArgumentException if the name is not one of {@link #KERNEL_NAMES}, or it is
     *     {@code controlled} and {@code n < 2}
     * @throws IndexOutOfBoundsException if {@code target} is not a qubit of {@code n}
     */
    static Circuit kernelCircuit(String name, int n, int target) {
        return kernelCircuitOf(name, n, target);
    }

    /**
     * Whether the core keeps a kernel kind's gate in its lazy frame instead of applying it:
     * {@code diagonal} ({@code rz}, a single-qubit phase) and {@code permutation} (X), which
     * cost no pass over the state until a read settles the frame (docs/architecture.md, "The
     * path of a gate", step 5). Their bandwidth is that of the settling read.
     */
    static boolean keptInFrame(String kernel) {
        return kernel.equals("diagonal") || kernel.equals("permutation");
    }

    private static Circuit kernelCircuitOf(String name, int n, int target) {
        final Circuit.Builder b = Circuit.builder(n);
        if (name.equals("controlled")) {
            if (n < 2) {
                throw new IllegalArgumentException("the controlled kernel needs at least 2"
                        + " qubits but the state has " + n);
            }
            return b.cnot(controlFor(target, n), target).build();
        }
        return b.apply(kernelGate(name), target).build();
    }

    /**
     * Returns the single-qubit operator of a kernel kind other than {@code controlled} (whose
     * operator on the target is X): {@code dense} is {@code gate("dense")}, {@code diagonal} is
     * {@code rz(0.7)}, {@code permutation} is X.
     *
     * @throws IllegalArgumentException if the name is not one of {@link #KERNEL_NAMES}
     */
    static Operator kernelGate(String name) {
        switch (name) {
            case "dense":
                return gate("dense");
            case "diagonal":
                return Gates.rz(0.7);
            case "permutation":
            case "controlled":
                return Gates.X;
            default:
                throw new IllegalArgumentException("kernel '" + name + "' is not known; allowed: "
                        + String.join(", ", KERNEL_NAMES));
        }
    }

    /**
     * Returns the control qubit paired with a target for the {@code controlled} kernel: the
     * next qubit up, or the one below when the target is the highest qubit.
     *
     * @throws IllegalArgumentException if {@code n < 2} or the target is not in [0, n)
     */
    static int controlFor(int target, int n) {
        if (n < 2 || target < 0 || target >= n) {
            throw new IllegalArgumentException("target " + target + " needs a control qubit in a "
                    + n + "-qubit state; allowed: n >= 2 and target in [0, " + (n - 1) + "]");
        }
        return target + 1 < n ? target + 1 : target - 1;
    }

    /**
     * Returns the circuit that compares fused and unfused runs: {@code layers} layers, each a
     * random single-qubit rotation on every qubit (rx, ry or rz, kind and angle in [0, 2 pi)
     * drawn from a generator seeded with {@code seed}), followed by a ladder of two-qubit gates
     * on neighbours {@code (q, q + 1)}, {@code q = 0 .. n - 2}: CZ in even layers (0, 2, ...),
     * CNOT (control q, target q + 1) in odd ones. It has {@code layers * (2n - 1)} gates.
     *
     * @throws IllegalArgumentException if {@code n < 1} or {@code layers < 1}
     */
    static Circuit layeredCircuit(int n, int layers, long seed) {
        if (n < 1 || layers < 1) {
            throw new IllegalArgumentException("the layered circuit needs n >= 1 and layers >= 1"
                    + " but got n = " + n + ", layers = " + layers);
        }
        final UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        final Circuit.Builder b = Circuit.builder(n);
        for (int layer = 0; layer < layers; layer++) {
            for (int q = 0; q < n; q++) {
                final double angle = 2.0 * Math.PI * rng.nextDouble();
                switch (rng.nextInt(3)) {
                    case 0:
                        b.rx(q, angle);
                        break;
                    case 1:
                        b.ry(q, angle);
                        break;
                    default:
                        b.rz(q, angle);
                        break;
                }
            }
            for (int q = 0; q + 1 < n; q++) {
                if (layer % 2 == 0) {
                    b.cz(q, q + 1);
                } else {
                    b.cnot(q, q + 1);
                }
            }
        }
        return b.build();
    }

    /**
     * Returns a normalised {@code n}-qubit product state in double precision; the same as
     * {@link #productState(int, long, Precision) productState(n, seed, Precision.DOUBLE)}.
     *
     * @throws IllegalArgumentException if {@code n} is not in [1, 40]
     * @throws IllegalStateException from the core if the heap cannot hold the state
     */
    static StateVector productState(int n, long seed) {
        return productState(n, seed, Precision.DOUBLE);
    }

    /**
     * Returns a normalised {@code n}-qubit product state whose amplitudes are all nonzero and
     * complex, stored in the given precision: qubit {@code k} is {@code rz(b_k) ry(a_k)|0>} with
     * angles drawn from a generator seeded with {@code seed} (qubit 0 first), angles {@code a_k}
     * in [0.5, 2.5] so no amplitude is tiny.
     *
     * <p>The low {@code ceil(n/2)} qubits and the high {@code floor(n/2)} qubits are each built
     * by tensor products in double precision (at most 2^20 amplitudes up to 40 qubits), and one
     * last tensor product of the two makes the state. So the full-size state is the only large
     * allocation: the heap needs the state's bytes plus a little, never a second full or
     * half-size state. In single precision the low half is rounded to {@code float} first, so
     * the product is stored in single precision (each part of a single-precision amplitude is
     * the {@code float} nearest to a product of two rounded factors).
     *
     * @throws IllegalArgumentException if {@code n} is not in [1, 40]
     * @throws NullPointerException if {@code precision} is null
     * @throws IllegalStateException from the core if the heap cannot hold the state
     */
    static StateVector productState(int n, long seed, Precision precision) {
        Objects.requireNonNull(precision, "precision");
        if (n < 1 || n > StateVector.MAX_QUBITS) {
            throw new IllegalArgumentException("qubit count must be in [1, "
                    + StateVector.MAX_QUBITS + "] but was " + n);
        }
        final UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        final StateVector[] factors = new StateVector[n];
        for (int k = 0; k < n; k++) {
            factors[k] = oneQubit(rng);
        }
        final int low = (n + 1) / 2;
        StateVector lowPart = product(factors, 0, low);
        if (precision == Precision.SINGLE) {
            lowPart = lowPart.toPrecision(Precision.SINGLE);
        }
        if (low == n) {
            return lowPart;
        }
        // The high factor takes qubits low..n-1; the low part keeps qubits 0..low-1.
        return product(factors, low, n).tensor(lowPart);
    }

    /** The tensor product of {@code factors[from..to)}, factor {@code from} on the lowest qubit. */
    private static StateVector product(StateVector[] factors, int from, int to) {
        StateVector state = factors[from];
        for (int k = from + 1; k < to; k++) {
            // The new factor takes the next qubit up; the product so far keeps the lower ones.
            state = factors[k].tensor(state);
        }
        return state;
    }

    private static StateVector oneQubit(UniformRandomProvider rng) {
        final double polar = 0.5 + 2.0 * rng.nextDouble();
        final double azimuth = 2.0 * Math.PI * rng.nextDouble();
        return StateVector.zero(1).apply(Gates.ry(polar), 0).apply(Gates.rz(azimuth), 0);
    }
}
