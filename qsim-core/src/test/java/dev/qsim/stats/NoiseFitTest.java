package dev.qsim.stats;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.optim.InitialGuess;
import org.apache.commons.math3.optim.MaxEval;
import org.apache.commons.math3.optim.SimpleBounds;
import org.apache.commons.math3.optim.nonlinear.scalar.GoalType;
import org.apache.commons.math3.optim.nonlinear.scalar.ObjectiveFunction;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.BOBYQAOptimizer;
import org.apache.commons.math3.optim.univariate.BrentOptimizer;
import org.apache.commons.math3.optim.univariate.SearchInterval;
import org.apache.commons.math3.optim.univariate.UnivariateObjectiveFunction;
import org.apache.commons.math3.stat.inference.GTest;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;

/**
 * Maximum-likelihood noise fits checked against closed forms (the binomial likelihood of one
 * measured bit), reference libraries (Commons Math 3.6.1 for the chi-square quantile, root
 * finding, optimisation and the G statistic) and repeated simulation from known parameters.
 */
class NoiseFitTest {
    /** A three-qubit GHZ circuit: one one-qubit gate, two two-qubit gates. */
    private static final Circuit GHZ = Circuit.builder(3).h(0).cnot(0, 1).cnot(1, 2).measure()
            .build();

    /** The chi-square quantile at 95 % with one degree of freedom, from Commons Math 3.6.1. */
    private static final double Q95 = new org.apache.commons.math3.distribution
            .ChiSquaredDistribution(1).inverseCumulativeProbability(0.95);

    private static double[] distribution(NoiseFamily family, Circuit circuit, double... theta) {
        return Simulator.seeded(0).withThreads(1).withNoise(family.model(theta))
                .distribution(circuit);
    }

    private static Tally bits(long zeros, long ones) {
        return Tally.ofCounts(1, new long[] {0, 1}, new long[] {zeros, ones});
    }

    /** The binomial log-likelihood k log(e) + (n - k) log(1 - e), 0 log 0 = 0. */
    private static double binomial(long k, long n, double e) {
        return (k == 0 ? 0 : k * Math.log(e)) + (n == k ? 0 : (n - k) * Math.log1p(-e));
    }

    /**
     * The Fisher information matrix of {@code shots} multinomial draws from {@code p_θ}:
     * {@code n Σ_i (∂p_i/∂θ_a)(∂p_i/∂θ_b) / p_i} (a textbook identity: the score of one draw
     * is {@code ∂ log p_i}; e.g. Casella and Berger 2002, <i>Statistical Inference</i>, 2nd
     * ed., §7.3.2), with central differences of the exact distributions.
     */
    private static double[][] fisher(NoiseFamily family, Circuit circuit, double[] theta,
            long shots) {
        int k = theta.length;
        double[] p = distribution(family, circuit, theta);
        double[][] grad = new double[k][];
        for (int a = 0; a < k; a++) {
            double h = 1e-6;
            double[] up = theta.clone();
            double[] down = theta.clone();
            up[a] += h;
            down[a] -= h;
            double[] pu = distribution(family, circuit, up);
            double[] pd = distribution(family, circuit, down);
            grad[a] = new double[p.length];
            for (int i = 0; i < p.length; i++) {
                grad[a][i] = (pu[i] - pd[i]) / (2 * h);
            }
        }
        double[][] info = new double[k][k];
        for (int a = 0; a < k; a++) {
            for (int b = 0; b < k; b++) {
                for (int i = 0; i < p.length; i++) {
                    if (p[i] > 0) {
                        info[a][b] += shots * grad[a][i] * grad[b][i] / p[i];
                    }
                }
            }
        }
        return info;
    }

    /** Standard errors from the inverse Fisher information (one or two parameters). */
    private static double[] standardErrors(double[][] info) {
        if (info.length == 1) {
            return new double[] {1 / Math.sqrt(info[0][0])};
        }
        double det = info[0][0] * info[1][1] - info[0][1] * info[1][0];
        return new double[] {Math.sqrt(info[1][1] / det), Math.sqrt(info[0][0] / det)};
    }

    // ---- closed forms -------------------------------------------------------------------

    @Test
    void readoutErrorOfOneBitIsTheBinomialProportionWithItsWilksInterval() {
        // x then measure with readout error e = P(0|1): each shot reads 0 with probability e, so
        // k zeros in n shots have likelihood e^k (1-e)^(n-k), maximised at e = k/n (binomial
        // MLE; Casella and Berger 2002, Statistical Inference, 2nd ed., §7.2.2). The
        // likelihood-ratio interval {e : 2 (l(k/n) - l(e)) <= chi2_1(0.95)} (Wilks 1938) is
        // computed here directly with Commons Math's BrentSolver on the closed-form l.
        Circuit flip = Circuit.builder(1).x(0).measure().build();
        NoiseFit fit = NoiseFit.of(NoiseFamily.ofKinds(ErrorRates.none(),
                ErrorKind.READOUT_ZERO_GIVEN_ONE));
        long[][] cases = {{37, 400}, {3, 50}, {180, 1000}};
        for (long[] c : cases) {
            long k = c[0];
            long n = c[1];
            FittedNoise f = fit.fit(flip, bits(k, n - k));
            FittedParameter e = f.parameter("readout0given1");
            double mle = (double) k / n;
            assertEquals(mle, e.estimate(), 1e-8, "k = " + k + ", n = " + n);
            double top = binomial(k, n, mle);
            assertEquals(top, f.logLikelihood(), 1e-9);
            BrentSolver solver = new BrentSolver(1e-14, 1e-14);
            double low = solver.solve(1000, x -> 2 * (top - binomial(k, n, x)) - Q95, 1e-12, mle);
            double high = solver.solve(1000, x -> 2 * (top - binomial(k, n, x)) - Q95, mle, 0.5);
            assertEquals(low, e.low(), 1e-8, "lower end, k = " + k + ", n = " + n);
            assertEquals(high, e.high(), 1e-8, "upper end, k = " + k + ", n = " + n);
            assertFalse(e.lowAtRangeEnd() || e.highAtRangeEnd());
            // The ideal x always reads 1 (Nielsen and Chuang 2010, §1.3.1): the k zeros are
            // impossible for it, so its log-likelihood is -infinity and the test rejects it.
            assertEquals(Double.NEGATIVE_INFINITY, f.idealLogLikelihood());
            assertEquals(k, f.idealForbiddenShots());
            assertEquals(Double.POSITIVE_INFINITY, f.ratioStatistic());
            assertEquals(0, f.ratioPValue());
            assertTrue(f.report().contains("ideal -infinity (the ideal model gives probability 0"
                    + " to outcomes seen in " + k + " shot(s))"), f.report());
        }
    }

    @Test
    void noZerosGiveTheEstimateZeroAndTheClosedFormUpperEnd() {
        // k = 0: l(e) = n log(1 - e) is largest at e = 0, and 2 (l(0) - l(e)) = q at
        // e = 1 - exp(-q / (2n)) (closed form of the binomial likelihood at k = 0). The lower
        // end is the range's own.
        Circuit flip = Circuit.builder(1).x(0).measure().build();
        NoiseFit fit = NoiseFit.of(NoiseFamily.ofKinds(ErrorRates.none(),
                ErrorKind.READOUT_ZERO_GIVEN_ONE));
        FittedNoise f = fit.fit(flip, bits(0, 200));
        FittedParameter e = f.parameters().get(0);
        assertEquals(0, e.estimate(), 1e-9);
        assertEquals(0, e.low());
        assertTrue(e.lowAtRangeEnd() && !e.highAtRangeEnd());
        assertEquals(-Math.expm1(-Q95 / 400), e.high(), 1e-9);
        // The ideal model explains 200 ones perfectly (l = 0), as does e = 0 (closed form).
        assertEquals(0, f.idealLogLikelihood());
        assertEquals(0, f.ratioStatistic(), 1e-9);
        assertEquals(1, f.ratioPValue(), 1e-6);
    }

    @Test
    void theRatioAgainstTheIdealModelIsTheGStatisticOfTheBinomial() {
        // ry(a) then measure reads 1 with probability s = sin^2(a/2) (Nielsen and Chuang 2010,
        // §4.2); with readout error r = P(1|0) it reads 1 with probability s + r (1 - s). For k
        // ones in n shots above s the MLE is r = (k/n - s) / (1 - s), the fitted likelihood that
        // of the binomial at k/n, and 2 (l(fit) - l(ideal)) is the G statistic of the counts
        // against the ideal expectation (n (1 - s), n s), here from Commons Math 3.6.1's GTest,
        // with its p-value on 1 degree of freedom.
        double s = 0.3;
        Circuit tilt = Circuit.builder(1).ry(0, 2 * Math.asin(Math.sqrt(s))).measure().build();
        NoiseFit fit = NoiseFit.of(NoiseFamily.ofKinds(ErrorRates.none(),
                ErrorKind.READOUT_ONE_GIVEN_ZERO));
        long n = 500;
        long k = 175;
        FittedNoise f = fit.fit(tilt, bits(n - k, k));
        assertEquals((0.35 - s) / (1 - s), f.estimates()[0], 1e-8);
        assertEquals(binomial(k, n, 0.35), f.logLikelihood(), 1e-9);
        assertEquals(binomial(k, n, s), f.idealLogLikelihood(), 1e-9);
        assertEquals(0, f.idealForbiddenShots());
        double[] expected = {n * (1 - s), n * s};
        long[] observed = {n - k, k};
        GTest g = new GTest();
        assertEquals(g.g(expected, observed), f.ratioStatistic(), 1e-7);
        assertEquals(g.gTest(expected, observed), f.ratioPValue(), 1e-8);
        assertEquals(1, f.degreesOfFreedom());
    }

    @Test
    void aRateTheCircuitCannotSeeHasAFlatLikelihoodAndTheWholeRangeAsInterval() {
        // Depolarizing after h(0): the Bloch vector of |+> shrinks but stays on the x axis, so
        // P(0) = P(1) = 1/2 for every rate (Nielsen and Chuang 2010, §8.3.4). The likelihood is
        // flat: the interval is the whole range and the ideal model fits as well.
        Circuit plus = Circuit.builder(1).h(0).measure().build();
        FittedNoise f = NoiseFit.of(NoiseFamily.ofKinds(ErrorRates.none(),
                ErrorKind.ONE_QUBIT_DEPOLARIZING)).fit(plus, bits(520, 480));
        FittedParameter p = f.parameters().get(0);
        assertEquals(0, p.low());
        assertEquals(0.75, p.high());
        assertTrue(p.lowAtRangeEnd() && p.highAtRangeEnd());
        assertEquals(1000 * Math.log(0.5), f.logLikelihood(), 1e-9);
        assertEquals(0, f.ratioStatistic(), 1e-9);
        assertTrue(f.report().contains("(the whole range: the tally does not narrow it)"),
                f.report());
    }

    // ---- repeated simulation from known parameters -----------------------------------------

    /**
     * Fits {@code replicates} tallies drawn from the family at {@code truth} and returns, per
     * parameter: the intervals covering the truth, the mean and the standard deviation of the
     * estimates.
     */
    private static double[][] replicate(NoiseFamily family, double[] truth, int shots,
            int replicates, long seed) {
        double[] p = distribution(family, GHZ, truth);
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        NoiseFit fit = NoiseFit.of(family).withThreads(1);
        int k = truth.length;
        double[][] out = new double[3][k];
        double[] squares = new double[k];
        for (int r = 0; r < replicates; r++) {
            FittedNoise f = fit.fit(GHZ, Tally.sample(p, 3, shots, rng));
            for (int j = 0; j < k; j++) {
                FittedParameter q = f.parameters().get(j);
                out[0][j] += q.covers(truth[j]) ? 1 : 0;
                out[1][j] += q.estimate() / replicates;
                squares[j] += q.estimate() * q.estimate();
            }
        }
        for (int j = 0; j < k; j++) {
            out[2][j] = Math.sqrt((squares[j] - replicates * out[1][j] * out[1][j])
                    / (replicates - 1));
        }
        return out;
    }

    /**
     * Checks coverage, bias and spread of replicated fits. Coverage: if each interval covers the
     * truth with probability 0.95, the count of R = 200 covering intervals is Binomial(200, 0.95)
     * (mean 190, sd 3.1), below 180 with probability 0.0012 and above 198 with probability
     * 0.0004; for R = 100, below 90 with probability 0.012 and 100 with probability 0.006
     * (Commons Statistics BinomialDistribution). So [0.90, 0.99] fails an honest 95 % interval
     * rarely while catching a 90 % or 99 % one. Bias: the mean of R estimates lies within 3.5
     * standard errors sd/sqrt(R) of the truth, the standard error from the Fisher information
     * (asymptotic normality of the MLE, Casella and Berger 2002, §10.1.2). Spread: the sample sd
     * of the estimates is within [0.8, 1.25] of the Fisher standard error (the MLE attains the
     * Cramér-Rao bound asymptotically, same source; the sd of a sample sd is about
     * sd / sqrt(2 R), 5-7 % here).
     */
    private static void checkReplicates(double[][] r, double[] truth, double[] se,
            int replicates) {
        for (int j = 0; j < truth.length; j++) {
            double coverage = r[0][j] / replicates;
            assertTrue(coverage >= 0.90 && coverage <= 0.99, "coverage " + coverage
                    + " of parameter " + j);
            assertEquals(truth[j], r[1][j], 3.5 * se[j] / Math.sqrt(replicates),
                    "mean estimate of parameter " + j);
            double ratio = r[2][j] / se[j];
            assertTrue(ratio > 0.8 && ratio < 1.25, "sd / Fisher se " + ratio + " of parameter "
                    + j);
        }
    }

    @Test
    void theGlobalScaleIsEstimatedWithoutBiasAndItsIntervalCoversAtTheNominalRate() {
        NoiseFamily family = NoiseFamily.scaled(new ErrorRates(0.01, 0.04, 0.02, 0.03));
        double[] truth = {1.5};
        int shots = 2000;
        int replicates = 200;
        double[] se = standardErrors(fisher(family, GHZ, truth, shots));
        checkReplicates(replicate(family, truth, shots, replicates, 20241205L), truth, se,
                replicates);
    }

    @Test
    void depolarizingAndReadoutAreEstimatedWithoutBiasAndTheirIntervalsCover() {
        // On the GHZ circuit the two rates are told apart: readout flips each bit alone at the
        // same rate, while a Pauli error after cnot(0, 1) flips bit 0 against the other two
        // more often than bit 1 or 2 (its X part on qubit 1 spreads to qubit 2 through
        // cnot(1, 2): an X on a CNOT's control is copied to its target, from memory).
        NoiseFamily family = NoiseFamily.ofKinds(ErrorRates.none(),
                ErrorKind.TWO_QUBIT_DEPOLARIZING, ErrorKind.READOUT_SYMMETRIC);
        double[] truth = {0.06, 0.02};
        int shots = 4000;
        int replicates = 100;
        double[] se = standardErrors(fisher(family, GHZ, truth, shots));
        checkReplicates(replicate(family, truth, shots, replicates, 20241206L), truth, se,
                replicates);
    }

    @Test
    void aLargeTallyGivesEstimatesWithinAFewStandardErrors() {
        // 50,000 shots from known rates: each estimate within 3 Fisher standard errors of the
        // truth (asymptotic normality of the MLE, Casella and Berger 2002, §10.1.2).
        NoiseFamily family = NoiseFamily.ofKinds(ErrorRates.none(),
                ErrorKind.TWO_QUBIT_DEPOLARIZING, ErrorKind.READOUT_SYMMETRIC);
        double[] truth = {0.06, 0.02};
        int shots = 50_000;
        Tally t = Tally.sample(distribution(family, GHZ, truth), 3, shots,
                RandomSource.XO_RO_SHI_RO_128_PP.create(7L));
        FittedNoise f = NoiseFit.of(family).fit(GHZ, t);
        double[] se = standardErrors(fisher(family, GHZ, truth, shots));
        for (int j = 0; j < 2; j++) {
            assertEquals(truth[j], f.estimates()[j], 3 * se[j], "parameter " + j);
            // The interval's half-width is about 1.96 standard errors (common practice:
            // likelihood-ratio and Wald intervals agree for large samples).
            FittedParameter p = f.parameters().get(j);
            assertEquals(1.96 * se[j], (p.high() - p.low()) / 2, 0.15 * 1.96 * se[j]);
        }
    }

    // ---- the optimiser against reference libraries --------------------------------------

    @Test
    void theMaximumAndTheProfileEndsAgreeWithCommonsMath() {
        // The fitted point against Commons Math 3.6.1's BOBYQA (Powell 2009) on the same
        // log-likelihood and box; each interval end against a profile computed with Commons
        // Math's BrentOptimizer: the maximum over the other parameter there is l(fit) - q/2.
        NoiseFamily family = NoiseFamily.ofKinds(ErrorRates.none(),
                ErrorKind.TWO_QUBIT_DEPOLARIZING, ErrorKind.READOUT_SYMMETRIC);
        Tally t = Tally.sample(distribution(family, GHZ, 0.06, 0.02), 3, 4000,
                RandomSource.XO_RO_SHI_RO_128_PP.create(99L));
        NoiseFit fit = NoiseFit.of(family);
        FittedNoise f = fit.fit(GHZ, t);
        double[] reference = new BOBYQAOptimizer(5, 0.01, 1e-10).optimize(new MaxEval(5000),
                new ObjectiveFunction(x -> fit.logLikelihood(GHZ, t, x)), GoalType.MAXIMIZE,
                new InitialGuess(new double[] {0.1, 0.1}),
                new SimpleBounds(new double[] {0, 0}, new double[] {15 / 16.0, 0.5})).getPoint();
        assertArrayEquals(reference, f.estimates(), 2e-5);
        assertTrue(f.logLikelihood() >= fit.logLikelihood(GHZ, t, reference) - 1e-9);
        for (int index = 0; index < 2; index++) {
            int j = index;
            FittedParameter p = f.parameters().get(j);
            int other = 1 - j;
            assertFalse(p.lowAtRangeEnd() || p.highAtRangeEnd());
            for (double end : new double[] {p.low(), p.high()}) {
                double profile = new BrentOptimizer(1e-12, 1e-14).optimize(new MaxEval(1000),
                        new UnivariateObjectiveFunction(x -> {
                            double[] theta = new double[2];
                            theta[j] = end;
                            theta[other] = x;
                            return fit.logLikelihood(GHZ, t, theta);
                        }), GoalType.MAXIMIZE, new SearchInterval(0, family.upper(other)))
                        .getValue();
                assertEquals(f.logLikelihood() - Q95 / 2, profile, 1e-6,
                        "parameter " + j + " at " + end);
            }
        }
    }

    @Test
    void fourParametersAtOnceLeaveTheTruthInsideTheJointRegion() {
        // All four kinds at once on a circuit that separates them: the ry(1) makes one-qubit
        // depolarizing visible, the x(2) and the ry make 0s and 1s unequal so that the two
        // readout directions differ. The fitted point is at least as likely as the truth
        // (definition of the maximum), and the truth lies in the 99.9 % likelihood-ratio region
        // on 4 degrees of freedom, 2 (l(fit) - l(truth)) <= 18.47 (Wilks 1938; quantile from
        // Commons Math 3.6.1).
        NoiseFamily family = NoiseFamily.ofKinds(ErrorRates.none(),
                ErrorKind.ONE_QUBIT_DEPOLARIZING, ErrorKind.TWO_QUBIT_DEPOLARIZING,
                ErrorKind.READOUT_ONE_GIVEN_ZERO, ErrorKind.READOUT_ZERO_GIVEN_ONE);
        Circuit c = Circuit.builder(3).h(0).cnot(0, 1).cnot(1, 2).x(2).ry(1, 0.7).measure()
                .build();
        double[] truth = {0.02, 0.05, 0.01, 0.03};
        Tally t = Tally.sample(distribution(family, c, truth), 3, 20_000,
                RandomSource.XO_RO_SHI_RO_128_PP.create(3L));
        NoiseFit fit = NoiseFit.of(family);
        FittedNoise f = fit.fit(c, t);
        double atTruth = fit.logLikelihood(c, t, truth);
        assertTrue(f.logLikelihood() >= atTruth, f.logLikelihood() + " < " + atTruth);
        double q = new org.apache.commons.math3.distribution.ChiSquaredDistribution(4)
                .inverseCumulativeProbability(0.999);
        assertTrue(2 * (f.logLikelihood() - atTruth) <= q, f.report());
        assertEquals(4, f.degreesOfFreedom());
        assertEquals(9, f.report().split("\n").length, f.report());
    }

    // ---- behaviour --------------------------------------------------------------------------

    @Test
    void fitsDoNotDependOnTheThreadCount() {
        // The project's rule: results identical to the bit for any thread count.
        NoiseFamily family = NoiseFamily.scaled(new ErrorRates(0.01, 0.04, 0.02, 0.03));
        Tally t = Tally.sample(distribution(family, GHZ, 1.2), 3, 1000,
                RandomSource.XO_RO_SHI_RO_128_PP.create(5L));
        FittedNoise one = NoiseFit.of(family).withThreads(1).fit(GHZ, t);
        FittedNoise two = NoiseFit.of(family).withThreads(2).fit(GHZ, t);
        assertEquals(one.parameters(), two.parameters());
        assertEquals(one.logLikelihood(), two.logLikelihood());
        assertEquals(one.evaluations(), two.evaluations());
        assertEquals(one.report(), two.report());
    }

    @Test
    void aLowerConfidenceGivesANarrowerIntervalAndTheReportSaysSo() {
        // Wilks intervals are nested in the confidence level, since the chi-square quantile
        // grows with it (common practice).
        NoiseFamily family = NoiseFamily.scaled(new ErrorRates(0.01, 0.04, 0.02, 0.03));
        Tally t = Tally.sample(distribution(family, GHZ, 1.0), 3, 3000,
                RandomSource.XO_RO_SHI_RO_128_PP.create(8L));
        FittedNoise wide = NoiseFit.of(family).fit(GHZ, t);
        FittedNoise narrow = NoiseFit.of(family).withConfidence(0.9).fit(GHZ, t);
        FittedParameter w = wide.parameters().get(0);
        FittedParameter n = narrow.parameters().get(0);
        assertEquals(w.estimate(), n.estimate());
        assertTrue(w.low() < n.low() && n.high() < w.high());
        assertTrue(narrow.report().contains("90% interval"), narrow.report());
        assertTrue(wide.report().contains("95% interval"), wide.report());
        assertTrue(wide.report().startsWith("Fit of NoiseFamily[scale in [0, 16.6667] times"),
                wide.report());
        assertEquals(0.9, narrow.confidence());
        assertEquals(3000, wide.shots());
        assertTrue(wide.evaluations() > 10);
    }

    @Test
    void aTallyNoParametersCanProduceIsRefusedNamingTheOutcome() {
        // Depolarizing after h(0) then cnot(0, 1): whatever the rate, qubit 0 is a mixture of
        // |+> and I/2, and cnot copies its Z value to qubit 1, so only 00 and 11 occur
        // (Nielsen and Chuang 2010, §8.3.4). A tally with 01 is impossible.
        Circuit bell = Circuit.builder(2).h(0).cnot(0, 1).measure().build();
        Tally t = Tally.ofCounts(2, new long[] {0, 1, 3}, new long[] {10, 2, 8});
        NoiseFit fit = NoiseFit.of(NoiseFamily.ofKinds(ErrorRates.none(),
                ErrorKind.ONE_QUBIT_DEPOLARIZING));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> fit.fit(bell, t));
        assertTrue(e.getMessage().contains("outcome '01' (seen 2 time(s)) has probability 0"),
                e.getMessage());
        assertEquals(Double.NEGATIVE_INFINITY, fit.logLikelihood(bell, t, 0.1));
    }

    @Test
    void badCircuitsTalliesAndSettingsAreRefusedNamingTheValue() {
        NoiseFit fit = NoiseFit.of(NoiseFamily.scaled(new ErrorRates(0.01, 0.04, 0.02, 0.03)));
        Tally three = Tally.ofCounts(3, new long[] {0, 7}, new long[] {5, 5});
        Circuit bell = Circuit.builder(2).h(0).cnot(0, 1).measure().build();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> fit.fit(bell, three));
        assertTrue(e.getMessage().contains("width is 3")
                && e.getMessage().contains("2 classical bit(s)"), e.getMessage());

        Circuit.Builder wide = Circuit.builder(11);
        for (int q = 1; q < 11; q++) {
            wide.cnot(0, q);
        }
        Circuit eleven = wide.measure().build();
        e = assertThrows(IllegalArgumentException.class, () -> fit.fit(eleven,
                Tally.ofCounts(11, new long[] {0}, new long[] {1})));
        assertTrue(e.getMessage().contains("11 qubits") && e.getMessage().contains("at most 10"),
                e.getMessage());

        // A mid-circuit measurement and reset are fitted too: x, read, reset, read gives a
        // correct read of 1 then of 0, so the symmetric readout estimate is the binomial one,
        // wrong reads / reads (common practice: the maximum-likelihood estimate of a binomial
        // proportion). Wrong reads: 10 + 8 + 2 * 2 = 22 of 200.
        Circuit reuse = Circuit.builder(1, 2).x(0).measure(0, 0).reset(0).measure(0, 1).build();
        FittedNoise reads = NoiseFit.of(NoiseFamily.ofKinds(ErrorRates.none(),
                ErrorKind.READOUT_SYMMETRIC)).fit(reuse, Tally.ofCounts(2,
                new long[] {0b01, 0b00, 0b11, 0b10}, new long[] {80, 10, 8, 2}));
        assertEquals(22.0 / 200, reads.parameter("readout").estimate(), 1e-7);

        Circuit silent = Circuit.builder(1, 0).h(0).build();
        e = assertThrows(IllegalArgumentException.class, () -> fit.fit(silent,
                Tally.ofCounts(0, new long[] {0}, new long[] {3})));
        assertTrue(e.getMessage().contains("0 classical bits"), e.getMessage());

        e = assertThrows(IllegalArgumentException.class, () -> fit.withConfidence(1.5));
        assertTrue(e.getMessage().contains("1.5") && e.getMessage().contains("(0, 1)"),
                e.getMessage());
        assertEquals(NoiseFit.DEFAULT_CONFIDENCE, fit.confidence());
        e = assertThrows(IllegalArgumentException.class, () -> fit.withThreads(0));
        assertTrue(e.getMessage().contains("but was 0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> fit.logLikelihood(GHZ, three, 20.0));
        assertTrue(e.getMessage().contains("'scale'") && e.getMessage().contains("20.0"),
                e.getMessage());
        FittedNoise ok = fit.fit(GHZ, three);
        e = assertThrows(IllegalArgumentException.class, () -> ok.parameter("lambda"));
        assertTrue(e.getMessage().contains("'lambda'") && e.getMessage().contains("[scale]"),
                e.getMessage());
    }
}
