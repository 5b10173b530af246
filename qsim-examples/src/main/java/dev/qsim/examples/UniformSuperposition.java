package dev.qsim.examples;

import java.io.PrintStream;
import java.util.Arrays;
import java.util.Objects;

import org.apache.commons.statistics.inference.ChiSquareTest;
import org.apache.commons.statistics.inference.SignificanceResult;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;

/**
 * The main demo: a fairness check of a 32-sided quantum die.
 *
 * <p><b>Scenario (invented).</b> At the Saltmarsh Lane instrument lab, every morning begins with
 * the same check of the five-qubit "Fusee" test chip: put each qubit into an equal superposition,
 * read all five out a few thousand times, and ask whether the 32 outcomes turn up equally often.
 * A chip with a stuck or biased readout line fails the check.
 *
 * <p><b>Method.</b> A Hadamard gate on each of the {@value #QUBITS} qubits takes |00000&gt; to the
 * uniform superposition of all 32 basis states (the Walsh-Hadamard transform: M. A. Nielsen and
 * I. L. Chuang, <i>Quantum Computation and Quantum Information</i>, Cambridge University Press,
 * 2010, section 1.4.4), so each outcome has probability 1/32. The seeded tally is compared with
 * that distribution by Pearson's chi-square goodness-of-fit test (K. Pearson, 1900, Phil. Mag.
 * 50, 157-175), computed by Apache Commons Statistics {@link ChiSquareTest}.
 *
 * <p>Run with {@code java -jar qsim-examples.jar uniform [seed [shots]]}.
 */
public final class UniformSuperposition {

    /** Number of qubits on the invented test chip. */
    public static final int QUBITS = 5;

    /** Seed used when none is given. */
    public static final long DEFAULT_SEED = 20_240_611L;

    /** Shots used when none are given. */
    public static final int DEFAULT_SHOTS = 5_000;

    /** Significance level of the verdict: the tally is refused when the p-value is below it. */
    public static final double SIGNIFICANCE = 0.01;

    /** Usage line of this example's arguments. */
    static final String USAGE = "uniform [seed [shots]]";

    private UniformSuperposition() {
    }

    /**
     * Outcome of one fairness check.
     *
     * @param seed the simulator seed
     * @param shots the number of shots
     * @param counts count of each outcome, indexed by the outcome's value (length 32); copied
     * @param statistic the chi-square statistic against the uniform distribution
     * @param degreesOfFreedom degrees of freedom of the test (outcomes minus one)
     * @param pValue the p-value of the test
     */
    public record Result(long seed, int shots, long[] counts, double statistic,
            int degreesOfFreedom, double pValue) {

        /**
         * Checks and copies the arguments.
         *
         * @param seed the simulator seed
         * @param shots the number of shots
         * @param counts count of each outcome, indexed by value; copied
         * @param statistic the chi-square statistic
         * @param degreesOfFreedom degrees of freedom of the test
         * @param pValue the p-value of the test
         */
        public Result {
            counts = Objects.requireNonNull(counts, "counts").clone();
        }

        /**
         * Returns a copy of the outcome counts, indexed by outcome value.
         *
         * @return count of each of the 32 outcomes
         */
        @Override
        public long[] counts() {
            return counts.clone();
        }

        /**
         * Tells whether the tally is consistent with the uniform distribution at the
         * {@link #SIGNIFICANCE} level, that is whether the p-value is at least that level.
         *
         * @return {@code true} if the test does not reject uniformity
         */
        public boolean consistent() {
            return pValue >= SIGNIFICANCE;
        }
    }

    /**
     * Builds the check circuit: a Hadamard on every qubit, then every qubit measured into the
     * classical bit of the same number.
     *
     * @return the circuit on {@value #QUBITS} qubits and {@value #QUBITS} classical bits
     */
    public static Circuit circuit() {
        Circuit.Builder builder = Circuit.builder(QUBITS);
        for (int q = 0; q < QUBITS; q++) {
            builder.h(q);
        }
        return builder.measure().build();
    }

    /**
     * Runs the check, prints the histogram and the chi-square verdict to {@code out}, and
     * returns the numbers.
     *
     * @param out where the report goes
     * @param seed the simulator seed
     * @param shots number of shots, from 1 to 1,000,000
     * @return the counts and the test result
     * @throws IllegalArgumentException if {@code shots} is out of range
     */
    public static Result run(PrintStream out, long seed, int shots) {
        Objects.requireNonNull(out, "out");
        Args.requireShots(shots);
        Circuit circuit = circuit();
        Tally tally = Simulator.seeded(seed).run(circuit, shots);

        int outcomes = 1 << QUBITS;
        long[] counts = new long[outcomes];
        long max = 0;
        for (int v = 0; v < outcomes; v++) {
            counts[v] = tally.count(v);
            max = Math.max(max, counts[v]);
        }
        double[] expected = new double[outcomes];
        Arrays.fill(expected, (double) shots / outcomes);
        SignificanceResult test = ChiSquareTest.withDefaults().test(expected, counts);
        Result result = new Result(seed, shots, counts, test.getStatistic(), outcomes - 1,
                test.getPValue());

        Text.title(out, "Saltmarsh Lane instrument lab: morning fairness check of the Fusee chip");
        out.println(Text.f("H on each of %d qubits, then read all %d out; %s, seed %d.",
                QUBITS, QUBITS, Text.count(shots, "shot"), seed));
        out.println(Text.f("Ideal: each of the %d outcomes has probability 1/%d (%,.1f shots).",
                outcomes, outcomes, (double) shots / outcomes));

        Text.heading(out, "Tally");
        double ideal = (double) shots / outcomes;
        out.println(Text.f("%-7s  %8s  %9s  %s", "outcome", "count", "vs ideal", "bar"));
        for (int v = 0; v < outcomes; v++) {
            out.println(Text.f("%-7s  %8d  %+9.1f  %s", Text.bits(v, QUBITS), counts[v],
                    counts[v] - ideal, Text.bar(counts[v], max)));
        }

        Text.heading(out, "Chi-square goodness of fit against uniform 1/" + outcomes);
        out.println(Text.f("  %-20s %12.4f", "statistic", result.statistic()));
        out.println(Text.f("  %-20s %12d", "degrees of freedom", result.degreesOfFreedom()));
        out.println(Text.f("  %-20s %12.4f", "p-value", result.pValue()));
        out.println(Text.f("  %-20s %s", "verdict", result.consistent()
                ? "consistent with uniform at the 1% level"
                : "NOT consistent with uniform at the 1% level"));
        return result;
    }

    /**
     * Runs the check from the command line: {@code [seed [shots]]}, both optional.
     *
     * @param args optional seed and shot count
     */
    public static void main(String[] args) {
        Main.launch("uniform", args);
    }

    /** Reads {@code [seed [shots]]} and runs; used by {@link Main}. */
    static void fromArgs(String[] args, PrintStream out) {
        Args.requireAtMost(args, 2, USAGE);
        run(out, Args.seed(args, 0, DEFAULT_SEED), Args.shots(args, 1, DEFAULT_SHOTS));
    }
}
