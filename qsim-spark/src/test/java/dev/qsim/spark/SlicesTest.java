package dev.qsim.spark;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.math.BigInteger;
import java.util.List;

import org.junit.jupiter.api.Test;

/**
 * Slices of item indices: contiguous, covering, the same cut as Spark's own
 * {@code parallelize} (positions {@code floor(k n / p)}: common practice, and the rule of
 * Spark's ParallelCollectionRDD.slice), and the partitioner agrees with them.
 */
class SlicesTest {
    @Test
    void slicesCoverTheIndicesInOrderAtFloorKnOverP() {
        for (long n : new long[] {1, 5, 7, 100, 1_000_003, (1L << 31) - 1}) {
            for (int p : new int[] {1, 2, 4, 7, 64}) {
                List<long[]> s = Slices.of(n, p);
                assertEquals(p, s.size());
                long next = 0;
                for (int k = 0; k < p; k++) {
                    assertEquals(next, s.get(k)[0]);
                    long end = BigInteger.valueOf(n).multiply(BigInteger.valueOf(k + 1))
                            .divide(BigInteger.valueOf(p)).longValueExact();
                    assertEquals(end, s.get(k)[1], "n " + n + " p " + p + " k " + k);
                    next = s.get(k)[1];
                }
                assertEquals(n, next);
            }
        }
    }

    @Test
    void thePartitionerSendsEachIndexToItsSlice() {
        for (long n : new long[] {1, 5, 7, 100, 1003}) {
            for (int p : new int[] {1, 2, 4, 7, 13}) {
                Slices.ByIndex by = new Slices.ByIndex(n, p);
                List<long[]> s = Slices.of(n, p);
                for (int k = 0; k < p; k++) {
                    for (long i = s.get(k)[0]; i < s.get(k)[1]; i++) {
                        assertEquals(k, by.getPartition(i), "n " + n + " p " + p + " i " + i);
                    }
                }
            }
        }
    }

    @Test
    void theDefaultIsThreeTasksPerCoreAndAtMostOnePerItem() {
        // "2-3 tasks per CPU core" (Apache Spark documentation, "Tuning Spark", Level of
        // Parallelism): three per core, never an empty partition, never none.
        assertEquals(6, Slices.defaultPartitions(2, 200));
        assertEquals(3, Slices.defaultPartitions(2, 3));
        assertEquals(1, Slices.defaultPartitions(2, 1));
        assertEquals(1, Slices.defaultPartitions(0, 0));
        assertEquals(3, Slices.defaultPartitions(1, 1_000_000));
        assertEquals(Slices.MAX_PARTITIONS, Slices.defaultPartitions(Integer.MAX_VALUE,
                Long.MAX_VALUE));
    }

    @Test
    void settingsOutOfRangeAreRefusedByValue() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Slices.requirePartitions(Slices.MAX_PARTITIONS + 1));
        assertTrue(e.getMessage().contains(Integer.toString(Slices.MAX_PARTITIONS + 1)));
        e = assertThrows(IllegalArgumentException.class, () -> Slices.requireThreads(257));
        assertTrue(e.getMessage().contains("257"));
    }
}
