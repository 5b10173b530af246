package dev.qsim.bench;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.function.DoubleSupplier;

import dev.qsim.Circuit;
import dev.qsim.Gates;
import dev.qsim.Operator;
import dev.qsim.Simulator;
import dev.qsim.bench.BatchTimer.Batch;
import dev.qsim.bench.BatchTimer.Timing;
import dev.qsim.examples.cli.Progress;
import dev.qsim.noise.Channel;
import dev.qsim.noise.DensityMatrix;
import dev.qsim.noise.NoiseModel;

/**
 * The noise rows of {@code --noise on}: one gate plus a depolarizing channel on a density
 * matrix (streamed as a 2n-qubit vector, two passes), and one Monte Carlo trajectory of a GHZ
 * chain with depolarizing noise after every gate ({@code ns_per_gate} is then the time of the
 * whole trajectory, {@code gb_per_s} counts one pass per gate). Each row has its own probe
 * figures, measured at the size of the vector streamed. Double precision only.
 *
 * <p>The calls into the noise engines are kept in {@link #densityMatrixSteps(int)} and
 * {@link #trajectories(int)}, one method per row kind.
 */
final class NoiseRows {
    /** Smallest density matrix timed by {@code --noise on}. */
    static final int NOISE_DM_MIN = 6;

    /** Largest density matrix timed by {@code --noise on} (4 GiB). */
    static final int NOISE_DM_MAX = 14;

    /** Smallest register whose trajectories {@code --noise on} times. */
    static final int NOISE_TRAJECTORY_MIN = 20;

    private final ReportSettings settings;
    private final BandwidthProbe probe;
    private final Progress progress;
    private double sink;

    /**
     * Timed work and the figure read from its result afterwards (outside the timing).
     *
     * @param batch the timed work
     * @param result a value of its result, summed so the work is not dead code
     */
    private record Work(Batch batch, DoubleSupplier result) {
    }

    /**
     * Prepares the noise rows.
     *
     * @param settings the checked options
     * @param probe the bandwidth probe, measured again at each row's size
     * @param progress where the {@code #} lines and the bar go
     */
    NoiseRows(ReportSettings settings, BandwidthProbe probe, Progress progress) {
        this.settings = settings;
        this.probe = probe;
        this.progress = progress;
    }

    /** Measures the density-matrix rows, then the trajectory rows. */
    List<ReportRow> measure() {
        final List<ReportRow> rows = new ArrayList<>();
        for (int n = NOISE_DM_MIN; n <= Math.min(NOISE_DM_MAX, settings.max()); n++) {
            final int vector = 2 * n;
            final ReportRunner.Bandwidth bandwidth = probe(vector);
            final Work work = densityMatrixSteps(n);
            progress.show("n=" + n + " density-matrix");
            final Timing t = BatchTimer.measure(work.batch(), settings.targetNanos());
            sink += work.result().getAsDouble();
            final ReportRow row = new ReportRow(n, "density-matrix", "mid", settings.threads(),
                    t.perRep(), bandwidth.copyGbps(), bandwidth.triadGbps(), vector, 2);
            progress.done(String.format(Locale.ROOT, "# n=%d density-matrix: gate and channel"
                    + " %.1f ns (%s), %.3f GB/s", n, t.perRep(),
                    ReportRunner.count(t.reps(), "repetition"), row.gbps()));
            rows.add(row);
        }
        for (int n = Math.max(NOISE_TRAJECTORY_MIN, settings.min()); n <= settings.max(); n++) {
            final ReportRunner.Bandwidth bandwidth = probe(n);
            final Work work = trajectories(n);
            progress.show("n=" + n + " trajectory");
            final Timing t = BatchTimer.measure(work.batch(), settings.targetNanos());
            sink += work.result().getAsDouble();
            final ReportRow row = new ReportRow(n, "trajectory", "ghz", settings.threads(),
                    t.perRep(), bandwidth.copyGbps(), bandwidth.triadGbps(), n, n);
            progress.done(String.format(Locale.ROOT, "# n=%d trajectory: %.3f s per trajectory"
                    + " of a %d-gate noisy GHZ chain (%s)", n, t.perRep() / 1e9, n,
                    t.reps() == 1 ? "1 trajectory" : t.reps() + " trajectories"));
            rows.add(row);
        }
        return rows;
    }

    /** The sum of values read from the results, to be published once at the end. */
    double sink() {
        return sink;
    }

    /** Copy and triad of the probe over the bytes of a {@code vectorQubits} state (no line). */
    private ReportRunner.Bandwidth probe(int vectorQubits) {
        return probeAt(probe, vectorQubits, settings.targetNanos());
    }

    /** The probe's copy and triad bandwidths over a vector of {@code vectorQubits} qubits. */
    static ReportRunner.Bandwidth probeAt(BandwidthProbe probe, int vectorQubits,
            long targetNanos) {
        final int len = probe.lengthFor(vectorQubits);
        final double copyGbps = BandwidthProbe.copyBytes(len)
                / BatchTimer.measure(r -> probe.timeCopy(len, r), targetNanos).perRep();
        final double triadGbps = BandwidthProbe.triadBytes(len)
                / BatchTimer.measure(r -> probe.timeTriad(len, r), targetNanos).perRep();
        return new ReportRunner.Bandwidth(copyGbps, triadGbps);
    }

    /**
     * One repetition: {@code rz(0.7)} and a depolarizing channel (p = 0.01) on qubit
     * {@code n / 2} of an {@code n}-qubit density matrix; the purity is read afterwards.
     */
    private Work densityMatrixSteps(int n) {
        // core entry point: the density-matrix rows run through DensityMatrix.apply
        final DensityMatrix rho = DensityMatrix.zero(n).setThreads(settings.threads());
        final Channel depolarizing = Channel.depolarizing(0.01);
        final Operator gate = Gates.rz(0.7);
        final int q = n / 2;
        return new Work(reps -> {
            final long start = System.nanoTime();
            for (long r = 0; r < reps; r++) {
                rho.apply(gate, q).apply(depolarizing, q);
            }
            return System.nanoTime() - start;
        }, rho::purity);
    }

    /**
     * One repetition: one seeded trajectory of an {@code n}-qubit GHZ chain (H, then CNOTs down
     * the chain, then measurement) with depolarizing noise after every gate (p = 0.001 after
     * one-qubit gates, 0.01 after two-qubit ones); the shots run are summed.
     */
    private Work trajectories(int n) {
        // core entry point: the trajectory rows run through the facade's TRAJECTORIES engine
        final Circuit.Builder b = Circuit.builder(n).h(0);
        for (int k = 0; k + 1 < n; k++) {
            b.cnot(k, k + 1);
        }
        final Circuit ghz = b.measure().build();
        final NoiseModel model = NoiseModel.builder()
                .afterOneQubitGates(Channel.depolarizing(0.001))
                .afterTwoQubitGates(Channel.twoQubitDepolarizing(0.01)).build();
        final Simulator runner = Simulator.seeded(Workloads.STATE_SEED)
                .withThreads(settings.threads()).withNoise(model)
                .withEngine(Simulator.Engine.TRAJECTORIES);
        final double[] shots = new double[1];
        return new Work(reps -> {
            final long start = System.nanoTime();
            shots[0] += runner.run(ghz, (int) reps).shots();
            return System.nanoTime() - start;
        }, () -> shots[0]);
    }
}
