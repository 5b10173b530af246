package dev.qsim.bench;

import java.io.PrintStream;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.Circuit;
import dev.qsim.Operator;
import dev.qsim.mps.MatrixProductState;

/**
 * The cost of the matrix-product-state engine: how the time of one two-qubit gate grows with
 * the bond dimension χ, and the time of a wide brickwork circuit. A plain program, no JMH; the
 * scaling report's rows are per qubit count, these per bond dimension, so they have a report of
 * their own.
 *
 * <p><b>Bond scaling.</b> For each χ a state of {@code --chain-qubits} qubits is brought to
 * bond dimension χ across its middle bonds by brickwork layers of Haar-random two-qubit gates
 * with bond limit χ; then random two-qubit gates are applied alternately to the two bonds
 * either side of the middle qubit, each followed by the split back to χ (an SVD of a
 * {@code 2χ x 2χ} matrix and a QR to move the centre), timed by {@link BatchTimer} for
 * {@code --millis}. The SVD costs {@code O(χ³)} (Golub and Van Loan 2013, §8.6.3), so
 * {@code log(time)} against {@code log χ} should have slope 3 once χ is large enough for the
 * cubic work to dominate; the report fits the slope by least squares over the points with χ of
 * at least {@code --fit-from}.
 *
 * <p><b>Brickwork.</b> {@code --qubits} qubits in a line, {@code --depth} layers of
 * Haar-random two-qubit gates on neighbours {@code (q, q+1)}, q even in even layers and odd in
 * odd ones, bond limit {@code --bond-limit}: the time of {@code MatrixProductState.apply} (best
 * of {@code --runs}), with the truncation record.
 *
 * <p>Random unitaries: Gram-Schmidt on the columns of a complex Gaussian matrix (Mezzadri 2007,
 * "How to generate random matrices from the classical compact groups", Notices AMS 54, 592),
 * seeded.
 */
public final class MatrixProductReport {
    /** Usage text. */
    static final String USAGE = String.join("\n",
            "usage: java -cp qsim-bench.jar dev.qsim.bench.MatrixProductReport [options]",
            "Times one two-qubit gate of the matrix product state against the bond dimension",
            "and fits the exponent, then times a brickwork circuit on a line of qubits.",
            "  --chis A,B,...     bond dimensions (default 8,16,32,64,128,256; 2..4096)",
            "  --fit-from X       smallest bond dimension in the fit (default 32)",
            "  --chain-qubits N   qubits of the scaling state (default 24; 4..64)",
            "  --millis M         time per bond dimension (default 2000; 10..600000)",
            "  --qubits N         qubits of the brickwork (default 100; 2..100000)",
            "  --depth D          brickwork layers (default 10; 1..10000)",
            "  --bond-limit X     brickwork bond limit (default 64; 1..4096)",
            "  --runs R           brickwork runs, the best reported (default 3; 1..100)",
            "  --seed S           seed of the random gates (default 20261205)",
            "  --help             print this and exit",
            "Exit status: 0 done, 1 bad options.");

    private MatrixProductReport() {
    }

    /** Parsed options. */
    static final class Options {
        int[] chis = {8, 16, 32, 64, 128, 256};
        int fitFrom = 32;
        int chainQubits = 24;
        long millis = 2000;
        int qubits = 100;
        int depth = 10;
        int bondLimit = 64;
        int runs = 3;
        long seed = 20_261_205L;
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

    private static final List<String> NAMES = List.of("--chis", "--fit-from", "--chain-qubits",
            "--millis", "--qubits", "--depth", "--bond-limit", "--runs", "--seed");

    static Options parse(String[] args) {
        Options o = new Options();
        for (int i = 0; i < args.length; i++) {
            String name = args[i];
            if (name.equals("--help")) {
                o.help = true;
                continue;
            }
            if (!NAMES.contains(name)) {
                throw new IllegalArgumentException("unknown option '" + name + "'; allowed: "
                        + String.join(", ", NAMES) + ", --help");
            }
            if (i + 1 >= args.length) {
                throw new IllegalArgumentException("option " + name + " needs a value");
            }
            String value = args[++i];
            if (name.equals("--chis")) {
                String[] parts = value.split(",");
                o.chis = new int[parts.length];
                for (int k = 0; k < parts.length; k++) {
                    long chi = PlainOptions.number(name, parts[k].trim());
                    o.chis[k] = (int) PlainOptions.within(name, chi, 2, 4096);
                }
                continue;
            }
            long v = PlainOptions.number(name, value);
            switch (name) {
                case "--fit-from":
                    o.fitFrom = (int) PlainOptions.within(name, v, 2, 4096);
                    break;
                case "--chain-qubits":
                    o.chainQubits = (int) PlainOptions.within(name, v, 4, 64);
                    break;
                case "--millis":
                    o.millis = PlainOptions.within(name, v, 10, 600_000);
                    break;
                case "--qubits":
                    o.qubits = (int) PlainOptions.within(name, v, 2, 100_000);
                    break;
                case "--depth":
                    o.depth = (int) PlainOptions.within(name, v, 1, 10_000);
                    break;
                case "--bond-limit":
                    o.bondLimit = (int) PlainOptions.within(name, v, 1, 4096);
                    break;
                case "--runs":
                    o.runs = (int) PlainOptions.within(name, v, 1, 100);
                    break;
                default:
                    o.seed = v;
                    break;
            }
        }
        for (int chi : o.chis) {
            // both middle bonds reach chi when each side of them has log2(chi) qubits
            int bits = 64 - Long.numberOfLeadingZeros(chi - 1);
            if (bits > o.chainQubits / 2 - 1) {
                throw new IllegalArgumentException("bond dimension " + chi + " needs at least "
                        + 2 * (bits + 1) + " chain qubits but --chain-qubits is "
                        + o.chainQubits);
            }
        }
        return o;
    }



    /** A Haar-random two-qubit unitary (Gram-Schmidt on complex Gaussian columns). */
    static Operator randomUnitary(UniformRandomProvider rng) {
        int d = 4;
        double[][] re = new double[d][d];
        double[][] im = new double[d][d];
        for (int c = 0; c < d; c++) {
            for (int r = 0; r < d; r++) {
                re[c][r] = gaussian(rng);
                im[c][r] = gaussian(rng);
            }
            for (int pass = 0; pass < 2; pass++) {
                for (int p = 0; p < c; p++) {
                    double sr = 0;
                    double si = 0;
                    for (int r = 0; r < d; r++) {
                        sr += re[p][r] * re[c][r] + im[p][r] * im[c][r];
                        si += re[p][r] * im[c][r] - im[p][r] * re[c][r];
                    }
                    for (int r = 0; r < d; r++) {
                        re[c][r] -= sr * re[p][r] - si * im[p][r];
                        im[c][r] -= sr * im[p][r] + si * re[p][r];
                    }
                }
            }
            double norm = 0;
            for (int r = 0; r < d; r++) {
                norm += re[c][r] * re[c][r] + im[c][r] * im[c][r];
            }
            norm = Math.sqrt(norm);
            for (int r = 0; r < d; r++) {
                re[c][r] /= norm;
                im[c][r] /= norm;
            }
        }
        Complex[][] rows = new Complex[d][d];
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                rows[r][c] = Complex.ofCartesian(re[c][r], im[c][r]);
            }
        }
        return Operator.of(rows);
    }

    /** Standard normal deviate by the Box-Muller transform (Box and Muller 1958). */
    private static double gaussian(UniformRandomProvider rng) {
        double u = 1 - rng.nextDouble();
        return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rng.nextDouble());
    }

    /** The brickwork circuit of the class comment. */
    static Circuit brickwork(int n, int depth, UniformRandomProvider rng) {
        Circuit.Builder b = Circuit.builder(n);
        for (int layer = 0; layer < depth; layer++) {
            b.append(layer(n, layer % 2, rng));
        }
        return b.build();
    }

    /** One layer of random gates on the pairs {@code (q, q+1)} with q of the given parity. */
    static Circuit layer(int n, int parity, UniformRandomProvider rng) {
        Circuit.Builder b = Circuit.builder(n);
        for (int q = parity; q + 1 < n; q += 2) {
            b.apply(randomUnitary(rng), q, q + 1);
        }
        return b.build();
    }

    /**
     * The least-squares slope of {@code log y} against {@code log x} (common practice for a
     * power law {@code y = c x^k}).
     */
    static double slope(double[] x, double[] y) {
        int n = x.length;
        double mx = 0;
        double my = 0;
        for (int i = 0; i < n; i++) {
            mx += Math.log(x[i]) / n;
            my += Math.log(y[i]) / n;
        }
        double sxy = 0;
        double sxx = 0;
        for (int i = 0; i < n; i++) {
            double dx = Math.log(x[i]) - mx;
            sxy += dx * (Math.log(y[i]) - my);
            sxx += dx * dx;
        }
        return sxy / sxx;
    }

    /**
     * Brings a chain of {@code qubits} to bond dimension {@code chi} across its middle with
     * brickwork layers of random gates, then times two-qubit gates on the two middle bonds for
     * at least {@code millis} ms (each an SVD of a {@code 2χ x 2χ} block truncated back to χ).
     */
    static BatchTimer.Timing timeAtBond(int qubits, int chi, Operator[] gates,
            UniformRandomProvider rng, long millis) {
        MatrixProductState s = MatrixProductState.zero(qubits, chi, 0);
        int layers = 0;
        int mid = qubits / 2;
        while (s.bondDimension(mid - 1) < chi || s.bondDimension(mid) < chi) {
            if (layers > 4 * qubits) {
                throw new IllegalStateException("bond dimension " + chi + " not reached"
                        + " after " + layers + " layers");
            }
            s.apply(layer(qubits, layers % 2, rng));
            layers++;
        }
        return BatchTimer.measure(r -> timeGates(s, gates, r), millis * 1_000_000L);
    }

    /** Nanoseconds of {@code reps} gates on the bonds either side of the middle qubit. */
    private static long timeGates(MatrixProductState s, Operator[] gates, long reps) {
        // core entry point: MatrixProductState.apply(Operator, int...)
        int mid = s.qubits() / 2;
        long start = System.nanoTime();
        for (long r = 0; r < reps; r++) {
            int q = (r & 1) == 0 ? mid - 1 : mid;
            s.apply(gates[(int) (r % gates.length)], q, q + 1);
        }
        return System.nanoTime() - start;
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
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(o.seed);
        Operator[] gates = new Operator[16];
        for (int g = 0; g < gates.length; g++) {
            gates[g] = randomUnitary(rng);
        }
        out.printf(Locale.ROOT, "# bond scaling: %d qubits, seed %d, %d ms per bond dimension,"
                + " JDK %s, %d processors%n", o.chainQubits, o.seed, o.millis,
                System.getProperty("java.version"), Runtime.getRuntime().availableProcessors());
        out.println("chi,ms_per_gate,gates_timed");
        List<double[]> points = new ArrayList<>();
        for (int chi : o.chis) {
            BatchTimer.Timing t = timeAtBond(o.chainQubits, chi, gates, rng, o.millis);
            double ms = t.perRep() / 1e6;
            out.printf(Locale.ROOT, "%d,%.4f,%d%n", chi, ms, t.reps());
            if (chi >= o.fitFrom) {
                points.add(new double[] {chi, ms});
            }
            err.printf(Locale.ROOT, "# chi %d, %.3f ms per gate%n", chi, ms);
        }
        if (points.size() >= 2) {
            double[] x = new double[points.size()];
            double[] y = new double[points.size()];
            for (int i = 0; i < x.length; i++) {
                x[i] = points.get(i)[0];
                y[i] = points.get(i)[1];
            }
            out.printf(Locale.ROOT, "# time per two-qubit gate grows as chi^%.2f (least squares"
                    + " over chi >= %d)%n", slope(x, y), o.fitFrom);
        }
        Circuit c = brickwork(o.qubits, o.depth, rng);
        double best = Double.POSITIVE_INFINITY;
        MatrixProductState last = null;
        for (int run = 0; run < o.runs; run++) {
            long start = System.nanoTime();
            // core entry point: MatrixProductState.apply(Circuit)
            last = MatrixProductState.zero(o.qubits, o.bondLimit, 0).apply(c);
            best = Math.min(best, (System.nanoTime() - start) / 1e9);
        }
        out.printf(Locale.ROOT, "# brickwork: %d qubits, depth %d, %d two-qubit gates, bond limit"
                + " %d: best of %d runs %.3f s%n", o.qubits, o.depth, c.size(), o.bondLimit,
                o.runs, best);
        out.printf(Locale.ROOT, "# largest bond %d, %.1f MiB of tensors, %d truncations,"
                + " discarded weight %.4g, fidelity estimate %.4f, lower bound %.3g%n",
                last.maxBondDimension(), last.bytes() / (double) (1 << 20), last.truncations(),
                last.discardedWeight(), last.fidelityEstimate(), last.fidelityLowerBound());
        return 0;
    }
}
