package dev.qsim.spark.benchmarking;

import java.util.HashMap;
import java.util.Map;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Instruction;
import dev.qsim.Operator;

/**
 * The two-qubit Clifford group modulo global phase: its 11,520 elements, each as a short circuit
 * of {@code h}, {@code s}, {@code x}, {@code y}, {@code z} and {@code cnot} gates, with
 * composition and inverses. Immutable and thread-safe; {@link #group()} builds it once.
 *
 * <p>The elements are generated in the four classes of Córcoles et al. (2013), "Process
 * verification of two-qubit quantum gates by randomized benchmarking", Phys. Rev. A 87,
 * 030301(R), doi:10.1103/PhysRevA.87.030301 (also Barends et al. 2014, Nature 508, 500,
 * supplementary information), from the 24 single-qubit Cliffords {@code C1} and the
 * three-element subgroup {@code S1} that permutes the axes X → Z → Y → X ({@code I},
 * {@code H} then {@code S}, and its inverse {@code S†} then {@code H}):
 * <ul>
 *   <li>elements {@code 0 .. 575}, single-qubit class: {@code C1 ⊗ C1};</li>
 *   <li>{@code 576 .. 5759}, CNOT-like class: {@code C1 ⊗ C1}, then {@code cnot(0, 1)}, then
 *       {@code S1 ⊗ S1};</li>
 *   <li>{@code 5760 .. 10943}, iSWAP-like class: {@code C1 ⊗ C1}, then {@code cnot(0, 1)} and
 *       {@code cnot(1, 0)}, then {@code S1 ⊗ S1};</li>
 *   <li>{@code 10944 .. 11519}, SWAP-like class: {@code C1 ⊗ C1}, then {@code cnot(0, 1)},
 *       {@code cnot(1, 0)}, {@code cnot(0, 1)}.</li>
 * </ul>
 * {@code 576 + 5184 + 5184 + 576 = 11520}, the order of the two-qubit Clifford group modulo
 * phases, {@code 2^(n²+2n) Π_{j=1..n} (4^j - 1)} for {@code n = 2} (Calderbank, Rains, Shor
 * and Sloane 1998, IEEE Trans. Inf. Theory 44, 1369; Koenig and Smolin 2014, J. Math. Phys.
 * 55, 122202), and on average 1.5 CNOT gates per element. A single-qubit Clifford is one of
 * {@code I, H, S, H·S, S·H, H·S·H} (in circuit order) followed by one of {@code I, X, Y, Z}.
 * Element 0 is the identity. Drawing an index uniformly from {@code [0, 11520)} draws a
 * Clifford uniformly.
 *
 * <p>Elements are told apart by how they conjugate the Pauli operators (their stabilizer
 * tableau, Gottesman 1998, "The Heisenberg representation of quantum computers",
 * arXiv:quant-ph/9807006): the images {@code U P U†} of {@code X0, Z0, X1, Z1}, each a signed
 * Pauli product, identify {@code U} up to a global phase. Composition and inverses multiply the
 * 4 x 4 unitaries and look the product's images up.
 *
 * @since 0.1
 */
public final class TwoQubitCliffords {
    /** The number of elements: {@value}. */
    public static final int SIZE = 11_520;

    private static final int C1 = 24;
    private static final int S1 = 3;
    private static final int SINGLE = C1 * C1;
    private static final int CNOT_LIKE = SINGLE * S1 * S1;

    /** Gate words of the six coset representatives of the single-qubit group. */
    private static final Gate[][] REPRESENTATIVES = {{}, {Gate.H}, {Gate.S}, {Gate.H, Gate.S},
        {Gate.S, Gate.H}, {Gate.H, Gate.S, Gate.H}};
    private static final Gate[][] PAULIS = {{}, {Gate.X}, {Gate.Y}, {Gate.Z}};
    /**
     * The subgroup permuting the axes cyclically, in circuit order: I, (H, S) and its inverse
     * (S†, H), which is (H, S) twice up to a phase.
     */
    private static final Gate[][] CYCLES = {{}, {Gate.H, Gate.S}, {Gate.S_DAGGER, Gate.H}};

    private static final class Holder {
        static final TwoQubitCliffords GROUP = new TwoQubitCliffords();
    }

    private final Circuit[] circuits = new Circuit[SIZE];
    /** Each element's unitary, 4 x 4, row-major, re/im interleaved. */
    private final double[][] unitaries = new double[SIZE][];
    private final int[] inverses = new int[SIZE];
    private final Map<Integer, Integer> byImages = new HashMap<>();

    private TwoQubitCliffords() {
        for (int e = 0; e < SIZE; e++) {
            circuits[e] = build(e);
            unitaries[e] = matrix(circuits[e].toOperator());
            Integer old = byImages.put(images(unitaries[e]), e);
            if (old != null) {
                throw new IllegalStateException("elements " + old + " and " + e + " coincide");
            }
        }
        for (int e = 0; e < SIZE; e++) {
            inverses[e] = lookup(dagger(unitaries[e]));
        }
    }

    /**
     * Returns the group, built on first use (about 0.3 s) and shared.
     *
     * @return the group
     */
    public static TwoQubitCliffords group() {
        return Holder.GROUP;
    }

    /**
     * Returns the circuit of an element: gates on qubits 0 and 1, no classical bits.
     *
     * @param element the element, in {@code [0, 11520)}
     * @return the circuit
     * @throws IndexOutOfBoundsException if the element is out of range
     */
    public Circuit circuit(int element) {
        return circuits[check(element)];
    }

    /**
     * Returns the element that applies {@code first}, then {@code second}.
     *
     * @param first the element applied first
     * @param second the element applied next
     * @return their product {@code second · first}
     * @throws IndexOutOfBoundsException if an element is out of range
     */
    public int compose(int first, int second) {
        return lookup(times(unitaries[check(second)], unitaries[check(first)]));
    }

    /**
     * Returns the inverse of an element.
     *
     * @param element the element
     * @return the element that undoes it
     * @throws IndexOutOfBoundsException if the element is out of range
     */
    public int inverse(int element) {
        return inverses[check(element)];
    }

    /**
     * Draws an element uniformly.
     *
     * @param rng the source of randomness
     * @return an element in {@code [0, 11520)}
     */
    public int sample(UniformRandomProvider rng) {
        return rng.nextInt(SIZE);
    }

    /**
     * Returns the element whose unitary is the given one up to a global phase.
     *
     * @param unitary a two-qubit Clifford unitary
     * @return the element
     * @throws IllegalArgumentException if the operator is not a two-qubit Clifford
     */
    public int find(Operator unitary) {
        if (unitary.qubits() != 2 || !unitary.isUnitary(1e-9)) {
            throw new IllegalArgumentException("a two-qubit Clifford must be a unitary on 2"
                    + " qubits but this operator has " + unitary.qubits() + " qubit(s)"
                    + (unitary.qubits() == 2 ? " and is not unitary" : ""));
        }
        return lookup(matrix(unitary));
    }

    private static int check(int element) {
        if (element < 0 || element >= SIZE) {
            throw new IndexOutOfBoundsException("element " + element + " is out of range [0, "
                    + (SIZE - 1) + "]");
        }
        return element;
    }

    private int lookup(double[] u) {
        Integer e = byImages.get(images(u));
        if (e == null) {
            throw new IllegalArgumentException("the operator is not a two-qubit Clifford: it"
                    + " does not map every Pauli operator to a Pauli operator");
        }
        return e;
    }

    /** Element {@code e} as a circuit, in the classes of the class description. */
    private static Circuit build(int e) {
        Circuit.Builder b = Circuit.builder(2, 0);
        int rest = e;
        if (rest < SINGLE) {
            singles(b, rest / C1, rest % C1);
            return b.build();
        }
        rest -= SINGLE;
        if (rest < 2 * CNOT_LIKE) {
            boolean iswap = rest >= CNOT_LIKE;
            rest %= CNOT_LIKE;
            int pair = rest / (S1 * S1);
            int cycles = rest % (S1 * S1);
            singles(b, pair / C1, pair % C1);
            b.cnot(0, 1);
            if (iswap) {
                b.cnot(1, 0);
            }
            word(b, CYCLES[cycles / S1], 0);
            word(b, CYCLES[cycles % S1], 1);
            return b.build();
        }
        rest -= 2 * CNOT_LIKE;
        singles(b, rest / C1, rest % C1);
        b.cnot(0, 1).cnot(1, 0).cnot(0, 1);
        return b.build();
    }

    /** Single-qubit Clifford {@code a} on qubit 0 and {@code c} on qubit 1. */
    private static void singles(Circuit.Builder b, int a, int c) {
        word(b, REPRESENTATIVES[a / 4], 0);
        word(b, PAULIS[a % 4], 0);
        word(b, REPRESENTATIVES[c / 4], 1);
        word(b, PAULIS[c % 4], 1);
    }

    private static void word(Circuit.Builder b, Gate[] gates, int q) {
        for (Gate g : gates) {
            b.gate(g, q);
        }
    }

    // ------------------------------------------------------------------ 4 x 4 algebra

    /** The Pauli matrices I, X, Y, Z, 2 x 2, re/im interleaved. */
    private static final double[][] SIGMA = {
        {1, 0, 0, 0, 0, 0, 1, 0},
        {0, 0, 1, 0, 1, 0, 0, 0},
        {0, 0, 0, -1, 0, 1, 0, 0},
        {1, 0, 0, 0, 0, 0, -1, 0}};
    /** The 16 two-qubit Pauli products, index {@code 4 a + b}: {@code σ_a} on qubit 1. */
    private static final double[][] PRODUCTS = new double[16][];
    /** The generators X0, Z0, X1, Z1 as indices into {@link #PRODUCTS}. */
    private static final int[] GENERATORS = {1, 3, 4, 12};

    static {
        for (int a = 0; a < 4; a++) {
            for (int b = 0; b < 4; b++) {
                double[] m = new double[32];
                for (int r = 0; r < 4; r++) {
                    for (int c = 0; c < 4; c++) {
                        // Index bit 0 is qubit 0: entry (r, c) = σ_a[r1][c1] σ_b[r0][c0].
                        int i1 = 2 * ((r >> 1) * 2 + (c >> 1));
                        int i0 = 2 * ((r & 1) * 2 + (c & 1));
                        double re = SIGMA[a][i1] * SIGMA[b][i0] - SIGMA[a][i1 + 1]
                                * SIGMA[b][i0 + 1];
                        double im = SIGMA[a][i1] * SIGMA[b][i0 + 1] + SIGMA[a][i1 + 1]
                                * SIGMA[b][i0];
                        m[2 * (4 * r + c)] = re;
                        m[2 * (4 * r + c) + 1] = im;
                    }
                }
                PRODUCTS[4 * a + b] = m;
            }
        }
    }

    /**
     * The images of X0, Z0, X1, Z1 under {@code P -> U P U†}, 5 bits each (the product's index
     * and its sign), as one number.
     */
    static int images(double[] u) {
        double[] ud = dagger(u);
        int key = 0;
        for (int g : GENERATORS) {
            double[] q = times(times(u, PRODUCTS[g]), ud);
            int found = -1;
            for (int k = 0; k < 16; k++) {
                // tr(R Q) / 4 is ±1 for the image's product R and 0 for every other.
                double re = 0;
                for (int i = 0; i < 4; i++) {
                    for (int j = 0; j < 4; j++) {
                        double[] r = PRODUCTS[k];
                        re += r[2 * (4 * i + j)] * q[2 * (4 * j + i)]
                                - r[2 * (4 * i + j) + 1] * q[2 * (4 * j + i) + 1];
                    }
                }
                re /= 4;
                if (Math.abs(re) > 0.5) {
                    if (Math.abs(Math.abs(re) - 1) > 1e-6) {
                        return -1; // a mixture of products: not a Clifford
                    }
                    found = k | (re < 0 ? 16 : 0);
                    break;
                }
            }
            if (found < 0) {
                return -1;
            }
            key = key * 32 + found;
        }
        return key;
    }

    static double[] matrix(Operator op) {
        double[] m = new double[32];
        for (int r = 0; r < 4; r++) {
            for (int c = 0; c < 4; c++) {
                Complex z = op.get(r, c);
                m[2 * (4 * r + c)] = z.getReal();
                m[2 * (4 * r + c) + 1] = z.getImaginary();
            }
        }
        return m;
    }

    static double[] times(double[] a, double[] b) {
        double[] m = new double[32];
        for (int r = 0; r < 4; r++) {
            for (int c = 0; c < 4; c++) {
                double re = 0;
                double im = 0;
                for (int k = 0; k < 4; k++) {
                    double ar = a[2 * (4 * r + k)];
                    double ai = a[2 * (4 * r + k) + 1];
                    double br = b[2 * (4 * k + c)];
                    double bi = b[2 * (4 * k + c) + 1];
                    re += ar * br - ai * bi;
                    im += ar * bi + ai * br;
                }
                m[2 * (4 * r + c)] = re;
                m[2 * (4 * r + c) + 1] = im;
            }
        }
        return m;
    }

    static double[] dagger(double[] a) {
        double[] m = new double[32];
        for (int r = 0; r < 4; r++) {
            for (int c = 0; c < 4; c++) {
                m[2 * (4 * c + r)] = a[2 * (4 * r + c)];
                m[2 * (4 * c + r) + 1] = -a[2 * (4 * r + c) + 1];
            }
        }
        return m;
    }

    /**
     * Returns the gate counts of the elements' circuits, for the record: index 0 the mean
     * number of one-qubit gates, index 1 the mean number of CNOT gates.
     *
     * @return the two means over the group
     */
    public double[] meanGateCounts() {
        long one = 0;
        long two = 0;
        for (Circuit c : circuits) {
            for (Instruction in : c.instructions()) {
                if (in.qubits().length == 1) {
                    one++;
                } else {
                    two++;
                }
            }
        }
        return new double[] {one / (double) SIZE, two / (double) SIZE};
    }
}
