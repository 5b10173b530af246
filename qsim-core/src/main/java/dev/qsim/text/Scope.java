package dev.qsim.text;

import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.Map;

import dev.qsim.Circuit;
import dev.qsim.text.Syntax.Declaration;
import dev.qsim.text.Syntax.GateDefinition;
import dev.qsim.text.Syntax.Operand;
import dev.qsim.text.Syntax.Position;

/**
 * The names a program has declared so far, in one read: whether it included
 * {@code stdgates.inc}, its qubit and bit registers (each with the indices it takes) and its gate
 * definitions. {@link Expander} adds a name when the statement declaring it ends; the
 * {@link Parser} looks names up where OpenQASM requires them declared before use, so that every
 * problem is reported where the text first shows it.
 */
final class Scope {
    /** A register: its first index and its size. */
    record Register(int offset, int size) {
    }

    private boolean included;
    private final Map<String, Register> qubitRegisters = new LinkedHashMap<>();
    private final Map<String, Register> bitRegisters = new LinkedHashMap<>();
    private final Map<String, GateDefinition> definitions = new HashMap<>();
    private int qubits;
    private int clbits;

    /** The qubits declared so far. */
    int qubits() {
        return qubits;
    }

    /** The classical bits declared so far. */
    int clbits() {
        return clbits;
    }

    /** Records {@code include "stdgates.inc";}. */
    void include() {
        included = true;
    }

    /**
     * Declares a register, taking the next indices of its kind.
     *
     * @throws CircuitFormatException if the name is in use or the register takes the count of
     *     its kind past {@link Circuit#MAX_QUBITS}
     */
    void declare(Declaration d) {
        requireFree(d.name(), d.nameAt());
        long total = (d.quantum() ? qubits : clbits) + d.size();
        if (total > Circuit.MAX_QUBITS) {
            throw d.nameAt().error("register '" + d.name() + "' brings the " + d.keyword()
                    + " count to " + total + " but at most " + Circuit.MAX_QUBITS
                    + " are allowed");
        }
        if (d.quantum()) {
            qubitRegisters.put(d.name(), new Register(qubits, (int) d.size()));
            qubits = (int) total;
        } else {
            bitRegisters.put(d.name(), new Register(clbits, (int) d.size()));
            clbits = (int) total;
        }
    }

    /** Adds a gate definition; its name was checked free when the parser read it. */
    void define(GateDefinition d) {
        definitions.put(d.name(), d);
    }

    /**
     * Refuses a new name that is already a register, a gate (user, standard or built in,
     * included or not) or a word of the language.
     */
    void requireFree(String name, Position at) {
        if (qubitRegisters.containsKey(name) || bitRegisters.containsKey(name)
                || definitions.containsKey(name) || QasmGates.find(name) != null
                || Syntax.UNSUPPORTED.contains(name) || Syntax.RESERVED.contains(name)) {
            throw at.error("the name '" + Lexer.clip(name) + "' is already in use");
        }
    }

    /** The user gate of a name, or null. */
    GateDefinition definition(String name) {
        return definitions.get(name);
    }

    /** The standard or built-in gate a call may use by this name now, or null. */
    QasmGates.Entry knownGate(String name) {
        return QasmGates.callable(name, included);
    }

    /**
     * Returns the indices an operand stands for: one for an element, every index of the
     * register in order for a whole register.
     *
     * @param a the operand
     * @param quantum whether it must name a qubit register (else a bit register)
     * @throws CircuitFormatException if there is no such register or the index is out of range
     */
    int[] resolve(Operand a, boolean quantum) {
        String kind = quantum ? "qubit" : "bit";
        Register r = (quantum ? qubitRegisters : bitRegisters).get(a.name());
        if (r == null) {
            throw a.at().error("unknown " + kind + " register '" + Lexer.clip(a.name()) + "'");
        }
        if (a.whole()) {
            int[] all = new int[r.size()];
            for (int i = 0; i < r.size(); i++) {
                all[i] = r.offset() + i;
            }
            return all;
        }
        if (a.index() >= r.size()) {
            throw a.at().error("index " + a.index() + " is out of range [0, " + (r.size() - 1)
                    + "] for " + kind + " register '" + a.name() + "'");
        }
        return new int[] {r.offset() + (int) a.index()};
    }
}
