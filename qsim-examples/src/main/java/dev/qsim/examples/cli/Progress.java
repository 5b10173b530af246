package dev.qsim.examples.cli;

import java.io.PrintWriter;

/**
 * A progress line on standard error for long runs, drawn only when the JVM has a console (so
 * nothing is written when output is piped or redirected). Without a known total it shows the
 * elapsed time once a run passes one second; with a total it shows a bar of steps done.
 */
final class Progress implements AutoCloseable {
    private static final long QUIET_NANOS = 1_000_000_000L;
    private static final int BAR = 30;

    private final PrintWriter err;
    private final String label;
    private final int total;
    private final long start = System.nanoTime();
    private final Thread ticker;
    private int done;
    private boolean drawn;
    private boolean closed;

    private Progress(PrintWriter err, String label, int total, boolean active) {
        this.err = active ? err : null;
        this.label = label;
        this.total = total;
        if (active && total <= 0) {
            ticker = new Thread(this::tick, "progress");
            ticker.setDaemon(true);
            ticker.start();
        } else {
            ticker = null;
        }
    }

    /** A progress line of unknown length; inactive without a console. */
    static Progress start(PrintWriter err, String label) {
        return new Progress(err, label, 0, System.console() != null);
    }

    /** A progress bar of {@code total} steps; inactive without a console. */
    static Progress start(PrintWriter err, String label, int total) {
        return new Progress(err, label, total, System.console() != null);
    }

    private void tick() {
        try {
            while (!Thread.currentThread().isInterrupted()) {
                Thread.sleep(250);
                long elapsed = System.nanoTime() - start;
                if (elapsed > QUIET_NANOS) {
                    draw(Cli.f("%s ... %.1f s", label, elapsed / 1e9));
                }
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    /** Marks one step of a bar done. */
    synchronized void step() {
        if (err == null || total <= 0) {
            return;
        }
        done++;
        int filled = (int) ((long) BAR * done / total);
        draw(Cli.f("%s [%s%s] %d/%d", label, "#".repeat(filled), ".".repeat(BAR - filled), done,
                total));
    }

    private synchronized void draw(String text) {
        if (closed) {
            return;
        }
        err.print("\r" + text + "   ");
        err.flush();
        drawn = true;
    }

    /** Stops and erases the line. */
    @Override
    public synchronized void close() {
        closed = true;
        if (ticker != null) {
            ticker.interrupt();
        }
        if (err != null && drawn) {
            err.print("\r" + " ".repeat(BAR + label.length() + 30) + "\r");
            err.flush();
        }
    }
}
