package dev.qsim.bench;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import dev.qsim.Precision;

/**
 * The settings of one {@link ScalingReport} run, as {@link ReportOptions} read and checked them.
 *
 * @param min the smallest qubit count measured
 * @param max the largest qubit count measured
 * @param threads the threads of the kernels, the simulator and the probe
 * @param kernels the kernel kinds, of {@link Workloads#KERNEL_NAMES}, in the order given
 * @param targets the targets, of {@code low}, {@code mid}, {@code high}, {@code all}
 * @param millis the least measured time of one measurement, in milliseconds
 * @param circuitQubits the sizes of the fusion comparison, ascending, each in [min, max]
 *     (empty when it is off)
 * @param csv the CSV file, or {@code null} for standard output
 * @param svg the SVG file, or {@code null} for none
 * @param noise whether the noise rows are measured
 * @param precisions the precisions to measure in: double, single, or double then single
 * @param mps whether the matrix-product-state rows are measured ({@link BondRows})
 * @param reference the file of the C reference kernel's output ({@link CeilingReference}), or
 *     {@code null} for none
 */
record ReportSettings(int min, int max, int threads, List<String> kernels, List<String> targets,
        long millis, List<Integer> circuitQubits, Path csv, Path svg, boolean noise,
        List<Precision> precisions, boolean mps, Path reference) {

    /** Bytes of one amplitude in the widest precision measured: the largest state's. */
    int widestBytesPerAmplitude() {
        int widest = 0;
        for (Precision p : precisions) {
            widest = Math.max(widest, p.bytesPerAmplitude());
        }
        return widest;
    }

    /** The widest precision measured: that of the largest state. */
    Precision widestPrecision() {
        return widestBytesPerAmplitude() == Precision.SINGLE.bytesPerAmplitude()
                ? Precision.SINGLE : Precision.DOUBLE;
    }

    /** The least measured time of one measurement, in nanoseconds. */
    long targetNanos() {
        return millis * 1_000_000L;
    }

    /** The number of reported measurements: probe, kernels, circuit runs and noise rows. */
    int steps() {
        final int sizes = max - min + 1;
        final int p = precisions.size();
        return sizes * (2 + p * kernels.size() * targets.size()) + 2 * p * circuitQubits.size()
                + noiseSizes() + (mps ? BondRows.CHIS.length : 0);
    }

    /** The number of noise-engine measurements of {@code --noise on}. */
    int noiseSizes() {
        if (!noise) {
            return 0;
        }
        final int dm = Math.max(0, Math.min(NoiseRows.NOISE_DM_MAX, max)
                - NoiseRows.NOISE_DM_MIN + 1);
        final int tr = Math.max(0, max - Math.max(NoiseRows.NOISE_TRAJECTORY_MIN, min) + 1);
        return dm + tr;
    }

    /** The precisions' names, comma separated: {@code double}, {@code single} or both. */
    String precisionNames() {
        final List<String> names = new ArrayList<>();
        for (Precision p : precisions) {
            names.add(Workloads.precisionName(p));
        }
        return String.join(",", names);
    }
}
