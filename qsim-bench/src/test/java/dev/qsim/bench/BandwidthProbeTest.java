package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/** Tests of the memory-bandwidth probe: byte counts and what the kernels compute. */
class BandwidthProbeTest {

    @ParameterizedTest
    @CsvSource({"1", "1000", "2097152"})
    void bytesMovedFollowMcCalpin(long len) {
        // McCalpin (1995), STREAM's table of kernels: copy counts 16 bytes per iteration (one
        // 8-byte read, one write), triad 24 (two reads, one write).
        assertEquals(16 * len, BandwidthProbe.copyBytes(len));
        assertEquals(24 * len, BandwidthProbe.triadBytes(len));
    }

    @ParameterizedTest
    @CsvSource({
        // capacity, length, threads: below and above the split threshold 2^15
        "100,   77,    2",
        "70000, 65536, 2",
        "70000, 65531, 3",
        "70000, 65536, 1",
    })
    void copyAndTriadTouchExactlyTheirRange(int capacity, int len, int threads) {
        try (BandwidthProbe probe = new BandwidthProbe(capacity, threads)) {
            // Start a = 1, b = 2, c = 0.5, s = 3 (exact binary fractions, exact sums):
            // triad a = 2 + 1.5 = 3.5; copy b = 3.5; triad a = 3.5 + 1.5 = 5.
            assertTrue(probe.timeTriad(len, 1) >= 0);
            assertTrue(probe.timeCopy(len, 1) >= 0);
            assertTrue(probe.timeTriad(len, 1) >= 0);
            for (int i = 0; i < capacity; i++) {
                double expected = i < len ? 5.0 : 1.0;
                if (probe.sample(i) != expected) {
                    assertEquals(expected, probe.sample(i), "element " + i + " of " + len
                        + " with " + threads + " threads");
                }
            }
        }
    }

    @ParameterizedTest
    @CsvSource({
        // capacity, vector qubits, length: the state's doubles 2^(n+1), but at least 2^24
        // (beyond the caches, McCalpin 1995), at most the capacity
        "16777216, 4, 16777216",
        "16777216, 23, 16777216",
        "33554432, 24, 33554432",
        "67108864, 24, 33554432",
        "1000, 4, 1000",
        "16777216, 62, 16777216",
    })
    void lengthRunsBeyondTheCachesWithinTheCapacity(long capacity, int qubits, long length) {
        // Only the length arithmetic: a probe of 2^24 doubles would allocate 384 MiB.
        assertEquals(length, BandwidthProbe.lengthFor(qubits, capacity));
    }

    @ParameterizedTest
    @CsvSource({"0", "11"})
    void lengthOutOfRangeIsNamed(int len) {
        try (BandwidthProbe probe = new BandwidthProbe(10, 1)) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> probe.timeCopy(len, 1));
            assertEquals("probe length " + len + " is out of range [1, 10]", e.getMessage());
        }
    }
}
