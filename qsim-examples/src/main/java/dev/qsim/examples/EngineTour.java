package dev.qsim.examples;

import java.io.PrintStream;
import java.util.EnumMap;
import java.util.Map;
import java.util.Objects;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.Tally;
import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;

/**
 * One circuit on every engine, through one call shape.
 *
 * <p><b>Scenario (invented).</b> The Orchard Street teaching lab grades its students' entangling
 * circuits on whatever engine fits: the five-qubit "lantern" circuit (a GHZ chain) on the state
 * vector and on the stabilizer tableau, the same circuit with the lab's noise on a density matrix
 * and on trajectories, a 300-lantern version too wide for any state vector (the tableau holds
 * it), and the same with one T gate added, which rules the tableau out and leaves the matrix
 * product state. Every run is
 * {@code Simulator.seeded(seed).withThreads(t).withEngine(e).run(circuit, shots)}, and the
 * simulator says why it picked an engine when left to choose.
 *
 * <p><b>Method.</b> A Hadamard followed by a chain of CNOTs makes the GHZ state, whose
 * measurement reads all zeros or all ones (Greenberger, Horne, Shimony and Zeilinger, "Bell's
 * theorem without inequalities", Am. J. Phys. 58, 1131, 1990). With depolarizing noise after
 * each gate and readout error the density matrix gives the exact noisy distribution; averaged
 * trajectories reproduce it (Dalibard, Castin and Mølmer, Phys. Rev. Lett. 68, 580, 1992).
 *
 * <p>Run with {@code java -jar qsim-examples.jar engines [seed [shots]]}.
 */
public final class EngineTour {
    /** Qubits of the small lantern circuit. */
    public static final int QUBITS = 5;

    /** Qubits of the wide lantern circuit, beyond any state vector. */
    public static final int WIDE_QUBITS = 300;

    /** Seed used when none is given. */
    public static final long DEFAULT_SEED = 11L;

    /** Shots used when none are given. */
    public static final int DEFAULT_SHOTS = 2_000;

    private EngineTour() {
    }

    /**
     * What the tour found.
     *
     * @param tallies the small circuit's tally on each engine (noisy on the density matrix and
     *     trajectories)
     * @param exactNoisyAgreement the exact probability that the noisy circuit reads all zeros
     *     or all ones
     * @param wideChoice the engine picked for the wide circuit, with its reason
     * @param wide the wide circuit's tally
     */
    public record Report(Map<Simulator.Engine, Tally> tallies, double exactNoisyAgreement,
            Simulator.Choice wideChoice, Tally wide) {
        /**
         * Copies the map.
         *
         * @param tallies the tallies
         * @param exactNoisyAgreement the exact agreement probability
         * @param wideChoice the wide circuit's engine
         * @param wide the wide tally
         */
        public Report {
            tallies = Map.copyOf(tallies);
            Objects.requireNonNull(wideChoice, "wideChoice");
            Objects.requireNonNull(wide, "wide");
        }
    }

    /**
     * The lantern circuit: H on qubit 0, a CNOT chain, every qubit measured.
     *
     * @param n qubits, at least 2
     * @return the circuit
     */
    public static Circuit lanterns(int n) {
        Circuit.Builder b = Circuit.builder(n).h(0);
        for (int q = 1; q < n; q++) {
            b.cnot(q - 1, q);
        }
        return b.measure().build();
    }

    /**
     * The lab's noise: depolarizing after every gate and symmetric readout error.
     *
     * @return the model
     */
    public static NoiseModel labNoise() {
        return NoiseModel.builder().afterOneQubitGates(Channel.depolarizing(0.01))
                .afterTwoQubitGates(Channel.twoQubitDepolarizing(0.02)).readoutError(0.02, 0.03)
                .build();
    }

    /** The fraction of shots that read all zeros or all ones. */
    static double agreement(Tally t) {
        int n = t.width();
        return (t.count("0".repeat(n)) + t.count("1".repeat(n))) / (double) t.shots();
    }

    /**
     * Runs the tour and prints it.
     *
     * @param out where the report goes
     * @param seed the seed of every run
     * @param shots shots per run, at least 1
     * @return what the tour found
     * @throws IllegalArgumentException if {@code shots} is out of range
     */
    public static Report run(PrintStream out, long seed, int shots) {
        Objects.requireNonNull(out, "out");
        Args.requireShots(shots);
        Circuit small = lanterns(QUBITS);
        NoiseModel noise = labNoise();
        Text.title(out, "Orchard Street lab: the lantern circuit on every engine");
        out.println(Text.f("%d qubits, %s, seed %d; noise: depolarizing 0.01 / 0.02,"
                + " readout 0.02 / 0.03", QUBITS, Text.count(shots, "shot"), seed));
        out.println(Text.f("%-15s  %-8s  %9s  %8s  %s", "engine", "noise", "all-same", "ms",
                "why this engine"));
        Map<Simulator.Engine, Tally> tallies = new EnumMap<>(Simulator.Engine.class);
        for (Simulator.Engine e : Simulator.Engine.values()) {
            boolean noisy = e == Simulator.Engine.DENSITY_MATRIX
                    || e == Simulator.Engine.TRAJECTORIES;
            Simulator sim = Simulator.seeded(seed).withThreads(2).withEngine(e)
                    .withNoise(noisy ? noise : NoiseModel.none());
            long start = System.nanoTime();
            Tally t = sim.run(small, shots);
            double ms = (System.nanoTime() - start) * 1e-6;
            tallies.put(e, t);
            out.println(Text.f("%-15s  %-8s  %9.4f  %8.2f  %s", e, noisy ? "lab" : "none",
                    agreement(t), ms, sim.explain(small, shots).reason()));
        }
        double[] exact = Simulator.seeded(seed).withNoise(noise).distribution(small);
        double exactAgreement = exact[0] + exact[exact.length - 1];
        out.println(Text.f("exact all-same probability with the lab's noise (density matrix):"
                + " %.4f", exactAgreement));

        Circuit wide = lanterns(WIDE_QUBITS);
        Simulator cheapest = Simulator.seeded(seed).withThreads(2);
        Simulator.Choice choice = cheapest.explain(wide, shots);
        Tally wideTally = cheapest.run(wide, shots);
        Text.heading(out, Text.f("%d lanterns, engine left to choose", WIDE_QUBITS));
        out.println(choice);
        out.println(Text.f("all-same fraction: %.4f over %s", agreement(wideTally),
                Text.count(wideTally.shots(), "shot")));
        Circuit withT = Circuit.builder(WIDE_QUBITS).t(7).append(wide).build();
        Tally tTally = cheapest.run(withT, shots);
        out.println("with a T gate added: " + cheapest.explain(withT, shots));
        out.println(Text.f("all-same fraction: %.4f over %s", agreement(tTally),
                Text.count(tTally.shots(), "shot")));
        return new Report(tallies, exactAgreement, choice, wideTally);
    }

    /** The launcher's entry: optional seed and shots. */
    static void fromArgs(String[] args, PrintStream out) {
        Args.requireAtMost(args, 2, "engines [seed [shots]]");
        run(out, Args.seed(args, 0, DEFAULT_SEED), Args.shots(args, 1, DEFAULT_SHOTS));
    }
}
