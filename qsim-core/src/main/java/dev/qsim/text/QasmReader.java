package dev.qsim.text;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.InvalidPathException;
import java.nio.file.Path;
import java.util.Collections;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;

import dev.qsim.Circuit;
import dev.qsim.Gates;
import dev.qsim.internal.Checks;

/**
 * Reads a circuit written in OpenQASM 3 (Cross et al. 2022, "OpenQASM 3: A broader and deeper
 * quantum assembly language", ACM Transactions on Quantum Computing 3(3), 12,
 * doi:10.1145/3505636; language specification at openqasm.com). Stateless and thread-safe.
 * The full list of what is read, what is refused and why is in {@code docs/openqasm.md}.
 *
 * <p>Supported:
 * <ul>
 *   <li>{@code OPENQASM 3;} (optional, first), {@code include "stdgates.inc";} (needed for the
 *       standard gates), comments, {@code pragma} lines (ignored) and annotations (ignored,
 *       but {@code @max_iterations n} bounds the while loop after it);</li>
 *   <li>declarations: {@code qubit[n] q;}, {@code qubit a;}, {@code qreg q[n];},
 *       {@code bit[n] c;}, {@code creg c[n];}, {@code bit b = ...;}; classical variables
 *       {@code int}, {@code uint} (widths 1 to 64), {@code float} (64-bit), {@code angle}
 *       (held as a double in [0, 2π)) and {@code bool}, with or without a value;
 *       {@code const} declarations (computed when read); {@code input} declarations (values
 *       from {@link Settings#withInput}); {@code output} (as a plain declaration);
 *       {@code let} aliases of qubits or bits joined with {@code ++}. Registers take
 *       consecutive indices in the order declared; bits declared inside blocks and
 *       subroutines take the next indices when they are declared;</li>
 *   <li>the built-ins {@code U(θ, φ, λ)} ({@link Gates#u}) and {@code gphase(γ)} (the operator
 *       {@code e^{iγ} I} on qubit 0); every gate of {@code stdgates.inc}: {@code p x y z h s sdg
 *       t tdg sx rx ry rz cx cy cz cp crx cry crz ch swap ccx cswap cu id CX phase cphase u1 u2
 *       u3}; the modifiers {@code inv @}, {@code pow(k) @}, {@code ctrl(n) @} and
 *       {@code negctrl(n) @}, stacked, on every gate (a whole power repeats the gate or
 *       multiplies a rotation's angle; other powers only as the principal power of a
 *       rotation; a negative control is a control between X gates); gate definitions,
 *       expanded where called;</li>
 *   <li>operands: registers (broadcast: a gate on registers of equal size applies to each
 *       index in turn), elements {@code q[i]} (negative i counts from the end), ranges
 *       {@code q[0:2]} and {@code q[0:2:4]} (both ends included), sets {@code q[{0, 3}]};</li>
 *   <li>expressions with every operator of OpenQASM 3 and its precedence ({@code **} is the
 *       power, {@code ^} the bitwise exclusive or; {@code /} of two integers is an integer
 *       division), the constants {@code pi tau euler} ({@code π τ ℇ}), the functions
 *       {@code sin cos tan arcsin arccos arctan exp log (ln) sqrt}, {@code pow}, {@code mod},
 *       and for values known when read {@code floor ceiling popcount}, and casts such as
 *       {@code int[8](x)}; values known when read are computed at once, the others become the
 *       circuit's expressions (see {@link dev.qsim.Expression});</li>
 *   <li>{@code measure q -> c;}, {@code c = measure q;}, {@code measure q;} (the result goes to
 *       one extra classical bit after all the others), {@code reset}, {@code barrier} (nothing
 *       recorded), {@code delay[d] q;} with d in ns, us, µs, ms, s (kept in seconds) or dt (with
 *       {@link Settings#withTimeStep});</li>
 *   <li>assignments {@code x = e;} and compound ones ({@code += -= *= /= %= **= &= |= ^= <<=
 *       >>=}) to variables and bits;</li>
 *   <li>{@code if (...) ... else ...}: a condition known when read chooses a block;
 *       {@code if (c[0] == 1)} on one bit without else is the circuit's
 *       {@link Circuit.Builder#ifBit}; other conditions are
 *       {@link Circuit.Builder#ifThenElse};</li>
 *   <li>{@code for int i in [a:b]}, {@code [a:step:b]} and {@code {v, w, ...}} with bounds known
 *       when read, unrolled ({@code break} and {@code continue} where known when read);
 *       {@code while (...)} as {@link Circuit.Builder#whileLoop} with the bound of
 *       {@code @max_iterations} or {@link Settings#withLoopBound};</li>
 *   <li>{@code def} subroutines with qubit, bit and classical arguments, expanded where called,
 *       returning values (also {@code return measure q;}).</li>
 * </ul>
 * Refused with a {@link CircuitFormatException} naming the construct: timing ({@code box},
 * {@code stretch}, {@code duration}, {@code durationof}: the simulator keeps the order of
 * instructions, not a schedule), pulse-level code ({@code cal}, {@code defcal},
 * {@code defcalgrammar}, {@code frame}, {@code port}, {@code waveform}: it works at the gate
 * level), {@code extern} (code outside the file), arrays, {@code switch} (write if/else),
 * complex numbers (classical values are real), physical qubits {@code $n}, other includes and
 * OpenQASM 2 programs (whose {@code ^} is a power). Where the reader departs from the
 * specification ({@code /} of integers, {@code angle[n]} held as a double) is also in
 * {@code docs/openqasm.md}.
 *
 * <p>Hostile input: every read ends in a circuit or a {@link CircuitFormatException} (or, for
 * a path, an {@link IOException}), in time bounded by the text's size and the
 * {@linkplain Settings#workBudget() work budget}: no input exhausts the stack or the heap.
 *
 * <p>Names map to the builder so that {@link QasmWriter} output reads back equal:
 * {@code cx} → {@code cnot}, {@code p} → {@code phase}, {@code sdg} → {@code sDagger},
 * {@code sx} → {@code sqrtX}, {@code inv @ sx} → {@code sqrtXDagger}, {@code cp} →
 * {@code cphase}, {@code ccx} → {@code toffoli}, {@code cswap} → {@code fredkin},
 * {@code ctrl @ g} → {@code controlled}.
 *
 * @since 0.1
 */
public final class QasmReader {
    /** The most instructions a file may expand to by default: {@value}. */
    public static final int MAX_INSTRUCTIONS = 1_000_000;

    private QasmReader() {
    }

    /**
     * Reads a circuit from OpenQASM 3 text with the {@linkplain Settings#defaults() default
     * settings}.
     *
     * @param text the program
     * @return the circuit, with as many qubits and clbits as the declarations add up to
     * @throws CircuitFormatException if the text cannot be read; the message gives line and
     *     column
     */
    public static Circuit read(String text) {
        return read(text, Settings.DEFAULTS);
    }

    /**
     * Reads a circuit from OpenQASM 3 text.
     *
     * @param text the program
     * @param settings the inputs and limits
     * @return the circuit, with as many qubits and clbits as the declarations add up to
     * @throws CircuitFormatException if the text cannot be read, is longer than
     *     {@link Settings#maxFileBytes()} characters, or needs more work or instructions than
     *     the settings allow; the message gives line and column, and when the text is one line
     *     that names an existing file or ends in {@code .qasm}, says to call
     *     {@link #read(Path)}
     */
    public static Circuit read(String text, Settings settings) {
        Objects.requireNonNull(text, "text");
        Objects.requireNonNull(settings, "settings");
        if (text.length() > settings.maxFileBytes()) {
            throw new CircuitFormatException(1, 1, "the text has " + text.length()
                    + " characters but at most " + settings.maxFileBytes() + " are read; raise"
                    + " the limit with QasmReader.Settings.withMaxFileBytes(long)");
        }
        try {
            Parser parser = new Parser(new Tokens(new Lexer(text)));
            Expander expander = new Expander(settings);
            parser.header();
            while (!parser.atEnd()) {
                Syntax.Statement s = parser.next();
                if (s != null) {
                    expander.top(s);
                }
            }
            return expander.finish(parser.end());
        } catch (CircuitFormatException e) {
            if (looksLikeAFileName(text)) {
                String m = e.getMessage();
                throw new CircuitFormatException(e.line(), e.column(), m.substring(
                        m.indexOf(": ") + 2) + "; the text '" + Checks.excerpt(text.strip())
                        + "' looks like a file name, but read(String) reads program text: to"
                        + " read a file, call QasmReader.read(Path.of(...))", e);
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
        if (t.isEmpty() || t.length() > 4096 || t.contains("\n") || t.contains(";")) {
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
     * Reads a circuit from a UTF-8 OpenQASM 3 file with the {@linkplain Settings#defaults()
     * default settings}.
     *
     * @param file the file
     * @return the circuit
     * @throws IOException if the file does not exist, is a directory or cannot be read
     * @throws CircuitFormatException if the file is larger than
     *     {@link Settings#maxFileBytes()}, is not UTF-8 or cannot be read as a circuit
     */
    public static Circuit read(Path file) throws IOException {
        return read(file, Settings.DEFAULTS);
    }

    /**
     * Reads a circuit from a UTF-8 OpenQASM 3 file. The size is checked before the text is
     * read, and no more than {@link Settings#maxFileBytes()} bytes are read whatever the file
     * claims (so {@code /dev/zero} is refused, not read forever).
     *
     * @param file the file
     * @param settings the inputs and limits
     * @return the circuit
     * @throws IOException if the file does not exist, is a directory or cannot be read
     * @throws CircuitFormatException if the file is larger than
     *     {@link Settings#maxFileBytes()}, is not UTF-8 or cannot be read as a circuit
     */
    public static Circuit read(Path file, Settings settings) throws IOException {
        Objects.requireNonNull(file, "file");
        Objects.requireNonNull(settings, "settings");
        return read(text(file, settings.maxFileBytes()), settings);
    }

    private static CircuitFormatException tooLarge(Path file, long limit) {
        return new CircuitFormatException(1, 1, "the file "
                + Checks.excerpt(String.valueOf(file.getFileName())) + " holds more than " + limit
                + " bytes; raise the limit with QasmReader.Settings.withMaxFileBytes(long)");
    }

    /** The file's text, read and decoded with its size bounded. */
    private static String text(Path file, long limit) throws IOException {
        if (Files.isDirectory(file)) {
            throw new IOException(Checks.excerpt(file.toString()) + " is a directory, not an"
                    + " OpenQASM file");
        }
        if (Files.isRegularFile(file) && Files.size(file) > limit) {
            throw tooLarge(file, limit);
        }
        byte[] buffer = new byte[(int) Math.min(limit + 1, 1 << 16)];
        int n = 0;
        try (InputStream in = Files.newInputStream(file)) {
            while (true) {
                if (n == buffer.length) {
                    if (n > limit) {
                        throw tooLarge(file, limit);
                    }
                    buffer = java.util.Arrays.copyOf(buffer, (int) Math.min(limit + 1,
                            (long) n * 2));
                }
                int r = in.read(buffer, n, buffer.length - n);
                if (r < 0) {
                    break;
                }
                n += r;
            }
        }
        if (n > limit) {
            throw tooLarge(file, limit);
        }
        return decode(buffer, n);
    }

    /** Decodes UTF-8, refusing malformed bytes with their line and column. */
    private static String decode(byte[] bytes, int n) {
        CharsetDecoder d = StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT)
                .onUnmappableCharacter(CodingErrorAction.REPORT);
        ByteBuffer in = ByteBuffer.wrap(bytes, 0, n);
        CharBuffer out = CharBuffer.allocate(n);
        CoderResult r = d.decode(in, out, true);
        if (r.isUnderflow()) {
            r = d.flush(out);
        }
        if (r.isError()) {
            int bad = in.position();
            int line = 1;
            int col = 1;
            for (int i = 0; i < out.position(); i++) {
                if (out.get(i) == '\n') {
                    line++;
                    col = 1;
                } else {
                    col++;
                }
            }
            throw new CircuitFormatException(line, col, "the file is not UTF-8: byte " + bad
                    + " (0x" + Integer.toHexString(bytes[bad] & 0xff) + ") starts no character");
        }
        out.flip();
        return out.toString();
    }

    /**
     * The reader's settings: values for the program's {@code input} declarations and the
     * limits of one read. Immutable and thread-safe; each {@code with...} returns a new
     * settings object.
     *
     * @since 0.1
     */
    public static final class Settings {
        /** The default work budget: {@value} steps. */
        public static final long DEFAULT_WORK_BUDGET = 10_000_000L;
        /** The default bound of a while loop without {@code @max_iterations}: {@value}. */
        public static final int DEFAULT_LOOP_BOUND = 1000;
        /** The default largest file: {@value} bytes (64 MiB). */
        public static final long DEFAULT_MAX_FILE_BYTES = 64L << 20;

        static final Settings DEFAULTS = new Settings(Map.of(), DEFAULT_WORK_BUDGET,
                DEFAULT_LOOP_BOUND, DEFAULT_MAX_FILE_BYTES, MAX_INSTRUCTIONS, Double.NaN);

        private final Map<String, Number> inputs;
        private final long workBudget;
        private final int loopBound;
        private final long maxFileBytes;
        private final int maxInstructions;
        private final double timeStep;

        private Settings(Map<String, Number> inputs, long workBudget, int loopBound,
                long maxFileBytes, int maxInstructions, double timeStep) {
            this.inputs = inputs;
            this.workBudget = workBudget;
            this.loopBound = loopBound;
            this.maxFileBytes = maxFileBytes;
            this.maxInstructions = maxInstructions;
            this.timeStep = timeStep;
        }

        /**
         * Returns the default settings: no inputs, a work budget of
         * {@value #DEFAULT_WORK_BUDGET} steps, while loops bounded at
         * {@value #DEFAULT_LOOP_BOUND} iterations, files up to {@value #DEFAULT_MAX_FILE_BYTES}
         * bytes, at most {@value QasmReader#MAX_INSTRUCTIONS} instructions, {@code dt} unknown.
         *
         * @return the defaults
         */
        public static Settings defaults() {
            return DEFAULTS;
        }

        private Settings withInputValue(String name, Number value) {
            Checks.requireName(name, "an input name");
            Map<String, Number> m = new TreeMap<>(inputs);
            m.put(name, value);
            return new Settings(Collections.unmodifiableMap(m), workBudget, loopBound,
                    maxFileBytes, maxInstructions, timeStep);
        }

        /**
         * Gives the value of an {@code input} declaration of float or angle type (an integer
         * or bool input takes it truncated toward zero, or true when non-zero). Every input
         * given must be declared by the program.
         *
         * @param name the input's name
         * @param value its value, finite
         * @return new settings
         * @throws IllegalArgumentException if the name is blank or holds white space, or the
         *     value is not finite
         */
        public Settings withInput(String name, double value) {
            Checks.requireFinite(value, "the value of input " + Checks.excerpt(name));
            return withInputValue(name, value);
        }

        /**
         * Gives the value of an {@code input} declaration of integer, bool or float type (a
         * bool input is true when the value is non-zero). Every input given must be declared
         * by the program.
         *
         * @param name the input's name
         * @param value its value
         * @return new settings
         * @throws IllegalArgumentException if the name is blank or holds white space
         */
        public Settings withInput(String name, long value) {
            return withInputValue(name, value);
        }

        /**
         * Sets the work budget: the most steps one read may take (statements run, gate
         * definitions and subroutines entered, loop iterations, register elements operands
         * stand for, barrier operands, expression operations). A read ends in time
         * proportional to it.
         *
         * @param steps at least 1
         * @return new settings
         * @throws IllegalArgumentException if {@code steps} is less than 1
         */
        public Settings withWorkBudget(long steps) {
            Checks.requireAtLeast(steps, 1, "the work budget");
            return new Settings(inputs, steps, loopBound, maxFileBytes, maxInstructions,
                    timeStep);
        }

        /**
         * Sets the iteration bound of while loops that have no {@code @max_iterations}
         * annotation ({@link Circuit.Builder#whileLoop}).
         *
         * @param iterations 1 to {@value Circuit.Builder#MAX_ITERATIONS}
         * @return new settings
         * @throws IllegalArgumentException if out of range
         */
        public Settings withLoopBound(int iterations) {
            Checks.requireInRange(iterations, 1, Circuit.Builder.MAX_ITERATIONS,
                    "the loop bound");
            return new Settings(inputs, workBudget, iterations, maxFileBytes, maxInstructions,
                    timeStep);
        }

        /**
         * Sets the largest file read, in bytes (for text given as a string, in characters).
         *
         * @param bytes 1 to {@value Integer#MAX_VALUE} minus 8
         * @return new settings
         * @throws IllegalArgumentException if out of range
         */
        public Settings withMaxFileBytes(long bytes) {
            Checks.requireAtLeast(bytes, 1, "the largest file");
            if (bytes > Integer.MAX_VALUE - 8) {
                throw new IllegalArgumentException("the largest file must be at most "
                        + (Integer.MAX_VALUE - 8) + " bytes but was " + bytes);
            }
            return new Settings(inputs, workBudget, loopBound, bytes, maxInstructions,
                    timeStep);
        }

        /**
         * Sets the most instructions a program may expand to (blocks count their
         * instructions too).
         *
         * @param instructions at least 1
         * @return new settings
         * @throws IllegalArgumentException if less than 1
         */
        public Settings withMaxInstructions(int instructions) {
            Checks.requireInRange(instructions, 1, Integer.MAX_VALUE, "the instruction limit");
            return new Settings(inputs, workBudget, loopBound, maxFileBytes, instructions,
                    timeStep);
        }

        /**
         * Sets the length of the time unit {@code dt} (a device's sample time), so that
         * {@code delay[100dt]} can be read.
         *
         * @param seconds finite and greater than 0
         * @return new settings
         * @throws IllegalArgumentException if not finite or not positive
         */
        public Settings withTimeStep(double seconds) {
            Checks.requirePositiveTime(seconds, "the length of dt");
            return new Settings(inputs, workBudget, loopBound, maxFileBytes, maxInstructions,
                    seconds);
        }

        /**
         * Returns the input values given, by name.
         *
         * @return an unmodifiable map of {@link Long} and {@link Double} values
         */
        public Map<String, Number> inputs() {
            return inputs;
        }

        /**
         * Returns the work budget, in steps.
         *
         * @return the budget
         */
        public long workBudget() {
            return workBudget;
        }

        /**
         * Returns the iteration bound of while loops without an annotation.
         *
         * @return the bound
         */
        public int loopBound() {
            return loopBound;
        }

        /**
         * Returns the largest file read, in bytes.
         *
         * @return the limit
         */
        public long maxFileBytes() {
            return maxFileBytes;
        }

        /**
         * Returns the most instructions a program may expand to.
         *
         * @return the limit
         */
        public int maxInstructions() {
            return maxInstructions;
        }

        /**
         * Returns the length of {@code dt} in seconds, or NaN when not given.
         *
         * @return the length or NaN
         */
        public double timeStep() {
            return timeStep;
        }

        /**
         * Returns a summary of the settings.
         *
         * @return the summary
         */
        @Override
        public String toString() {
            return "Settings[inputs " + Checks.excerpt(inputs.keySet().toString())
                    + ", work budget " + workBudget + ", loop bound " + loopBound
                    + ", max file bytes " + maxFileBytes + ", max instructions "
                    + maxInstructions + ", dt " + (Double.isNaN(timeStep) ? "unknown"
                    : timeStep + " s") + "]";
        }
    }
}
