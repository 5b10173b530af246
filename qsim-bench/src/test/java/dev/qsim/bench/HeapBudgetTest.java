package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Optional;
import org.junit.jupiter.api.Test;

/** The probe's length next to the largest state, and the heap check. */
class HeapBudgetTest {
    @Test
    void probeLengthFitsTheHeap() {
        long gib = 1L << 30;
        long mib = 1L << 20;
        // Exact arithmetic on heapNeeded = B * 2^max * 9 / 8 + 256 MiB + 3 * 8 * len:
        // 1024 + 128 + 256 + 3072 MiB.
        assertEquals(4480 * mib, HeapBudget.heapNeeded(26, 1L << 27, 16));
        // n = 24: 256 + 32 + 256 + 3 * 256 MiB fit in 4 GiB, full length 2^25.
        assertEquals(1L << 25, HeapBudget.probeLength(24, 4 * gib, 16));
        // n = 26 in 4 GiB: 1408 + 3072 MiB is too much; 1408 + 1536 fits.
        assertEquals(1L << 26, HeapBudget.probeLength(26, 4 * gib, 16));
        // In 2 GiB: 1408 + 768 does not fit, 1408 + 384 does, and 2^24 is the floor.
        assertEquals(1L << 24, HeapBudget.probeLength(26, 2 * gib, 16));
        assertEquals(1L << 24, HeapBudget.probeLength(26, 1792 * mib, 16));
        assertEquals(-1, HeapBudget.probeLength(26, 1791 * mib, 16));
        // Single precision needs half the state (8 bytes per amplitude, IEEE 754-2019 sec. 3.6:
        // two 4-byte floats): 512 + 64 + 256 + 384 MiB.
        assertEquals(1216 * mib, HeapBudget.heapNeeded(26, 1L << 24, 8));
        assertEquals(1L << 24, HeapBudget.probeLength(26, 1216 * mib, 8));
        assertEquals(-1, HeapBudget.probeLength(26, 1215 * mib, 8));
        // Small states are never shortened: 2^11 doubles at n = 10; the 256 MiB of room do not
        // fit in a 256 MiB heap next to the state.
        assertEquals(1L << 11, HeapBudget.probeLength(10, 512 * mib, 16));
        assertEquals(-1, HeapBudget.probeLength(10, 256 * mib, 16));
    }

    @Test
    void heapCheck() {
        assertEquals(Optional.empty(), HeapBudget.heapProblem(24, 4L << 30, 16));
        // 16 * 2^26 B = 1 GiB; with an eighth and 256 MiB, 1408 MiB; probe 3 x 1 GiB; 4480 MiB
        // round up to 5 GiB, plus 1 GiB of room. In 1.5 GiB even the shortest probe (384 MiB)
        // does not fit beside 1408 MiB, but single precision (1216 MiB, see above) does.
        String message = HeapBudget.heapProblem(26, 3L << 29, 16).orElseThrow();
        assertAll(
            () -> assertTrue(message.contains("a 26-qubit state in double precision needs 1.0"
                + " GiB"), message),
            () -> assertTrue(message.contains("1.4 GiB with room for the collector"), message),
            () -> assertTrue(message.contains("the bandwidth probe 3 x 1.0 GiB (3 x 128.0 MiB"
                + " at least)"), message),
            () -> assertTrue(message.contains("maximum heap is 1.5 GiB"), message),
            () -> assertTrue(message.contains("-Xmx6g"), message),
            () -> assertTrue(message.contains("--precision single fits"), message));
        // In 1 GiB single precision does not fit either, and is not offered.
        String small = HeapBudget.heapProblem(26, 1L << 30, 16).orElseThrow();
        assertTrue(small.endsWith("-Xmx6g, or lower --max"), small);
    }

    @Test
    void singlePrecisionReaches31QubitsIn20GiB() {
        long heap = 20L << 30;
        // 31 qubits: 2^31 amplitudes of 8 bytes are 16 GiB in single precision, of 16 bytes
        // 32 GiB in double (IEEE 754-2019, sec. 3.6: binary32 is 4 bytes, binary64 8).
        // Single: 16384 + 2048 + 256 = 18688 MiB leaves 1792 MiB, room for 3 x 512 MiB probes.
        assertEquals(1L << 26, HeapBudget.probeLength(31, heap, 8));
        assertEquals(Optional.empty(), HeapBudget.heapProblem(31, heap, 8));
        String message = HeapBudget.heapProblem(31, heap, 16).orElseThrow();
        assertTrue(message.startsWith("a 31-qubit state in double precision needs 32.0 GiB"),
            message);
        assertTrue(message.contains("--precision single fits"), message);
    }
}
