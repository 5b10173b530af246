package dev.qsim.bench;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

import dev.qsim.Circuit;
import dev.qsim.Precision;
import dev.qsim.StateVector;
import dev.qsim.bench.BatchTimer.Timing;
import dev.qsim.examples.cli.Progress;

/**
 * The kernel rows of the scaling report: each selected kernel kind at each selected target on
 * the seeded product state of {@link Workloads#productState(int, long, Precision)}, one gate
 * circuit applied per repetition.
 */
final class KernelRows {
    /** Keeps the timed reads from being optimised away. */
    private static volatile double readSink;

    private final ReportSettings settings;
    private final Progress progress;
    private double sink;

    /**
     * Prepares the kernel rows.
     *
     * @param settings the checked options
     * @param progress where the {@code #} lines and the bar go
     */
    KernelRows(ReportSettings settings, Progress progress) {
        this.settings = settings;
        this.progress = progress;
    }

    /**
     * Times every selected kernel at every selected target (only the first target with
     * {@code warmUp}) on the seeded product state of {@code n} qubits in one precision.
     */
    List<ReportRow> measure(int n, Precision precision, ReportRunner.Bandwidth bandwidth,
            String prefix, boolean warmUp) {
        final String label = Workloads.precisionName(precision);
        final double copyGbps = bandwidth.copyGbps();
        final List<ReportRow> rows = new ArrayList<>();
        final StateVector state = Workloads.productState(n, Workloads.STATE_SEED, precision)
                .setThreads(settings.threads());
        for (String kernel : settings.kernels()) {
            for (String target : settings.targets()) {
                final Circuit[] gates = gates(kernel, target, n);
                progress.show("n=" + n + " " + kernel + " " + target + " " + label);
                final Timing t = BatchTimer.measure(r -> timeGates(state, gates, r),
                        settings.targetNanos());
                ReportRow row = new ReportRow(n, kernel, target, settings.threads(),
                        t.perRep(), copyGbps, bandwidth.triadGbps(), precision);
                String pass = "";
                if (Workloads.keptInFrame(kernel)) {
                    // The gate costs no pass of its own; its bandwidth is the read's that
                    // settles the frame, timed one gate and one read at a time.
                    progress.show("n=" + n + " " + kernel + " " + target + " " + label
                            + " settling read");
                    final Timing settle = BatchTimer.measure(
                            r -> timeGatesThenRead(state, gates, r), settings.targetNanos());
                    row = row.withPass(settle.perRep());
                    pass = String.format(Locale.ROOT, " (kept in the lazy frame; gate and the"
                            + " read that settles it: %.1f ns)", settle.perRep());
                }
                ReportRunner.finished(progress, String.format(Locale.ROOT, "%sn=%d %s %s (%s):"
                        + " %s in %.3f s, %.1f ns per gate%s, %.3f GB/s, %.2f of copy", prefix, n,
                        kernel, target, label, ReportRunner.count(t.reps(), "repetition"),
                        t.nanos() / 1e9, t.perRep(), pass, row.gbps(), row.gbps() / copyGbps),
                        !warmUp);
                rows.add(row);
                if (warmUp) {
                    break;
                }
            }
        }
        sink += state.probability(0);
        return rows;
    }

    /** The sum of values read from the states, to be published once at the end. */
    double sink() {
        return sink;
    }

    /**
     * The one-gate circuits of a kernel at a target: one circuit, or for {@code all} one per
     * qubit, applied in turn.
     */
    static Circuit[] gates(String kernel, String target, int n) {
        if (!target.equals("all")) {
            return new Circuit[] {Workloads.kernelCircuit(kernel, n, Workloads.target(target, n))};
        }
        final Circuit[] gates = new Circuit[n];
        for (int q = 0; q < n; q++) {
            gates[q] = Workloads.kernelCircuit(kernel, n, q);
        }
        return gates;
    }

    /**
     * Applies the one-gate circuits in turn, reading one amplitude after each, {@code reps}
     * times; returns nanoseconds. For a gate kept in the lazy frame each read settles it: one
     * pass over the state per repetition.
     */
    static long timeGatesThenRead(StateVector state, Circuit[] gates, long reps) {
        // core entry point: StateVector.apply(Circuit), then a read that settles the frame
        final int count = gates.length;
        int next = 0;
        double s = 0;
        final long start = System.nanoTime();
        for (long r = 0; r < reps; r++) {
            state.apply(gates[next]);
            s += state.probability(0);
            next = next + 1 == count ? 0 : next + 1;
        }
        final long elapsed = System.nanoTime() - start;
        readSink += s;
        return elapsed;
    }

    /**
     * Applies the one-gate circuits {@code reps} times in turn, then reads one amplitude;
     * returns nanoseconds. The read is timed because X and single-qubit phase gates are kept
     * in the core's lazy frame: the first read after them applies the frame in one pass, and
     * that pass belongs to the gates' cost.
     */
    static long timeGates(StateVector state, Circuit[] gates, long reps) {
        // core entry point: the kernel rows run through StateVector.apply(Circuit) and one read
        final int count = gates.length;
        int next = 0;
        final long start = System.nanoTime();
        for (long r = 0; r < reps; r++) {
            state.apply(gates[next]);
            next = next + 1 == count ? 0 : next + 1;
        }
        readSink += state.probability(0);
        return System.nanoTime() - start;
    }
}
