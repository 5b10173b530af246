package dev.qsim.bench;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

import dev.qsim.Precision;
import dev.qsim.bench.BatchTimer.Timing;
import dev.qsim.examples.cli.Progress;

/**
 * The measurement loop of the scaling report: at each size the bandwidth probe, then for each
 * precision the kernel rows ({@link KernelRows}) and, where selected, the fusion comparison
 * ({@link CircuitRows}); at the end the noise rows ({@link NoiseRows}). Each measurement prints
 * a {@code #} line through the shared {@link Progress}; a warm-up line does not count as a step.
 */
final class ReportRunner {
    private final ReportSettings settings;
    private final BandwidthProbe probe;
    private final Progress progress;
    private final KernelRows kernels;
    private final CircuitRows circuits;
    private final NoiseRows noise;
    private final BondRows bonds;
    /** Sum of values read from results, so no measured work is dead code. */
    private double sink;

    /**
     * Copy and triad bandwidth of the probe at one size, in GB/s.
     *
     * @param copyGbps the copy's bandwidth
     * @param triadGbps the triad's bandwidth
     */
    record Bandwidth(double copyGbps, double triadGbps) {
    }

    /**
     * Prepares a run.
     *
     * @param settings the checked options
     * @param probe the probe, allocated at its final length
     * @param progress where the {@code #} lines and the bar go
     */
    ReportRunner(ReportSettings settings, BandwidthProbe probe, Progress progress) {
        this.settings = settings;
        this.probe = probe;
        this.progress = progress;
        this.kernels = new KernelRows(settings, progress);
        this.circuits = new CircuitRows(settings, progress);
        this.noise = new NoiseRows(settings, probe, progress);
        this.bonds = new BondRows(settings, probe, progress);
    }

    /** A count with its noun, plural unless the count is 1: "1 run", "3 runs". */
    static String count(long n, String noun) {
        return n + " " + (n == 1 ? noun : noun + "s");
    }

    /**
     * Prints a measurement's line; a reported step ({@code counts}) advances the bar, a warm-up
     * line does not.
     */
    static void finished(Progress progress, String line, boolean counts) {
        if (counts) {
            progress.done(line);
        } else {
            progress.note(line + " (elapsed " + progress.elapsed() + ")");
        }
    }

    /**
     * Measures everything at {@code n}; with {@code warmUp}, only the first target of each
     * kernel, reported as not counted, and returns no rows.
     */
    List<ReportRow> size(int n, boolean warmUp) {
        final String prefix = warmUp ? "# warm-up (not reported) " : "# ";
        final long targetNanos = settings.targetNanos();
        final int len = probe.lengthFor(n);
        progress.show("n=" + n + " probe copy");
        final Timing copy = BatchTimer.measure(r -> probe.timeCopy(len, r), targetNanos);
        final double copyGbps = BandwidthProbe.copyBytes(len) / copy.perRep();
        finished(progress, String.format(Locale.ROOT, "%sn=%d probe copy: %d doubles, %s in"
                + " %.3f s, %.3f GB/s", prefix, n, len, count(copy.reps(), "repetition"),
                copy.nanos() / 1e9, copyGbps), !warmUp);
        progress.show("n=" + n + " probe triad");
        final Timing triad = BatchTimer.measure(r -> probe.timeTriad(len, r), targetNanos);
        final double triadGbps = BandwidthProbe.triadBytes(len) / triad.perRep();
        finished(progress, String.format(Locale.ROOT, "%sn=%d probe triad: %d doubles, %s in"
                + " %.3f s, %.3f GB/s", prefix, n, len, count(triad.reps(), "repetition"),
                triad.nanos() / 1e9, triadGbps), !warmUp);
        sink += probe.sample(len - 1);

        final Bandwidth bandwidth = new Bandwidth(copyGbps, triadGbps);
        final List<ReportRow> rows = new ArrayList<>();
        final boolean circuit = warmUp ? !settings.circuitQubits().isEmpty()
                : settings.circuitQubits().contains(n);
        for (Precision precision : settings.precisions()) {
            // Each call's state is unreachable once it returns, so only one state of this size
            // is live at a time (see HeapBudget).
            rows.addAll(kernels.measure(n, precision, bandwidth, prefix, warmUp));
            if (circuit) {
                rows.addAll(circuits.measure(n, precision, bandwidth, prefix, warmUp));
            }
        }
        return warmUp ? List.of() : rows;
    }

    /** Measures the noise rows of {@code --noise on}; see {@link NoiseRows}. */
    List<ReportRow> noise() {
        return noise.measure();
    }

    /** Measures the matrix-product-state rows of {@code --mps on}; see {@link BondRows}. */
    List<ReportRow> bonds() {
        return bonds.measure();
    }

    /** The fitted exponent of the bond dimension, after {@link #bonds()}. */
    double bondExponent() {
        return bonds.exponent();
    }

    /** The sum of values read from every result, to be published once at the end. */
    double sink() {
        return sink + kernels.sink() + circuits.sink() + noise.sink();
    }
}
