package dev.qsim.text;

import java.util.List;
import java.util.Map;
import java.util.Set;

import dev.qsim.Expression;
import dev.qsim.text.Lexer.Token;

/**
 * The syntax tree of an OpenQASM 3 program as {@link Parser} builds it: plain records, each with
 * the line and column where it starts in the user's text. The tree holds names as written; it
 * resolves nothing to qubit indices and builds no circuit ({@link Expander} does). The parser
 * hands the expander one top-level statement at a time, so a long program is never held whole.
 */
final class Syntax {
    /**
     * Words of OpenQASM 3 the reader does not support, each with the reason given when a
     * program uses it.
     */
    static final Map<String, String> UNSUPPORTED = Map.ofEntries(
            Map.entry("box", "timing (box) is unsupported: the simulator has no"
                    + " schedule, only the order of instructions"),
            Map.entry("stretch", "timing (stretch) is unsupported: the simulator has"
                    + " no schedule to stretch"),
            Map.entry("duration", "the duration type is unsupported; durations may"
                    + " appear only as literals in delay[...]"),
            Map.entry("durationof", "durationof is unsupported: the simulator has no"
                    + " gate durations"),
            Map.entry("cal", "pulse-level code (cal) is unsupported: the simulator"
                    + " works at the gate level"),
            Map.entry("defcal", "pulse-level code (defcal) is unsupported: the"
                    + " simulator works at the gate level"),
            Map.entry("defcalgrammar", "pulse-level code (defcalgrammar) is"
                    + " unsupported: the simulator works at the gate level"),
            Map.entry("frame", "pulse-level code (frame) is unsupported"),
            Map.entry("port", "pulse-level code (port) is unsupported"),
            Map.entry("waveform", "pulse-level code (waveform) is unsupported"),
            Map.entry("extern", "extern functions are unsupported: the simulator"
                    + " cannot call code outside the file"),
            Map.entry("array", "arrays are unsupported; use bit registers or several"
                    + " variables"),
            Map.entry("switch", "switch is unsupported; write it as if ... else"),
            Map.entry("case", "switch and case are unsupported; write them as if"
                    + " ... else"),
            Map.entry("default", "switch and default are unsupported; write them as"
                    + " if ... else"),
            Map.entry("complex", "complex numbers are unsupported: classical values"
                    + " are real"),
            Map.entry("opaque", "opaque gates are unsupported: a gate needs a body"
                    + " to be simulated"),
            Map.entry("readonly", "array arguments (readonly) are unsupported"),
            Map.entry("mutable", "array arguments (mutable) are unsupported"),
            Map.entry("sizeof", "sizeof is unsupported: it measures arrays, which are"
                    + " unsupported"),
            Map.entry("end", "end is unsupported: a program runs to its last"
                    + " statement"),
            Map.entry("nop", "nop is unsupported: it belongs to timing-level code"));

    /**
     * Words that cannot name a register, variable, gate, subroutine, parameter or argument:
     * the keywords of the supported part, the built-in constants and the math functions.
     */
    static final Set<String> RESERVED = Set.of("OPENQASM", "include", "qubit", "qreg", "bit",
            "creg", "int", "uint", "float", "angle", "bool", "const", "input", "output", "let",
            "gate", "def", "return", "measure", "reset", "barrier", "delay", "if", "else", "for",
            "in", "while", "break", "continue", "inv", "pow", "ctrl", "negctrl", "gphase", "U",
            "true", "false", "pi", "π", "tau", "τ", "euler", "ℇ", "pragma", "sin", "cos", "tan",
            "arcsin", "arccos", "arctan", "exp", "ln", "log", "sqrt", "floor", "ceiling", "mod",
            "popcount");

    private Syntax() {
    }

    /** Whether a word is a keyword, a built-in or unsupported: no program may declare it. */
    static boolean reserved(String name) {
        return RESERVED.contains(name) || UNSUPPORTED.containsKey(name);
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

        @Override
        public String toString() {
            return "line " + line + ", column " + column;
        }
    }

    // ---------------------------------------------------------------- types

    /** The kinds of declared type. */
    enum Kind {
        /** {@code qubit} or {@code qubit[n]} (subroutine arguments). */
        QUBIT,
        /** {@code bit} or {@code bit[n]}. */
        BIT,
        /** {@code int} or {@code int[n]}. */
        INT,
        /** {@code uint} or {@code uint[n]}. */
        UINT,
        /** {@code float} or {@code float[n]}. */
        FLOAT,
        /** {@code angle} or {@code angle[n]}. */
        ANGLE,
        /** {@code bool}. */
        BOOL
    }

    /**
     * A type as written.
     *
     * @param width the width or register size, or null when not given
     */
    record Type(Position at, Kind kind, Expr width) {
    }

    // ---------------------------------------------------------------- expressions

    /** An expression; {@link #depth()} counts the nodes on its longest path to a leaf. */
    sealed interface Expr permits Literal, Name, Indexed, Unary, Binary, Call, Cast, Measure,
            Duration {
        Position at();

        int depth();
    }

    /**
     * A number, a bool or a built-in constant, or a constant part of an expression that the
     * parser has folded.
     *
     * @param type its type
     * @param integer its value when an integer or bool
     * @param real its value when a float
     */
    record Literal(Position at, Expression.Type type, long integer, double real)
            implements Expr {
        @Override
        public int depth() {
            return 1;
        }
    }

    /** A name: a register, variable, constant, parameter or argument. */
    record Name(Position at, String name) implements Expr {
        @Override
        public int depth() {
            return 1;
        }
    }

    /** One item of an index: a value, a range or a set. */
    sealed interface IndexItem permits Single, Range, IndexSet {
    }

    /** A single index. */
    record Single(Expr value) implements IndexItem {
    }

    /**
     * A range {@code start:end} or {@code start:step:end}, both ends included; a missing part
     * is null (the register's first index, 1, its last index).
     */
    record Range(Position at, Expr start, Expr step, Expr end) implements IndexItem {
    }

    /** A set of indices {@code {a, b, ...}} in the order written. */
    record IndexSet(Position at, List<Expr> values) implements IndexItem {
    }

    /** {@code base[index]}. */
    record Indexed(Position at, Expr base, IndexItem index, int depth) implements Expr {
    }

    /** A prefix operator ({@code - ! ~}). */
    record Unary(Position at, Expression.Op op, Expr operand, int depth) implements Expr {
    }

    /**
     * A binary operator.
     *
     * @param at where the operator is
     */
    record Binary(Position at, Expression.Op op, Expr left, Expr right, int depth)
            implements Expr {
    }

    /** A call of a function or subroutine by name. */
    record Call(Position at, String name, List<Expr> arguments, int depth) implements Expr {
    }

    /** A cast such as {@code int[8](x)} or {@code float(x)}. */
    record Cast(Position at, Type type, Expr operand, int depth) implements Expr {
    }

    /** {@code measure operand}, allowed as the value of an assignment, declaration or return. */
    record Measure(Position at, Expr operand, int depth) implements Expr {
    }

    /**
     * A duration literal, allowed in {@code delay[...]}.
     *
     * @param value the number as written
     * @param unit its unit
     */
    record Duration(Position at, double value, String unit) implements Expr {
        @Override
        public int depth() {
            return 1;
        }
    }

    // ---------------------------------------------------------------- statements

    /** A statement. */
    sealed interface Statement permits Include, QubitDeclaration, BitDeclaration,
            VariableDeclaration, Alias, GateDefinition, SubroutineDefinition, GateCall,
            MeasureArrow, Assignment, Reset, Barrier, Delay, If, For, While, Jump, Return,
            Block {
        Position at();
    }

    /** {@code include "file";}. */
    record Include(Position at, String file) implements Statement {
    }

    /**
     * {@code qubit[size] name;}, {@code qubit name;} or {@code qreg name[size];}.
     *
     * @param size the size, or null for one qubit
     */
    record QubitDeclaration(Position at, String name, Position nameAt, Expr size)
            implements Statement {
    }

    /**
     * {@code bit[size] name;}, {@code bit name = value;} or {@code creg name[size];}.
     *
     * @param size the size, or null for one bit
     * @param value the initial value (possibly a {@link Measure}), or null
     */
    record BitDeclaration(Position at, String name, Position nameAt, Expr size, Expr value)
            implements Statement {
    }

    /** How a classical variable is declared. */
    enum Storage {
        /** A variable set during the shot. */
        VARIABLE,
        /** {@code const}: a value known when the file is read. */
        CONSTANT,
        /** {@code input}: a value given to the reader. */
        INPUT
    }

    /**
     * A declaration of a classical variable of type int, uint, float, angle or bool.
     *
     * @param value the initial value, or null
     */
    record VariableDeclaration(Position at, Storage storage, Type type, String name,
            Position nameAt, Expr value) implements Statement {
    }

    /** {@code let name = a ++ b ...;}. */
    record Alias(Position at, String name, Position nameAt, List<Expr> parts)
            implements Statement {
    }

    /** A name as declared, with where it is. */
    record Declared(Position at, String name) {
    }

    /**
     * {@code gate name(parameters) qubits { body }}; the body holds gate calls and
     * barriers.
     */
    record GateDefinition(Position at, String name, Position nameAt, List<Declared> parameters,
            List<Declared> qubits, List<Statement> body) implements Statement {
    }

    /** A subroutine's argument: its type and name. */
    record Argument(Type type, Declared name) {
    }

    /**
     * {@code def name(arguments) -> type { body }}.
     *
     * @param returns the return type, or null
     */
    record SubroutineDefinition(Position at, String name, Position nameAt,
            List<Argument> arguments, Type returns, List<Statement> body)
            implements Statement {
    }

    /** The kinds of gate modifier. */
    enum ModifierKind {
        /** {@code inv @}. */
        INVERSE,
        /** {@code pow(k) @}. */
        POWER,
        /** {@code ctrl @} or {@code ctrl(n) @}. */
        CONTROL,
        /** {@code negctrl @} or {@code negctrl(n) @}. */
        NEGATIVE_CONTROL
    }

    /**
     * One gate modifier, as written before the gate name.
     *
     * @param argument the power or the control count, or null
     */
    record Modifier(Position at, ModifierKind kind, Expr argument) {
    }

    /**
     * A gate call, or a call of a subroutine as a statement (no modifiers, no operands after
     * the arguments).
     *
     * @param at where the call starts (its first modifier, or its name)
     */
    record GateCall(Position at, List<Modifier> modifiers, String name, Position nameAt,
            List<Expr> arguments, List<Expr> operands) implements Statement {
    }

    /**
     * {@code measure qubits -> bits;} or {@code measure qubits;}.
     *
     * @param bits the bits, or null when the result is discarded
     */
    record MeasureArrow(Position at, Expr qubits, Expr bits) implements Statement {
    }

    /**
     * {@code target = value;} or a compound assignment such as {@code target += value;}.
     *
     * @param compound the operator of a compound assignment, or null
     */
    record Assignment(Position at, Expr target, Expression.Op compound, Expr value)
            implements Statement {
    }

    /** {@code reset operands;}. */
    record Reset(Position at, List<Expr> operands) implements Statement {
    }

    /** {@code barrier operands;} (the operands may be none). */
    record Barrier(Position at, List<Expr> operands) implements Statement {
    }

    /** {@code delay[duration] operands;} (no operands: every qubit). */
    record Delay(Position at, Expr duration, List<Expr> operands) implements Statement {
    }

    /**
     * {@code if (condition) then else otherwise}.
     *
     * @param grouped whether the condition was written in parentheses of its own
     * @param otherwise the statements after {@code else}, or null without one
     */
    record If(Position at, Expr condition, boolean grouped, List<Statement> then,
            List<Statement> otherwise) implements Statement {
    }

    /** What a {@code for} loop runs over: a range or a set. */
    record Iteration(Position at, Range range, IndexSet set) {
    }

    /** {@code for type name in iteration body}. */
    record For(Position at, Type type, String name, Position nameAt, Iteration over,
            List<Statement> body) implements Statement {
    }

    /**
     * {@code while (condition) body}.
     *
     * @param bound the iteration bound of an {@code @max_iterations} annotation, or 0
     */
    record While(Position at, Expr condition, List<Statement> body, int bound)
            implements Statement {
    }

    /**
     * {@code break;} or {@code continue;}.
     *
     * @param breaks true for break
     */
    record Jump(Position at, boolean breaks) implements Statement {
    }

    /**
     * {@code return value;}.
     *
     * @param value the value, or null
     */
    record Return(Position at, Expr value) implements Statement {
    }

    /** {@code { statements }}. */
    record Block(Position at, List<Statement> statements) implements Statement {
    }
}
