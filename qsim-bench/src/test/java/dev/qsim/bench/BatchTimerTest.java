package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.ArrayList;
import java.util.List;

import org.junit.jupiter.api.Test;

/** How one measurement is timed: repetitions and the doubling warm-up, on a fake clock. */
class BatchTimerTest {
    @Test
    void repetitionsCoverTheTargetWithMargin() {
        // Exact arithmetic: 100 reps in 1 ms is 1e4 ns each; 1.25 * 3e8 / 1e4 = 37500.
        assertEquals(37_500, BatchTimer.chooseRepetitions(100, 1_000_000, 300_000_000));
        // A pilot measured as 0 ns counts as 1 ns: ceil(1.25 * 10 / 1) = 13.
        assertEquals(13, BatchTimer.chooseRepetitions(1, 0, 10));
        // A slow pilot still gives one repetition.
        assertEquals(1, BatchTimer.chooseRepetitions(1, 5_000_000_000L, 300_000_000));
        // Capped.
        assertEquals(BatchTimer.MAX_REPETITIONS,
            BatchTimer.chooseRepetitions(1L << 40, 1, 1_000_000_000));
    }

    @Test
    void measureDoublesThenTimesOneLongBatch() {
        // A batch that "takes" 10 ns per repetition (a fake clock, exact arithmetic): doubling
        // from 1 stops at the first reps with 10 * reps >= 1000 / 3, i.e. 64 (640 ns); then
        // ceil(1.25 * 1000 / 10) = 125 repetitions, 1250 ns >= 1000, no retry.
        List<Long> calls = new ArrayList<>();
        BatchTimer.Timing t = BatchTimer.measure(reps -> {
            calls.add(reps);
            return 10 * reps;
        }, 1000);
        assertEquals(List.of(1L, 2L, 4L, 8L, 16L, 32L, 64L, 125L), calls);
        assertEquals(new BatchTimer.Timing(125, 1250), t);
        assertEquals(10.0, t.perRep(), 0.0);
    }
}
