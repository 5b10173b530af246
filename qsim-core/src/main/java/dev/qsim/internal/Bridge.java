package dev.qsim.internal;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.Precision;
import dev.qsim.StateVector;
import dev.qsim.Tally;
import dev.qsim.kernel.Amplitudes;
import dev.qsim.mps.MatrixProductState;
import dev.qsim.noise.DensityMatrix;
import dev.qsim.noise.NoiseModel;
import dev.qsim.stabilizer.StabilizerTableau;

/**
 * The one bridge between qsim's packages: the storage behind the public state types, and the
 * engines the run facade ({@link dev.qsim.Simulator}) reaches in other packages, without making
 * either public. Each part is registered once, by the static initialiser of the class that owns
 * it ({@link StateVector}, {@link DensityMatrix}, {@link StabilizerTableau},
 * {@link MatrixProductState}); a second registration is refused. Internal: this package is not
 * exported, and nothing here checks arguments.
 */
public final class Bridge {
    /** Access to a {@link StateVector}'s storage. */
    public interface States {
        /**
         * Returns the state's storage as it is (either precision, lazy frame possibly pending;
         * the storage's public accessors settle the frame before any read or write).
         *
         * @param state the state
         * @return its storage
         */
        Amplitudes store(StateVector state);

        /**
         * Returns the state's amplitudes in double precision: the storage itself, or a widened
         * copy (heap-checked) of a single-precision state.
         *
         * @param state the state
         * @return double-precision amplitudes
         * @throws IllegalStateException if the heap cannot hold the copy
         */
        Amplitudes doubles(StateVector state);

        /**
         * Wraps storage as a state that owns it.
         *
         * @param amplitudes the storage, normalised
         * @param threads the state's thread count
         * @return the state
         */
        StateVector wrap(Amplitudes amplitudes, int threads);

        /**
         * Applies one gate instruction to a state in place, through the engine's gate path.
         *
         * @param state the state. Modified.
         * @param gate a gate instruction on the state's qubits
         */
        void apply(StateVector state, Instruction gate);
    }

    /** Access to a {@link DensityMatrix}'s storage: the vectorised matrix on 2n qubits. */
    public interface Densities {
        /**
         * Returns the storage: entry (r, c) is amplitude {@code r | c << n}.
         *
         * @param rho the density matrix
         * @return its storage
         */
        Amplitudes store(DensityMatrix rho);

        /**
         * Wraps storage of {@code 2n} qubits as an n-qubit density matrix that owns it.
         *
         * @param amplitudes the storage
         * @param threads the thread count
         * @return the density matrix
         */
        DensityMatrix wrap(Amplitudes amplitudes, int threads);
    }

    /** The stabilizer engine (package {@code dev.qsim.stabilizer}). */
    public interface Tableaus {
        /**
         * Runs a Clifford circuit for a number of shots.
         *
         * @param circuit a circuit that {@link Circuit#isClifford()}
         * @param shots at least 1
         * @param seed the seed
         * @return the tally of the classical register
         */
        Tally run(Circuit circuit, int shots, long seed);

        /**
         * Returns the stabilizer state after one seeded shot.
         *
         * @param circuit a Clifford circuit
         * @param seed the seed
         * @return the table
         */
        StabilizerTableau stateAfter(Circuit circuit, long seed);
    }

    /** The noise engines (package {@code dev.qsim.noise}). */
    public interface Noise {
        /**
         * Returns the density matrix after a circuit under a noise model: gates each followed by
         * their noise, resets as channels, measurements (without their readout error) as the
         * loss of coherence they cause; the ensemble over all outcomes.
         *
         * @param circuit a circuit without conditioned blocks
         * @param model the noise model
         * @param threads threads
         * @return the density matrix
         */
        DensityMatrix densityMatrix(Circuit circuit, NoiseModel model, int threads);

        /**
         * Returns the exact distribution of the classical register, readout error included.
         *
         * @param circuit a circuit whose measurements come last
         * @param model the noise model
         * @param threads threads
         * @return {@code 2^clbits} probabilities, index = register value
         */
        double[] distribution(Circuit circuit, NoiseModel model, int threads);

        /**
         * Returns the exact distribution of the classical register of any circuit, conditions
         * and mid-circuit measurements included, by evolving one unnormalised density matrix
         * per value of the register.
         *
         * @param circuit a circuit of at most 26 classical bits
         * @param model the noise model
         * @param threads threads
         * @param budgetBytes the most bytes the density matrices may hold at once
         * @return {@code 2^clbits} probabilities, index = register value
         * @throws IllegalStateException if the register values to track exceed the budget
         */
        double[] branchDistribution(Circuit circuit, NoiseModel model, int threads,
                long budgetBytes);

        /**
         * Runs Monte Carlo wave-function trajectories {@code first} to
         * {@code first + shots - 1} of the seed's ensemble, one shot each.
         *
         * @param circuit any circuit with at most 63 classical bits
         * @param model the noise model
         * @param first the index of the first trajectory, at least 0
         * @param shots the trajectory count
         * @param seed the seed
         * @param threads threads
         * @param precision the state vectors' precision
         * @return the tally
         */
        Tally trajectories(Circuit circuit, NoiseModel model, long first, int shots, long seed,
                int threads, Precision precision);

        /**
         * Returns the state at the end of trajectory 0.
         *
         * @param circuit any circuit
         * @param model the noise model
         * @param seed the seed
         * @param threads threads
         * @param precision the state's precision
         * @return the state
         */
        StateVector trajectoryState(Circuit circuit, NoiseModel model, long seed, int threads,
                Precision precision);

        /**
         * Counts the work of a noisy run without running it: one density matrix, or the given
         * number of trajectories.
         *
         * @param circuit the circuit
         * @param model the noise model
         * @param densityMatrix whether the density-matrix engine runs it (else trajectories)
         * @param shots the shots
         * @param threads threads
         * @return the counted work
         */
        EngineWork work(Circuit circuit, NoiseModel model, boolean densityMatrix, int shots,
                int threads);
    }

    /** The matrix-product-state engine (package {@code dev.qsim.mps}). */
    public interface MatrixProducts {
        /**
         * Checks a bond limit and a truncation threshold.
         *
         * @param bondLimit the most Schmidt values kept across a bond
         * @param truncation the largest share of weight one split may drop
         * @throws IllegalArgumentException if either is out of range
         */
        void requireSettings(int bondLimit, double truncation);

        /**
         * Runs a circuit for a number of shots.
         *
         * @param circuit any ideal circuit
         * @param shots at least 1
         * @param seed the seed
         * @param bondLimit the bond limit
         * @param truncation the truncation threshold
         * @return the tally of the classical register
         */
        Tally run(Circuit circuit, int shots, long seed, int bondLimit, double truncation);

        /**
         * Returns the state after one seeded shot.
         *
         * @param circuit any ideal circuit
         * @param seed the seed
         * @param bondLimit the bond limit
         * @param truncation the truncation threshold
         * @return the state
         */
        MatrixProductState stateAfter(Circuit circuit, long seed, int bondLimit,
                double truncation);
    }

    private static volatile States states;
    private static volatile Densities densities;
    private static volatile Tableaus tableaus;
    private static volatile Noise noise;
    private static volatile MatrixProducts matrixProducts;

    private Bridge() {
    }

    private static <T> T once(T current, T next, String what) {
        if (current != null) {
            throw new IllegalStateException("the " + what + " bridge is already registered");
        }
        if (next == null) {
            throw new NullPointerException(what);
        }
        return next;
    }

    /**
     * Registers the state-vector bridge; called once, by {@link StateVector}.
     *
     * @param s the implementation
     * @throws IllegalStateException if one is registered already
     */
    public static synchronized void register(States s) {
        states = once(states, s, "state-vector");
    }

    /**
     * Registers the density-matrix bridge; called once, by {@link DensityMatrix}.
     *
     * @param d the implementation
     * @throws IllegalStateException if one is registered already
     */
    public static synchronized void register(Densities d) {
        densities = once(densities, d, "density-matrix");
    }

    /**
     * Registers the stabilizer engine; called once, by {@link StabilizerTableau}.
     *
     * @param t the implementation
     * @throws IllegalStateException if one is registered already
     */
    public static synchronized void register(Tableaus t) {
        tableaus = once(tableaus, t, "stabilizer engine");
    }

    /**
     * Registers the noise engines; called once, by {@link NoiseModel}.
     *
     * @param n the implementation
     * @throws IllegalStateException if one is registered already
     */
    public static synchronized void register(Noise n) {
        noise = once(noise, n, "noise engine");
    }

    /**
     * Registers the matrix-product-state engine; called once, by {@link MatrixProductState}.
     *
     * @param m the implementation
     * @throws IllegalStateException if one is registered already
     */
    public static synchronized void register(MatrixProducts m) {
        matrixProducts = once(matrixProducts, m, "matrix-product-state engine");
    }

    /** Runs the static initialiser of the class that registers a part. */
    private static void initialise(Class<?> owner) {
        try {
            Class.forName(owner.getName(), true, owner.getClassLoader());
        } catch (ClassNotFoundException e) {
            throw new IllegalStateException(e);
        }
    }

    /**
     * Returns the state-vector bridge.
     *
     * @return the implementation
     */
    public static States states() {
        States s = states;
        if (s == null) {
            initialise(StateVector.class);
            s = states;
        }
        return s;
    }

    /**
     * Returns the density-matrix bridge.
     *
     * @return the implementation
     */
    public static Densities densities() {
        Densities d = densities;
        if (d == null) {
            initialise(DensityMatrix.class);
            d = densities;
        }
        return d;
    }

    /**
     * Returns the stabilizer engine.
     *
     * @return the implementation
     */
    public static Tableaus tableaus() {
        Tableaus t = tableaus;
        if (t == null) {
            initialise(StabilizerTableau.class);
            t = tableaus;
        }
        return t;
    }

    /**
     * Returns the noise engines.
     *
     * @return the implementation
     */
    public static Noise noise() {
        Noise n = noise;
        if (n == null) {
            initialise(NoiseModel.class);
            n = noise;
        }
        return n;
    }

    /**
     * Returns the matrix-product-state engine.
     *
     * @return the implementation
     */
    public static MatrixProducts matrixProducts() {
        MatrixProducts m = matrixProducts;
        if (m == null) {
            initialise(MatrixProductState.class);
            m = matrixProducts;
        }
        return m;
    }
}
