package dev.qsim.observable;

import java.util.Arrays;
import java.util.Objects;

import dev.qsim.internal.Checks;

/**
 * A Pauli product {@code i^k · σ_{n-1} ⊗ ... ⊗ σ_1 ⊗ σ_0}: a phase in {@code {+1, +i, -1, -i}}
 * and one of I, X, Y, Z on each qubit, identity on every qubit not named. Immutable and
 * thread-safe; equality is exact (same phase, same operator on every qubit).
 *
 * <p>Stored as two bit masks, {@code x} and {@code z}, in {@code long} words (any qubit count):
 * qubit {@code q} holds I for bits (0, 0), X for (1, 0), Y for (1, 1) and Z for (0, 1), the
 * binary symplectic form of Dehaene and De Moor (2003), "Clifford group, stabilizer states, and
 * linear and quadratic operations over GF(2)", Phys. Rev. A 68, 042323,
 * doi:10.1103/PhysRevA.68.042323. On a basis state the product acts as
 * {@code P|j> = i^k · i^{|x∧z|} · (-1)^{|j∧z|} |j ⊕ x>}, because {@code Y = iXZ}.
 *
 * <h2>Text</h2>
 * Two forms are read by {@link #parse(String)}, each after an optional phase {@code +},
 * {@code -}, {@code i}, {@code +i} or {@code -i}:
 * <ul>
 *   <li>sparse: operator letter then qubit index, separated by whitespace, in any order, each
 *       qubit at most once: {@code "X0 Z3"}, {@code "-i Y2 X0"};</li>
 *   <li>dense: one letter per qubit with the <em>highest qubit leftmost</em>, as bitstrings are
 *       written in {@code dev.qsim}: {@code "XIZ"} is X on qubit 2 and Z on qubit 0.</li>
 * </ul>
 * {@link #toString()} prints the sparse form with qubits ascending ({@code "-Z0 X2"}, and
 * {@code "I"} for the identity); {@link #toDense(int)} prints the dense form.
 *
 * <p>Products follow the single-qubit rules {@code XY = iZ}, {@code YZ = iX}, {@code ZX = iY}
 * (Nielsen and Chuang 2010, Quantum Computation and Quantum Information, §2.1.3, exercise 2.41);
 * the phase bookkeeping is that of Aaronson and Gottesman (2004), "Improved simulation of
 * stabilizer circuits", Phys. Rev. A 70, 052328, doi:10.1103/PhysRevA.70.052328, function g.
 *
 * @since 0.1
 */
public final class PauliProduct {
    /** The largest qubit index accepted in text: {@value} (as {@link dev.qsim.Circuit}). */
    public static final int MAX_QUBIT = (1 << 20) - 1;

    /** The identity, phase +1. */
    public static final PauliProduct IDENTITY = new PauliProduct(0, new long[0], new long[0]);

    private static final long[] NONE = new long[0];

    private final int phase;
    private final long[] x;
    private final long[] z;

    private PauliProduct(int phase, long[] x, long[] z) {
        this.phase = phase & 3;
        int len = Math.max(x.length, z.length);
        while (len > 0 && (len > x.length || x[len - 1] == 0)
                && (len > z.length || z[len - 1] == 0)) {
            len--;
        }
        this.x = Arrays.copyOf(x, len);
        this.z = Arrays.copyOf(z, len);
    }

    /**
     * Returns the product with one Pauli letter on one qubit and phase +1.
     *
     * @param letter one of {@code 'I', 'X', 'Y', 'Z'}
     * @param qubit the qubit, in {@code [0, }{@value #MAX_QUBIT}{@code ]}
     * @return the product
     * @throws IllegalArgumentException if the letter is not I, X, Y or Z
     * @throws IndexOutOfBoundsException if the qubit is out of range
     */
    public static PauliProduct single(char letter, int qubit) {
        if (qubit < 0 || qubit > MAX_QUBIT) {
            throw new IndexOutOfBoundsException("qubit " + qubit + " is out of range [0, "
                    + MAX_QUBIT + "]");
        }
        int bits = letterBits(letter);
        if (bits < 0) {
            throw new IllegalArgumentException("a Pauli letter must be one of I, X, Y, Z but was '"
                    + letter + "'");
        }
        long[] xs = new long[(qubit >>> 6) + 1];
        long[] zs = new long[xs.length];
        set(xs, zs, qubit, bits);
        return new PauliProduct(0, xs, zs);
    }

    /**
     * Reads a Pauli product from text in the sparse ({@code "X0 Z3"}) or dense ({@code "XIZ"},
     * highest qubit leftmost) form described in the class documentation.
     *
     * @param text the text
     * @return the product
     * @throws IllegalArgumentException if the text is malformed; the message gives the
     *     character position (from 0) and what was expected there
     */
    public static PauliProduct parse(String text) {
        Objects.requireNonNull(text, "text");
        return new Parser(text).parse();
    }

    private static int letterBits(char c) {
        switch (c) {
            case 'I':
                return 0;
            case 'X':
                return 2;
            case 'Y':
                return 3;
            case 'Z':
                return 1;
            default:
                return -1;
        }
    }

    /** Sets qubit q to the letter with bits (x << 1) | z. */
    private static void set(long[] xs, long[] zs, int q, int bits) {
        long m = 1L << (q & 63);
        if ((bits & 2) != 0) {
            xs[q >>> 6] |= m;
        }
        if ((bits & 1) != 0) {
            zs[q >>> 6] |= m;
        }
    }

    /** Reads the text; positions in messages count characters from 0. */
    private static final class Parser {
        private final String s;
        private int pos;

        Parser(String s) {
            this.s = s;
        }

        private IllegalArgumentException error(String expected) {
            String found = pos < s.length() ? "'" + s.charAt(pos) + "'" : "the end of the text";
            return new IllegalArgumentException("malformed Pauli text \"" + Checks.excerpt(s)
                    + "\": at position "
                    + pos + " expected " + expected + " but found " + found);
        }

        private void skipSpace() {
            while (pos < s.length() && Character.isWhitespace(s.charAt(pos))) {
                pos++;
            }
        }

        PauliProduct parse() {
            skipSpace();
            int ph = 0;
            if (pos < s.length() && (s.charAt(pos) == '+' || s.charAt(pos) == '-')) {
                ph = s.charAt(pos) == '-' ? 2 : 0;
                pos++;
                skipSpace();
            }
            if (pos < s.length() && s.charAt(pos) == 'i') {
                ph += 1;
                pos++;
                skipSpace();
            }
            if (pos >= s.length() || letterBits(s.charAt(pos)) < 0) {
                throw error("a Pauli letter I, X, Y or Z");
            }
            int next = pos + 1;
            boolean sparse = next < s.length() && Character.isDigit(s.charAt(next));
            return sparse ? sparse(ph) : dense(ph);
        }

        private PauliProduct dense(int ph) {
            int start = pos;
            while (pos < s.length() && letterBits(s.charAt(pos)) >= 0) {
                pos++;
            }
            int end = pos;
            skipSpace();
            if (pos < s.length()) {
                throw error(end == pos ? "a Pauli letter I, X, Y or Z (dense form has one letter"
                        + " per qubit, no indices)" : "the end of the dense form");
            }
            int len = end - start;
            if (len - 1 > MAX_QUBIT) {
                throw new IllegalArgumentException("malformed Pauli text: the dense form names "
                        + len + " qubits but at most " + (MAX_QUBIT + 1) + " are allowed");
            }
            long[] xs = new long[((len - 1) >>> 6) + 1];
            long[] zs = new long[xs.length];
            for (int p = start; p < end; p++) {
                set(xs, zs, end - 1 - p, letterBits(s.charAt(p)));
            }
            return new PauliProduct(ph, xs, zs);
        }

        private PauliProduct sparse(int ph) {
            long[] xs = NONE;
            long[] zs = NONE;
            long[] seen = NONE;
            while (true) {
                int bits = pos < s.length() ? letterBits(s.charAt(pos)) : -1;
                if (bits < 0) {
                    throw error("a Pauli letter I, X, Y or Z");
                }
                pos++;
                int digits = pos;
                long q = 0;
                while (pos < s.length() && s.charAt(pos) >= '0' && s.charAt(pos) <= '9') {
                    q = Math.min(10L * q + (s.charAt(pos) - '0'), Integer.MAX_VALUE);
                    pos++;
                }
                if (pos == digits) {
                    throw error("a qubit index after the letter (sparse form such as \"X0 Z3\")");
                }
                if (q > MAX_QUBIT) {
                    pos = digits;
                    throw error("a qubit index in [0, " + MAX_QUBIT + "]");
                }
                int qi = (int) q;
                int w = qi >>> 6;
                if (w >= xs.length) {
                    xs = Arrays.copyOf(xs, w + 1);
                    zs = Arrays.copyOf(zs, w + 1);
                    seen = Arrays.copyOf(seen, w + 1);
                }
                if ((seen[w] & (1L << (qi & 63))) != 0) {
                    throw new IllegalArgumentException("malformed Pauli text \""
                            + Checks.excerpt(s) + "\": at position " + digits
                            + " expected a qubit not named before but qubit " + qi
                            + " appears twice");
                }
                seen[w] |= 1L << (qi & 63);
                set(xs, zs, qi, bits);
                int afterIndex = pos;
                skipSpace();
                if (pos >= s.length()) {
                    return new PauliProduct(ph, xs, zs);
                }
                if (pos == afterIndex) {
                    throw error("whitespace or the end of the text after a qubit index");
                }
            }
        }
    }

    /**
     * Returns the phase as the power {@code k} of {@code i}: 0 for +1, 1 for +i, 2 for -1,
     * 3 for -i.
     *
     * @return {@code k} in {@code [0, 3]}
     */
    public int phase() {
        return phase;
    }

    /**
     * Returns this product with phase {@code i^k}, same operators.
     *
     * @param k the power of {@code i}; any int, taken modulo 4
     * @return the product
     */
    public PauliProduct withPhase(int k) {
        return new PauliProduct(k, x, z);
    }

    /**
     * Returns the letter on one qubit: {@code 'I'}, {@code 'X'}, {@code 'Y'} or {@code 'Z'}.
     *
     * @param qubit a qubit index, at least 0 (beyond the span the letter is I)
     * @return the letter
     * @throws IndexOutOfBoundsException if {@code qubit < 0}
     */
    public char letter(int qubit) {
        if (qubit < 0) {
            throw new IndexOutOfBoundsException("qubit " + qubit + " must be at least 0");
        }
        int w = qubit >>> 6;
        if (w >= x.length) {
            return 'I';
        }
        long m = 1L << (qubit & 63);
        boolean xb = (x[w] & m) != 0;
        boolean zb = (z[w] & m) != 0;
        return xb ? (zb ? 'Y' : 'X') : (zb ? 'Z' : 'I');
    }

    /**
     * Returns one more than the highest qubit with a letter other than I (0 for the identity).
     *
     * @return the span
     */
    public int span() {
        for (int w = x.length - 1; w >= 0; w--) {
            long m = x[w] | z[w];
            if (m != 0) {
                return 64 * w + 64 - Long.numberOfLeadingZeros(m);
            }
        }
        return 0;
    }

    /**
     * Returns the number of qubits with a letter other than I.
     *
     * @return the weight
     */
    public int weight() {
        int c = 0;
        for (int w = 0; w < x.length; w++) {
            c += Long.bitCount(x[w] | z[w]);
        }
        return c;
    }

    /**
     * Returns the X mask of the qubits below 64: bit {@code q} is set where the letter is X or Y.
     *
     * @return the low word of the X mask
     */
    public long xBits() {
        return x.length == 0 ? 0 : x[0];
    }

    /**
     * Returns the Z mask of the qubits below 64: bit {@code q} is set where the letter is Z or Y.
     *
     * @return the low word of the Z mask
     */
    public long zBits() {
        return z.length == 0 ? 0 : z[0];
    }

    /**
     * Returns whether the product is Hermitian, that is its phase is +1 or -1.
     *
     * @return whether the phase is real
     */
    public boolean isHermitian() {
        return (phase & 1) == 0;
    }

    /**
     * Returns the product {@code this · other} with its phase.
     *
     * @param other the right factor
     * @return the product
     */
    public PauliProduct times(PauliProduct other) {
        Objects.requireNonNull(other, "other");
        int len = Math.max(x.length, other.x.length);
        long[] rx = new long[len];
        long[] rz = new long[len];
        int k = phase + other.phase;
        for (int w = 0; w < len; w++) {
            long x1 = w < x.length ? x[w] : 0;
            long z1 = w < z.length ? z[w] : 0;
            long x2 = w < other.x.length ? other.x[w] : 0;
            long z2 = w < other.z.length ? other.z[w] : 0;
            long ax = x1 & ~z1;
            long ay = x1 & z1;
            long az = ~x1 & z1;
            long bx = x2 & ~z2;
            long by = x2 & z2;
            long bz = ~x2 & z2;
            // XY = iZ, YZ = iX, ZX = iY; reversed orders give -i.
            k += Long.bitCount((ax & by) | (ay & bz) | (az & bx));
            k -= Long.bitCount((ay & bx) | (az & by) | (ax & bz));
            rx[w] = x1 ^ x2;
            rz[w] = z1 ^ z2;
        }
        return new PauliProduct(k, rx, rz);
    }

    /**
     * Returns whether this product commutes with another: they do exactly when they anticommute
     * on an even number of qubits (Nielsen and Chuang 2010, §10.5.1).
     *
     * @param other another product
     * @return whether {@code this · other = other · this}
     */
    public boolean commutesWith(PauliProduct other) {
        Objects.requireNonNull(other, "other");
        int len = Math.min(x.length, other.x.length);
        int odd = 0;
        for (int w = 0; w < len; w++) {
            odd ^= Long.bitCount((x[w] & other.z[w]) ^ (z[w] & other.x[w])) & 1;
        }
        return odd == 0;
    }

    /**
     * Returns whether the products commute qubit by qubit: on every qubit one of them is I or
     * both have the same letter. Such products can be measured with one setting (Verteletskyi,
     * Yen and Izmaylov 2020, "Measurement optimization in the variational quantum eigensolver
     * using a minimum clique cover", J. Chem. Phys. 152, 124114, doi:10.1063/1.5141458).
     *
     * @param other another product
     * @return whether the two are qubit-wise commuting
     */
    public boolean commutesQubitWise(PauliProduct other) {
        Objects.requireNonNull(other, "other");
        int len = Math.min(x.length, other.x.length);
        for (int w = 0; w < len; w++) {
            long both = (x[w] | z[w]) & (other.x[w] | other.z[w]);
            if ((both & ((x[w] ^ other.x[w]) | (z[w] ^ other.z[w]))) != 0) {
                return false;
            }
        }
        return true;
    }

    /**
     * Returns the dense text on {@code qubits} qubits, highest qubit leftmost, with the phase
     * prefix of {@link #toString()}: {@code "XIZ"} for X on qubit 2 and Z on qubit 0.
     *
     * @param qubits the number of letters, at least {@link #span()} and at least 1
     * @return the text
     * @throws IllegalArgumentException if {@code qubits} is smaller than the span or than 1
     */
    public String toDense(int qubits) {
        if (qubits < Math.max(1, span())) {
            throw new IllegalArgumentException("the dense text needs at least "
                    + Math.max(1, span()) + " letter(s) for " + this + " but " + qubits
                    + " were asked for");
        }
        StringBuilder sb = new StringBuilder(prefix());
        for (int q = qubits - 1; q >= 0; q--) {
            sb.append(letter(q));
        }
        return sb.toString();
    }

    private String prefix() {
        switch (phase) {
            case 1:
                return "i";
            case 2:
                return "-";
            case 3:
                return "-i";
            default:
                return "";
        }
    }

    /**
     * Returns the sparse text with qubits ascending, such as {@code "-Z0 X2"}; the identity is
     * {@code "I"}. {@link #parse(String)} reads it back to an equal product.
     *
     * @return the text
     */
    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder(prefix());
        int n = span();
        if (n == 0) {
            return sb.append('I').toString();
        }
        boolean first = true;
        for (int q = 0; q < n; q++) {
            char c = letter(q);
            if (c != 'I') {
                if (!first) {
                    sb.append(' ');
                }
                sb.append(c).append(q);
                first = false;
            }
        }
        return sb.toString();
    }

    /**
     * Compares phase and letters exactly.
     *
     * @param o another object
     * @return whether {@code o} is an equal product
     */
    @Override
    public boolean equals(Object o) {
        if (this == o) {
            return true;
        }
        if (!(o instanceof PauliProduct)) {
            return false;
        }
        PauliProduct p = (PauliProduct) o;
        return phase == p.phase && Arrays.equals(x, p.x) && Arrays.equals(z, p.z);
    }

    /**
     * Returns a hash code consistent with {@link #equals(Object)}.
     *
     * @return the hash code
     */
    @Override
    public int hashCode() {
        return 31 * (31 * phase + Arrays.hashCode(x)) + Arrays.hashCode(z);
    }
}
