package dev.qsim.examples.cli;

import java.io.PrintWriter;
import java.util.Locale;
import java.util.Objects;
import java.util.function.LongSupplier;

/**
 * Progress of a long run on standard error, shared by the command-line tool and the scaling
 * report of {@code qsim-bench}.
 *
 * <p>Two things are written. The <em>bar</em> is a single line redrawn in place with carriage
 * returns, drawn only when asked to (the factories of the tool draw it only when the JVM has a
 * console, so nothing reaches a pipe or a file): with a known total it reads
 * {@code label [#######---------------------] 7/28 0:01:05  what}, the steps done against the
 * total, the elapsed time (hours, minutes, seconds) and what is being worked on now; without a
 * total it reads {@code label ... 1.2 s}, redrawn four times a second once the run has lasted a
 * second. The <em>lines</em> given to {@link #done(String)} and {@link #note(String)} are always
 * printed, each on its own line after the bar is wiped, so a log reads the same with or without
 * a console.
 *
 * <p>The methods are synchronized: the bar of an unknown total is redrawn from a daemon thread.
 * {@link #close()} stops it and wipes the bar.
 */
public final class Progress implements AutoCloseable {
    /** Width of the bar between its brackets, in characters. */
    static final int BAR = 28;
    private static final long QUIET_NANOS = 1_000_000_000L;
    private static final long TICK_MILLIS = 250;

    private final PrintWriter err;
    private final String label;
    private final int total;
    private final boolean draw;
    private final LongSupplier clock;
    private final long start;
    private final Thread ticker;
    private int done;
    private int drawn;
    private String what = "";
    private boolean closed;
    private volatile double expectedSeconds;

    /**
     * Makes a progress display.
     *
     * @param err where the bar and the lines go
     * @param label the text before the bar; may be empty
     * @param total the number of steps, or 0 or less when it is not known
     * @param draw whether to draw the bar at all
     * @param clock the time in nanoseconds, as {@link System#nanoTime()} gives it
     */
    Progress(PrintWriter err, String label, int total, boolean draw, LongSupplier clock) {
        this.err = Objects.requireNonNull(err, "err");
        this.label = Objects.requireNonNull(label, "label");
        this.total = Math.max(0, total);
        this.draw = draw;
        this.clock = Objects.requireNonNull(clock, "clock");
        this.start = clock.getAsLong();
        if (draw && this.total == 0) {
            ticker = new Thread(this::tick, "progress");
            ticker.setDaemon(true);
            ticker.start();
        } else {
            ticker = null;
        }
    }

    /**
     * Starts a progress line of unknown length, drawn only when the JVM has a console: the
     * elapsed time once the run has lasted a second.
     *
     * @param err where the line goes
     * @param label what is running, e.g. {@code "comparing"}
     * @return the running display; close it when the work is done
     */
    public static Progress start(PrintWriter err, String label) {
        return new Progress(err, label, 0, System.console() != null, System::nanoTime);
    }

    /**
     * Starts a line of unknown length with a predicted duration, drawn only when the JVM has a
     * console: a bar of the elapsed share of the prediction and the predicted time left.
     *
     * @param err where the line goes
     * @param label what is running
     * @param seconds the predicted wall time
     * @return the running display; close it when the work is done
     */
    public static Progress forecast(PrintWriter err, String label, double seconds) {
        Progress p = new Progress(err, label, 0, System.console() != null, System::nanoTime);
        p.expectedSeconds = seconds;
        return p;
    }

    /**
     * The text of a line with a predicted duration after {@code elapsed} seconds, such as
     * {@code "running [#####-------] 2.0 s, about 6.1 s left (predicted)"}.
     *
     * @param label the label
     * @param elapsed seconds so far
     * @param expected predicted seconds in all
     * @return the text
     */
    static String forecastLine(String label, double elapsed, double expected) {
        double share = Math.min(1, elapsed / Math.max(expected, 1e-9));
        int filled = (int) (BAR * share);
        String left = elapsed <= expected ? String.format(Locale.ROOT, "about %.1f s left"
                + " (predicted)", expected - elapsed) : String.format(Locale.ROOT, "%.1f s over"
                + " the predicted %.1f s", elapsed - expected, expected);
        return label + " [" + "#".repeat(filled) + "-".repeat(BAR - filled) + "] "
                + String.format(Locale.ROOT, "%.1f s, ", elapsed) + left;
    }

    /**
     * Starts a bar of {@code total} steps, drawn only when the JVM has a console.
     *
     * @param err where the bar goes
     * @param label what is running, e.g. {@code "timing"}
     * @param total the number of steps, at least 1 for a bar
     * @return the running display; call {@link #step()} per step and close it at the end
     */
    public static Progress start(PrintWriter err, String label, int total) {
        return new Progress(err, label, total, System.console() != null, System::nanoTime);
    }

    /**
     * Starts a bar of {@code total} steps with the bar drawn or not as the caller decides, for a
     * program that prints a line per finished step ({@link #done(String)}) whether or not the
     * bar is drawn.
     *
     * @param err where the bar and the lines go
     * @param label the text before the bar; may be empty
     * @param total the number of steps
     * @param draw whether to draw the bar (typically: whether the JVM has a console)
     * @return the running display; close it at the end
     */
    public static Progress of(PrintWriter err, String label, int total, boolean draw) {
        return new Progress(err, label, total, draw, System::nanoTime);
    }

    /** Marks one step done and redraws the bar. */
    public synchronized void step() {
        done++;
        redraw();
    }

    /**
     * Redraws the bar with what is being worked on now; the count of steps is unchanged.
     *
     * @param now a short description, e.g. {@code "n=20 dense mid"}
     */
    public synchronized void show(String now) {
        what = Objects.requireNonNull(now, "now");
        redraw();
    }

    /**
     * Marks one step done and prints its line, followed by {@code (elapsed h:mm:ss)}, above the
     * bar. The bar is drawn again at the next {@link #show(String)} or {@link #step()}.
     *
     * @param line what the finished step found, without a line break
     */
    public synchronized void done(String line) {
        done++;
        note(line + " (elapsed " + elapsed() + ")");
    }

    /**
     * Prints a line above the bar as it is, without counting a step.
     *
     * @param line the text, without a line break
     */
    public synchronized void note(String line) {
        wipe();
        err.println(line);
        err.flush();
    }

    /**
     * Returns the steps done so far.
     *
     * @return the count of {@link #step()} and {@link #done(String)} calls
     */
    public synchronized int stepsDone() {
        return done;
    }

    /**
     * Returns the time since the display was made, as {@code h:mm:ss}.
     *
     * @return the elapsed time, e.g. {@code 0:01:05}
     */
    public String elapsed() {
        final long s = (clock.getAsLong() - start) / 1_000_000_000L;
        return String.format(Locale.ROOT, "%d:%02d:%02d", s / 3600, s / 60 % 60, s % 60);
    }

    /** Stops the display and wipes the bar; the lines printed stay. */
    @Override
    public synchronized void close() {
        closed = true;
        if (ticker != null) {
            ticker.interrupt();
        }
        wipe();
    }

    private void tick() {
        try {
            while (!Thread.currentThread().isInterrupted()) {
                Thread.sleep(TICK_MILLIS);
                final long elapsed = clock.getAsLong() - start;
                if (elapsed > QUIET_NANOS) {
                    synchronized (this) {
                        paint(expectedSeconds > 0 ? forecastLine(label, elapsed / 1e9,
                                expectedSeconds) : String.format(Locale.ROOT, "%s ... %.1f s",
                                label, elapsed / 1e9));
                    }
                }
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    /** Draws the bar of a known total. */
    private void redraw() {
        if (total == 0) {
            return;
        }
        final int filled = (int) ((long) BAR * Math.min(done, total) / total);
        paint((label.isEmpty() ? "" : label + " ") + "[" + "#".repeat(filled)
                + "-".repeat(BAR - filled) + "] " + done + "/" + total + " " + elapsed()
                + (what.isEmpty() ? "" : "  " + what));
    }

    /** Writes the bar over the previous one, padded to cover a longer previous text. */
    private void paint(String text) {
        if (!draw || closed) {
            return;
        }
        err.print("\r" + text + " ".repeat(Math.max(0, drawn - text.length())));
        err.flush();
        drawn = text.length();
    }

    private void wipe() {
        if (drawn > 0) {
            err.print("\r" + " ".repeat(drawn) + "\r");
            err.flush();
            drawn = 0;
        }
    }
}
