package dev.qsim.text;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Gates;
import dev.qsim.Operator;
import dev.qsim.text.Lexer.Token;
import dev.qsim.text.Lexer.Type;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.function.Function;
import org.apache.commons.numbers.complex.Complex;

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
 *   <li>the standard gates {@code h x y z s sdg t tdg sx rx ry rz p phase cx CX cy ch crx cry
 *       crz cz cp cphase swap ccx cswap}, the built-ins {@code U(θ, φ, λ)} (as
 *       {@link Gates#u(double, double, double)}) and {@code gphase(γ)} (a global phase, applied
 *       as the operator {@code e^{iγ} I} on qubit 0), and the modifiers {@code inv @} and
 *       {@code ctrl @} / {@code ctrl(k) @} (the latter on standard and built-in gates);</li>
 *   <li>a whole register as an operand applies the gate to each index in turn (registers of one
 *       call must then have equal sizes);</li>
 *   <li>parameters as constant expressions: numbers, {@code pi}/{@code π}, {@code tau}/{@code τ},
 *       {@code euler}, {@code + - * /}, powers {@code ^} or {@code **}, unary minus, parentheses
 *       and the functions {@code sin cos tan arcsin arccos arctan exp ln sqrt};</li>
 *   <li>{@code c[0] = measure q[0];}, {@code c = measure q;}, {@code measure q[0] -> c[0];},
 *       {@code reset q[0];}, {@code barrier ...;} (accepted, nothing recorded);</li>
 *   <li>{@code if (c[0] == 1) stmt} or {@code if (c[0] == 1) { ... }} on one bit;</li>
 *   <li>{@code gate name(params) a, b { ... }} definitions, expanded where used;</li>
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
 * @since 0.2
 */
public final class QasmReader {
    /** The most instructions a file may expand to: {@value}. */
    public static final int MAX_INSTRUCTIONS = 1_000_000;
    private static final int MAX_NESTING = 64;

    private static final Set<String> OUTSIDE = Set.of("def", "defcal", "cal", "for", "while",
            "switch", "case", "return", "break", "continue", "end", "input", "output", "const",
            "let", "int", "uint", "float", "angle", "bool", "complex", "duration", "stretch",
            "delay", "box", "extern", "array", "qreg", "creg", "pragma", "opaque", "else",
            "negctrl", "pow", "durationof", "defcalgrammar", "readonly", "mutable");

    private QasmReader() {
    }

    /**
     * Reads a circuit from OpenQASM 3 text.
     *
     * @param text the program
     * @return the circuit, with as many qubits and clbits as the declarations add up to
     * @throws CircuitFormatException if the text is not in the subset or the circuit refuses a
     *     statement; the message gives line and column
     */
    public static Circuit read(String text) {
        Objects.requireNonNull(text, "text");
        return new Parser(Lexer.tokens(text)).program();
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

    /** Records one instruction (or block) once the circuit's size is known. */
    @FunctionalInterface
    interface Op {
        void apply(Circuit.Builder b, int qubits, int clbits);
    }

    /** A parameter expression. */
    @FunctionalInterface
    interface Expr {
        double eval(Map<String, Double> env);
    }

    /** The operator {@code e^{iγ} I} on one qubit. */
    static Operator globalPhase(double gamma) {
        if (!Double.isFinite(gamma)) {
            throw new IllegalArgumentException("gphase angle must be finite but was " + gamma);
        }
        Complex z = Complex.ofCis(gamma);
        return Operator.of(new Complex[][] {{z, Complex.ZERO}, {Complex.ZERO, z}});
    }

    /** A register: first index, size, whether declared without a size. */
    private static final class Register {
        final int offset;
        final int size;

        Register(int offset, int size) {
            this.offset = offset;
            this.size = size;
        }
    }

    /** An operand: a register name and an optional index. */
    private static final class Arg {
        final Token at;
        final String name;
        final long index; // -1 for the whole register

        Arg(Token at, String name, long index) {
            this.at = at;
            this.name = name;
            this.index = index;
        }
    }

    /** A gate call, with modifiers. */
    private static final class Call {
        final Token at;
        final String name;
        final boolean inverse;
        final int controls;
        final List<Expr> params;
        final List<Arg> args;

        Call(Token at, String name, boolean inverse, int controls, List<Expr> params,
                List<Arg> args) {
            this.at = at;
            this.name = name;
            this.inverse = inverse;
            this.controls = controls;
            this.params = params;
            this.args = args;
        }
    }

    /** A user gate definition. */
    private static final class Definition {
        final List<String> params;
        final List<String> qubits;
        final List<Call> body;

        Definition(List<String> params, List<String> qubits, List<Call> body) {
            this.params = params;
            this.qubits = qubits;
            this.body = body;
        }
    }

    /** Recursive-descent parser over the token list. */
    private static final class Parser {
        private final List<Token> tokens;
        private int pos;
        private boolean included;
        private final Map<String, Register> qregs = new LinkedHashMap<>();
        private final Map<String, Register> cregs = new LinkedHashMap<>();
        private final Map<String, Definition> gates = new HashMap<>();
        private int qubits;
        private int clbits;
        private long emitted;

        Parser(List<Token> tokens) {
            this.tokens = tokens;
        }

        private Token peek() {
            return tokens.get(pos);
        }

        private Token peek(int ahead) {
            return tokens.get(Math.min(pos + ahead, tokens.size() - 1));
        }

        private Token next() {
            Token t = tokens.get(pos);
            if (t.type != Type.END) {
                pos++;
            }
            return t;
        }

        private static CircuitFormatException error(Token t, String message) {
            return new CircuitFormatException(t.line, t.column, message);
        }

        private Token expect(String symbol) {
            Token t = next();
            if (!t.is(symbol)) {
                throw error(t, "expected '" + symbol + "' but found " + t.show());
            }
            return t;
        }

        private Token ident(String what) {
            Token t = next();
            if (t.type != Type.IDENT) {
                throw error(t, "expected " + what + " but found " + t.show());
            }
            return t;
        }

        Circuit program() {
            List<Op> ops = new ArrayList<>();
            if (peek().is("OPENQASM")) {
                next();
                Token num = next();
                if (num.type != Type.NUMBER || !(num.text.equals("3")
                        || num.text.startsWith("3."))) {
                    throw error(num, "OpenQASM version " + num.show() + " is not supported; only"
                            + " version 3 is");
                }
                expect(";");
            }
            while (peek().type != Type.END) {
                statement(ops, true, 0);
            }
            if (qubits == 0) {
                throw error(peek(), "the program declares no qubit; declare one with"
                        + " 'qubit[n] q;'");
            }
            Circuit.Builder b = Circuit.builder(qubits, clbits);
            for (Op op : ops) {
                op.apply(b, qubits, clbits);
            }
            return b.build();
        }

        private void statement(List<Op> ops, boolean top, int depth) {
            if (depth > MAX_NESTING) {
                throw error(peek(), "blocks nested deeper than " + MAX_NESTING + " levels");
            }
            Token t = peek();
            if (t.type != Type.IDENT) {
                throw error(t, "expected a statement but found " + t.show());
            }
            String w = t.text;
            if (w.equals("OPENQASM")) {
                throw error(t, "'OPENQASM' must be the first statement");
            }
            if (w.equals("include")) {
                requireTop(top, t);
                next();
                Token f = next();
                if (f.type != Type.STRING || !f.text.equals("stdgates.inc")) {
                    throw error(f, "only include \"stdgates.inc\" is supported, not " + f.show());
                }
                expect(";");
                included = true;
            } else if (w.equals("qubit") || w.equals("bit")) {
                requireTop(top, t);
                declaration(w.equals("qubit"));
            } else if (w.equals("gate")) {
                requireTop(top, t);
                definition();
            } else if (w.equals("measure")) {
                next();
                Arg q = operand();
                expect("->");
                Arg c = operand();
                expect(";");
                measure(t, q, c, ops);
            } else if (w.equals("reset")) {
                next();
                Arg a = operand();
                expect(";");
                for (int q : resolve(a, qregs, "qubit")) {
                    count(t);
                    ops.add(at(t, (b, nq, nc) -> b.reset(q)));
                }
            } else if (w.equals("barrier")) {
                next();
                if (!peek().is(";")) {
                    resolve(operand(), qregs, "qubit");
                    while (peek().is(",")) {
                        next();
                        resolve(operand(), qregs, "qubit");
                    }
                }
                expect(";");
            } else if (w.equals("if")) {
                conditional(ops, depth);
            } else if (OUTSIDE.contains(w)) {
                throw error(t, "'" + w + "' is outside the supported subset of OpenQASM 3"
                        + " (gates, measure, reset, barrier, if on one bit, gate definitions)");
            } else if (peek(1).is("=") || (peek(1).is("[") && peek(3).is("]")
                    && peek(4).is("="))) {
                Arg c = operand();
                expect("=");
                Token m = next();
                if (!m.is("measure")) {
                    throw error(m, "only 'measure' may be assigned to a bit, not " + m.show());
                }
                Arg q = operand();
                expect(";");
                measure(t, q, c, ops);
            } else {
                Call call = call(null, null);
                expect(";");
                topCall(call, ops);
            }
        }

        private void requireTop(boolean top, Token t) {
            if (!top) {
                throw error(t, "'" + t.text + "' is allowed only at the top level, not inside"
                        + " a block");
            }
        }

        private void declaration(boolean quantum) {
            Token kw = next();
            long size = 1;
            if (peek().is("[")) {
                next();
                Token n = next();
                size = whole(n, "register size");
                expect("]");
                if (size < 1) {
                    throw error(n, "a register needs at least 1 " + kw.text + " but the size was "
                            + size);
                }
            }
            Token name = ident("a register name");
            if (peek().is("=")) {
                throw error(peek(), "initialised declarations are outside the supported subset");
            }
            expect(";");
            checkFree(name);
            long total = (quantum ? qubits : clbits) + size;
            if (total > Circuit.MAX_QUBITS) {
                throw error(name, "register '" + name.text + "' brings the " + kw.text
                        + " count to " + total + " but at most " + Circuit.MAX_QUBITS
                        + " are allowed");
            }
            if (quantum) {
                qregs.put(name.text, new Register(qubits, (int) size));
                qubits = (int) total;
            } else {
                cregs.put(name.text, new Register(clbits, (int) size));
                clbits = (int) total;
            }
        }

        private void checkFree(Token name) {
            String n = name.text;
            if (qregs.containsKey(n) || cregs.containsKey(n) || gates.containsKey(n)
                    || QasmGates.find(n) != null || OUTSIDE.contains(n) || isKeyword(n)) {
                throw error(name, "the name '" + Lexer.clip(n) + "' is already in use");
            }
        }

        private static boolean isKeyword(String n) {
            return Set.of("qubit", "bit", "gate", "measure", "reset", "barrier", "if", "include",
                    "OPENQASM", "inv", "ctrl", "pi", "tau", "euler", "π", "τ").contains(n);
        }

        private static long whole(Token n, String what) {
            if (n.type != Type.NUMBER) {
                throw error(n, "expected a whole number for the " + what + " but found "
                        + n.show());
            }
            try {
                return Long.parseLong(n.text);
            } catch (NumberFormatException e) {
                throw error(n, "the " + what + " must be a whole number up to "
                        + Circuit.MAX_QUBITS + " but was '" + Lexer.clip(n.text) + "'");
            }
        }

        private Arg operand() {
            Token name = ident("a register name");
            long index = -1;
            if (peek().is("[")) {
                next();
                Token n = next();
                index = whole(n, "index");
                expect("]");
            }
            return new Arg(name, name.text, index);
        }

        private static int[] resolve(Arg a, Map<String, Register> regs, String kind) {
            Register r = regs.get(a.name);
            if (r == null) {
                throw error(a.at, "unknown " + kind + " register '" + Lexer.clip(a.name) + "'");
            }
            if (a.index < 0) {
                int[] all = new int[r.size];
                for (int i = 0; i < r.size; i++) {
                    all[i] = r.offset + i;
                }
                return all;
            }
            if (a.index >= r.size) {
                throw error(a.at, "index " + a.index + " is out of range [0, " + (r.size - 1)
                        + "] for " + kind + " register '" + a.name + "'");
            }
            return new int[] {r.offset + (int) a.index};
        }

        private void measure(Token t, Arg qa, Arg ca, List<Op> ops) {
            int[] q = resolve(qa, qregs, "qubit");
            int[] c = resolve(ca, cregs, "bit");
            if (q.length != c.length) {
                throw error(t, "measure needs as many bits as qubits but got " + q.length
                        + " qubit(s) and " + c.length + " bit(s)");
            }
            for (int i = 0; i < q.length; i++) {
                int qi = q[i];
                int ci = c[i];
                count(t);
                ops.add(at(t, (b, nq, nc) -> b.measure(qi, ci)));
            }
        }

        private void conditional(List<Op> ops, int depth) {
            Token t = next();
            expect("(");
            Arg bit = operand();
            int[] c = resolve(bit, cregs, "bit");
            if (c.length != 1) {
                throw error(bit.at, "a condition must test one bit, but '" + bit.name + "' has "
                        + c.length);
            }
            expect("==");
            Token v = next();
            int value;
            if (v.is("true") || v.is("1")) {
                value = 1;
            } else if (v.is("false") || v.is("0")) {
                value = 0;
            } else if (v.type == Type.NUMBER && (v.text.equals("1") || v.text.equals("0"))) {
                value = Integer.parseInt(v.text);
            } else {
                throw error(v, "a bit can be compared only with 0, 1, true or false, not "
                        + v.show());
            }
            expect(")");
            List<Op> body = new ArrayList<>();
            if (peek().is("{")) {
                next();
                while (!peek().is("}")) {
                    if (peek().type == Type.END) {
                        throw error(peek(), "expected '}' to close the block of 'if' on line "
                                + t.line);
                    }
                    statement(body, false, depth + 1);
                }
                next();
            } else {
                statement(body, false, depth + 1);
            }
            if (peek().is("else")) {
                throw error(peek(), "'else' is outside the supported subset of OpenQASM 3");
            }
            int clbit = c[0];
            List<Op> block = List.copyOf(body);
            ops.add(at(t, (b, nq, nc) -> b.ifBit(clbit, value, inner -> {
                for (Op op : block) {
                    op.apply(inner, nq, nc);
                }
            })));
        }

        private void definition() {
            next();
            Token name = ident("a gate name");
            checkFree(name);
            List<String> params = new ArrayList<>();
            if (peek().is("(")) {
                next();
                if (!peek().is(")")) {
                    params.add(newName(params, null));
                    while (peek().is(",")) {
                        next();
                        params.add(newName(params, null));
                    }
                }
                expect(")");
            }
            List<String> qargs = new ArrayList<>();
            qargs.add(newName(qargs, params));
            while (peek().is(",")) {
                next();
                qargs.add(newName(qargs, params));
            }
            expect("{");
            List<Call> body = new ArrayList<>();
            while (!peek().is("}")) {
                Token t = peek();
                if (t.type == Type.END) {
                    throw error(t, "expected '}' to close gate '" + name.text + "'");
                }
                if (t.is("barrier")) {
                    next();
                    while (!peek().is(";")) {
                        Token a = ident("a qubit argument");
                        if (!qargs.contains(a.text)) {
                            throw error(a, "unknown qubit argument '" + Lexer.clip(a.text)
                                    + "' in gate '" + name.text + "'; arguments: " + qargs);
                        }
                        if (!peek().is(";")) {
                            expect(",");
                        }
                    }
                    next();
                    continue;
                }
                if (t.is("measure") || t.is("reset") || t.is("if") || t.is("qubit")
                        || t.is("bit") || t.is("gate")) {
                    throw error(t, "'" + t.text + "' is not allowed in a gate definition; only"
                            + " gates and barrier are");
                }
                Call c = call(params, qargs);
                expect(";");
                body.add(c);
            }
            next();
            gates.put(name.text, new Definition(params, qargs, body));
        }

        private String newName(List<String> seen, List<String> other) {
            Token t = ident("a name");
            if (seen.contains(t.text) || (other != null && other.contains(t.text))
                    || isKeyword(t.text)) {
                throw error(t, "the name '" + Lexer.clip(t.text) + "' is already in use");
            }
            return t.text;
        }

        /** Parses modifiers, a gate name, parameters and operands (not the ';'). */
        private Call call(List<String> params, List<String> qargs) {
            boolean inverse = false;
            int controls = 0;
            Token first = peek();
            while (peek().is("inv") || peek().is("ctrl") || peek().is("negctrl")
                    || peek().is("pow")) {
                Token m = next();
                if (m.is("negctrl") || m.is("pow")) {
                    throw error(m, "the modifier '" + m.text + "' is outside the supported"
                            + " subset; 'inv @' and 'ctrl @' are supported");
                }
                if (m.is("inv")) {
                    inverse = !inverse;
                } else {
                    long k = 1;
                    if (peek().is("(")) {
                        next();
                        Token n = next();
                        k = whole(n, "control count");
                        expect(")");
                        if (k < 1 || k > 64) {
                            throw error(n, "the control count must be from 1 to 64 but was "
                                    + k);
                        }
                    }
                    if (controls > 0) {
                        throw error(m, "only one 'ctrl' modifier per gate is supported; use"
                                + " ctrl(k) @");
                    }
                    controls = (int) k;
                }
                expect("@");
            }
            Token name = ident("a gate name");
            if (OUTSIDE.contains(name.text)) {
                throw error(name, "'" + name.text + "' is outside the supported subset of"
                        + " OpenQASM 3 (gates, measure, reset, barrier, if on one bit, gate"
                        + " definitions)");
            }
            QasmGates.Entry known = QasmGates.callable(name.text, included);
            Definition user = gates.get(name.text);
            if (known == null && user == null) {
                throw error(name, "unknown gate '" + Lexer.clip(name.text) + "'"
                        + (QasmGates.find(name.text) != null
                        ? "; standard gates need include \"stdgates.inc\"" : ""));
            }
            if (controls > 0 && user != null) {
                throw error(first, "'ctrl @' on the user gate '" + name.text + "' is outside the"
                        + " supported subset; it works on standard gates, U and gphase");
            }
            List<Expr> exprs = new ArrayList<>();
            if (peek().is("(")) {
                next();
                if (!peek().is(")")) {
                    exprs.add(expression(params, 0));
                    while (peek().is(",")) {
                        next();
                        exprs.add(expression(params, 0));
                    }
                }
                expect(")");
            }
            List<Arg> args = new ArrayList<>();
            if (!peek().is(";")) {
                args.add(qargs == null ? operand() : bodyArg(qargs));
                while (peek().is(",")) {
                    next();
                    args.add(qargs == null ? operand() : bodyArg(qargs));
                }
            }
            int wantParams = known != null ? known.parameters() : user.params.size();
            int wantQubits = controls + (known != null ? known.qubits() : user.qubits.size());
            if (exprs.size() != wantParams) {
                throw error(name, "gate '" + name.text + "' takes " + wantParams
                        + " parameter(s) but " + exprs.size() + " were given");
            }
            if (args.size() != wantQubits) {
                throw error(name, (controls > 0 ? "ctrl(" + controls + ") @ " : "") + "gate '"
                        + name.text + "' takes " + wantQubits + " qubit(s) but " + args.size()
                        + " were given");
            }
            return new Call(first, name.text, inverse, controls, exprs, args);
        }

        private Arg bodyArg(List<String> qargs) {
            Token t = ident("a qubit argument");
            if (peek().is("[")) {
                throw error(peek(), "indexing is not allowed inside a gate definition");
            }
            if (!qargs.contains(t.text)) {
                throw error(t, "unknown qubit argument '" + Lexer.clip(t.text) + "'; arguments: "
                        + qargs);
            }
            return new Arg(t, t.text, -1);
        }

        /** Expands a top-level call, broadcasting whole registers. */
        private void topCall(Call call, List<Op> ops) {
            List<int[]> lists = new ArrayList<>();
            int n = -1;
            for (Arg a : call.args) {
                int[] q = resolve(a, qregs, "qubit");
                if (a.index < 0) {
                    if (n >= 0 && q.length != n) {
                        throw error(a.at, "registers of one call must have equal sizes, but '"
                                + a.name + "' has " + q.length + " qubits and an earlier one "
                                + n);
                    }
                    n = q.length;
                }
                lists.add(q);
            }
            double[] p = new double[call.params.size()];
            Map<String, Double> none = Map.of();
            for (int i = 0; i < p.length; i++) {
                p[i] = call.params.get(i).eval(none);
            }
            int reps = Math.max(n, 1);
            for (int r = 0; r < reps; r++) {
                int[] q = new int[lists.size()];
                for (int i = 0; i < q.length; i++) {
                    int[] l = lists.get(i);
                    q[i] = l.length == 1 && call.args.get(i).index >= 0 ? l[0] : l[r];
                }
                expand(call, p, q, ops, 0);
            }
        }

        private void count(Token t) {
            if (++emitted > MAX_INSTRUCTIONS) {
                throw error(t, "the program expands to more than " + MAX_INSTRUCTIONS
                        + " instructions");
            }
        }

        /** Appends the instructions of one call with evaluated parameters and qubits. */
        private void expand(Call call, double[] p, int[] q, List<Op> ops, int depth) {
            Token t = call.at;
            if (depth > MAX_NESTING) {
                throw error(t, "gate definitions nested deeper than " + MAX_NESTING + " levels");
            }
            Definition def = gates.get(call.name);
            if (def != null) {
                List<Op> inner = call.inverse ? new ArrayList<>() : ops;
                Map<String, Double> env = new HashMap<>();
                for (int i = 0; i < p.length; i++) {
                    env.put(def.params.get(i), p[i]);
                }
                Map<String, Integer> qs = new HashMap<>();
                for (int i = 0; i < q.length; i++) {
                    qs.put(def.qubits.get(i), q[i]);
                }
                for (Call c : def.body) {
                    double[] cp = new double[c.params.size()];
                    for (int i = 0; i < cp.length; i++) {
                        cp[i] = c.params.get(i).eval(env);
                    }
                    int[] cq = new int[c.args.size()];
                    for (int i = 0; i < cq.length; i++) {
                        cq[i] = qs.get(c.args.get(i).name);
                    }
                    expand(c, cp, cq, inner, depth + 1);
                }
                if (call.inverse) {
                    List<Op> block = List.copyOf(inner);
                    ops.add(at(t, (b, nq, nc) -> b.append(replay(block, nq, nc).inverse())));
                }
                return;
            }
            count(t);
            int k = call.controls;
            boolean inverse = call.inverse;
            QasmGates.Entry known = QasmGates.find(call.name);
            if (known.globalPhase()) {
                // ctrl(k) @ gphase(γ) is phase(γ) on the last control, controlled by the rest.
                ops.add(at(t, (b, nq, nc) -> {
                    double gamma = inverse ? -p[0] : p[0];
                    if (k == 0) {
                        b.apply(globalPhase(gamma), 0);
                    } else {
                        b.controlled(Gate.PHASE, new double[] {gamma},
                                java.util.Arrays.copyOf(q, k - 1), q[k - 1]);
                    }
                }));
                return;
            }
            Gate gate = known.gate();
            int[] controls = java.util.Arrays.copyOf(q, k);
            int[] own = java.util.Arrays.copyOfRange(q, k, q.length);
            ops.add(at(t, (b, nq, nc) -> {
                Gate use = inverse ? gate.inverse() : gate;
                double[] angles = inverse ? gate.inverseAngles(p) : p;
                b.controlled(use, angles, controls, own);
            }));
        }

        private static Circuit replay(List<Op> ops, int nq, int nc) {
            Circuit.Builder tmp = Circuit.builder(nq, nc);
            for (Op op : ops) {
                op.apply(tmp, nq, nc);
            }
            return tmp.build();
        }

        private static Op at(Token t, Op op) {
            return (b, nq, nc) -> {
                try {
                    op.apply(b, nq, nc);
                } catch (CircuitFormatException e) {
                    throw e;
                } catch (IllegalArgumentException | IndexOutOfBoundsException e) {
                    throw new CircuitFormatException(t.line, t.column, e.getMessage(), e);
                }
            };
        }

        // Expressions: sum := product (('+'|'-') product)*; product := unary (('*'|'/') unary)*;
        // unary := ('-'|'+') unary | power; power := primary (('^'|'**') unary)?
        private Expr expression(List<String> params, int depth) {
            nest(depth);
            Expr left = product(params, depth);
            while (peek().is("+") || peek().is("-")) {
                boolean plus = next().is("+");
                Expr l = left;
                Expr r = product(params, depth);
                left = plus ? env -> l.eval(env) + r.eval(env) : env -> l.eval(env) - r.eval(env);
            }
            return left;
        }

        private void nest(int depth) {
            if (depth > MAX_NESTING) {
                throw error(peek(), "expression nested deeper than " + MAX_NESTING + " levels");
            }
        }

        private Expr product(List<String> params, int depth) {
            Expr left = unary(params, depth);
            while (peek().is("*") || peek().is("/")) {
                boolean times = next().is("*");
                Expr l = left;
                Expr r = unary(params, depth);
                left = times ? env -> l.eval(env) * r.eval(env) : env -> l.eval(env) / r.eval(env);
            }
            return left;
        }

        private Expr unary(List<String> params, int depth) {
            nest(depth);
            if (peek().is("-")) {
                next();
                Expr e = unary(params, depth + 1);
                return env -> -e.eval(env);
            }
            if (peek().is("+")) {
                next();
                return unary(params, depth + 1);
            }
            Expr base = primary(params, depth);
            if (peek().is("^") || peek().is("**")) {
                next();
                Expr exp = unary(params, depth + 1);
                return env -> Math.pow(base.eval(env), exp.eval(env));
            }
            return base;
        }

        private Expr primary(List<String> params, int depth) {
            Token t = next();
            if (t.type == Type.NUMBER) {
                double v = Double.parseDouble(t.text);
                return env -> v;
            }
            if (t.is("(")) {
                Expr e = expression(params, depth + 1);
                expect(")");
                return e;
            }
            if (t.type == Type.IDENT) {
                switch (t.text) {
                    case "pi":
                    case "π":
                        return env -> Math.PI;
                    case "tau":
                    case "τ":
                        return env -> 2 * Math.PI;
                    case "euler":
                    case "ℇ":
                        return env -> Math.E;
                    default:
                        break;
                }
                Function<Double, Double> f = function(t.text);
                if (f != null) {
                    expect("(");
                    Expr arg = expression(params, depth + 1);
                    expect(")");
                    return env -> f.apply(arg.eval(env));
                }
                if (params != null && params.contains(t.text)) {
                    String name = t.text;
                    return env -> env.get(name);
                }
                throw error(t, "unknown name '" + Lexer.clip(t.text) + "' in an expression;"
                        + " allowed: numbers, pi, tau, euler, sin, cos, tan, arcsin, arccos,"
                        + " arctan, exp, ln, sqrt" + (params == null || params.isEmpty() ? ""
                        : ", and the parameters " + params));
            }
            throw error(t, "expected a number or an expression but found " + t.show());
        }

        private static Function<Double, Double> function(String name) {
            switch (name) {
                case "sin":
                    return Math::sin;
                case "cos":
                    return Math::cos;
                case "tan":
                    return Math::tan;
                case "arcsin":
                    return Math::asin;
                case "arccos":
                    return Math::acos;
                case "arctan":
                    return Math::atan;
                case "exp":
                    return Math::exp;
                case "ln":
                    return Math::log;
                case "sqrt":
                    return Math::sqrt;
                default:
                    return null;
            }
        }
    }
}
