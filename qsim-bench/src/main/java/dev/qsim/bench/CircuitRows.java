package dev.qsim.bench;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

import dev.qsim.Circuit;
import dev.qsim.Precision;
import dev.qsim.Simulator;
import dev.qsim.bench.BatchTimer.Batch;
import dev.qsim.bench.BatchTimer.Timing;
import dev.qsim.examples.cli.Progress;

/**
 * The fusion comparison of the scaling report: the layered circuit of
 * {@link Workloads#layeredCircuit(int, int, long)} run from {@code |0...0>} with gate fusion on
 * and off, rows {@code circuit-fused} and {@code circuit-unfused} (time per gate: one run
 * divided by the circuit's gate count).
 */
final class CircuitRows {
    private final ReportSettings settings;
    private final Progress progress;
    private double sink;

    /**
     * Prepares the circuit rows.
     *
     * @param settings the checked options
     * @param progress where the {@code #} lines and the bar go
     */
    CircuitRows(ReportSettings settings, Progress progress) {
        this.settings = settings;
        this.progress = progress;
    }

    /**
     * Times the layered circuit on {@code n} qubits with fusion on and off in one precision:
     * fused, unfused, unfused, fused (once each with {@code warmUp}), each mode keeping its
     * faster measurement, then prints the speed-up.
     */
    List<ReportRow> measure(int n, Precision precision, ReportRunner.Bandwidth bandwidth,
            String prefix, boolean warmUp) {
        final String label = Workloads.precisionName(precision);
        final List<ReportRow> rows = new ArrayList<>();
        final Circuit c = Workloads.layeredCircuit(n, Workloads.CIRCUIT_LAYERS,
                Workloads.CIRCUIT_SEED);
        final double[] perGate = new double[2];
        final Timing[] best = new Timing[2];
        // Fused, unfused, unfused, fused (ABBA): a drift of the machine over the four
        // measurements hits both modes alike; each mode keeps its faster measurement.
        final int[] order = warmUp ? new int[] {0, 1} : new int[] {0, 1, 1, 0};
        for (int f : order) {
            final boolean fused = f == 0;
            final Batch runs = runs(c, fused, precision);
            progress.show("n=" + n + " " + (fused ? "circuit-fused" : "circuit-unfused") + " "
                    + label);
            final Timing t = BatchTimer.measure(runs, settings.targetNanos());
            if (best[f] == null || t.perRep() < best[f].perRep()) {
                best[f] = t;
            }
        }
        for (int f = 0; f < 2; f++) {
            final boolean fused = f == 0;
            final String kernel = fused ? "circuit-fused" : "circuit-unfused";
            final Timing t = best[f];
            perGate[f] = t.perRep() / c.size();
            final ReportRow row = new ReportRow(n, kernel, "all", settings.threads(), perGate[f],
                    bandwidth.copyGbps(), bandwidth.triadGbps(), precision);
            ReportRunner.finished(progress, String.format(Locale.ROOT, "%sn=%d %s (%s): %d gates,"
                    + " %s in %.3f s, %.1f ns per gate", prefix, n, kernel, label, c.size(),
                    ReportRunner.count(t.reps(), "run"), t.nanos() / 1e9, perGate[f]), !warmUp);
            rows.add(row);
        }
        progress.note(String.format(Locale.ROOT, "%sn=%d fusion speed-up (%s): %.2fx"
                + " (unfused %.1f ns per gate, fused %.1f)", prefix, n, label,
                perGate[1] / perGate[0], perGate[1], perGate[0]));
        return rows;
    }

    /** The sum of values read from the final states, to be published once at the end. */
    double sink() {
        return sink;
    }

    /**
     * Returns the timed work of one mode: {@code reps} runs of {@code c}, each from a newly
     * allocated {@code |0...0>} (part of the time, as for any caller), reading one probability
     * of each final state.
     */
    private Batch runs(Circuit c, boolean fused, Precision precision) {
        // core entry point: the circuit rows run through Simulator.stateAfter
        final Simulator sim = Simulator.seeded(Workloads.CIRCUIT_SEED)
                .withThreads(settings.threads()).withFusion(fused).withPrecision(precision);
        return reps -> {
            double s = 0;
            final long start = System.nanoTime();
            for (long r = 0; r < reps; r++) {
                s += sim.stateAfter(c).probability(0);
            }
            final long elapsed = System.nanoTime() - start;
            sink += s;
            return elapsed;
        };
    }
}
