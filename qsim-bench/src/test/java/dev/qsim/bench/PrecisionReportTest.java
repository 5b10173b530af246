package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.util.List;

import org.junit.jupiter.api.Test;

class PrecisionReportTest {
    /** Unit roundoff of IEEE 754 binary32 (Higham 2002, §2.1, Table 2.1): 2^-24. */
    private static final double U = Math.scalb(1.0, -24);

    private static String[] run(String... args) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int status = PrecisionReport.run(args, new PrintStream(out, true, StandardCharsets.UTF_8),
                new PrintStream(err, true, StandardCharsets.UTF_8));
        return new String[] {Integer.toString(status), out.toString(StandardCharsets.UTF_8),
            err.toString(StandardCharsets.UTF_8)};
    }

    @Test
    void driftStaysWithinTheRoundingBound() {
        String[] r = run("--qubits", "8", "--gates", "300", "--seed", "11", "--threads", "1");
        assertEquals("0", r[0], r[2]);
        List<String> lines = r[1].lines().filter(l -> !l.startsWith("#")).skip(1)
                .collect(java.util.stream.Collectors.toList());
        // Checkpoints at 10 and 100 gates and at the end, then the whole circuit.
        assertEquals(4, lines.size(), r[1]);
        int[] gates = {10, 100, 300, 300};
        for (int k = 0; k < lines.size(); k++) {
            String[] f = lines.get(k).split(",");
            assertEquals(k < 3 ? "gate-by-gate" : "whole-circuit", f[0]);
            assertEquals(gates[k], Integer.parseInt(f[1]));
            double doubleDrift = Double.parseDouble(f[2]);
            double singleDrift = Double.parseDouble(f[3]);
            double infidelity = Double.parseDouble(f[4]);
            double maxDiff = Double.parseDouble(f[5]);
            // Higham 2002, §2.1 (Theorem 2.2): each rounded gate changes the norm by at most a
            // relative u, so after G gates |norm - 1| <= G u (+ the double path's own drift,
            // bounded the same way with 2^-53). A single state really is rounded: the
            // amplitudes differ from double.
            assertTrue(singleDrift <= gates[k] * U + 1e-12, lines.get(k));
            assertTrue(doubleDrift <= gates[k] * Math.scalb(1.0, -53) * 4, lines.get(k));
            assertTrue(infidelity <= 4 * gates[k] * U, lines.get(k));
            assertTrue(maxDiff > 0 && maxDiff <= 2 * gates[k] * U, lines.get(k));
        }
    }

    @Test
    void badOptionsAreRefusedWithTheirValue() {
        String[] r = run("--qubits", "40");
        assertEquals("1", r[0]);
        assertTrue(r[2].contains("--qubits must be in [2, 26] but was 40"), r[2]);
        r = run("--gates", "many");
        assertEquals("1", r[0]);
        assertTrue(r[2].contains("'many'"), r[2]);
        r = run("--colour");
        assertEquals("1", r[0]);
        assertTrue(r[2].contains("unknown option '--colour'"), r[2]);
        r = run("--help");
        assertEquals("0", r[0]);
        assertTrue(r[1].startsWith("usage:"), r[1]);
    }
}
