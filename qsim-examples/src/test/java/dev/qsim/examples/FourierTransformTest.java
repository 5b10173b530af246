package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.StateVector;

class FourierTransformTest {

    private static final double TOL = 1e-10;

    /**
     * The discrete Fourier transform by its definition, b_y = 1/sqrt(N) sum_x a_x e^{2 pi i xy/N}
     * (Nielsen & Chuang 2010, sec. 5.1, eq. 5.2), as a plain double loop; returns re, im.
     */
    private static double[][] dft(double[] re, double[] im) {
        int n = re.length;
        double[] outRe = new double[n];
        double[] outIm = new double[n];
        double scale = 1 / Math.sqrt(n);
        for (int y = 0; y < n; y++) {
            double sr = 0;
            double si = 0;
            for (int x = 0; x < n; x++) {
                double angle = 2 * Math.PI * ((long) x * y % n) / n;
                double c = Math.cos(angle);
                double s = Math.sin(angle);
                sr += re[x] * c - im[x] * s;
                si += re[x] * s + im[x] * c;
            }
            outRe[y] = sr * scale;
            outIm[y] = si * scale;
        }
        return new double[][] {outRe, outIm};
    }

    private static void assertMatchesDft(StateVector input, StateVector output, String where) {
        int n = (int) input.dimension();
        double[] re = new double[n];
        double[] im = new double[n];
        for (int x = 0; x < n; x++) {
            re[x] = input.amplitude(x).getReal();
            im[x] = input.amplitude(x).getImaginary();
        }
        double[][] expected = dft(re, im);
        for (int y = 0; y < n; y++) {
            Complex a = output.amplitude(y);
            assertEquals(expected[0][y], a.getReal(), TOL, where + ", real part of y = " + y);
            assertEquals(expected[1][y], a.getImaginary(), TOL, where + ", imag part of y = " + y);
        }
    }

    @ParameterizedTest
    @CsvSource({"1, 101", "2, 102", "3, 103", "4, 104", "5, 105", "7, 107"})
    void qftOfARandomStateEqualsTheDirectDft(int qubits, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int n = 1 << qubits;
        double[] re = new double[n];
        double[] im = new double[n];
        double norm = 0;
        for (int x = 0; x < n; x++) {
            re[x] = rng.nextDouble() * 2 - 1;
            im[x] = rng.nextDouble() * 2 - 1;
            norm += re[x] * re[x] + im[x] * im[x];
        }
        Complex[] amplitudes = new Complex[n];
        for (int x = 0; x < n; x++) {
            amplitudes[x] = Complex.ofCartesian(re[x] / Math.sqrt(norm), im[x] / Math.sqrt(norm));
        }
        StateVector input = StateVector.of(amplitudes);
        StateVector output = input.copy().apply(FourierTransform.qft(qubits));
        assertMatchesDft(input, output, "qubits " + qubits + ", seed " + seed);
    }

    @Test
    void qftOfEachBasisStateEqualsTheDirectDft() {
        for (long x = 0; x < 8; x++) {
            StateVector input = StateVector.basis(3, x);
            StateVector output = input.copy().apply(FourierTransform.qft(3));
            assertMatchesDft(input, output, "basis " + x);
        }
    }

    @Test
    void periodicInputPeaksAtMultiplesOfNOverThePeriod() {
        Capture out = new Capture();
        FourierTransform.Result r = FourierTransform.run(out.stream(), 5, 4, 1);
        // Input: equal superposition of 1, 5, ..., 29 (by construction of the scenario).
        StateVector input = r.input();
        for (int x = 0; x < 32; x++) {
            double expected = x % 4 == 1 ? 1.0 / 8 : 0.0;
            assertEquals(expected, input.probability(x), TOL, "input x = " + x);
        }
        assertMatchesDft(input, r.output(), "beacon input");
        // Period r dividing N: probability 1/r at each multiple of N/r and 0 elsewhere
        // (Nielsen & Chuang 2010, sec. 5.4.1).
        assertEquals(List.of(0, 8, 16, 24), r.peaks());
        for (int y = 0; y < 32; y++) {
            double expected = y % 8 == 0 ? 0.25 : 0.0;
            assertEquals(expected, r.output().probability(y), TOL, "output y = " + y);
        }
        String text = out.text();
        assertTrue(text.contains(FourierTransform.qft(5).diagram().strip()), text);
        assertTrue(text.contains("Peaks at y = 0, 8, 16, 24"), text);
        assertTrue(text.contains("flash period is N/spacing = 32/8 = 4"), text);
    }

    @ParameterizedTest
    @CsvSource({"3, 1, 0", "3, 2, 1", "4, 8, 5", "6, 16, 3", "4, 16, 7"})
    void peaksFollowThePeriodForOtherInputs(int qubits, int period, int offset) {
        FourierTransform.Result r = FourierTransform.run(new Capture().stream(), qubits,
                period, offset);
        int size = 1 << qubits;
        List<Integer> expected = new ArrayList<>();
        for (int y = 0; y < size; y += size / period) {
            expected.add(y);
        }
        // Nielsen & Chuang 2010, sec. 5.4.1, as above; and the amplitudes equal the direct DFT.
        assertEquals(expected, r.peaks());
        assertMatchesDft(r.input(), r.output(), "period " + period + ", offset " + offset);
    }

    @Test
    void refusesAPeriodThatIsNotAPowerOfTwo() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> FourierTransform.periodicInput(5, 3, 0));
        assertTrue(e.getMessage().contains("got 3"), e.getMessage());
        IllegalArgumentException offset = assertThrows(IllegalArgumentException.class,
                () -> FourierTransform.periodicInput(5, 4, 4));
        assertTrue(offset.getMessage().contains("got 4"), offset.getMessage());
    }
}
