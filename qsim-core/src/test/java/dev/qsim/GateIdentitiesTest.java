package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * Gate matrices of {@link Gates} against their textbook forms, and textbook gate identities.
 * Reference: Nielsen &amp; Chuang (2010), <i>Quantum Computation and Quantum Information</i>
 * (N&amp;C below), sec. 1.3 and sec. 4.2; the expected matrices come from {@link DenseReference},
 * which writes them out by hand. Tolerance 1e-15 per entry for fixed gates (entries are exact or
 * one rounding of 1/sqrt2, cos or sin) and 1e-14 for products of a few gates (common practice).
 */
class GateIdentitiesTest {

    private static final double EXACT = 1e-15;
    private static final double PRODUCT = 1e-14;

    private static void same(DenseReference.Matrix expected, Operator actual, double tol,
                             String what) {
        DenseReference.assertClose(expected, actual, tol, () -> what);
    }

    private static void same(Operator expected, Operator actual, double tol, String what) {
        DenseReference.assertClose(fromOperator(expected), actual, tol, () -> what);
    }

    private static DenseReference.Matrix fromOperator(Operator op) {
        DenseReference.Matrix m = new DenseReference.Matrix(op.dimension());
        for (int i = 0; i < m.dim; i++) {
            for (int j = 0; j < m.dim; j++) {
                Complex c = op.get(i, j);
                m.re[i][j] = c.getReal();
                m.im[i][j] = c.getImaginary();
            }
        }
        return m;
    }

    @Test
    void scaledMultipliesEveryEntry() {
        // Products of Pauli matrices, N&C 2010 eq. 2.40 (X Y = i Z and its cyclic forms): the
        // scalar multiple of Z by i against the product computed by times().
        Complex i = Complex.I;
        same(Gates.X.times(Gates.Y), Gates.Z.scaled(i), 0, "XY = iZ");
        same(Gates.Y.times(Gates.Z), Gates.X.scaled(i), 0, "YZ = iX");
        same(Gates.Z.times(Gates.X), Gates.Y.scaled(i), 0, "ZX = iY");
        // A global phase: S = e^{iπ/4} rz(π/2) (N&C 2010, sec. 4.2, S as a phase times a
        // rotation about z).
        same(Gates.S, Gates.rz(Math.PI / 2).scaled(Complex.ofCis(Math.PI / 4)), EXACT,
                "S = e^{i pi/4} rz(pi/2)");
        // Definition of scalar multiplication (N&C 2010, sec. 2.1): entry by entry.
        Complex z = Complex.ofCartesian(0.3, -1.7);
        Operator h = Gates.H.scaled(z);
        for (int r = 0; r < 2; r++) {
            for (int c = 0; c < 2; c++) {
                Complex expected = Gates.H.get(r, c).multiply(z);
                assertEquals(expected.getReal(), h.get(r, c).getReal(), 0.0);
                assertEquals(expected.getImaginary(), h.get(r, c).getImaginary(), 0.0);
            }
        }
        assertTrue(Gates.CNOT.scaled(Complex.ONE).equals(Gates.CNOT));
    }

    @Test
    void singleQubitConstantsHaveTheirTextbookMatrices() {
        // N&C 2010 sec. 4.2: I, X, Y, Z, H, S, T.
        same(DenseReference.i2(), Gates.I, 0, "I (N&C sec. 4.2)");
        same(DenseReference.x(), Gates.X, 0, "X (N&C sec. 4.2)");
        same(DenseReference.y(), Gates.Y, 0, "Y (N&C sec. 4.2)");
        same(DenseReference.z(), Gates.Z, 0, "Z (N&C sec. 4.2)");
        same(DenseReference.h(), Gates.H, EXACT, "H (N&C sec. 4.2)");
        same(DenseReference.s(), Gates.S, 0, "S (N&C sec. 4.2)");
        same(DenseReference.t(), Gates.T, EXACT, "T = diag(1, e^{iπ/4}) (N&C sec. 4.2)");
        // Conjugate transposes of S and T (definition of the adjoint, N&C sec. 2.1.6).
        same(DenseReference.sDagger(), Gates.S_DAGGER, 0, "S dagger");
        same(DenseReference.tDagger(), Gates.T_DAGGER, EXACT, "T dagger");
        // DESIGN.md convention: SQRT_X = ½[[1+i, 1−i], [1−i, 1+i]].
        same(DenseReference.sqrtX(), Gates.SQRT_X, 0, "SQRT_X (DESIGN.md)");
    }

    @Test
    void multiQubitConstantsHaveTheirProjectorSumMatrices() {
        // Matrix-index bit 0 = first listed qubit (DESIGN.md). CNOT(control 0, target 1) =
        // |0><0|_0 ⊗ I + |1><1|_0 ⊗ X_1 (N&C 2010 sec. 4.3).
        same(DenseReference.cnot(2, 0, 1), Gates.CNOT, 0, "CNOT, control = matrix bit 0");
        same(DenseReference.cz(2, 0, 1), Gates.CZ, 0, "CZ (N&C sec. 4.3)");
        same(DenseReference.swap(2, 0, 1), Gates.SWAP, 0, "SWAP");
        // Toffoli: controls are matrix bits 0 and 1, target bit 2 (N&C sec. 4.3).
        same(DenseReference.toffoli(3, 0, 1, 2), Gates.TOFFOLI, 0, "Toffoli");
        // Fredkin: control is matrix bit 0, swapping bits 1 and 2 (controlled swap).
        same(DenseReference.fredkin(3, 0, 1, 2), Gates.FREDKIN, 0, "Fredkin");
    }

    @ParameterizedTest
    @ValueSource(doubles = {0.0, 0.3, -1.2, Math.PI / 2, Math.PI, 2.5, -3 * Math.PI / 4,
        2 * Math.PI, 7.0})
    void rotationFactoriesHaveTheirTextbookMatrices(double theta) {
        String at = " at θ = " + theta;
        same(DenseReference.rx(theta), Gates.rx(theta), EXACT, "rx, N&C eq. 4.4" + at);
        same(DenseReference.ry(theta), Gates.ry(theta), EXACT, "ry, N&C eq. 4.5" + at);
        same(DenseReference.rz(theta), Gates.rz(theta), EXACT, "rz, N&C eq. 4.6" + at);
        same(DenseReference.phase(theta), Gates.phase(theta), EXACT,
                "phase = diag(1, e^{iλ}) (DESIGN.md)" + at);
        same(DenseReference.cphase(2, 0, 1, theta), Gates.cphase(theta), EXACT,
                "cphase = diag(1,1,1,e^{iλ}) (DESIGN.md)" + at);
        same(DenseReference.rzz(2, 0, 1, theta), Gates.rzz(theta), EXACT,
                "rzz = exp(−iθ Z⊗Z/2) (DESIGN.md)" + at);
    }

    @ParameterizedTest
    @ValueSource(doubles = {0.0, 0.7, -2.1, Math.PI, 4.0})
    void rotationsAreCosineIdentityMinusISineOfPauli(double theta) {
        // N&C 2010 eqs. 4.4-4.6: R_P(θ) = cos(θ/2) I − i sin(θ/2) P for P in {X, Y, Z}; built
        // here with Operator arithmetic from the Pauli constants.
        double c = Math.cos(theta / 2);
        double s = Math.sin(theta / 2);
        Operator[] paulis = {Gates.X, Gates.Y, Gates.Z};
        Operator[] rotations = {Gates.rx(theta), Gates.ry(theta), Gates.rz(theta)};
        for (int p = 0; p < 3; p++) {
            DenseReference.Matrix expected = DenseReference.addScaled(
                    DenseReference.scale(c, 0, DenseReference.i2()), 0, -s,
                    fromOperator(paulis[p]));
            same(expected, rotations[p], EXACT, "R_" + "XYZ".charAt(p) + "(" + theta + ")");
        }
    }

    @Test
    void hadamardConjugationExchangesXAndZ() {
        // N&C 2010 sec. 4.2 (Exercise 4.13 in the 2010 edition, from memory): HXH = Z, HZH = X.
        same(Gates.Z, Gates.H.times(Gates.X).times(Gates.H), PRODUCT, "HXH = Z");
        same(Gates.X, Gates.H.times(Gates.Z).times(Gates.H), PRODUCT, "HZH = X");
    }

    @Test
    void powersOfPhaseGates() {
        // S = T² and Z = S² (N&C 2010 sec. 4.2, from the diagonal forms).
        same(Gates.Z, Gates.S.times(Gates.S), PRODUCT, "S S = Z");
        same(Gates.S, Gates.T.times(Gates.T), PRODUCT, "T T = S");
        // DESIGN.md: SQRT_X² = X.
        same(Gates.X, Gates.SQRT_X.times(Gates.SQRT_X), PRODUCT, "SQRT_X² = X");
        // Adjoint pairs multiply to the identity (unitarity, N&C sec. 2.1.6).
        same(Gates.I, Gates.S.times(Gates.S_DAGGER), PRODUCT, "S S† = I");
        same(Gates.I, Gates.T.times(Gates.T_DAGGER), PRODUCT, "T T† = I");
    }

    @Test
    void yIsIXZ() {
        // Pauli algebra (N&C 2010 sec. 2.1.3): X Z = [[0,−1],[1,0]], so i X Z = Y.
        DenseReference.Matrix ixz = DenseReference.scale(0, 1,
                fromOperator(Gates.X.times(Gates.Z)));
        same(ixz, Gates.Y, PRODUCT, "Y = i X Z");
    }

    @Test
    void cnotIsCzConjugatedByHadamardsOnTheTarget() {
        // N&C 2010 sec. 4.3 (Exercise 4.17 in the 2010 edition, from memory): a CNOT is a CZ
        // with H on the target before and after. Gates.CNOT's target is matrix bit 1, and
        // H.tensor(I) puts H on bit 1 (DESIGN.md: the argument of tensor takes the low bits).
        Operator hOnTarget = Gates.H.tensor(Gates.I);
        same(Gates.CNOT, hOnTarget.times(Gates.CZ).times(hOnTarget), PRODUCT,
                "CNOT = (H⊗I) CZ (H⊗I)");
    }

    @Test
    void bellCircuitMakesTheBellState() {
        // N&C 2010 sec. 1.3.6: H on the first qubit then CNOT gives (|00> + |11>)/√2.
        StateVector bell = StateVector.zero(2).apply(Circuit.builder(2).h(0).cnot(0, 1).build());
        double r = 1 / Math.sqrt(2);
        double[][] expected = {{r, 0, 0, r}, {0, 0, 0, 0}};
        DenseReference.assertClose(expected, bell, EXACT, () -> "Bell state β00");
        assertEquals(0.5, bell.probability(0), EXACT, "P(00) of β00 (N&C sec. 1.3.6)");
        assertEquals(0.5, bell.probability(3), EXACT, "P(11) of β00 (N&C sec. 1.3.6)");
    }

    @Test
    void operatorTensorTimesDaggerMatchTheReference() {
        final long seed = 9_001L;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        for (int trial = 0; trial < 20; trial++) {
            int ka = 1 + rng.nextInt(3);
            int kb = 1 + rng.nextInt(3);
            DenseReference.Matrix a = DenseReference.randomUnitary(1 << ka, rng);
            DenseReference.Matrix a2 = DenseReference.randomUnitary(1 << ka, rng);
            DenseReference.Matrix b = DenseReference.randomUnitary(1 << kb, rng);
            Operator opA = DenseReference.toOperator(a);
            Operator opA2 = DenseReference.toOperator(a2);
            Operator opB = DenseReference.toOperator(b);
            String at = "seed " + seed + ", trial " + trial;
            // Kronecker product (N&C 2010 sec. 2.1.7): b on the low bits.
            same(DenseReference.kron(a, b), opA.tensor(opB), PRODUCT, "tensor, " + at);
            // Matrix product: this · other.
            same(DenseReference.multiply(a, a2), opA.times(opA2), PRODUCT, "times, " + at);
            // Adjoint = conjugate transpose (N&C 2010 sec. 2.1.6).
            same(DenseReference.dagger(a), opA.dagger(), 0, "dagger, " + at);
            assertTrue(opA.tensor(opB).isUnitary(1e-9), "tensor of unitaries is unitary, " + at);
            // Identity on k qubits.
            same(DenseReference.identity(1 << ka), Operator.identity(ka), 0, "identity, " + at);
        }
    }

    @Test
    void tensorOfSingleQubitGatesActsOnTheRightQubits() {
        // X.tensor(I) flips qubit 1 (the high bit): X⊗I |00> = |10> = index 2 (DESIGN.md).
        StateVector s = StateVector.zero(2).apply(Gates.X.tensor(Gates.I), 0, 1);
        assertEquals(1.0, s.probability(2), 0, "X⊗I on qubits (0,1) sends |00> to index 2");
        // A k-qubit operator on qubits (q0, q1) maps matrix bit j to qubit qj: the same X⊗I
        // given qubits (1, 0) flips qubit 0.
        StateVector t = StateVector.zero(2).apply(Gates.X.tensor(Gates.I), 1, 0);
        assertEquals(1.0, t.probability(1), 0, "X⊗I on qubits (1,0) sends |00> to index 1");
    }
}
