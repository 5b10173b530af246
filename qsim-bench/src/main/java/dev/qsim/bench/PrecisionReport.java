package dev.qsim.bench;

import java.io.PrintStream;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.Circuit;
import dev.qsim.Precision;
import dev.qsim.StateVector;

/**
 * Measures how far single-precision storage drifts from double precision on a random circuit:
 * the same seeded gates are applied to a double and a single-precision state one gate at a time
 * (so the single state is rounded to {@code float} after every gate, the worst case), and at
 * 10, 100, 1,000 ... gates and at the end it prints the norm drift {@code |‖ψ‖ - 1|} of both,
 * the infidelity of the directions, {@code 1 - |<ψ_d|ψ_s>|² / (‖ψ_d‖² ‖ψ_s‖²)}, and the largest
 * amplitude difference.
 * Then the whole circuit is applied at once to a fresh single state (gates grouped into windows,
 * rounded once per group) and compared in the same way.
 *
 * <p>Gates: with probability 0.6 a rotation rx, ry or rz by a uniform angle in [0, 2π) or H on a
 * uniform qubit, else CNOT or CZ on a uniform ordered pair of distinct qubits.
 *
 * <p>Rounding to nearest perturbs each stored part by at most the unit roundoff
 * {@code u = 2^-24} relative (N. J. Higham, <i>Accuracy and Stability of Numerical
 * Algorithms</i>, 2nd ed., SIAM 2002, §2.1, Theorem 2.2), so the norm after {@code G} rounded
 * gates is within {@code (1 + u)^G - 1 ≈ G u} of 1; round-to-nearest errors of random sign
 * usually grow like {@code sqrt(G) u} instead (ibid., §2.8).
 */
public final class PrecisionReport {
    /** Usage text. */
    static final String USAGE = String.join("\n",
            "usage: java -cp qsim-bench.jar dev.qsim.bench.PrecisionReport [options]",
            "Applies the same random gates to a double- and a single-precision state and prints",
            "norm drift, infidelity and largest amplitude difference as the gates add up.",
            "  --qubits N    qubits (default 20; 2..26)",
            "  --gates G     gates (default 10000; 1..10000000)",
            "  --seed S      seed of the random circuit (default 20261202)",
            "  --threads T   kernel threads (default: available processors; 1..256)",
            "  --help        print this and exit",
            "Exit status: 0 done, 1 bad options.");

    private PrecisionReport() {
    }

    /** Parsed options. */
    static final class Options {
        int qubits = 20;
        int gates = 10_000;
        long seed = 20_261_202L;
        int threads = Runtime.getRuntime().availableProcessors();
        boolean help;
    }

    /**
     * Runs the report; see the class comment and {@link #USAGE}.
     *
     * @param args the options
     */
    public static void main(String[] args) {
        int status = run(args, System.out, System.err);
        System.out.flush();
        if (status != 0) {
            System.exit(status);
        }
    }

    static Options parse(String[] args) {
        Options o = new Options();
        for (int i = 0; i < args.length; i++) {
            String name = args[i];
            if (name.equals("--help")) {
                o.help = true;
                continue;
            }
            if (!List.of("--qubits", "--gates", "--seed", "--threads").contains(name)) {
                throw new IllegalArgumentException("unknown option '" + name
                        + "'; allowed: --qubits, --gates, --seed, --threads, --help");
            }
            if (i + 1 >= args.length) {
                throw new IllegalArgumentException("option " + name + " needs a value");
            }
            String value = args[++i];
            long v = PlainOptions.number(name, value);
            switch (name) {
                case "--qubits":
                    o.qubits = (int) PlainOptions.within(name, v, 2, 26);
                    break;
                case "--gates":
                    o.gates = (int) PlainOptions.within(name, v, 1, 10_000_000);
                    break;
                case "--threads":
                    o.threads = (int) PlainOptions.within(name, v, 1, 256);
                    break;
                default:
                    o.seed = v;
                    break;
            }
        }
        return o;
    }


    /** One-gate circuits of the random circuit, in order. */
    static List<Circuit> gates(int n, int count, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        List<Circuit> out = new ArrayList<>(count);
        for (int g = 0; g < count; g++) {
            Circuit.Builder b = Circuit.builder(n);
            if (rng.nextDouble() < 0.6) {
                int q = rng.nextInt(n);
                double angle = 2 * Math.PI * rng.nextDouble();
                switch (rng.nextInt(4)) {
                    case 0:
                        b.rx(q, angle);
                        break;
                    case 1:
                        b.ry(q, angle);
                        break;
                    case 2:
                        b.rz(q, angle);
                        break;
                    default:
                        b.h(q);
                        break;
                }
            } else {
                int c = rng.nextInt(n);
                int t = (c + 1 + rng.nextInt(n - 1)) % n;
                if (rng.nextBoolean()) {
                    b.cnot(c, t);
                } else {
                    b.cz(c, t);
                }
            }
            out.add(b.build());
        }
        return out;
    }

    /** {norm drift of d, norm drift of s, infidelity, largest amplitude difference}. */
    static double[] compare(StateVector d, StateVector s) {
        double worst = 0;
        for (long i = 0; i < d.dimension(); i++) {
            Complex x = d.amplitude(i);
            Complex y = s.amplitude(i);
            worst = Math.max(worst, Math.hypot(x.getReal() - y.getReal(),
                    x.getImaginary() - y.getImaginary()));
        }
        double nd = d.norm();
        double ns = s.norm();
        return new double[] {Math.abs(nd - 1), Math.abs(ns - 1),
            Math.max(0, 1 - d.fidelity(s) / (nd * nd * ns * ns)), worst};
    }

    static int run(String[] args, PrintStream out, PrintStream err) {
        Options o;
        try {
            o = parse(args);
        } catch (IllegalArgumentException e) {
            err.println("error: " + e.getMessage());
            err.println(USAGE);
            return 1;
        }
        if (o.help) {
            out.println(USAGE);
            return 0;
        }
        List<Circuit> gates = gates(o.qubits, o.gates, o.seed);
        StateVector d = StateVector.zero(o.qubits).setThreads(o.threads);
        StateVector s = StateVector.zero(o.qubits, Precision.SINGLE).setThreads(o.threads);
        out.printf(Locale.ROOT, "# %d qubits, %d random gates, seed %d, %d threads%n", o.qubits,
                o.gates, o.seed, o.threads);
        out.println("mode,gates,double_norm_drift,single_norm_drift,infidelity,max_amplitude_diff");
        long next = 10;
        for (int g = 0; g < gates.size(); g++) {
            d.apply(gates.get(g));
            s.apply(gates.get(g));
            if (g + 1 == next || g + 1 == gates.size()) {
                print(out, "gate-by-gate", g + 1, compare(d, s));
                next *= 10;
            }
        }
        Circuit.Builder whole = Circuit.builder(o.qubits);
        for (Circuit c : gates) {
            whole.append(c);
        }
        StateVector grouped = StateVector.zero(o.qubits, Precision.SINGLE).setThreads(o.threads)
                .apply(whole.build());
        print(out, "whole-circuit", gates.size(), compare(d, grouped));
        return 0;
    }

    private static void print(PrintStream out, String mode, int gates, double[] m) {
        out.printf(Locale.ROOT, "%s,%d,%.3e,%.3e,%.3e,%.3e%n", mode, gates, m[0], m[1], m[2],
                m[3]);
    }
}
