package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.HashMap;
import java.util.Map;
import java.util.SortedMap;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.apache.commons.statistics.inference.ChiSquareTest;
import org.junit.jupiter.api.Test;

/**
 * Sampled frequencies against the Born-rule probabilities, judged by Pearson's chi-square
 * goodness-of-fit test from Apache Commons Statistics 1.1 ({@link ChiSquareTest}), and the
 * shape of {@link Tally}. Significance level 0.001: with fixed seeds the outcome is
 * deterministic, and a correct sampler fails at that level for only 1 seed in 1000 (common
 * practice).
 */
class SamplingFitTest {

    /** Reject the fit below this p-value (common practice). */
    private static final double ALPHA = 0.001;

    private static UniformRandomProvider rng(long seed) {
        return RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
    }

    private static long[] counts(Tally t, int outcomes) {
        long[] c = new long[outcomes];
        for (int v = 0; v < outcomes; v++) {
            c[v] = t.count(v);
        }
        return c;
    }

    private static double pValue(double[] probabilities, long[] observed) {
        long shots = 0;
        for (long o : observed) {
            shots += o;
        }
        double[] expected = new double[probabilities.length];
        for (int i = 0; i < expected.length; i++) {
            expected[i] = probabilities[i] * shots;
        }
        return ChiSquareTest.withDefaults().test(expected, observed).getPValue();
    }

    private static Circuit.Builder uniform5() {
        Circuit.Builder b = Circuit.builder(5);
        for (int q = 0; q < 5; q++) {
            b.h(q);
        }
        return b;
    }

    @Test
    void uniformSuperpositionOfFiveQubits() {
        StateVector s = StateVector.zero(5).apply(uniform5().build());
        for (int i = 0; i < 32; i++) {
            // H on each of 5 qubits gives probability 1/32 = 0.03125 per outcome (common
            // practice); 1e-15 covers the rounding of (1/√2)^10.
            assertEquals(0.03125, s.probability(i), 1e-15, "P(" + i + ")");
        }
        final long seed = 20_240_611L;
        Tally t = Simulator.seeded(seed).run(uniform5().measure().build(), 5000);
        assertEquals(5000, t.shots());
        assertEquals(5, t.width());
        double[] p = new double[32];
        Arrays.fill(p, 0.03125);
        // Chi-square goodness of fit, Commons Statistics ChiSquareTest.
        double pv = pValue(p, counts(t, 32));
        assertTrue(pv > ALPHA,
                "seed " + seed + ": chi-square p-value " + pv + " for " + t.outcomes());
    }

    @Test
    void biasedQubitCountIsWithinFourSigmaOfTheBinomialMean() {
        final long seed = 8_675_309L;
        double theta = 1.2;
        int shots = 10_000;
        Tally t = Simulator.seeded(seed).run(Circuit.builder(1).ry(0, theta).measure().build(),
                shots);
        // ry(θ)|0> = cos(θ/2)|0> + sin(θ/2)|1> (N&C 2010 eq. 4.5), so P(1) = sin²(θ/2).
        double p = Math.pow(Math.sin(theta / 2), 2);
        double mean = shots * p;
        double sigma = Math.sqrt(shots * p * (1 - p)); // binomial (common practice)
        long ones = t.count("1");
        assertEquals(shots, ones + t.count("0"), "every shot is 0 or 1");
        assertTrue(Math.abs(ones - mean) <= 4 * sigma, "seed " + seed + ": " + ones
                + " ones, mean " + mean + " ± 4 × " + sigma);
        assertEquals((double) ones / shots, t.probability("1"), 1e-15, "Tally.probability");
    }

    /** Marginal of a state over the qubits, summed directly from the amplitudes. */
    private static double[] referenceMarginal(StateVector s, int[] qubits) {
        double[] m = new double[1 << qubits.length];
        for (long i = 0; i < s.dimension(); i++) {
            int v = 0;
            for (int j = 0; j < qubits.length; j++) {
                v |= (int) ((i >> qubits[j]) & 1) << j; // qubits[j] is bit j (DESIGN.md)
            }
            Complex a = s.amplitude(i);
            m[v] += a.getReal() * a.getReal() + a.getImaginary() * a.getImaginary(); // Born rule
        }
        return m;
    }

    @Test
    void sampleOnSubsetMatchesMarginal() {
        final long seed = 5_551_212L;
        UniformRandomProvider rng = rng(seed);
        StateVector s = DenseReference.toState(DenseReference.randomState(64, rng));
        double[][] before = DenseReference.amplitudes(s);
        int[][] subsets = {{4, 1}, {0}, {5, 2, 3}, {}};
        for (int[] qubits : subsets) {
            int[] effective = qubits.length == 0 ? new int[] {0, 1, 2, 3, 4, 5} : qubits;
            double[] expected = referenceMarginal(s, effective);
            double[] marginal = s.marginal(effective);
            for (int v = 0; v < expected.length; v++) {
                assertEquals(expected[v], marginal[v], 1e-12, "marginal "
                        + Arrays.toString(effective) + " at " + v);
            }
            Tally t = s.sample(20_000, rng, qubits);
            assertEquals(effective.length, t.width(), "width of sample over "
                    + Arrays.toString(qubits));
            double pv = pValue(expected, counts(t, expected.length));
            assertTrue(pv > ALPHA, "seed " + seed + ", qubits "
                    + Arrays.toString(qubits) + ": chi-square p-value " + pv);
        }
        // Sampling leaves the state untouched (DESIGN.md).
        DenseReference.assertClose(before, s, 0, () -> "state after sampling");
    }

    @Test
    void sameSeedGivesTheSameTally() {
        Circuit c = Circuit.builder(4).h(0).ry(1, 0.4).cnot(0, 2).rx(3, 2.0).measure().build();
        Tally a = Simulator.seeded(99).run(c, 1000);
        Tally b = Simulator.seeded(99).run(c, 1000);
        assertEquals(a.outcomes(), b.outcomes(), "same seed, same counts (DESIGN.md)");
        assertEquals(a.toCsv(), b.toCsv());
        StateVector s = StateVector.zero(4).apply(Circuit.builder(4).h(0).ry(1, 0.4).cnot(0, 2)
                .rx(3, 2.0).build());
        assertEquals(s.sample(500, rng(7)).outcomes(), s.sample(500, rng(7)).outcomes(),
                "same generator seed, same sample");
    }

    @Test
    void outcomeKeysHaveTheClbitWidthAndBitOrder() {
        // 3 qubits, 5 clbits. qubit 0 -> clbit 4, qubit 1 -> clbit 0, qubit 2 -> clbit 2.
        Circuit c = Circuit.builder(3, 5).h(0).h(1).cnot(1, 2)
                .measure(0, 4).measure(1, 0).measure(2, 2).build();
        Tally t = Simulator.seeded(3).run(c, 400);
        assertEquals(5, t.width());
        SortedMap<String, Long> outcomes = t.outcomes();
        long total = 0;
        for (Map.Entry<String, Long> e : outcomes.entrySet()) {
            String bits = e.getKey();
            assertEquals(5, bits.length(), "key " + bits + " has the clbit count as width");
            // Clbit c is character width−1−c (highest bit leftmost, DESIGN.md).
            assertEquals('0', bits.charAt(5 - 1 - 1), "clbit 1 is never written: " + bits);
            assertEquals('0', bits.charAt(5 - 1 - 3), "clbit 3 is never written: " + bits);
            // CNOT copies qubit 1 into qubit 2 (N&C 2010 sec. 1.3.6), so clbits 0 and 2 agree.
            assertEquals(bits.charAt(5 - 1 - 0), bits.charAt(5 - 1 - 2), "clbits 0, 2: " + bits);
            assertEquals(e.getValue().longValue(), t.count(Long.parseLong(bits, 2)),
                    "count(String) and count(long) agree for " + bits);
            total += e.getValue();
        }
        assertEquals(400, total);
        // The four outcomes of two fair independent bits (qubits 0 and 1) all appear in 400 shots;
        // each is missed with probability (3/4)^400 (common practice).
        assertEquals(4, outcomes.size(), "outcomes " + outcomes);
    }

    @Test
    void csvHasHeaderAndOneRowPerOutcome() {
        Tally t = Simulator.seeded(12).run(uniform5().measure().build(), 300);
        String[] lines = t.toCsv().split("\\R");
        assertEquals("bits,count", lines[0], "CSV header (DESIGN.md)");
        assertEquals(t.outcomes().size() + 1, lines.length, "one row per outcome");
        Map<String, Long> rows = new HashMap<>();
        for (int i = 1; i < lines.length; i++) {
            String[] cells = lines[i].split(",", -1);
            assertEquals(2, cells.length, "row " + lines[i]);
            rows.put(cells[0], Long.parseLong(cells[1]));
        }
        assertEquals(t.outcomes(), rows, "rows equal outcomes()");
    }
}
