package dev.qsim.noise;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Objects;

import org.apache.commons.numbers.complex.Complex;

import dev.qsim.Gates;
import dev.qsim.Operator;
import dev.qsim.internal.Checks;

/**
 * A quantum channel (completely positive, trace-preserving map) on one or two qubits, given by
 * Kraus operators: {@code rho -> sum_k K_k rho K_k^dagger} with {@code sum_k K_k^dagger K_k = I}
 * (Nielsen and Chuang 2010, <i>Quantum Computation and Quantum Information</i>, 10th anniversary
 * edition, Cambridge University Press, §8.2.3, operator-sum representation). Immutable and
 * thread-safe.
 *
 * <p>Bit {@code j} of a Kraus matrix index is the {@code j}-th qubit the channel is applied to,
 * as for {@link Operator}. Every probability-like parameter of the built-in channels is the
 * probability that the error happens, in {@code [0, 1]}.
 *
 * @since 0.1
 */
public final class Channel {
    /** The largest number of qubits a channel acts on. */
    public static final int MAX_QUBITS = 2;

    /** The largest allowed deviation of {@code sum K^dagger K} from the identity, entrywise. */
    public static final double TRACE_TOLERANCE = 1e-9;

    private final int qubits;
    private final List<Operator> kraus;
    /** Superoperator sum_k K_k (x) conj(K_k), row-major re/im interleaved, dimension 4^k. */
    private final double[] superoperator;
    /** The matrices K_k^dagger K_k, row-major re/im interleaved, dimension 2^k. */
    private final double[][] weights;
    /** The Kraus matrices, row-major re/im interleaved. */
    private final double[][] raw;
    /** Branch probabilities if they do not depend on the state (all K^dagger K = p I), else null.
     * */
    private final double[] fixed;
    /** Whether Kraus operator k is a multiple of the identity. */
    private final boolean[] scalar;

    private Channel(int qubits, List<Operator> kraus) {
        this.qubits = qubits;
        this.kraus = kraus;
        int d = 1 << qubits;
        int dd = d * d;
        raw = new double[kraus.size()][];
        weights = new double[kraus.size()][];
        superoperator = new double[2 * dd * dd];
        for (int k = 0; k < kraus.size(); k++) {
            Operator op = kraus.get(k);
            double[] m = new double[2 * dd];
            for (int r = 0; r < d; r++) {
                for (int c = 0; c < d; c++) {
                    Complex z = op.get(r, c);
                    m[2 * (r * d + c)] = z.getReal();
                    m[2 * (r * d + c) + 1] = z.getImaginary();
                }
            }
            raw[k] = m;
            // K†K, with Operator's own adjoint and product.
            Operator kk = op.dagger().times(op);
            double[] w = new double[2 * dd];
            for (int r = 0; r < d; r++) {
                for (int c = 0; c < d; c++) {
                    Complex z = kk.get(r, c);
                    w[2 * (r * d + c)] = z.getReal();
                    w[2 * (r * d + c) + 1] = z.getImaginary();
                }
            }
            weights[k] = w;
            // S[(r + c d), (r' + c' d)] += K[r][r'] conj(K[c][c'])
            for (int r = 0; r < d; r++) {
                for (int c = 0; c < d; c++) {
                    int row = r + c * d;
                    for (int r2 = 0; r2 < d; r2++) {
                        double ar = m[2 * (r * d + r2)];
                        double ai = m[2 * (r * d + r2) + 1];
                        for (int c2 = 0; c2 < d; c2++) {
                            double br = m[2 * (c * d + c2)];
                            double bi = -m[2 * (c * d + c2) + 1];
                            int col = r2 + c2 * d;
                            superoperator[2 * (row * dd + col)] += ar * br - ai * bi;
                            superoperator[2 * (row * dd + col) + 1] += ar * bi + ai * br;
                        }
                    }
                }
            }
        }
        scalar = new boolean[raw.length];
        double[] p = new double[raw.length];
        boolean allFixed = true;
        for (int k = 0; k < raw.length; k++) {
            scalar[k] = isScalar(raw[k], d);
            if (isScalar(weights[k], d) && weights[k][1] == 0) {
                p[k] = weights[k][0];
            } else {
                allFixed = false;
            }
        }
        fixed = allFixed ? p : null;
    }

    /** True if the d x d interleaved matrix m is c I exactly (up to 1e-15). */
    private static boolean isScalar(double[] m, int d) {
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                int o = 2 * (r * d + c);
                if (r != c && (Math.abs(m[o]) > 1e-15 || Math.abs(m[o + 1]) > 1e-15)) {
                    return false;
                }
                if (r == c && (Math.abs(m[o] - m[0]) > 1e-15
                        || Math.abs(m[o + 1] - m[1]) > 1e-15)) {
                    return false;
                }
            }
        }
        return true;
    }

    /**
     * Returns the channel with the given Kraus operators. All-zero operators are dropped.
     *
     * @param kraus the Kraus operators, at least one, all on the same 1 or 2 qubits
     * @return the channel
     * @throws IllegalArgumentException if the list is empty, the operators act on different
     *     numbers of qubits or on more than {@value #MAX_QUBITS}, or {@code sum K^dagger K}
     *     differs from the identity by more than {@value #TRACE_TOLERANCE} in some entry (the
     *     message gives the deviation)
     */
    public static Channel of(List<Operator> kraus) {
        Objects.requireNonNull(kraus, "kraus");
        if (kraus.isEmpty()) {
            throw new IllegalArgumentException("a channel needs at least one Kraus operator");
        }
        int k = Objects.requireNonNull(kraus.get(0), "kraus[0]").qubits();
        List<Operator> kept = new ArrayList<>();
        for (int i = 0; i < kraus.size(); i++) {
            Operator op = Objects.requireNonNull(kraus.get(i), "kraus[" + i + "]");
            if (op.qubits() != k) {
                throw new IllegalArgumentException("Kraus operator " + i + " acts on "
                        + op.qubits() + " qubit(s) but operator 0 acts on " + k
                        + "; all must act on the same qubits");
            }
            if (!isZero(op)) {
                kept.add(op);
            }
        }
        if (k > MAX_QUBITS) {
            throw new IllegalArgumentException("Kraus operators act on " + k
                    + " qubits; a channel acts on 1 to " + MAX_QUBITS + " qubits");
        }
        double deviation = traceDeviation(kept, k);
        if (!(deviation <= TRACE_TOLERANCE)) {
            throw new IllegalArgumentException("the Kraus operators are not trace preserving: "
                    + "sum of K^dagger K differs from the identity by " + deviation
                    + " (allowed " + TRACE_TOLERANCE + ")");
        }
        return new Channel(k, Collections.unmodifiableList(kept));
    }

    /**
     * Returns the channel with the given Kraus operators.
     *
     * @param kraus the Kraus operators
     * @return the channel
     * @throws IllegalArgumentException as for {@link #of(List)}
     */
    public static Channel of(Operator... kraus) {
        return of(List.of(kraus));
    }

    /**
     * Returns the identity channel (no noise) on {@code qubits} qubits.
     *
     * @param qubits 1 or 2
     * @return the channel with the single Kraus operator {@code I}
     * @throws IllegalArgumentException if {@code qubits} is not 1 or 2
     */
    public static Channel identity(int qubits) {
        if (qubits < 1 || qubits > MAX_QUBITS) {
            throw new IllegalArgumentException("qubit count " + qubits + " is out of range [1, "
                    + MAX_QUBITS + "]");
        }
        return of(Operator.identity(qubits));
    }

    /**
     * Returns the bit-flip channel {@code rho -> (1-p) rho + p X rho X}: Kraus operators
     * {@code sqrt(1-p) I} and {@code sqrt(p) X}. Nielsen and Chuang (2010) §8.3.3 write the same
     * channel with {@code p} as the probability of <em>no</em> flip; here {@code p} is the flip
     * probability. It maps the Bloch vector {@code (x, y, z)} to {@code (x, (1-2p) y, (1-2p) z)}.
     *
     * @param p the flip probability, in [0, 1]
     * @return the channel
     * @throws IllegalArgumentException if {@code p} is outside [0, 1]
     */
    public static Channel bitFlip(double p) {
        Checks.requireProbability(p, "bit-flip probability");
        return of(scaled(Gates.I, Math.sqrt(1 - p)), scaled(Gates.X, Math.sqrt(p)));
    }

    /**
     * Returns the phase-flip channel {@code rho -> (1-p) rho + p Z rho Z} (Nielsen and Chuang
     * 2010, §8.3.3, with {@code p} the flip probability). It maps the Bloch vector
     * {@code (x, y, z)} to {@code ((1-2p) x, (1-2p) y, z)}.
     *
     * @param p the flip probability, in [0, 1]
     * @return the channel
     * @throws IllegalArgumentException if {@code p} is outside [0, 1]
     */
    public static Channel phaseFlip(double p) {
        Checks.requireProbability(p, "phase-flip probability");
        return of(scaled(Gates.I, Math.sqrt(1 - p)), scaled(Gates.Z, Math.sqrt(p)));
    }

    /**
     * Returns the bit-phase-flip channel {@code rho -> (1-p) rho + p Y rho Y} (Nielsen and
     * Chuang 2010, §8.3.3, with {@code p} the flip probability). It maps the Bloch vector
     * {@code (x, y, z)} to {@code ((1-2p) x, y, (1-2p) z)}.
     *
     * @param p the flip probability, in [0, 1]
     * @return the channel
     * @throws IllegalArgumentException if {@code p} is outside [0, 1]
     */
    public static Channel bitPhaseFlip(double p) {
        Checks.requireProbability(p, "bit-phase-flip probability");
        return of(scaled(Gates.I, Math.sqrt(1 - p)), scaled(Gates.Y, Math.sqrt(p)));
    }

    /**
     * Returns the one-qubit depolarizing channel in its Pauli-error form
     * {@code rho -> (1-p) rho + (p/3)(X rho X + Y rho Y + Z rho Z)}: each of X, Y, Z happens
     * with probability {@code p/3} (Nielsen and Chuang 2010, §8.3.4). This equals the other form
     * of that section, {@code rho -> q I/2 + (1-q) rho}, with {@code q = 4p/3}; the Bloch vector
     * shrinks by the factor {@code 1 - 4p/3}. {@code p = 3/4} gives the completely mixed state.
     *
     * @param p the probability of a Pauli error, in [0, 1]
     * @return the channel
     * @throws IllegalArgumentException if {@code p} is outside [0, 1]
     */
    public static Channel depolarizing(double p) {
        Checks.requireProbability(p, "depolarizing probability");
        double s = Math.sqrt(p / 3);
        return of(scaled(Gates.I, Math.sqrt(1 - p)), scaled(Gates.X, s), scaled(Gates.Y, s),
                scaled(Gates.Z, s));
    }

    /**
     * Returns the two-qubit depolarizing channel
     * {@code rho -> (1-p) rho + (p/15) sum_P P rho P}, the sum over the 15 two-qubit Pauli
     * products {@code P != I(x)I}: the two-qubit analogue of {@link #depolarizing(double)}
     * (Nielsen and Chuang 2010, §8.3.4, Pauli-error form; common practice for two-qubit
     * gates). {@code p = 15/16} gives the completely mixed state.
     *
     * @param p the probability of a Pauli error, in [0, 1]
     * @return the channel on 2 qubits
     * @throws IllegalArgumentException if {@code p} is outside [0, 1]
     */
    public static Channel twoQubitDepolarizing(double p) {
        Checks.requireProbability(p, "two-qubit depolarizing probability");
        Operator[] paulis = {Gates.I, Gates.X, Gates.Y, Gates.Z};
        List<Operator> ops = new ArrayList<>();
        double s = Math.sqrt(p / 15);
        for (int a = 0; a < 4; a++) {
            for (int b = 0; b < 4; b++) {
                double w = a == 0 && b == 0 ? Math.sqrt(1 - p) : s;
                ops.add(scaled(paulis[a].tensor(paulis[b]), w));
            }
        }
        return of(ops);
    }

    /**
     * Returns the amplitude-damping channel with Kraus operators
     * {@code E0 = [[1, 0], [0, sqrt(1-gamma)]]} and {@code E1 = [[0, sqrt(gamma)], [0, 0]]}
     * (Nielsen and Chuang 2010, §8.3.5): energy loss from |1> to |0> with probability
     * {@code gamma}. It maps the Bloch vector {@code (x, y, z)} to
     * {@code (sqrt(1-gamma) x, sqrt(1-gamma) y, gamma + (1-gamma) z)}.
     *
     * @param gamma the decay probability, in [0, 1]
     * @return the channel
     * @throws IllegalArgumentException if {@code gamma} is outside [0, 1]
     */
    public static Channel amplitudeDamping(double gamma) {
        Checks.requireProbability(gamma, "amplitude-damping probability");
        return of(matrix(1, 0, 0, Math.sqrt(1 - gamma)), matrix(0, Math.sqrt(gamma), 0, 0));
    }

    /**
     * Returns the phase-damping channel with Kraus operators
     * {@code E0 = [[1, 0], [0, sqrt(1-lambda)]]} and {@code E1 = [[0, 0], [0, sqrt(lambda)]]}
     * (Nielsen and Chuang 2010, §8.3.6): populations stay, the coherences
     * {@code rho01, rho10} are multiplied by {@code sqrt(1-lambda)}.
     *
     * @param lambda the scattering probability, in [0, 1]
     * @return the channel
     * @throws IllegalArgumentException if {@code lambda} is outside [0, 1]
     */
    public static Channel phaseDamping(double lambda) {
        Checks.requireProbability(lambda, "phase-damping probability");
        return of(matrix(1, 0, 0, Math.sqrt(1 - lambda)), matrix(0, 0, 0, Math.sqrt(lambda)));
    }

    /**
     * Returns the decay of a qubit left alone for a time {@code duration}, with
     * energy-relaxation time {@code t1} and coherence time {@code t2}: amplitude damping with
     * {@code gamma = 1 - exp(-duration/t1)}, then phase damping with
     * {@code lambda = 1 - exp(-duration (2/t2 - 1/t1))}, so that the excited population decays as
     * {@code exp(-duration/t1)} and the coherences as {@code exp(-duration/t2)}. This is the usual
     * phenomenological model {@code 1/T2 = 1/(2 T1) + 1/T_phi} (Krantz et al. 2019, "A quantum
     * engineer's guide to superconducting qubits", Appl. Phys. Rev. 6, 021318,
     * doi:10.1063/1.5089550; Nielsen and Chuang 2010, §8.3.5-8.3.6 for the two parts),
     * which requires {@code t2 <= 2 t1}. Times are in any one unit.
     *
     * @param duration the time the qubit decays for, finite and at least 0
     * @param t1 the relaxation time, positive (infinity allowed)
     * @param t2 the coherence time, positive (infinity allowed if {@code t1} is), at most
     *     {@code 2 t1}
     * @return the channel on 1 qubit
     * @throws IllegalArgumentException if a time is out of range or {@code t2 > 2 t1}
     */
    public static Channel decay(double duration, double t1, double t2) {
        Checks.requirePositiveTime(t1, "T1");
        Checks.requirePositiveTime(t2, "T2");
        Checks.requireFiniteTime(duration, "the duration");
        double time = duration;
        if (t2 > 2 * t1) {
            throw new IllegalArgumentException("T2 " + t2 + " is larger than 2*T1 = " + 2 * t1
                    + "; physical qubits have T2 <= 2*T1");
        }
        double gamma = -Math.expm1(-time / t1);
        double rate = 2 / t2 - 1 / t1;
        double lambda = Math.min(1, Math.max(0, -Math.expm1(-time * rate)));
        return amplitudeDamping(gamma).then(phaseDamping(lambda));
    }

    /**
     * Returns the channel that applies this channel first and then {@code next}, on the same
     * qubits: Kraus operators {@code L_j K_i}.
     *
     * @param next the channel applied second
     * @return the composition
     * @throws IllegalArgumentException if the channels act on different numbers of qubits
     */
    public Channel then(Channel next) {
        Objects.requireNonNull(next, "next");
        if (next.qubits != qubits) {
            throw new IllegalArgumentException("cannot compose a " + qubits
                    + "-qubit channel with a " + next.qubits + "-qubit channel");
        }
        List<Operator> ops = new ArrayList<>();
        for (Operator l : next.kraus) {
            for (Operator k : kraus) {
                ops.add(l.times(k));
            }
        }
        return of(ops);
    }

    /**
     * Returns the channel that applies this channel and {@code other} side by side; as in
     * {@link Operator#tensor(Operator)}, {@code other} takes the low qubits (matrix-index bit
     * 0) and this channel the high ones.
     *
     * @param other the channel on the low qubits
     * @return the product channel, Kraus operators {@code K_i (x) L_j}
     * @throws IllegalArgumentException if the product would act on more than
     *     {@value #MAX_QUBITS} qubits
     */
    public Channel tensor(Channel other) {
        Objects.requireNonNull(other, "other");
        if (qubits + other.qubits > MAX_QUBITS) {
            throw new IllegalArgumentException("the product would act on "
                    + (qubits + other.qubits) + " qubits; at most " + MAX_QUBITS);
        }
        List<Operator> ops = new ArrayList<>();
        for (Operator k : kraus) {
            for (Operator l : other.kraus) {
                ops.add(k.tensor(l));
            }
        }
        return of(ops);
    }

    /**
     * Returns the number of qubits the channel acts on.
     *
     * @return 1 or 2
     */
    public int qubits() {
        return qubits;
    }

    /**
     * Returns the Kraus operators (all-zero ones dropped).
     *
     * @return an unmodifiable list
     */
    public List<Operator> kraus() {
        return kraus;
    }

    /**
     * Returns whether this channel is exactly the identity map (one Kraus operator, equal to
     * the identity).
     *
     * @return true for the noiseless channel
     */
    public boolean isIdentity() {
        return kraus.size() == 1 && kraus.get(0).equals(Operator.identity(qubits));
    }

    /** Superoperator for the density-matrix engine. Not copied: do not modify. */
    double[] superoperator() {
        return superoperator;
    }

    /** Kraus matrices, re/im interleaved. Not copied: do not modify. */
    double[][] rawKraus() {
        return raw;
    }

    /** Branch probabilities independent of the state, or null. Not copied: do not modify. */
    double[] fixedProbabilities() {
        return fixed;
    }

    /** Whether each Kraus operator is a multiple of the identity. Not copied. */
    boolean[] scalarBranches() {
        return scalar;
    }

    /** K_k^dagger K_k, re/im interleaved. Not copied: do not modify. */
    double[][] weights() {
        return weights;
    }

    /**
     * Describes the channel by its qubit count and number of Kraus operators.
     *
     * @return a short description
     */
    @Override
    public String toString() {
        return "Channel[" + qubits + " qubit(s), " + kraus.size() + " Kraus operator(s)]";
    }

    private static boolean isZero(Operator op) {
        int d = op.dimension();
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                Complex z = op.get(r, c);
                if (z.getReal() != 0 || z.getImaginary() != 0) {
                    return false;
                }
            }
        }
        return true;
    }

    private static double traceDeviation(List<Operator> ops, int k) {
        int d = 1 << k;
        double worst = 0;
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                double re = r == c ? -1 : 0;
                double im = 0;
                for (Operator op : ops) {
                    for (int j = 0; j < d; j++) {
                        Complex z = op.get(j, r).conj().multiply(op.get(j, c));
                        re += z.getReal();
                        im += z.getImaginary();
                    }
                }
                double dev = Math.hypot(re, im);
                if (Double.isNaN(dev)) {
                    return Double.NaN;
                }
                worst = Math.max(worst, dev);
            }
        }
        return worst;
    }

    private static Operator scaled(Operator op, double s) {
        int d = op.dimension();
        Complex[][] rows = new Complex[d][d];
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                rows[r][c] = op.get(r, c).multiply(s);
            }
        }
        return Operator.of(rows);
    }

    private static Operator matrix(double a, double b, double c, double d) {
        return Operator.of(new Complex[][] {
            {Complex.ofCartesian(a, 0), Complex.ofCartesian(b, 0)},
            {Complex.ofCartesian(c, 0), Complex.ofCartesian(d, 0)}});
    }
}
