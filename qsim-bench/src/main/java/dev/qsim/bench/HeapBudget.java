package dev.qsim.bench;

import dev.qsim.Precision;
import java.util.Locale;
import java.util.Optional;

/**
 * How the scaling report fits in the heap: the length of the bandwidth probe's arrays next to
 * the largest state, and whether the two fit at all.
 */
final class HeapBudget {
    /**
     * The probe arrays are never shortened below this many doubles (128 MiB each, three times
     * that in all) to fit the heap: McCalpin asks for arrays well beyond the last-level cache.
     */
    static final long MIN_PROBE_LENGTH = 1L << 24;

    /** Longest probe array: 2^30 doubles (8 GiB), within Java's array limit. */
    static final long MAX_PROBE_LENGTH = 1L << 30;

    /**
     * Heap kept free beside the largest state and an eighth of it (256 MiB, the margin the core
     * adds to the {@code -Xmx} it suggests): for the small objects of a run (circuits, fused
     * matrices, scratch windows) and for the gaps the collector leaves between the large arrays
     * of the state and the probe. The eighth covers what the collector loses placing a state's
     * large chunks in its regions.
     */
    static final long HEAP_ROOM = 256L << 20;

    private static final long GIB = 1L << 30;
    private static final long MIB = 1L << 20;

    private HeapBudget() {
    }

    /**
     * Heap the report needs at {@code --max maxQubits} with amplitudes of
     * {@code bytesPerAmplitude} bytes and probe arrays of {@code probeLength} doubles: the
     * largest state, an eighth of it plus {@link #HEAP_ROOM} of room, and three probe arrays.
     * One state at a time is enough: the state is built with one large allocation
     * ({@link Workloads#productState(int, long, Precision)}), each size's states are dropped
     * before the next are made, and the core runs the collector before it refuses a new state,
     * so a circuit run's new state takes the place of the previous, unreachable one.
     */
    static long heapNeeded(int maxQubits, long probeLength, int bytesPerAmplitude) {
        final long state = ReportRow.stateBytes(maxQubits, bytesPerAmplitude);
        return state + state / 8 + HEAP_ROOM + 3 * Double.BYTES * probeLength;
    }

    /**
     * Returns the length of the probe arrays: {@code 2^(max+1)} doubles (the bytes of the
     * double-precision state), at most {@link #MAX_PROBE_LENGTH}; if the heap cannot hold that
     * next to the state of {@code bytesPerAmplitude} bytes per amplitude, the longest power of two
     * that fits, but not below {@code min(2^(max+1), MIN_PROBE_LENGTH)}; or -1 if even that does
     * not fit.
     */
    static long probeLength(int maxQubits, long maxHeapBytes, int bytesPerAmplitude) {
        final long full = Math.min(2L << maxQubits, MAX_PROBE_LENGTH);
        final long least = Math.min(full, MIN_PROBE_LENGTH);
        long len = full;
        while (len > least && heapNeeded(maxQubits, len, bytesPerAmplitude) > maxHeapBytes) {
            len >>= 1;
        }
        return heapNeeded(maxQubits, len, bytesPerAmplitude) <= maxHeapBytes ? len : -1;
    }

    /**
     * Checks the heap can hold the largest state, of {@code bytesPerAmplitude} bytes per
     * amplitude (16 in double precision, 8 in single), with room, and the probe arrays (shorter
     * ones if need be, see {@link #probeLength}).
     *
     * @return empty if it can, otherwise a message with the bytes needed, the heap maximum and
     *     the {@code -Xmx} that would do
     */
    static Optional<String> heapProblem(int maxQubits, long maxHeapBytes, int bytesPerAmplitude) {
        if (probeLength(maxQubits, maxHeapBytes, bytesPerAmplitude) > 0) {
            return Optional.empty();
        }
        final long full = Math.min(2L << maxQubits, MAX_PROBE_LENGTH);
        final long least = Math.min(full, MIN_PROBE_LENGTH);
        final long state = ReportRow.stateBytes(maxQubits, bytesPerAmplitude);
        final long needed = heapNeeded(maxQubits, full, bytesPerAmplitude);
        final long suggestGib = (needed + GIB - 1) / GIB + 1;
        final int single = Precision.SINGLE.bytesPerAmplitude();
        final String precision = bytesPerAmplitude == single ? "single" : "double";
        final String alternative = bytesPerAmplitude > single
                && probeLength(maxQubits, maxHeapBytes, single) > 0
                ? ", lower --max, or measure in single precision only (--precision single fits)"
                : ", or lower --max";
        return Optional.of("a " + maxQubits + "-qubit state in " + precision + " precision"
                + " needs " + formatBytes(state) + " (" + formatBytes(state + state / 8
                + HEAP_ROOM) + " with room for the collector) and the bandwidth probe 3 x "
                + formatBytes(8 * full) + " (3 x " + formatBytes(8 * least) + " at least), but"
                + " the maximum heap is " + formatBytes(maxHeapBytes) + "; rerun with java -Xmx"
                + suggestGib + "g" + alternative);
    }

    /** Formats a byte count in MiB below 1 GiB, else in GiB, one decimal. */
    static String formatBytes(long bytes) {
        if (bytes < GIB) {
            return String.format(Locale.ROOT, "%.1f MiB", (double) bytes / MIB);
        }
        return String.format(Locale.ROOT, "%.1f GiB", (double) bytes / GIB);
    }
}
