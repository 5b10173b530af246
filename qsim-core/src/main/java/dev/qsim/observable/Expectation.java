package dev.qsim.observable;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Objects;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.Circuit;
import dev.qsim.Precision;
import dev.qsim.StateVector;
import dev.qsim.Tally;
import dev.qsim.internal.Bridge;
import dev.qsim.internal.Checks;
import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.DensityKernels;
import dev.qsim.kernel.PauliKernels;
import dev.qsim.noise.DensityMatrix;

/**
 * Expectation values of observables: exact in a state vector ({@code <ψ|H|ψ>}, variance) or a
 * density matrix ({@code Tr(ρH)}), and estimated from shots. One name for every kind of state:
 * {@code Expectation.of(h, state)}; a stabilizer table answers for one Pauli product itself
 * ({@link dev.qsim.stabilizer.StabilizerTableau#expectation(PauliProduct)}). Stateless; thread-safe
 * as long as no other thread changes the state
 * during a call.
 *
 * <p>The exact value reads the amplitudes once per term and never copies the state: for a term
 * {@code w P} with masks {@code (x, z)},
 * {@code <ψ|P|ψ> = i^{|x∧z|} Σ_j conj(a_{j⊕x}) (-1)^{|j∧z|} a_j}. Sums run over fixed blocks in a
 * fixed order, so results are the same to the bit for every thread count.
 *
 * @since 0.1
 */
public final class Expectation {
    private Expectation() {
    }

    /** Checks that an observable or Pauli product fits on a state of {@code qubits} qubits. */
    static void requireFits(int span, int qubits, Object what) {
        if (span > qubits) {
            throw new IllegalArgumentException("qubit " + (span - 1) + " of "
                    + Checks.excerpt(String.valueOf(what)) + " is out of range [0, "
                    + (qubits - 1) + "] for a " + qubits + "-qubit state");
        }
    }

    /**
     * Returns the expectation value {@code Tr(ρH)} of an observable in a density matrix
     * (Nielsen and Chuang 2010, §2.4.1), for at most 12 qubits.
     *
     * @param h the observable, acting on qubits of the matrix only
     * @param rho the density matrix. Not modified.
     * @return the real part of {@code Tr(ρH)} (the imaginary part vanishes for Hermitian
     *     {@code H} and {@code ρ})
     * @throws IllegalArgumentException if the matrix has more than 12 qubits or the
     *     observable acts beyond it
     */
    public static double of(Observable h, DensityMatrix rho) {
        Objects.requireNonNull(h, "h");
        Objects.requireNonNull(rho, "rho");
        int n = rho.qubits();
        if (n > dev.qsim.Operator.MAX_QUBITS) {
            throw new IllegalArgumentException("the expectation in a density matrix is for at"
                    + " most " + dev.qsim.Operator.MAX_QUBITS + " qubits, not " + n);
        }
        requireFits(h.span(), n, "the observable");
        dev.qsim.Operator op = h.toOperator(n);
        int d = 1 << n;
        double[] m = new double[2 * d * d];
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                Complex z = op.get(r, c);
                m[2 * (r * d + c)] = z.getReal();
                m[2 * (r * d + c) + 1] = z.getImaginary();
            }
        }
        return DensityKernels.expectation(Bridge.densities().store(rho), n, m);
    }

    /**
     * Returns {@code <ψ|P|ψ>} for one Pauli product, phase included (real when the phase is
     * ±1).
     *
     * @param pauli the product, acting on qubits of the state only
     * @param state the state, normalised. Not modified.
     * @return the expectation value
     * @throws IllegalArgumentException if the product acts on a qubit outside the state
     */
    public static Complex of(PauliProduct pauli, StateVector state) {
        Objects.requireNonNull(pauli, "pauli");
        Objects.requireNonNull(state, "state");
        requireFits(pauli.span(), state.qubits(), "the Pauli product " + pauli);
        Amplitudes a = Bridge.states().doubles(state);
        long x = pauli.xBits();
        long z = pauli.zBits();
        double[] v = PauliKernels.inner(a, a, x, z, state.threads());
        switch ((Long.bitCount(x & z) + pauli.phase()) & 3) {
            case 0:
                return Complex.ofCartesian(v[0], v[1]);
            case 1:
                return Complex.ofCartesian(-v[1], v[0]);
            case 2:
                return Complex.ofCartesian(-v[0], -v[1]);
            default:
                return Complex.ofCartesian(v[1], -v[0]);
        }
    }

    /**
     * Returns the exact expectation value {@code <ψ|H|ψ> = Σ_k w_k <ψ|P_k|ψ>} (Nielsen and
     * Chuang 2010, Quantum Computation and Quantum Information, §2.2.5, eq. 2.110).
     *
     * @param h the observable, acting on qubits of the state only
     * @param state the state, normalised. Not modified.
     * @return the expectation value
     * @throws IllegalArgumentException if a term acts on a qubit outside the state
     */
    public static double of(Observable h, StateVector state) {
        Objects.requireNonNull(h, "h");
        Objects.requireNonNull(state, "state");
        requireFits(h.span(), state.qubits(), "the observable");
        Amplitudes a = Bridge.states().doubles(state);
        return sum(h, a, a, state.threads());
    }

    /** Returns Re Σ_k w_k <bra|P_k|ket>; unchecked. */
    static double sum(Observable h, Amplitudes bra, Amplitudes ket, int threads) {
        double sum = 0;
        for (int k = 0; k < h.size(); k++) {
            PauliProduct p = h.product(k);
            long x = p.xBits();
            long z = p.zBits();
            double[] v = PauliKernels.inner(bra, ket, x, z, threads);
            // times i^{|x∧z|}, real part only
            switch (Long.bitCount(x & z) & 3) {
                case 0:
                    sum += h.weight(k) * v[0];
                    break;
                case 1:
                    sum -= h.weight(k) * v[1];
                    break;
                case 2:
                    sum -= h.weight(k) * v[0];
                    break;
                default:
                    sum += h.weight(k) * v[1];
                    break;
            }
        }
        return sum;
    }

    /**
     * Returns the exact variance {@code <H²> - <H>²}, with {@code H²} from
     * {@link Observable#squared()} (Nielsen and Chuang 2010, §2.2.5, eq. 2.111), clamped below
     * at 0 against rounding.
     *
     * @param h the observable, acting on qubits of the state only
     * @param state the state, normalised. Not modified.
     * @return the variance, at least 0
     * @throws IllegalArgumentException if a term acts on a qubit outside the state
     */
    public static double variance(Observable h, StateVector state) {
        double mean = of(h, state);
        double square = of(h.squared(), state);
        return Math.max(0, square - mean * mean);
    }

    /**
     * Splits the non-identity terms of an observable into groups whose products commute qubit
     * by qubit, so each group can be measured with one setting. Greedy: terms are taken by
     * decreasing weight magnitude (ties in term order) and each joins the first group it fits,
     * the "largest first" heuristic of Verteletskyi, Yen and Izmaylov (2020), J. Chem. Phys.
     * 152, 124114, doi:10.1063/1.5141458, §II; the idea of one setting per qubit-wise commuting
     * group is that of Kandala et al. (2017), Nature 549, 242, doi:10.1038/nature23879.
     * Identity terms are left out (they need no measurement).
     *
     * @param h the observable; terms on qubits below 64 only
     * @return the groups, each an observable with some of the terms
     * @throws IllegalArgumentException if a term acts on qubit 64 or above
     */
    public static List<Observable> groups(Observable h) {
        Objects.requireNonNull(h, "h");
        if (h.span() > 64) {
            throw new IllegalArgumentException("measurement grouping handles qubits 0 to 63 but"
                    + " the observable acts on qubit " + (h.span() - 1));
        }
        Integer[] order = new Integer[h.size()];
        for (int k = 0; k < order.length; k++) {
            order[k] = k;
        }
        Arrays.sort(order, (a, b) -> Double.compare(Math.abs(h.weight(b)), Math.abs(h.weight(a))));
        List<long[]> signatures = new ArrayList<>();
        List<Observable.Builder> builders = new ArrayList<>();
        for (int k : order) {
            PauliProduct p = h.product(k);
            long x = p.xBits();
            long z = p.zBits();
            if ((x | z) == 0) {
                continue;
            }
            int g = 0;
            for (; g < signatures.size(); g++) {
                long[] s = signatures.get(g);
                long both = (s[0] | s[1]) & (x | z);
                if ((both & ((s[0] ^ x) | (s[1] ^ z))) == 0) {
                    s[0] |= x;
                    s[1] |= z;
                    break;
                }
            }
            if (g == signatures.size()) {
                signatures.add(new long[] {x, z});
                builders.add(Observable.builder());
            }
            builders.get(g).add(h.weight(k), p);
        }
        List<Observable> out = new ArrayList<>(builders.size());
        for (Observable.Builder b : builders) {
            out.add(b.build());
        }
        return out;
    }

    /**
     * Estimates {@code <ψ|H|ψ>} from shots, as a device would: the terms are grouped by
     * {@link #groups(Observable)}; for each group a copy of the state is turned to the group's
     * measurement basis (H on qubits read in X, S† then H on qubits read in Y), {@code shots}
     * outcomes are sampled, and each shot gives {@code Σ_k w_k (-1)^{parity of P_k's qubits}}.
     * The estimate is the sum of the group means plus the identity weights; its standard error
     * combines the groups' sample variances (common practice; see Kandala et al. 2017, Nature
     * 549, 242, Methods). The state is not changed; one extra state is allocated and reused.
     *
     * @param h the observable, acting on qubits of the state only
     * @param state the state, normalised. Not modified.
     * @param shots shots per measurement setting, at least 2
     * @param rng the source of randomness
     * @return the estimate
     * @throws IllegalArgumentException if {@code shots < 2} or a term acts outside the state
     * @throws IllegalStateException if the heap cannot hold a copy of the state
     */
    public static Estimate sampled(Observable h, StateVector state, int shots,
            UniformRandomProvider rng) {
        Objects.requireNonNull(h, "h");
        Objects.requireNonNull(state, "state");
        Objects.requireNonNull(rng, "rng");
        requireFits(h.span(), state.qubits(), "the observable");
        Checks.requireAtLeast(shots, 2, "shots per setting");
        int n = state.qubits();
        double constant = 0;
        for (int k = 0; k < h.size(); k++) {
            if (h.product(k).weight() == 0) {
                constant += h.weight(k);
            }
        }
        List<Observable> groups = groups(h);
        if (groups.isEmpty()) {
            return new Estimate(constant, 0, 0, shots);
        }
        StateVector work = state.toPrecision(Precision.DOUBLE);
        Amplitudes source = Bridge.states().doubles(state);
        Amplitudes target = Bridge.states().store(work);
        double value = constant;
        double errorSquared = 0;
        for (Observable g : groups) {
            long x = 0;
            long z = 0;
            for (int k = 0; k < g.size(); k++) {
                x |= g.product(k).xBits();
                z |= g.product(k).zBits();
            }
            long support = x | z;
            int[] qs = new int[Long.bitCount(support)];
            Circuit.Builder turn = Circuit.builder(n, 0);
            for (int q = 0, j = 0; q < n; q++) {
                long m = 1L << q;
                if ((support & m) != 0) {
                    qs[j++] = q;
                    if ((x & m) != 0) {
                        if ((z & m) != 0) {
                            turn.sDagger(q);
                        }
                        turn.h(q);
                    }
                }
            }
            target.copyFrom(source);
            work.apply(turn.build());
            Tally tally = work.sample(shots, rng, qs);
            long[] masks = new long[g.size()];
            for (int k = 0; k < masks.length; k++) {
                long s = g.product(k).xBits() | g.product(k).zBits();
                for (int j = 0; j < qs.length; j++) {
                    if ((s & (1L << qs[j])) != 0) {
                        masks[k] |= 1L << j;
                    }
                }
            }
            Map<String, Long> outcomes = tally.outcomes();
            double[] values = new double[outcomes.size()];
            long[] counts = new long[outcomes.size()];
            int o = 0;
            double sum = 0;
            for (Map.Entry<String, Long> e : outcomes.entrySet()) {
                long key = Long.parseLong(e.getKey(), 2);
                double v = 0;
                for (int k = 0; k < masks.length; k++) {
                    v += (Long.bitCount(key & masks[k]) & 1) == 0 ? g.weight(k) : -g.weight(k);
                }
                values[o] = v;
                counts[o] = e.getValue();
                sum += v * counts[o];
                o++;
            }
            double mean = sum / shots;
            double squares = 0;
            for (int i = 0; i < o; i++) {
                double d = values[i] - mean;
                squares += d * d * counts[i];
            }
            value += mean;
            errorSquared += squares / (shots - 1) / shots;
        }
        return new Estimate(value, Math.sqrt(errorSquared), groups.size(), shots);
    }

    /**
     * Estimates {@code <ψ|H|ψ>} from shots with a seeded generator
     * ({@link RandomSource#XO_RO_SHI_RO_128_PP}); equal seeds give equal estimates.
     *
     * @param h the observable, acting on qubits of the state only
     * @param state the state, normalised. Not modified.
     * @param shots shots per measurement setting, at least 2
     * @param seed the seed
     * @return the estimate
     * @throws IllegalArgumentException if {@code shots < 2} or a term acts outside the state
     * @see #sampled(Observable, StateVector, int, UniformRandomProvider)
     */
    public static Estimate sampled(Observable h, StateVector state, int shots, long seed) {
        return sampled(h, state, shots, RandomSource.XO_RO_SHI_RO_128_PP.create(seed));
    }
}
