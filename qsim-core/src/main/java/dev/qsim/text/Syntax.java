package dev.qsim.text;

import java.util.List;
import java.util.Set;
import java.util.function.DoubleUnaryOperator;

import dev.qsim.text.Lexer.Token;

/**
 * The syntax tree of an OpenQASM 3 program as {@link Parser} builds it: plain records, each with
 * the line and column where it starts in the user's text. The tree holds names as written; it
 * resolves nothing to qubit indices and builds no circuit ({@link Expander} does).
 */
final class Syntax {
    /** Words of OpenQASM 3 outside the subset: refused as statements, gate names and new names. */
    static final Set<String> UNSUPPORTED = Set.of("def", "defcal", "cal", "for", "while",
            "switch", "case", "return", "break", "continue", "end", "input", "output", "const",
            "let", "int", "uint", "float", "angle", "bool", "complex", "duration", "stretch",
            "delay", "box", "extern", "array", "qreg", "creg", "pragma", "opaque", "else",
            "negctrl", "pow", "durationof", "defcalgrammar", "readonly", "mutable");

    /** Words of the subset that cannot name a register, gate, parameter or qubit argument. */
    static final Set<String> RESERVED = Set.of("qubit", "bit", "gate", "measure", "reset",
            "barrier", "if", "include", "OPENQASM", "inv", "ctrl", "pi", "tau", "euler", "π",
            "τ");

    private Syntax() {
    }

    /** Where a node starts: 1-based line and column. */
    record Position(int line, int column) {
        static Position of(Token t) {
            return new Position(t.line, t.column);
        }

        /** The reader's exception for a problem at this position. */
        CircuitFormatException error(String message) {
            return new CircuitFormatException(line, column, message);
        }
    }

    /**
     * A whole program.
     *
     * @param version the text of the version number of {@code OPENQASM 3;}, or null without one
     * @param statements the top-level statements in order
     * @param end where the text ends
     */
    record Program(String version, List<Statement> statements, Position end) {
    }

    /** A statement: top level, or in the block of an {@code if}. */
    sealed interface Statement permits Include, Declaration, GateDefinition, GateCall, Measure,
            Reset, Barrier, If {
        Position at();
    }

    /** {@code include "file";} (the subset accepts only {@code stdgates.inc}). */
    record Include(Position at, String file) implements Statement {
    }

    /**
     * {@code qubit[size] name;} or {@code bit[size] name;} ({@code size} 1 when not given).
     *
     * @param quantum true for {@code qubit}, false for {@code bit}
     */
    record Declaration(Position at, boolean quantum, long size, String name, Position nameAt)
            implements Statement {
        /** The keyword, for messages. */
        String keyword() {
            return quantum ? "qubit" : "bit";
        }
    }

    /**
     * {@code gate name(parameters) qubits { body }}. The body holds the gate calls in order; a
     * {@code barrier} in the body has been checked and dropped, since it records nothing.
     */
    record GateDefinition(Position at, String name, Position nameAt, List<String> parameters,
            List<String> qubits, List<GateCall> body) implements Statement {
    }

    /** The kinds of gate modifier in the subset. */
    enum ModifierKind {
        /** {@code inv @}. */
        INVERSE,
        /** {@code ctrl @} or {@code ctrl(count) @}. */
        CONTROL
    }

    /**
     * One gate modifier, as written before the gate name.
     *
     * @param count the number of controls of {@link ModifierKind#CONTROL}, 0 for the others
     */
    record Modifier(Position at, ModifierKind kind, int count) {
    }

    /**
     * A gate call: modifiers, the gate's name, its parameter expressions and its operands. At
     * the top level (or in an {@code if} block) it is a statement; in a gate definition's body
     * its operands are the definition's qubit arguments.
     *
     * @param at where the call starts (its first modifier, or its name)
     */
    record GateCall(Position at, List<Modifier> modifiers, String name, Position nameAt,
            List<Expression> parameters, List<Operand> operands) implements Statement {
        /** Whether the modifiers invert the gate (an odd number of {@code inv}). */
        boolean inverse() {
            boolean inverse = false;
            for (Modifier m : modifiers) {
                if (m.kind() == ModifierKind.INVERSE) {
                    inverse = !inverse;
                }
            }
            return inverse;
        }

        /** The number of controls the modifiers add. */
        int controls() {
            int k = 0;
            for (Modifier m : modifiers) {
                k += m.count();
            }
            return k;
        }
    }

    /**
     * {@code measure qubits -> bits;} or {@code bits = measure qubits;}.
     *
     * @param at where the statement starts
     */
    record Measure(Position at, Operand qubits, Operand bits) implements Statement {
    }

    /** {@code reset operand;}. */
    record Reset(Position at, Operand operand) implements Statement {
    }

    /** {@code barrier operands;} (the operands may be none); records nothing. */
    record Barrier(Position at, List<Operand> operands) implements Statement {
    }

    /**
     * {@code if (bit == value) statement} or {@code if (bit == value) { statements }}.
     *
     * @param value 0 or 1
     */
    record If(Position at, Operand bit, int value, List<Statement> body) implements Statement {
    }

    /**
     * A register, one of its elements, or a gate definition's qubit argument.
     *
     * @param index the element's index, or {@link #WHOLE} for the whole register or argument
     */
    record Operand(Position at, String name, long index) {
        /** The index of an operand that names a whole register. */
        static final long WHOLE = -1;

        boolean whole() {
            return index < 0;
        }
    }

    /** A parameter expression: a constant expression, or one of a gate definition's. */
    sealed interface Expression permits Constant, Variable, Negation, Binary,
            FunctionCall {
        Position at();
    }

    /**
     * A number or a named constant.
     *
     * @param text as written, such as {@code "1.5e-1"} or {@code "pi"}
     * @param value its value
     */
    record Constant(Position at, String text, double value) implements Expression {
    }

    /** A gate definition's parameter, by name. */
    record Variable(Position at, String name) implements Expression {
    }

    /** Unary minus. */
    record Negation(Position at, Expression operand) implements Expression {
    }

    /** The binary operators: {@code + - * /} and the power, {@code ^} or {@code **}. */
    enum BinaryOperator {
        /** {@code +}. */
        ADD,
        /** {@code -}. */
        SUBTRACT,
        /** {@code *}. */
        MULTIPLY,
        /** {@code /}. */
        DIVIDE,
        /** {@code ^} or {@code **}, as {@link Math#pow(double, double)}. */
        POWER
    }

    /**
     * A binary operation.
     *
     * @param at where the operator is
     */
    record Binary(Position at, BinaryOperator operator, Expression left, Expression right)
            implements Expression {
    }

    /** The functions an expression may call, each with its {@link Math} method. */
    enum MathFunction {
        /** {@link Math#sin(double)}. */
        SIN("sin", Math::sin),
        /** {@link Math#cos(double)}. */
        COS("cos", Math::cos),
        /** {@link Math#tan(double)}. */
        TAN("tan", Math::tan),
        /** {@link Math#asin(double)}. */
        ARCSIN("arcsin", Math::asin),
        /** {@link Math#acos(double)}. */
        ARCCOS("arccos", Math::acos),
        /** {@link Math#atan(double)}. */
        ARCTAN("arctan", Math::atan),
        /** {@link Math#exp(double)}. */
        EXP("exp", Math::exp),
        /** {@link Math#log(double)}, the natural logarithm. */
        LN("ln", Math::log),
        /** {@link Math#sqrt(double)}. */
        SQRT("sqrt", Math::sqrt);

        private final String word;
        private final DoubleUnaryOperator method;

        MathFunction(String word, DoubleUnaryOperator method) {
            this.word = word;
            this.method = method;
        }

        /** The function of a name as written, or null. */
        static MathFunction named(String name) {
            for (MathFunction f : values()) {
                if (f.word.equals(name)) {
                    return f;
                }
            }
            return null;
        }

        double apply(double x) {
            return method.applyAsDouble(x);
        }
    }

    /** A function call, such as {@code sin(x)}. */
    record FunctionCall(Position at, MathFunction function, Expression argument)
            implements Expression {
    }
}
