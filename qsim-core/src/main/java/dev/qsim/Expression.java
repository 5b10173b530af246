package dev.qsim;

import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Objects;

import dev.qsim.internal.Checks;

/**
 * A classical expression evaluated during a shot: over constants, classical bits, bit registers
 * and the circuit's classical variables, with the arithmetic, comparison, logical and bitwise
 * operators and the mathematical functions of OpenQASM 3 (Cross et al. 2022, ACM Transactions on
 * Quantum Computing 3(3), 12, §"Classical types and computation"). Conditions
 * ({@link Circuit.Builder#ifThen}, {@link Circuit.Builder#whileLoop}), assignments and gate
 * angles known only during the shot are expressions. Immutable and thread-safe.
 *
 * <p>Every expression has a static {@linkplain #type() type}: {@link Type#BOOL},
 * {@link Type#INT} (64-bit two's complement) or {@link Type#FLOAT} (double). Arithmetic with a
 * float operand is float; comparisons and logical operators are bool; bitwise operators and
 * shifts need integers. A bool or int used as a condition is true when non-zero; a float is
 * never a condition. Integer division and remainder by zero evaluate to 0 (a shot cannot throw);
 * float arithmetic follows IEEE 754.
 *
 * <p>Variables are obtained from the builder that declares them
 * ({@link Circuit.Builder#declare(String, Circuit.VariableType, int, Expression)}), so an
 * expression always refers to a variable of its circuit.
 *
 * @since 0.1
 */
public final class Expression {
    /** The static type of an expression's value. */
    public enum Type {
        /** true or false (stored as 1 or 0). */
        BOOL,
        /** A 64-bit signed integer (bits and bit registers read as unsigned integers). */
        INT,
        /** A double-precision float. */
        FLOAT
    }

    /**
     * The values an expression reads during a shot: its classical bits and variables.
     *
     * @since 0.1
     */
    public interface Values {
        /**
         * Returns a classical bit.
         *
         * @param clbit the bit
         * @return its value
         */
        boolean bit(int clbit);

        /**
         * Returns the 64 bits of a variable: an integer or bool as itself, a float as its IEEE
         * 754 bits ({@link Double#doubleToRawLongBits(double)}).
         *
         * @param slot the variable's slot ({@link Circuit#variables()} index)
         * @return its bits
         */
        long variable(int slot);
    }

    /** An operator or function of an expression, with its OpenQASM 3 spelling. */
    public enum Op {
        /** Unary minus. */
        NEG("-", 1),
        /** Logical not. */
        NOT("!", 1),
        /** Bitwise complement. */
        COMPLEMENT("~", 1),
        /** Addition. */
        ADD("+", 2),
        /** Subtraction. */
        SUB("-", 2),
        /** Multiplication. */
        MUL("*", 2),
        /** Division (integer division truncates toward zero). */
        DIV("/", 2),
        /** Remainder. */
        MOD("%", 2),
        /** Power ({@code **} in OpenQASM 3). */
        POW("**", 2),
        /** Bitwise and. */
        BIT_AND("&", 2),
        /** Bitwise or. */
        BIT_OR("|", 2),
        /** Bitwise exclusive or ({@code ^} in OpenQASM 3). */
        BIT_XOR("^", 2),
        /** Left shift. */
        SHIFT_LEFT("<<", 2),
        /** Arithmetic right shift. */
        SHIFT_RIGHT(">>", 2),
        /** Equality. */
        EQ("==", 2),
        /** Inequality. */
        NE("!=", 2),
        /** Less than. */
        LT("<", 2),
        /** Less than or equal. */
        LE("<=", 2),
        /** Greater than. */
        GT(">", 2),
        /** Greater than or equal. */
        GE(">=", 2),
        /** Logical and (both operands are evaluated). */
        AND("&&", 2),
        /** Logical or (both operands are evaluated). */
        OR("||", 2),
        /** Sine. */
        SIN("sin", 1),
        /** Cosine. */
        COS("cos", 1),
        /** Tangent. */
        TAN("tan", 1),
        /** Arc sine. */
        ARCSIN("arcsin", 1),
        /** Arc cosine. */
        ARCCOS("arccos", 1),
        /** Arc tangent. */
        ARCTAN("arctan", 1),
        /** Exponential. */
        EXP("exp", 1),
        /** Natural logarithm. */
        LN("ln", 1),
        /** Square root. */
        SQRT("sqrt", 1);

        private final String symbol;
        private final int arity;

        Op(String symbol, int arity) {
            this.symbol = symbol;
            this.arity = arity;
        }

        /**
         * Returns the OpenQASM 3 spelling.
         *
         * @return the symbol or function name
         */
        public String symbol() {
            return symbol;
        }

        /**
         * Returns the number of operands.
         *
         * @return 1 or 2
         */
        public int arity() {
            return arity;
        }

        boolean isFunction() {
            return ordinal() >= SIN.ordinal();
        }
    }

    /** The deepest nesting an expression may have (so evaluation cannot exhaust the stack). */
    public static final int MAX_DEPTH = 256;

    /**
     * The most operations and operands an expression may hold, shared operands counted each
     * time they are used (so one evaluation has a bounded cost).
     */
    public static final int MAX_SIZE = 1 << 16;

    private static final int CONSTANT = 0;
    private static final int BITS = 1;
    private static final int VARIABLE = 2;
    private static final int UNARY = 3;
    private static final int BINARY = 4;

    private final int node;
    private final Type type;
    private final long integer;
    private final double real;
    private final int[] bits;
    private final int slot;
    private final String name;
    private final Op op;
    private final Expression left;
    private final Expression right;
    /** The longest path to a leaf, counting this node. */
    private final int depth;
    /** The nodes of the tree, a shared operand counted each time it is used. */
    private final int size;

    private Expression(int node, Type type, long integer, double real, int[] bits, int slot,
            String name, Op op, Expression left, Expression right) {
        this.node = node;
        this.type = type;
        this.integer = integer;
        this.real = real;
        this.bits = bits;
        this.slot = slot;
        this.name = name;
        this.op = op;
        this.left = left;
        this.right = right;
        this.depth = 1 + Math.max(left == null ? 0 : left.depth, right == null ? 0 : right.depth);
        this.size = 1 + (left == null ? 0 : left.size) + (right == null ? 0 : right.size);
    }

    /**
     * Refuses an expression that would be deeper than {@link #MAX_DEPTH} or larger than
     * {@link #MAX_SIZE}, before it is built.
     */
    private static void requireBounds(Op op, Expression a, Expression b) {
        int d = 1 + Math.max(a.depth, b == null ? 0 : b.depth);
        long n = 1L + a.size + (b == null ? 0 : b.size);
        if (d > MAX_DEPTH) {
            throw new IllegalArgumentException("applying " + op.symbol + " would nest the"
                    + " expression " + d + " levels deep; at most " + MAX_DEPTH + " are allowed");
        }
        if (n > MAX_SIZE) {
            throw new IllegalArgumentException("applying " + op.symbol + " would make an"
                    + " expression of " + n + " operations and operands (shared parts counted each"
                    + " time they are used); at most " + MAX_SIZE + " are allowed");
        }
    }

    /**
     * Returns an integer constant.
     *
     * @param value the value
     * @return the expression
     */
    public static Expression constant(long value) {
        return new Expression(CONSTANT, Type.INT, value, value, null, -1, null, null, null, null);
    }

    /**
     * Returns a float constant.
     *
     * @param value the value, finite
     * @return the expression
     * @throws IllegalArgumentException if the value is not finite
     */
    public static Expression constant(double value) {
        Checks.requireFinite(value, "a float constant");
        return new Expression(CONSTANT, Type.FLOAT, 0, value, null, -1, null, null, null, null);
    }

    /**
     * Returns a bool constant.
     *
     * @param value the value
     * @return the expression
     */
    public static Expression bool(boolean value) {
        return new Expression(CONSTANT, Type.BOOL, value ? 1 : 0, value ? 1 : 0, null, -1, null,
                null, null, null);
    }

    /**
     * Returns the value of one classical bit, 0 or 1 (an {@link Type#INT}; as a condition,
     * true when the bit is 1).
     *
     * @param clbit the classical bit, at least 0 (checked against the circuit when recorded)
     * @return the expression
     * @throws IllegalArgumentException if {@code clbit} is negative
     */
    public static Expression clbit(int clbit) {
        return clbits(clbit);
    }

    /**
     * Returns the unsigned integer whose bit {@code j} is classical bit {@code clbits[j]} (a bit
     * register read as a number, as OpenQASM 3 reads {@code c} in {@code c == 5}).
     *
     * @param clbits 1 to 63 distinct classical bits, each at least 0
     * @return the expression
     * @throws IllegalArgumentException if there are none or more than 63, or one is negative
     *     or repeats
     */
    public static Expression clbits(int... clbits) {
        Objects.requireNonNull(clbits, "clbits");
        if (clbits.length < 1 || clbits.length > 63) {
            throw new IllegalArgumentException("a bit register in an expression has 1 to 63 bits"
                    + " but " + clbits.length + " were given");
        }
        for (int i = 0; i < clbits.length; i++) {
            if (clbits[i] < 0) {
                throw new IllegalArgumentException("clbit " + clbits[i] + " is negative");
            }
        }
        Checks.requireDistinctQubits(clbits, Integer.MAX_VALUE, "the clbits of an expression");
        return new Expression(BITS, Type.INT, 0, 0, clbits.clone(), -1, null, null, null, null);
    }

    /** A variable of a circuit: built by the builder that declares it. */
    static Expression variable(int slot, String name, Type type) {
        return new Expression(VARIABLE, type, 0, 0, null, slot, name, null, null, null);
    }

    /**
     * Applies a unary operator or function.
     *
     * @param op an operator of arity 1
     * @param operand the operand
     * @return the expression
     * @throws IllegalArgumentException if the operator takes two operands or does not accept
     *     the operand's type ({@code ~} needs an integer or bool)
     */
    public static Expression of(Op op, Expression operand) {
        Objects.requireNonNull(op, "op");
        Objects.requireNonNull(operand, "operand");
        if (op.arity != 1) {
            throw new IllegalArgumentException("operator " + op + " takes two operands, not one");
        }
        requireBounds(op, operand, null);
        Type t;
        if (op.isFunction()) {
            t = Type.FLOAT;
        } else if (op == Op.NOT) {
            requireCondition(operand, op);
            t = Type.BOOL;
        } else if (op == Op.COMPLEMENT) {
            requireInteger(operand, op);
            t = Type.INT;
        } else {
            t = operand.type == Type.FLOAT ? Type.FLOAT : Type.INT;
        }
        return new Expression(UNARY, t, 0, 0, null, -1, null, op, operand, null);
    }

    /**
     * Applies a binary operator.
     *
     * @param op an operator of arity 2
     * @param a the left operand
     * @param b the right operand
     * @return the expression
     * @throws IllegalArgumentException if the operator takes one operand or does not accept
     *     the operands' types (bitwise operators and shifts need integers, logical operators
     *     need bools or integers)
     */
    public static Expression of(Op op, Expression a, Expression b) {
        Objects.requireNonNull(op, "op");
        Objects.requireNonNull(a, "a");
        Objects.requireNonNull(b, "b");
        if (op.arity != 2) {
            throw new IllegalArgumentException("operator " + op + " takes one operand, not two");
        }
        requireBounds(op, a, b);
        boolean real = a.type == Type.FLOAT || b.type == Type.FLOAT;
        Type t;
        switch (op) {
            case EQ:
            case NE:
            case LT:
            case LE:
            case GT:
            case GE:
                t = Type.BOOL;
                break;
            case AND:
            case OR:
                requireCondition(a, op);
                requireCondition(b, op);
                t = Type.BOOL;
                break;
            case BIT_AND:
            case BIT_OR:
            case BIT_XOR:
            case SHIFT_LEFT:
            case SHIFT_RIGHT:
                requireInteger(a, op);
                requireInteger(b, op);
                t = Type.INT;
                break;
            case POW:
                t = Type.FLOAT;
                break;
            default:
                t = real ? Type.FLOAT : Type.INT;
                break;
        }
        return new Expression(BINARY, t, 0, 0, null, -1, null, op, a, b);
    }

    private static void requireInteger(Expression e, Op op) {
        if (e.type == Type.FLOAT) {
            throw new IllegalArgumentException("operator " + op.symbol + " needs integer"
                    + " operands but " + Checks.excerpt(e.toString()) + " is a float");
        }
    }

    private static void requireCondition(Expression e, Op op) {
        if (e.type == Type.FLOAT) {
            throw new IllegalArgumentException("operator " + op.symbol + " needs bool or integer"
                    + " operands but " + Checks.excerpt(e.toString()) + " is a float");
        }
    }

    /**
     * Returns the static type of the value.
     *
     * @return the type
     */
    public Type type() {
        return type;
    }

    /**
     * Returns the operator or function at the root of this expression, or {@code null} for a
     * leaf: a constant, a register of classical bits or a variable. With {@link #operands()},
     * {@link #registerBits()} and {@link #variableSlot()} this lets a writer walk the tree (as
     * {@code dev.qsim.text.QasmWriter} does to print it in OpenQASM 3).
     *
     * @return the root operator, or null for a leaf
     */
    public Op op() {
        return node == UNARY || node == BINARY ? op : null;
    }

    /**
     * Returns the operands of the root operator: none for a leaf, one for a unary operator or
     * function, two (left, right) for a binary operator.
     *
     * @return an unmodifiable list
     */
    public List<Expression> operands() {
        switch (node) {
            case UNARY:
                return List.of(left);
            case BINARY:
                return List.of(left, right);
            default:
                return List.of();
        }
    }

    /**
     * Returns the classical bits of a register leaf ({@link #clbits(int...)}; bit {@code j} of
     * its value is classical bit {@code registerBits()[j]}), or an empty array for any other
     * expression.
     *
     * @return a copy of the bits
     */
    public int[] registerBits() {
        return node == BITS ? bits.clone() : new int[0];
    }

    /**
     * Returns the slot of a variable leaf (its index in {@link Circuit#variables()}), or -1
     * for any other expression.
     *
     * @return the slot or -1
     */
    public int variableSlot() {
        return node == VARIABLE ? slot : -1;
    }

    /**
     * Tells whether the expression reads nothing of the shot (no bits, no variables), so it
     * has one value.
     *
     * @return whether it is constant
     */
    public boolean isConstant() {
        switch (node) {
            case CONSTANT:
                return true;
            case BITS:
            case VARIABLE:
                return false;
            case UNARY:
                return left.isConstant();
            default:
                return left.isConstant() && right.isConstant();
        }
    }

    /**
     * Returns the value of a constant expression as a double.
     *
     * @return the value
     * @throws IllegalStateException if the expression is not {@linkplain #isConstant()
     *     constant}
     */
    public double constantValue() {
        if (!isConstant()) {
            throw new IllegalStateException("the expression " + Checks.excerpt(toString())
                    + " depends on the shot");
        }
        return asDouble(null);
    }

    /** The largest clbit this expression reads, or -1. */
    int maxClbit() {
        switch (node) {
            case BITS: {
                int m = -1;
                for (int b : bits) {
                    m = Math.max(m, b);
                }
                return m;
            }
            case UNARY:
                return left.maxClbit();
            case BINARY:
                return Math.max(left.maxClbit(), right.maxClbit());
            default:
                return -1;
        }
    }

    /** Adds every clbit this expression reads to {@code out}. */
    void collectClbits(java.util.BitSet out) {
        switch (node) {
            case BITS:
                for (int b : bits) {
                    out.set(b);
                }
                break;
            case UNARY:
                left.collectClbits(out);
                break;
            case BINARY:
                left.collectClbits(out);
                right.collectClbits(out);
                break;
            default:
                break;
        }
    }

    /** The largest variable slot this expression reads, or -1. */
    int maxSlot() {
        switch (node) {
            case VARIABLE:
                return slot;
            case UNARY:
                return left.maxSlot();
            case BINARY:
                return Math.max(left.maxSlot(), right.maxSlot());
            default:
                return -1;
        }
    }

    /** This expression with every variable slot moved by {@code offset}. */
    Expression withSlotOffset(int offset) {
        switch (node) {
            case VARIABLE:
                return variable(slot + offset, name, type);
            case UNARY:
                return new Expression(UNARY, type, 0, 0, null, -1, null, op,
                        left.withSlotOffset(offset), null);
            case BINARY:
                return new Expression(BINARY, type, 0, 0, null, -1, null, op,
                        left.withSlotOffset(offset), right.withSlotOffset(offset));
            default:
                return this;
        }
    }

    /**
     * Evaluates as an integer (a float value is truncated toward zero).
     *
     * @param s the shot's bits and variables (may be null for a constant expression)
     * @return the value
     */
    public long evaluateInteger(Values s) {
        return asLong(s);
    }

    /**
     * Evaluates as a double.
     *
     * @param s the shot's bits and variables (may be null for a constant expression)
     * @return the value
     */
    public double evaluateReal(Values s) {
        return asDouble(s);
    }

    /**
     * Evaluates as a condition: a bool or integer is true when non-zero.
     *
     * @param s the shot's bits and variables (may be null for a constant expression)
     * @return the truth value
     * @throws IllegalStateException if the expression is a float (never a condition)
     */
    public boolean test(Values s) {
        if (type == Type.FLOAT) {
            throw new IllegalStateException("a float expression is not a condition: "
                    + Checks.excerpt(toString()));
        }
        return truth(s);
    }

    /** Evaluates as an integer (a float value is truncated toward zero). */
    long asLong(Values s) {
        if (type == Type.FLOAT) {
            return (long) asDouble(s);
        }
        switch (node) {
            case CONSTANT:
                return integer;
            case BITS: {
                long v = 0;
                for (int j = 0; j < bits.length; j++) {
                    if (s.bit(bits[j])) {
                        v |= 1L << j;
                    }
                }
                return v;
            }
            case VARIABLE:
                return s.variable(slot);
            case UNARY: {
                long a = left.asLong(s);
                switch (op) {
                    case NEG:
                        return -a;
                    case NOT:
                        return a == 0 ? 1 : 0;
                    default:
                        return ~a;
                }
            }
            default:
                return binaryLong(s);
        }
    }

    private long binaryLong(Values s) {
        switch (op) {
            case EQ:
            case NE:
            case LT:
            case LE:
            case GT:
            case GE:
                return compare(s) ? 1 : 0;
            case AND:
                return (left.truth(s) & right.truth(s)) ? 1 : 0;
            case OR:
                return (left.truth(s) | right.truth(s)) ? 1 : 0;
            default:
                break;
        }
        long a = left.asLong(s);
        long b = right.asLong(s);
        switch (op) {
            case ADD:
                return a + b;
            case SUB:
                return a - b;
            case MUL:
                return a * b;
            case DIV:
                return b == 0 ? 0 : a / b;
            case MOD:
                return b == 0 ? 0 : a % b;
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

    private boolean compare(Values s) {
        boolean real = left.type == Type.FLOAT || right.type == Type.FLOAT;
        int c = real ? Double.compare(left.asDouble(s), right.asDouble(s))
                : Long.compare(left.asLong(s), right.asLong(s));
        switch (op) {
            case EQ:
                return real ? left.asDouble(s) == right.asDouble(s) : c == 0;
            case NE:
                return real ? left.asDouble(s) != right.asDouble(s) : c != 0;
            case LT:
                return c < 0;
            case LE:
                return c <= 0;
            case GT:
                return c > 0;
            default:
                return c >= 0;
        }
    }

    /** Evaluates as a double. */
    double asDouble(Values s) {
        if (type != Type.FLOAT) {
            return asLong(s);
        }
        switch (node) {
            case CONSTANT:
                return real;
            case VARIABLE:
                return Double.longBitsToDouble(s.variable(slot));
            case UNARY: {
                double a = left.asDouble(s);
                switch (op) {
                    case NEG:
                        return -a;
                    case SIN:
                        return Math.sin(a);
                    case COS:
                        return Math.cos(a);
                    case TAN:
                        return Math.tan(a);
                    case ARCSIN:
                        return Math.asin(a);
                    case ARCCOS:
                        return Math.acos(a);
                    case ARCTAN:
                        return Math.atan(a);
                    case EXP:
                        return Math.exp(a);
                    case LN:
                        return Math.log(a);
                    default:
                        return Math.sqrt(a);
                }
            }
            default: {
                double a = left.asDouble(s);
                double b = right.asDouble(s);
                switch (op) {
                    case ADD:
                        return a + b;
                    case SUB:
                        return a - b;
                    case MUL:
                        return a * b;
                    case DIV:
                        return a / b;
                    case MOD:
                        return a % b;
                    default:
                        return Math.pow(a, b);
                }
            }
        }
    }

    /** Evaluates as a condition: a bool or integer is true when non-zero. */
    boolean truth(Values s) {
        return asLong(s) != 0;
    }

    /**
     * Compares structure and constants exactly.
     *
     * @param o another object
     * @return whether the expressions are equal
     */
    @Override
    public boolean equals(Object o) {
        if (this == o) {
            return true;
        }
        if (!(o instanceof Expression)) {
            return false;
        }
        Expression e = (Expression) o;
        return node == e.node && type == e.type && integer == e.integer
                && Double.doubleToLongBits(real) == Double.doubleToLongBits(e.real)
                && Arrays.equals(bits, e.bits) && slot == e.slot && op == e.op
                && Objects.equals(left, e.left) && Objects.equals(right, e.right);
    }

    /**
     * Returns a hash code consistent with {@link #equals(Object)}.
     *
     * @return the hash code
     */
    @Override
    public int hashCode() {
        return Objects.hash(node, type, integer, Double.doubleToLongBits(real),
                Arrays.hashCode(bits), slot, op, left, right);
    }

    /**
     * Returns the expression in OpenQASM 3 syntax, fully parenthesised, with a register of bits
     * written as {@code c[i]} for one bit and {@code (c[i] | c[j] << 1 ...)} for several, and
     * variables by name.
     *
     * @return the text
     */
    @Override
    public String toString() {
        switch (node) {
            case CONSTANT:
                if (type == Type.BOOL) {
                    return integer != 0 ? "true" : "false";
                }
                return type == Type.INT ? Long.toString(integer) : floatText(real);
            case BITS: {
                if (bits.length == 1) {
                    return "c[" + bits[0] + "]";
                }
                StringBuilder sb = new StringBuilder("(");
                for (int j = 0; j < bits.length; j++) {
                    sb.append(j > 0 ? " | " : "").append("c[").append(bits[j]).append(']');
                    if (j > 0) {
                        sb.append(" << ").append(j);
                    }
                }
                return sb.append(')').toString();
            }
            case VARIABLE:
                return name;
            case UNARY:
                return op.isFunction() ? op.symbol + "(" + left + ")" : "(" + op.symbol + left
                        + ")";
            default:
                return "(" + left + " " + op.symbol + " " + right + ")";
        }
    }

    /** A float as OpenQASM 3 text that reads back to the same double. */
    static String floatText(double x) {
        String s = Double.toString(x);
        return s.toLowerCase(Locale.ROOT);
    }
}
