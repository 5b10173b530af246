package dev.qsim.text;

import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.nio.charset.StandardCharsets;

import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.ShrinkingMode;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

/**
 * Mutated programs and random bytes: the reader either returns a circuit or throws
 * {@link CircuitFormatException} with a line and column, never another exception (a
 * robustness requirement of the issue; common practice for parsers).
 */
class QasmFuzzTest {

    private static final String[] CORPUS = {
        "OPENQASM 3.0;\ninclude \"stdgates.inc\";\nqubit[3] q;\nbit[3] c;\nh q[0];\n"
            + "cx q[0], q[1];\nrz(pi/4 - sin(0.3)^2) q[2];\nc = measure q;\n"
            + "if (c[0] == 1) { x q[1]; reset q[2]; }\n",
        "OPENQASM 3;\ninclude \"stdgates.inc\";\n// comment\ngate g(a, b) x, y { U(a, b, 0) x;"
            + " cp(a * b) x, y; barrier x, y; }\nqubit[2] q;\nbit b;\ng(0.1, -2e-1) q[0], q[1];"
            + "\n/* note */ inv @ g(1, 2) q[1], q[0];\nctrl @ sx q[0], q[1];\nb = measure q[1];\n",
        "include \"stdgates.inc\";\nqubit a;\nqubit[4] r;\nbit[4] m;\nh r;\nccx a, r[0], r[1];"
            + "\ncswap r[3], a, r[2];\nctrl(2) @ gphase(pi) a, r[0];\nmeasure r -> m;\n"
            + "if (m[3] == true) gphase(tau / 3);\n",
    };

    private static final String[] PIECES = {
        "q", "[", "]", "(", ")", "{", "}", ";", ",", "@", "==", "=", "-", "+", "*", "/", "^",
        "**", "->", "pi", "inv", "ctrl", "gate", "if", "measure", "reset", "qubit", "bit",
        "99999999999", "1e400", "0", "1", "2", "\"", "/*", "//", "\n", " ", "h", "cx", "U",
        "gphase", "sqrt(", "ln(0)", "ctrl(3) @", "qubit[1000000] z;", "\u0000", "\uffff", "é",
    };

    private static void check(String text, long seed) {
        try {
            QasmReader.read(text);
        } catch (CircuitFormatException e) {
            assertTrue(e.line() >= 1 && e.column() >= 1, () -> "seed " + seed + ": "
                    + e.getMessage());
            assertTrue(e.getMessage().startsWith("line " + e.line() + ", column " + e.column()),
                    () -> "seed " + seed + ": " + e.getMessage());
        } catch (RuntimeException | StackOverflowError e) {
            fail("seed " + seed + ": " + e + " for text:\n" + text, e);
        }
    }

    @Property(tries = 1500, seed = "7101", shrinking = ShrinkingMode.OFF)
    void mutatedProgramsOnlyGiveTheParseError(@ForAll long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        StringBuilder sb = new StringBuilder(CORPUS[rng.nextInt(CORPUS.length)]);
        int edits = 1 + rng.nextInt(6);
        for (int i = 0; i < edits; i++) {
            int at = rng.nextInt(sb.length() + 1);
            switch (rng.nextInt(4)) {
                case 0:
                    sb.insert(at, PIECES[rng.nextInt(PIECES.length)]);
                    break;
                case 1:
                    if (sb.length() > 0) {
                        int end = Math.min(sb.length(), at + 1 + rng.nextInt(8));
                        sb.delete(Math.min(at, sb.length() - 1), end);
                    }
                    break;
                case 2:
                    if (at < sb.length()) {
                        sb.setCharAt(at, (char) (32 + rng.nextInt(95)));
                    }
                    break;
                default:
                    int from = rng.nextInt(sb.length());
                    int to = Math.min(sb.length(), from + rng.nextInt(30));
                    sb.insert(at, sb.substring(from, to));
            }
        }
        check(sb.toString(), seed);
    }

    @Property(tries = 500, seed = "7102", shrinking = ShrinkingMode.OFF)
    void randomBytesOnlyGiveTheParseError(@ForAll long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        byte[] bytes = new byte[rng.nextInt(200)];
        rng.nextBytes(bytes);
        check(new String(bytes, StandardCharsets.UTF_8), seed);
        check(new String(bytes, StandardCharsets.ISO_8859_1), seed);
    }
}
