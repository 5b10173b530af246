package dev.qsim.text;

import java.util.ArrayList;
import java.util.List;
import java.util.function.Consumer;

import dev.qsim.text.Lexer.Token;
import dev.qsim.text.Lexer.Type;
import dev.qsim.text.Syntax.Barrier;
import dev.qsim.text.Syntax.Declaration;
import dev.qsim.text.Syntax.GateCall;
import dev.qsim.text.Syntax.If;
import dev.qsim.text.Syntax.Include;
import dev.qsim.text.Syntax.Measure;
import dev.qsim.text.Syntax.Operand;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.Program;
import dev.qsim.text.Syntax.Reset;
import dev.qsim.text.Syntax.Statement;

/**
 * Parses the subset's statements by recursive descent into a {@link Syntax} tree; gate calls
 * and definitions go to a {@link CallParser}, expressions to an {@link ExpressionParser}, all on
 * the same tokens. Builds no circuit.
 *
 * <p>Each statement, at any depth, is handed to a listener as soon as it ends (the statements
 * of an {@code if} block before the {@code if} itself), so that the listener's checks run
 * before the text after the statement is read and every problem is reported where the text
 * first shows it. For the same reason the parser looks names up in the {@link Scope} the
 * listener keeps where OpenQASM requires them declared before use: a called gate (with its
 * parameter and qubit counts), the name of a new gate, the registers of {@code barrier} and of
 * a condition.
 */
final class Parser {
    private final Tokens tokens;
    private final CallParser calls;
    private final Scope scope;
    private final Consumer<Statement> ended;

    /**
     * Creates a parser over a whole text's tokens.
     *
     * @param list the lexer's tokens
     * @param scope the names declared so far, kept up to date by {@code ended}
     * @param ended receives each statement as soon as it ends
     */
    Parser(List<Token> list, Scope scope, Consumer<Statement> ended) {
        this.tokens = new Tokens(list);
        this.calls = new CallParser(tokens, scope);
        this.scope = scope;
        this.ended = ended;
    }

    /** Parses the whole text. */
    Program program() {
        String version = null;
        if (tokens.peek().is("OPENQASM")) {
            tokens.next();
            Token num = tokens.next();
            if (num.type != Type.NUMBER || !(num.text.equals("3") || num.text.startsWith("3."))) {
                throw Tokens.error(num, "OpenQASM version " + num.show() + " is not supported;"
                        + " only version 3 is");
            }
            version = num.text;
            tokens.expect(";");
        }
        List<Statement> statements = new ArrayList<>();
        while (tokens.peek().type != Type.END) {
            statements.add(statement(true, 0));
        }
        return new Program(version, statements, Position.of(tokens.peek()));
    }

    private Statement statement(boolean top, int depth) {
        Statement s = parseStatement(top, depth);
        ended.accept(s);
        return s;
    }

    private Statement parseStatement(boolean top, int depth) {
        if (depth > QasmReader.MAX_NESTING) {
            throw Tokens.error(tokens.peek(), "blocks nested deeper than "
                    + QasmReader.MAX_NESTING + " levels");
        }
        Token t = tokens.peek();
        Position at = Position.of(t);
        if (t.type != Type.IDENT) {
            throw Tokens.error(t, "expected a statement but found " + t.show());
        }
        switch (t.text) {
            case "OPENQASM":
                throw Tokens.error(t, "'OPENQASM' must be the first statement");
            case "include":
                requireTop(top, t);
                tokens.next();
                Token f = tokens.next();
                if (f.type != Type.STRING || !f.text.equals("stdgates.inc")) {
                    throw Tokens.error(f, "only include \"stdgates.inc\" is supported, not "
                            + f.show());
                }
                tokens.expect(";");
                return new Include(at, f.text);
            case "qubit":
            case "bit":
                requireTop(top, t);
                return declaration();
            case "gate":
                requireTop(top, t);
                return calls.definition();
            case "measure":
                tokens.next();
                Operand q = calls.operand();
                tokens.expect("->");
                Operand c = calls.operand();
                tokens.expect(";");
                return new Measure(at, q, c);
            case "reset":
                tokens.next();
                Operand a = calls.operand();
                tokens.expect(";");
                return new Reset(at, a);
            case "barrier":
                return barrier();
            case "if":
                return conditional(depth);
            default:
                break;
        }
        if (Syntax.UNSUPPORTED.contains(t.text)) {
            throw Tokens.error(t, "'" + t.text + "' is outside the supported subset of OpenQASM"
                    + " 3 (gates, measure, reset, barrier, if on one bit, gate definitions)");
        }
        if (tokens.peek(1).is("=") || (tokens.peek(1).is("[") && tokens.peek(3).is("]")
                && tokens.peek(4).is("="))) {
            Operand c = calls.operand();
            tokens.expect("=");
            Token m = tokens.next();
            if (!m.is("measure")) {
                throw Tokens.error(m, "only 'measure' may be assigned to a bit, not " + m.show());
            }
            Operand q = calls.operand();
            tokens.expect(";");
            return new Measure(at, q, c);
        }
        GateCall call = calls.call(null, null);
        tokens.expect(";");
        return call;
    }

    private static void requireTop(boolean top, Token t) {
        if (!top) {
            throw Tokens.error(t, "'" + t.text + "' is allowed only at the top level, not"
                    + " inside a block");
        }
    }

    private Declaration declaration() {
        Token kw = tokens.next();
        long size = 1;
        if (tokens.peek().is("[")) {
            tokens.next();
            Token n = tokens.next();
            size = Tokens.whole(n, "register size");
            tokens.expect("]");
            if (size < 1) {
                throw Tokens.error(n, "a register needs at least 1 " + kw.text + " but the size"
                        + " was " + size);
            }
        }
        Token name = tokens.ident("a register name");
        if (tokens.peek().is("=")) {
            throw Tokens.error(tokens.peek(), "initialised declarations are outside the"
                    + " supported subset");
        }
        tokens.expect(";");
        return new Declaration(Position.of(kw), kw.is("qubit"), size, name.text,
                Position.of(name));
    }

    private Barrier barrier() {
        Token kw = tokens.next();
        List<Operand> operands = new ArrayList<>();
        if (!tokens.peek().is(";")) {
            operands.add(barrierOperand());
            while (tokens.peek().is(",")) {
                tokens.next();
                operands.add(barrierOperand());
            }
        }
        tokens.expect(";");
        return new Barrier(Position.of(kw), operands);
    }

    private Operand barrierOperand() {
        Operand a = calls.operand();
        scope.resolve(a, true);
        return a;
    }

    private If conditional(int depth) {
        Token t = tokens.next();
        tokens.expect("(");
        Operand bit = calls.operand();
        int[] c = scope.resolve(bit, false);
        if (c.length != 1) {
            throw bit.at().error("a condition must test one bit, but '" + bit.name() + "' has "
                    + c.length);
        }
        int value;
        if (tokens.peek().is(")")) {
            // A bit alone is a condition: true when it is 1 (OpenQASM 3, a bit converts to
            // bool as bit != 0).
            value = 1;
        } else {
            tokens.expect("==");
            Token v = tokens.next();
            if (v.is("true") || (v.type == Type.NUMBER && v.text.equals("1"))) {
                value = 1;
            } else if (v.is("false") || (v.type == Type.NUMBER && v.text.equals("0"))) {
                value = 0;
            } else {
                throw Tokens.error(v, "a bit can be compared only with 0, 1, true or false, not "
                        + v.show());
            }
        }
        tokens.expect(")");
        List<Statement> body = new ArrayList<>();
        if (tokens.peek().is("{")) {
            tokens.next();
            while (!tokens.peek().is("}")) {
                if (tokens.peek().type == Type.END) {
                    throw Tokens.error(tokens.peek(), "expected '}' to close the block of 'if'"
                            + " on line " + t.line);
                }
                body.add(statement(false, depth + 1));
            }
            tokens.next();
        } else {
            body.add(statement(false, depth + 1));
        }
        if (tokens.peek().is("else")) {
            throw Tokens.error(tokens.peek(), "'else' is outside the supported subset of"
                    + " OpenQASM 3");
        }
        return new If(Position.of(t), bit, value, body);
    }
}
