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

import dev.qsim.Circuit;
import dev.qsim.Precision;
import dev.qsim.StateVector;

/**
 * Time of one gate of each kernel kind applied in place to a state of {@code n} qubits: the
 * kinds of {@link Workloads#kernelCircuit} ({@code dense}, {@code diagonal}, {@code
 * permutation}, {@code controlled}), target qubit {@code low} (0) or {@code high} (n - 1), 1 or 2
 * kernel threads, amplitudes stored in {@code double} or {@code single} precision
 * ({@link Precision}), {@code n} = 20, 22, 24 (16, 64 and 256 MiB in double precision, half that
 * in single; beyond most last-level caches).
 *
 * <p>Each invocation applies a prebuilt one-gate circuit with {@code StateVector.apply(Circuit)},
 * which keeps the state normalised, and returns the state. The state is the seeded product state
 * of {@link Workloads#productState(int, long, Precision)}, stored in the chosen precision; a
 * single-precision gate is widened to double window by window, applied and rounded back by the
 * core, so the pair of rows shows what halving the bytes per amplitude buys.
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(value = 1, jvmArgsAppend = {"-Xmx2g", "--add-modules", "jdk.incubator.vector"})
public class KernelBenchmark {

    /** Creates the benchmark; JMH calls this. */
    public KernelBenchmark() {
        // The workload holds the data.
    }

    /** The state and gate of one parameter combination; fields are not final. */
    @State(Scope.Benchmark)
    public static class Workload {
        /** Qubit count: state of 2^n amplitudes, 16 bytes each (8 in single precision). */
        @Param({"20", "22", "24"})
        int n;

        /** Kernel kind: dense, diagonal, permutation or controlled. */
        @Param({"dense", "diagonal", "permutation", "controlled"})
        String kernel;

        /** Target qubit: low (0) or high (n - 1). */
        @Param({"low", "high"})
        String target;

        /** Threads the state's kernels may use. */
        @Param({"1", "2"})
        int threads;

        /** Storage of the amplitudes: double (16 bytes each) or single (8 bytes each). */
        @Param({"double", "single"})
        String precision;

        /** The state the gate is applied to; changed in place by every invocation. */
        StateVector state;

        /** The one-gate circuit. */
        Circuit gate;

        /** Creates the workload; JMH calls this and then sets the parameters. */
        public Workload() {
            // Parameters are injected by JMH before setUp().
        }

        /**
         * Builds the seeded state of {@code n} qubits in the chosen precision, and the gate.
         *
         * @throws IllegalArgumentException if a parameter is not one of the allowed values
         * @throws IllegalStateException if the heap cannot hold the state
         */
        @Setup
        public void setUp() {
            KernelNote.once();
            final Precision p = Workloads.precision(precision);
            gate = Workloads.kernelCircuit(kernel, n, Workloads.target(target, n));
            state = Workloads.productState(n, Workloads.STATE_SEED, p).setThreads(threads);
        }
    }

    /**
     * Applies the gate once.
     *
     * @param w the workload
     * @return the state, changed in place
     */
    @Benchmark
    public StateVector applyGate(Workload w) {
        return w.state.apply(w.gate);
    }

    /**
     * Applies the gate once and reads one probability. X and single-qubit phase gates are kept
     * in the core's lazy frame, which the read applies in one pass, so for those kinds this is
     * the cost of a gate that is read at once; for the others it equals {@link #applyGate}.
     *
     * @param w the workload
     * @return the probability of the all-zero basis state
     */
    @Benchmark
    public double applyGateThenRead(Workload w) {
        return w.state.apply(w.gate).probability(0);
    }
}
