package dev.qsim.kernel;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicIntegerArray;

import org.junit.jupiter.api.Test;

/**
 * {@link Parallel#forRange}: every index of the range is visited exactly once, in the pieces the
 * documentation promises, whatever the thread count, when calls overlap or nest, and a worker's
 * failure reaches the caller (common practice for a fork-join helper).
 */
class ParallelTest {
    private static AtomicIntegerArray visit(int threads, int total) {
        AtomicIntegerArray seen = new AtomicIntegerArray(total);
        Parallel.forRange(threads, total, true, (from, to) -> {
            for (long i = from; i < to; i++) {
                seen.incrementAndGet((int) i);
            }
        });
        return seen;
    }

    @Test
    void everyIndexOnceForAnyThreadCount() {
        for (int threads = 1; threads <= 5; threads++) {
            for (int total : new int[] {1, 2, 3, 7, 1000}) {
                for (int rep = 0; rep < 20; rep++) {
                    AtomicIntegerArray seen = visit(threads, total);
                    for (int i = 0; i < total; i++) {
                        assertEquals(1, seen.get(i), "threads " + threads + " total " + total
                                + " index " + i);
                    }
                }
            }
        }
    }

    @Test
    void overlappingAndNestedCallsStillVisitEveryIndexOnce() throws InterruptedException {
        List<Thread> callers = new ArrayList<>();
        List<Throwable> failures = new ArrayList<>();
        for (int c = 0; c < 4; c++) {
            Thread t = new Thread(() -> {
                for (int rep = 0; rep < 50; rep++) {
                    AtomicIntegerArray outer = new AtomicIntegerArray(64);
                    Parallel.forRange(3, 8, true, (from, to) -> {
                        for (long i = from; i < to; i++) {
                            final long block = i;
                            // A nested call from inside a piece goes to the plain pool.
                            Parallel.forRange(2, 8, true, (f, e) -> {
                                for (long j = f; j < e; j++) {
                                    outer.incrementAndGet((int) (block * 8 + j));
                                }
                            });
                        }
                    });
                    for (int i = 0; i < 64; i++) {
                        if (outer.get(i) != 1) {
                            synchronized (failures) {
                                failures.add(new AssertionError("index " + i + " seen "
                                        + outer.get(i) + " times"));
                            }
                        }
                    }
                }
            });
            callers.add(t);
            t.start();
        }
        for (Thread t : callers) {
            t.join();
        }
        assertEquals(List.of(), failures);
    }

    @Test
    void aFailureInAWorkerPieceReachesTheCaller() {
        IllegalStateException boom = new IllegalStateException("piece failed");
        IllegalStateException thrown = assertThrows(IllegalStateException.class,
                () -> Parallel.forRange(3, 3, true, (from, to) -> {
                    if (from == 2) {
                        throw boom;
                    }
                }));
        assertSame(boom, thrown);
        // The team still works after a failure.
        AtomicIntegerArray seen = visit(3, 30);
        for (int i = 0; i < 30; i++) {
            assertEquals(1, seen.get(i));
        }
    }
}
