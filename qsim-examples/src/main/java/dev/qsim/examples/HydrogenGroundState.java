package dev.qsim.examples;

import java.io.PrintStream;
import java.util.Objects;

import dev.qsim.StateVector;
import dev.qsim.observable.Estimate;
import dev.qsim.observable.Expectation;
import dev.qsim.observable.Gradients;
import dev.qsim.observable.Observable;
import dev.qsim.observable.TunableCircuit;

/**
 * Variational ground-state search for the hydrogen molecule in the minimal STO-3G basis at the
 * bond length R = 1.4 bohr (0.7408 Å), reduced to two qubits; the scenario is an invented
 * chemistry teaching lab checking its first variational run against the textbook.
 *
 * <h2>The Hamiltonian</h2>
 * Integrals over the two molecular orbitals σg (1) and σu (2) from Szabo and Ostlund (1996),
 * <i>Modern Quantum Chemistry</i>, Dover, §3.5.2 (values from memory): {@code h11 = -1.2528},
 * {@code h22 = -0.4756}, {@code J11 = 0.6746}, {@code J22 = 0.6975}, {@code J12 = 0.6636},
 * {@code K12 = 0.1813} hartree; nuclear repulsion {@code 1/R = 1/1.4}. Their consistency with the
 * book's orbital energies ({@code ε1 = h11 + J11 = -0.5782}, {@code ε2 = h22 + 2J12 - K12 =
 * 0.6703}) and Hartree-Fock energy ({@code 2h11 + J11 + 1/R = -1.1167}) is checked in the test.
 *
 * <p>With one α and one β electron, qubit 1 says whether the α electron is in σu and qubit 0
 * whether the β electron is: the four determinants of the two-electron singlet/triplet (Ms = 0)
 * space, so two qubits suffice. The diagonal energies are
 * {@code E00 = 2h11 + J11}, {@code E11 = 2h22 + J22}, {@code E01 = E10 = h11 + h22 + J12}, and the
 * double excitations {@code 00 ↔ 11} and {@code 01 ↔ 10} have matrix element {@code K12}
 * (Szabo and Ostlund, §2.3 and §4.1, Slater rules), so
 * <pre>
 *   H = c0 + c1 (Z0 + Z1) + c2 Z0 Z1 + K12 X0 X1,
 *   c0 = [(E00 + E11)/2 + E01]/2 + 1/R,  c1 = (E00 - E11)/4,  c2 = [(E00 + E11)/2 - E01]/2.
 * </pre>
 * The lowest eigenvalue is the full-CI energy of the basis, -1.1373 hartree (Szabo and Ostlund,
 * §4.1; from memory).
 *
 * <h2>The search</h2>
 * Ansatz {@code CNOT(0→1)·ry(θ)|00> = cos(θ/2)|00> + sin(θ/2)|11>}, which spans the ground
 * state's symmetry sector; {@link SteepestDescent} with adjoint gradients
 * ({@link Gradients#adjoint}) prints energy and gradient per iteration, then a shot-based
 * estimate of the final energy with its standard error.
 */
public final class HydrogenGroundState {

    /** Bond length in bohr (Szabo and Ostlund 1996, §3.5.2). */
    public static final double BOND_LENGTH_BOHR = 1.4;
    /** Core integral of σg, hartree. */
    static final double H11 = -1.2528;
    /** Core integral of σu, hartree. */
    static final double H22 = -0.4756;
    /** Coulomb integral (11|11), hartree. */
    static final double J11 = 0.6746;
    /** Coulomb integral (22|22), hartree. */
    static final double J22 = 0.6975;
    /** Coulomb integral (11|22), hartree. */
    static final double J12 = 0.6636;
    /** Exchange integral (12|21), hartree. */
    static final double K12 = 0.1813;

    /** Seed used when none is given. */
    public static final long DEFAULT_SEED = 2_016L;
    /** Shots per measurement setting used when none are given. */
    public static final int DEFAULT_SHOTS = 20_000;
    /** Most descent iterations. */
    static final int MAX_ITERATIONS = 200;
    /** Gradient norm at which the search stops. */
    static final double TOLERANCE = 1e-9;

    private HydrogenGroundState() {
    }

    /**
     * Returns the two-qubit Hamiltonian of the class documentation, in hartree, nuclear
     * repulsion included.
     *
     * @return the observable
     */
    public static Observable hamiltonian() {
        double e00 = 2 * H11 + J11;
        double e11 = 2 * H22 + J22;
        double e01 = H11 + H22 + J12;
        double c0 = ((e00 + e11) / 2 + e01) / 2 + 1 / BOND_LENGTH_BOHR;
        double c1 = (e00 - e11) / 4;
        double c2 = ((e00 + e11) / 2 - e01) / 2;
        return Observable.builder().add(c0, "I").add(c1, "Z0").add(c1, "Z1").add(c2, "Z0 Z1")
                .add(K12, "X0 X1").build();
    }

    /**
     * Writes a Hamiltonian for the report: each weight to six decimals with trailing zeros
     * dropped (the integrals have four), signs between the terms, as in
     * {@code -0.339289 I - 0.394325 Z0 + 0.1813 X0 X1}. ({@link Observable#toString()} writes
     * every digit of each double, such as {@code 0.01122500000000004}.)
     *
     * @param h the observable
     * @return the text
     */
    static String terms(Observable h) {
        StringBuilder sb = new StringBuilder();
        for (int k = 0; k < h.size(); k++) {
            double w = h.weight(k);
            String digits = new java.math.BigDecimal(Text.f("%.6f", Math.abs(w)))
                    .stripTrailingZeros().toPlainString();
            sb.append(k == 0 ? (w < 0 ? "-" : "") : (w < 0 ? " - " : " + ")).append(digits)
                    .append(' ').append(h.product(k));
        }
        return sb.length() == 0 ? "0" : sb.toString();
    }

    /**
     * Returns the one-parameter ansatz {@code CNOT(0→1)·ry(θ) on qubit 0}; θ = 0 is the
     * Hartree-Fock determinant {@code |00>}.
     *
     * @return the circuit, parameter {@code "theta"}
     */
    public static TunableCircuit ansatz() {
        return TunableCircuit.builder(2).ry(0, "theta").cnot(0, 1).build();
    }

    /**
     * What the search found.
     *
     * @param energy the final exact energy, hartree
     * @param theta the final angle
     * @param iterations descent iterations taken
     * @param hartreeFock the energy at θ = 0, hartree
     * @param estimate the shot-based estimate of the final energy
     */
    public record Result(double energy, double theta, int iterations, double hartreeFock,
            Estimate estimate) {
    }

    /**
     * Runs the search and prints its convergence and the final energies.
     *
     * @param out where the report goes
     * @param seed the seed of the shot-based estimate
     * @param shots shots per measurement setting, at least 2
     * @return the result
     */
    public static Result run(PrintStream out, long seed, int shots) {
        Objects.requireNonNull(out, "out");
        if (shots < 2) {
            throw new UsageException("shots must be at least 2 for a standard error, got "
                    + shots);
        }
        Observable h = hamiltonian();
        TunableCircuit ansatz = ansatz();
        Text.title(out, "H2 ground state, STO-3G, R = 1.4 bohr, two qubits");
        out.println("H = " + terms(h));
        out.println();
        out.println(" iter   energy (Ha)        |gradient|");
        SteepestDescent.Objective f = new SteepestDescent.Objective() {
            @Override
            public double value(double[] x) {
                return energy(ansatz, h, x);
            }

            @Override
            public double[] gradient(double[] x) {
                return Gradients.adjoint(ansatz, x, h);
            }
        };
        SteepestDescent.Result r = SteepestDescent.minimise(f, new double[] {0}, MAX_ITERATIONS,
                TOLERANCE, (it, x, value, norm) -> out.println(
                        Text.f("%5d  %.10f  %.3e", it, value, norm)));
        double hf = energy(ansatz, h, new double[] {0});
        StateVector best = StateVector.zero(2).apply(ansatz.bind(r.x()));
        Estimate estimate = Expectation.sampled(h, best, shots, seed);
        out.println();
        out.println(Text.f("Hartree-Fock (theta = 0)   %.6f Ha   (textbook -1.1167)", hf));
        out.println(Text.f("variational minimum        %.6f Ha   (textbook full CI -1.1373)",
                r.value()));
        out.println(Text.f("correlation energy         %.6f Ha   (textbook -0.0206)",
                r.value() - hf));
        out.println(Text.f("theta = %.6f after %s", r.x()[0], Text.count(r.iterations(),
                "iteration")));
        out.println(Text.f("from %s per setting  %.6f ± %.6f Ha (%s, seed %d)",
                Text.count(shots, "shot"), estimate.value(), estimate.standardError(),
                Text.count(estimate.settings(), "setting"), seed));
        return new Result(r.value(), r.x()[0], r.iterations(), hf, estimate);
    }

    private static double energy(TunableCircuit ansatz, Observable h, double[] x) {
        return Expectation.of(h, StateVector.zero(2).apply(ansatz.bind(x)));
    }

    /**
     * Runs the example: {@code [seed [shots]]}.
     *
     * @param args optional seed and shots per setting
     */
    public static void main(String[] args) {
        try {
            fromArgs(args, System.out);
        } catch (UsageException e) {
            System.err.println("hydrogen: " + e.getMessage());
            System.exit(Main.EXIT_USAGE);
        }
    }

    /** Reads {@code [seed [shots]]} and runs; for the launcher. */
    static void fromArgs(String[] args, PrintStream out) {
        Args.requireAtMost(args, 2, "hydrogen [seed [shots]]");
        run(out, Args.seed(args, 0, DEFAULT_SEED), Args.shots(args, 1, DEFAULT_SHOTS));
    }
}
