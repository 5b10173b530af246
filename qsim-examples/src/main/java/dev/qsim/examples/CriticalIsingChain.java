package dev.qsim.examples;

import java.io.PrintStream;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.StateVector;
import dev.qsim.mps.MatrixProductState;
import dev.qsim.observable.Expectation;
import dev.qsim.observable.Gradients;
import dev.qsim.observable.Observable;
import dev.qsim.observable.TunableCircuit;

/**
 * The energy per spin of the critical transverse-field Ising chain from a shallow variational
 * circuit, on chains far too long for a state vector.
 *
 * <p><b>Scenario (invented).</b> A solid-state reading group wants to know how close a circuit
 * of a few layers gets to the ground-state energy of a long chain of spins at its critical
 * point, and how that energy per spin approaches the infinite-chain value as the chain grows.
 *
 * <p><b>The model.</b> {@code H = -Σ_i Z_i Z_{i+1} - Σ_i X_i} on an open chain of N spins: the
 * transverse-field Ising chain at the critical field {@code g = J = 1}. Its ground-state energy
 * per spin on the infinite chain is {@code -4/π} (Pfeuty 1970, "The one-dimensional Ising model
 * with a transverse field", Ann. Phys. 57, 79, doi:10.1016/0003-4916(70)90270-8). The open
 * chain is solved by free fermions (Lieb, Schultz and Mattis 1961, Ann. Phys. 16, 407): at
 * {@code g = 1} the quasi-momenta are {@code k_m = 2πm/(2N + 1)}, {@code m = 1..N}, with
 * energies {@code Λ_m = 4 cos(k_m / 2)} (Pfeuty 1970, §3), so {@code E_0(N) = -½ Σ Λ_m}, which
 * sums in closed form to {@code E_0(N) = 1 - 1/sin(π / (2(2N + 1)))} and behaves as
 * {@code E_0(N)/N = -4/π + (1 - 2/π)/N + O(1/N²)}: the surface energy {@code 1 - 2/π}.
 *
 * <p><b>The circuit.</b> The Hamiltonian-variational form: Hadamards make {@code |+...+>}, the
 * ground state of {@code -ΣX}; then p layers of {@code rzz(a_l)} on every bond and
 * {@code rx(b_l)} on every spin, one angle pair per layer. A layer spreads correlations by one
 * spin each way, so a term in the middle of the chain sees only the {@code 2p + 2} spins of its
 * light cone (the locality argument of Farhi, Goldstone and Gutmann 2014, "A quantum
 * approximate optimization algorithm", arXiv:1411.4028, §3): the energy per spin of the
 * infinite chain, {@code e(p) = <-Z_p Z_{p+1} - X_p>}, is computed exactly on a chain of
 * {@code 2p + 2} qubits with the state vector, and minimised over the angles with BFGS on
 * adjoint gradients (each depth starting from the previous depth's angles). The optimised
 * circuit then runs on open chains of up to hundreds of spins on the matrix product state
 * ({@link Simulator.Engine#MATRIX_PRODUCT}); its bonds need at most {@code 2^p} values, so with
 * the default bond limit nothing is truncated, and a tighter limit shows what truncation costs.
 *
 * <p>Run with {@code java -jar qsim-examples.jar ising [layers [longest chain]]}.
 */
public final class CriticalIsingChain {
    /** The energy per spin of the infinite critical chain, {@code -4/π} (Pfeuty 1970). */
    public static final double INFINITE_CHAIN = -4 / Math.PI;
    /** The surface energy of the open critical chain, {@code 1 - 2/π}. */
    public static final double SURFACE = 1 - 2 / Math.PI;
    /** Layers used when none are given. */
    public static final int DEFAULT_LAYERS = 6;
    /** Longest chain used when none is given. */
    public static final int DEFAULT_LONGEST = 160;
    /** Most layers accepted: {@value} (bonds of up to 2^8 values). */
    public static final int MAX_LAYERS = 8;
    /** Longest chain accepted: {@value}. */
    public static final int MAX_LONGEST = 2000;
    /** The bond limit of the truncated run. */
    static final int TIGHT_BOND_LIMIT = 8;
    /** Most BFGS iterations per depth. */
    static final int MAX_ITERATIONS = 300;

    private CriticalIsingChain() {
    }

    /**
     * The optimum at one depth.
     *
     * @param layers p
     * @param angles the angles {@code a_1, b_1, ..., a_p, b_p}
     * @param energyPerSpin {@code e(p)}, the infinite-chain energy per spin of the circuit
     * @param iterations BFGS iterations taken
     */
    public record Depth(int layers, double[] angles, double energyPerSpin, int iterations) {
        /**
         * Copies the angles.
         *
         * @param layers p
         * @param angles the angles
         * @param energyPerSpin e(p)
         * @param iterations iterations
         */
        public Depth {
            angles = angles.clone();
        }

        /**
         * Returns a copy of the angles.
         *
         * @return the angles
         */
        @Override
        public double[] angles() {
            return angles.clone();
        }
    }

    /**
     * One open chain on the matrix product state.
     *
     * @param spins N
     * @param energyPerSpin the circuit's {@code <H>/N}
     * @param exactPerSpin {@code E_0(N)/N}
     * @param middleTerm {@code <-Z_m Z_{m+1} - X_m>} at the middle spin m
     * @param largestBond the largest bond dimension
     * @param seconds wall time of the run and the energy
     */
    public record Chain(int spins, double energyPerSpin, double exactPerSpin, double middleTerm,
            int largestBond, double seconds) {
    }

    /**
     * What the example found.
     *
     * @param depths the optimum at each depth 1..p
     * @param chains the open chains at depth p
     * @param truncated the longest chain again with bond limit {@value #TIGHT_BOND_LIMIT}
     */
    public record Report(List<Depth> depths, List<Chain> chains, MatrixProductState truncated) {
        /**
         * Copies the lists.
         *
         * @param depths the depths
         * @param chains the chains
         * @param truncated the truncated state
         */
        public Report {
            depths = List.copyOf(depths);
            chains = List.copyOf(chains);
            Objects.requireNonNull(truncated, "truncated");
        }
    }

    /**
     * Returns {@code E_0(N) = 1 - 1/sin(π / (2(2N + 1)))}, the exact ground-state energy of the
     * open critical chain (see the class documentation).
     *
     * @param spins N, at least 1
     * @return the energy
     */
    public static double exactEnergy(int spins) {
        return 1 - 1 / Math.sin(Math.PI / (2 * (2.0 * spins + 1)));
    }

    /**
     * Returns {@code H = -Σ Z_i Z_{i+1} - Σ X_i} on an open chain.
     *
     * @param spins N, at least 2
     * @return the observable
     */
    public static Observable hamiltonian(int spins) {
        Observable.Builder b = Observable.builder();
        for (int q = 0; q + 1 < spins; q++) {
            b.add(-1, "Z" + q + " Z" + (q + 1));
        }
        for (int q = 0; q < spins; q++) {
            b.add(-1, "X" + q);
        }
        return b.build();
    }

    /**
     * Returns the energy of one spin, {@code -Z_m Z_{m+1} - X_m}.
     *
     * @param m the spin
     * @return the observable
     */
    public static Observable term(int m) {
        return Observable.builder().add(-1, "Z" + m + " Z" + (m + 1)).add(-1, "X" + m).build();
    }

    /**
     * Returns the p-layer variational circuit on N spins; parameters {@code a1, b1, ...}.
     *
     * @param spins N, at least 2
     * @param layers p, at least 1
     * @return the circuit
     */
    public static TunableCircuit ansatz(int spins, int layers) {
        TunableCircuit.Builder b = TunableCircuit.builder(spins);
        for (int q = 0; q < spins; q++) {
            b.h(q);
        }
        for (int l = 1; l <= layers; l++) {
            for (int q = 0; q + 1 < spins; q++) {
                b.rzz(q, q + 1, "a" + l);
            }
            for (int q = 0; q < spins; q++) {
                b.rx(q, "b" + l);
            }
        }
        return b.build();
    }

    /**
     * Minimises {@code e(p)} on the light-cone chain of {@code 2p + 2} qubits.
     *
     * @param layers p
     * @param start starting angles ({@code 2p} of them)
     * @return the optimum
     */
    static Depth optimise(int layers, double[] start) {
        int spins = 2 * layers + 2;
        TunableCircuit c = ansatz(spins, layers);
        Observable h = term(layers);
        SteepestDescent.Objective f = new SteepestDescent.Objective() {
            @Override
            public double value(double[] x) {
                return Expectation.of(h, StateVector.zero(spins).apply(c.bind(x)));
            }

            @Override
            public double[] gradient(double[] x) {
                return Gradients.adjoint(c, x, h);
            }
        };
        Bfgs.Result r = Bfgs.minimise(f, start, MAX_ITERATIONS, 1e-8);
        return new Depth(layers, r.x(), r.value(), r.iterations());
    }

    /**
     * Starting angles for depth p from the optimum at depth p - 1: the schedule stretched over
     * one more layer (linear interpolation), or a short ramp at depth 1.
     */
    static double[] stretch(double[] previous, int layers) {
        double[] x = new double[2 * layers];
        int old = previous.length / 2;
        for (int l = 0; l < layers; l++) {
            if (old == 0) {
                x[2 * l] = 0.4;
                x[2 * l + 1] = 0.8;
                continue;
            }
            double pos = old == 1 ? 0 : l * (old - 1.0) / (layers - 1.0);
            int lo = (int) Math.floor(pos);
            int hi = Math.min(old - 1, lo + 1);
            double w = pos - lo;
            for (int k = 0; k < 2; k++) {
                x[2 * l + k] = (1 - w) * previous[2 * lo + k] + w * previous[2 * hi + k];
            }
        }
        return x;
    }

    /**
     * Runs the example and prints it.
     *
     * @param out where the report goes
     * @param layers p, 1 to {@value #MAX_LAYERS}
     * @param longest the longest chain, {@code 2p + 4} to {@value #MAX_LONGEST}
     * @return what the example found
     * @throws IllegalArgumentException if an argument is out of range
     */
    public static Report run(PrintStream out, int layers, int longest) {
        Objects.requireNonNull(out, "out");
        if (layers < 1 || layers > MAX_LAYERS) {
            throw new UsageException("layers must be a whole number from 1 to " + MAX_LAYERS
                    + ", got " + layers);
        }
        if (longest < 2 * layers + 4 || longest > MAX_LONGEST) {
            throw new UsageException("the longest chain must have " + (2 * layers + 4) + " to "
                    + MAX_LONGEST + " spins for " + layers + " layer(s), got " + longest);
        }
        Text.title(out, "Critical Ising chain: energy per spin from a " + layers
                + "-layer circuit");
        out.println(Text.f("H = -Σ Z_i Z_(i+1) - Σ X_i, open chain at the critical field;"
                + " infinite chain: -4/π = %.6f", INFINITE_CHAIN));
        Text.heading(out, "Depth by depth: the infinite chain's energy per spin, on the 2p + 2"
                + " qubits of the light cone");
        out.println(" p  qubits  iterations   e(p) per spin   above -4/π");
        List<Depth> depths = new ArrayList<>();
        double[] angles = new double[0];
        for (int p = 1; p <= layers; p++) {
            Depth d = optimise(p, stretch(angles, p));
            angles = d.angles();
            depths.add(d);
            out.println(Text.f("%2d  %6d  %10d   %13.6f   %9.3f %%", p, 2 * p + 2,
                    d.iterations(), d.energyPerSpin(),
                    100 * (d.energyPerSpin() - INFINITE_CHAIN) / -INFINITE_CHAIN));
        }
        Depth best = depths.get(layers - 1);
        Text.heading(out, Text.f("Open chains on the matrix product state (p = %d, bond limit"
                + " %d)", layers, MatrixProductState.DEFAULT_BOND_LIMIT));
        out.println("    N   E/N circuit   E/N exact   N·(exact + 4/π)   middle term   bond"
                + "      s");
        List<Chain> chains = new ArrayList<>();
        List<Integer> sizes = new ArrayList<>();
        for (int n = longest; n >= 2 * layers + 4; n /= 2) {
            sizes.add(0, n);
        }
        Simulator sim = Simulator.seeded(0).withEngine(Simulator.Engine.MATRIX_PRODUCT);
        for (int n : sizes) {
            long start = System.nanoTime();
            Circuit c = ansatz(n, layers).bind(best.angles());
            MatrixProductState s = sim.matrixProductStateAfter(c);
            double e = s.expectation(hamiltonian(n)) / n;
            double middle = s.expectation(term(n / 2 - 1));
            double seconds = (System.nanoTime() - start) / 1e9;
            double exact = exactEnergy(n) / n;
            chains.add(new Chain(n, e, exact, middle, s.maxBondDimension(), seconds));
            out.println(Text.f("%5d   %11.6f  %10.6f   %15.4f   %11.6f   %4d  %5.2f", n, e,
                    exact, n * (exact - INFINITE_CHAIN), middle, s.maxBondDimension(),
                    seconds));
        }
        out.println(Text.f("N·(exact + 4/π) tends to the surface energy 1 - 2/π = %.4f; the"
                + " middle term equals e(%d) = %.6f, as the light cone says.", SURFACE, layers,
                best.energyPerSpin()));
        int n = sizes.get(sizes.size() - 1);
        Circuit c = ansatz(n, layers).bind(best.angles());
        MatrixProductState tight = sim.withBondLimit(TIGHT_BOND_LIMIT).matrixProductStateAfter(c);
        double e = tight.expectation(hamiltonian(n)) / n;
        Text.heading(out, Text.f("The %d-spin chain again with bond limit %d", n,
                TIGHT_BOND_LIMIT));
        out.println(Text.f("E/N = %.6f (untruncated %.6f); %d truncations dropped weight %.3g;"
                + " fidelity with the untruncated state: estimate %.4f, lower bound %.4f", e,
                chains.get(chains.size() - 1).energyPerSpin(), tight.truncations(),
                tight.discardedWeight(), tight.fidelityEstimate(), tight.fidelityLowerBound()));
        return new Report(depths, chains, tight);
    }

    /**
     * Runs the example: {@code [layers [longest chain]]}.
     *
     * @param args optional layers and longest chain
     */
    public static void main(String[] args) {
        try {
            fromArgs(args, System.out);
        } catch (UsageException e) {
            System.err.println("ising: " + e.getMessage());
            System.exit(Main.EXIT_USAGE);
        }
    }

    /** Reads {@code [layers [longest]]} and runs; for the launcher. */
    static void fromArgs(String[] args, PrintStream out) {
        Args.requireAtMost(args, 2, "ising [layers [longest chain]]");
        int layers = whole(args, 0, DEFAULT_LAYERS, "layers");
        int longest = whole(args, 1, DEFAULT_LONGEST, "the longest chain");
        run(out, layers, longest);
    }

    private static int whole(String[] args, int index, int fallback, String what) {
        if (index >= args.length) {
            return fallback;
        }
        try {
            return Integer.parseInt(args[index].trim());
        } catch (NumberFormatException e) {
            throw new UsageException(what + " must be a whole number, got '" + args[index]
                    + "'", e);
        }
    }
}
