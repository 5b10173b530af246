package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import org.junit.jupiter.api.Test;

import dev.qsim.Precision;

/** The probe's length next to the largest state, and the core's word on the state itself. */
class HeapBudgetTest {
    private static final long GIB = 1L << 30;
    private static final long MIB = 1L << 20;

    @Test
    void probeLengthFitsTheBudget() {
        // Exact arithmetic on heapNeeded = B * 2^max * 9 / 8 + 256 MiB + 3 * 8 * len:
        // 1024 + 128 + 256 + 3072 MiB.
        assertEquals(4480 * MIB, HeapBudget.heapNeeded(26, 1L << 27, 16));
        // n = 24: 256 + 32 + 256 + 3 * 256 MiB fit in 4 GiB, full length 2^25.
        assertEquals(1L << 25, HeapBudget.probeLength(24, 4 * GIB, 16));
        // n = 26 in 4 GiB: 1408 + 3072 MiB is too much; 1408 + 1536 fits.
        assertEquals(1L << 26, HeapBudget.probeLength(26, 4 * GIB, 16));
        // In 2 GiB: 1408 + 768 does not fit, 1408 + 384 does, and 2^24 is the floor.
        assertEquals(1L << 24, HeapBudget.probeLength(26, 2 * GIB, 16));
        assertEquals(1L << 24, HeapBudget.probeLength(26, 1792 * MIB, 16));
        assertTrue(HeapBudget.roomy(26, 1L << 24, 1792 * MIB, 16));
        // One MiB less: the floor still, but without the room the report keeps (the core has
        // the last word on the state, see below).
        assertEquals(1L << 24, HeapBudget.probeLength(26, 1791 * MIB, 16));
        assertFalse(HeapBudget.roomy(26, 1L << 24, 1791 * MIB, 16));
        // Single precision needs half the state (8 bytes per amplitude, IEEE 754-2019 sec. 3.6:
        // two 4-byte floats): 512 + 64 + 256 + 384 MiB.
        assertEquals(1216 * MIB, HeapBudget.heapNeeded(26, 1L << 24, 8));
        assertTrue(HeapBudget.roomy(26, 1L << 24, 1216 * MIB, 8));
        assertFalse(HeapBudget.roomy(26, 1L << 24, 1215 * MIB, 8));
        // Small states get the floor too, 2^24 doubles (not the 2^11 of a 10-qubit state), so
        // the probe measures main memory and not a cache; 16 KiB + 2 KiB + 256 + 384 MiB fit in
        // 1 GiB, not in 512 MiB.
        assertEquals(1L << 24, HeapBudget.probeLength(10, 1024 * MIB, 16));
        assertTrue(HeapBudget.roomy(10, 1L << 24, 1024 * MIB, 16));
        assertEquals(1L << 24, HeapBudget.probeLength(10, 512 * MIB, 16));
        assertFalse(HeapBudget.roomy(10, 1L << 24, 512 * MIB, 16));
        // The longest arrays Java allows: 2^30 doubles from n = 30 up.
        assertEquals(1L << 30, HeapBudget.probeLength(32, 1L << 50, 16));
    }

    @Test
    void singlePrecisionReaches31QubitsIn20GiB() {
        long heap = 20 * GIB;
        // 31 qubits: 2^31 amplitudes of 8 bytes are 16 GiB in single precision, of 16 bytes
        // 32 GiB in double (IEEE 754-2019, sec. 3.6: binary32 is 4 bytes, binary64 8).
        // Single: 16384 + 2048 + 256 = 18688 MiB leaves 1792 MiB, room for 3 x 512 MiB probes.
        assertEquals(1L << 26, HeapBudget.probeLength(31, heap, 8));
        assertTrue(HeapBudget.roomy(31, 1L << 26, heap, 8));
        // Double: the state alone is more than the heap; the probe drops to its floor.
        assertEquals(1L << 24, HeapBudget.probeLength(31, heap, 16));
        assertFalse(HeapBudget.roomy(31, 1L << 24, heap, 16));
    }

    @Test
    void theCoresRefusalIsPassedOnWithTheReportsWaysOut() {
        List<String> asked = new ArrayList<>();
        String core = "a 31-qubit state needs 32.0 GiB (34359738368 bytes) but the maximum heap"
            + " is 20.0 GiB with 19.5 GiB free; raise the heap, e.g. -Xmx37g";
        // Refuses double precision, as the core does on that heap, and accepts single.
        HeapBudget.StateMaker doubleTooLarge = (n, p) -> {
            asked.add(n + " " + p);
            if (p == Precision.DOUBLE) {
                throw new IllegalStateException(core);
            }
        };
        assertEquals(Optional.of(core + "; or lower --max, or measure in single precision only"
            + " (--precision single fits)"),
            HeapBudget.largestStateRefused(31, Precision.DOUBLE, doubleTooLarge));
        assertEquals(List.of("31 DOUBLE", "31 SINGLE"), asked);

        // Refused in both precisions: single precision is not offered.
        HeapBudget.StateMaker bothTooLarge = (n, p) -> {
            throw new IllegalStateException(core);
        };
        assertEquals(Optional.of(core + "; or lower --max"),
            HeapBudget.largestStateRefused(31, Precision.DOUBLE, bothTooLarge));

        // A refused single-precision run is not asked about single precision again.
        asked.clear();
        HeapBudget.StateMaker singleTooLarge = (n, p) -> {
            asked.add(n + " " + p);
            throw new IllegalStateException(core);
        };
        assertEquals(Optional.of(core + "; or lower --max"),
            HeapBudget.largestStateRefused(31, Precision.SINGLE, singleTooLarge));
        assertEquals(List.of("31 SINGLE"), asked);

        // Accepted: nothing to say, and only the measured precision is made.
        asked.clear();
        assertEquals(Optional.empty(),
            HeapBudget.largestStateRefused(12, Precision.DOUBLE, (n, p) -> asked.add(n + " " + p)));
        assertEquals(List.of("12 DOUBLE"), asked);
    }

    @Test
    void theRealCoreAcceptsASmallStateAndRefusesAHugeOne() {
        assertEquals(Optional.empty(), HeapBudget.largestStateRefused(12, Precision.DOUBLE));
        // 2^40 amplitudes of 16 bytes (16 TiB) exceed any test heap; so do 8 TiB in single
        // precision, so that is not offered. The numbers are the core's.
        String message = HeapBudget.largestStateRefused(40, Precision.DOUBLE).orElseThrow();
        assertTrue(message.startsWith("a 40-qubit state"), message);
        assertTrue(message.contains("16384.0 GiB"), message);
        assertTrue(message.endsWith("; or lower --max"), message);
        Matcher xmx = Pattern.compile("-Xmx(\\d+)g").matcher(message);
        assertTrue(xmx.find(), message);
        assertTrue(Long.parseLong(xmx.group(1)) > 16384, message);
    }
}
