package dev.qsim.noise;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import dev.qsim.Gates;
import dev.qsim.Operator;
import dev.qsim.StateVector;

class ChannelTest {
    private static final double TOL = 1e-12;

    /** A one-qubit state with Bloch vector (sin a cos b, sin a sin b, cos a). */
    private static DensityMatrix state(double a, double b) {
        return DensityMatrix.of(StateVector.zero(1).apply(Gates.ry(a), 0).apply(Gates.rz(b), 0));
    }

    private static double[] blochAfter(Channel ch, double a, double b) {
        return NoiseFixtures.bloch(state(a, b).apply(ch, 0));
    }

    private static double[] start(double a, double b) {
        return new double[] {Math.sin(a) * Math.cos(b), Math.sin(a) * Math.sin(b), Math.cos(a)};
    }

    @ParameterizedTest
    @ValueSource(doubles = {0, 0.1, 0.37, 0.5, 1})
    void pauliChannelsShrinkTheBlochVectorAsInNielsenChuang(double p) {
        double a = 1.1;
        double b = 0.7;
        double[] r = start(a, b);
        double f = 1 - 2 * p;
        // Nielsen and Chuang (2010), §8.3.3: bit flip keeps x and scales y, z
        // by 1-2p; phase flip keeps z; bit-phase flip keeps y.
        assertArrayEquals(new double[] {r[0], f * r[1], f * r[2]},
                blochAfter(Channel.bitFlip(p), a, b), TOL, "bit flip p=" + p);
        assertArrayEquals(new double[] {f * r[0], f * r[1], r[2]},
                blochAfter(Channel.phaseFlip(p), a, b), TOL, "phase flip p=" + p);
        assertArrayEquals(new double[] {f * r[0], r[1], f * r[2]},
                blochAfter(Channel.bitPhaseFlip(p), a, b), TOL, "bit-phase flip p=" + p);
        // Nielsen and Chuang (2010), §8.3.4: the depolarizing channel in Pauli form,
        // (1-p) rho + p/3 (X rho X + Y rho Y + Z rho Z), shrinks r by 1 - 4p/3.
        double g = 1 - 4 * p / 3;
        assertArrayEquals(new double[] {g * r[0], g * r[1], g * r[2]},
                blochAfter(Channel.depolarizing(p), a, b), TOL, "depolarizing p=" + p);
    }

    @ParameterizedTest
    @ValueSource(doubles = {0, 0.2, 0.5, 0.9, 1})
    void dampingChannelsActOnTheBlochVectorAsInNielsenChuang(double gamma) {
        double a = 2.3;
        double b = -0.4;
        double[] r = start(a, b);
        double s = Math.sqrt(1 - gamma);
        // Nielsen and Chuang (2010), §8.3.5: amplitude damping maps (x, y, z) to
        // (x sqrt(1-g), y sqrt(1-g), g + (1-g) z) in our sign convention z = rho00 - rho11.
        assertArrayEquals(new double[] {s * r[0], s * r[1], gamma + (1 - gamma) * r[2]},
                blochAfter(Channel.amplitudeDamping(gamma), a, b), TOL, "gamma=" + gamma);
        // Nielsen and Chuang (2010), §8.3.6: phase damping scales the coherences by
        // sqrt(1-lambda) and keeps the populations.
        assertArrayEquals(new double[] {s * r[0], s * r[1], r[2]},
                blochAfter(Channel.phaseDamping(gamma), a, b), TOL, "lambda=" + gamma);
    }

    @Test
    void krausOperatorsAreTheTextbookMatrices() {
        double g = 0.3;
        // Nielsen and Chuang (2010), §8.3.5: E0 = [[1,0],[0,sqrt(1-g)]], E1 = [[0,sqrt(g)],[0,0]].
        List<Operator> ad = Channel.amplitudeDamping(g).kraus();
        assertEquals(2, ad.size());
        assertEquals(Math.sqrt(1 - g), ad.get(0).get(1, 1).getReal(), 0);
        assertEquals(1, ad.get(0).get(0, 0).getReal(), 0);
        assertEquals(Math.sqrt(g), ad.get(1).get(0, 1).getReal(), 0);
        assertEquals(Complex.ZERO, ad.get(1).get(1, 0));
        // Nielsen and Chuang (2010), §8.3.6: E1 = [[0,0],[0,sqrt(lambda)]].
        List<Operator> pd = Channel.phaseDamping(g).kraus();
        assertEquals(Math.sqrt(g), pd.get(1).get(1, 1).getReal(), 0);
        assertEquals(Complex.ZERO, pd.get(1).get(0, 0));
        // Nielsen and Chuang (2010), §8.3.4: Pauli form sqrt(1-p) I, sqrt(p/3) X, Y, Z.
        List<Operator> dep = Channel.depolarizing(0.3).kraus();
        assertEquals(4, dep.size());
        assertEquals(Math.sqrt(0.1), dep.get(2).get(1, 0).getImaginary(), 1e-15);
    }

    @Test
    void completelyDepolarizingGivesTheMaximallyMixedState() {
        // Nielsen and Chuang (2010), §8.3.4: I/2 = (rho + X rho X + Y rho Y + Z rho Z)/4, so
        // p = 3/4 maps every state to I/2; for two qubits, the 16 Pauli products average to
        // I/4 in the same way, so p = 15/16 gives I/4 (common practice).
        assertArrayEquals(new double[] {0, 0, 0}, blochAfter(Channel.depolarizing(0.75), 0.4, 2),
                TOL);
        DensityMatrix bell = DensityMatrix.of(StateVector.zero(2).apply(Gates.H, 0)
                .apply(Gates.CNOT, 0, 1));
        bell.apply(Channel.twoQubitDepolarizing(15.0 / 16), 0, 1);
        for (int r = 0; r < 4; r++) {
            for (int c = 0; c < 4; c++) {
                assertEquals(r == c ? 0.25 : 0, bell.get(r, c).abs(), TOL, r + "," + c);
            }
        }
        assertEquals(0.25, bell.purity(), TOL);
    }

    @ParameterizedTest
    @ValueSource(doubles = {0, 0.5, 2, 10, 40})
    void relaxationFollowsT1AndT2Exponentials(double t) {
        double t1 = 30;
        double t2 = 45;
        // Krantz et al. (2019), Appl. Phys. Rev. 6, 021318 (and Nielsen and Chuang 2010,
        // §8.3.5): from |1>, the excited population decays as exp(-t/T1)...
        DensityMatrix one = DensityMatrix.of(StateVector.basis(1, 1));
        one.apply(Channel.amplitudeDamping(1 - Math.exp(-t / t1)), 0);
        assertEquals(Math.exp(-t / t1), one.get(1, 1).getReal(), TOL, "t=" + t);
        DensityMatrix relaxed = DensityMatrix.of(StateVector.basis(1, 1));
        relaxed.apply(Channel.decay(t, t1, t2), 0);
        assertEquals(Math.exp(-t / t1), relaxed.get(1, 1).getReal(), TOL, "t=" + t);
        // ...and from |+>, the coherence rho01 = 1/2 decays as exp(-t/T2).
        DensityMatrix plus = DensityMatrix.of(StateVector.zero(1).apply(Gates.H, 0));
        plus.apply(Channel.decay(t, t1, t2), 0);
        assertEquals(0.5 * Math.exp(-t / t2), plus.get(0, 1).abs(), TOL, "t=" + t);
        assertEquals(0.5 * Math.exp(-t / t2), plus.get(1, 0).abs(), TOL, "t=" + t);
    }

    @Test
    void compositionMultipliesContractions() {
        // Bit flips with p and q compose to one with p(1-q) + q(1-p): the factors 1-2p multiply
        // (Nielsen and Chuang 2010, §8.3.3).
        double p = 0.1;
        double q = 0.25;
        assertArrayEquals(blochAfter(Channel.bitFlip(p * (1 - q) + q * (1 - p)), 0.8, 0.3),
                blochAfter(Channel.bitFlip(p).then(Channel.bitFlip(q)), 0.8, 0.3), TOL);
        // then: first this, then the argument; amplitude damping then bit flip from |1>:
        // populations (1-g, g) become ((1-g)(1-p) + g p, ...) (exact arithmetic).
        DensityMatrix rho = DensityMatrix.of(StateVector.basis(1, 1));
        rho.apply(Channel.amplitudeDamping(0.3).then(Channel.bitFlip(0.2)), 0);
        assertEquals(0.3 * 0.8 + 0.7 * 0.2, rho.get(0, 0).getReal(), TOL);
    }

    @Test
    void tensorPutsTheArgumentOnTheLowQubit() {
        // Convention of Operator.tensor in dev.qsim: the argument takes the low qubits.
        StateVector psi = StateVector.zero(2).apply(Gates.H, 0).apply(Gates.ry(1.2), 1)
                .apply(Gates.CNOT, 0, 1);
        DensityMatrix joint = DensityMatrix.of(psi)
                .apply(Channel.amplitudeDamping(0.4).tensor(Channel.phaseFlip(0.3)), 0, 1);
        DensityMatrix separate = DensityMatrix.of(psi).apply(Channel.phaseFlip(0.3), 0)
                .apply(Channel.amplitudeDamping(0.4), 1);
        for (int r = 0; r < 4; r++) {
            for (int c = 0; c < 4; c++) {
                assertEquals(separate.get(r, c).getReal(), joint.get(r, c).getReal(), TOL);
                assertEquals(separate.get(r, c).getImaginary(), joint.get(r, c).getImaginary(),
                        TOL);
            }
        }
    }

    @Test
    void everyBuiltInIsTracePreserving() {
        // Completeness sum K^dagger K = I (Nielsen and Chuang 2010, §8.2.3, completeness relation);
        // Channel.of re-validates it to 1e-9, and we check it here independently to 1e-12.
        Channel[] all = {Channel.bitFlip(0.3), Channel.phaseFlip(0.7), Channel.bitPhaseFlip(0.2),
            Channel.depolarizing(0.6), Channel.twoQubitDepolarizing(0.4),
            Channel.amplitudeDamping(0.35), Channel.phaseDamping(0.8),
            Channel.decay(4, 20, 13), Channel.identity(2)};
        for (Channel ch : all) {
            int d = 1 << ch.qubits();
            for (int r = 0; r < d; r++) {
                for (int c = 0; c < d; c++) {
                    Complex sum = Complex.ZERO;
                    for (Operator k : ch.kraus()) {
                        for (int j = 0; j < d; j++) {
                            sum = sum.add(k.get(j, r).conj().multiply(k.get(j, c)));
                        }
                    }
                    assertEquals(r == c ? 1 : 0, sum.getReal(), TOL, ch + " " + r + "," + c);
                    assertEquals(0, sum.getImaginary(), TOL, ch + " " + r + "," + c);
                }
            }
        }
    }

    @Test
    void badInputIsRefusedWithTheBadValue() {
        Operator half = Operator.of(new Complex[][] {{Complex.ofCartesian(0.5, 0), Complex.ZERO},
            {Complex.ZERO, Complex.ONE}});
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Channel.of(half));
        assertTrue(e.getMessage().contains("not trace preserving")
                && e.getMessage().contains("0.75"),
                e.getMessage());
        for (double p : new double[] {-0.1, 1.5, Double.NaN}) {
            e = assertThrows(IllegalArgumentException.class, () -> Channel.depolarizing(p));
            assertTrue(e.getMessage().contains(String.valueOf(p)), e.getMessage());
            e = assertThrows(IllegalArgumentException.class, () -> Channel.amplitudeDamping(p));
            assertTrue(e.getMessage().contains(String.valueOf(p)), e.getMessage());
        }
        e = assertThrows(IllegalArgumentException.class, () -> Channel.bitFlip(1.01));
        assertTrue(e.getMessage().contains("1.01"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> Channel.decay(1, 10, 20.5));
        assertTrue(e.getMessage().contains("20.5") && e.getMessage().contains("2*T1"),
                e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> Channel.decay(-2, 10, 5));
        assertTrue(e.getMessage().contains("-2.0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> Channel.decay(1, -3, 5));
        assertTrue(e.getMessage().contains("-3.0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> Channel.of(Gates.I, Gates.CNOT));
        assertTrue(e.getMessage().contains("2 qubit(s)"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> Channel.bitFlip(0.1).then(Channel.twoQubitDepolarizing(0.1)));
        assertTrue(e.getMessage().contains("2-qubit"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> DensityMatrix.zero(3).apply(Channel.twoQubitDepolarizing(0.1), 1));
        assertTrue(e.getMessage().contains("acts on 2 qubit(s) but 1"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseModel.builder().afterOneQubitGates(Channel.twoQubitDepolarizing(0.1)));
        assertTrue(e.getMessage().contains("2-qubit channel"), e.getMessage());
    }
}
