package dev.qsim;

import java.util.List;
import java.util.Locale;
import java.util.Objects;

/**
 * The predicted cost of a run, made without running it ({@link Simulator#forecast(Circuit,
 * int)}): the engine that would run, the wall time, the bytes held at the peak, the passes over
 * memory counted, which measured rates priced them, and cheaper settings that would apply.
 * Immutable and thread-safe.
 *
 * <p>How it is made: the engine's steps are counted as the engine would take them (after gate
 * fusion and cache blocking are planned by the run's own planner): passes over the state by
 * kind of kernel, the kernel work done on blocks in cache, copies, measurements, shots drawn,
 * trajectories. Each count is priced with this machine's rate for that kind at that state size
 * and thread count ({@link Calibration}). Bytes are the arrays the run holds at once (state,
 * copies, per-thread buffers, per-shot arrays) as the heap stores them, region-rounded under
 * G1. A shot-by-shot count takes conditioned blocks as taken and loops at their bound, so it
 * is an upper bound for such circuits.
 *
 * @since 0.1
 */
public final class RunCost {
    /**
     * A cheaper setting of the same run, with its own prediction.
     *
     * @param change the setting in words, such as {@code "withPrecision(SINGLE)"}
     * @param seconds the predicted wall time with it
     * @param bytes the predicted peak bytes with it
     * @param why what it trades, in words
     * @since 0.1
     */
    public record Alternative(String change, double seconds, long bytes, String why) {
        /**
         * Checks the fields.
         *
         * @param change the setting
         * @param seconds the time
         * @param bytes the bytes
         * @param why the trade
         */
        public Alternative {
            Objects.requireNonNull(change, "change");
            Objects.requireNonNull(why, "why");
        }
    }

    private final Simulator.Choice choice;
    private final Precision precision;
    private final int threads;
    private final int shots;
    private final long trajectories;
    private final double seconds;
    private final long bytes;
    private final double passes;
    private final String rates;
    private final List<String> work;
    private final List<String> held;
    private final List<Alternative> alternatives;

    RunCost(Simulator.Choice choice, Precision precision, int threads, int shots,
            long trajectories, double seconds, long bytes, double passes, String rates,
            List<String> work, List<String> held, List<Alternative> alternatives) {
        this.choice = choice;
        this.precision = precision;
        this.threads = threads;
        this.shots = shots;
        this.trajectories = trajectories;
        this.seconds = seconds;
        this.bytes = bytes;
        this.passes = passes;
        this.rates = rates;
        this.work = List.copyOf(work);
        this.held = List.copyOf(held);
        this.alternatives = List.copyOf(alternatives);
    }

    RunCost withAlternatives(List<Alternative> list) {
        return new RunCost(choice, precision, threads, shots, trajectories, seconds, bytes,
                passes, rates, work, held, list);
    }

    /**
     * Returns the engine that would run, never {@link Simulator.Engine#CHEAPEST}.
     *
     * @return the engine
     */
    public Simulator.Engine engine() {
        return choice.engine();
    }

    /**
     * Returns the engine choice with its reason, as {@link Simulator#explain} gives it.
     *
     * @return the choice
     */
    public Simulator.Choice choice() {
        return choice;
    }

    /**
     * Returns the storage precision of the run's state vectors.
     *
     * @return the precision
     */
    public Precision precision() {
        return precision;
    }

    /**
     * Returns the threads of the run.
     *
     * @return the threads
     */
    public int threads() {
        return threads;
    }

    /**
     * Returns the shots of the run.
     *
     * @return the shots
     */
    public int shots() {
        return shots;
    }

    /**
     * Returns the trajectories the run would simulate (0 unless the engine is
     * {@link Simulator.Engine#TRAJECTORIES}).
     *
     * @return the trajectories
     */
    public long trajectories() {
        return trajectories;
    }

    /**
     * Returns the predicted wall time of the run, in seconds, excluding JVM start and reading
     * the circuit.
     *
     * @return the seconds
     */
    public double seconds() {
        return seconds;
    }

    /**
     * Returns the predicted bytes the run holds at its peak on the heap.
     *
     * @return the bytes
     */
    public long bytes() {
        return bytes;
    }

    /**
     * Returns the passes over memory counted for the whole run (all shots and trajectories); a
     * cache-blocked group of gates is one pass. Expected counts (noise branches) may make it
     * fractional.
     *
     * @return the passes
     */
    public double passes() {
        return passes;
    }

    /**
     * Returns which rates priced the counts ({@link Calibration#describe()}).
     *
     * @return the description
     */
    public String rates() {
        return rates;
    }

    /**
     * Returns the counted work, a line per kind of pass with its count and time.
     *
     * @return the lines
     */
    public List<String> work() {
        return work;
    }

    /**
     * Returns what holds the bytes, in words.
     *
     * @return the items
     */
    public List<String> held() {
        return held;
    }

    /**
     * Returns the cheaper settings that apply, cheapest in time first; empty when none does.
     *
     * @return the alternatives
     */
    public List<Alternative> alternatives() {
        return alternatives;
    }

    /**
     * Returns a report of several lines: engine and why, settings, memory, time, work, rates
     * and cheaper settings.
     *
     * @return the report
     */
    public String report() {
        StringBuilder sb = new StringBuilder();
        sb.append("engine     ").append(choice).append('\n');
        sb.append("settings   ").append(precision.name().toLowerCase(Locale.ROOT))
                .append(" precision, ").append(threads).append(threads == 1 ? " thread, "
                        : " threads, ").append(shots).append(shots == 1 ? " shot" : " shots");
        if (trajectories > 0) {
            sb.append(" (").append(trajectories).append(" trajectories)");
        }
        sb.append('\n');
        sb.append("memory     ").append(bytesText(bytes)).append(" at the peak (")
                .append(String.join(", ", held)).append(")\n");
        sb.append("time       ").append(secondsText(seconds)).append('\n');
        sb.append("work       ").append(String.format(Locale.ROOT, "%.0f", passes))
                .append(" passes over memory\n");
        for (String w : work) {
            sb.append("             ").append(w).append('\n');
        }
        sb.append("rates      ").append(rates).append('\n');
        if (alternatives.isEmpty()) {
            sb.append("cheaper    none of single precision, the tableau, trajectories or fewer"
                    + " threads applies\n");
        }
        for (int i = 0; i < alternatives.size(); i++) {
            Alternative a = alternatives.get(i);
            sb.append(i == 0 ? "cheaper    " : "           ").append(a.change()).append(": ")
                    .append(secondsText(a.seconds())).append(", ").append(bytesText(a.bytes()))
                    .append(" (").append(a.why()).append(")\n");
        }
        return sb.toString();
    }

    /**
     * Formats bytes with a binary unit, such as {@code "4.0 GiB"}.
     *
     * @param b the bytes
     * @return the text
     */
    public static String bytesText(long b) {
        if (b >= 1L << 30) {
            return String.format(Locale.ROOT, "%.1f GiB", b / (double) (1L << 30));
        }
        if (b >= 1L << 20) {
            return String.format(Locale.ROOT, "%.1f MiB", b / (double) (1L << 20));
        }
        if (b >= 1L << 10) {
            return String.format(Locale.ROOT, "%.1f KiB", b / (double) (1L << 10));
        }
        return b + " bytes";
    }

    /**
     * Formats seconds with a suitable unit, such as {@code "12 ms"} or {@code "3 min 5 s"}.
     *
     * @param s the seconds
     * @return the text
     */
    public static String secondsText(double s) {
        if (s < 1e-3) {
            return String.format(Locale.ROOT, "%.0f µs", s * 1e6);
        }
        if (s < 1) {
            return String.format(Locale.ROOT, "%.0f ms", s * 1e3);
        }
        if (s < 60) {
            return String.format(Locale.ROOT, "%.1f s", s);
        }
        if (s < 3600) {
            return String.format(Locale.ROOT, "%d min %d s", (long) s / 60, (long) s % 60);
        }
        return String.format(Locale.ROOT, "%.1f h", s / 3600);
    }

    /**
     * Returns a one-line summary, such as {@code "AMPLITUDES: 1.2 s, 256.0 MiB"}.
     *
     * @return the text
     */
    @Override
    public String toString() {
        return choice.engine() + ": " + secondsText(seconds) + ", " + bytesText(bytes);
    }
}
