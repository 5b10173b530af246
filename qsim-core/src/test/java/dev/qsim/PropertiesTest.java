package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.List;
import java.util.Map;

import net.jqwik.api.EdgeCasesMode;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.ShrinkingMode;
import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

/**
 * Property checks of the state-vector engine. Each property draws a long seed from jqwik (itself
 * run with a fixed seed, so every run sees the same cases) and builds its random circuits and
 * states from a commons-rng generator on that seed; the seed is in every failure message.
 * The properties are the defining ones of quantum mechanics' linear-algebra model (Nielsen &amp;
 * Chuang 2010, <i>Quantum Computation and Quantum Information</i>, sec. 2.1-2.2): gates are
 * linear and unitary, unitaries keep the norm and probabilities sum to one, U⁻¹ = U†, and
 * operators on separate systems act factor by factor on product states (sec. 2.1.7).
 */
class PropertiesTest {

    /** Per-amplitude tolerance: tens of gates of rounding near 1e-16 each (common practice). */
    private static final double TOL = 1e-12;
    /** Unitarity tolerance on U†U − I, max abs entry (DESIGN.md). */
    private static final double UNITARY_TOL = 1e-9;

    private static UniformRandomProvider rng(long seed) {
        return RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
    }

    private static int[] allQubits(int n) {
        int[] q = new int[n];
        for (int i = 0; i < n; i++) {
            q[i] = i;
        }
        return q;
    }

    /** Complex a·x + b·y for state vectors (re, im). */
    private static double[][] combine(double ar, double ai, double[][] x,
                                      double br, double bi, double[][] y) {
        int d = x[0].length;
        double[][] r = new double[2][d];
        for (int i = 0; i < d; i++) {
            r[0][i] = ar * x[0][i] - ai * x[1][i] + br * y[0][i] - bi * y[1][i];
            r[1][i] = ar * x[1][i] + ai * x[0][i] + br * y[1][i] + bi * y[0][i];
        }
        return r;
    }

    /**
     * Checks U(αa + βb) = αUa + βUb for the circuit: a, b random states, α, β random complex
     * scaled so that αa + βb has norm 1 (StateVector.of needs a normalised vector).
     */
    private static void checkLinear(int n, Circuit c, UniformRandomProvider rng, String what) {
        int d = 1 << n;
        double[][] a = DenseReference.randomState(d, rng);
        double[][] b = DenseReference.randomState(d, rng);
        double ar = DenseReference.gaussian(rng);
        double ai = DenseReference.gaussian(rng);
        double br = DenseReference.gaussian(rng);
        double bi = DenseReference.gaussian(rng);
        double[][] mix = combine(ar, ai, a, br, bi, b);
        double norm = 0;
        for (int i = 0; i < d; i++) {
            norm += mix[0][i] * mix[0][i] + mix[1][i] * mix[1][i];
        }
        norm = Math.sqrt(norm);
        ar /= norm;
        ai /= norm;
        br /= norm;
        bi /= norm;
        mix = combine(ar, ai, a, br, bi, b);
        double[][] ua = DenseReference.amplitudes(DenseReference.toState(a).apply(c));
        double[][] ub = DenseReference.amplitudes(DenseReference.toState(b).apply(c));
        // Linearity of quantum evolution (N&C 2010 sec. 2.2, postulate 2).
        double[][] expected = combine(ar, ai, ua, br, bi, ub);
        StateVector actual = DenseReference.toState(mix).apply(c);
        DenseReference.assertClose(expected, actual, TOL, () -> what);
    }

    @Property(tries = 60, seed = "1001", shrinking = ShrinkingMode.OFF,
            edgeCases = EdgeCasesMode.NONE)
    void everyGateIsLinear(@ForAll long seed) {
        UniformRandomProvider rng = rng(seed);
        int n = 3 + rng.nextInt(3);
        for (String kind : DenseReference.KINDS) {
            DenseReference.Step step = DenseReference.randomStep(kind, n, rng);
            checkLinear(n, DenseReference.build(n, List.of(step)), rng,
                    "seed " + seed + ", " + step.describe());
        }
    }

    @Property(tries = 60, seed = "1002", shrinking = ShrinkingMode.OFF,
            edgeCases = EdgeCasesMode.NONE)
    void randomCircuitsAreLinear(@ForAll long seed) {
        UniformRandomProvider rng = rng(seed);
        int n = 1 + rng.nextInt(8);
        Circuit c = DenseReference.build(n, DenseReference.randomSteps(n, 30, rng));
        checkLinear(n, c, rng, "seed " + seed + ", " + n + " qubits");
    }

    /** Max abs entry of U†U − I, computed with the reference arithmetic. */
    private static double unitarityError(Operator u) {
        DenseReference.Matrix m = new DenseReference.Matrix(u.dimension());
        for (int i = 0; i < m.dim; i++) {
            for (int j = 0; j < m.dim; j++) {
                Complex z = u.get(i, j);
                m.re[i][j] = z.getReal();
                m.im[i][j] = z.getImaginary();
            }
        }
        DenseReference.Matrix p = DenseReference.multiply(DenseReference.dagger(m), m);
        double worst = 0;
        for (int i = 0; i < m.dim; i++) {
            for (int j = 0; j < m.dim; j++) {
                double re = p.re[i][j] - (i == j ? 1 : 0);
                worst = Math.max(worst, Math.hypot(re, p.im[i][j]));
            }
        }
        return worst;
    }

    @Property(tries = 100, seed = "1003", shrinking = ShrinkingMode.OFF,
            edgeCases = EdgeCasesMode.NONE)
    void everyGateIsUnitary(@ForAll long seed) {
        UniformRandomProvider rng = rng(seed);
        double a = (rng.nextDouble() * 2 - 1) * 100; // any finite angle
        Operator[] gates = {
            Gates.I, Gates.X, Gates.Y, Gates.Z, Gates.H, Gates.S, Gates.S_DAGGER, Gates.T,
            Gates.T_DAGGER, Gates.SQRT_X, Gates.CNOT, Gates.CZ, Gates.SWAP, Gates.TOFFOLI,
            Gates.FREDKIN, Gates.rx(a), Gates.ry(a), Gates.rz(a), Gates.phase(a),
            Gates.cphase(a), Gates.rzz(a),
        };
        for (int g = 0; g < gates.length; g++) {
            // Gates are unitary: U†U = I (N&C 2010 sec. 2.2, postulate 2); tolerance DESIGN.md.
            double err = unitarityError(gates[g]);
            assertTrue(err <= UNITARY_TOL, "seed " + seed + ", gate #" + g + " at angle " + a
                    + ": |U†U − I| = " + err);
            assertTrue(gates[g].isUnitary(UNITARY_TOL), "seed " + seed + ", gate #" + g
                    + " at angle " + a + ": isUnitary(1e-9) is false");
        }
    }

    @Property(tries = 60, seed = "1004", shrinking = ShrinkingMode.OFF,
            edgeCases = EdgeCasesMode.NONE)
    void randomCircuitOperatorsAreUnitary(@ForAll long seed) {
        UniformRandomProvider rng = rng(seed);
        int n = 1 + rng.nextInt(6);
        Operator u = DenseReference.build(n, DenseReference.randomSteps(n, 25, rng))
                .toOperator();
        // Products of unitaries are unitary (N&C 2010 sec. 2.1.6).
        double err = unitarityError(u);
        assertTrue(err <= UNITARY_TOL,
                "seed " + seed + ", " + n + " qubits: |U†U − I| = " + err);
        assertTrue(u.isUnitary(UNITARY_TOL), "seed " + seed + ": isUnitary(1e-9) is false");
    }

    @Property(tries = 20, seed = "1005", shrinking = ShrinkingMode.OFF,
            edgeCases = EdgeCasesMode.NONE)
    void normIsKeptOverAThousandGates(@ForAll long seed) {
        UniformRandomProvider rng = rng(seed);
        int n = 8;
        Circuit c = DenseReference.build(n, DenseReference.randomSteps(n, 1000, rng));
        StateVector s = StateVector.zero(n).apply(c);
        // Unitaries keep the norm (N&C 2010 sec. 2.1.6); 1000 gates of ~1e-16 rounding.
        assertEquals(1.0, s.norm(), TOL, "seed " + seed + ": norm()");
        double sum = 0;
        for (long i = 0; i < s.dimension(); i++) {
            Complex z = s.amplitude(i);
            sum += z.getReal() * z.getReal() + z.getImaginary() * z.getImaginary();
        }
        assertEquals(1.0, sum, TOL, "seed " + seed + ": Σ|a|² from amplitude()");
    }

    @Property(tries = 10, seed = "1007", shrinking = ShrinkingMode.OFF,
            edgeCases = EdgeCasesMode.NONE)
    void singlePrecisionKeepsTheNormWithinRoundingOverAThousandGates(@ForAll long seed) {
        UniformRandomProvider rng = rng(seed);
        int n = 8;
        List<DenseReference.Step> steps = DenseReference.randomSteps(n, 1000, rng);
        StateVector s = StateVector.zero(n, Precision.SINGLE);
        for (DenseReference.Step step : steps) {
            // Gate by gate: rounded to float after every gate, the worst case.
            s.apply(DenseReference.build(n, List.of(step)));
        }
        // Unitaries keep the norm (N&C 2010 sec. 2.1.6); each rounding to binary32 changes it
        // by a relative 2^-24 at most (Higham 2002, sec. 2.1), so 1000 gates stay within
        // 1000 * 2^-24 ≈ 6e-5.
        assertEquals(1.0, s.norm(), 1000 * Math.scalb(1.0, -24), "seed " + seed + ": norm()");
        double sum = 0;
        for (double p : s.probabilities()) {
            sum += p;
        }
        assertEquals(s.norm() * s.norm(), sum, 1e-12, "seed " + seed + ": Σ probabilities()");
    }

    @Property(tries = 30, seed = "1008", shrinking = ShrinkingMode.OFF,
            edgeCases = EdgeCasesMode.NONE)
    void singlePrecisionCircuitsAreLinearToRounding(@ForAll long seed) {
        // U(αa + βb) = αUa + βUb (N&C 2010 sec. 2.2.2), with the single-precision engine on the
        // left and the double engine on the right: equal to the rounding of binary32 (1e-5 on
        // amplitudes of size at most 1, common practice).
        UniformRandomProvider rng = rng(seed);
        int n = 1 + rng.nextInt(8);
        Circuit c = DenseReference.build(n, DenseReference.randomSteps(n, 30, rng));
        int d = 1 << n;
        double[][] a = DenseReference.randomState(d, rng);
        double[][] b = DenseReference.randomState(d, rng);
        double[][] mix = combine(0.6, 0.0, a, 0.0, 0.8, b);
        double norm = 0;
        for (int i = 0; i < d; i++) {
            norm += mix[0][i] * mix[0][i] + mix[1][i] * mix[1][i];
        }
        norm = Math.sqrt(norm);
        for (int i = 0; i < d; i++) {
            mix[0][i] /= norm;
            mix[1][i] /= norm;
        }
        StateVector left = DenseReference.toState(mix).toPrecision(Precision.SINGLE).apply(c);
        StateVector ua = DenseReference.toState(a).apply(c);
        StateVector ub = DenseReference.toState(b).apply(c);
        for (int i = 0; i < d; i++) {
            Complex x = ua.amplitude(i);
            Complex y = ub.amplitude(i);
            double re = (0.6 * x.getReal() - 0.8 * y.getImaginary()) / norm;
            double im = (0.6 * x.getImaginary() + 0.8 * y.getReal()) / norm;
            Complex l = left.amplitude(i);
            assertEquals(re, l.getReal(), 1e-5, "seed " + seed + ", amplitude " + i + " (re)");
            assertEquals(im, l.getImaginary(), 1e-5, "seed " + seed + ", amplitude " + i
                    + " (im)");
        }
    }

    @Property(tries = 100, seed = "1006", shrinking = ShrinkingMode.OFF,
            edgeCases = EdgeCasesMode.NONE)
    void probabilitiesMarginalsAndSamplesAreConserved(@ForAll long seed) {
        UniformRandomProvider rng = rng(seed);
        int n = 1 + rng.nextInt(8);
        StateVector s = DenseReference.toState(DenseReference.randomState(1 << n, rng));
        // Born rule: probabilities of a normalised state sum to one (N&C 2010 sec. 2.2.3).
        double sum = 0;
        for (double p : s.probabilities()) {
            sum += p;
        }
        assertEquals(1.0, sum, TOL, "seed " + seed + ": Σ probabilities()");
        int k = 1 + rng.nextInt(n);
        int[] qubits = DenseReference.distinctQubits(n, k, rng);
        double[] marginal = s.marginal(qubits);
        assertEquals(1 << k, marginal.length, "seed " + seed + ": marginal length 2^k");
        double msum = 0;
        for (double p : marginal) {
            msum += p;
        }
        assertEquals(1.0, msum, TOL,
                "seed " + seed + ": Σ marginal(" + Arrays.toString(qubits) + ")");
        int shots = 1 + rng.nextInt(2000);
        Tally t = s.sample(shots, rng, qubits);
        long total = 0;
        for (Map.Entry<String, Long> e : t.outcomes().entrySet()) {
            total += e.getValue();
        }
        // Every shot gives exactly one outcome (common practice).
        assertEquals(shots, total, "seed " + seed + ": Σ tally counts");
        assertEquals(shots, t.shots(), "seed " + seed + ": Tally.shots()");
        assertEquals(k, t.width(), "seed " + seed + ": Tally.width()");
    }

    @Property(tries = 80, seed = "1007", shrinking = ShrinkingMode.OFF,
            edgeCases = EdgeCasesMode.NONE)
    void inverseUndoesTheCircuit(@ForAll long seed) {
        UniformRandomProvider rng = rng(seed);
        int n = 1 + rng.nextInt(8);
        Circuit c = DenseReference.build(n, DenseReference.randomSteps(n, 40, rng));
        double[][] start = DenseReference.randomState(1 << n, rng);
        StateVector original = DenseReference.toState(start);
        StateVector back = original.copy().apply(c).apply(c.inverse());
        // U†U = I, so the inverse circuit restores the state (N&C 2010 sec. 2.1.6).
        assertEquals(1.0, back.fidelity(original), TOL, "seed " + seed + ": fidelity");
        DenseReference.assertClose(start, back, TOL, () -> "seed " + seed + ": amplitudes");
    }

    @Property(tries = 80, seed = "1008", shrinking = ShrinkingMode.OFF,
            edgeCases = EdgeCasesMode.NONE)
    void tensorProductActsFactorByFactor(@ForAll long seed) {
        UniformRandomProvider rng = rng(seed);
        int na = 1 + rng.nextInt(3);
        int nb = 1 + rng.nextInt(3);
        Operator opA = DenseReference.toOperator(DenseReference.randomUnitary(1 << na, rng));
        Operator opB = DenseReference.toOperator(DenseReference.randomUnitary(1 << nb, rng));
        StateVector a = DenseReference.toState(DenseReference.randomState(1 << na, rng));
        StateVector b = DenseReference.toState(DenseReference.randomState(1 << nb, rng));
        // (A⊗B)(|a>⊗|b>) = A|a> ⊗ B|b> (definition of A⊗B, N&C 2010 sec. 2.1.7).
        StateVector left = a.tensor(b).apply(opA.tensor(opB), allQubits(na + nb));
        StateVector right = a.copy().apply(opA, allQubits(na))
                .tensor(b.copy().apply(opB, allQubits(nb)));
        DenseReference.assertClose(DenseReference.amplitudes(right), left, TOL,
            () -> "seed " + seed + ", " + na + " ⊗ " + nb + " qubits");
    }

    private static void assertBitwiseEqual(StateVector one, StateVector two, long seed) {
        for (long i = 0; i < one.dimension(); i++) {
            Complex x = one.amplitude(i);
            Complex y = two.amplitude(i);
            if (Double.doubleToLongBits(x.getReal()) != Double.doubleToLongBits(y.getReal())
                    || Double.doubleToLongBits(x.getImaginary())
                    != Double.doubleToLongBits(y.getImaginary())) {
                throw new AssertionError("seed " + seed + ": amplitude " + i + " is " + x
                        + " with 1 thread but " + y + " with 2");
            }
        }
    }

    @Property(tries = 2, seed = "1010", shrinking = ShrinkingMode.OFF,
            edgeCases = EdgeCasesMode.NONE)
    void oneAndTwoThreadsAgreeBitwiseOnStatesPastOneChunk(@ForAll long seed) {
        UniformRandomProvider rng = rng(seed);
        int n = 21; // 2^21 amplitudes: more than one 2^20-amplitude chunk
        Circuit c = DenseReference.build(n, DenseReference.randomSteps(n, 30, rng));
        // DESIGN.md: same results whatever the thread count.
        StateVector one = StateVector.zero(n).setThreads(1).apply(c);
        StateVector two = StateVector.zero(n).setThreads(2).apply(c);
        assertBitwiseEqual(one, two, seed);
        // Unitaries keep the norm (N&C 2010 sec. 2.1.6).
        assertEquals(1.0, two.norm(), TOL, "seed " + seed + ": norm");
    }

    @Property(tries = 8, seed = "1009", shrinking = ShrinkingMode.OFF,
            edgeCases = EdgeCasesMode.NONE)
    void oneAndTwoThreadsGiveBitwiseEqualResults(@ForAll long seed) {
        UniformRandomProvider rng = rng(seed);
        int n = 16; // above the 14-qubit size where the kernels go parallel
        List<DenseReference.Step> steps = DenseReference.randomSteps(n, 120, rng);
        Circuit c = DenseReference.build(n, steps);
        // DESIGN.md: same seed, same results, whatever the thread count.
        StateVector one = StateVector.zero(n).setThreads(1).apply(c);
        StateVector two = StateVector.zero(n).setThreads(2).apply(c);
        assertEquals(1, one.threads(), "seed " + seed + ": threads()");
        assertEquals(2, two.threads(), "seed " + seed + ": threads()");
        assertBitwiseEqual(one, two, seed);
        long sampleSeed = rng.nextLong();
        assertEquals(one.sample(3000, rng(sampleSeed)).outcomes(),
                two.sample(3000, rng(sampleSeed)).outcomes(), "seed " + seed + ": samples");

        // Through the Simulator, with and without mid-circuit measurement and reset.
        Circuit.Builder measured = Circuit.builder(n);
        for (DenseReference.Step s : steps) {
            s.addTo(measured);
        }
        Circuit finalOnly = measured.measure().build();
        Circuit.Builder mid = Circuit.builder(n);
        for (DenseReference.Step s : steps.subList(0, 60)) {
            s.addTo(mid);
        }
        mid.measure(3, 3).reset(3).h(3);
        for (DenseReference.Step s : steps.subList(60, 80)) {
            s.addTo(mid);
        }
        Circuit midCircuit = mid.measure().build();
        long simSeed = rng.nextLong();
        Tally t1 = Simulator.seeded(simSeed).withThreads(1).run(finalOnly, 2000);
        Tally t2 = Simulator.seeded(simSeed).withThreads(2).run(finalOnly, 2000);
        assertEquals(t1.outcomes(), t2.outcomes(), "seed " + seed + ": final-measure tallies");
        Tally m1 = Simulator.seeded(simSeed).withThreads(1).run(midCircuit, 6);
        Tally m2 = Simulator.seeded(simSeed).withThreads(2).run(midCircuit, 6);
        assertEquals(m1.outcomes(), m2.outcomes(), "seed " + seed + ": mid-circuit tallies");
    }
}
