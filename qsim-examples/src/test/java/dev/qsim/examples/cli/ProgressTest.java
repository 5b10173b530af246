package dev.qsim.examples.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.concurrent.atomic.AtomicLong;

import org.junit.jupiter.api.Test;

/** The shared progress display, on a clock the test sets (no real waiting, no timing). */
class ProgressTest {
    private static final long SECOND = 1_000_000_000L;
    private static final String NL = System.lineSeparator();

    private final StringWriter text = new StringWriter();
    private final PrintWriter err = new PrintWriter(text);
    private final AtomicLong now = new AtomicLong(5 * SECOND);

    private Progress progress(String label, int total, boolean draw) {
        return new Progress(err, label, total, draw, now::get);
    }

    /** Returns what was written since the last call. */
    private String taken() {
        String s = text.toString();
        text.getBuffer().setLength(0);
        return s;
    }

    @Test
    void barShowsStepsDoneTotalElapsedAndTheCurrentWork() {
        Progress p = progress("", 4, true);
        p.show("n=3 probe copy");
        String first = "[" + "-".repeat(28) + "] 0/4 0:00:00  n=3 probe copy";
        assertEquals("\r" + first, taken());
        now.addAndGet(65 * SECOND);
        p.done("# n=3 probe copy: 1.000 GB/s");
        // The bar is wiped (as many blanks as it had characters), then the line is printed.
        assertEquals("\r" + " ".repeat(first.length()) + "\r"
                + "# n=3 probe copy: 1.000 GB/s (elapsed 0:01:05)" + NL, taken());
        assertEquals(1, p.stepsDone());
        p.show("n=3 dense low");
        // 1 of 4 steps: 28 / 4 = 7 filled.
        String second = "[" + "#".repeat(7) + "-".repeat(21) + "] 1/4 0:01:05  n=3 dense low";
        assertEquals("\r" + second, taken());
        p.close();
        assertEquals("\r" + " ".repeat(second.length()) + "\r", taken());
    }

    @Test
    void aShorterBarIsPaddedToCoverTheLongerOneBeforeIt() {
        Progress p = progress("", 2, true);
        p.show("a long description");
        taken();
        p.show("short");
        String bar = "[" + "-".repeat(28) + "] 0/2 0:00:00  ";
        // 13 blanks: the length of "a long description" less that of "short".
        assertEquals("\r" + bar + "short" + " ".repeat(13), taken());
    }

    @Test
    void theToolsLabelledBarAdvancesWithEachStep() {
        Progress p = progress("timing", 3, true);
        p.step();
        assertEquals("\rtiming [" + "#".repeat(9) + "-".repeat(19) + "] 1/3 0:00:00", taken());
        p.step();
        p.step();
        assertEquals("\rtiming [" + "#".repeat(18) + "-".repeat(10) + "] 2/3 0:00:00"
                + "\rtiming [" + "#".repeat(28) + "] 3/3 0:00:00", taken());
        assertEquals(3, p.stepsDone());
    }

    @Test
    void withoutTheBarOnlyTheLinesAreWritten() {
        Progress p = progress("", 3, false);
        p.show("n=4 dense low");
        p.step();
        assertEquals("", taken());
        now.addAndGet(3723 * SECOND);
        p.done("# step two");
        p.note("# a comment");
        p.close();
        assertEquals("# step two (elapsed 1:02:03)" + NL + "# a comment" + NL, taken());
        assertEquals(2, p.stepsDone());
    }

    @Test
    void notesDoNotCountAndNothingIsDrawnAfterClose() {
        Progress p = progress("", 2, true);
        p.note("# first");
        assertEquals("# first" + NL, taken());
        assertEquals(0, p.stepsDone());
        p.close();
        p.show("late");
        p.step();
        assertEquals("", taken());
        // Closing twice is harmless.
        p.close();
        assertEquals("", taken());
    }

    @Test
    void anUnknownTotalDrawsNoBarForSteps() {
        // Not drawn (no console): no ticker, and steps of an unknown total draw nothing.
        Progress p = progress("comparing", 0, false);
        p.step();
        p.show("x");
        p.close();
        assertEquals("", taken());
        assertEquals("0:00:00", p.elapsed());
    }
}
