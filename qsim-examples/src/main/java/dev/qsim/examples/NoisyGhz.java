package dev.qsim.examples;

import java.io.PrintStream;
import java.util.Objects;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.StateVector;
import dev.qsim.Tally;
import dev.qsim.noise.Channel;
import dev.qsim.noise.DensityMatrix;
import dev.qsim.noise.NoiseModel;

/**
 * A GHZ preparation on a noisy six-qubit chip: the ideal prediction, the exact density-matrix
 * prediction and the Monte Carlo trajectory prediction side by side.
 *
 * <p><b>Scenario (invented).</b> The Fernhollow test bench holds "Verge-6", a six-qubit chip on
 * a line. Before booking bench time, its team wants to know how often a GHZ preparation will
 * read all zeros or all ones, given the chip's data sheet: per-qubit relaxation time T1,
 * coherence time T2 and readout errors, 40 ns single-qubit gates and 320 ns CNOTs with a
 * small depolarizing error.
 *
 * <p><b>Method.</b> The circuit is the ideal GHZ preparation of {@link BellAndGhz}. The noise
 * model puts, after each gate, thermal relaxation for the gate's duration on each qubit it
 * touches (amplitude damping with {@code gamma = 1 - exp(-t/T1)} and pure dephasing so that
 * coherences decay as {@code exp(-t/T2)}; Krantz et al. 2019, Appl. Phys. Rev. 6, 021318),
 * followed by depolarizing noise (Nielsen and Chuang 2010, §8.3.4); each measured bit is then
 * misread with its qubit's confusion probabilities. The density-matrix engine gives the exact
 * distribution; the trajectory engine samples it by Monte Carlo wave functions (Dalibard,
 * Castin and Mølmer 1992, Phys. Rev. Lett. 68, 580).
 *
 * <p>Run with {@code java -jar qsim-examples.jar noisy-ghz [seed [shots]]}.
 */
public final class NoisyGhz {

    /** Qubits on the invented chip. */
    public static final int QUBITS = 6;

    /** Seed used when none is given. */
    public static final long DEFAULT_SEED = 6_061L;

    /** Shots (and trajectories) used when none are given. */
    public static final int DEFAULT_SHOTS = 4_000;

    /** Relaxation times T1 of the invented chip, microseconds, by qubit. */
    static final double[] T1 = {42, 55, 38, 61, 47, 33};

    /** Coherence times T2 of the invented chip, microseconds, by qubit. */
    static final double[] T2 = {35, 70, 30, 52, 60, 28};

    /** Readout errors P(1|0) by qubit (invented). */
    static final double[] READ_1_GIVEN_0 = {0.012, 0.020, 0.015, 0.009, 0.025, 0.018};

    /** Readout errors P(0|1) by qubit (invented). */
    static final double[] READ_0_GIVEN_1 = {0.035, 0.041, 0.030, 0.052, 0.038, 0.060};

    /** Single-qubit gate time, microseconds (invented). */
    static final double ONE_QUBIT_TIME = 0.040;

    /** CNOT time, microseconds (invented). */
    static final double CNOT_TIME = 0.320;

    /** Depolarizing probability after a single-qubit gate (invented). */
    static final double ONE_QUBIT_ERROR = 0.001;

    /** Two-qubit depolarizing probability after a CNOT (invented). */
    static final double CNOT_ERROR = 0.012;

    /** Outcomes below this probability in every prediction are not listed. */
    static final double LIST_FROM = 0.004;

    private NoisyGhz() {
    }

    /**
     * The three predictions of one run.
     *
     * @param ideal ideal outcome probabilities, index = register value
     * @param exact density-matrix outcome probabilities with noise and readout error
     * @param densityTally a tally drawn from {@code exact}
     * @param trajectoryTally the tally of the trajectory engine
     * @param fidelity the fidelity of the noisy state with the ideal GHZ state, before readout
     */
    public record Report(double[] ideal, double[] exact, Tally densityTally,
            Tally trajectoryTally, double fidelity) {

        /**
         * Checks and copies the arguments.
         *
         * @param ideal ideal probabilities
         * @param exact exact noisy probabilities
         * @param densityTally tally from the density matrix
         * @param trajectoryTally tally of the trajectories
         * @param fidelity fidelity before readout
         */
        public Report {
            ideal = Objects.requireNonNull(ideal, "ideal").clone();
            exact = Objects.requireNonNull(exact, "exact").clone();
            Objects.requireNonNull(densityTally, "densityTally");
            Objects.requireNonNull(trajectoryTally, "trajectoryTally");
        }

        /**
         * Returns a copy of the ideal probabilities.
         *
         * @return the probabilities
         */
        @Override
        public double[] ideal() {
            return ideal.clone();
        }

        /**
         * Returns a copy of the exact noisy probabilities.
         *
         * @return the probabilities
         */
        @Override
        public double[] exact() {
            return exact.clone();
        }
    }

    /**
     * Returns the invented chip's noise model.
     *
     * @return the model
     */
    public static NoiseModel chip() {
        NoiseModel.Builder b = NoiseModel.builder();
        for (int q = 0; q < QUBITS; q++) {
            b.afterOneQubitGatesOn(q, Channel.decay(ONE_QUBIT_TIME, T1[q], T2[q])
                    .then(Channel.depolarizing(ONE_QUBIT_ERROR)));
            b.readoutError(q, READ_1_GIVEN_0[q], READ_0_GIVEN_1[q]);
        }
        for (int q = 0; q + 1 < QUBITS; q++) {
            // The gate's qubits are (control q, target q+1); tensor puts its argument on the
            // first of them.
            Channel relax = Channel.decay(CNOT_TIME, T1[q + 1], T2[q + 1])
                    .tensor(Channel.decay(CNOT_TIME, T1[q], T2[q]));
            b.afterTwoQubitGatesOn(q, q + 1,
                    relax.then(Channel.twoQubitDepolarizing(CNOT_ERROR)));
        }
        return b.build();
    }

    /**
     * Predicts the GHZ tally of the chip three ways and prints them side by side.
     *
     * @param out where the report goes
     * @param seed the seed of both samplers
     * @param shots shots of the density-matrix tally and number of trajectories
     * @return the predictions
     * @throws IllegalArgumentException if {@code shots} is out of range
     */
    public static Report predict(PrintStream out, long seed, int shots) {
        Objects.requireNonNull(out, "out");
        Args.requireShots(shots);
        Circuit prep = BellAndGhz.preparation(QUBITS);
        Circuit measured = Circuit.builder(QUBITS).append(prep).measure().build();
        NoiseModel model = chip();
        Simulator noisy = Simulator.seeded(seed).withNoise(model);
        StateVector ghz = StateVector.zero(QUBITS).apply(prep);
        double[] ideal = ghz.probabilities();
        double[] exact = noisy.distribution(measured);
        DensityMatrix rho = noisy.densityMatrixAfter(prep);
        Tally dm = noisy.withEngine(Simulator.Engine.DENSITY_MATRIX).run(measured, shots);
        Tally traj = noisy.withEngine(Simulator.Engine.TRAJECTORIES).run(measured, shots);
        Report report = new Report(ideal, exact, dm, traj, rho.fidelity(ghz));

        Text.title(out, "Verge-6 on the Fernhollow bench: a noisy GHZ preparation");
        out.println("qubit   T1 us   T2 us   P(1|0)   P(0|1)");
        for (int q = 0; q < QUBITS; q++) {
            out.println(Text.f("%5d  %6.1f  %6.1f  %7.3f  %7.3f", q, T1[q], T2[q],
                    READ_1_GIVEN_0[q], READ_0_GIVEN_1[q]));
        }
        out.println(Text.f("gates: %.0f ns single-qubit (depolarizing %.3f), %.0f ns CNOT "
                + "(two-qubit depolarizing %.3f)", ONE_QUBIT_TIME * 1000, ONE_QUBIT_ERROR,
                CNOT_TIME * 1000, CNOT_ERROR));

        Text.heading(out, Text.f("Predictions: %s and %s, seed %d", Text.count(shots, "shot"),
                shots == 1 ? "1 trajectory" : Text.f("%,d trajectories", shots), seed));
        out.println(Text.f("%-7s  %6s  %15s  %9s  %13s", "outcome", "ideal", "density matrix",
                "dm tally", "trajectories"));
        for (int i = 0; i < exact.length; i++) {
            double fd = dm.count(i) / (double) shots;
            double ft = traj.count(i) / (double) shots;
            if (ideal[i] >= LIST_FROM || exact[i] >= LIST_FROM || fd >= LIST_FROM
                    || ft >= LIST_FROM) {
                out.println(Text.f("%-7s  %6.4f  %15.4f  %9.4f  %13.4f", Text.bits(i, QUBITS),
                        ideal[i], exact[i], fd, ft));
            }
        }
        int all = (1 << QUBITS) - 1;
        out.println(Text.f("%-7s  %6.4f  %15.4f  %9.4f  %13.4f", "agree", ideal[0] + ideal[all],
                exact[0] + exact[all], (dm.count(0) + dm.count(all)) / (double) shots,
                (traj.count(0) + traj.count(all)) / (double) shots));
        out.println();
        out.println(Text.f("Fidelity of the noisy state with the ideal GHZ state, before "
                + "readout: %.4f (purity %.4f).", report.fidelity(), rho.purity()));
        out.println(Text.f("The chip should read all zeros or all ones in %.1f%% of shots, "
                + "not 100%%.", 100 * (exact[0] + exact[all])));
        return report;
    }

    /**
     * Runs from the command line: {@code [seed [shots]]}, both optional.
     *
     * @param args optional seed and shot count
     */
    public static void main(String[] args) {
        Main.launch("noisy-ghz", args);
    }

    /** Reads {@code [seed [shots]]} and runs the prediction; used by {@link Main}. */
    static void fromArgs(String[] args, PrintStream out) {
        Args.requireAtMost(args, 2, "noisy-ghz [seed [shots]]");
        predict(out, Args.seed(args, 0, DEFAULT_SEED), Args.shots(args, 1, DEFAULT_SHOTS));
    }
}
