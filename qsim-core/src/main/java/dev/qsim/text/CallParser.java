package dev.qsim.text;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

import dev.qsim.text.Lexer.Token;
import dev.qsim.text.Lexer.Type;
import dev.qsim.text.Syntax.Barrier;
import dev.qsim.text.Syntax.Declared;
import dev.qsim.text.Syntax.Expr;
import dev.qsim.text.Syntax.GateCall;
import dev.qsim.text.Syntax.GateDefinition;
import dev.qsim.text.Syntax.Modifier;
import dev.qsim.text.Syntax.ModifierKind;
import dev.qsim.text.Syntax.Name;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.Statement;

/**
 * Parses gate calls (modifiers, name, arguments, operands) and gate definitions for the
 * {@link Parser}. Names are checked against each other here (in time linear in their count);
 * whether a called gate exists is the {@link Expander}'s question.
 */
final class CallParser {
    private final Tokens tokens;
    private final ExpressionParser expressions;

    CallParser(Tokens tokens, ExpressionParser expressions) {
        this.tokens = tokens;
        this.expressions = expressions;
    }

    /** Whether the next tokens start a modifier ({@code inv @}, {@code ctrl(2) @} ...). */
    boolean atModifier() {
        Token t = tokens.peek();
        return (t.is("inv") || t.is("pow") || t.is("ctrl") || t.is("negctrl"))
                && (tokens.peek(1).is("@") || tokens.peek(1).is("("));
    }

    /** Parses a gate call from its first modifier or its name, through its ';'. */
    GateCall call() {
        Token first = tokens.peek();
        List<Modifier> modifiers = new ArrayList<>();
        while (atModifier()) {
            Token m = tokens.next();
            Expr argument = null;
            ModifierKind kind = m.is("inv") ? ModifierKind.INVERSE : m.is("pow")
                    ? ModifierKind.POWER : m.is("ctrl") ? ModifierKind.CONTROL
                    : ModifierKind.NEGATIVE_CONTROL;
            if (tokens.at("(")) {
                if (kind == ModifierKind.INVERSE) {
                    throw Tokens.error(tokens.peek(), "'inv' takes no argument; write inv @");
                }
                tokens.next();
                argument = expressions.parse();
                tokens.expect(")");
            } else if (kind == ModifierKind.POWER) {
                throw Tokens.error(tokens.peek(), "'pow' needs its power, as in pow(2) @");
            }
            tokens.expect("@");
            modifiers.add(new Modifier(Position.of(m), kind, argument));
        }
        Token name = tokens.ident("a gate name");
        requireCallable(name);
        return rest(Position.of(first), modifiers, name.text, Position.of(name), null);
    }

    private static void requireCallable(Token name) {
        String reason = Syntax.UNSUPPORTED.get(name.text);
        if (reason != null) {
            throw Tokens.error(name, "'" + name.text + "' is unsupported: " + reason);
        }
        if (Syntax.reserved(name.text) && !name.is("U") && !name.is("gphase")) {
            throw Tokens.error(name, "expected a gate name but found the keyword '"
                    + name.text + "'");
        }
    }

    /**
     * Parses a call's arguments and operands after its name, through its ';'.
     *
     * @param qubits the qubit arguments of the enclosing gate definition (operands must be
     *     one of them, without index), or null outside a definition
     */
    GateCall rest(Position at, List<Modifier> modifiers, String name, Position nameAt,
            Set<String> qubits) {
        List<Expr> arguments = new ArrayList<>();
        if (tokens.accept("(")) {
            if (!tokens.at(")")) {
                do {
                    arguments.add(expressions.parse());
                } while (tokens.accept(","));
            }
            tokens.expect(")");
        }
        List<Expr> operands = new ArrayList<>();
        if (!tokens.at(";")) {
            do {
                operands.add(qubits == null ? expressions.operand() : bodyOperand(qubits));
            } while (tokens.accept(","));
        }
        tokens.expect(";");
        return new GateCall(at, List.copyOf(modifiers), name, nameAt, arguments, operands);
    }

    /** An operand in a gate definition's body: one of its qubit arguments, never indexed. */
    private Expr bodyOperand(Set<String> qubits) {
        Token t = tokens.ident("a qubit argument");
        if (tokens.at("[")) {
            throw Tokens.error(tokens.peek(), "indexing is not allowed inside a gate"
                    + " definition; its operands are its qubit arguments");
        }
        if (!qubits.contains(t.text)) {
            throw Tokens.error(t, "unknown qubit argument '" + Lexer.clip(t.text) + "'; a gate"
                    + " body may use only the qubits the gate declares");
        }
        return new Name(Position.of(t), t.text);
    }

    /** Parses {@code gate name(params) qubits { body }}, from the keyword on. */
    GateDefinition gateDefinition() {
        Token kw = tokens.next();
        Token name = tokens.ident("a gate name");
        requireNewName(name);
        Set<String> seen = new HashSet<>();
        List<Declared> params = new ArrayList<>();
        if (tokens.accept("(")) {
            if (!tokens.at(")")) {
                do {
                    params.add(newName(seen, "a parameter name"));
                } while (tokens.accept(","));
            }
            tokens.expect(")");
        }
        List<Declared> qargs = new ArrayList<>();
        Set<String> qubitNames = new HashSet<>();
        do {
            Declared q = newName(seen, "a qubit argument");
            qargs.add(q);
            qubitNames.add(q.name());
        } while (tokens.accept(","));
        Token open = tokens.expect("{");
        List<Statement> body = new ArrayList<>();
        while (!tokens.at("}")) {
            Token t = tokens.peek();
            if (t.type == Type.END) {
                throw Tokens.error(t, "expected '}' to close gate '" + Lexer.clip(name.text)
                        + "' opened on line " + open.line);
            }
            if (t.is("barrier")) {
                tokens.next();
                List<Expr> operands = new ArrayList<>();
                if (!tokens.at(";")) {
                    do {
                        operands.add(bodyOperand(qubitNames));
                    } while (tokens.accept(","));
                }
                tokens.expect(";");
                body.add(new Barrier(Position.of(t), operands));
                continue;
            }
            if (t.type == Type.IDENT && !atModifier() && !t.is("U") && !t.is("gphase")
                    && Syntax.reserved(t.text)) {
                throw Tokens.error(t, "'" + t.text + "' is not allowed in a gate definition;"
                        + " only gate calls, gphase and barrier are");
            }
            body.add(bodyCall(qubitNames));
        }
        tokens.next();
        return new GateDefinition(Position.of(kw), name.text, Position.of(name),
                List.copyOf(params), List.copyOf(qargs), List.copyOf(body));
    }

    private GateCall bodyCall(Set<String> qubitNames) {
        Token first = tokens.peek();
        List<Modifier> modifiers = new ArrayList<>();
        if (atModifier()) {
            GateCall probe = call();
            for (Expr o : probe.operands()) {
                if (!(o instanceof Name n) || !qubitNames.contains(n.name())) {
                    throw o.at().error("a gate body may use only the qubits the gate declares,"
                            + " without index");
                }
            }
            return probe;
        }
        Token name = tokens.ident("a gate name");
        requireCallable(name);
        return rest(Position.of(first), modifiers, name.text, Position.of(name), qubitNames);
    }

    private Declared newName(Set<String> seen, String what) {
        Token t = tokens.ident(what);
        requireNewName(t);
        if (!seen.add(t.text)) {
            throw Tokens.error(t, "the name '" + Lexer.clip(t.text) + "' is declared twice");
        }
        return new Declared(Position.of(t), t.text);
    }

    /** Refuses a keyword, built-in name or unsupported word as a new name. */
    static void requireNewName(Token t) {
        if (Syntax.reserved(t.text)) {
            throw Tokens.error(t, "'" + t.text + "' is a word of the language and cannot be"
                    + " declared as a name");
        }
    }
}
