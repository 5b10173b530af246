package dev.qsim.mps;

import java.util.Arrays;
import java.util.List;
import java.util.Objects;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.Operator;
import dev.qsim.StateVector;
import dev.qsim.Tally;
import dev.qsim.internal.Bridge;
import dev.qsim.internal.Checks;
import dev.qsim.observable.Observable;
import dev.qsim.observable.PauliProduct;

/**
 * A matrix product state of {@code n} qubits: one tensor per qubit, joined in a line by bonds
 * whose dimension grows with the entanglement across them, so that wide circuits with little
 * entanglement fit in memory that a state vector of {@code 2^n} amplitudes never could (Vidal
 * 2003, "Efficient classical simulation of slightly entangled quantum computations", Phys. Rev.
 * Lett. 91, 147902, doi:10.1103/PhysRevLett.91.147902; Schollwöck 2011, "The density-matrix
 * renormalization group in the age of matrix product states", Ann. Phys. 326, 96,
 * doi:10.1016/j.aop.2010.09.012). Like {@link StateVector} it is mutable:
 * {@link #apply(Circuit)}, {@link #apply(Operator, int...)} and
 * {@link #measure(int, UniformRandomProvider)} change it in place, {@link #copy()} keeps one.
 * Not thread-safe.
 *
 * <p><b>Storage and canonical form.</b> Qubit {@code q} is tensor {@code q} of the line (bit
 * order as in the {@linkplain dev.qsim package conventions}); tensor {@code q} has indices
 * (left bond, qubit value, right bond). The tensors are kept in mixed canonical form about one
 * orthogonality centre (Schollwöck 2011, §4.4), moved by QR decompositions, so that the singular
 * values of a block that holds the centre are the Schmidt coefficients of the state across that
 * cut, and dropping the smallest of them is the best approximation with fewer (Eckart and
 * Young 1936).
 *
 * <p><b>Gates.</b> A one-qubit gate multiplies one tensor. A gate on k qubits (two-qubit gates,
 * Toffoli, Fredkin, any number of controls, any {@link Operator}) is applied by contraction:
 * its qubits are brought onto adjacent tensors by swaps (a gate on qubits {@code d} apart costs
 * {@code 2(d - 1)} swap updates; the swaps are undone, so qubit {@code q} always stays tensor
 * {@code q}), the k tensors are contracted into one block, the {@code 2^k x 2^k} matrix is
 * applied, and the block is split back with {@code k - 1} singular value decompositions. Each
 * split keeps at most {@link #bondLimit()} Schmidt values, drops values that are numerically
 * zero ({@code σ <= max(m, n) ε σ_1}, Golub and Van Loan 2013, §5.4.1), and then drops the
 * largest tail of values whose weight {@code Σσ²} is at most {@link #truncation()} times the
 * total; the kept values are rescaled so the state stays normalised.
 *
 * <p><b>What accuracy was given up.</b> Each split that drops weight {@code w} (its share of
 * {@code Σσ²}) leaves a normalised state whose overlap with the untruncated one is exactly
 * {@code 1 - w}. {@link #discardedWeight()} is {@code Σw};
 * {@link #fidelityEstimate()} is {@code Π(1 - w)}, the usual estimate of the fidelity with the
 * exact state (Zhou, Stoudenmire and Waintal 2020, "What limits the simulation of quantum
 * computers?", Phys. Rev. X 10, 041038, doi:10.1103/PhysRevX.10.041038), which assumes the
 * errors of successive truncations do not add coherently; {@link #fidelityLowerBound()} is
 * {@code cos²(min(π/2, Σ asin √w))}, a rigorous lower bound on {@code |<exact|this>|²} for a
 * unitary circuit: the angle {@code arccos|<φ|ψ>|} between pure states is a metric (Nielsen and
 * Chuang 2010, §9.2.2), unitaries preserve it, and each truncation moves the state by
 * {@code asin √w}. After a mid-circuit measurement the figures still total the truncations, but
 * bound nothing about the conditioned state.
 *
 * <p><b>Reads</b> never change the state: an amplitude costs {@code O(n χ²)}, an expectation
 * value of a Pauli product {@code O(span χ³)} per term, a marginal of k qubits
 * {@code O(2^k span χ³)}, a sampled shot {@code O(n χ²)} (Ferris and Vidal 2012, "Perfect
 * sampling with unitary tensor networks", Phys. Rev. B 85, 165146,
 * doi:10.1103/PhysRevB.85.165146), where χ is the largest bond dimension.
 *
 * <p>Every tensor allocation that grows with the bond dimension is checked against the heap
 * first: a state or a step the heap cannot hold is refused with an {@link IllegalStateException}
 * naming the bytes and the {@code -Xmx} that would do. Run circuits with measurement, reset and
 * classical control through {@link dev.qsim.Simulator} with
 * {@link dev.qsim.Simulator.Engine#MATRIX_PRODUCT}.
 *
 * @since 0.1
 */
public final class MatrixProductState {
    /** The bond limit of {@link #zero(int)}: {@value}. */
    public static final int DEFAULT_BOND_LIMIT = 64;

    /**
     * The largest bond limit: {@value}. A two-qubit gate at bond dimension χ costs an SVD of a
     * {@code 2χ x 2χ} matrix, about {@code 160 χ³} flops: minutes per gate at this limit.
     */
    public static final int MAX_BOND_LIMIT = 4096;

    /** The truncation threshold of {@link #zero(int)}: {@value} (drop only zero values). */
    public static final double DEFAULT_TRUNCATION = 0;

    /** The most qubits {@link #marginal(int...)} takes at once: {@value}. */
    public static final int MAX_MARGINAL_QUBITS = 20;

    static {
        Bridge.register(new MatrixProductEngine());
    }

    private final Chain chain;

    MatrixProductState(Chain chain) {
        this.chain = chain;
    }

    /**
     * Returns {@code |0...0>} on {@code n} qubits with the default bond limit
     * ({@value #DEFAULT_BOND_LIMIT}) and truncation threshold ({@value #DEFAULT_TRUNCATION}).
     *
     * @param n qubits, from 1 to {@link Circuit#MAX_QUBITS}
     * @return a new state
     * @throws IllegalArgumentException if {@code n} is out of range
     * @throws IllegalStateException if the heap cannot hold the state
     */
    public static MatrixProductState zero(int n) {
        return zero(n, DEFAULT_BOND_LIMIT, DEFAULT_TRUNCATION);
    }

    /**
     * Returns {@code |0...0>} on {@code n} qubits whose bonds are truncated as the class
     * documentation says.
     *
     * @param n qubits, from 1 to {@link Circuit#MAX_QUBITS}
     * @param bondLimit the most Schmidt values kept across any bond, from 1 to
     *     {@value #MAX_BOND_LIMIT}
     * @param truncation the largest share of weight one split may drop, in {@code [0, 1)}
     * @return a new state
     * @throws IllegalArgumentException if an argument is out of range
     * @throws IllegalStateException if the heap cannot hold the state
     */
    public static MatrixProductState zero(int n, int bondLimit, double truncation) {
        Checks.requireInRange(n, 1, Circuit.MAX_QUBITS, "qubit count");
        requireSettings(bondLimit, truncation);
        return new MatrixProductState(Chain.zero(n, bondLimit, truncation));
    }

    /** Checks a bond limit and a truncation threshold (the facade's through the bridge). */
    static void requireSettings(int bondLimit, double truncation) {
        Checks.requireInRange(bondLimit, 1, MAX_BOND_LIMIT, "bond limit");
        if (!(truncation >= 0 && truncation < 1)) {
            throw new IllegalArgumentException("the truncation threshold (the largest share of"
                    + " weight one split may drop) must be in [0, 1) but was " + truncation);
        }
    }

    /**
     * Returns the number of qubits.
     *
     * @return n
     */
    public int qubits() {
        return chain.n;
    }

    /**
     * Returns the most Schmidt values kept across a bond.
     *
     * @return the bond limit
     */
    public int bondLimit() {
        return chain.bondLimit;
    }

    /**
     * Returns the truncation threshold: the largest share of weight one split may drop.
     *
     * @return the threshold
     */
    public double truncation() {
        return chain.threshold;
    }

    /**
     * Returns the dimension of the bond between qubits {@code bond} and {@code bond + 1}: the
     * number of Schmidt values kept across that cut.
     *
     * @param bond from 0 to {@code n - 2}
     * @return the dimension
     * @throws IndexOutOfBoundsException if {@code bond} is out of range
     */
    public int bondDimension(int bond) {
        if (bond < 0 || bond > chain.n - 2) {
            throw new IndexOutOfBoundsException("bond " + bond + " is out of range [0, "
                    + (chain.n - 2) + "] for a " + chain.n + "-qubit state (bond b joins qubits"
                    + " b and b + 1)");
        }
        return chain.bond[bond + 1];
    }

    /**
     * Returns the largest bond dimension (1 for a product state).
     *
     * @return the largest dimension
     */
    public int maxBondDimension() {
        return chain.maxBond();
    }

    /**
     * Returns the bytes the tensors occupy.
     *
     * @return the bytes
     */
    public long bytes() {
        return chain.bytes();
    }

    /**
     * Returns the sum of the weights dropped by every truncation so far (0 if none).
     *
     * @return {@code Σw}
     */
    public double discardedWeight() {
        return chain.discarded;
    }

    /**
     * Returns {@code Π(1 - w)} over the truncations so far, the usual estimate of the fidelity
     * with the exact state (see the class documentation; not a bound).
     *
     * @return the estimate, in {@code [0, 1]}
     */
    public double fidelityEstimate() {
        return Math.exp(chain.logFidelity);
    }

    /**
     * Returns {@code cos²(min(π/2, Σ asin √w))}, a lower bound on the fidelity
     * {@code |<exact|this>|²} with the state the same unitary gates make without truncation
     * (see the class documentation).
     *
     * @return the bound, in {@code [0, 1]}
     */
    public double fidelityLowerBound() {
        double a = Math.min(Math.PI / 2, chain.angle);
        double c = Math.cos(a);
        return c * c;
    }

    /**
     * Returns the number of splits whose bond limit or threshold dropped a Schmidt value that
     * was not numerically zero.
     *
     * @return the count
     */
    public long truncations() {
        return chain.truncations;
    }

    /**
     * Applies a circuit of gates in place. Gates on several qubits are routed and split as the
     * class documentation says.
     *
     * @param circuit a circuit of gates only (delays allowed), on the same number of qubits
     * @return this state
     * @throws IllegalArgumentException if the qubit counts differ or the circuit measures,
     *     resets or has classical control (run those with {@link dev.qsim.Simulator})
     * @throws IllegalStateException if the heap cannot hold a step
     */
    public MatrixProductState apply(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        if (circuit.qubits() != qubits()) {
            throw new IllegalArgumentException("the circuit has " + circuit.qubits()
                    + " qubit(s) but the state has " + qubits() + "; they must match");
        }
        List<Instruction> list = circuit.instructions();
        for (int i = 0; i < list.size(); i++) {
            Instruction in = list.get(i);
            boolean gate = in.kind() == Instruction.Kind.GATE && !in.isDynamic();
            if (!gate && in.kind() != Instruction.Kind.DELAY) {
                throw new IllegalArgumentException("MatrixProductState.apply(Circuit) needs a"
                        + " circuit of gates only, but instruction " + i + " is '"
                        + Checks.excerpt(in.toString()) + "'; run circuits with measurement,"
                        + " reset or classical control with Simulator (engine MATRIX_PRODUCT)");
            }
        }
        for (Instruction in : list) {
            if (in.kind() == Instruction.Kind.GATE) {
                chain.applyGate(in.qubits(), GateMatrices.of(in, null));
            }
        }
        return this;
    }

    /**
     * Applies a unitary operator to some qubits in place; bit {@code j} of the operator's matrix
     * index is {@code qubits[j]}, and with no qubits given, all qubits in order.
     *
     * @param op a unitary operator (within {@value Operator#UNITARY_TOLERANCE})
     * @param qubits distinct qubits, as many as the operator acts on
     * @return this state
     * @throws IndexOutOfBoundsException if a qubit is out of range
     * @throws IllegalArgumentException if the qubit count does not match the operator, a qubit
     *     repeats, or the operator is not unitary
     * @throws IllegalStateException if the heap cannot hold a step
     */
    public MatrixProductState apply(Operator op, int... qubits) {
        Objects.requireNonNull(op, "op");
        Objects.requireNonNull(qubits, "qubits");
        int[] qs = qubits.length == 0 ? allQubits(qubits()) : qubits.clone();
        Instruction in = Circuit.builder(qubits(), 0).apply(op, qs).build().instructions()
                .get(0);
        chain.applyGate(in.qubits(), GateMatrices.of(in, null));
        return this;
    }

    private static int[] allQubits(int n) {
        int[] qs = new int[n];
        Arrays.setAll(qs, i -> i);
        return qs;
    }

    /** Reads a bitstring, highest qubit leftmost, into bit j = qubit j. */
    private boolean[] bits(String bits) {
        Objects.requireNonNull(bits, "bits");
        int n = qubits();
        if (bits.length() != n) {
            throw new IllegalArgumentException("a bitstring of the " + n + "-qubit state needs "
                    + n + " characters but \"" + Checks.excerpt(bits) + "\" has "
                    + bits.length());
        }
        boolean[] out = new boolean[n];
        for (int i = 0; i < n; i++) {
            char ch = bits.charAt(n - 1 - i);
            if (ch != '0' && ch != '1') {
                throw new IllegalArgumentException("a bitstring holds only '0' and '1', but \""
                        + Checks.excerpt(bits) + "\" has '" + ch + "' at position " + (n - 1 - i));
            }
            out[i] = ch == '1';
        }
        return out;
    }

    private boolean[] bits(long index) {
        int n = qubits();
        if (n > 63 || index < 0 || index >= (1L << n)) {
            throw new IndexOutOfBoundsException(n > 63 ? "a basis index addresses at most 63"
                    + " qubits but the state has " + n + "; give the bitstring instead"
                    : "basis index " + index + " is out of range [0, " + ((1L << n) - 1) + "]");
        }
        boolean[] out = new boolean[n];
        for (int i = 0; i < n; i++) {
            out[i] = ((index >>> i) & 1) == 1;
        }
        return out;
    }

    /**
     * Returns the amplitude of a basis state given as a bitstring, highest qubit leftmost (the
     * {@linkplain dev.qsim package conventions}).
     *
     * @param bits n characters, each '0' or '1'
     * @return {@code <bits|ψ>}
     * @throws IllegalArgumentException if the length is not n or a character is not a bit
     */
    public Complex amplitude(String bits) {
        double[] a = Reads.amplitude(chain, bits(bits));
        return Complex.ofCartesian(a[0], a[1]);
    }

    /**
     * Returns the amplitude of a basis state given by its index (at most 63 qubits).
     *
     * @param index the basis index, bit k the value of qubit k
     * @return {@code <index|ψ>}
     * @throws IndexOutOfBoundsException if the state has more than 63 qubits or the index is out
     *     of range
     */
    public Complex amplitude(long index) {
        double[] a = Reads.amplitude(chain, bits(index));
        return Complex.ofCartesian(a[0], a[1]);
    }

    /**
     * Returns the probability of a basis state given as a bitstring.
     *
     * @param bits n characters, each '0' or '1', highest qubit leftmost
     * @return {@code |<bits|ψ>|²}
     * @throws IllegalArgumentException if the length is not n or a character is not a bit
     */
    public double probability(String bits) {
        double[] a = Reads.amplitude(chain, bits(bits));
        return a[0] * a[0] + a[1] * a[1];
    }

    /**
     * Returns the marginal distribution of some qubits: entry {@code v} is the probability that
     * qubit {@code qubits[j]} reads bit {@code j} of {@code v}.
     *
     * @param qubits distinct qubits, from 1 to {@value #MAX_MARGINAL_QUBITS}
     * @return a new array of {@code 2^k} probabilities
     * @throws IndexOutOfBoundsException if a qubit is out of range
     * @throws IllegalArgumentException if a qubit repeats, or none or more than
     *     {@value #MAX_MARGINAL_QUBITS} are given
     * @throws IllegalStateException if the heap cannot hold an environment
     */
    public double[] marginal(int... qubits) {
        Objects.requireNonNull(qubits, "qubits");
        Checks.requireDistinctQubits(qubits, qubits(), "the marginal's qubits");
        if (qubits.length < 1 || qubits.length > MAX_MARGINAL_QUBITS) {
            throw new IllegalArgumentException("a marginal over 1 to " + MAX_MARGINAL_QUBITS
                    + " qubits is allowed but " + qubits.length + " were given");
        }
        return Reads.marginal(chain, qubits.clone());
    }

    /**
     * Returns {@code <ψ|P|ψ>} for one Pauli product, its phase included (real when the phase
     * is ±1).
     *
     * @param pauli the product, on qubits of this state only
     * @return the expectation value
     * @throws IllegalArgumentException if the product acts on a qubit outside the state
     * @throws IllegalStateException if the heap cannot hold an environment
     */
    public Complex expectation(PauliProduct pauli) {
        Objects.requireNonNull(pauli, "pauli");
        requireFits(pauli.span(), "the Pauli product " + pauli);
        double[] v = pauliValue(pauli, null);
        return Complex.ofCartesian(v[0], v[1]);
    }

    /**
     * Returns the expectation value {@code <ψ|H|ψ> = Σ_k w_k <ψ|P_k|ψ>} of an observable
     * (Nielsen and Chuang 2010, §2.2.5, eq. 2.110).
     *
     * @param h the observable, on qubits of this state only
     * @return the expectation value
     * @throws IllegalArgumentException if a term acts on a qubit outside the state
     * @throws IllegalStateException if the heap cannot hold an environment
     */
    public double expectation(Observable h) {
        Objects.requireNonNull(h, "h");
        requireFits(h.span(), "the observable");
        int maxFrom = 0;
        int minTo = qubits() - 1;
        for (int k = 0; k < h.size(); k++) {
            PauliProduct p = h.product(k);
            if (p.span() > 0) {
                maxFrom = Math.max(maxFrom, first(p));
                minTo = Math.min(minTo, p.span() - 1);
            }
        }
        Reads.Environments env = new Reads.Environments(chain, maxFrom, minTo);
        double sum = 0;
        for (int k = 0; k < h.size(); k++) {
            sum += h.weight(k) * pauliValue(h.product(k), env)[0];
        }
        return sum;
    }

    private static int first(PauliProduct p) {
        int from = 0;
        while (p.letter(from) == 'I') {
            from++;
        }
        return from;
    }

    private void requireFits(int span, String what) {
        if (span > qubits()) {
            throw new IllegalArgumentException("qubit " + (span - 1) + " of "
                    + Checks.excerpt(what) + " is out of range [0, " + (qubits() - 1)
                    + "] for a " + qubits() + "-qubit state");
        }
    }

    private static final double[] X = {0, 0, 1, 0, 1, 0, 0, 0};
    private static final double[] Y = {0, 0, 0, -1, 0, 1, 0, 0};
    private static final double[] Z = {1, 0, 0, 0, 0, 0, -1, 0};

    /** The value of a Pauli product, through cached environments when given. */
    private double[] pauliValue(PauliProduct p, Reads.Environments env) {
        int span = p.span();
        double re;
        double im;
        if (span == 0) {
            re = 1;
            im = 0;
        } else {
            int from = first(p);
            double[][] ops = new double[span - from][];
            for (int q = from; q < span; q++) {
                char letter = p.letter(q);
                ops[q - from] = letter == 'X' ? X : letter == 'Y' ? Y : letter == 'Z' ? Z : null;
            }
            double[] v = env == null ? Reads.product(chain, from, ops) : env.product(from, ops);
            re = v[0];
            im = v[1];
        }
        switch (p.phase()) {
            case 1:
                return new double[] {-im, re};
            case 2:
                return new double[] {-re, -im};
            case 3:
                return new double[] {im, -re};
            default:
                return new double[] {re, im};
        }
    }

    /**
     * Measures one qubit in the computational basis: draws 0 or 1 with its Born probability,
     * then collapses and renormalises the state (Nielsen and Chuang 2010, §2.2.3).
     *
     * @param qubit the qubit
     * @param rng the source of randomness (one uniform is drawn)
     * @return the outcome, 0 or 1
     * @throws IndexOutOfBoundsException if {@code qubit} is out of range
     */
    public int measure(int qubit, UniformRandomProvider rng) {
        Checks.requireQubit(qubit, qubits());
        Objects.requireNonNull(rng, "rng");
        return chain.measure(qubit, rng.nextDouble());
    }

    /**
     * Samples measurement outcomes of some qubits without changing the state, each shot drawn
     * qubit by qubit from the exact conditional probabilities (Ferris and Vidal 2012). Bit
     * {@code j} of an outcome is qubit {@code qubits[j]}; with no qubits given, all qubits in
     * order. Each shot draws one uniform for each qubit up to the highest sampled one.
     *
     * @param shots the number of shots, at least 1
     * @param rng the source of randomness
     * @param qubits distinct qubits
     * @return the tally, of width {@code qubits.length} (or {@code n})
     * @throws IllegalArgumentException if {@code shots < 1} or a qubit repeats
     * @throws IndexOutOfBoundsException if a qubit is out of range
     * @throws IllegalStateException if the heap cannot hold the environments or the tally
     */
    public Tally sample(int shots, UniformRandomProvider rng, int... qubits) {
        Checks.requireShots(shots);
        Objects.requireNonNull(rng, "rng");
        Objects.requireNonNull(qubits, "qubits");
        int[] qs = qubits.length == 0 ? allQubits(qubits()) : qubits.clone();
        Checks.requireDistinctQubits(qs, qubits(), "the sampled qubits");
        int last = 0;
        for (int q : qs) {
            last = Math.max(last, q);
        }
        Reads.Sampler sampler = new Reads.Sampler(chain, last);
        boolean[] bits = new boolean[last + 1];
        boolean[] reg = new boolean[qs.length];
        Tally.Recorder out = Tally.recorder(qs.length);
        for (int s = 0; s < shots; s++) {
            sampler.draw(rng::nextDouble, bits);
            for (int j = 0; j < qs.length; j++) {
                reg[j] = bits[qs[j]];
            }
            out.add(reg, 1);
        }
        return out.build();
    }

    /**
     * Returns the dense state vector this state stands for (at most
     * {@value StateVector#MAX_QUBITS} qubits; the heap is the real limit).
     *
     * @return a new state vector
     * @throws IllegalArgumentException if the state has more than
     *     {@value StateVector#MAX_QUBITS} qubits
     * @throws IllegalStateException if the heap cannot hold the state vector
     */
    public StateVector toStateVector() {
        if (qubits() > StateVector.MAX_QUBITS) {
            throw new IllegalArgumentException("a state vector holds at most "
                    + StateVector.MAX_QUBITS + " qubits but this state has " + qubits());
        }
        return Bridge.states().wrap(Reads.toAmplitudes(chain), 1);
    }

    /**
     * Returns an independent copy, truncation record included.
     *
     * @return the copy
     * @throws IllegalStateException if the heap cannot hold it
     */
    public MatrixProductState copy() {
        return new MatrixProductState(chain.copy());
    }

    /**
     * Returns a short description, such as
     * {@code "MatrixProductState[100 qubits, largest bond 64 of 64, 2.1 MiB, discarded weight
     * 3.2e-05]"}.
     *
     * @return the text
     */
    @Override
    public String toString() {
        return String.format(java.util.Locale.ROOT, "MatrixProductState[%d qubits, largest bond"
                + " %d of %d, %s, discarded weight %.3g]", qubits(), maxBondDimension(),
                bondLimit(), dev.qsim.internal.Heap.size(bytes()), discardedWeight());
    }
}
