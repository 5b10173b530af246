package dev.qsim.text;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.net.URISyntaxException;
import java.nio.file.Path;

import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.Simulator;

/**
 * The example file {@code every-construct.qasm} (an invented device's self-test that uses every
 * construct the reader supports) read and simulated: its exact distribution against the one
 * derived by hand in the file's closing comment. The derivation uses ry(θ)|0> =
 * cos(θ/2)|0> + sin(θ/2)|1> (Nielsen and Chuang 2010, §4.2), U(π, 0, π) = X and the other gate
 * definitions of the OpenQASM 3 specification (Cross et al. 2022, doi:10.1145/3505636;
 * stdgates.inc, from memory), the identity of each gate followed by its inverse, and
 * independence of the three random readings (a geometric number of tries for the ancilla).
 */
class EveryConstructTest {

    private static Circuit read() throws IOException, URISyntaxException {
        Path file = Path.of(EveryConstructTest.class.getResource("every-construct.qasm")
                .toURI());
        return QasmReader.read(file, QasmReader.Settings.defaults()
                .withInput("tilt", Math.PI / 3).withTimeStep(1e-9));
    }

    @Test
    void theSelfTestGivesTheDistributionDerivedByHand() throws Exception {
        Circuit c = read();
        assertEquals(5, c.qubits());
        assertEquals(10, c.clbits());
        double[] p = Simulator.seeded(1).distribution(c);
        double[] expected = new double[1 << 10];
        for (int a = 0; a < 2; a++) {
            for (int b = 0; b < 2; b++) {
                for (int f = 0; f < 2; f++) {
                    int value = a + 2 * a + 4 * b + 8 * f + 16 * (a ^ b) + 32 * (a & b) + 64
                            + 256 + 512;
                    expected[value] = (a == 1 ? 0.25 : 0.75) * (b == 1 ? 0.25 : 0.75)
                            * (f == 1 ? 15.0 / 16 : 1.0 / 16);
                }
            }
        }
        for (int v = 0; v < expected.length; v++) {
            // Gate and inverse pairs cancel to rounding (about 1e-15 per amplitude).
            assertEquals(expected[v], p[v], 1e-12, "outcome " + v);
        }
    }

    @Test
    void theSelfTestRecordsEveryInstructionKindAndWritesBackEqual() throws Exception {
        Circuit c = read();
        java.util.EnumSet<Instruction.Kind> kinds = java.util.EnumSet.noneOf(
                Instruction.Kind.class);
        collect(c.instructions(), kinds);
        assertEquals(java.util.EnumSet.allOf(Instruction.Kind.class), kinds);
        assertTrue(c.instructions().stream().anyMatch(Instruction::isDynamic));
        assertEquals(c, QasmReader.read(QasmWriter.write(c)));
        // The loop bound of the annotation, the delays in seconds: 100 ns is 100 / 1e9 (one
        // rounding), 50 dt is 50 times the length of dt, 1e-9 s.
        Instruction loop = c.instructions().stream()
                .filter(i -> i.kind() == Instruction.Kind.WHILE).findFirst().orElseThrow();
        assertEquals(4, loop.maxIterations());
        double[] delays = c.instructions().stream()
                .filter(i -> i.kind() == Instruction.Kind.DELAY)
                .mapToDouble(Instruction::duration).toArray();
        assertEquals(java.util.List.of(1e-7, 2e-6, 1e-6, 3e-3, 1.0, 50 * 1e-9),
                java.util.Arrays.stream(delays).boxed().collect(
                        java.util.stream.Collectors.toList()));
    }

    private static void collect(java.util.List<Instruction> list,
            java.util.Set<Instruction.Kind> kinds) {
        for (Instruction i : list) {
            kinds.add(i.kind());
            collect(i.body(), kinds);
            collect(i.otherwise(), kinds);
        }
    }
}
