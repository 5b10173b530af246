package dev.qsim.text;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.InvalidPathException;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Objects;

import dev.qsim.Circuit;
import dev.qsim.Gates;
import dev.qsim.internal.Checks;

/**
 * Reads a circuit written in a gate-level subset of OpenQASM 3 (Cross et al. 2022, ACM
 * Transactions on Quantum Computing 3(3), 12, doi:10.1145/3505636; language specification at
 * openqasm.com). Stateless and thread-safe.
 *
 * <p>The subset:
 * <ul>
 *   <li>{@code OPENQASM 3;} (optional, first) and {@code include "stdgates.inc";} (needed for
 *       every gate but the built-in {@code U} and {@code gphase});</li>
 *   <li>declarations {@code qubit[n] q;}, {@code qubit a;}, {@code bit[n] c;}, {@code bit b;}:
 *       registers take consecutive indices in the order declared (the first qubit register
 *       holds qubits 0..n-1, the next one the following indices; likewise for bits);</li>
 *   <li>the standard gates {@code id h x y z s sdg t tdg sx rx ry rz p phase cx CX cy ch crx
 *       cry crz cz cp cphase swap ccx cswap}, the built-ins {@code U(θ, φ, λ)} (as
 *       {@link Gates#u(double, double, double)}) and {@code gphase(γ)} (a global phase, applied
 *       as the operator {@code e^{iγ} I} on qubit 0), and the modifiers {@code inv @} and
 *       {@code ctrl @} / {@code ctrl(k) @} with {@code 1 <= k <= 64} (one per call, on standard
 *       and built-in gates);</li>
 *   <li>a whole register as an operand applies the gate to each index in turn (registers of one
 *       call must then have equal sizes);</li>
 *   <li>parameters as constant expressions: numbers, {@code pi}/{@code π}, {@code tau}/{@code τ},
 *       {@code euler}/{@code ℇ}, {@code + - * /}, powers {@code ^} or {@code **}, unary minus
 *       and plus, parentheses and the functions
 *       {@code sin cos tan arcsin arccos arctan exp ln sqrt};</li>
 *   <li>{@code c[0] = measure q[0];}, {@code c = measure q;}, {@code measure q[0] -> c[0];},
 *       {@code reset q[0];}, {@code barrier ...;} (accepted, nothing recorded);</li>
 *   <li>{@code if (c[0] == 1) stmt} or {@code if (c[0] == 1) { ... }} on one bit, compared with
 *       {@code 0}, {@code 1}, {@code true} or {@code false}, or alone, {@code if (c[0]) stmt},
 *       which means {@code == 1} (a bit used as a condition is true when it is 1);</li>
 *   <li>{@code gate name(params) a, b { ... }} definitions of gate calls and {@code barrier},
 *       expanded where used;</li>
 *   <li>comments {@code //} to the end of the line and {@code /* ... *}{@code /}.</li>
 * </ul>
 * Everything else (classical types, loops, subroutines, timing, pulse-level code, other
 * includes) is refused with a {@link CircuitFormatException} giving the line and column.
 *
 * <p>Names map to the builder so that {@link QasmWriter} output reads back equal:
 * {@code cx} → {@code cnot}, {@code p} → {@code phase}, {@code sdg} → {@code sDagger},
 * {@code sx} → {@code sqrtX}, {@code inv @ sx} → {@code sqrtXDagger}, {@code cp} →
 * {@code cphase}, {@code ccx} → {@code toffoli}, {@code cswap} → {@code fredkin}, {@code ctrl @ g}
 * → {@code controlled}.
 *
 * @since 0.1
 */
public final class QasmReader {
    /** The most instructions a file may expand to: {@value}. */
    public static final int MAX_INSTRUCTIONS = 1_000_000;
    /** The deepest nesting of blocks, of expressions and of gate definitions. */
    static final int MAX_NESTING = 64;

    private QasmReader() {
    }

    /**
     * Reads a circuit from OpenQASM 3 text.
     *
     * @param text the program
     * @return the circuit, with as many qubits and clbits as the declarations add up to
     * @throws CircuitFormatException if the text is not in the subset or the circuit refuses a
     *     statement; the message gives line and column, and when the text is one line that
     *     names an existing file or ends in {@code .qasm}, says to call {@link #read(Path)}
     */
    public static Circuit read(String text) {
        Objects.requireNonNull(text, "text");
        try {
            // The lexer reads the whole text first; then the parser hands each statement to the
            // expander as it ends, so that every problem is reported in text order.
            Scope scope = new Scope();
            Expander expander = new Expander(scope);
            Syntax.Program program = new Parser(Lexer.tokens(text), scope, expander::ended)
                    .program();
            return expander.build(program);
        } catch (CircuitFormatException e) {
            if (looksLikeAFileName(text)) {
                throw new CircuitFormatException(e.line(), e.column(), e.getMessage()
                        .substring(e.getMessage().indexOf(": ") + 2) + "; the text '"
                        + Checks.excerpt(text.strip()) + "' looks like a file name, but"
                        + " read(String) reads program text: to read a file, call"
                        + " QasmReader.read(Path.of(...))", e);
            }
            throw e;
        }
    }

    /**
     * Whether text that failed to read is one line naming a file: one that exists, or any
     * name ending in {@code .qasm}.
     */
    static boolean looksLikeAFileName(String text) {
        String t = text.strip();
        if (t.isEmpty() || t.contains("\n") || t.contains(";")) {
            return false;
        }
        if (t.toLowerCase(Locale.ROOT).endsWith(".qasm")) {
            return true;
        }
        try {
            return Files.isRegularFile(Path.of(t));
        } catch (InvalidPathException e) {
            return false;
        }
    }

    /**
     * Reads a circuit from a UTF-8 OpenQASM 3 file.
     *
     * @param file the file
     * @return the circuit
     * @throws IOException if the file cannot be read
     * @throws CircuitFormatException if the text is not in the subset
     */
    public static Circuit read(Path file) throws IOException {
        return read(Files.readString(Objects.requireNonNull(file, "file"),
                StandardCharsets.UTF_8));
    }
}
