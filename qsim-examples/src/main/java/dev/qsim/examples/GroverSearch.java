package dev.qsim.examples;

import java.io.PrintStream;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;

import dev.qsim.Circuit;
import dev.qsim.Gates;
import dev.qsim.Simulator;
import dev.qsim.StateVector;
import dev.qsim.Tally;

/**
 * Amplitude amplification: finding a locker combination with a yes/no checker.
 *
 * <p><b>Scenario (invented).</b> Locker 17 at the Bramblecote lido has a dial of five two-way
 * switches, 32 settings in all. The attendant's checker box only answers "right" or "wrong" for a
 * setting. Tried one by one, the right setting takes about 16 tries on average; with the box
 * wired as a quantum phase oracle, four rounds of amplification make the right setting come up
 * almost every time it is read.
 *
 * <p><b>Method.</b> Grover's search (L. K. Grover, "A fast quantum mechanical algorithm for
 * database search", Proceedings of the 28th Annual ACM Symposium on the Theory of Computing,
 * 212-219, 1996; M. A. Nielsen and I. L. Chuang, <i>Quantum Computation and Quantum
 * Information</i>, Cambridge University Press, 2010, section 6.1). Start in the uniform
 * superposition, then repeat: the oracle flips the sign of each marked setting (X on its zero
 * bits, a multi-controlled Z, X again), and the diffusion step H, X, multi-controlled Z, X, H
 * reflects about the mean. With M marked among N = 2^n and sin(theta) = sqrt(M/N), after k rounds
 * the marked settings are read with probability sin^2((2k+1) theta), highest near
 * k = floor(pi/4 sqrt(N/M)) (M. Boyer, G. Brassard, P. H&oslash;yer and A. Tapp, "Tight bounds on
 * quantum searching", Fortschritte der Physik 46, 493-505, 1998). The example prints the
 * simulated probability next to that formula for each k, then a seeded tally at the best k.
 *
 * <p>Run with {@code java -jar qsim-examples.jar grover [seed [shots]]}.
 */
public final class GroverSearch {

    /** Number of switches (qubits) on the invented locker dial. */
    public static final int DEFAULT_QUBITS = 5;

    /** The invented right setting, 10110 (switches 1, 2 and 4 up). */
    public static final int DEFAULT_MARKED = 0b10110;

    /** Seed used when none is given. */
    public static final long DEFAULT_SEED = 31_337L;

    /** Shots used when none are given. */
    public static final int DEFAULT_SHOTS = 2_000;

    /** Largest number of qubits accepted, so the example stays quick. */
    public static final int MAX_QUBITS = 12;

    /** Outcomes listed in the printed tally before the rest are summed up. */
    static final int TALLY_ROWS = 6;

    private GroverSearch() {
    }

    /**
     * What the search found.
     *
     * @param qubits number of qubits n
     * @param marked the marked settings; copied
     * @param iterations the number of rounds used for the tally, floor(pi/4 sqrt(N/M))
     * @param success simulated probability of reading a marked setting after k rounds, index k;
     *     copied
     * @param tally seeded tally after {@code iterations} rounds
     */
    public record Result(int qubits, int[] marked, int iterations, double[] success,
            Tally tally) {

        /**
         * Checks and copies the arguments.
         *
         * @param qubits number of qubits
         * @param marked the marked settings; copied
         * @param iterations the number of rounds used for the tally
         * @param success simulated success probability per round count; copied
         * @param tally seeded tally after {@code iterations} rounds
         */
        public Result {
            marked = Objects.requireNonNull(marked, "marked").clone();
            success = Objects.requireNonNull(success, "success").clone();
            Objects.requireNonNull(tally, "tally");
        }

        /**
         * Returns a copy of the marked settings.
         *
         * @return the marked settings
         */
        @Override
        public int[] marked() {
            return marked.clone();
        }

        /**
         * Returns a copy of the simulated success probabilities, indexed by round count.
         *
         * @return success probability after 0, 1, 2, ... rounds
         */
        @Override
        public double[] success() {
            return success.clone();
        }

        /**
         * Returns how many shots of the tally read a marked setting.
         *
         * @return count of marked outcomes
         */
        public long hits() {
            long hits = 0;
            for (int m : marked) {
                hits += tally.count(m);
            }
            return hits;
        }
    }

    /**
     * Returns the number of rounds that maximises the success probability to within one round,
     * {@code floor(pi/4 * sqrt(N/M))} (Boyer, Brassard, Hoyer and Tapp 1998).
     *
     * @param qubits number of qubits n, from 2 to {@value #MAX_QUBITS}
     * @param markedCount number of marked settings M, from 1 to 2^n - 1
     * @return the number of rounds
     * @throws IllegalArgumentException if an argument is out of range
     */
    public static int optimalIterations(int qubits, int markedCount) {
        requireQubits(qubits);
        long size = 1L << qubits;
        if (markedCount < 1 || markedCount >= size) {
            throw new IllegalArgumentException("marked count must be from 1 to " + (size - 1)
                    + " for " + qubits + " qubits, got " + markedCount);
        }
        return (int) Math.floor(Math.PI / 4 * Math.sqrt((double) size / markedCount));
    }

    /**
     * Builds the phase oracle: it multiplies each marked basis state by -1 and leaves the others
     * alone. Each marked setting costs X on its zero bits, a Z on the top qubit controlled by all
     * the others, and the same X again.
     *
     * @param qubits number of qubits n, from 2 to {@value #MAX_QUBITS}
     * @param marked distinct settings in [0, 2^n), at least one and fewer than 2^n
     * @return the oracle circuit
     * @throws IllegalArgumentException if an argument is out of range or repeated
     */
    public static Circuit oracle(int qubits, int... marked) {
        requireMarked(qubits, marked);
        Circuit.Builder builder = Circuit.builder(qubits);
        int[] controls = lowQubits(qubits);
        for (int m : marked) {
            flipZeroBits(builder, qubits, m);
            builder.controlled(Gates.Z, controls, qubits - 1);
            flipZeroBits(builder, qubits, m);
        }
        return builder.build();
    }

    /**
     * Builds the diffusion step H, X, multi-controlled Z, X, H on every qubit: the reflection
     * about the uniform superposition, times the global phase -1.
     *
     * @param qubits number of qubits n, from 2 to {@value #MAX_QUBITS}
     * @return the diffusion circuit
     * @throws IllegalArgumentException if {@code qubits} is out of range
     */
    public static Circuit diffusion(int qubits) {
        requireQubits(qubits);
        Circuit.Builder builder = Circuit.builder(qubits);
        for (int q = 0; q < qubits; q++) {
            builder.h(q).x(q);
        }
        builder.controlled(Gates.Z, lowQubits(qubits), qubits - 1);
        for (int q = 0; q < qubits; q++) {
            builder.x(q).h(q);
        }
        return builder.build();
    }

    /**
     * Builds the search without measurement: H on every qubit, then {@code iterations} rounds of
     * oracle and diffusion.
     *
     * @param qubits number of qubits n, from 2 to {@value #MAX_QUBITS}
     * @param iterations number of rounds, from 0 to 1000
     * @param marked distinct settings in [0, 2^n), at least one and fewer than 2^n
     * @return the search circuit
     * @throws IllegalArgumentException if an argument is out of range or repeated
     */
    public static Circuit search(int qubits, int iterations, int... marked) {
        Circuit oracle = oracle(qubits, marked);
        if (iterations < 0 || iterations > 1000) {
            throw new IllegalArgumentException("iterations must be from 0 to 1000, got "
                    + iterations);
        }
        Circuit diffusion = diffusion(qubits);
        Circuit.Builder builder = Circuit.builder(qubits);
        for (int q = 0; q < qubits; q++) {
            builder.h(q);
        }
        for (int k = 0; k < iterations; k++) {
            builder.append(oracle).append(diffusion);
        }
        return builder.build();
    }

    /**
     * Runs the search for 0 up to {@code 2 * optimal + 1} rounds, prints the simulated success
     * probability beside the formula of Boyer et al., then a seeded tally at the optimal count.
     *
     * @param out where the report goes
     * @param qubits number of qubits n, from 2 to {@value #MAX_QUBITS}
     * @param marked distinct settings in [0, 2^n), at least one and fewer than 2^n
     * @param seed the simulator seed of the tally
     * @param shots number of shots of the tally, from 1 to 1,000,000
     * @return the probabilities and the tally
     * @throws IllegalArgumentException if an argument is out of range or repeated
     */
    public static Result run(PrintStream out, int qubits, int[] marked, long seed, int shots) {
        Objects.requireNonNull(out, "out");
        requireMarked(qubits, marked);
        Args.requireShots(shots);
        long size = 1L << qubits;
        int best = optimalIterations(qubits, marked.length);
        double theta = Math.asin(Math.sqrt((double) marked.length / size));

        double[] success = new double[2 * best + 2];
        for (int k = 0; k < success.length; k++) {
            StateVector state = StateVector.zero(qubits).apply(search(qubits, k, marked));
            double p = 0;
            for (int m : marked) {
                p += state.probability(m);
            }
            success[k] = p;
        }
        Circuit measured = Circuit.builder(qubits).append(search(qubits, best, marked))
                .measure().build();
        Tally tally = Simulator.seeded(seed).run(measured, shots);
        Result result = new Result(qubits, marked, best, success, tally);

        Text.title(out, "Bramblecote lido: finding the combination of locker 17");
        List<String> names = new ArrayList<>();
        for (int m : marked) {
            names.add(Text.bits(m, qubits));
        }
        out.println(Text.f("%d switches, N = %d settings, M = %d right (%s).", qubits, size,
                marked.length, String.join(", ", names)));
        out.println(Text.f("sin(theta) = sqrt(M/N): theta = %.6f rad; best round count "
                + "floor(pi/4 sqrt(N/M)) = %d.", theta, best));

        Text.heading(out, "Success probability after k rounds");
        out.println(Text.f("%3s  %12s  %20s  %10s  %s", "k", "simulated", "sin^2((2k+1)theta)",
                "difference", "bar"));
        for (int k = 0; k < success.length; k++) {
            double formula = Math.pow(Math.sin((2 * k + 1) * theta), 2);
            out.println(Text.f("%3d  %12.6f  %20.6f  %10.1e  %-" + Text.BAR_WIDTH + "s%s", k,
                    success[k], formula, success[k] - formula, Text.bar(success[k], 1.0),
                    k == best ? "  <- best" : "").stripTrailing());
        }

        Text.heading(out, Text.f("Tally after %s: %s, seed %d", Text.count(best, "round"),
                Text.count(shots, "shot"), seed));
        List<Map.Entry<String, Long>> rows = new ArrayList<>(tally.outcomes().entrySet());
        rows.sort((a, b) -> Long.compare(b.getValue(), a.getValue()));
        long max = rows.isEmpty() ? 0 : rows.get(0).getValue();
        int width = Math.max("setting".length(), qubits);
        out.println(Text.f("%-" + width + "s  %8s  %s", "setting", "count", "bar"));
        long rest = 0;
        for (int i = 0; i < rows.size(); i++) {
            Map.Entry<String, Long> e = rows.get(i);
            if (i < TALLY_ROWS) {
                boolean right = names.contains(e.getKey());
                out.println(Text.f("%-" + width + "s  %8d  %-" + Text.BAR_WIDTH + "s%s",
                        e.getKey(), e.getValue(), Text.bar(e.getValue(), max),
                        right ? "  <- right" : "").stripTrailing());
            } else {
                rest += e.getValue();
            }
        }
        if (rows.size() > TALLY_ROWS) {
            out.println(Text.f("(%s: %s in all)", Text.count(rows.size() - TALLY_ROWS,
                    "other setting"), Text.count(rest, "shot")));
        }
        out.println();
        out.println(Text.f("Right setting read in %,d of %s (%.2f%%); predicted %.2f%%.",
                result.hits(), Text.count(shots, "shot"), 100.0 * result.hits() / shots,
                100 * success[best]));
        return result;
    }

    private static void flipZeroBits(Circuit.Builder builder, int qubits, int setting) {
        for (int q = 0; q < qubits; q++) {
            if ((setting >>> q & 1) == 0) {
                builder.x(q);
            }
        }
    }

    private static int[] lowQubits(int qubits) {
        int[] controls = new int[qubits - 1];
        for (int q = 0; q < controls.length; q++) {
            controls[q] = q;
        }
        return controls;
    }

    private static void requireQubits(int qubits) {
        if (qubits < 2 || qubits > MAX_QUBITS) {
            throw new IllegalArgumentException("qubits must be from 2 to " + MAX_QUBITS
                    + ", got " + qubits);
        }
    }

    private static void requireMarked(int qubits, int[] marked) {
        requireQubits(qubits);
        Objects.requireNonNull(marked, "marked");
        long size = 1L << qubits;
        if (marked.length < 1 || marked.length >= size) {
            throw new IllegalArgumentException("marked settings must number from 1 to "
                    + (size - 1) + " for " + qubits + " qubits, got " + marked.length);
        }
        boolean[] seen = new boolean[(int) size];
        for (int m : marked) {
            if (m < 0 || m >= size) {
                throw new IllegalArgumentException("marked setting " + m + " is out of range [0, "
                        + (size - 1) + "] for " + qubits + " qubits");
            }
            if (seen[m]) {
                throw new IllegalArgumentException("marked setting " + m + " is given twice");
            }
            seen[m] = true;
        }
    }

    /**
     * Runs the example from the command line: {@code [seed [shots]]}, both optional.
     *
     * @param args optional seed and shot count
     */
    public static void main(String[] args) {
        Main.launch("grover", args);
    }

    /** Reads {@code [seed [shots]]} and runs; used by {@link Main}. */
    static void fromArgs(String[] args, PrintStream out) {
        Args.requireAtMost(args, 2, "grover [seed [shots]]");
        run(out, DEFAULT_QUBITS, new int[] {DEFAULT_MARKED}, Args.seed(args, 0, DEFAULT_SEED),
                Args.shots(args, 1, DEFAULT_SHOTS));
    }
}
