package dev.qsim.examples;

import java.io.PrintStream;
import java.util.Map;
import java.util.Objects;

import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.StateVector;
import dev.qsim.Tally;
import dev.qsim.observable.Expectation;
import dev.qsim.observable.Gradients;
import dev.qsim.observable.Observable;
import dev.qsim.observable.TunableCircuit;

/**
 * The quantum approximate optimisation algorithm (QAOA) for maximum cut (Farhi, Goldstone and
 * Gutmann 2014, "A quantum approximate optimization algorithm", arXiv:1411.4028) on an invented
 * graph: six relay huts of an invented mountain radio club, linked where they can hear each other;
 * the club wants to split the huts into two shifts so that as many links as possible join huts
 * of different shifts.
 *
 * <p>The cut size is {@code C = Σ_{(u,v)} (1 - Z_u Z_v)/2}. Each of the {@code p} layers applies
 * {@code exp(-iγ C)} (an {@code rzz(-γ)} per edge, up to a global phase) then
 * {@code exp(-iβ Σ X)} (an {@code rx(2β)} per qubit) to {@code |+...+>}. {@link SteepestDescent}
 * with adjoint gradients ({@link Gradients#adjoint}) minimises {@code <-C>} over the 2p angles;
 * the final state is then sampled and the best sampled cut is compared with the brute-force
 * maximum over all {@code 2^n} splits.
 */
public final class MaxCutQaoa {

    /** The invented graph: two triangles of huts (0-1-2, 3-4-5) and three links between them. */
    public static final int[][] EDGES = {
        {0, 1}, {1, 2}, {2, 0}, {3, 4}, {4, 5}, {5, 3}, {2, 3}, {1, 4}, {0, 5}};

    /** Number of huts (qubits). */
    public static final int NODES = 6;

    /** Layers used when none are given. */
    public static final int DEFAULT_LAYERS = 2;

    /** Seed used when none is given. */
    public static final long DEFAULT_SEED = 1_411L;

    /** Shots used when none are given. */
    public static final int DEFAULT_SHOTS = 1_000;

    /** Most descent iterations. */
    static final int MAX_ITERATIONS = 100;

    private MaxCutQaoa() {
    }

    /**
     * Returns the observable {@code -C}, whose expectation the search minimises.
     *
     * @param edges the edges, pairs of distinct nodes
     * @return {@code Σ_edges (Z_u Z_v - 1)/2}
     */
    public static Observable negativeCut(int[][] edges) {
        Observable.Builder b = Observable.builder();
        for (int[] e : edges) {
            b.add(0.5, "Z" + e[0] + " Z" + e[1]).add(-0.5, "I");
        }
        return b.build().simplified();
    }

    /**
     * Returns the QAOA circuit with {@code layers} layers, parameters
     * {@code gamma1, beta1, gamma2, beta2, ...}.
     *
     * @param nodes the qubit count
     * @param edges the edges
     * @param layers the number of layers p, at least 1
     * @return the circuit
     */
    public static TunableCircuit circuit(int nodes, int[][] edges, int layers) {
        if (layers < 1 || layers > 10) {
            throw new UsageException("layers must be from 1 to 10, got " + layers);
        }
        TunableCircuit.Builder b = TunableCircuit.builder(nodes);
        for (int q = 0; q < nodes; q++) {
            b.h(q);
        }
        for (int l = 1; l <= layers; l++) {
            for (int[] e : edges) {
                b.rzz(e[0], e[1], "gamma" + l, -1, 0);
            }
            for (int q = 0; q < nodes; q++) {
                b.rx(q, "beta" + l, 2, 0);
            }
        }
        return b.build();
    }

    /**
     * Returns the number of edges cut by a split: node {@code k} is in shift bit {@code k}.
     *
     * @param split the split as bits
     * @param edges the edges
     * @return the cut size
     */
    public static int cut(long split, int[][] edges) {
        int c = 0;
        for (int[] e : edges) {
            c += (int) (((split >>> e[0]) ^ (split >>> e[1])) & 1);
        }
        return c;
    }

    /**
     * What the run found.
     *
     * @param expectedCut {@code <C>} at the optimised angles
     * @param angles the optimised angles, gamma1, beta1, ...
     * @param bestSampledCut the largest cut among the sampled splits
     * @param bestSplit a sampled split with that cut, as a bitstring
     * @param maxCut the brute-force maximum cut
     * @param iterations descent iterations taken
     */
    public record Result(double expectedCut, double[] angles, int bestSampledCut,
            String bestSplit, int maxCut, int iterations) {
    }

    /**
     * Runs QAOA on {@link #EDGES}, prints convergence, the sampled cuts and the brute-force
     * maximum.
     *
     * @param out where the report goes
     * @param layers QAOA layers p, 1 to 10
     * @param seed the sampling seed
     * @param shots shots sampled from the final state
     * @return the result
     */
    public static Result run(PrintStream out, int layers, long seed, int shots) {
        Objects.requireNonNull(out, "out");
        Args.requireShots(shots);
        TunableCircuit c = circuit(NODES, EDGES, layers);
        Observable h = negativeCut(EDGES);
        Text.title(out, "QAOA max cut: " + NODES + " radio huts, " + EDGES.length + " links, p = "
                + layers);
        out.println(" iter   <cut>        |gradient|   angles " + c.parameters());
        double[] start = new double[2 * layers];
        for (int l = 0; l < layers; l++) {
            // A small linear ramp, common practice for QAOA starting angles.
            start[2 * l] = 0.3 * (l + 1) / layers;
            start[2 * l + 1] = 0.3 * (layers - l) / layers;
        }
        SteepestDescent.Objective f = new SteepestDescent.Objective() {
            @Override
            public double value(double[] x) {
                return Expectation.of(h, StateVector.zero(NODES).apply(c.bind(x)));
            }

            @Override
            public double[] gradient(double[] x) {
                return Gradients.adjoint(c, x, h);
            }
        };
        SteepestDescent.Result r = SteepestDescent.minimise(f, start, MAX_ITERATIONS, 1e-8,
                (it, x, value, norm) -> out.println(Text.f("%5d  %.8f  %.3e   %s", it, -value,
                        norm, angles(x))));
        StateVector finalState = StateVector.zero(NODES).apply(c.bind(r.x()));
        Tally tally = finalState.sample(shots, RandomSource.XO_RO_SHI_RO_128_PP.create(seed));
        int best = -1;
        String bestSplit = "";
        long hits = 0;
        for (Map.Entry<String, Long> e : tally.outcomes().entrySet()) {
            int k = cut(Long.parseLong(e.getKey(), 2), EDGES);
            if (k > best) {
                best = k;
                bestSplit = e.getKey();
                hits = 0;
            }
            if (k == best) {
                hits += e.getValue();
            }
        }
        int max = 0;
        for (long s = 0; s < (1L << NODES); s++) {
            max = Math.max(max, cut(s, EDGES));
        }
        out.println();
        out.println(Text.f("expected cut at the optimum  %.6f of %d links", -r.value(),
                EDGES.length));
        out.println(Text.f("best sampled cut             %d (split %s, shift bit k = hut k),"
                + " seen in %d of %s, seed %d", best, bestSplit, hits, Text.count(shots, "shot"),
                seed));
        out.println(Text.f("brute-force maximum cut      %d (all %d splits)", max, 1 << NODES));
        out.println(best == max ? "the sampled best is a maximum cut"
                : "the sampled best falls short of the maximum");
        return new Result(-r.value(), r.x(), best, bestSplit, max, r.iterations());
    }

    private static String angles(double[] x) {
        StringBuilder sb = new StringBuilder("[");
        for (int j = 0; j < x.length; j++) {
            sb.append(j == 0 ? "" : ", ").append(Text.f("%.4f", x[j]));
        }
        return sb.append(']').toString();
    }

    /**
     * Runs the example: {@code [layers [seed [shots]]]}.
     *
     * @param args optional layers, seed and shots
     */
    public static void main(String[] args) {
        try {
            fromArgs(args, System.out);
        } catch (UsageException e) {
            System.err.println("maxcut: " + e.getMessage());
            System.exit(Main.EXIT_USAGE);
        }
    }

    /** Reads {@code [layers [seed [shots]]]} and runs; for the launcher. */
    static void fromArgs(String[] args, PrintStream out) {
        Args.requireAtMost(args, 3, "maxcut [layers [seed [shots]]]");
        int layers = DEFAULT_LAYERS;
        if (args.length > 0) {
            try {
                layers = Integer.parseInt(args[0].trim());
            } catch (NumberFormatException e) {
                throw new UsageException("layers must be a whole number from 1 to 10, got '"
                        + args[0] + "'", e);
            }
        }
        run(out, layers, Args.seed(args, 1, DEFAULT_SEED), Args.shots(args, 2, DEFAULT_SHOTS));
    }
}
