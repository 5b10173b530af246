package dev.qsim.bench.observable;

import java.util.concurrent.TimeUnit;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

import dev.qsim.Circuit;
import dev.qsim.StateVector;
import dev.qsim.bench.KernelNote;
import dev.qsim.observable.Expectation;
import dev.qsim.observable.Gradients;
import dev.qsim.observable.Observable;
import dev.qsim.observable.TunableCircuit;

/**
 * The cost of the adjoint gradient (Jones and Gacon 2020, arXiv:2009.02823) of a variational
 * circuit against one forward simulation of the same circuit, and against one exact expectation
 * value of the observable. The workload: {@code n} qubits, {@code params} ry rotations each with
 * its own parameter, swept over the qubits in order with a CNOT ladder after every sweep, and a
 * seeded random observable of {@code terms} Pauli products of weight 2 to 4.
 *
 * <p>The adjoint sweep costs about three forward simulations (forward, then each gate undone on
 * two states) plus one pass over the state per parameter and per observable term.
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 2, time = 2)
@Measurement(iterations = 3, time = 3)
@Fork(value = 1, jvmArgsAppend = {"-Xmx2g", "--add-modules", "jdk.incubator.vector"})
public class GradientBenchmark {

    /** Seed of the angles and the observable. */
    static final long SEED = 20_200_902L;

    /** Creates the benchmark; JMH calls this. */
    public GradientBenchmark() {
        // The workload holds the data.
    }

    /** The circuit, angles, observable and bound circuit of one parameter combination. */
    @State(Scope.Benchmark)
    public static class Workload {
        /** Qubits. */
        @Param({"20"})
        int n;

        /** Parameterised rotations, one parameter each. */
        @Param({"200"})
        int params;

        /** Terms of the observable. */
        @Param({"50"})
        int terms;

        /** Threads the states' kernels may use. */
        @Param({"1"})
        int threads;

        /** The parameterised circuit. */
        TunableCircuit circuit;

        /** The parameter values. */
        double[] values;

        /** The observable. */
        Observable observable;

        /** The circuit bound to {@link #values}. */
        Circuit bound;

        /** The start state, |0...0> with the thread setting. */
        StateVector start;

        /** The state after the circuit. */
        StateVector finalState;

        /** Creates the workload; JMH calls this and then sets the parameters. */
        public Workload() {
            // Parameters are injected by JMH before setUp().
        }

        /** Builds the seeded workload. */
        @Setup
        public void setUp() {
            KernelNote.once();
            circuit = circuit(n, params);
            values = values(params, SEED);
            observable = observable(n, terms, SEED + 1);
            bound = circuit.bind(values);
            start = StateVector.zero(n).setThreads(threads);
            finalState = start.copy().apply(bound);
        }
    }

    /**
     * Returns {@code params} ry rotations swept over the qubits, a CNOT ladder after each sweep.
     *
     * @param n qubits, at least 2
     * @param params the number of rotations (and parameters)
     * @return the circuit, parameters {@code t0, t1, ...}
     */
    static TunableCircuit circuit(int n, int params) {
        TunableCircuit.Builder b = TunableCircuit.builder(n);
        for (int j = 0; j < params; j++) {
            b.ry(j % n, "t" + j);
            if (j % n == n - 1) {
                for (int q = 0; q + 1 < n; q++) {
                    b.cnot(q, q + 1);
                }
            }
        }
        return b.build();
    }

    /**
     * Returns seeded angles in [-π, π).
     *
     * @param count how many
     * @param seed the seed
     * @return the angles
     */
    static double[] values(int count, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        double[] v = new double[count];
        for (int j = 0; j < count; j++) {
            v[j] = Math.PI * (2 * rng.nextDouble() - 1);
        }
        return v;
    }

    /**
     * Returns a seeded observable of {@code terms} Pauli products of weight 2 to 4 on distinct
     * random qubits, weights in [-1, 1).
     *
     * @param n qubits, at least 4
     * @param terms the number of terms
     * @param seed the seed
     * @return the observable
     */
    static Observable observable(int n, int terms, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        Observable.Builder b = Observable.builder();
        for (int k = 0; k < terms; k++) {
            int weight = 2 + rng.nextInt(3);
            StringBuilder sb = new StringBuilder();
            long used = 0;
            while (Long.bitCount(used) < weight) {
                int q = rng.nextInt(n);
                if ((used & (1L << q)) == 0) {
                    used |= 1L << q;
                    sb.append(sb.length() == 0 ? "" : " ").append("XYZ".charAt(rng.nextInt(3)))
                            .append(q);
                }
            }
            b.add(2 * rng.nextDouble() - 1, sb.toString());
        }
        return b.build();
    }

    /**
     * The gradient of {@code <H>} with respect to every parameter, by adjoint differentiation.
     *
     * @param w the workload
     * @return the gradient
     */
    @Benchmark
    public double[] adjointGradient(Workload w) {
        return Gradients.adjoint(w.circuit, w.values, w.observable, w.start);
    }

    /**
     * One forward simulation of the bound circuit from |0...0>.
     *
     * @param w the workload
     * @return the final state
     */
    @Benchmark
    public StateVector forwardSimulation(Workload w) {
        return w.start.copy().apply(w.bound);
    }

    /**
     * One exact expectation value of the observable in the final state.
     *
     * @param w the workload
     * @return {@code <ψ|H|ψ>}
     */
    @Benchmark
    public double expectation(Workload w) {
        return Expectation.of(w.observable, w.finalState);
    }
}
