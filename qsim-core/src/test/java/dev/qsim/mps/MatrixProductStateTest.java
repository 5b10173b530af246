package dev.qsim.mps;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.SplittableRandom;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.apache.commons.statistics.inference.ChiSquareTest;
import org.ejml.data.Complex_F64;
import org.ejml.data.ZMatrixRMaj;
import org.ejml.dense.row.CommonOps_ZDRM;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Operator;
import dev.qsim.StateVector;
import dev.qsim.Tally;
import dev.qsim.observable.Expectation;
import dev.qsim.observable.Observable;
import dev.qsim.observable.PauliProduct;

/**
 * The matrix product state on wide circuits with known answers, its truncation record, its
 * reads and its refusals. Sources are named beside each check.
 */
class MatrixProductStateTest {

    private static Circuit ghz(int n) {
        Circuit.Builder b = Circuit.builder(n).h(0);
        for (int q = 1; q < n; q++) {
            b.cnot(q - 1, q);
        }
        return b.build();
    }

    @Test
    void aHundredQubitGhzStateHasBondDimensionTwo() {
        // (|0...0> + |1...1>)/√2 (Greenberger, Horne, Shimony and Zeilinger, Am. J. Phys. 58,
        // 1131, 1990) has Schmidt rank 2 across every cut (Nielsen and Chuang 2010, §2.5), so
        // every bond holds exactly 2 values; its stabilizers X...X and Z_i Z_j have
        // expectation 1, and Z_i alone 0.
        int n = 100;
        MatrixProductState s = MatrixProductState.zero(n).apply(ghz(n));
        for (int b = 0; b < n - 1; b++) {
            assertEquals(2, s.bondDimension(b), "bond " + b);
        }
        double r = Math.sqrt(0.5);
        assertEquals(r, s.amplitude("0".repeat(n)).getReal(), 1e-14);
        assertEquals(r, s.amplitude("1".repeat(n)).getReal(), 1e-14);
        assertEquals(0, s.amplitude("1" + "0".repeat(n - 1)).abs(), 1e-15);
        assertEquals(0, s.probability("01".repeat(n / 2)), 1e-15);
        assertEquals(1, s.expectation(PauliProduct.parse("X".repeat(n))).getReal(), 1e-12);
        assertEquals(1, s.expectation(PauliProduct.parse("Z0 Z99")).getReal(), 1e-12);
        assertEquals(0, s.expectation(PauliProduct.parse("Z50")).getReal(), 1e-12);
        assertArrayEquals(new double[] {0.5, 0, 0, 0.5}, s.marginal(0, 99), 1e-12);
        assertEquals(0, s.discardedWeight(), 1e-25);
        assertEquals(1.0, s.fidelityLowerBound(), 1e-12);
        // Shots read all zeros or all ones, half each: chi-square at 1e-3 (Commons Statistics).
        Tally t = s.sample(2000, RandomSource.XO_RO_SHI_RO_128_PP.create(5));
        long zeros = t.count("0".repeat(n));
        long ones = t.count("1".repeat(n));
        assertEquals(2000, zeros + ones);
        double p = ChiSquareTest.withDefaults().test(new double[] {0.5, 0.5},
                new long[] {zeros, ones}).getPValue();
        assertTrue(p > 1e-3, "p = " + p + ", " + t);
    }

    @Test
    void distantGatesAreRoutedAndTheSwapsUndone() {
        // The same GHZ state made by CNOTs from qubit 0 to every other qubit: each gate is routed
        // through swaps and they are undone, so the state and its bonds are as above.
        int n = 40;
        Circuit.Builder b = Circuit.builder(n).h(0);
        for (int q = 1; q < n; q++) {
            b.cnot(0, q);
        }
        MatrixProductState s = MatrixProductState.zero(n).apply(b.build());
        assertEquals(2, s.maxBondDimension());
        assertEquals(Math.sqrt(0.5), s.amplitude("1".repeat(n)).getReal(), 1e-13);
        assertEquals(Math.sqrt(0.5), s.amplitude("0".repeat(n)).getReal(), 1e-13);
        assertEquals(0, s.discardedWeight(), 1e-25);
    }

    /**
     * A 60-qubit nearest-neighbour circuit of hopping gates {@code exp(-iθ(XX + YY)/2)} and
     * phase gates on 30 excitations. Under the Jordan-Wigner map (Lieb, Schultz and Mattis 1961,
     * Ann. Phys. 16, 407) neighbouring hops and phases are non-interacting fermions, so the
     * circuit is fixed by a 60 x 60 single-particle unitary {@code U}, and (Terhal and
     * DiVincenzo 2002, "Classical simulation of noninteracting-fermion quantum circuits", Phys.
     * Rev. A 65, 032325) the amplitude of the excitations at sorted sites S from sorted sites T
     * is {@code det U[S, T]} (computed by EJML), the density at site j is
     * {@code n_j = Σ_{t∈T} |U_jt|²}, and by Wick's theorem {@code <n_i n_j> = n_i n_j - |G_ij|²}
     * with {@code G_ij = Σ_{t∈T} U_it conj(U_jt)}.
     */
    @Test
    void aSixtyQubitFreeFermionCircuitMatchesItsSingleParticleSolution() {
        int n = 60;
        int depth = 6;
        SplittableRandom r = new SplittableRandom(60);
        double[][] ur = new double[n][n];
        double[][] ui = new double[n][n];
        for (int j = 0; j < n; j++) {
            ur[j][j] = 1;
        }
        Circuit.Builder b = Circuit.builder(n);
        int[] occupied = new int[n / 2];
        for (int k = 0; k < n / 2; k++) {
            occupied[k] = 2 * k;
            b.x(2 * k);
        }
        for (int layer = 0; layer < depth; layer++) {
            for (int j = 0; j < n; j++) {
                double lambda = r.nextDouble(-Math.PI, Math.PI);
                b.phase(j, lambda);
                double c = Math.cos(lambda);
                double s = Math.sin(lambda);
                for (int t = 0; t < n; t++) {
                    double xr = ur[j][t];
                    double xi = ui[j][t];
                    ur[j][t] = c * xr - s * xi;
                    ui[j][t] = c * xi + s * xr;
                }
            }
            for (int j = layer % 2; j + 1 < n; j += 2) {
                double theta = r.nextDouble(0.2, 1.4);
                double c = Math.cos(theta);
                double s = Math.sin(theta);
                Complex[][] m = {
                    {Complex.ONE, Complex.ZERO, Complex.ZERO, Complex.ZERO},
                    {Complex.ZERO, Complex.ofCartesian(c, 0), Complex.ofCartesian(0, -s),
                        Complex.ZERO},
                    {Complex.ZERO, Complex.ofCartesian(0, -s), Complex.ofCartesian(c, 0),
                        Complex.ZERO},
                    {Complex.ZERO, Complex.ZERO, Complex.ZERO, Complex.ONE},
                };
                b.apply(Operator.of(m), j, j + 1);
                // rows j, j+1 of U mix by [[c, -i s], [-i s, c]]
                for (int t = 0; t < n; t++) {
                    double ar = ur[j][t];
                    double ai = ui[j][t];
                    double br = ur[j + 1][t];
                    double bi = ui[j + 1][t];
                    ur[j][t] = c * ar + s * bi;
                    ui[j][t] = c * ai - s * br;
                    ur[j + 1][t] = c * br + s * ai;
                    ui[j + 1][t] = c * bi - s * ar;
                }
            }
        }
        MatrixProductState mps = MatrixProductState.zero(n, 256, 0).apply(b.build());
        assertEquals(0, mps.truncations());
        assertTrue(mps.maxBondDimension() > 8, "the circuit entangles: " + mps);
        double[] density = new double[n];
        for (int j = 0; j < n; j++) {
            for (int t : occupied) {
                density[j] += ur[j][t] * ur[j][t] + ui[j][t] * ui[j][t];
            }
            assertEquals(1 - 2 * density[j], mps.expectation(PauliProduct.single('Z', j))
                    .getReal(), 1e-10, "Z" + j);
        }
        for (int[] pair : new int[][] {{0, 1}, {10, 13}, {29, 30}, {45, 59}}) {
            int i = pair[0];
            int j = pair[1];
            double gr = 0;
            double gi = 0;
            for (int t : occupied) {
                gr += ur[i][t] * ur[j][t] + ui[i][t] * ui[j][t];
                gi += ui[i][t] * ur[j][t] - ur[i][t] * ui[j][t];
            }
            double nn = density[i] * density[j] - (gr * gr + gi * gi);
            double zz = 1 - 2 * density[i] - 2 * density[j] + 4 * nn;
            assertEquals(zz, mps.expectation(PauliProduct.parse("Z" + i + " Z" + j)).getReal(),
                    1e-10, "Z" + i + " Z" + j);
        }
        // Amplitudes: back to the start, and with one excitation moved one site on.
        int[][] finals = {occupied.clone(), occupied.clone(), occupied.clone()};
        finals[1][7] = 15;
        finals[2][29] = 59;
        for (int[] s : finals) {
            Arrays.sort(s);
            ZMatrixRMaj m = new ZMatrixRMaj(n / 2, n / 2);
            for (int x = 0; x < n / 2; x++) {
                for (int y = 0; y < n / 2; y++) {
                    m.set(x, y, ur[s[x]][occupied[y]], ui[s[x]][occupied[y]]);
                }
            }
            Complex_F64 det = CommonOps_ZDRM.det(m);
            char[] bits = new char[n];
            Arrays.fill(bits, '0');
            for (int q : s) {
                bits[n - 1 - q] = '1';
            }
            Complex a = mps.amplitude(new String(bits));
            assertEquals(det.real, a.getReal(), 1e-10, Arrays.toString(s));
            assertEquals(det.imaginary, a.getImaginary(), 1e-10, Arrays.toString(s));
        }
        // Every shot keeps 30 excitations (the circuit conserves their number).
        Tally t = mps.sample(50, RandomSource.XO_RO_SHI_RO_128_PP.create(1));
        for (String bits : t.outcomes().keySet()) {
            assertEquals(n / 2, bits.chars().filter(ch -> ch == '1').count(), bits);
        }
    }

    @Test
    void aSingleTruncationKeepsTheLargerSchmidtValue() {
        // ry(2a) then CNOT makes cos a |00> + sin a |11> (Schmidt form, Nielsen and Chuang 2010,
        // §2.5). With one value per bond the larger stays: the state becomes |00>, the
        // discarded weight is sin²a and the fidelity with the exact state cos²a = 1 - w, which
        // the estimate and the bound both give exactly for a single truncation.
        double a = 0.4;
        Circuit c = Circuit.builder(2).ry(0, 2 * a).cnot(0, 1).build();
        MatrixProductState s = MatrixProductState.zero(2, 1, 0).apply(c);
        double w = Math.sin(a) * Math.sin(a);
        assertEquals(1, s.truncations());
        assertEquals(w, s.discardedWeight(), 1e-15);
        assertEquals(1 - w, s.fidelityEstimate(), 1e-15);
        assertEquals(1 - w, s.fidelityLowerBound(), 1e-15);
        assertEquals(1, s.amplitude("00").getReal(), 1e-15);
        assertEquals(1 - w, s.toStateVector().fidelity(StateVector.zero(2).apply(c)), 1e-15);
        // A threshold above w drops the value too; one below keeps the state exact.
        assertEquals(w, MatrixProductState.zero(2, 64, 1.01 * w).apply(c).discardedWeight(),
                1e-15);
        assertEquals(0, MatrixProductState.zero(2, 64, 0.99 * w).apply(c).discardedWeight(),
                1e-25);
    }

    @Test
    void theLowerBoundHoldsOnTruncatedRandomCircuits() {
        // The angle arccos|<φ|ψ>| is a metric (Nielsen and Chuang 2010, §9.2.2), so the exact
        // fidelity is at least cos²(Σ asin √w); checked against the state vector, 8 seeds.
        for (long seed = 1; seed <= 8; seed++) {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
            int n = 10;
            Circuit.Builder b = Circuit.builder(n);
            for (int layer = 0; layer < 8; layer++) {
                for (int q = 0; q < n; q++) {
                    b.u(q, 3 * rng.nextDouble(), 6 * rng.nextDouble(), 6 * rng.nextDouble());
                }
                for (int q = layer % 2; q + 1 < n; q += 2) {
                    b.cnot(q, q + 1).rzz(q, q + 1, rng.nextDouble());
                }
            }
            Circuit c = b.build();
            MatrixProductState s = MatrixProductState.zero(n, 4, 0).apply(c);
            assertTrue(s.maxBondDimension() <= 4);
            assertTrue(s.truncations() > 0 && s.discardedWeight() > 0, s.toString());
            double exact = s.toStateVector().fidelity(StateVector.zero(n).apply(c));
            assertTrue(exact >= s.fidelityLowerBound() - 1e-12, "seed " + seed + ": fidelity "
                    + exact + " below the bound " + s.fidelityLowerBound());
            assertTrue(s.fidelityEstimate() <= 1 && s.fidelityEstimate() >= s.fidelityLowerBound());
        }
    }

    private static Circuit randomCircuit(int n, int layers, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        Circuit.Builder b = Circuit.builder(n);
        for (int layer = 0; layer < layers; layer++) {
            for (int q = 0; q < n; q++) {
                b.u(q, 3 * rng.nextDouble(), 6 * rng.nextDouble(), 6 * rng.nextDouble());
            }
            for (int q = layer % 2; q + 1 < n; q += 2) {
                b.cnot(q, q + 1);
            }
            b.cphase(rng.nextInt(n / 2), n / 2 + rng.nextInt(n / 2), rng.nextDouble());
        }
        return b.build();
    }

    @Test
    void marginalsAndExpectationsAgreeWithTheStateVector() {
        Circuit c = randomCircuit(8, 6, 21);
        StateVector sv = StateVector.zero(8).apply(c);
        MatrixProductState s = MatrixProductState.zero(8).apply(c);
        for (int[] qs : new int[][] {{0}, {7}, {5, 1, 3}, {2, 6}, {0, 1, 2, 3, 4, 5, 6, 7}}) {
            assertArrayEquals(sv.marginal(qs), s.marginal(qs), 1e-12, Arrays.toString(qs));
        }
        Observable h = Observable.builder().add(0.5, "Z0 Z1").add(-1.25, "X3 Y4")
                .add(2, "Y7").add(0.75, "X0 Z2 Y5 X7").add(-0.3, "I").build();
        assertEquals(Expectation.of(h, sv), s.expectation(h), 1e-12);
        Complex p = s.expectation(PauliProduct.parse("i X2 Z6"));
        Complex q = Expectation.of(PauliProduct.parse("i X2 Z6"), sv);
        assertEquals(q.getReal(), p.getReal(), 1e-12);
        assertEquals(q.getImaginary(), p.getImaginary(), 1e-12);
        // Textbook values: after ry(θ) on |0>, <Z> = cos θ and <X> = sin θ (Nielsen and Chuang
        // 2010, §4.2, eq. 4.5); the phase i multiplies the value.
        MatrixProductState one = MatrixProductState.zero(3).apply(Circuit.builder(3).ry(1, 0.7)
                .build());
        assertEquals(Math.cos(0.7), one.expectation(Observable.of(1, "Z1")), 1e-15);
        assertEquals(Math.sin(0.7), one.expectation(Observable.of(1, "X1")), 1e-15);
        assertEquals(Math.cos(0.7), one.expectation(PauliProduct.parse("i Z1")).getImaginary(),
                1e-15);
    }

    @Test
    void samplesFollowTheBornRule() {
        // Chi-square goodness of fit of 20,000 shots against the exact distribution at 1e-3
        // (Commons Statistics); the state's centre is not at qubit 0, so the right
        // environments are used.
        Circuit c = randomCircuit(6, 5, 8);
        StateVector sv = StateVector.zero(6).apply(c);
        MatrixProductState s = MatrixProductState.zero(6).apply(c);
        String before = s.toString();
        int shots = 20_000;
        Tally t = s.sample(shots, RandomSource.XO_RO_SHI_RO_128_PP.create(99), 3, 0, 5);
        double[] expected = sv.marginal(3, 0, 5);
        long[] observed = new long[8];
        for (int v = 0; v < 8; v++) {
            observed[v] = t.count(v);
        }
        double p = ChiSquareTest.withDefaults().test(expected, observed).getPValue();
        assertTrue(p > 1e-3, "p = " + p + ", " + t);
        assertEquals(before, s.toString());
        // all qubits
        Tally all = s.sample(shots, RandomSource.XO_RO_SHI_RO_128_PP.create(98));
        long[] counts = new long[64];
        for (int v = 0; v < 64; v++) {
            counts[v] = all.count(v);
        }
        double[] probs = sv.probabilities();
        // merge outcomes of expected count below 5 into one cell (common practice for chi-square)
        p = ChiSquareTest.withDefaults().test(merged(probs, counts, shots)[0],
                toLongs(merged(probs, counts, shots)[1])).getPValue();
        assertTrue(p > 1e-3, "p = " + p);
    }

    private static double[][] merged(double[] probs, long[] counts, int shots) {
        double[] e = new double[probs.length + 1];
        double[] o = new double[probs.length + 1];
        int k = 0;
        for (int v = 0; v < probs.length; v++) {
            if (probs[v] * shots >= 5) {
                e[k] = probs[v];
                o[k++] = counts[v];
            } else {
                e[probs.length] += probs[v];
                o[probs.length] += counts[v];
            }
        }
        e[k] = e[probs.length];
        o[k++] = o[probs.length];
        return new double[][] {Arrays.copyOf(e, k), Arrays.copyOf(o, k)};
    }

    private static long[] toLongs(double[] x) {
        long[] out = new long[x.length];
        for (int i = 0; i < x.length; i++) {
            out[i] = (long) x[i];
        }
        return out;
    }

    @Test
    void measuringCollapsesTheState() {
        // Measuring one qubit of a GHZ state fixes all the others (Nielsen and Chuang 2010,
        // §2.2.3).
        for (long seed = 0; seed < 6; seed++) {
            MatrixProductState s = MatrixProductState.zero(12).apply(ghz(12));
            int o = s.measure(5, RandomSource.XO_RO_SHI_RO_128_PP.create(seed));
            assertEquals(1, s.probability(String.valueOf(o).repeat(12)), 1e-14);
            assertEquals(o, s.measure(11, RandomSource.XO_RO_SHI_RO_128_PP.create(seed + 100)));
        }
    }

    @Test
    void toStateVectorAgreesAcrossTheSplitOfItsContraction() {
        // 22 qubits: the low 20 sites are contracted into a table and the top two walked, so
        // every leaf write is checked. Against the state vector of the same circuit.
        Circuit c = randomCircuit(22, 3, 4);
        StateVector sv = StateVector.zero(22).apply(c);
        assertEquals(1, MatrixProductState.zero(22).apply(c).toStateVector().fidelity(sv),
                1e-11);
    }

    private static <T extends Throwable> T fails(Class<T> type, Runnable r, String... parts) {
        T e = assertThrows(type, r::run);
        for (String part : parts) {
            assertTrue(e.getMessage().contains(part), () -> "'" + part + "' not in: "
                    + e.getMessage());
        }
        return e;
    }

    @Test
    void badArgumentsAreRefusedWithTheirValuesAndNothingChanges() {
        fails(IllegalArgumentException.class, () -> MatrixProductState.zero(0), "qubit count",
                "0", "1048576");
        fails(IllegalArgumentException.class, () -> MatrixProductState.zero(5, 0, 0),
                "bond limit", "0", "4096");
        fails(IllegalArgumentException.class, () -> MatrixProductState.zero(5, 8, 1.0),
                "1.0", "[0, 1)");
        fails(IllegalArgumentException.class, () -> MatrixProductState.zero(5, 8, Double.NaN),
                "NaN");
        MatrixProductState s = MatrixProductState.zero(3).apply(ghz(3));
        String before = s.toString();
        Complex amp = s.amplitude("111");
        fails(IllegalArgumentException.class, () -> s.amplitude("01"), "3 characters", "01");
        fails(IllegalArgumentException.class, () -> s.amplitude("0a1"), "'a'");
        fails(IndexOutOfBoundsException.class, () -> s.amplitude(8), "8", "[0, 7]");
        fails(IndexOutOfBoundsException.class, () -> MatrixProductState.zero(64).amplitude(0),
                "63");
        fails(IllegalArgumentException.class, () -> s.marginal(), "1 to 20", "0 were given");
        fails(IllegalArgumentException.class, () -> s.marginal(1, 1), "appears twice");
        fails(IndexOutOfBoundsException.class, () -> s.marginal(5), "qubit 5");
        fails(IllegalArgumentException.class, () -> s.apply(Circuit.builder(3).h(0).measure(0, 0)
                .x(1).build()), "instruction 1", "Simulator");
        fails(IllegalArgumentException.class, () -> s.apply(Circuit.builder(4).h(0).build()),
                "4 qubit(s)", "3");
        fails(IllegalArgumentException.class, () -> s.apply(Operator.identity(1), 0, 1),
                "operator acts on 1");
        fails(IndexOutOfBoundsException.class, () -> s.bondDimension(2), "bond 2", "[0, 1]");
        fails(IllegalArgumentException.class, () -> s.expectation(PauliProduct.parse("Z7")),
                "qubit 7");
        fails(IllegalArgumentException.class, () -> s.sample(0,
                RandomSource.XO_RO_SHI_RO_128_PP.create(1)), "shots", "0");
        fails(IndexOutOfBoundsException.class, () -> s.measure(3,
                RandomSource.XO_RO_SHI_RO_128_PP.create(1)), "qubit 3");
        assertEquals(before, s.toString());
        assertEquals(amp, s.amplitude("111"));
        fails(IllegalArgumentException.class, () -> MatrixProductState.zero(41).toStateVector(),
                "41", "40");
        // 2^40 amplitudes of 16 bytes: 16 TiB, more than any test heap.
        fails(IllegalStateException.class, () -> MatrixProductState.zero(40).toStateVector(),
                "17592186044416 bytes", "-Xmx");
    }
}
