package dev.qsim.bench.stabilizer;

import java.util.SplittableRandom;
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
import dev.qsim.Tally;
import dev.qsim.bench.KernelNote;

/**
 * Time of a whole run of a random Clifford circuit on the stabilizer engine: {@code gates}
 * random gates on {@code n} qubits, then a measurement of every qubit, for {@code shots} shots
 * (a fresh table, every gate, every measurement, then the shots and the tally). One call is
 * seconds long, so each is timed once ({@code SingleShotTime}).
 */
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 1)
@Measurement(iterations = 3)
@Fork(value = 1, jvmArgsAppend = {"-Xmx2g", "--add-modules", "jdk.incubator.vector"})
public class CliffordCircuitBenchmark {

    /** Seed of the random circuit. */
    static final long CIRCUIT_SEED = 20_261_201L;

    /** Creates the benchmark; JMH calls this. */
    public CliffordCircuitBenchmark() {
        // The workload holds the data.
    }

    /** The circuit of one parameter combination; fields are not final. */
    @State(Scope.Benchmark)
    public static class Workload {
        /** Qubits. */
        @Param({"1000", "5000"})
        int n;

        /** Random Clifford gates before the measurements. */
        @Param({"100000"})
        int gates;

        /** Shots sampled from the one simulation. */
        @Param({"1", "1000"})
        int shots;

        /** The circuit: random gates, then measure every qubit. */
        Circuit circuit;

        /** The run facade on the stabilizer engine, seed 1. */
        final Simulator tableau = Simulator.seeded(1L).withEngine(Simulator.Engine.TABLEAU);

        /** Creates the workload; JMH calls this and then sets the parameters. */
        public Workload() {
            // Parameters are injected by JMH before setUp().
        }

        /** Builds the seeded circuit. */
        @Setup
        public void setUp() {
            KernelNote.once();
            circuit = randomCircuit(n, gates, CIRCUIT_SEED);
        }
    }

    /**
     * Builds {@code gates} random gates drawn evenly from h, s, sDagger, x, z, cnot, cz and
     * swap on random qubits, then a measurement of every qubit k into clbit k.
     *
     * @param n qubits, at least 2
     * @param gates number of gates
     * @param seed seed of the choice
     * @return the circuit
     */
    static Circuit randomCircuit(int n, int gates, long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        Circuit.Builder b = Circuit.builder(n);
        for (int k = 0; k < gates; k++) {
            int q = rnd.nextInt(n);
            int r = (q + 1 + rnd.nextInt(n - 1)) % n;
            switch (rnd.nextInt(8)) {
                case 0:
                    b.h(q);
                    break;
                case 1:
                    b.s(q);
                    break;
                case 2:
                    b.sDagger(q);
                    break;
                case 3:
                    b.x(q);
                    break;
                case 4:
                    b.z(q);
                    break;
                case 5:
                    b.cnot(q, r);
                    break;
                case 6:
                    b.cz(q, r);
                    break;
                default:
                    b.swap(q, r);
                    break;
            }
        }
        return b.measure().build();
    }

    /**
     * Runs the circuit and returns its tally.
     *
     * @param w the workload
     * @return the tally, so the work cannot be dropped
     */
    @Benchmark
    public Tally run(Workload w) {
        return w.tableau.run(w.circuit, w.shots);
    }
}
