/**
 * qsim: a pure-Java quantum circuit simulator to embed in JVM code.
 *
 * <p>The public API is the package {@code dev.qsim}. The kernels in {@code dev.qsim.kernel}
 * are internal and not exported.
 */
module dev.qsim {
    requires transitive org.apache.commons.numbers.complex;
    requires transitive org.apache.commons.rng.api;
    requires org.apache.commons.rng.simple;
    requires org.apache.commons.statistics.distribution;
    requires org.apache.commons.statistics.inference;

    exports dev.qsim;
    exports dev.qsim.noise;
    exports dev.qsim.stabilizer;
    exports dev.qsim.text;
    exports dev.qsim.stats;
    exports dev.qsim.observable;
}
