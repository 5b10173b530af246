package dev.qsim.spark.benchmarking;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

/** The decay fit on data of the model itself. */
class DecayFitTest {
    @Test
    void dataOfTheModelGiveBackItsParameters() {
        // Least squares on data that follow the model exactly return the parameters that made
        // them (common practice), and r = (1 - p)(d - 1)/d (Magesan, Gambetta and Emerson 2011).
        int[] m = {1, 1, 5, 5, 20, 20, 60, 60, 120, 120};
        for (double[] truth : new double[][] {{0.7, 0.985, 0.25}, {0.5, 0.9, 0.5},
            {0.74, 0.999, 0.26}}) {
            double[] y = new double[m.length];
            for (int i = 0; i < m.length; i++) {
                y[i] = truth[0] * Math.pow(truth[1], m[i]) + truth[2];
            }
            DecayFit fit = DecayFit.of(m, y, 2);
            assertEquals(truth[0], fit.a(), 1e-8);
            assertEquals(truth[1], fit.p(), 1e-10);
            assertEquals(truth[2], fit.b(), 1e-8);
            assertEquals(0.75 * (1 - truth[1]), fit.errorPerClifford(), 1e-10);
            assertEquals(10, fit.points());
        }
    }

    @Test
    void theStandardErrorOfPMatchesItsSpreadOverNoisyData() {
        // The covariance s^2 (J^T J)^-1 estimates the spread of the fitted p over repeated
        // noisy data sets (Seber and Wild 2003, section 2.1): over 300 data sets with Gaussian
        // noise of sd 0.01, the mean reported error and the observed spread agree within 15 %.
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(6);
        int[] m = new int[60];
        for (int i = 0; i < m.length; i++) {
            m[i] = new int[] {1, 10, 30, 60, 100, 150}[i % 6];
        }
        int sets = 300;
        double sum = 0;
        double sumSq = 0;
        double reported = 0;
        for (int s = 0; s < sets; s++) {
            double[] y = new double[m.length];
            for (int i = 0; i < m.length; i++) {
                double g = Math.sqrt(-2 * Math.log(1 - rng.nextDouble()))
                        * Math.cos(2 * Math.PI * rng.nextDouble());
                y[i] = 0.72 * Math.pow(0.985, m[i]) + 0.25 + 0.01 * g;
            }
            DecayFit fit = DecayFit.of(m, y, 2);
            sum += fit.p();
            sumSq += fit.p() * fit.p();
            reported += fit.pError();
        }
        double mean = sum / sets;
        double spread = Math.sqrt((sumSq - sets * mean * mean) / (sets - 1));
        assertEquals(0.985, mean, 3 * spread / Math.sqrt(sets));
        assertEquals(spread, reported / sets, 0.15 * spread);
    }

    @Test
    void tooLittleDataIsRefused() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> DecayFit.of(new int[] {1, 2, 1, 2}, new double[] {1, 0.9, 1, 0.9}, 2));
        assertTrue(e.getMessage().contains("2 lengths"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> DecayFit.of(new int[] {1, 2, 3, 4}, new double[] {1, 0.9, Double.NaN, 1},
                        2));
        assertTrue(e.getMessage().contains("NaN"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> DecayFit.of(new int[] {1, 2, 3}, new double[] {1, 0.9}, 2));
        assertTrue(e.getMessage().contains("3 lengths but 2"), e.getMessage());
    }
}
