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
import dev.qsim.Simulator;
import dev.qsim.StateVector;

/**
 * Time of one run of the 20-layer circuit of {@link Workloads#layeredCircuit} (random rx, ry,
 * rz on every qubit, then a CZ or CNOT ladder) with {@code Simulator.stateAfter}, gate fusion on
 * or off, 1 or 2 threads, amplitudes stored in {@code double} or {@code single} precision
 * ({@code Simulator.withPrecision}), {@code n} = 20, 22, 24. Each run starts from a newly
 * allocated {@code |0...0>} in that precision, as every {@code stateAfter} call does.
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 2, time = 2)
@Measurement(iterations = 3, time = 2)
@Fork(value = 1, jvmArgsAppend = {"-Xmx2g", "--add-modules", "jdk.incubator.vector"})
public class FusionBenchmark {

    /** Creates the benchmark; JMH calls this. */
    public FusionBenchmark() {
        // The workload holds the data.
    }

    /** The circuit and simulator of one parameter combination; fields are not final. */
    @State(Scope.Benchmark)
    public static class Workload {
        /** Qubit count. */
        @Param({"20", "22", "24"})
        int n;

        /** Whether gates are fused. */
        @Param({"true", "false"})
        boolean fusion;

        /** Threads the kernels may use. */
        @Param({"1", "2"})
        int threads;

        /** Storage of the amplitudes: double (16 bytes each) or single (8 bytes each). */
        @Param({"double", "single"})
        String precision;

        /** The circuit. */
        Circuit circuit;

        /** The simulator with the chosen fusion, threads and precision. */
        Simulator simulator;

        /** Creates the workload; JMH calls this and then sets the parameters. */
        public Workload() {
            // Parameters are injected by JMH before setUp().
        }

        /**
         * Builds the circuit and the simulator.
         *
         * @throws IllegalArgumentException if a parameter is out of range or the precision is
         *     neither {@code double} nor {@code single}
         */
        @Setup
        public void setUp() {
            KernelNote.once();
            circuit = Workloads.layeredCircuit(n, Workloads.CIRCUIT_LAYERS,
                    Workloads.CIRCUIT_SEED);
            simulator = Simulator.seeded(Workloads.CIRCUIT_SEED).withThreads(threads)
                    .withFusion(fusion).withPrecision(Workloads.precision(precision));
        }
    }

    /**
     * Runs the circuit once from |0...0>.
     *
     * @param w the workload
     * @return the final state
     */
    @Benchmark
    public StateVector run(Workload w) {
        return w.simulator.stateAfter(w.circuit);
    }
}
