package dev.qsim.bench;

import java.io.PrintStream;
import java.util.Arrays;
import java.util.Locale;

import dev.qsim.Circuit;
import dev.qsim.Precision;
import dev.qsim.Simulator;
import dev.qsim.StateVector;

/**
 * Times qsim in the units of the C reference kernel ({@code shared/ceiling/ceiling.c}), so the
 * two can be compared line by line: tab-separated {@code key=value} lines, {@code #} lines for
 * people. {@code qsim-bench/ceiling-compare.sh} runs both back to back.
 *
 * <ul>
 *   <li>{@code gates N REPS [THREADS] [double|single]}: the dense gate
 *       {@code rz(1.1) ry(0.3) rz(0.7)} (four complex entries, like the C kernel's general
 *       unitary) on every target of a seeded N-qubit product state, each applied REPS times as a
 *       prebuilt one-gate circuit ({@code StateVector.apply(Circuit)}); per target the median
 *       time, then a {@code test=gate_summary} line with the median, least and largest rate over
 *       the targets. A rate counts 32 bytes per amplitude per gate, as the C kernel does, in
 *       both precisions (a single-precision gate moves 16), so rates compare times.</li>
 *   <li>{@code circuit N RUNS [THREADS] [fused|unfused] [double|single]}: the 20-layer circuit
 *       of {@link Workloads#layeredCircuit} (a random rx, ry or rz on every qubit, then a CZ or
 *       CNOT ladder; {@code 20 (2N - 1)} gates) with {@code Simulator.stateAfter}, RUNS times;
 *       the median time of a run and per gate.</li>
 * </ul>
 *
 * <p>Before timing, every measurement runs once on a small state (so the JIT compiler has
 * compiled the loops), and once untimed on the real one. The first {@code #} line names the
 * loops in use ({@code Simulator.kernels()}): start the JVM with
 * {@code --add-modules jdk.incubator.vector} for the vector ones.
 */
public final class GateRate {
    /** Usage text. */
    static final String USAGE = String.join("\n",
            "usage: java [--add-modules jdk.incubator.vector] -cp qsim-bench.jar"
                    + " dev.qsim.bench.GateRate MODE ...",
            "  gates N REPS [THREADS] [double|single]       dense gate on every target",
            "  circuit N RUNS [THREADS] [fused|unfused] [double|single]   20-layer circuit",
            "N in [4, 30], REPS and RUNS in [1, 100000], THREADS in [1, 256] (default 1).",
            "Exit status: 0 done, 1 bad arguments.");

    /** Bytes a dense gate counts per amplitude, as the C reference kernel counts them. */
    static final double BYTES_PER_AMPLITUDE = 32;

    private GateRate() {
    }

    /**
     * Runs a mode; see the class comment and {@link #USAGE}.
     *
     * @param args the mode and its arguments
     */
    public static void main(String[] args) {
        int status = run(args, System.out, System.err);
        System.out.flush();
        if (status != 0) {
            System.exit(status);
        }
    }

    /** The parsed command line. */
    static final class Settings {
        String mode;
        int n;
        int reps;
        int threads = 1;
        boolean fused = true;
        Precision precision = Precision.DOUBLE;
    }

    static Settings parse(String[] args) {
        if (args.length < 3) {
            throw new IllegalArgumentException("expected a mode, N and a count; got "
                    + args.length + " argument(s)");
        }
        Settings s = new Settings();
        s.mode = args[0];
        if (!s.mode.equals("gates") && !s.mode.equals("circuit")) {
            throw new IllegalArgumentException("mode must be gates or circuit but was '"
                    + s.mode + "'");
        }
        s.n = integer(args[1], "N", 4, 30);
        s.reps = integer(args[2], s.mode.equals("gates") ? "REPS" : "RUNS", 1, 100_000);
        for (int i = 3; i < args.length; i++) {
            String a = args[i];
            if (a.equals("double") || a.equals("single")) {
                s.precision = Workloads.precision(a);
            } else if (s.mode.equals("circuit") && (a.equals("fused") || a.equals("unfused"))) {
                s.fused = a.equals("fused");
            } else if (i == 3) {
                s.threads = integer(a, "THREADS", 1, 256);
            } else {
                throw new IllegalArgumentException("argument '" + a + "' is not understood");
            }
        }
        return s;
    }

    private static int integer(String text, String name, int min, int max) {
        int v;
        try {
            v = Integer.parseInt(text);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException(name + " must be an integer but was '" + text
                    + "'", e);
        }
        if (v < min || v > max) {
            throw new IllegalArgumentException(name + " must be in [" + min + ", " + max
                    + "] but was " + v);
        }
        return v;
    }

    static int run(String[] args, PrintStream out, PrintStream err) {
        Settings s;
        try {
            s = parse(args);
        } catch (IllegalArgumentException e) {
            err.println("error: " + e.getMessage());
            err.println(USAGE);
            return 1;
        }
        out.println("# kernels: " + Simulator.kernels());
        out.println("# jdk=" + System.getProperty("java.vm.version") + " processors="
                + Runtime.getRuntime().availableProcessors());
        if (s.mode.equals("gates")) {
            gates(s, out);
        } else {
            circuit(s, out);
        }
        return 0;
    }

    /** Median time in seconds of each target's gate, warm-up first. */
    static double[] gateTimes(int n, int reps, int threads, Precision precision) {
        final StateVector state = Workloads.productState(n, Workloads.STATE_SEED, precision)
                .setThreads(threads);
        final Circuit[] gates = new Circuit[n];
        for (int t = 0; t < n; t++) {
            gates[t] = Circuit.builder(n).apply(Workloads.gate("dense"), t).build();
        }
        for (Circuit c : gates) {
            state.apply(c);
        }
        final double[] median = new double[n];
        final long[] times = new long[reps];
        for (int t = 0; t < n; t++) {
            for (int r = 0; r < reps; r++) {
                long t0 = System.nanoTime();
                state.apply(gates[t]);
                times[r] = System.nanoTime() - t0;
            }
            median[t] = median(times) * 1e-9;
        }
        return median;
    }

    private static void gates(Settings s, PrintStream out) {
        // Warm-up on a state of up to 18 qubits for at least a second: every path of the loops
        // compiled before timing, the threads' path too (it starts at 16 qubits). One round at
        // 14 qubits (16 ms) left the compiler at work during the timing, its threads taking a
        // processor from the team: two threads ran a 16-qubit gate at 0.96-1.42 times one (the
        // C kernel's two at 1.08-1.77), and at 1.9 times once warm.
        long warm = System.nanoTime();
        do {
            gateTimes(Math.min(s.n, 18), 50, s.threads, s.precision);
        } while (System.nanoTime() - warm < 1_000_000_000L);
        final double[] time = gateTimes(s.n, s.reps, s.threads, s.precision);
        final double amps = Math.pow(2, s.n);
        final double bytes = BYTES_PER_AMPLITUDE * amps;
        final String p = Workloads.precisionName(s.precision);
        final double[] gbs = new double[s.n];
        final double[] nspa = new double[s.n];
        for (int t = 0; t < s.n; t++) {
            gbs[t] = bytes / time[t] / 1e9;
            nspa[t] = time[t] / amps * 1e9;
            out.println(String.format(Locale.ROOT, "test=gate\timpl=qsim\tgate=u\tn=%d\tt=%d\t"
                    + "threads=%d\tprecision=%s\treps=%d\tmedian_s=%.9f\tns_per_amp=%.4f\t"
                    + "gbs=%.2f", s.n, t, s.threads, p, s.reps, time[t], nspa[t], gbs[t]));
        }
        double[] low = Arrays.copyOf(gbs, Math.min(3, s.n));
        double[] high = Arrays.copyOfRange(gbs, Math.min(3, s.n), s.n);
        double[] sorted = gbs.clone();
        Arrays.sort(sorted);
        out.println(String.format(Locale.ROOT, "test=gate_summary\timpl=qsim\tgate=u\tn=%d\t"
                + "threads=%d\tprecision=%s\treps=%d\tmedian_over_t_gbs=%.2f\t"
                + "min_over_t_gbs=%.2f\tmax_over_t_gbs=%.2f\tmedian_t_lt3_gbs=%.2f\t"
                + "median_t_ge3_gbs=%.2f\tmedian_over_t_ns_per_amp=%.4f", s.n, s.threads, p,
                s.reps, median(gbs), sorted[0], sorted[s.n - 1], median(low), median(high),
                median(nspa)));
        out.println(String.format(Locale.ROOT, "# n=%d threads=%d %s: u %.1f GB/s (%.3f ns/amp)"
                + " [median over targets of the median of %d reps]", s.n, s.threads, p,
                median(gbs), median(nspa), s.reps));
    }

    private static void circuit(Settings s, PrintStream out) {
        final Simulator sim = Simulator.seeded(1).withThreads(s.threads).withFusion(s.fused)
                .withPrecision(s.precision);
        final int warm = Math.min(s.n, 16);
        sim.stateAfter(Workloads.layeredCircuit(warm, Workloads.CIRCUIT_LAYERS,
                Workloads.CIRCUIT_SEED));
        final Circuit c = Workloads.layeredCircuit(s.n, Workloads.CIRCUIT_LAYERS,
                Workloads.CIRCUIT_SEED);
        sim.stateAfter(c);
        final long[] times = new long[s.reps];
        for (int r = 0; r < s.reps; r++) {
            long t0 = System.nanoTime();
            StateVector psi = sim.stateAfter(c);
            times[r] = System.nanoTime() - t0;
            if (psi.qubits() != s.n) {
                throw new IllegalStateException("the simulator returned a state of "
                        + psi.qubits() + " qubits");
            }
        }
        long[] sorted = times.clone();
        Arrays.sort(sorted);
        final double median = median(times) * 1e-9;
        out.println(String.format(Locale.ROOT, "test=circuit\timpl=qsim\tn=%d\tthreads=%d\t"
                + "layers=%d\tgates=%d\tfusion=%s\tprecision=%s\truns=%d\tmedian_s=%.4f\t"
                + "min_s=%.4f\tns_per_gate=%.1f", s.n, s.threads, Workloads.CIRCUIT_LAYERS,
                c.size(), s.fused ? "on" : "off", Workloads.precisionName(s.precision), s.reps,
                median, sorted[0] * 1e-9, median / c.size() * 1e9));
        out.println(String.format(Locale.ROOT, "# n=%d threads=%d circuit of %d gates: %.3f s"
                + " a run, %.2f ms a gate [median of %d runs]", s.n, s.threads, c.size(),
                median, median / c.size() * 1e3, s.reps));
    }

    static double median(long[] values) {
        long[] v = values.clone();
        Arrays.sort(v);
        int k = v.length;
        return (k & 1) == 1 ? v[k / 2] : 0.5 * (v[k / 2 - 1] + v[k / 2]);
    }

    static double median(double[] values) {
        if (values.length == 0) {
            return Double.NaN;
        }
        double[] v = values.clone();
        Arrays.sort(v);
        int k = v.length;
        return (k & 1) == 1 ? v[k / 2] : 0.5 * (v[k / 2 - 1] + v[k / 2]);
    }
}
