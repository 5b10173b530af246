package dev.qsim.text;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.io.RandomAccessFile;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.concurrent.atomic.AtomicReference;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.Circuit;
import dev.qsim.Expression;
import dev.qsim.Gate;

/**
 * The reader against hostile input: each defect found by the independent checks of the issue
 * "Circuit files as users have them, and readers that no file can break" (a construction that
 * failed before this reader) and the bound that now holds. Expected values are the arithmetic
 * of the text (common practice), the OpenQASM 3 specification (Cross et al. 2022, ACM Trans.
 * Quantum Comput. 3(3), 12, doi:10.1145/3505636; live specification at openqasm.com) where
 * named, and the robustness rule of the project: every read ends in a circuit or a
 * {@link CircuitFormatException} (for a path, also an {@link IOException}), never another
 * throwable, in bounded time (common practice for parsers of untrusted input).
 */
class QasmLimitsTest {

    private static final String HEAD = "OPENQASM 3.0;\ninclude \"stdgates.inc\";\n";
    /** Generous bound for one read in these tests; each takes well under a second. */
    private static final Duration SLOW = Duration.ofSeconds(10);

    /** Runs a read on a thread with a small stack (256 KiB), as an embedding caller might. */
    private static Circuit onSmallStack(String text) throws InterruptedException {
        AtomicReference<Object> result = new AtomicReference<>();
        Thread t = new Thread(null, () -> {
            try {
                result.set(QasmReader.read(text));
            } catch (Throwable e) {
                result.set(e);
            }
        }, "small-stack reader", 256 * 1024);
        t.start();
        t.join();
        Object r = result.get();
        if (r instanceof CircuitFormatException e) {
            throw e;
        }
        if (r instanceof Throwable e) {
            throw new AssertionError("the reader threw " + e, e);
        }
        return (Circuit) r;
    }

    @Test
    void aLongFlatExpressionReadsWithoutOverflowingTheStack() throws InterruptedException {
        // Defect: rx(1+1+...+1) with ~8,000 terms threw StackOverflowError. The sum of 20,000
        // ones is 20,000; the product of ones is 1; 20,000 minus signs cancel in pairs.
        String sum = "1" + "+1".repeat(19_999);
        String product = "2.0" + "*1".repeat(20_000);
        String minus = "-".repeat(20_000) + "0.5";
        Circuit c = onSmallStack(HEAD + "qubit q;\nrx(" + sum + ") q;\nry(" + product
                + ") q;\nrz(" + minus + ") q;\n");
        Circuit hand = Circuit.builder(1, 0).rx(0, 20_000).ry(0, 2.0).rz(0, 0.5).build();
        assertEquals(hand, c);
    }

    @Test
    void deepNestingIsRefusedCleanlyEvenOnASmallStack() throws InterruptedException {
        // Parentheses past 64 levels, an unfoldable chain past Expression.MAX_DEPTH, blocks
        // past 64 levels and gate calls nested past Scope.MAX_DEPTH are refused, not overflowed.
        String parens = HEAD + "qubit q;\nrx(" + "(".repeat(10_000) + "1" + ")".repeat(10_000)
                + ") q;\n";
        assertTrue(message(parens).contains("nested deeper than"));
        String chain = HEAD + "gate g(t) a { rx(t" + "+t".repeat(5_000) + ") a; }\n";
        assertTrue(message(chain).contains("more than " + Expression.MAX_DEPTH));
        String blocks = HEAD + "qubit q;\n" + "{".repeat(10_000) + "}".repeat(10_000);
        assertTrue(message(blocks).contains("nested deeper than"));
        StringBuilder gates = new StringBuilder(HEAD + "gate g0 a { x a; }\n");
        for (int i = 1; i < 5_000; i++) {
            gates.append("gate g").append(i).append(" a { g").append(i - 1).append(" a; }\n");
        }
        String deepGates = gates + "qubit q;\ng4999 q;\n";
        assertTrue(message(deepGates).contains("nest more than " + Scope.MAX_DEPTH));
        String fits = gates + "qubit q;\ng" + (Scope.MAX_DEPTH - 2) + " q;\n";
        assertEquals(1, onSmallStack(fits).size());
    }

    private static String message(String text) throws InterruptedException {
        try {
            onSmallStack(text);
        } catch (CircuitFormatException e) {
            return e.getMessage();
        }
        throw new AssertionError("no refusal");
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        // Defect: these threw a plain IllegalArgumentException without a position. 0/0 and
        // 1/0 of integers are integer divisions by zero (OpenQASM 3: / of two integers is an
        // integer division, from memory); with a float they give NaN or an infinity, which no
        // angle may be. Every failure is at the call (line 4, column 1).
        "ctrl @ rx(0/0) q[0], q[1];|integer division by zero",
        "ctrl @ gphase(1/0) q[0];|integer division by zero",
        "ctrl @ U(0, 0/0, 0) q[0], q[1];|integer division by zero",
        "inv @ ctrl @ ry(1/0) q[0], q[1];|integer division by zero",
        "ctrl @ rx(0.0/0) q[0], q[1];|angle 1 of rx is NaN",
        "ctrl @ gphase(1.0/0) q[0];|angle 1 of phase is Infinity",
        "ctrl @ U(0, 0.0/0, 0) q[0], q[1];|angle 2 of u is NaN",
        "inv @ ctrl @ ry(1.0/0) q[0], q[1];|angle 1 of ry is -Infinity",
        "negctrl @ pow(2) @ rz(-1.0/0) q[0], q[1];|angle 1 of rz is -Infinity",
        "ctrl @ u3(0, 0, 1.0/0) q[0], q[1];|finite [inside gate 'u3' of stdgates.inc",
        "g(0/0) q[0], q[1];|integer division by zero",
        "inv @ g(1.0/0) q[1], q[0];|rx is -Infinity; angles must be finite [inside gate 'g'",
    })
    void aBadAngleInAModifiedCallIsAFormatExceptionAtTheCall(String call, String part) {
        String g = "gate g(t) a, b { ctrl @ rx(t) a, b; }\n";
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(HEAD + "qubit[2] q;\n" + g + call + "\n"));
        assertSame(CircuitFormatException.class, e.getClass());
        assertEquals(5, e.line(), e.getMessage());
        assertEquals(1, e.column(), e.getMessage());
        assertTrue(e.getMessage().contains(part), e.getMessage());
    }

    private static void assertBudget(CircuitFormatException e) {
        assertTrue(e.getMessage().contains("more than "
                + QasmReader.Settings.DEFAULT_WORK_BUDGET + " steps"), e.getMessage());
        assertTrue(e.getMessage().contains("QasmReader.Settings.withWorkBudget(long)"),
                e.getMessage());
    }

    @Test
    void nestedEmptyAndBarrierOnlyGatesRunOutOfBudgetQuickly() {
        // Defect: 60 nested definitions with empty or barrier-only bodies (2 KB) ran without
        // bound, since expansion counted only real gates. Each doubles the work: 2^59 calls.
        for (String body : new String[] {"", "barrier a;"}) {
            StringBuilder sb = new StringBuilder(HEAD + "gate g0 a { " + body + " }\n");
            for (int i = 1; i < 60; i++) {
                sb.append("gate g").append(i).append(" a { ").append(body).append(" g")
                        .append(i - 1).append(" a; g").append(i - 1).append(" a; }\n");
            }
            String text = sb + "qubit q;\ng59 q;\n";
            CircuitFormatException e = assertTimeoutPreemptively(SLOW, () -> assertThrows(
                    CircuitFormatException.class, () -> QasmReader.read(text)));
            assertBudget(e);
            assertEquals(64, e.line(), e.getMessage());
            assertTrue(e.getMessage().contains("inside gate 'g59' defined at line 62, column 1"),
                    e.getMessage());
        }
    }

    @Test
    void registerElementsAndBarrierOperandsAreCounted() {
        // Defect: qubit[1048576] q; and 100 calls of an empty gate on q took 4 s; now each
        // element an operand stands for is a step: 100 * 2^20 steps exceed the budget.
        String big = HEAD + "qubit[1048576] q;\ngate e a { }\n" + "e q;\n".repeat(100);
        assertBudget(assertTimeoutPreemptively(SLOW, () -> assertThrows(
                CircuitFormatException.class, () -> QasmReader.read(big))));
        // With a budget large enough the same kind of program reads, and records nothing.
        String smaller = HEAD + "qubit[100000] q;\ngate e a { }\n" + "e q;\n".repeat(30);
        assertBudget(assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(smaller)));
        Circuit c = QasmReader.read(smaller, QasmReader.Settings.defaults()
                .withWorkBudget(40_000_000));
        assertEquals(0, c.size());
        // Barrier operands are counted: 20 barriers on 2^20 qubits exceed the budget.
        String barriers = HEAD + "qubit[1048576] q;\n" + "barrier q;\n".repeat(20);
        assertBudget(assertTimeoutPreemptively(SLOW, () -> assertThrows(
                CircuitFormatException.class, () -> QasmReader.read(barriers))));
        // Defect: 4,000 repeated barrier operands took 4.4 s; 400,000 now read at once.
        String barrier = HEAD + "qubit q;\nbarrier q" + ", q".repeat(400_000) + ";\n";
        assertEquals(0, assertTimeoutPreemptively(SLOW, () -> QasmReader.read(barrier)).size());
        // Loops count their iterations, even empty ones.
        assertBudget(assertTimeoutPreemptively(SLOW, () -> assertThrows(
                CircuitFormatException.class, () -> QasmReader.read(HEAD
                        + "qubit q;\nfor int i in [0:1000000000] { }\n"))));
    }

    @Test
    void namesAreCheckedInLinearTime() {
        // Defect: a gate with 60,000 arguments did not finish in 5 s (quadratic name checks;
        // 3.4 s here before). 200,000 arguments would take about 40 s then.
        int n = 200_000;
        StringBuilder sb = new StringBuilder(HEAD + "gate wide ");
        for (int i = 0; i < n; i++) {
            sb.append(i == 0 ? "a" : ", a").append(i);
        }
        sb.append(" { }\nqubit[").append(n).append("] q;\nwide ");
        for (int i = 0; i < n; i++) {
            sb.append(i == 0 ? "q[" : ", q[").append(i).append(']');
        }
        String text = sb + ";\n";
        assertEquals(0, assertTimeoutPreemptively(SLOW, () -> QasmReader.read(text)).size());
        String twice = text.replace(", a199999 {", ", a0 {");
        CircuitFormatException e = assertTimeoutPreemptively(SLOW, () -> assertThrows(
                CircuitFormatException.class, () -> QasmReader.read(twice)));
        assertTrue(e.getMessage().contains("'a0' is declared twice"), e.getMessage());
    }

    @Test
    void messagesQuoteOnlyAnExcerpt() {
        // Defect: messages echoed inputs whole (300,176 characters).
        String name = "n".repeat(300_000);
        String[] texts = {
            HEAD + "qubit q;\n" + name + " q;\n",
            HEAD + "qubit q;\nrx(" + name + ") q;\n",
            HEAD + "gate g " + name + " { h " + name + "x; }\n",
            "include \"" + name + "\";\n",
            HEAD + "qubit q;\n" + name + " = 1;\n",
            HEAD + "qubit q;\nh q" + ", q".repeat(100_000) + ";\n",
            HEAD + "qubit[3] q;\nctrl(2) @ x q[0], q[1], q[0];\n",
        };
        for (String t : texts) {
            CircuitFormatException e = assertThrows(CircuitFormatException.class,
                    () -> QasmReader.read(t));
            assertTrue(e.getMessage().length() <= CircuitFormatException.MAX_MESSAGE,
                    () -> e.getMessage().length() + " characters");
            assertTrue(e.getMessage().length() < 400, e.getMessage());
        }
    }

    @Test
    void aFileIsBoundedBeforeItIsRead(@TempDir Path dir) throws IOException {
        // A sparse file larger than the limit is refused from its size, without reading it.
        Path huge = dir.resolve("huge.qasm");
        try (RandomAccessFile f = new RandomAccessFile(huge.toFile(), "rw")) {
            f.setLength(QasmReader.Settings.DEFAULT_MAX_FILE_BYTES + 1);
        }
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(huge));
        assertTrue(e.getMessage().contains("holds more than "
                + QasmReader.Settings.DEFAULT_MAX_FILE_BYTES + " bytes"), e.getMessage());
        assertTrue(e.getMessage().contains("withMaxFileBytes"), e.getMessage());
        Path small = dir.resolve("bell.qasm");
        Files.writeString(small, HEAD + "qubit[2] q;\nh q[0];\ncx q[0], q[1];\n",
                StandardCharsets.UTF_8);
        assertEquals(2, QasmReader.read(small).size());
        assertThrows(CircuitFormatException.class, () -> QasmReader.read(small,
                QasmReader.Settings.defaults().withMaxFileBytes(20)));
        IOException d = assertThrows(IOException.class, () -> QasmReader.read(dir));
        assertTrue(d.getMessage().contains("is a directory"), d.getMessage());
        assertThrows(NoSuchFileException.class, () -> QasmReader.read(dir.resolve("none")));
        // Bytes that are not UTF-8 are refused with their line and column.
        Path latin = dir.resolve("latin.qasm");
        Files.write(latin, new byte[] {'q', 'u', 'b', 'i', 't', ' ', 'q', ';', '\n', 'x', ' ',
            (byte) 0xe9, ';'});
        CircuitFormatException u = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(latin));
        assertEquals(2, u.line());
        assertEquals(3, u.column());
        assertTrue(u.getMessage().contains("not UTF-8"), u.getMessage());
    }

    @Test
    void aStreamWithoutEndIsReadOnlyUpToTheLimit() {
        // /dev/zero claims no size and never ends: the reader stops after the limit.
        Path zero = Path.of("/dev/zero");
        assumeTrue(Files.isReadable(zero), "no /dev/zero on this system");
        CircuitFormatException e = assertTimeoutPreemptively(SLOW, () -> assertThrows(
                CircuitFormatException.class, () -> QasmReader.read(zero,
                        QasmReader.Settings.defaults().withMaxFileBytes(1 << 20))));
        assertTrue(e.getMessage().contains("holds more than 1048576 bytes"), e.getMessage());
    }

    @Test
    void caretIsExclusiveOrAndTwoStarsThePower() {
        // Defect: ^ was read as a power. OpenQASM 3: ^ is bitwise exclusive or (6 ^ 3 = 5),
        // ** the power (2 ** 3 = 8).
        Circuit c = QasmReader.read(HEAD + "qubit q;\nrx(6 ^ 3) q;\nrx(2 ** 3) q;\n");
        assertEquals(Circuit.builder(1, 0).rx(0, 5).rx(0, 8).build(), c);
        assertEquals(Gate.RX, c.instructions().get(0).gate());
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> QasmReader.read(HEAD + "qubit q;\nrx(2.0 ^ 3) q;\n"));
        assertTrue(e.getMessage().contains("needs integer or bool operands"), e.getMessage());
    }

    @Test
    void repeatedBitsAndQubitsAreFormatExceptions() {
        // The circuit's expressions and assignments take distinct bits; an index set may
        // repeat one (common practice: refuse at the statement, never pass the model's
        // IllegalArgumentException through).
        String[] texts = {
            "c[{0, 0}] = 1;",
            "if (c[{1, 1}] == 1) x q[0];",
            "c[{0, 0}] += 1;",
            "rx(c[{0, 1, 0}] * 0.5) q[0];",
            "let a = q ++ q;",
            "delay[1ns] q[0], q[0];",
            "h q[{0, 0}];\ncx q[{0, 0}], q[{1, 0}];",
        };
        for (String t : texts) {
            CircuitFormatException e = assertThrows(CircuitFormatException.class,
                    () -> QasmReader.read(HEAD + "qubit[2] q;\nbit[2] c;\n" + t + "\n"));
            assertSame(CircuitFormatException.class, e.getClass());
            assertTrue(e.getMessage().contains("appears twice"), e.getMessage());
        }
    }
}
