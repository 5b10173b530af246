package dev.qsim.text;

import dev.qsim.Circuit;
import dev.qsim.Expression;
import dev.qsim.Expression.Op;
import dev.qsim.internal.Checks;

/**
 * A classical value as the reader computes it: a constant known when the file is read (a
 * bool, a 64-bit integer or a double; folded as it is computed) or an {@link Expression}
 * evaluated during the shot. Constant arithmetic follows {@link Expression}'s rules exactly
 * (the types of results, wrapping integers, IEEE 754 floats, shifts, comparisons), so that a
 * value folded when the file is read equals the value the shot would compute, with one
 * exception: an integer division or remainder by zero, which a shot evaluates to 0, is refused
 * when it is known at reading time. Immutable.
 */
final class Value {
    private final Expression.Type type;
    private final long integer;
    private final double real;
    private final Expression dynamic;

    private Value(Expression.Type type, long integer, double real, Expression dynamic) {
        this.type = type;
        this.integer = integer;
        this.real = real;
        this.dynamic = dynamic;
    }

    static Value ofInt(long v) {
        return new Value(Expression.Type.INT, v, 0, null);
    }

    static Value ofReal(double v) {
        return new Value(Expression.Type.FLOAT, 0, v, null);
    }

    static Value ofBool(boolean v) {
        return new Value(Expression.Type.BOOL, v ? 1 : 0, 0, null);
    }

    /** A value known only during the shot. */
    static Value of(Expression e) {
        return new Value(e.type(), 0, 0, e);
    }

    /** The constant of a literal node. */
    static Value of(Syntax.Literal l) {
        return new Value(l.type(), l.integer(), l.real(), null);
    }

    Expression.Type type() {
        return type;
    }

    boolean isConstant() {
        return dynamic == null;
    }

    boolean isFloat() {
        return type == Expression.Type.FLOAT;
    }

    /** A constant as an integer (a float truncated toward zero, as {@link Expression} does). */
    long asLong() {
        return type == Expression.Type.FLOAT ? (long) real : integer;
    }

    /** A constant as a double. */
    double asDouble() {
        return type == Expression.Type.FLOAT ? real : (double) integer;
    }

    /** A constant as a condition: true when non-zero. */
    boolean truth() {
        return type == Expression.Type.FLOAT ? real != 0 : integer != 0;
    }

    /** Whether a constant is an integer value (of any type) that fits a long exactly. */
    boolean isWhole() {
        return type != Expression.Type.FLOAT || (real == Math.rint(real)
                && Math.abs(real) < 0x1p62);
    }

    /** A literal node holding this constant. */
    Syntax.Literal literal(Syntax.Position at) {
        return new Syntax.Literal(at, type, integer, real);
    }

    /**
     * Returns the value as an expression for the shot.
     *
     * @throws IllegalArgumentException if it is a float constant that is not finite
     */
    Expression toExpression() {
        if (dynamic != null) {
            return dynamic;
        }
        switch (type) {
            case BOOL:
                return Expression.bool(integer != 0);
            case INT:
                return Expression.constant(integer);
            default:
                if (!Double.isFinite(real)) {
                    throw new IllegalArgumentException("the value " + real + " is not finite, so"
                            + " it cannot take part in an expression evaluated during the shot");
                }
                return Expression.constant(real);
        }
    }

    /** A short description for messages. */
    String show() {
        if (dynamic != null) {
            return Checks.excerpt(dynamic.toString());
        }
        switch (type) {
            case BOOL:
                return integer != 0 ? "true" : "false";
            case INT:
                return Long.toString(integer);
            default:
                return Double.toString(real);
        }
    }

    // ------------------------------------------------------------------ operations

    /**
     * Applies a unary operator or function: folded when the operand is constant.
     *
     * @throws IllegalArgumentException if the operand's type is not allowed
     */
    static Value apply(Op op, Value a) {
        if (a.dynamic != null) {
            return of(Expression.of(op, a.dynamic));
        }
        if (op.ordinal() >= Op.SIN.ordinal()) {
            return ofReal(function(op, a.asDouble()));
        }
        switch (op) {
            case NOT:
                requireNotFloat(a, op);
                return ofBool(a.integer == 0);
            case COMPLEMENT:
                requireNotFloat(a, op);
                return ofInt(~a.integer);
            case NEG:
                return a.isFloat() ? ofReal(-a.real) : ofInt(-a.integer);
            default:
                throw new IllegalArgumentException("operator " + op.symbol() + " takes two"
                        + " operands");
        }
    }

    private static double function(Op op, double x) {
        switch (op) {
            case SIN:
                return Math.sin(x);
            case COS:
                return Math.cos(x);
            case TAN:
                return Math.tan(x);
            case ARCSIN:
                return Math.asin(x);
            case ARCCOS:
                return Math.acos(x);
            case ARCTAN:
                return Math.atan(x);
            case EXP:
                return Math.exp(x);
            case LN:
                return Math.log(x);
            default:
                return Math.sqrt(x);
        }
    }

    private static void requireNotFloat(Value a, Op op) {
        if (a.isFloat()) {
            throw new IllegalArgumentException("operator " + op.symbol() + " needs integer or"
                    + " bool operands but " + a.show() + " is a float");
        }
    }

    /**
     * Applies a binary operator: folded when both operands are constant.
     *
     * @throws IllegalArgumentException if an operand's type is not allowed, or for an integer
     *     division or remainder by a constant zero
     */
    static Value apply(Op op, Value a, Value b) {
        if (a.dynamic != null || b.dynamic != null) {
            if (b.isConstant() && !b.isFloat() && b.integer == 0
                    && (op == Op.DIV || op == Op.MOD) && !a.isFloat()) {
                throw new IllegalArgumentException("integer " + (op == Op.DIV ? "division"
                        : "remainder") + " by zero");
            }
            return of(Expression.of(op, a.toExpression(), b.toExpression()));
        }
        boolean real = a.isFloat() || b.isFloat();
        switch (op) {
            case EQ:
                return ofBool(real ? a.asDouble() == b.asDouble() : a.integer == b.integer);
            case NE:
                return ofBool(real ? a.asDouble() != b.asDouble() : a.integer != b.integer);
            case LT:
            case LE:
            case GT:
            case GE: {
                int c = real ? Double.compare(a.asDouble(), b.asDouble())
                        : Long.compare(a.integer, b.integer);
                return ofBool(op == Op.LT ? c < 0 : op == Op.LE ? c <= 0 : op == Op.GT ? c > 0
                        : c >= 0);
            }
            case AND:
            case OR:
                requireNotFloat(a, op);
                requireNotFloat(b, op);
                return ofBool(op == Op.AND ? a.integer != 0 && b.integer != 0
                        : a.integer != 0 || b.integer != 0);
            case BIT_AND:
            case BIT_OR:
            case BIT_XOR:
            case SHIFT_LEFT:
            case SHIFT_RIGHT:
                requireNotFloat(a, op);
                requireNotFloat(b, op);
                return ofInt(bitwise(op, a.integer, b.integer));
            case POW:
                return ofReal(Math.pow(a.asDouble(), b.asDouble()));
            default:
                break;
        }
        if (real) {
            double x = a.asDouble();
            double y = b.asDouble();
            switch (op) {
                case ADD:
                    return ofReal(x + y);
                case SUB:
                    return ofReal(x - y);
                case MUL:
                    return ofReal(x * y);
                case DIV:
                    return ofReal(x / y);
                default:
                    return ofReal(x % y);
            }
        }
        long x = a.integer;
        long y = b.integer;
        switch (op) {
            case ADD:
                return ofInt(x + y);
            case SUB:
                return ofInt(x - y);
            case MUL:
                return ofInt(x * y);
            case DIV:
            case MOD:
                if (y == 0) {
                    throw new IllegalArgumentException("integer " + (op == Op.DIV ? "division"
                            : "remainder") + " by zero in " + x + " " + op.symbol() + " 0");
                }
                return ofInt(op == Op.DIV ? x / y : x % y);
            default:
                throw new IllegalArgumentException("operator " + op.symbol() + " takes one"
                        + " operand");
        }
    }

    private static long bitwise(Op op, long a, long b) {
        switch (op) {
            case BIT_AND:
                return a & b;
            case BIT_OR:
                return a | b;
            case BIT_XOR:
                return a ^ b;
            case SHIFT_LEFT:
                return b < 0 || b > 63 ? 0 : a << b;
            default:
                return b < 0 ? a : a >> Math.min(b, 63);
        }
    }

    // ------------------------------------------------------------------ conversions

    /**
     * Converts to a declared classical type, as an assignment to a variable of that type does
     * ({@link Circuit.Variable#convert(long, boolean)}): a bool becomes 0 or 1, an integer wraps
     * to its width, a float is truncated toward zero, an angle is reduced to [0, 2π).
     *
     * @param kind the type (not qubit)
     * @param width the width for int, uint and bit (1 to 64)
     * @throws IllegalArgumentException if a value known only during the shot cannot be
     *     converted with the expression operators (a float to an integer or an angle)
     */
    Value convert(Syntax.Kind kind, int width) {
        if (dynamic != null) {
            return convertDynamic(kind, width);
        }
        switch (kind) {
            case BOOL:
                return ofBool(truth());
            case FLOAT:
                return ofReal(asDouble());
            case ANGLE: {
                double a = asDouble() % (2 * Math.PI);
                return ofReal(a < 0 ? a + 2 * Math.PI : a);
            }
            case INT: {
                long v = asLong();
                return ofInt(width == 64 ? v : (v << (64 - width)) >> (64 - width));
            }
            default: {
                long v = asLong();
                return ofInt(width == 64 ? v : v & ((1L << width) - 1));
            }
        }
    }

    private Value convertDynamic(Syntax.Kind kind, int width) {
        switch (kind) {
            case BOOL:
                return type == Expression.Type.BOOL ? this
                        : of(Expression.of(Op.NE, dynamic, Expression.constant(0)));
            case FLOAT:
                return isFloat() ? this
                        : of(Expression.of(Op.ADD, dynamic, Expression.constant(0.0)));
            case ANGLE:
                throw new IllegalArgumentException("the value " + show() + " is known only"
                        + " during the shot, so it cannot be reduced to an angle here; use a"
                        + " float");
            default:
                if (isFloat()) {
                    throw new IllegalArgumentException("the float " + show() + " is known only"
                            + " during the shot, so it cannot be converted to an integer here;"
                            + " assign it to an int variable instead");
                }
                if (width == 64) {
                    return this;
                }
                if (kind == Syntax.Kind.INT) {
                    Expression shift = Expression.constant(64 - width);
                    return of(Expression.of(Op.SHIFT_RIGHT,
                            Expression.of(Op.SHIFT_LEFT, dynamic, shift), shift));
                }
                return of(Expression.of(Op.BIT_AND, dynamic,
                        Expression.constant((1L << width) - 1)));
        }
    }
}
