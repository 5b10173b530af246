package dev.qsim.text;

import java.util.ArrayList;
import java.util.List;

import dev.qsim.Expression;
import dev.qsim.Expression.Op;
import dev.qsim.text.Lexer.Token;
import dev.qsim.text.Lexer.Type;
import dev.qsim.text.Syntax.Binary;
import dev.qsim.text.Syntax.Call;
import dev.qsim.text.Syntax.Cast;
import dev.qsim.text.Syntax.Duration;
import dev.qsim.text.Syntax.Expr;
import dev.qsim.text.Syntax.IndexItem;
import dev.qsim.text.Syntax.IndexSet;
import dev.qsim.text.Syntax.Indexed;
import dev.qsim.text.Syntax.Kind;
import dev.qsim.text.Syntax.Literal;
import dev.qsim.text.Syntax.Measure;
import dev.qsim.text.Syntax.Name;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.Range;
import dev.qsim.text.Syntax.Single;
import dev.qsim.text.Syntax.Unary;

/**
 * Parses expressions with the OpenQASM 3 operators and their precedence (Cross et al. 2022,
 * the specification's table of operator precedence, from memory), highest first:
 * <pre>
 * ()  []  calls  casts
 * **                 (right to left)
 * !  -  ~            (prefix)
 * *  /  %
 * +  -
 * &lt;&lt;  &gt;&gt;
 * &lt;  &lt;=  &gt;  &gt;=
 * ==  !=
 * &amp;
 * ^                  (bitwise exclusive or, not a power)
 * |
 * &amp;&amp;
 * ||
 * </pre>
 * Chains of operators are read with an explicit stack of operators and operands (precedence
 * climbing without recursion), and an operator whose operands are constants is folded at once
 * ({@link Value}), so a flat expression of any length, such as {@code 1+1+...+1}, costs constant
 * stack and ends as one literal. Only brackets recurse: parentheses, indices and the arguments
 * of calls nest at most {@link #MAX_NESTING} levels, and an expression that cannot be folded is
 * refused when it would be deeper than {@link Expression#MAX_DEPTH} operations, the bound the
 * circuit's expressions have anyway. Every refusal is a {@link CircuitFormatException}.
 */
final class ExpressionParser {
    /** The deepest nesting of parentheses, brackets and calls. */
    static final int MAX_NESTING = 64;

    private static final int UNARY = 12;

    private final Tokens tokens;
    /** Whether the last expression parsed was one parenthesised group. */
    private boolean grouped;
    /** Whether the last primary that started with '(' was a group without index brackets. */
    private boolean bareGroup;

    ExpressionParser(Tokens tokens) {
        this.tokens = tokens;
    }

    /** Whether the expression just parsed was written as one group in parentheses. */
    boolean lastWasGrouped() {
        return grouped;
    }

    /** Parses one expression at the outermost level. */
    Expr parse() {
        return parse(0);
    }

    /** A pending operator on the stack: binary, or unary (prefix). */
    private record Pending(Op op, boolean unary, int precedence, Position at) {
    }

    private static int precedence(Op op) {
        switch (op) {
            case POW:
                return 13;
            case MUL:
            case DIV:
            case MOD:
                return 11;
            case ADD:
            case SUB:
                return 10;
            case SHIFT_LEFT:
            case SHIFT_RIGHT:
                return 9;
            case LT:
            case LE:
            case GT:
            case GE:
                return 8;
            case EQ:
            case NE:
                return 7;
            case BIT_AND:
                return 6;
            case BIT_XOR:
                return 5;
            case BIT_OR:
                return 4;
            case AND:
                return 3;
            default:
                return 2;
        }
    }

    /** The binary operator of a token, or null. */
    private static Op binary(Token t) {
        if (t.type != Type.SYMBOL) {
            return null;
        }
        switch (t.text) {
            case "**":
                return Op.POW;
            case "*":
                return Op.MUL;
            case "/":
                return Op.DIV;
            case "%":
                return Op.MOD;
            case "+":
                return Op.ADD;
            case "-":
                return Op.SUB;
            case "<<":
                return Op.SHIFT_LEFT;
            case ">>":
                return Op.SHIFT_RIGHT;
            case "<":
                return Op.LT;
            case "<=":
                return Op.LE;
            case ">":
                return Op.GT;
            case ">=":
                return Op.GE;
            case "==":
                return Op.EQ;
            case "!=":
                return Op.NE;
            case "&":
                return Op.BIT_AND;
            case "^":
                return Op.BIT_XOR;
            case "|":
                return Op.BIT_OR;
            case "&&":
                return Op.AND;
            case "||":
                return Op.OR;
            default:
                return null;
        }
    }

    private void requireNesting(int nesting, Token t) {
        if (nesting > MAX_NESTING) {
            throw Tokens.error(t, "expression nested deeper than " + MAX_NESTING + " levels of"
                    + " parentheses, brackets and calls");
        }
    }

    static int checkDepth(int depth, Position at) {
        if (depth > Expression.MAX_DEPTH) {
            throw at.error("the expression nests more than " + Expression.MAX_DEPTH
                    + " operations deep (the bound of expressions evaluated during a shot);"
                    + " split it, or declare parts of it as const");
        }
        return depth;
    }

    private Expr parse(int nesting) {
        requireNesting(nesting, tokens.peek());
        List<Expr> operands = new ArrayList<>();
        List<Pending> operators = new ArrayList<>();
        boolean single = true;
        boolean firstGrouped = false;
        while (true) {
            // Prefix operators, then one operand.
            while (true) {
                Token t = tokens.peek();
                if (t.is("-") || t.is("!") || t.is("~")) {
                    tokens.next();
                    Op op = t.is("-") ? Op.NEG : t.is("!") ? Op.NOT : Op.COMPLEMENT;
                    operators.add(new Pending(op, true, UNARY, Position.of(t)));
                    single = false;
                } else if (t.is("+")) {
                    tokens.next();
                    single = false;
                } else {
                    break;
                }
            }
            boolean paren = tokens.at("(");
            operands.add(primary(nesting));
            if (operands.size() == 1) {
                firstGrouped = paren && bareGroup;
            }
            Token t = tokens.peek();
            Op op = binary(t);
            if (op == null) {
                break;
            }
            tokens.next();
            single = false;
            int p = precedence(op);
            boolean right = op == Op.POW;
            while (!operators.isEmpty()) {
                Pending top = operators.get(operators.size() - 1);
                if (top.precedence() > p || (top.precedence() == p && !right)) {
                    reduce(operands, operators);
                } else {
                    break;
                }
            }
            operators.add(new Pending(op, false, p, Position.of(t)));
        }
        while (!operators.isEmpty()) {
            reduce(operands, operators);
        }
        grouped = single && firstGrouped;
        return operands.get(0);
    }

    /** Applies the top operator to its operands, folding constants. */
    private static void reduce(List<Expr> operands, List<Pending> operators) {
        Pending p = operators.remove(operators.size() - 1);
        if (p.unary()) {
            Expr a = operands.remove(operands.size() - 1);
            operands.add(unary(p.at(), p.op(), a));
            return;
        }
        Expr b = operands.remove(operands.size() - 1);
        Expr a = operands.remove(operands.size() - 1);
        operands.add(binary(p.at(), p.op(), a, b));
    }

    static Expr unary(Position at, Op op, Expr a) {
        if (a instanceof Literal l) {
            try {
                return Value.apply(op, Value.of(l)).literal(l.at());
            } catch (IllegalArgumentException e) {
                // Left for the expander, which reports it at the statement.
            }
        }
        return new Unary(at, op, a, checkDepth(a.depth() + 1, at));
    }

    static Expr binary(Position at, Op op, Expr a, Expr b) {
        if (a instanceof Literal x && b instanceof Literal y) {
            try {
                return Value.apply(op, Value.of(x), Value.of(y)).literal(x.at());
            } catch (IllegalArgumentException e) {
                // Left for the expander, which reports it at the statement.
            }
        }
        return new Binary(at, op, a, b, checkDepth(Math.max(a.depth(), b.depth()) + 1, at));
    }

    /** A type keyword of a cast, or null. */
    static Kind castKind(String word) {
        switch (word) {
            case "int":
                return Kind.INT;
            case "uint":
                return Kind.UINT;
            case "float":
                return Kind.FLOAT;
            case "angle":
                return Kind.ANGLE;
            case "bool":
                return Kind.BOOL;
            case "bit":
                return Kind.BIT;
            default:
                return null;
        }
    }

    private Expr primary(int nesting) {
        Token t = tokens.next();
        Position at = Position.of(t);
        switch (t.type) {
            case INT:
                return new Literal(at, Expression.Type.INT, t.integer, 0);
            case FLOAT:
                return new Literal(at, Expression.Type.FLOAT, 0, t.real);
            case DURATION:
                return new Duration(at, t.real, t.unit);
            case STRING:
                return bitString(t);
            case SYMBOL:
                if (t.is("(")) {
                    Expr e = parse(nesting + 1);
                    tokens.expect(")");
                    if (tokens.at("[")) {
                        Expr indexed = postfix(e, nesting);
                        bareGroup = false;
                        return indexed;
                    }
                    bareGroup = true;
                    return e;
                }
                throw Tokens.error(t, "expected a value but found " + t.show());
            case END:
                throw Tokens.error(t, "expected a value but found " + t.show());
            default:
                break;
        }
        switch (t.text) {
            case "true":
            case "false":
                return new Literal(at, Expression.Type.BOOL, t.is("true") ? 1 : 0, 0);
            case "pi":
            case "π":
                return new Literal(at, Expression.Type.FLOAT, 0, Math.PI);
            case "tau":
            case "τ":
                return new Literal(at, Expression.Type.FLOAT, 0, 2 * Math.PI);
            case "euler":
            case "ℇ":
                return new Literal(at, Expression.Type.FLOAT, 0, Math.E);
            case "measure": {
                Expr operand = operand(nesting + 1);
                return new Measure(at, operand, checkDepth(operand.depth() + 1, at));
            }
            default:
                break;
        }
        String reason = Syntax.UNSUPPORTED.get(t.text);
        if (reason != null) {
            throw Tokens.error(t, "'" + t.text + "' is unsupported: " + reason);
        }
        Kind cast = castKind(t.text);
        if (cast != null && (tokens.at("(") || tokens.at("["))) {
            Expr width = null;
            if (tokens.accept("[")) {
                width = parse(nesting + 1);
                tokens.expect("]");
            }
            tokens.expect("(");
            Expr operand = parse(nesting + 1);
            tokens.expect(")");
            return new Cast(at, new Syntax.Type(at, cast, width), operand,
                    checkDepth(operand.depth() + 1, at));
        }
        if (Syntax.reserved(t.text) && !tokens.at("(")) {
            throw Tokens.error(t, "expected a value but found the keyword '" + t.text + "'");
        }
        if (tokens.at("(")) {
            tokens.next();
            List<Expr> args = new ArrayList<>();
            int depth = 0;
            if (!tokens.at(")")) {
                do {
                    Expr a = parse(nesting + 1);
                    depth = Math.max(depth, a.depth());
                    args.add(a);
                } while (tokens.accept(","));
            }
            tokens.expect(")");
            return postfix(new Call(at, t.text, args, checkDepth(depth + 1, at)), nesting);
        }
        return postfix(new Name(at, t.text), nesting);
    }

    /** A bit string such as "0101": an integer whose leftmost character is its highest bit. */
    private static Expr bitString(Token t) {
        long v = 0;
        int bits = 0;
        for (int i = 0; i < t.text.length(); i++) {
            char c = t.text.charAt(i);
            if (c == '_' && bits > 0) {
                continue;
            }
            if (c != '0' && c != '1') {
                throw Tokens.error(t, "a string in an expression must be a bit string of 0 and"
                        + " 1, such as \"0101\", but was " + t.show());
            }
            if (++bits > 63) {
                throw Tokens.error(t, "the bit string " + t.show() + " has more than 63 bits");
            }
            v = v << 1 | (c - '0');
        }
        if (bits == 0) {
            throw Tokens.error(t, "an empty string is not a value");
        }
        return new Literal(Position.of(t), Expression.Type.INT, v, 0);
    }

    /** Index brackets after a name or group: {@code base[index][index]...}. */
    private Expr postfix(Expr base, int nesting) {
        Expr e = base;
        while (tokens.at("[")) {
            Token open = tokens.next();
            requireNesting(nesting + 1, open);
            IndexItem item = index(nesting + 1);
            if (tokens.at(",")) {
                throw Tokens.error(tokens.peek(), "indices separated by ',' address arrays,"
                        + " which are unsupported; use a set such as {0, 3}");
            }
            tokens.expect("]");
            e = new Indexed(Position.of(open), e, item, checkDepth(Math.max(e.depth(),
                    itemDepth(item)) + 1, Position.of(open)));
        }
        return e;
    }

    private static int itemDepth(IndexItem item) {
        if (item instanceof Single s) {
            return s.value().depth();
        }
        if (item instanceof Range r) {
            int d = 0;
            for (Expr x : new Expr[] {r.start(), r.step(), r.end()}) {
                d = x == null ? d : Math.max(d, x.depth());
            }
            return d;
        }
        int d = 0;
        for (Expr x : ((IndexSet) item).values()) {
            d = Math.max(d, x.depth());
        }
        return d;
    }

    /** The contents of one pair of index brackets. */
    private IndexItem index(int nesting) {
        Token first = tokens.peek();
        if (tokens.accept("{")) {
            return set(first, nesting);
        }
        Expr start = tokens.at(":") ? null : parse(nesting);
        if (!tokens.at(":")) {
            return new Single(start);
        }
        return range(first, start, nesting);
    }

    /** A set {@code {a, b, ...}}, its '{' consumed. */
    IndexSet set(Token open, int nesting) {
        List<Expr> values = new ArrayList<>();
        if (!tokens.at("}")) {
            do {
                values.add(parse(nesting + 1));
            } while (tokens.accept(","));
        }
        tokens.expect("}");
        return new IndexSet(Position.of(open), values);
    }

    /** The rest of a range after its start (null if not written), at its first ':'. */
    Range range(Token first, Expr start, int nesting) {
        tokens.expect(":");
        Expr second = tokens.at(":") || tokens.at("]") ? null : parse(nesting);
        if (tokens.accept(":")) {
            Expr third = tokens.at("]") ? null : parse(nesting);
            return new Range(Position.of(first), start, second, third);
        }
        return new Range(Position.of(first), start, null, second);
    }

    /**
     * Parses a register operand: a name, then any index brackets ({@code q}, {@code q[0]},
     * {@code q[0:2]}, {@code q[{0, 3}]}).
     */
    Expr operand(int nesting) {
        Token name = tokens.next();
        if (name.type != Type.IDENT || Syntax.reserved(name.text)) {
            throw Tokens.error(name, "expected a register or qubit name but found "
                    + name.show());
        }
        return postfix(new Name(Position.of(name), name.text), nesting);
    }

    /** Parses an operand at the outermost level. */
    Expr operand() {
        return operand(0);
    }

    /** Parses a range or set of a for loop, at its '[' or '{'. */
    Syntax.Iteration iteration() {
        Token open = tokens.next();
        if (open.is("{")) {
            return new Syntax.Iteration(Position.of(open), null, set(open, 0));
        }
        if (!open.is("[")) {
            throw Tokens.error(open, "a for loop runs over a range such as [0:3] or a set such"
                    + " as {1, 4}, but found " + open.show() + "; loops over registers or"
                    + " arrays are unsupported");
        }
        Expr start = tokens.at(":") ? null : parse(1);
        if (!tokens.at(":")) {
            throw Tokens.error(tokens.peek(), "expected ':' in the range of a for loop, as in"
                    + " [0:3], but found " + tokens.peek().show());
        }
        Range r = range(open, start, 1);
        tokens.expect("]");
        return new Syntax.Iteration(Position.of(open), r, null);
    }
}
