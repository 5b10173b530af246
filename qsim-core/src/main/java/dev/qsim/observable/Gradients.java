package dev.qsim.observable;

import java.util.List;
import java.util.Objects;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Instruction;
import dev.qsim.Precision;
import dev.qsim.StateVector;
import dev.qsim.internal.Bridge;
import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.PauliKernels;

/**
 * Exact gradients of an expectation value {@code E(θ) = <ψ(θ)|H|ψ(θ)>}, with
 * {@code |ψ(θ)> = U(θ)|ψ0>} the state a {@link TunableCircuit} makes, with respect to every
 * parameter. Two methods give the same numbers up to rounding:
 * <ul>
 *   <li>{@link #parameterShift}: for each parameterised gate, two more simulations at the
 *       gate's angle shifted by {@code ±π/2}, {@code dE/da = [E(a + π/2) - E(a - π/2)] / 2},
 *       exact for gates {@code exp(-i a G)} whose generator {@code G} has two eigenvalues
 *       {@code ±1/2} up to a shift, as every parameterised gate here does (Mitarai et al. 2018,
 *       "Quantum circuit learning", Phys. Rev. A 98, 032309, doi:10.1103/PhysRevA.98.032309;
 *       Schuld et al. 2019, "Evaluating analytic gradients on quantum hardware", Phys. Rev. A
 *       99, 032331, doi:10.1103/PhysRevA.99.032331, eq. 13). Cost: two simulations per gate.</li>
 *   <li>{@link #adjoint}: one forward simulation, then one backward sweep that un-applies the
 *       gates from both {@code |φ> = |ψ>} and {@code |λ> = H|ψ>} and adds
 *       {@code 2 Re <λ|dU_k/da|φ_{k-1}>} at each parameterised gate (Jones and Gacon 2020,
 *       "Efficient calculation of gradients in classical simulations of variational quantum
 *       algorithms", arXiv:2009.02823, Algorithm 1). Cost: about three simulations plus one
 *       pass per term of {@code H}, and two extra states of memory.</li>
 * </ul>
 * A parameter used by several gates gets the sum over them, each times its gate's scale (chain
 * rule). Stateless and thread-safe; results do not depend on the thread count.
 *
 * @since 0.1
 */
public final class Gradients {
    private Gradients() {
    }

    /**
     * Returns {@code dE/dθ_j} for every parameter by adjoint differentiation, starting from
     * {@code |0...0>}.
     *
     * @param circuit the circuit
     * @param values one finite value per parameter, in declared order
     * @param h the observable, on qubits of the circuit only
     * @return the gradient, one entry per parameter in declared order
     * @throws IllegalArgumentException if the values do not fit the parameters or the
     *     observable acts outside the circuit
     * @throws IllegalStateException if the heap cannot hold the states
     */
    public static double[] adjoint(TunableCircuit circuit, double[] values, Observable h) {
        Objects.requireNonNull(circuit, "circuit");
        return adjoint(circuit, values, h, StateVector.zero(circuit.qubits()));
    }

    /**
     * Returns {@code dE/dθ_j} for every parameter by adjoint differentiation, starting from a
     * given state (not modified; its thread setting is used).
     *
     * @param circuit the circuit
     * @param values one finite value per parameter, in declared order
     * @param h the observable, on qubits of the circuit only
     * @param initial the state the circuit starts from, same qubit count. Not modified.
     * @return the gradient, one entry per parameter in declared order
     * @throws IllegalArgumentException if the values do not fit the parameters, the observable
     *     acts outside the circuit, or the state has another qubit count
     * @throws IllegalStateException if the heap cannot hold the states
     */
    public static double[] adjoint(TunableCircuit circuit, double[] values, Observable h,
            StateVector initial) {
        Objects.requireNonNull(circuit, "circuit");
        Objects.requireNonNull(h, "h");
        Circuit bound = check(circuit, values, h, initial);
        int n = circuit.qubits();
        int threads = initial.threads();
        Bridge.States access = Bridge.states();
        List<Instruction> forward = bound.instructions();
        List<Instruction> backward = bound.inverse().instructions();
        List<TunableCircuit.Step> steps = circuit.steps();
        int count = forward.size();

        StateVector phiState = initial.toPrecision(Precision.DOUBLE);
        for (Instruction in : forward) {
            access.apply(phiState, in);
        }
        Amplitudes phi = access.store(phiState);
        StateVector lambdaState = StateVector.zero(n).setThreads(threads);
        Amplitudes lambda = access.store(lambdaState);
        lambda.clear();
        for (int k = 0; k < h.size(); k++) {
            long x = h.product(k).xBits();
            long z = h.product(k).zBits();
            double[] c = PauliKernels.ownPhase(x, z);
            double w = h.weight(k);
            PauliKernels.accumulate(lambda, phi, x, z, w * c[0], w * c[1], threads);
        }

        int first = count;
        for (int k = 0; k < count; k++) {
            if (steps.get(k).param >= 0) {
                first = k;
                break;
            }
        }
        double[] grad = new double[circuit.parameters().size()];
        for (int k = count - 1; k >= first; k--) {
            TunableCircuit.Step s = steps.get(k);
            if (s.param >= 0) {
                grad[s.param] += s.scale * slope(s, lambda, phi, threads);
            }
            if (k > first) {
                Instruction undo = backward.get(count - 1 - k);
                access.apply(phiState, undo);
                access.apply(lambdaState, undo);
            }
        }
        return grad;
    }

    /**
     * Returns {@code 2 Re <λ|dU/da|φ_{k-1}>} for gate {@code s}, with {@code φ = U φ_{k-1}} the
     * state after the gate. For {@code U = exp(-i a G/2)}, {@code dU/da = (-i/2) G U}, giving
     * {@code Im <λ|G|φ>}; for {@code U = exp(i a Π)} with a projector {@code Π},
     * {@code dU/da = i Π U}, giving {@code -2 Im <λ|Π|φ>}.
     */
    private static double slope(TunableCircuit.Step s, Amplitudes lambda, Amplitudes phi,
            int threads) {
        double sum = 0;
        for (Gate.Term t : s.gate.generator()) {
            long x = 0;
            long z = 0;
            for (int j = 0; j < s.qubits.length; j++) {
                char c = t.letters().charAt(j);
                long bit = 1L << s.qubits[j];
                if (c == 'X' || c == 'Y') {
                    x |= bit;
                }
                if (c == 'Z' || c == 'Y') {
                    z |= bit;
                }
            }
            // P = i^{|x∧z|} X^x Z^z; the slope takes Im <λ|P|φ>.
            double[] v = PauliKernels.inner(lambda, phi, x, z, threads);
            double im;
            switch (Long.bitCount(x & z) & 3) {
                case 0:
                    im = v[1];
                    break;
                case 1:
                    im = v[0];
                    break;
                case 2:
                    im = -v[1];
                    break;
                default:
                    im = -v[0];
                    break;
            }
            sum += t.weight() * im;
        }
        return sum;
    }

    /**
     * Returns {@code dE/dθ_j} for every parameter by the parameter-shift rule, starting from
     * {@code |0...0>}.
     *
     * @param circuit the circuit
     * @param values one finite value per parameter, in declared order
     * @param h the observable, on qubits of the circuit only
     * @return the gradient, one entry per parameter in declared order
     * @throws IllegalArgumentException if the values do not fit the parameters or the
     *     observable acts outside the circuit
     * @throws IllegalStateException if the heap cannot hold the states
     */
    public static double[] parameterShift(TunableCircuit circuit, double[] values,
            Observable h) {
        Objects.requireNonNull(circuit, "circuit");
        return parameterShift(circuit, values, h, StateVector.zero(circuit.qubits()));
    }

    /**
     * Returns {@code dE/dθ_j} for every parameter by the parameter-shift rule, starting from a
     * given state (not modified; its thread setting is used).
     *
     * @param circuit the circuit
     * @param values one finite value per parameter, in declared order
     * @param h the observable, on qubits of the circuit only
     * @param initial the state the circuit starts from, same qubit count. Not modified.
     * @return the gradient, one entry per parameter in declared order
     * @throws IllegalArgumentException if the values do not fit the parameters, the observable
     *     acts outside the circuit, or the state has another qubit count
     * @throws IllegalStateException if the heap cannot hold the states
     */
    public static double[] parameterShift(TunableCircuit circuit, double[] values, Observable h,
            StateVector initial) {
        Objects.requireNonNull(circuit, "circuit");
        Objects.requireNonNull(h, "h");
        check(circuit, values, h, initial);
        List<TunableCircuit.Step> steps = circuit.steps();
        double[] grad = new double[circuit.parameters().size()];
        StateVector work = initial.toPrecision(Precision.DOUBLE);
        Amplitudes source = Bridge.states().doubles(initial);
        Amplitudes target = Bridge.states().store(work);
        for (int k = 0; k < steps.size(); k++) {
            TunableCircuit.Step s = steps.get(k);
            if (s.param < 0) {
                continue;
            }
            target.copyFrom(source);
            double plus = Expectation.of(h,
                    work.apply(circuit.bind(values, k, Math.PI / 2)));
            target.copyFrom(source);
            double minus = Expectation.of(h,
                    work.apply(circuit.bind(values, k, -Math.PI / 2)));
            grad[s.param] += s.scale * (plus - minus) / 2;
        }
        return grad;
    }

    private static Circuit check(TunableCircuit circuit, double[] values, Observable h,
            StateVector initial) {
        Objects.requireNonNull(initial, "initial");
        Circuit bound = circuit.bind(values);
        if (initial.qubits() != circuit.qubits()) {
            throw new IllegalArgumentException("the initial state has " + initial.qubits()
                    + " qubit(s) but the circuit has " + circuit.qubits() + "; they must match");
        }
        Expectation.requireFits(h.span(), circuit.qubits(), "the observable");
        return bound;
    }
}
