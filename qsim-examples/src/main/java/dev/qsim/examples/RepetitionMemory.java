package dev.qsim.examples;

import java.io.PrintStream;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.SplittableRandom;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;

/**
 * A repetition-code memory experiment on 801 qubits, run on the stabilizer engine.
 *
 * <p><b>Scenario (invented).</b> The Hollybank lab's "Mainspring" chip is a single line of 801
 * qubits: 401 data qubits (even positions) with a check qubit between each neighbouring pair
 * (odd positions). The lab stores one logical qubit in the data line for ten rounds of checks
 * and wants to see where its checks fire when a few bit flips are planted on purpose.
 *
 * <p><b>Method.</b> The data qubits hold the distance-401 bit-flip repetition code (M. A.
 * Nielsen and I. L. Chuang, <i>Quantum Computation and Quantum Information</i>, Cambridge
 * University Press, 2010, section 10.1.1, there with three qubits), prepared in the logical
 * |+&gt; state (a GHZ state, so the final readout is random per shot). Each round resets every
 * check qubit, copies the parity of its two data neighbours into it with two CNOTs and measures
 * it. Before each round, each data qubit gets an X with a small probability, chosen once from
 * the seed (the same planted flips in every shot). A check "detects" in a round when its
 * outcome differs from its outcome in the round before (0 before the first). A planted flip on
 * data qubit j in round r makes checks j-1 and j (those that exist) detect in round r, and the
 * final data readout, with the planted flips undone, reads all zeros or all ones.
 *
 * <p>Run with {@code java -cp qsim-examples.jar dev.qsim.examples.RepetitionMemory [seed
 * [shots]]}.
 */
public final class RepetitionMemory {

    /** Data qubits on the invented chip. */
    public static final int DATA = 401;

    /** Check qubits, one between each neighbouring pair of data qubits. */
    public static final int CHECKS = DATA - 1;

    /** All qubits of the line. */
    public static final int QUBITS = DATA + CHECKS;

    /** Rounds of checks. */
    public static final int ROUNDS = 10;

    /** Chance of a planted X on each data qubit before each round. */
    public static final double FLIP_RATE = 0.002;

    /** Seed used when none is given. */
    public static final long DEFAULT_SEED = 4_011L;

    /** Shots used when none are given. */
    public static final int DEFAULT_SHOTS = 200;

    private RepetitionMemory() {
    }

    /**
     * A planted bit flip.
     *
     * @param round the round before whose checks it happens, from 0
     * @param data the data qubit's index along the line of data qubits, from 0
     */
    public record Flip(int round, int data) {
    }

    /**
     * What one run found.
     *
     * @param flips the planted flips
     * @param detections {@code detections[r][i]}: shots in which check i detected in round r
     * @param decodedZeros shots whose data readout, planted flips undone, reads all zeros
     * @param decodedOnes shots whose data readout, planted flips undone, reads all ones
     * @param tally the tally of all check and data outcomes
     */
    public record Report(List<Flip> flips, long[][] detections, long decodedZeros,
            long decodedOnes, Tally tally) {

        /**
         * Checks and copies the arguments.
         *
         * @param flips the planted flips
         * @param detections shots with a detection per round and check
         * @param decodedZeros shots decoded to all zeros
         * @param decodedOnes shots decoded to all ones
         * @param tally the tally
         */
        public Report {
            flips = List.copyOf(flips);
            detections = copy(detections);
            Objects.requireNonNull(tally, "tally");
        }

        /**
         * Returns a copy of the detection counts.
         *
         * @return {@code [round][check]} shots with a detection
         */
        @Override
        public long[][] detections() {
            return copy(detections);
        }

        private static long[][] copy(long[][] a) {
            long[][] c = new long[a.length][];
            for (int i = 0; i < a.length; i++) {
                c[i] = a[i].clone();
            }
            return c;
        }
    }

    /** Qubit of data qubit j on the line. */
    static int dataQubit(int j) {
        return 2 * j;
    }

    /** Qubit of check i (between data i and i + 1). */
    static int checkQubit(int i) {
        return 2 * i + 1;
    }

    /** Clbit of check i in round r. */
    static int checkClbit(int r, int i) {
        return r * CHECKS + i;
    }

    /** Clbit of the final readout of data qubit j. */
    static int dataClbit(int j) {
        return ROUNDS * CHECKS + j;
    }

    /**
     * Draws the planted flips from the seed: each data qubit before each round with chance
     * {@link #FLIP_RATE}.
     *
     * @param seed the seed
     * @return the flips, by round then data qubit
     */
    public static List<Flip> plantedFlips(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        List<Flip> flips = new ArrayList<>();
        for (int r = 0; r < ROUNDS; r++) {
            for (int j = 0; j < DATA; j++) {
                if (rnd.nextDouble() < FLIP_RATE) {
                    flips.add(new Flip(r, j));
                }
            }
        }
        return flips;
    }

    /**
     * Builds the experiment: logical |+&gt;, then per round the planted flips and one round of
     * checks, then the readout of every data qubit.
     *
     * @param flips the flips to plant
     * @return the circuit on {@link #QUBITS} qubits and {@code ROUNDS * CHECKS + DATA} clbits
     */
    public static Circuit circuit(List<Flip> flips) {
        Circuit.Builder b = Circuit.builder(QUBITS, ROUNDS * CHECKS + DATA);
        b.h(dataQubit(0));
        for (int j = 1; j < DATA; j++) {
            b.cnot(dataQubit(j - 1), dataQubit(j));
        }
        for (int r = 0; r < ROUNDS; r++) {
            for (Flip f : flips) {
                if (f.round() == r) {
                    b.x(dataQubit(f.data()));
                }
            }
            for (int i = 0; i < CHECKS; i++) {
                int c = checkQubit(i);
                b.reset(c).cnot(dataQubit(i), c).cnot(dataQubit(i + 1), c).measure(c,
                        checkClbit(r, i));
            }
        }
        for (int j = 0; j < DATA; j++) {
            b.measure(dataQubit(j), dataClbit(j));
        }
        return b.build();
    }

    /**
     * Runs the experiment on the stabilizer engine, prints the syndrome statistics and returns
     * them.
     *
     * @param out where the report goes
     * @param seed seed of the planted flips and of the shots
     * @param shots number of shots, from 1 to 1,000,000
     * @return what the run found
     * @throws IllegalArgumentException if {@code shots} is out of range
     */
    public static Report run(PrintStream out, long seed, int shots) {
        Objects.requireNonNull(out, "out");
        Args.requireShots(shots);
        List<Flip> flips = plantedFlips(seed);
        Circuit circuit = circuit(flips);
        long start = System.nanoTime();
        Tally tally = Simulator.seeded(seed).withEngine(Simulator.Engine.TABLEAU)
                .run(circuit, shots);
        double seconds = (System.nanoTime() - start) * 1e-9;

        int[] undo = new int[DATA];
        for (Flip f : flips) {
            undo[f.data()] ^= 1;
        }
        long[][] detections = new long[ROUNDS][CHECKS];
        long zeros = 0;
        long ones = 0;
        int width = tally.width();
        for (Map.Entry<String, Long> e : tally.outcomes().entrySet()) {
            String bits = e.getKey();
            long count = e.getValue();
            for (int i = 0; i < CHECKS; i++) {
                char before = '0';
                for (int r = 0; r < ROUNDS; r++) {
                    char now = bits.charAt(width - 1 - checkClbit(r, i));
                    if (now != before) {
                        detections[r][i] += count;
                    }
                    before = now;
                }
            }
            int sum = 0;
            for (int j = 0; j < DATA; j++) {
                sum += (bits.charAt(width - 1 - dataClbit(j)) - '0') ^ undo[j];
            }
            zeros += sum == 0 ? count : 0;
            ones += sum == DATA ? count : 0;
        }
        Report report = new Report(flips, detections, zeros, ones, tally);
        print(out, report, seed, shots, seconds);
        return report;
    }

    private static void print(PrintStream out, Report report, long seed, int shots,
            double seconds) {
        Text.title(out, "Mainspring chip: repetition-code memory on " + QUBITS + " qubits");
        out.println(Text.f("%d data qubits, %d check qubits, %d rounds, %s, seed %d;"
                + " stabilizer engine, %.2f s.", DATA, CHECKS, ROUNDS, Text.count(shots, "shot"),
                seed, seconds));

        Text.heading(out, "Planted bit flips (round, data qubit)");
        StringBuilder list = new StringBuilder();
        for (Flip f : report.flips()) {
            list.append(list.length() == 0 ? "" : ", ").append('(').append(f.round())
                    .append(", ").append(f.data()).append(')');
        }
        out.println(report.flips().isEmpty() ? "none" : list);

        long[][] det = report.detections();
        Text.heading(out, "Detections per round (shots x checks that fired)");
        long total = 0;
        long most = 1;
        long[] perRound = new long[ROUNDS];
        for (int r = 0; r < ROUNDS; r++) {
            for (int i = 0; i < CHECKS; i++) {
                perRound[r] += det[r][i];
            }
            total += perRound[r];
            most = Math.max(most, perRound[r]);
        }
        for (int r = 0; r < ROUNDS; r++) {
            out.println(Text.f("round %2d  %8.3f per shot  %s", r, perRound[r] / (double) shots,
                    Text.bar(perRound[r], most)));
        }

        Text.heading(out, "Checks that fired (fraction of rounds with a detection)");
        int quiet = 0;
        for (int i = 0; i < CHECKS; i++) {
            long fired = 0;
            for (int r = 0; r < ROUNDS; r++) {
                fired += det[r][i];
            }
            if (fired == 0) {
                quiet++;
            } else {
                out.println(Text.f("check %3d (qubit %3d)  %.3f", i, checkQubit(i),
                        fired / (double) (shots * (long) ROUNDS)));
            }
        }
        out.println(Text.f("%d of %d checks never fired; %.4f detections per check per round.",
                quiet, CHECKS, total / (double) (shots * (long) ROUNDS * CHECKS)));

        Text.heading(out, "Data readout with the planted flips undone");
        out.println(Text.f("all zeros: %s, all ones: %s, anything else: %,d.",
                Text.count(report.decodedZeros(), "shot"), Text.count(report.decodedOnes(),
                "shot"), shots - report.decodedZeros() - report.decodedOnes()));
    }

    /** Reads {@code [seed [shots]]} and runs the experiment; for the launcher. */
    static void fromArgs(String[] args, PrintStream out) {
        Args.requireAtMost(args, 2, "memory [seed [shots]]");
        run(out, Args.seed(args, 0, DEFAULT_SEED), Args.shots(args, 1, DEFAULT_SHOTS));
    }

    /**
     * Runs the experiment with {@code [seed [shots]]} from the command line.
     *
     * @param args optional seed and shot count
     */
    public static void main(String[] args) {
        try {
            fromArgs(args, System.out);
        } catch (UsageException e) {
            System.err.println("RepetitionMemory: " + e.getMessage());
            System.exit(Main.EXIT_USAGE);
        }
        System.out.flush();
    }
}
