package dev.qsim.examples;

import java.io.PrintStream;
import java.util.Map;
import java.util.Objects;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.StateVector;
import dev.qsim.Tally;

/**
 * Entangled pairs and rings: a Bell pair on two qubits and a GHZ state on six.
 *
 * <p><b>Scenario (invented).</b> The two relay huts on Larkspur Ridge share entangled pairs to
 * check that their clocks agree: whatever one hut reads, the other must read the same. Further
 * down the valley, the six-node "Lantern" sensor ring shares one six-qubit entangled state, so
 * all six nodes read all zeros or all ones together and never a mixture.
 *
 * <p><b>Method.</b> A Hadamard then a CNOT makes the Bell state (|00&gt; + |11&gt;)/&radic;2
 * (M. A. Nielsen and I. L. Chuang, <i>Quantum Computation and Quantum Information</i>, Cambridge
 * University Press, 2010, section 1.3.6, equation 1.98). A Hadamard followed by a chain of CNOTs
 * makes the n-qubit GHZ state (|0...0&gt; + |1...1&gt;)/&radic;2 (D. M. Greenberger, M. A. Horne,
 * A. Shimony and A. Zeilinger, "Bell's theorem without inequalities", Am. J. Phys. 58, 1131,
 * 1990). Each is printed as its nonzero amplitudes and as a seeded tally, in which only the
 * all-zeros and all-ones outcomes may appear.
 *
 * <p>Run with {@code java -jar qsim-examples.jar bell [seed [shots]]} (both parts) or
 * {@code ... ghz [seed [shots]]} (the ring alone).
 */
public final class BellAndGhz {

    /** Qubits in the invented sensor ring's GHZ state. */
    public static final int RING_QUBITS = 6;

    /** Seed used when none is given. */
    public static final long DEFAULT_SEED = 1_729L;

    /** Shots used when none are given. */
    public static final int DEFAULT_SHOTS = 2_000;

    /** Amplitudes below this magnitude are treated as zero when printed. */
    static final double ZERO = 1e-12;

    private BellAndGhz() {
    }

    /**
     * An entangled state and its seeded tally.
     *
     * @param qubits number of qubits
     * @param state the state before measurement; copied
     * @param tally the seeded tally of measuring every qubit
     */
    public record Report(int qubits, StateVector state, Tally tally) {

        /**
         * Checks and copies the arguments.
         *
         * @param qubits number of qubits
         * @param state the state before measurement; copied
         * @param tally the seeded tally of measuring every qubit
         */
        public Report {
            state = Objects.requireNonNull(state, "state").copy();
            Objects.requireNonNull(tally, "tally");
        }

        /**
         * Returns a copy of the state before measurement.
         *
         * @return the state
         */
        @Override
        public StateVector state() {
            return state.copy();
        }

        /**
         * Returns the number of shots that read every qubit as 0.
         *
         * @return count of the all-zeros outcome
         */
        public long allZeros() {
            return tally.count(0L);
        }

        /**
         * Returns the number of shots that read every qubit as 1.
         *
         * @return count of the all-ones outcome
         */
        public long allOnes() {
            return tally.count((1L << qubits) - 1);
        }

        /**
         * Returns the number of shots with any other outcome (zero for an ideal simulator).
         *
         * @return shots that were neither all zeros nor all ones
         */
        public long mixed() {
            return tally.shots() - allZeros() - allOnes();
        }
    }

    /**
     * Builds the GHZ preparation: a Hadamard on qubit 0, then CNOTs from each qubit to the next.
     * On two qubits this is the Bell pair. No measurement is included.
     *
     * @param qubits number of qubits, from 2 to 20
     * @return the preparation circuit
     * @throws IllegalArgumentException if {@code qubits} is out of range
     */
    public static Circuit preparation(int qubits) {
        if (qubits < 2 || qubits > 20) {
            throw new IllegalArgumentException("qubits must be from 2 to 20, got " + qubits);
        }
        Circuit.Builder builder = Circuit.builder(qubits).h(0);
        for (int q = 0; q + 1 < qubits; q++) {
            builder.cnot(q, q + 1);
        }
        return builder.build();
    }

    /**
     * Prepares the Bell pair of the ridge huts, prints it and its tally, and returns both.
     *
     * @param out where the report goes
     * @param seed the simulator seed
     * @param shots number of shots, from 1 to 1,000,000
     * @return the state and the tally
     * @throws IllegalArgumentException if {@code shots} is out of range
     */
    public static Report bell(PrintStream out, long seed, int shots) {
        return show(out, "Larkspur Ridge relay huts: one Bell pair", 2, seed, shots);
    }

    /**
     * Prepares the GHZ state of the sensor ring, prints it and its tally, and returns both.
     *
     * @param out where the report goes
     * @param qubits number of qubits, from 2 to 20
     * @param seed the simulator seed
     * @param shots number of shots, from 1 to 1,000,000
     * @return the state and the tally
     * @throws IllegalArgumentException if {@code qubits} or {@code shots} is out of range
     */
    public static Report ghz(PrintStream out, int qubits, long seed, int shots) {
        return show(out, "Lantern sensor ring: a GHZ state on " + qubits + " nodes", qubits,
                seed, shots);
    }

    private static Report show(PrintStream out, String title, int qubits, long seed, int shots) {
        Objects.requireNonNull(out, "out");
        Args.requireShots(shots);
        Circuit prep = preparation(qubits);
        StateVector state = StateVector.zero(qubits).apply(prep);
        Circuit measured = Circuit.builder(qubits).append(prep).measure().build();
        Tally tally = Simulator.seeded(seed).run(measured, shots);
        Report report = new Report(qubits, state, tally);

        Text.title(out, title);
        StringBuilder chain = new StringBuilder("0");
        for (int q = 1; q < qubits; q++) {
            chain.append("->").append(q);
        }
        out.println("H on qubit 0, then CNOTs along " + chain + ".");

        Text.heading(out, "Nonzero amplitudes");
        String basis = "basis";
        int column = Math.max(basis.length(), qubits + 2);
        out.println(Text.f("%-" + column + "s  %-23s  %s", basis, "amplitude", "probability"));
        long dimension = 1L << qubits;
        for (long i = 0; i < dimension; i++) {
            if (state.amplitude(i).abs() > ZERO) {
                out.println(Text.f("%-" + column + "s  %-23s  %11.6f",
                        "|" + Text.bits(i, qubits) + ">", Text.complex(state.amplitude(i)),
                        state.probability(i)));
            }
        }

        Text.heading(out, Text.f("Tally: %s, seed %d", Text.count(shots, "shot"), seed));
        long max = 0;
        for (long count : tally.outcomes().values()) {
            max = Math.max(max, count);
        }
        int width = Math.max("outcome".length(), qubits);
        out.println(Text.f("%-" + width + "s  %8s  %s", "outcome", "count", "bar"));
        for (Map.Entry<String, Long> e : tally.outcomes().entrySet()) {
            out.println(Text.f("%-" + width + "s  %8d  %s", e.getKey(), e.getValue(),
                    Text.bar(e.getValue(), max)));
        }
        out.println();
        if (report.mixed() == 0) {
            out.println(Text.f("%s all zeros or all ones: the %s always agree.", shots == 1
                    ? "The one shot read" : Text.f("All %,d shots read", shots),
                    qubits == 2 ? "two huts" : "nodes"));
        } else {
            out.println(Text.f("%s read a mixed outcome: the nodes disagreed.",
                    Text.count(report.mixed(), "shot")));
        }
        return report;
    }

    /**
     * Runs both parts from the command line: {@code [seed [shots]]}, both optional.
     *
     * @param args optional seed and shot count
     */
    public static void main(String[] args) {
        Main.launch("bell", args);
    }

    /** Reads {@code [seed [shots]]} and runs the GHZ ring; used by {@link Main}. */
    static void ghzFromArgs(String[] args, PrintStream out) {
        Args.requireAtMost(args, 2, "ghz [seed [shots]]");
        ghz(out, RING_QUBITS, Args.seed(args, 0, DEFAULT_SEED), Args.shots(args, 1,
                DEFAULT_SHOTS));
    }

    /** Reads {@code [seed [shots]]} and runs both parts; used by {@link Main}. */
    static void bothFromArgs(String[] args, PrintStream out) {
        Args.requireAtMost(args, 2, "bell [seed [shots]]");
        long seed = Args.seed(args, 0, DEFAULT_SEED);
        int shots = Args.shots(args, 1, DEFAULT_SHOTS);
        bell(out, seed, shots);
        out.println();
        ghz(out, RING_QUBITS, seed, shots);
    }
}
