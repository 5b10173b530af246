package dev.qsim.text;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

import dev.qsim.Circuit;
import dev.qsim.Expression.Op;
import dev.qsim.text.Lexer.Token;
import dev.qsim.text.Lexer.Type;
import dev.qsim.text.Syntax.Alias;
import dev.qsim.text.Syntax.Argument;
import dev.qsim.text.Syntax.Assignment;
import dev.qsim.text.Syntax.Barrier;
import dev.qsim.text.Syntax.BitDeclaration;
import dev.qsim.text.Syntax.Block;
import dev.qsim.text.Syntax.Declared;
import dev.qsim.text.Syntax.Delay;
import dev.qsim.text.Syntax.Expr;
import dev.qsim.text.Syntax.For;
import dev.qsim.text.Syntax.If;
import dev.qsim.text.Syntax.Include;
import dev.qsim.text.Syntax.Indexed;
import dev.qsim.text.Syntax.Jump;
import dev.qsim.text.Syntax.Kind;
import dev.qsim.text.Syntax.MeasureArrow;
import dev.qsim.text.Syntax.Name;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.QubitDeclaration;
import dev.qsim.text.Syntax.Reset;
import dev.qsim.text.Syntax.Return;
import dev.qsim.text.Syntax.Statement;
import dev.qsim.text.Syntax.Storage;
import dev.qsim.text.Syntax.SubroutineDefinition;
import dev.qsim.text.Syntax.VariableDeclaration;
import dev.qsim.text.Syntax.While;

/**
 * Parses statements by recursive descent into a {@link Syntax} tree, one top-level statement
 * at a time ({@link #next()}), so that the reader can expand each before reading the next:
 * problems come in text order from one top-level statement to the next (within one, problems
 * of syntax before problems of meaning). Gate calls and definitions go to a
 * {@link CallParser}, expressions to an {@link ExpressionParser}, all on the same tokens.
 * Blocks nest at most {@link #MAX_NESTING} levels. Builds no circuit.
 */
final class Parser {
    /** The deepest nesting of blocks. */
    static final int MAX_NESTING = 64;
    /** The annotation that bounds the iterations of the while loop after it. */
    static final String LOOP_ANNOTATION = "max_iterations";

    private final Tokens tokens;
    private final ExpressionParser expressions;
    private final CallParser calls;

    Parser(Tokens tokens) {
        this.tokens = tokens;
        this.expressions = new ExpressionParser(tokens);
        this.calls = new CallParser(tokens, expressions);
    }

    /**
     * Reads {@code OPENQASM 3;} (or {@code 3.0}, {@code 3.1} ...) if the text starts with it.
     *
     * @return the version as written, or null without one
     */
    String header() {
        if (!tokens.at("OPENQASM")) {
            return null;
        }
        tokens.next();
        Token num = tokens.next();
        boolean three = (num.type == Type.INT && num.integer == 3)
                || (num.type == Type.FLOAT && num.text.startsWith("3."));
        if (!three) {
            throw Tokens.error(num, "OpenQASM version " + num.show() + " is not supported;"
                    + " only version 3 is");
        }
        tokens.expect(";");
        return num.text;
    }

    /** Whether the whole text has been read. */
    boolean atEnd() {
        return tokens.peek().type == Type.END;
    }

    /** Where the text ends. */
    Position end() {
        return Position.of(tokens.peek());
    }

    /** The next top-level statement, or null for one that records nothing (a pragma). */
    Statement next() {
        return statement(0, true);
    }

    private Statement statement(int nesting, boolean top) {
        int bound = 0;
        Token boundAt = null;
        while (tokens.at("@")) {
            Token a = tokens.next();
            String[] annotation = tokens.annotation(a);
            if (annotation[0].equals(LOOP_ANNOTATION)) {
                bound = loopBound(a, annotation[1]);
                boundAt = a;
            }
        }
        Token t = tokens.peek();
        if (nesting > MAX_NESTING) {
            throw Tokens.error(t, "blocks nested deeper than " + MAX_NESTING + " levels");
        }
        if (boundAt != null && !t.is("while")) {
            throw Tokens.error(boundAt, "@" + LOOP_ANNOTATION + " bounds the while loop that"
                    + " follows it, but " + t.show() + " follows");
        }
        Position at = Position.of(t);
        if (t.is("{")) {
            return new Block(at, block(nesting, t));
        }
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
            case "qreg":
                requireTop(top, t);
                return qubits();
            case "bit":
            case "creg":
                return bits(at);
            case "int":
            case "uint":
            case "float":
            case "angle":
            case "bool":
                return variable(at, Storage.VARIABLE);
            case "const":
                tokens.next();
                return variable(at, Storage.CONSTANT);
            case "input":
                requireTop(top, t);
                tokens.next();
                return variable(at, Storage.INPUT);
            case "output":
                requireTop(top, t);
                tokens.next();
                return tokens.at("bit") || tokens.at("creg") ? bits(at)
                        : variable(at, Storage.VARIABLE);
            case "let":
                return alias(at);
            case "gate":
                requireTop(top, t);
                return calls.gateDefinition();
            case "def":
                requireTop(top, t);
                return subroutine(at);
            case "measure": {
                tokens.next();
                Expr q = expressions.operand();
                Expr c = tokens.accept("->") ? expressions.operand() : null;
                tokens.expect(";");
                return new MeasureArrow(at, q, c);
            }
            case "reset": {
                tokens.next();
                List<Expr> operands = operands();
                if (operands.isEmpty()) {
                    throw Tokens.error(tokens.peek(), "reset needs a qubit or register");
                }
                tokens.expect(";");
                return new Reset(at, operands);
            }
            case "barrier": {
                tokens.next();
                List<Expr> operands = operands();
                tokens.expect(";");
                return new Barrier(at, operands);
            }
            case "delay":
                return delay(at);
            case "if":
                return conditional(at, nesting);
            case "for":
                return loop(at, nesting);
            case "while": {
                tokens.next();
                tokens.expect("(");
                Expr condition = expressions.parse();
                tokens.expect(")");
                return new While(at, condition, body(nesting, t), bound);
            }
            case "break":
            case "continue":
                tokens.next();
                tokens.expect(";");
                return new Jump(at, t.is("break"));
            case "return": {
                tokens.next();
                Expr value = tokens.at(";") ? null : expressions.parse();
                tokens.expect(";");
                return new Return(at, value);
            }
            case "pragma":
                tokens.next();
                tokens.restOfLine(t);
                return null;
            case "else":
                throw Tokens.error(t, "'else' without an 'if' before it");
            default:
                break;
        }
        String reason = Syntax.UNSUPPORTED.get(t.text);
        if (reason != null) {
            throw Tokens.error(t, "'" + t.text + "' is unsupported: " + reason);
        }
        if (calls.atModifier() || t.is("gphase") || t.is("U")) {
            return calls.call();
        }
        if (Syntax.reserved(t.text)) {
            throw Tokens.error(t, "expected a statement but found the keyword '" + t.text
                    + "'");
        }
        return assignmentOrCall(at);
    }

    private int loopBound(Token at, String text) {
        long v;
        try {
            v = Long.parseLong(text.replace("_", ""));
        } catch (NumberFormatException e) {
            v = -1;
        }
        if (v < 1 || v > Circuit.Builder.MAX_ITERATIONS) {
            throw Tokens.error(at, "@" + LOOP_ANNOTATION + " takes a whole number of"
                    + " iterations from 1 to " + Circuit.Builder.MAX_ITERATIONS + ", but was '"
                    + Lexer.clip(text) + "'");
        }
        return (int) v;
    }

    private static void requireTop(boolean top, Token t) {
        if (!top) {
            throw Tokens.error(t, "'" + t.text + "' is allowed only at the top level, not"
                    + " inside a block");
        }
    }

    private List<Expr> operands() {
        List<Expr> out = new ArrayList<>();
        if (!tokens.at(";")) {
            do {
                out.add(expressions.operand());
            } while (tokens.accept(","));
        }
        return out;
    }

    private Token newName(String what) {
        Token t = tokens.ident(what);
        CallParser.requireNewName(t);
        return t;
    }

    private QubitDeclaration qubits() {
        Token kw = tokens.next();
        Expr size = null;
        if (kw.is("qubit") && tokens.accept("[")) {
            size = expressions.parse();
            tokens.expect("]");
        }
        Token name = newName("a register name");
        if (kw.is("qreg") && tokens.accept("[")) {
            size = expressions.parse();
            tokens.expect("]");
        }
        if (tokens.at("=")) {
            throw Tokens.error(tokens.peek(), "qubits cannot be given a value; they start in"
                    + " |0>");
        }
        tokens.expect(";");
        return new QubitDeclaration(Position.of(kw), name.text, Position.of(name), size);
    }

    private BitDeclaration bits(Position at) {
        Token kw = tokens.next();
        Expr size = null;
        if (kw.is("bit") && tokens.accept("[")) {
            size = expressions.parse();
            tokens.expect("]");
        }
        Token name = newName("a register name");
        if (kw.is("creg") && tokens.accept("[")) {
            size = expressions.parse();
            tokens.expect("]");
        }
        Expr value = tokens.accept("=") ? expressions.parse() : null;
        tokens.expect(";");
        return new BitDeclaration(at, name.text, Position.of(name), size, value);
    }

    private Syntax.Type type() {
        Token kw = tokens.next();
        Kind kind = ExpressionParser.castKind(kw.text);
        if (kind == null || kind == Kind.BIT) {
            String reason = Syntax.UNSUPPORTED.get(kw.text);
            throw Tokens.error(kw, reason != null ? "'" + kw.text + "' is unsupported: " + reason
                    : "expected a classical type (int, uint, float, angle or bool) but found "
                    + kw.show());
        }
        Expr width = null;
        if (tokens.accept("[")) {
            width = expressions.parse();
            tokens.expect("]");
        }
        return new Syntax.Type(Position.of(kw), kind, width);
    }

    private VariableDeclaration variable(Position at, Storage storage) {
        Syntax.Type type = type();
        Token name = newName("a variable name");
        Expr value = null;
        if (tokens.accept("=")) {
            if (storage == Storage.INPUT) {
                throw Tokens.error(name, "an input takes its value from the reader's settings,"
                        + " not from the file");
            }
            value = expressions.parse();
        } else if (storage == Storage.CONSTANT) {
            throw Tokens.error(tokens.peek(), "a const declaration needs a value, as in"
                    + " const int n = 4;");
        }
        tokens.expect(";");
        return new VariableDeclaration(at, storage, type, name.text, Position.of(name), value);
    }

    private Alias alias(Position at) {
        tokens.next();
        Token name = newName("an alias name");
        tokens.expect("=");
        List<Expr> parts = new ArrayList<>();
        do {
            parts.add(expressions.operand());
        } while (tokens.accept("++"));
        tokens.expect(";");
        return new Alias(at, name.text, Position.of(name), parts);
    }

    private Delay delay(Position at) {
        tokens.next();
        tokens.expect("[");
        Expr duration = expressions.parse();
        tokens.expect("]");
        List<Expr> operands = operands();
        tokens.expect(";");
        return new Delay(at, duration, operands);
    }

    private If conditional(Position at, int nesting) {
        Token t = tokens.next();
        tokens.expect("(");
        Expr condition = expressions.parse();
        boolean grouped = expressions.lastWasGrouped();
        tokens.expect(")");
        List<Statement> then = body(nesting, t);
        List<Statement> otherwise = null;
        if (tokens.accept("else")) {
            otherwise = body(nesting, t);
        }
        return new If(at, condition, grouped, then, otherwise);
    }

    private For loop(Position at, int nesting) {
        Token t = tokens.next();
        Syntax.Type type = null;
        if (ExpressionParser.castKind(tokens.peek().text) != null
                && tokens.peek().type == Type.IDENT) {
            type = type();
        }
        Token name = newName("a loop variable");
        tokens.expect("in");
        Syntax.Iteration over = expressions.iteration();
        return new For(at, type, name.text, Position.of(name), over, body(nesting, t));
    }

    private SubroutineDefinition subroutine(Position at) {
        tokens.next();
        Token name = newName("a subroutine name");
        tokens.expect("(");
        List<Argument> args = new ArrayList<>();
        Set<String> seen = new HashSet<>();
        if (!tokens.at(")")) {
            do {
                Token kw = tokens.peek();
                Syntax.Type type;
                if (kw.is("qubit") || kw.is("bit")) {
                    tokens.next();
                    Expr size = null;
                    if (tokens.accept("[")) {
                        size = expressions.parse();
                        tokens.expect("]");
                    }
                    type = new Syntax.Type(Position.of(kw), kw.is("qubit") ? Kind.QUBIT
                            : Kind.BIT, size);
                } else {
                    type = type();
                }
                Token arg = newName("an argument name");
                if (!seen.add(arg.text)) {
                    throw Tokens.error(arg, "the argument '" + Lexer.clip(arg.text)
                            + "' is declared twice");
                }
                args.add(new Argument(type, new Declared(Position.of(arg), arg.text)));
            } while (tokens.accept(","));
        }
        tokens.expect(")");
        Syntax.Type returns = null;
        if (tokens.accept("->")) {
            if (tokens.at("bit")) {
                Token kw = tokens.next();
                Expr size = null;
                if (tokens.accept("[")) {
                    size = expressions.parse();
                    tokens.expect("]");
                }
                returns = new Syntax.Type(Position.of(kw), Kind.BIT, size);
            } else {
                returns = type();
            }
        }
        Token open = tokens.peek();
        if (!open.is("{")) {
            throw Tokens.error(open, "expected '{' to start the body of subroutine '"
                    + Lexer.clip(name.text) + "' but found " + open.show());
        }
        return new SubroutineDefinition(at, name.text, Position.of(name), List.copyOf(args),
                returns, block(0, open));
    }

    /** A block in braces, or a single statement, as the body of if, else, for or while. */
    private List<Statement> body(int nesting, Token owner) {
        if (tokens.at("{")) {
            return block(nesting, owner);
        }
        Statement s = statement(nesting + 1, false);
        return s == null ? List.of() : List.of(s);
    }

    /** The statements of a block in braces, its '{' not yet consumed. */
    private List<Statement> block(int nesting, Token owner) {
        Token open = tokens.expect("{");
        List<Statement> out = new ArrayList<>();
        while (!tokens.at("}")) {
            if (atEnd()) {
                throw Tokens.error(tokens.peek(), "expected '}' to close the block of '"
                        + Lexer.clip(owner.text) + "' opened on line " + open.line);
            }
            Statement s = statement(nesting + 1, false);
            if (s != null) {
                out.add(s);
            }
        }
        tokens.next();
        return out;
    }

    /** A statement that starts with a name: an assignment, or a gate or subroutine call. */
    private Statement assignmentOrCall(Position at) {
        Expr target = expressions.operand();
        Token t = tokens.peek();
        Op compound = compound(t);
        if (t.is("=") || compound != null) {
            tokens.next();
            Expr value = expressions.parse();
            tokens.expect(";");
            return new Assignment(at, target, compound, value);
        }
        if (target instanceof Indexed) {
            throw Tokens.error(t, "expected '=' after an indexed name but found " + t.show());
        }
        Name name = (Name) target;
        return calls.rest(at, List.of(), name.name(), name.at(), null);
    }

    /** The operator of a compound assignment such as {@code +=}, or null. */
    private static Op compound(Token t) {
        if (t.type != Type.SYMBOL || !t.text.endsWith("=") || t.text.length() < 2) {
            return null;
        }
        switch (t.text) {
            case "+=":
                return Op.ADD;
            case "-=":
                return Op.SUB;
            case "*=":
                return Op.MUL;
            case "/=":
                return Op.DIV;
            case "%=":
                return Op.MOD;
            case "**=":
                return Op.POW;
            case "&=":
                return Op.BIT_AND;
            case "|=":
                return Op.BIT_OR;
            case "^=":
                return Op.BIT_XOR;
            case "<<=":
                return Op.SHIFT_LEFT;
            case ">>=":
                return Op.SHIFT_RIGHT;
            default:
                return null;
        }
    }
}
