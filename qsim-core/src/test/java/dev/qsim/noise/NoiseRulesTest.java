package dev.qsim.noise;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Simulator;
import dev.qsim.text.QasmReader;

/** Noise rules bind to catalogue entries, whatever name the rule or the circuit uses. */
class NoiseRulesTest {

    /** X on qubit 0, then a CNOT written as OpenQASM's cx: ideally "11" with certainty. */
    private static final Circuit FROM_FILE = QasmReader.read("OPENQASM 3;\n"
            + "include \"stdgates.inc\";\nqubit[2] q;\nbit[2] c;\n"
            + "x q[0];\ncx q[0], q[1];\nc = measure q;\n");

    @Test
    void aRuleWrittenWithTheOpenQasmNameAddsItsNoiseToACircuitReadFromAFile() {
        // A bit flip of probability 1 on each qubit after the CNOT turns "11" into "00"; a bit
        // flip of probability p gives P(00) = p^2, P(01) = P(10) = p(1-p), P(11) = (1-p)^2
        // (independent flips, Nielsen and Chuang 2010, §8.3.3). Exact, from the density matrix.
        assertSame(Gate.CNOT, FROM_FILE.instructions().get(1).gate());
        double p = 0.1;
        double[] expected = {p * p, p * (1 - p), p * (1 - p), (1 - p) * (1 - p)};
        for (String name : new String[] {"cx", "CX", "cnot", "CNOT"}) {
            NoiseModel model = NoiseModel.builder().afterGate(name, Channel.bitFlip(p)).build();
            double[] got = Simulator.seeded(1).withNoise(model).distribution(FROM_FILE);
            assertArrayEquals(expected, got, 1e-15, name);
        }
        // A rule on X follows the X only: qubit 0 flips back to 0 before the CNOT, which then
        // does nothing, so "00" is certain.
        NoiseModel onX = NoiseModel.builder().afterGate(Gate.X, Channel.bitFlip(1)).build();
        assertEquals(1.0, Simulator.seeded(1).withNoise(onX).distribution(FROM_FILE)[0], 1e-15);
    }

    @Test
    void rulesOnExactQubitsUseTheCatalogueToo() {
        NoiseModel model = NoiseModel.builder()
                .afterGateOn("cx", Channel.bitFlip(1).tensor(Channel.identity(1)), 0, 1).build();
        // The two-qubit channel acts on (control, target), its low factor on the control
        // (tensor order of the package conventions): the target flips back to 0, leaving "01".
        double[] got = Simulator.seeded(1).withNoise(model).distribution(FROM_FILE);
        assertEquals(1.0, got[1], 1e-15);
    }

    @Test
    void unknownNamesAreRefusedWithTheKnownOnes() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> NoiseModel.builder().afterGate("cnott", Channel.bitFlip(0.1)));
        assertTrue(e.getMessage().contains("'cnott'") && e.getMessage().contains("cnot (cx)")
                && e.getMessage().contains("sDagger (sdg)"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> NoiseModel.builder().afterGateOn("", Channel.bitFlip(0.1), 0));
        assertTrue(e.getMessage().contains("unknown gate ''"), e.getMessage());
    }
}
