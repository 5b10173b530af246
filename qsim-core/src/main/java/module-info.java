/**
 * qsim: a pure-Java quantum circuit simulator to embed in JVM code.
 *
 * <p>The public API is seven packages: {@code dev.qsim} (circuits, the gate catalogue, states,
 * tallies and the run facade {@code Simulator}), {@code dev.qsim.noise} (channels, noise models,
 * density matrices), {@code dev.qsim.stabilizer} (the stabilizer tableau), {@code dev.qsim.mps}
 * (matrix product states for wide circuits with little entanglement),
 * {@code dev.qsim.observable} (Pauli products, observables, expectation values, gradients),
 * {@code dev.qsim.stats} (comparing tallies with predictions, fitting error rates, tally files)
 * and {@code dev.qsim.text} (OpenQASM 3). Two packages are internal and not exported:
 * {@code dev.qsim.kernel} (the loops over amplitudes) and {@code dev.qsim.internal} (argument
 * checks, the heap check, the bridge between packages, the JSON reader and the interpreter of
 * classical control). See {@code docs/architecture.md}.
 */
module dev.qsim {
    requires transitive org.apache.commons.numbers.complex;
    requires transitive org.apache.commons.rng.api;
    requires org.apache.commons.rng.simple;
    requires java.management;
    requires org.apache.commons.statistics.distribution;
    requires org.apache.commons.statistics.inference;

    exports dev.qsim;
    exports dev.qsim.noise;
    exports dev.qsim.stabilizer;
    exports dev.qsim.mps;
    exports dev.qsim.text;
    exports dev.qsim.stats;
    exports dev.qsim.observable;
}
