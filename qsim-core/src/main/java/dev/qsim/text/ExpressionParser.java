package dev.qsim.text;

import java.util.List;

import dev.qsim.text.Lexer.Token;
import dev.qsim.text.Lexer.Type;
import dev.qsim.text.Syntax.Binary;
import dev.qsim.text.Syntax.BinaryOperator;
import dev.qsim.text.Syntax.Constant;
import dev.qsim.text.Syntax.Expression;
import dev.qsim.text.Syntax.FunctionCall;
import dev.qsim.text.Syntax.MathFunction;
import dev.qsim.text.Syntax.Negation;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.Variable;

/**
 * Parses parameter expressions by recursive descent, with the OpenQASM 3 precedence (the power
 * binds tighter than unary minus, which binds tighter than {@code *} and {@code /}):
 * <pre>
 * sum     := product (('+' | '-') product)*
 * product := unary (('*' | '/') unary)*
 * unary   := ('-' | '+') unary | power
 * power   := primary (('^' | '**') unary)?
 * primary := number | constant | function '(' sum ')' | parameter | '(' sum ')'
 * </pre>
 * Parentheses, unary operators and powers count as nesting, up to
 * {@link QasmReader#MAX_NESTING} levels.
 */
final class ExpressionParser {
    private final Tokens tokens;

    ExpressionParser(Tokens tokens) {
        this.tokens = tokens;
    }

    /**
     * Parses one expression.
     *
     * @param parameters the names of the enclosing gate definition's parameters, or null
     *     outside a definition
     * @return the expression
     */
    Expression parse(List<String> parameters) {
        return sum(parameters, 0);
    }

    private Expression sum(List<String> params, int depth) {
        nest(depth);
        Expression left = product(params, depth);
        while (tokens.peek().is("+") || tokens.peek().is("-")) {
            Token op = tokens.next();
            Expression right = product(params, depth);
            left = new Binary(Position.of(op), op.is("+") ? BinaryOperator.ADD
                    : BinaryOperator.SUBTRACT, left, right);
        }
        return left;
    }

    private void nest(int depth) {
        if (depth > QasmReader.MAX_NESTING) {
            throw Tokens.error(tokens.peek(), "expression nested deeper than "
                    + QasmReader.MAX_NESTING + " levels");
        }
    }

    private Expression product(List<String> params, int depth) {
        Expression left = unary(params, depth);
        while (tokens.peek().is("*") || tokens.peek().is("/")) {
            Token op = tokens.next();
            Expression right = unary(params, depth);
            left = new Binary(Position.of(op), op.is("*") ? BinaryOperator.MULTIPLY
                    : BinaryOperator.DIVIDE, left, right);
        }
        return left;
    }

    private Expression unary(List<String> params, int depth) {
        nest(depth);
        if (tokens.peek().is("-")) {
            Token minus = tokens.next();
            return new Negation(Position.of(minus), unary(params, depth + 1));
        }
        if (tokens.peek().is("+")) {
            tokens.next();
            return unary(params, depth + 1);
        }
        Expression base = primary(params, depth);
        if (tokens.peek().is("^") || tokens.peek().is("**")) {
            Token op = tokens.next();
            Expression exponent = unary(params, depth + 1);
            return new Binary(Position.of(op), BinaryOperator.POWER, base, exponent);
        }
        return base;
    }

    private Expression primary(List<String> params, int depth) {
        Token t = tokens.next();
        Position at = Position.of(t);
        if (t.type == Type.NUMBER) {
            return new Constant(at, t.text, Double.parseDouble(t.text));
        }
        if (t.is("(")) {
            Expression e = sum(params, depth + 1);
            tokens.expect(")");
            return e;
        }
        if (t.type == Type.IDENT) {
            switch (t.text) {
                case "pi":
                case "π":
                    return new Constant(at, t.text, Math.PI);
                case "tau":
                case "τ":
                    return new Constant(at, t.text, 2 * Math.PI);
                case "euler":
                case "ℇ":
                    return new Constant(at, t.text, Math.E);
                default:
                    break;
            }
            MathFunction f = MathFunction.named(t.text);
            if (f != null) {
                tokens.expect("(");
                Expression argument = sum(params, depth + 1);
                tokens.expect(")");
                return new FunctionCall(at, f, argument);
            }
            if (params != null && params.contains(t.text)) {
                return new Variable(at, t.text);
            }
            throw Tokens.error(t, "unknown name '" + Lexer.clip(t.text) + "' in an expression;"
                    + " allowed: numbers, pi, tau, euler, sin, cos, tan, arcsin, arccos,"
                    + " arctan, exp, ln, sqrt" + (params == null || params.isEmpty() ? ""
                    : ", and the parameters " + params));
        }
        throw Tokens.error(t, "expected a number or an expression but found " + t.show());
    }
}
