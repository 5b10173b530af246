package dev.qsim.bench.text;

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
import dev.qsim.text.QasmReader;

/**
 * Time of reading an OpenQASM 3 program of {@code gates} gate statements on 20 qubits (h, x,
 * t, s, sdg, sx, rz with a random angle, cx, cp with an angle pi/k) with
 * {@code QasmReader.read(String)}: tokens, parsing, expansion and the circuit. Reading should be
 * linear in the text: time per gate the same at 10^4, 10^5 and 10^6 gates. One call of the
 * largest is about a second, so each is timed once ({@code SingleShotTime}).
 */
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3)
@Measurement(iterations = 5)
@Fork(value = 1, jvmArgsAppend = "-Xmx2g")
public class QasmReadBenchmark {

    /** Seed of the random program. */
    static final long PROGRAM_SEED = 20_261_205L;

    /** Creates the benchmark; JMH calls this. */
    public QasmReadBenchmark() {
        // The workload holds the data.
    }

    /** The program text of one size; fields are not final. */
    @State(Scope.Benchmark)
    public static class Workload {
        /** Gate statements. */
        @Param({"10000", "100000", "1000000"})
        int gates;

        /** The program. */
        String text;

        /** Creates the workload; JMH calls this and then sets the parameters. */
        public Workload() {
            // Parameters are injected by JMH before setUp().
        }

        /** Writes the seeded program. */
        @Setup
        public void setUp() {
            text = program(gates, PROGRAM_SEED);
        }
    }

    /**
     * Writes a program of {@code gates} random gate statements on a 20-qubit register.
     *
     * @param gates number of gate statements
     * @param seed seed of the choice
     * @return the program text
     */
    static String program(int gates, long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        String[] one = {"h", "x", "t", "s", "sdg", "sx"};
        StringBuilder sb = new StringBuilder("OPENQASM 3.0;\ninclude \"stdgates.inc\";\n"
                + "qubit[20] q;\n");
        for (int k = 0; k < gates; k++) {
            int q = rnd.nextInt(20);
            int r = (q + 1 + rnd.nextInt(19)) % 20;
            switch (rnd.nextInt(4)) {
                case 0:
                    sb.append(one[rnd.nextInt(one.length)]).append(" q[").append(q)
                            .append("];\n");
                    break;
                case 1:
                    sb.append("rz(").append(rnd.nextDouble()).append(") q[").append(q)
                            .append("];\n");
                    break;
                case 2:
                    sb.append("cx q[").append(q).append("], q[").append(r).append("];\n");
                    break;
                default:
                    sb.append("cp(pi/").append(1 + rnd.nextInt(8)).append(") q[").append(q)
                            .append("], q[").append(r).append("];\n");
                    break;
            }
        }
        return sb.toString();
    }

    /**
     * Reads the program.
     *
     * @param w the workload
     * @return the circuit, so the work cannot be dropped
     */
    @Benchmark
    public Circuit read(Workload w) {
        return QasmReader.read(w.text);
    }
}
