package dev.qsim.observable;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

import org.apache.commons.numbers.complex.Complex;

import dev.qsim.Operator;
import dev.qsim.internal.Checks;

/**
 * A Hermitian observable {@code H = Σ_k w_k P_k}: a sum of Pauli products {@code P_k}, each with
 * phase +1, and finite real weights {@code w_k}. Every Hermitian operator on n qubits is such a
 * sum, since the 4^n Pauli products are a basis of the n-qubit matrices (Nielsen and Chuang
 * 2010, Quantum Computation and Quantum Information, exercise 2.70 and §8.3). Immutable and
 * thread-safe.
 *
 * <p>Terms keep the order they were given in; {@link #simplified()} merges equal products and
 * drops zero weights. A product given with phase -1 becomes its +1 form with the weight negated;
 * one with phase {@code ±i} is refused, as {@code i·P} is not Hermitian.
 *
 * @since 0.1
 */
public final class Observable {
    private final PauliProduct[] products;
    private final double[] weights;

    private Observable(PauliProduct[] products, double[] weights) {
        for (int k = 0; k < weights.length; k++) {
            if (!Double.isFinite(weights[k])) {
                // Sums and squares of finite weights can overflow; the result would be no
                // observable.
                throw new IllegalArgumentException("the weight of term " + k + " ("
                        + Checks.excerpt(products[k].toString()) + ") is " + weights[k]
                        + "; weights must stay finite (the arithmetic overflowed)");
            }
        }
        this.products = products;
        this.weights = weights;
    }

    /**
     * Returns the observable {@code weight · P} with {@code P} read by
     * {@link PauliProduct#parse(String)}.
     *
     * @param weight a finite real weight
     * @param pauli the Pauli product as text, such as {@code "Z0 Z1"} or {@code "XIZ"}
     * @return the observable
     * @throws IllegalArgumentException if the weight is not finite, the text is malformed, or
     *     its phase is {@code ±i}
     */
    public static Observable of(double weight, String pauli) {
        return new Builder().add(weight, pauli).build();
    }

    /**
     * Returns the observable {@code weight · P}.
     *
     * @param weight a finite real weight
     * @param pauli the Pauli product, phase ±1
     * @return the observable
     * @throws IllegalArgumentException if the weight is not finite or the phase is {@code ±i}
     */
    public static Observable of(double weight, PauliProduct pauli) {
        return new Builder().add(weight, pauli).build();
    }

    /**
     * Returns a builder that collects terms.
     *
     * @return a new, empty builder
     */
    public static Builder builder() {
        return new Builder();
    }

    /** Collects terms of an observable; mutable, not thread-safe. */
    public static final class Builder {
        private final List<PauliProduct> products = new ArrayList<>();
        private double[] weights = new double[8];

        private Builder() {
        }

        /**
         * Adds the term {@code weight · P} with {@code P} read from text.
         *
         * @param weight a finite real weight
         * @param pauli the Pauli product as text
         * @return this builder
         * @throws IllegalArgumentException if the weight is not finite, the text is malformed,
         *     or its phase is {@code ±i}; the builder is then unchanged
         */
        public Builder add(double weight, String pauli) {
            return add(weight, PauliProduct.parse(pauli));
        }

        /**
         * Adds the term {@code weight · P}.
         *
         * @param weight a finite real weight
         * @param pauli the Pauli product, phase +1 or -1 (-1 negates the weight)
         * @return this builder
         * @throws IllegalArgumentException if the weight is not finite or the phase is
         *     {@code ±i}; the builder is then unchanged
         */
        public Builder add(double weight, PauliProduct pauli) {
            Objects.requireNonNull(pauli, "pauli");
            if (!Double.isFinite(weight)) {
                throw new IllegalArgumentException("the weight of term " + pauli
                        + " must be finite but was " + weight);
            }
            if (!pauli.isHermitian()) {
                throw new IllegalArgumentException("the term " + pauli + " has phase "
                        + (pauli.phase() == 1 ? "+i" : "-i") + " and is not Hermitian; an"
                        + " observable takes products with phase +1 or -1");
            }
            int n = products.size();
            if (n == weights.length) {
                weights = Arrays.copyOf(weights, 2 * n);
            }
            weights[n] = pauli.phase() == 2 ? -weight : weight;
            products.add(pauli.withPhase(0));
            return this;
        }

        /**
         * Adds every term of an observable.
         *
         * @param h the observable
         * @return this builder
         */
        public Builder add(Observable h) {
            Objects.requireNonNull(h, "h");
            for (int k = 0; k < h.products.length; k++) {
                add(h.weights[k], h.products[k]);
            }
            return this;
        }

        /**
         * Returns the observable of the terms added so far, in order.
         *
         * @return the observable
         */
        public Observable build() {
            return new Observable(products.toArray(new PauliProduct[0]),
                    Arrays.copyOf(weights, products.size()));
        }
    }

    /**
     * Returns this observable plus the term {@code weight · P}.
     *
     * @param weight a finite real weight
     * @param pauli the Pauli product as text
     * @return a new observable with the term appended
     * @throws IllegalArgumentException as {@link Builder#add(double, String)}
     */
    public Observable plus(double weight, String pauli) {
        return new Builder().add(this).add(weight, pauli).build();
    }

    /**
     * Returns this observable plus another (terms appended, not merged).
     *
     * @param other the other observable
     * @return the sum
     */
    public Observable plus(Observable other) {
        return new Builder().add(this).add(other).build();
    }

    /**
     * Returns this observable with every weight multiplied by {@code factor}.
     *
     * @param factor a finite factor
     * @return the scaled observable
     * @throws IllegalArgumentException if {@code factor} is not finite
     */
    public Observable times(double factor) {
        Checks.requireFinite(factor, "the factor");
        double[] w = weights.clone();
        for (int k = 0; k < w.length; k++) {
            w[k] *= factor;
        }
        return new Observable(products.clone(), w);
    }

    /**
     * Returns the observable with equal products merged (weights added, in the order of first
     * appearance) and terms of weight exactly 0 dropped.
     *
     * @return the simplified observable
     */
    public Observable simplified() {
        return simplified(0);
    }

    /**
     * Returns the observable with equal products merged (in the order of first appearance) and
     * terms whose merged weight has magnitude at most {@code tolerance} dropped.
     *
     * @param tolerance at least 0
     * @return the simplified observable
     * @throws IllegalArgumentException if the tolerance is negative or not finite
     */
    public Observable simplified(double tolerance) {
        if (!(tolerance >= 0) || !Double.isFinite(tolerance)) {
            throw new IllegalArgumentException("the tolerance must be finite and at least 0 but"
                    + " was " + tolerance);
        }
        Map<PauliProduct, double[]> merged = new LinkedHashMap<>();
        for (int k = 0; k < products.length; k++) {
            merged.computeIfAbsent(products[k], p -> new double[1])[0] += weights[k];
        }
        List<PauliProduct> ps = new ArrayList<>();
        double[] ws = new double[merged.size()];
        for (Map.Entry<PauliProduct, double[]> e : merged.entrySet()) {
            double w = e.getValue()[0];
            if (Math.abs(w) > tolerance) {
                ws[ps.size()] = w;
                ps.add(e.getKey());
            }
        }
        return new Observable(ps.toArray(new PauliProduct[0]), Arrays.copyOf(ws, ps.size()));
    }

    /**
     * Returns {@code H²} as an observable, simplified. Products of anticommuting terms cancel
     * in pairs ({@code PQ + QP = 0}), and products of commuting terms are Hermitian with phase
     * ±1 (Nielsen and Chuang 2010, §10.5.1), so the square is again a real-weighted sum.
     *
     * @return the square
     */
    public Observable squared() {
        Builder b = new Builder();
        for (int a = 0; a < products.length; a++) {
            b.add(weights[a] * weights[a], PauliProduct.IDENTITY);
            for (int c = a + 1; c < products.length; c++) {
                if (products[a].commutesWith(products[c])) {
                    b.add(2 * weights[a] * weights[c], products[a].times(products[c]));
                }
            }
        }
        return b.build().simplified();
    }

    /**
     * Returns the number of terms.
     *
     * @return the term count
     */
    public int size() {
        return products.length;
    }

    /**
     * Returns the Pauli product of term {@code k} (phase +1).
     *
     * @param k the term index, in {@code [0, size())}
     * @return the product
     * @throws IndexOutOfBoundsException if {@code k} is out of range
     */
    public PauliProduct product(int k) {
        Objects.checkIndex(k, products.length);
        return products[k];
    }

    /**
     * Returns the weight of term {@code k}.
     *
     * @param k the term index, in {@code [0, size())}
     * @return the weight
     * @throws IndexOutOfBoundsException if {@code k} is out of range
     */
    public double weight(int k) {
        Objects.checkIndex(k, products.length);
        return weights[k];
    }

    /**
     * Returns one more than the highest qubit any term acts on (0 if all terms are identities).
     *
     * @return the span
     */
    public int span() {
        int s = 0;
        for (PauliProduct p : products) {
            s = Math.max(s, p.span());
        }
        return s;
    }

    /**
     * Returns the dense matrix on {@link #span()} qubits (at least 1).
     *
     * @return the operator
     * @throws IllegalArgumentException if the span exceeds {@value Operator#MAX_QUBITS}
     */
    public Operator toOperator() {
        return toOperator(Math.max(1, span()));
    }

    /**
     * Returns the dense {@code 2^n × 2^n} matrix {@code Σ_k w_k P_k} on {@code qubits} qubits,
     * bit order as in {@link dev.qsim}.
     *
     * @param qubits at least {@link #span()}, from 1 to {@value Operator#MAX_QUBITS}
     * @return the operator
     * @throws IllegalArgumentException if {@code qubits} is out of range
     */
    public Operator toOperator(int qubits) {
        if (qubits < Math.max(1, span()) || qubits > Operator.MAX_QUBITS) {
            throw new IllegalArgumentException("toOperator needs a qubit count in ["
                    + Math.max(1, span()) + ", " + Operator.MAX_QUBITS + "] for this observable"
                    + " but was " + qubits);
        }
        int d = 1 << qubits;
        double[] re = new double[d * d];
        double[] im = new double[d * d];
        for (int k = 0; k < products.length; k++) {
            long x = products[k].xBits();
            long z = products[k].zBits();
            // P|j> = i^{|x∧z|} (-1)^{|j∧z|} |j⊕x>.
            int k0 = Long.bitCount(x & z) & 3;
            double w = weights[k];
            for (int j = 0; j < d; j++) {
                int row = (int) (j ^ x);
                int e = (k0 + 2 * (Long.bitCount(j & z) & 1)) & 3;
                int at = row * d + j;
                switch (e) {
                    case 0:
                        re[at] += w;
                        break;
                    case 1:
                        im[at] += w;
                        break;
                    case 2:
                        re[at] -= w;
                        break;
                    default:
                        im[at] -= w;
                        break;
                }
            }
        }
        Complex[][] rows = new Complex[d][d];
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                rows[r][c] = Complex.ofCartesian(re[r * d + c], im[r * d + c]);
            }
        }
        return Operator.of(rows);
    }

    /**
     * Compares terms (products and weights, bitwise) in order.
     *
     * @param o another object
     * @return whether the observables have the same terms in the same order
     */
    @Override
    public boolean equals(Object o) {
        if (this == o) {
            return true;
        }
        if (!(o instanceof Observable)) {
            return false;
        }
        Observable h = (Observable) o;
        return Arrays.equals(products, h.products) && Arrays.equals(weights, h.weights);
    }

    /**
     * Returns a hash code consistent with {@link #equals(Object)}.
     *
     * @return the hash code
     */
    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(products) + Arrays.hashCode(weights);
    }

    /**
     * Returns the terms as text, such as {@code "0.5 Z0 Z1 - 0.25 X0"}; {@code "0"} when empty.
     *
     * @return the text
     */
    @Override
    public String toString() {
        if (products.length == 0) {
            return "0";
        }
        StringBuilder sb = new StringBuilder();
        for (int k = 0; k < products.length; k++) {
            double w = weights[k];
            if (k == 0) {
                sb.append(w);
            } else {
                sb.append(w < 0 || (w == 0 && 1 / w < 0) ? " - " : " + ").append(Math.abs(w));
            }
            sb.append(' ').append(products[k]);
        }
        return sb.toString();
    }
}
