package dev.qsim.bench;

import java.util.concurrent.TimeUnit;

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

import dev.qsim.Operator;
import dev.qsim.StateVector;

/**
 * Time of one single-qubit gate applied in place to a state of {@code n} qubits, against
 * {@code n}, the target qubit and the kernel's thread count.
 *
 * <p>The state is built once per trial by {@link Workload#setUp()}; each invocation applies the
 * same unitary again, which keeps the state normalised, and returns the state so the work cannot
 * be dropped. The sizes run from states that fit in the first-level cache (n = 10 is 16 KiB) to
 * one far beyond the last-level cache (n = 26 is 1 GiB), hence {@code -Xmx4g} in the fork.
 * {@link #baseline(Light)} measures the harness's own cost of one call that returns a field.
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(value = 1, jvmArgsAppend = {"-Xmx4g", "--add-modules", "jdk.incubator.vector"})
public class SingleQubitGateBenchmark {

    /** Creates the benchmark; JMH calls this. */
    public SingleQubitGateBenchmark() {
        // Nothing to set up here: the states hold the data.
    }

    /**
     * The state, gate and target of one parameter combination. Fields are not final, so the
     * JIT must read them on every call.
     */
    @State(Scope.Benchmark)
    public static class Workload {
        /** Qubit count: state of 2^n amplitudes, 16 bytes each. */
        @Param({"10", "12", "14", "16", "18", "20", "22", "24", "26"})
        int n;

        /** Target qubit: low (0), mid (n / 2) or high (n - 1). */
        @Param({"low", "mid", "high"})
        String target;

        /** Threads the state's kernels may use. */
        @Param({"1", "2"})
        int threads;

        /** Gate: dense (generic complex unitary), h, rx, ry, t (diagonal) or x (permutation). */
        @Param({"dense"})
        String gate;

        /** The state the gate is applied to; changed in place by every invocation. */
        StateVector state;

        /** The gate. */
        Operator op;

        /** The target qubit as the one-element array passed to {@code apply}. */
        int[] qubits;

        /** Creates the workload; JMH calls this and then sets the parameters. */
        public Workload() {
            // Parameters are injected by JMH before setUp().
        }

        /**
         * Builds the seeded state of {@code n} qubits and resolves the gate and target.
         *
         * @throws IllegalArgumentException if a parameter is not one of the allowed values
         * @throws IllegalStateException if the heap cannot hold the state
         */
        @Setup
        public void setUp() {
            KernelNote.once();
            op = Workloads.gate(gate);
            qubits = new int[] {Workloads.target(target, n)};
            state = Workloads.productState(n, Workloads.STATE_SEED).setThreads(threads);
        }
    }

    /** A small state for the baseline, so it does not run once per size. */
    @State(Scope.Benchmark)
    public static class Light {
        /** A value to return; not final, so it is read on every call. */
        int value = 42;

        /** Creates the state; JMH calls this. */
        public Light() {
            // Field initialiser is enough.
        }
    }

    /**
     * Applies the gate once to the target qubit.
     *
     * @param w the workload
     * @return the state, changed in place
     */
    @Benchmark
    public StateVector applyGate(Workload w) {
        return w.state.apply(w.op, w.qubits);
    }

    /**
     * Returns a field of a state: the cost of the harness around one call.
     *
     * @param light the state
     * @return its value
     */
    @Benchmark
    public int baseline(Light light) {
        return light.value;
    }
}
