package dev.qsim.text;

import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Hostile input: grammar-aware random programs ({@link RandomPrograms}) and a corpus of
 * valid ones, mutated (truncated, characters replaced, spans duplicated, nesting inserted,
 * huge numbers, long names, stray tokens), random bytes and programs built to explode. The
 * reader either returns a circuit or throws {@link CircuitFormatException} with a line, a column
 * and a bounded message, never another throwable (no StackOverflowError, OutOfMemoryError or
 * undocumented exception), and no read takes longer than {@link #BOUND_NANOS} of the reading
 * thread's time (the robustness
 * rules of the issue; common practice for parsers of untrusted input). Plain seeded loops:
 * a failure names its seed. About 5,100 reads per run.
 */
class QasmFuzzTest {
    /**
     * The slowest a single read may be: 10 s of the reading thread's processor time. The work
     * budget's worst cases here (10^7 steps of nested loops) took under 2 s on one 2-core AMD
     * EPYC VM and 2.0 to 2.2 s on another, where 2 s, the bound first chosen, failed; a read
     * that escaped the budget would run the loops' 2 * 10^10 steps, over an hour.
     */
    private static final long BOUND_NANOS = 10_000_000_000L;
    /** A small budget keeps the thousands of mutated reads quick; the bound is tested apart. */
    private static final QasmReader.Settings SMALL = QasmReader.Settings.defaults()
            .withWorkBudget(300_000);

    private static final String[] CORPUS = {
        "OPENQASM 3.0;\ninclude \"stdgates.inc\";\nqubit[3] q;\nbit[3] c;\nh q[0];\n"
            + "cx q[0], q[1];\nrz(pi/4 - sin(0.3)**2) q[2];\nc = measure q;\n"
            + "if (c[0] == 1) { x q[1]; reset q[2]; } else { z q[0]; }\n",
        "OPENQASM 3;\ninclude \"stdgates.inc\";\n// comment\ngate g(a, b) x, y { U(a, b, 0) x;"
            + " cp(a * b) x, y; barrier x, y; }\nqubit[2] q;\nbit b;\ng(0.1, -2e-1) q[0], q[1];"
            + "\n/* note */ inv @ g(1, 2) q[1], q[0];\nctrl @ sx q[0], q[1];\nb = measure q[1];\n",
        "include \"stdgates.inc\";\nqubit a;\nqubit[4] r;\nbit[4] m;\nh r;\nccx a, r[0], r[1];"
            + "\ncswap r[3], a, r[2];\nctrl(2) @ gphase(pi) a, r[0];\nmeasure r -> m;\n"
            + "if (m[3] == true) gphase(tau / 3);\n",
        "OPENQASM 3;\ninclude \"stdgates.inc\";\nconst int n = 3;\nqubit[n] q;\nbit[n] c;\n"
            + "int[8] count = 0;\nfor int i in [0:n - 1] { ry(i * pi / 4) q[i]; }\n"
            + "@max_iterations 10\nwhile (c[0] == 0) { h q[0]; c[0] = measure q[0];"
            + " count += 1; }\ndef flip(qubit a, float t) -> bit { rx(t) a; return measure a; }"
            + "\nc[2] = flip(q[2], 0.5);\nlet pair = q[0:1];\nnegctrl @ x pair[0], pair[1];"
            + "\ndelay[100ns] q;\npow(2) @ t q[{0, 2}];\n",
    };

    private static final String[] PIECES = {
        "q", "[", "]", "(", ")", "{", "}", ";", ",", "@", "==", "=", "-", "+", "*", "/", "^",
        "**", "->", "++", ":", "pi", "inv @", "ctrl", "negctrl @", "pow(", "gate", "if", "else",
        "for", "while", "def", "return", "measure", "reset", "qubit", "bit", "int", "float",
        "const", "input", "let", "delay[", "100ns", "5dt", "break;", "continue;", "\"0101\"",
        "99999999999999999999", "1e400", "0", "1", "2", "\"", "/*", "//", "\n", " ", "h", "cx",
        "U", "gphase", "sqrt(", "ln(0)", "ctrl(3) @", "qubit[1048576] z;", "\u0000", "\uffff",
        "é", "π", "$0", "box", "#", "@max_iterations 0\n", "\uFEFF",
    };

    private static final String[] NUMBERS = {"99999999999999999999", "1e308", "1e-400",
        "0x7fffffffffffffff", "1048576", "-9223372036854775808", "2**1024", "1.0/0", "0/0",
        "4.9e-324", "1_000_000_000"};

    /** The JVM's thread bean and its CPU-time method, or null where unavailable. */
    private static final Object THREADS;
    private static final java.lang.reflect.Method CPU_TIME;

    static {
        Object bean = null;
        java.lang.reflect.Method cpu = null;
        try {
            // By reflection: the tests compile in module dev.qsim, which does not read
            // java.management; they run on the class path, where it is present.
            bean = Class.forName("java.lang.management.ManagementFactory")
                    .getMethod("getThreadMXBean").invoke(null);
            Class<?> type = Class.forName("java.lang.management.ThreadMXBean");
            if ((Boolean) type.getMethod("isCurrentThreadCpuTimeSupported").invoke(bean)) {
                cpu = type.getMethod("getCurrentThreadCpuTime");
            }
        } catch (ReflectiveOperationException | RuntimeException e) {
            cpu = null;
        }
        THREADS = bean;
        CPU_TIME = cpu;
    }

    /**
     * The time the reading thread has run: CPU time where the JVM measures it, so that other
     * work on the machine (parallel builds on two cores) does not count against the reader;
     * otherwise the wall clock.
     */
    private static long now() {
        if (CPU_TIME != null) {
            try {
                return (Long) CPU_TIME.invoke(THREADS);
            } catch (ReflectiveOperationException e) {
                return System.nanoTime();
            }
        }
        return System.nanoTime();
    }

    private static void check(String text, QasmReader.Settings settings, String what) {
        long t0 = now();
        try {
            QasmReader.read(text, settings);
        } catch (CircuitFormatException e) {
            String m = e.getMessage();
            assertTrue(e.line() >= 1 && e.column() >= 1, () -> what + ": " + m);
            assertTrue(m.startsWith("line " + e.line() + ", column " + e.column() + ": "),
                    () -> what + ": " + m);
            assertTrue(m.length() <= CircuitFormatException.MAX_MESSAGE, what);
        } catch (Throwable e) {
            fail(what + ": " + e + " for text:\n" + Lexer.clip(text), e);
        }
        long took = now() - t0;
        assertTrue(took < BOUND_NANOS, () -> what + ": read took " + took / 1e6 + " ms");
    }

    private static char randomChar(UniformRandomProvider rng) {
        switch (rng.nextInt(4)) {
            case 0:
                return (char) rng.nextInt(0x3000);
            case 1:
                return "\n\t\0{}()[];,@=\"".charAt(rng.nextInt(14));
            default:
                return (char) (32 + rng.nextInt(95));
        }
    }

    /** Applies one random mutation. */
    static void mutate(UniformRandomProvider rng, StringBuilder sb) {
        int at = rng.nextInt(sb.length() + 1);
        switch (rng.nextInt(8)) {
            case 0:
                sb.setLength(at);
                break;
            case 1:
                if (at < sb.length()) {
                    sb.setCharAt(at, randomChar(rng));
                }
                break;
            case 2: {
                if (sb.length() == 0) {
                    break;
                }
                int from = rng.nextInt(sb.length());
                int to = Math.min(sb.length(), from + rng.nextInt(80));
                String span = sb.substring(from, to);
                int times = 1 + rng.nextInt(rng.nextBoolean() ? 3 : 200);
                sb.insert(at, span.repeat(times));
                break;
            }
            case 3: {
                String[] nest = {"(", "{", "ctrl @ ", "-", "inv @ ", "[", "!", "if (c) "};
                sb.insert(at, nest[rng.nextInt(nest.length)].repeat(1 + rng.nextInt(3000)));
                break;
            }
            case 4:
                sb.insert(at, NUMBERS[rng.nextInt(NUMBERS.length)]);
                break;
            case 5:
                sb.insert(at, "n".repeat(1 + rng.nextInt(20_000)));
                break;
            case 6:
                if (sb.length() > 0) {
                    int end = Math.min(sb.length(), at + 1 + rng.nextInt(12));
                    sb.delete(Math.min(at, sb.length() - 1), end);
                }
                break;
            default:
                sb.insert(at, PIECES[rng.nextInt(PIECES.length)]);
        }
    }

    @Test
    void mutatedProgramsOnlyGiveTheFormatException() {
        for (long seed = 0; seed < 3000; seed++) {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
            StringBuilder sb = new StringBuilder(seed % 4 == 0 ? CORPUS[rng.nextInt(
                    CORPUS.length)] : RandomPrograms.program(rng));
            int edits = 1 + rng.nextInt(4);
            for (int i = 0; i < edits; i++) {
                mutate(rng, sb);
            }
            check(sb.toString(), SMALL, "mutated program, seed " + seed);
        }
    }

    @Test
    void randomProgramsReadOrAreRefusedCleanly() {
        for (long seed = 10_000; seed < 10_500; seed++) {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
            check(RandomPrograms.program(rng), QasmReader.Settings.defaults(),
                    "random program, seed " + seed);
        }
    }

    @Test
    void randomBytesAndTokensOnlyGiveTheFormatException() {
        for (long seed = 20_000; seed < 20_500; seed++) {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
            byte[] bytes = new byte[rng.nextInt(300)];
            rng.nextBytes(bytes);
            check(new String(bytes, StandardCharsets.UTF_8), SMALL, "bytes, seed " + seed);
            check(new String(bytes, StandardCharsets.ISO_8859_1), SMALL, "bytes, seed " + seed);
            StringBuilder tokens = new StringBuilder("OPENQASM 3;\ninclude \"stdgates.inc\";\n"
                    + "qubit[2] q;\nbit[2] c;\n");
            int n = rng.nextInt(60);
            for (int i = 0; i < n; i++) {
                tokens.append(PIECES[rng.nextInt(PIECES.length)]).append(' ');
            }
            check(tokens.toString(), SMALL, "tokens, seed " + seed);
        }
    }

    @Test
    void programsBuiltToExplodeEndWithinTheBoundAtDefaultSettings() {
        // The worst cases of each kind of work, with the default budget: each must end (in a
        // circuit or a refusal) within the bound.
        String head = "OPENQASM 3;\ninclude \"stdgates.inc\";\n";
        StringBuilder doubling = new StringBuilder(head + "gate g0 a { }\n");
        StringBuilder doublingX = new StringBuilder(head + "gate g0 a { x a; }\n");
        for (int i = 1; i < 64; i++) {
            doubling.append("gate g").append(i).append(" a { barrier a; g").append(i - 1)
                    .append(" a; g").append(i - 1).append(" a; }\n");
            doublingX.append("gate g").append(i).append(" a { g").append(i - 1)
                    .append(" a; g").append(i - 1).append(" a; }\n");
        }
        String[] texts = {
            doubling + "qubit q;\ng63 q;\n",
            doublingX + "qubit q;\ng63 q;\n",
            head + "qubit[1048576] q;\ngate e a { }\n" + "e q;\n".repeat(50),
            head + "qubit[1048576] q;\nh q;\n",
            head + "qubit q;\nfor int i in [0:2000000000] { for int j in [0:9] { } }\n",
            head + "qubit q;\nfor int i in [0:2000000000] { rz(i*i+i*i+i*i+i*i+i*i+i*i) q; }\n",
            head + "qubit q;\nfor int i in [0:2000000000] { pow(1000000) @ h q; }\n",
            head + "qubit q;\nbarrier q" + ", q".repeat(1_000_000) + ";\n",
            head + "qubit q;\nrx(" + "1+".repeat(1_000_000) + "1) q;\n",
            head + "qubit q;\nrx(" + "-".repeat(1_000_000) + "1) q;\n",
            head + "qubit q;\n" + "{".repeat(1_000_000) + "\n",
            head + "qubit q;\nrx(" + "(".repeat(1_000_000) + "\n",
            head + "qubit q;\ndef f(int n) -> int { return n + n; }\nint x = 1;\nx = "
                + "f(".repeat(60) + "x" + ")".repeat(60) + ";\n",
            head + "qubit q;\n" + "n".repeat(5_000_000) + " q;\n",
            head + "qubit q;\nbit c;\n" + "while (c == 0) { ".repeat(60) + "x q;"
                + " }".repeat(60) + "\n",
        };
        for (int i = 0; i < texts.length; i++) {
            check(texts[i], QasmReader.Settings.defaults(), "explosive program " + i);
        }
    }

    @Test
    void filesOnlyGiveTheFormatExceptionOrTheDocumentedIoException(@TempDir Path dir)
            throws IOException {
        for (long seed = 30_000; seed < 30_100; seed++) {
            UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
            StringBuilder sb = new StringBuilder(RandomPrograms.program(rng));
            mutate(rng, sb);
            byte[] bytes = sb.toString().getBytes(StandardCharsets.UTF_8);
            if (rng.nextBoolean() && bytes.length > 0) {
                bytes[rng.nextInt(bytes.length)] = (byte) (0x80 + rng.nextInt(0x80));
            }
            Path f = dir.resolve("p" + seed + ".qasm");
            Files.write(f, bytes);
            long s = seed;
            try {
                QasmReader.read(f, SMALL);
            } catch (CircuitFormatException e) {
                assertTrue(e.line() >= 1 && e.column() >= 1, () -> "seed " + s);
            } catch (Throwable e) {
                fail("file, seed " + seed + ": " + e, e);
            }
        }
    }
}
