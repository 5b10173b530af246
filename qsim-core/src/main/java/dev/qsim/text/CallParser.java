package dev.qsim.text;

import java.util.ArrayList;
import java.util.List;

import dev.qsim.text.Lexer.Token;
import dev.qsim.text.Lexer.Type;
import dev.qsim.text.Syntax.Expression;
import dev.qsim.text.Syntax.GateCall;
import dev.qsim.text.Syntax.GateDefinition;
import dev.qsim.text.Syntax.Modifier;
import dev.qsim.text.Syntax.ModifierKind;
import dev.qsim.text.Syntax.Operand;
import dev.qsim.text.Syntax.Position;

/**
 * Parses gate calls (modifiers, name, parameters, operands) and gate definitions for the
 * {@link Parser}. A call's gate must be known when the call is read: a standard gate (once
 * {@code stdgates.inc} is included), a built-in or a gate defined earlier, looked up in the
 * {@link Scope}; its parameter and qubit counts are checked against the call.
 */
final class CallParser {
    private final Tokens tokens;
    private final ExpressionParser expressions;
    private final Scope scope;

    CallParser(Tokens tokens, Scope scope) {
        this.tokens = tokens;
        this.expressions = new ExpressionParser(tokens);
        this.scope = scope;
    }

    /** Parses {@code gate name(params) qubits { body }}, from the keyword on. */
    GateDefinition definition() {
        Token kw = tokens.next();
        Token name = tokens.ident("a gate name");
        scope.requireFree(name.text, Position.of(name));
        List<String> params = new ArrayList<>();
        if (tokens.peek().is("(")) {
            tokens.next();
            if (!tokens.peek().is(")")) {
                params.add(newName(params, null));
                while (tokens.peek().is(",")) {
                    tokens.next();
                    params.add(newName(params, null));
                }
            }
            tokens.expect(")");
        }
        List<String> qargs = new ArrayList<>();
        qargs.add(newName(qargs, params));
        while (tokens.peek().is(",")) {
            tokens.next();
            qargs.add(newName(qargs, params));
        }
        tokens.expect("{");
        List<GateCall> body = new ArrayList<>();
        while (!tokens.peek().is("}")) {
            Token t = tokens.peek();
            if (t.type == Type.END) {
                throw Tokens.error(t, "expected '}' to close gate '" + name.text + "'");
            }
            if (t.is("barrier")) {
                bodyBarrier(name.text, qargs);
                continue;
            }
            if (t.is("measure") || t.is("reset") || t.is("if") || t.is("qubit") || t.is("bit")
                    || t.is("gate")) {
                throw Tokens.error(t, "'" + t.text + "' is not allowed in a gate definition;"
                        + " only gates and barrier are");
            }
            body.add(call(params, qargs));
            tokens.expect(";");
        }
        tokens.next();
        return new GateDefinition(Position.of(kw), name.text, Position.of(name), params, qargs,
                body);
    }

    /** Checks a {@code barrier} in a gate definition's body; it records nothing. */
    private void bodyBarrier(String gate, List<String> qargs) {
        tokens.next();
        while (!tokens.peek().is(";")) {
            Token a = tokens.ident("a qubit argument");
            if (!qargs.contains(a.text)) {
                throw Tokens.error(a, "unknown qubit argument '" + Lexer.clip(a.text)
                        + "' in gate '" + gate + "'; arguments: " + qargs);
            }
            if (!tokens.peek().is(";")) {
                tokens.expect(",");
            }
        }
        tokens.next();
    }

    private String newName(List<String> seen, List<String> other) {
        Token t = tokens.ident("a name");
        if (seen.contains(t.text) || (other != null && other.contains(t.text))
                || Syntax.RESERVED.contains(t.text)) {
            throw Tokens.error(t, "the name '" + Lexer.clip(t.text) + "' is already in use");
        }
        return t.text;
    }

    /**
     * Parses modifiers, a gate name, parameters and operands (not the ';').
     *
     * @param params the enclosing definition's parameters, or null at the top level
     * @param qargs the enclosing definition's qubit arguments, or null at the top level
     */
    GateCall call(List<String> params, List<String> qargs) {
        Token first = tokens.peek();
        List<Modifier> modifiers = new ArrayList<>();
        int controls = 0;
        while (tokens.peek().is("inv") || tokens.peek().is("ctrl")
                || tokens.peek().is("negctrl") || tokens.peek().is("pow")) {
            Token m = tokens.next();
            if (m.is("negctrl") || m.is("pow")) {
                throw Tokens.error(m, "the modifier '" + m.text + "' is outside the supported"
                        + " subset; 'inv @' and 'ctrl @' are supported");
            }
            if (m.is("inv")) {
                modifiers.add(new Modifier(Position.of(m), ModifierKind.INVERSE, 0));
            } else {
                long k = 1;
                if (tokens.peek().is("(")) {
                    tokens.next();
                    Token n = tokens.next();
                    k = Tokens.whole(n, "control count");
                    tokens.expect(")");
                    if (k < 1 || k > 64) {
                        throw Tokens.error(n, "the control count must be from 1 to 64 but was "
                                + k);
                    }
                }
                if (controls > 0) {
                    throw Tokens.error(m, "only one 'ctrl' modifier per gate is supported; use"
                            + " ctrl(k) @");
                }
                controls = (int) k;
                modifiers.add(new Modifier(Position.of(m), ModifierKind.CONTROL, controls));
            }
            tokens.expect("@");
        }
        Token name = tokens.ident("a gate name");
        if (Syntax.UNSUPPORTED.contains(name.text)) {
            throw Tokens.error(name, "'" + name.text + "' is outside the supported subset of"
                    + " OpenQASM 3 (gates, measure, reset, barrier, if on one bit, gate"
                    + " definitions)");
        }
        QasmGates.Entry known = scope.knownGate(name.text);
        GateDefinition user = scope.definition(name.text);
        if (known == null && user == null) {
            throw Tokens.error(name, "unknown gate '" + Lexer.clip(name.text) + "'"
                    + (QasmGates.find(name.text) != null
                    ? "; standard gates need include \"stdgates.inc\"" : ""));
        }
        if (controls > 0 && user != null) {
            throw Tokens.error(first, "'ctrl @' on the user gate '" + name.text + "' is outside"
                    + " the supported subset; it works on standard gates, U and gphase");
        }
        List<Expression> exprs = new ArrayList<>();
        if (tokens.peek().is("(")) {
            tokens.next();
            if (!tokens.peek().is(")")) {
                exprs.add(expressions.parse(params));
                while (tokens.peek().is(",")) {
                    tokens.next();
                    exprs.add(expressions.parse(params));
                }
            }
            tokens.expect(")");
        }
        List<Operand> args = new ArrayList<>();
        if (!tokens.peek().is(";")) {
            args.add(qargs == null ? operand() : bodyOperand(qargs));
            while (tokens.peek().is(",")) {
                tokens.next();
                args.add(qargs == null ? operand() : bodyOperand(qargs));
            }
        }
        int wantParams = known != null ? known.parameters() : user.parameters().size();
        int wantQubits = controls + (known != null ? known.qubits() : user.qubits().size());
        if (exprs.size() != wantParams) {
            throw Tokens.error(name, "gate '" + name.text + "' takes " + wantParams
                    + " parameter(s) but " + exprs.size() + " were given");
        }
        if (args.size() != wantQubits) {
            throw Tokens.error(name, (controls > 0 ? "ctrl(" + controls + ") @ " : "")
                    + "gate '" + name.text + "' takes " + wantQubits + " qubit(s) but "
                    + args.size() + " were given");
        }
        return new GateCall(Position.of(first), modifiers, name.text, Position.of(name), exprs,
                args);
    }

    /** An operand in a gate definition's body: one of its qubit arguments, never indexed. */
    private Operand bodyOperand(List<String> qargs) {
        Token t = tokens.ident("a qubit argument");
        if (tokens.peek().is("[")) {
            throw Tokens.error(tokens.peek(), "indexing is not allowed inside a gate definition");
        }
        if (!qargs.contains(t.text)) {
            throw Tokens.error(t, "unknown qubit argument '" + Lexer.clip(t.text)
                    + "'; arguments: " + qargs);
        }
        return new Operand(Position.of(t), t.text, Operand.WHOLE);
    }

    /** Parses a register operand: {@code name} or {@code name[index]}. */
    Operand operand() {
        Token name = tokens.ident("a register name");
        long index = Operand.WHOLE;
        if (tokens.peek().is("[")) {
            tokens.next();
            Token n = tokens.next();
            index = Tokens.whole(n, "index");
            tokens.expect("]");
        }
        return new Operand(Position.of(name), name.text, index);
    }
}
