package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Optional;

import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/**
 * Every fact of the gate catalogue checked against an independent definition: matrices against
 * products of textbook matrices, inverses against {@code U U† = I}, Clifford decompositions
 * against the gate's full matrix up to a global phase, the Clifford test against its definition
 * (conjugation maps Paulis to Paulis, Gottesman 1998, arXiv:quant-ph/9807006), and generators
 * against {@code U = exp(-iθG/2)}.
 */
class GateCatalogueTest {
    private static final double TOL = 1e-12;

    /** Angles that make every parameterised entry non-Clifford. */
    private static double[] generic(Gate g) {
        double[] a = new double[g.parameters()];
        for (int i = 0; i < a.length; i++) {
            a[i] = 0.37 + 0.41 * i;
        }
        return a;
    }

    /** The full matrix of a gate on its qubits (controls first, as low index bits). */
    static Operator full(Gate g, double[] angles) {
        int k = g.qubits();
        int[] all = new int[k];
        for (int j = 0; j < k; j++) {
            all[j] = j;
        }
        return Circuit.builder(k, 0).gate(g, angles, all).build().toOperator();
    }

    private static Operator pauli(char letter) {
        switch (letter) {
            case 'X':
                return Gates.X;
            case 'Y':
                return Gates.Y;
            case 'Z':
                return Gates.Z;
            default:
                return Gates.I;
        }
    }

    /** The Pauli product with letters.charAt(j) on qubit j (qubit 0 is the low tensor factor). */
    private static Operator product(String letters) {
        Operator out = pauli(letters.charAt(0));
        for (int j = 1; j < letters.length(); j++) {
            out = pauli(letters.charAt(j)).tensor(out);
        }
        return out;
    }

    /** |Tr(A† B)| / d: 1 exactly when B = e^{iφ} A for unitaries (common practice). */
    private static double phaseOverlap(Operator a, Operator b) {
        int d = a.dimension();
        Complex tr = Complex.ZERO;
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                tr = tr.add(a.get(r, c).conj().multiply(b.get(r, c)));
            }
        }
        return tr.abs() / d;
    }

    private static void assertClose(Operator expected, Operator actual, double tol, String what) {
        int d = expected.dimension();
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                assertEquals(0, expected.get(r, c).subtract(actual.get(r, c)).abs(), tol,
                        what + " entry " + r + "," + c);
            }
        }
    }

    @ParameterizedTest
    @EnumSource(value = Gate.class, names = "UNITARY", mode = EnumSource.Mode.EXCLUDE)
    void inverseEntryUndoesTheGate(Gate g) {
        // U^{-1} = U† for a unitary (Nielsen and Chuang 2010, §2.1.6).
        double[] a = generic(g);
        Operator u = full(g, a);
        Operator inv = full(g.inverse(), g.inverseAngles(a));
        assertClose(Operator.identity(g.qubits()), inv.times(u), TOL, g.toString());
        assertTrue(u.isUnitary(TOL), g.toString());
    }

    @ParameterizedTest
    @EnumSource(value = Gate.class, names = "UNITARY", mode = EnumSource.Mode.EXCLUDE)
    void declaredShapeMatchesTheMatrix(Gate g) {
        Operator op = g.operator(generic(g));
        int d = op.dimension();
        int offDiagonal = 0;
        boolean oneZeroPerColumn = true;
        for (int c = 0; c < d; c++) {
            int inColumn = 0;
            for (int r = 0; r < d; r++) {
                if (op.get(r, c).abs() != 0) {
                    inColumn++;
                    offDiagonal += r != c ? 1 : 0;
                }
            }
            oneZeroPerColumn &= inColumn == 1;
        }
        switch (g.shape()) {
            case DIAGONAL:
                assertEquals(0, offDiagonal, g.toString());
                break;
            case PERMUTATION:
                assertTrue(oneZeroPerColumn && offDiagonal > 0, g.toString());
                break;
            default:
                assertFalse(oneZeroPerColumn, g.toString());
                break;
        }
    }

    @ParameterizedTest
    @EnumSource(value = Gate.class, names = "UNITARY", mode = EnumSource.Mode.EXCLUDE)
    void cliffordStepsEqualTheGateUpToPhase(Gate g) {
        // At every angle on the grid of multiples of pi/2, a gate the catalogue calls Clifford
        // equals the product of its primitive steps up to a global phase, and conjugates each
        // single-qubit Pauli to a Pauli product (the definition of the Clifford group).
        double[][] grid = angleGrid(g);
        for (double[] a : grid) {
            Operator u = full(g, a);
            boolean clifford = g.isClifford(a);
            assertEquals(clifford, mapsPaulisToPaulis(u, g.qubits()), g + " at "
                    + java.util.Arrays.toString(a));
            if (!clifford) {
                continue;
            }
            int k = g.qubits();
            Operator product = Operator.identity(k);
            for (Gate.Step s : g.cliffordSteps(a)) {
                int[] on = s.second() < 0 ? new int[] {s.first()}
                        : new int[] {s.first(), s.second()};
                Operator step = Circuit.builder(k, 0).gate(s.gate(), on).build().toOperator();
                product = step.times(product);
            }
            assertEquals(1, phaseOverlap(u, product), TOL, g + " at "
                    + java.util.Arrays.toString(a));
        }
    }

    private static double[][] angleGrid(Gate g) {
        int p = g.parameters();
        int count = (int) Math.pow(9, p);
        double[][] out = new double[count][p];
        for (int i = 0; i < count; i++) {
            int x = i;
            for (int j = 0; j < p; j++) {
                out[i][j] = (x % 9 - 4) * Math.PI / 2;
                x /= 9;
            }
        }
        if (p > 0) {
            double[] off = generic(g);
            out = java.util.Arrays.copyOf(out, count + 1);
            out[count] = off;
        }
        return out;
    }

    /** Whether U P U† is ± a Pauli product for every X_j and Z_j. */
    private static boolean mapsPaulisToPaulis(Operator u, int k) {
        for (int j = 0; j < k; j++) {
            for (char letter : new char[] {'X', 'Z'}) {
                char[] text = "I".repeat(k).toCharArray();
                text[j] = letter;
                Operator conj = u.times(product(new String(text))).times(u.dagger());
                if (!isSignedPauli(conj, k)) {
                    return false;
                }
            }
        }
        return true;
    }

    private static boolean isSignedPauli(Operator m, int k) {
        int count = 1 << (2 * k);
        for (int code = 0; code < count; code++) {
            char[] text = new char[k];
            for (int j = 0; j < k; j++) {
                text[j] = "IXYZ".charAt((code >> (2 * j)) & 3);
            }
            double overlap = phaseOverlap(product(new String(text)), m);
            if (Math.abs(overlap - 1) < 1e-9) {
                return true;
            }
        }
        return false;
    }

    @Test
    void generatorsGiveTheGateAsAnExponential() {
        // For commuting Pauli terms, exp(-iθG/2) = Π exp(-iθ w P/2) and exp(-iαP) =
        // cos α I - i sin α P since P² = I (Nielsen and Chuang 2010, exercise 4.2).
        for (Gate g : Gate.values()) {
            List<Gate.Term> gen = g.generator();
            if (gen.isEmpty()) {
                continue;
            }
            double theta = 0.83;
            int k = g.qubits();
            Operator u = Operator.identity(k);
            for (Gate.Term t : gen) {
                double alpha = theta * t.weight() / 2;
                Operator p = product(t.letters());
                int d = 1 << k;
                Complex[][] rows = new Complex[d][d];
                for (int r = 0; r < d; r++) {
                    for (int c = 0; c < d; c++) {
                        rows[r][c] = p.get(r, c).multiply(Complex.ofCartesian(0, -Math.sin(alpha)))
                                .add(r == c ? Math.cos(alpha) : 0);
                    }
                }
                u = Operator.of(rows).times(u);
            }
            assertClose(full(g, new double[] {theta}), u, TOL, g.toString());
        }
        assertTrue(Gate.T.generator().isEmpty());
    }

    @Test
    void fixedMatricesAreTheTextbookConstants() {
        // Nielsen and Chuang 2010, §4.3: CNOT, Toffoli and Fredkin on (controls, targets).
        // Exact entries (a -0.0 from a diagonal kernel equals 0.0 by value).
        assertClose(Gates.CNOT, full(Gate.CNOT, new double[0]), 0, "cnot");
        assertClose(Gates.TOFFOLI, full(Gate.TOFFOLI, new double[0]), 0, "toffoli");
        assertClose(Gates.FREDKIN, full(Gate.FREDKIN, new double[0]), 0, "fredkin");
        assertClose(Gates.CZ, full(Gate.CZ, new double[0]), 0, "cz");
        assertClose(Gates.SWAP, full(Gate.SWAP, new double[0]), 0, "swap");
        assertEquals(Gates.u(0.1, 0.2, 0.3), Gate.U.operator(0.1, 0.2, 0.3));
    }

    @Test
    void namesFindTheirEntries() {
        // OpenQASM 3 names of stdgates.inc (Cross et al. 2022) and our identifiers.
        assertSame(Gate.CNOT, Gate.lookup("cx"));
        assertSame(Gate.CNOT, Gate.lookup("CX"));
        assertSame(Gate.CNOT, Gate.lookup("CNOT"));
        assertSame(Gate.CNOT, Gate.lookup("cnot"));
        assertSame(Gate.S_DAGGER, Gate.lookup("sdg"));
        assertSame(Gate.S_DAGGER, Gate.lookup("sDagger"));
        assertSame(Gate.S_DAGGER, Gate.lookup("S_DAGGER"));
        assertSame(Gate.PHASE, Gate.lookup("p"));
        assertSame(Gate.TOFFOLI, Gate.lookup("ccx"));
        assertEquals(Optional.empty(), Gate.find("warp"));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Gate.lookup("warp"));
        assertTrue(e.getMessage().contains("'warp'") && e.getMessage().contains("cnot (cx)"),
                e.getMessage());
        for (Gate g : Gate.values()) {
            assertSame(g, Gate.lookup(g.id()));
            assertSame(g, Gate.lookup(g.name()));
            if (g.qasmName() != null) {
                assertSame(g, Gate.lookup(g.qasmName()));
            }
        }
    }

    @Test
    void controlledFormsHaveTheirOwnEntries() {
        assertEquals(Optional.of(Gate.CNOT), Gate.X.withControls(1));
        assertEquals(Optional.of(Gate.TOFFOLI), Gate.X.withControls(2));
        assertEquals(Optional.of(Gate.TOFFOLI), Gate.CNOT.withControls(1));
        assertEquals(Optional.of(Gate.FREDKIN), Gate.SWAP.withControls(1));
        assertEquals(Optional.of(Gate.CPHASE), Gate.PHASE.withControls(1));
        assertEquals(Optional.empty(), Gate.T.withControls(1));
        // Recorded through the builder, the controlled form is that entry, same matrix.
        Circuit c = Circuit.builder(3, 0).controlled(Gate.X, new double[0], new int[] {0, 1}, 2)
                .controlled(Gates.X, new int[] {1}, 0).apply(Gates.CNOT, 2, 1).build();
        assertSame(Gate.TOFFOLI, c.instructions().get(0).gate());
        assertSame(Gate.CNOT, c.instructions().get(1).gate());
        assertSame(Gate.CNOT, c.instructions().get(2).gate());
        assertEquals(Circuit.builder(3, 0).toffoli(0, 1, 2).cnot(1, 0).cnot(2, 1).build(), c);
        // Angles are checked before anything is recorded.
        Circuit.Builder b = Circuit.builder(2, 0);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> b.gate(Gate.RX, new double[] {Double.NaN}, 0));
        assertTrue(e.getMessage().contains("NaN"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> b.gate(Gate.RX, 0));
        assertTrue(e.getMessage().contains("1 angle"), e.getMessage());
        assertEquals(0, b.build().size());
    }
}
