package dev.qsim.bench;

import java.util.Locale;
import java.util.Optional;

import dev.qsim.Precision;
import dev.qsim.StateVector;

/**
 * How the scaling report fits in the heap. Two questions, answered in this order before
 * anything is measured:
 *
 * <ol>
 *   <li>How long can the bandwidth probe's arrays be? The report's own budget: the largest
 *       state, an eighth of it and {@link #HEAP_ROOM} are kept free, and the probe gets the
 *       longest power of two that fits beside them ({@link #probeLength}), never shorter than
 *       {@link #MIN_PROBE_LENGTH}.</li>
 *   <li>Can the heap hold the largest state next to that probe? The core answers: it checks the
 *       heap whenever a state is allocated and refuses one that does not fit with an
 *       {@link IllegalStateException} naming the bytes needed, the maximum heap and the
 *       {@code -Xmx} that would do. {@link #largestStateRefused} allocates the largest state
 *       once through the public API and passes that message on; the report computes no
 *       {@code -Xmx} of its own.</li>
 * </ol>
 */
final class HeapBudget {
    /**
     * The probe arrays are never shorter than this many doubles (128 MiB each, three times
     * that in all), whatever the sizes measured or the heap: McCalpin asks for arrays well
     * beyond the last-level cache, and shorter arrays measure a cache (at 13 qubits, 2^14
     * doubles, the copy ran 25 times faster than at 14, where it also met the threads' cost).
     */
    static final long MIN_PROBE_LENGTH = 1L << 24;

    /** Longest probe array: 2^30 doubles (8 GiB), within Java's array limit. */
    static final long MAX_PROBE_LENGTH = 1L << 30;

    /**
     * Heap kept free beside the largest state and an eighth of it when the probe is sized: for
     * the small objects of a run (circuits, fused matrices, scratch windows) and for the gaps the
     * collector leaves between the large arrays of the state and the probe. The eighth covers
     * what the collector loses placing a state's large chunks in its regions.
     */
    static final long HEAP_ROOM = 256L << 20;

    private static final long GIB = 1L << 30;
    private static final long MIB = 1L << 20;

    private HeapBudget() {
    }

    /** Allocates a state as the report's runs would; the core's heap check comes first. */
    @FunctionalInterface
    interface StateMaker {
        /**
         * Allocates an {@code n}-qubit state in the given precision and drops it.
         *
         * @throws IllegalStateException from the core if the heap cannot hold it
         */
        void make(int n, Precision precision);
    }

    /**
     * The heap the report budgets for at {@code --max maxQubits} with amplitudes of
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
     * double-precision state), at least {@link #MIN_PROBE_LENGTH} and at most
     * {@link #MAX_PROBE_LENGTH}; if the budget of {@link #heapNeeded} does not fit in
     * {@code maxHeapBytes} with that, the longest power of two that fits, but never below
     * {@link #MIN_PROBE_LENGTH} (whether the state then fits is the core's to say, see
     * {@link #largestStateRefused}).
     */
    static long probeLength(int maxQubits, long maxHeapBytes, int bytesPerAmplitude) {
        final long full = Math.max(Math.min(2L << maxQubits, MAX_PROBE_LENGTH),
                MIN_PROBE_LENGTH);
        final long least = MIN_PROBE_LENGTH;
        long len = full;
        while (len > least && heapNeeded(maxQubits, len, bytesPerAmplitude) > maxHeapBytes) {
            len >>= 1;
        }
        return len;
    }

    /**
     * Whether the budget of {@link #heapNeeded} fits in {@code maxHeapBytes} with probe arrays
     * of {@code probeLength} doubles; when it does not, the report still runs if the core
     * accepts the largest state, with less room than it would like.
     */
    static boolean roomy(int maxQubits, long probeLength, long maxHeapBytes,
            int bytesPerAmplitude) {
        return heapNeeded(maxQubits, probeLength, bytesPerAmplitude) <= maxHeapBytes;
    }

    /**
     * Asks the core whether the heap, as it is now (the probe allocated), holds the largest
     * state: allocates it once with {@link StateVector#zero(int, Precision)} and drops it.
     *
     * @param maxQubits the largest qubit count measured
     * @param precision the widest precision measured
     * @return empty if the core accepted the state; otherwise the core's message, which names
     *     the bytes needed, the maximum heap and the {@code -Xmx} that would do, followed by the
     *     report's other ways out
     */
    static Optional<String> largestStateRefused(int maxQubits, Precision precision) {
        return largestStateRefused(maxQubits, precision, StateVector::zero);
    }

    /**
     * As {@link #largestStateRefused(int, Precision)}, allocating with {@code maker}. When a
     * double-precision state is refused, a single-precision one of the same size is tried the
     * same way, and if the core accepts it the message says {@code --precision single} fits.
     */
    static Optional<String> largestStateRefused(int maxQubits, Precision precision,
            StateMaker maker) {
        try {
            maker.make(maxQubits, precision);
            return Optional.empty();
        } catch (IllegalStateException refused) {
            final String others;
            if (precision != Precision.SINGLE && accepts(maker, maxQubits, Precision.SINGLE)) {
                others = "; or lower --max, or measure in single precision only (--precision"
                        + " single fits)";
            } else {
                others = "; or lower --max";
            }
            return Optional.of(refused.getMessage() + others);
        }
    }

    private static boolean accepts(StateMaker maker, int n, Precision precision) {
        try {
            maker.make(n, precision);
            return true;
        } catch (IllegalStateException e) {
            return false;
        }
    }

    /** Formats a byte count in MiB below 1 GiB, else in GiB, one decimal. */
    static String formatBytes(long bytes) {
        if (bytes < GIB) {
            return String.format(Locale.ROOT, "%.1f MiB", (double) bytes / MIB);
        }
        return String.format(Locale.ROOT, "%.1f GiB", (double) bytes / GIB);
    }
}
