package dev.qsim.text;

import java.util.HashMap;
import java.util.Map;

import dev.qsim.Circuit;
import dev.qsim.text.Syntax.GateDefinition;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.SubroutineDefinition;

/**
 * The names a program has declared, in nested frames: the global frame (registers, variables,
 * constants, inputs, aliases), one frame per block, loop iteration, gate body or subroutine
 * call. Gates and subroutines are global. Lookups are hash lookups, so declaring and finding n
 * names costs time linear in n.
 *
 * <p>A gate body or subroutine sees only its own names and the global constants and inputs
 * (and gates and subroutines), as in OpenQASM 3 (Cross et al. 2022, §"Subroutines" and
 * §"Gates", from memory): registers and variables must be passed as arguments.
 */
final class Scope {
    /** What a name stands for. */
    sealed interface Symbol permits Qubits, Bits, Variable, Constant {
    }

    /**
     * Qubits: a register, an alias, or a gate's or subroutine's qubit argument.
     *
     * @param indices the circuit's qubit indices, in order
     * @param single whether the name is one qubit ({@code qubit a;}), not a register
     */
    record Qubits(int[] indices, boolean single) implements Symbol {
    }

    /**
     * Classical bits: a register, an alias, or a subroutine's bit argument.
     *
     * @param indices the circuit's clbit indices, in order
     * @param single whether the name is one bit
     * @param readOnly whether assignments are refused (a subroutine's argument)
     */
    record Bits(int[] indices, boolean single, boolean readOnly) implements Symbol {
    }

    /**
     * A classical variable of the circuit, read and written during the shot.
     *
     * @param circuitName its name in the circuit ({@link Circuit#variables()}), unique there
     * @param value the expression that reads it
     */
    record Variable(String circuitName, dev.qsim.Expression value,
            Circuit.VariableType type) implements Symbol {
    }

    /**
     * A value fixed for the frame: a constant, an input, a loop variable, a gate's parameter
     * or a subroutine's classical argument (which may be a value known only during the shot).
     *
     * @param what what it is, for messages ("the loop variable", "the constant")
     */
    record Constant(Value value, String what) implements Symbol {
    }

    /** One frame of names. */
    private static final class Frame {
        final Frame parent;
        /** Whether this frame starts a gate body or subroutine (which sees only constants). */
        final boolean sealed;
        final String owner;
        final Map<String, Symbol> names = new HashMap<>();

        Frame(Frame parent, boolean sealed, String owner) {
            this.parent = parent;
            this.sealed = sealed;
            this.owner = owner;
        }
    }

    /**
     * The deepest nesting of frames while expanding (blocks, loop iterations, gate bodies and
     * subroutine calls together), so that expansion, which recurses once per frame, never
     * exhausts the stack.
     */
    static final int MAX_DEPTH = 128;

    private final Frame global = new Frame(null, false, null);
    private int depth;
    private Frame current = global;
    private final Map<String, GateDefinition> gates = new HashMap<>();
    private final Map<String, SubroutineDefinition> subroutines = new HashMap<>();
    private boolean included;

    /** Records {@code include "stdgates.inc";}. */
    void include() {
        included = true;
    }

    /** Whether the program has included {@code stdgates.inc}. */
    boolean included() {
        return included;
    }

    /** Whether the current frame is the global one. */
    boolean atTop() {
        return current == global;
    }

    /**
     * Opens a frame.
     *
     * @param sealed whether it starts a gate body or subroutine
     * @param owner the gate or subroutine, for messages (or null)
     * @param at the statement that opens it
     * @throws CircuitFormatException if frames would nest deeper than {@link #MAX_DEPTH}
     */
    void open(boolean sealed, String owner, Position at) {
        if (depth >= MAX_DEPTH) {
            throw at.error("blocks, loop bodies, gate bodies and subroutine calls nest more than "
                    + MAX_DEPTH + " levels deep when expanded");
        }
        depth++;
        current = new Frame(current, sealed, owner);
    }

    /** The number of frames open. */
    int depth() {
        return depth;
    }

    /** Closes the innermost frame. */
    void close() {
        depth--;
        current = current.parent;
    }

    /**
     * Returns what a name stands for, or null: the innermost frame first; past a gate body's
     * or subroutine's frame only global constants are visible.
     *
     * @throws CircuitFormatException if the name is a register or variable outside the gate
     *     or subroutine
     */
    Symbol find(String name, Position at) {
        boolean past = false;
        String owner = null;
        Frame f = current;
        while (f != null) {
            Symbol s = f.names.get(name);
            if (s != null) {
                if (past && !(s instanceof Constant)) {
                    throw at.error("'" + Lexer.clip(name) + "' is declared outside "
                            + owner + ", which sees only its own names and global constants;"
                            + " pass it as an argument");
                }
                return s;
            }
            if (f.sealed) {
                // Past a gate body or subroutine only the global frame is visible.
                past = true;
                owner = f.owner;
                f = global;
            } else {
                f = f.parent;
            }
        }
        return null;
    }

    /**
     * Declares a name in the current frame.
     *
     * @throws CircuitFormatException if it is taken in this frame, or at the top level by a
     *     gate, subroutine or standard gate name
     */
    void declare(String name, Symbol s, Position at) {
        if (current.names.containsKey(name)) {
            throw at.error("the name '" + Lexer.clip(name) + "' is already in use");
        }
        if (current == global) {
            requireFreeGlobal(name, at);
        }
        current.names.put(name, s);
    }

    /** Refuses a global name that a gate, subroutine or the language already has. */
    void requireFreeGlobal(String name, Position at) {
        if (Syntax.reserved(name) || gates.containsKey(name) || subroutines.containsKey(name)
                || QasmGates.find(name) != null || global.names.containsKey(name)) {
            throw at.error("the name '" + Lexer.clip(name) + "' is already in use");
        }
    }

    /** Adds a gate definition (its name checked free). */
    void define(GateDefinition d) {
        requireFreeGlobal(d.name(), d.nameAt());
        gates.put(d.name(), d);
    }

    /** Adds a subroutine (its name checked free). */
    void define(SubroutineDefinition d) {
        requireFreeGlobal(d.name(), d.nameAt());
        subroutines.put(d.name(), d);
    }

    /** The user gate of a name, or null. */
    GateDefinition gate(String name) {
        return gates.get(name);
    }

    /** The subroutine of a name, or null. */
    SubroutineDefinition subroutine(String name) {
        return subroutines.get(name);
    }

    /** The standard or built-in gate a call may use by this name now, or null. */
    QasmGates.Entry knownGate(String name) {
        return QasmGates.callable(name, included);
    }
}
