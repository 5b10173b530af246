package dev.qsim.text;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.stream.Collectors;

import org.junit.jupiter.api.Test;

import dev.qsim.text.Syntax.Barrier;
import dev.qsim.text.Syntax.Binary;
import dev.qsim.text.Syntax.Constant;
import dev.qsim.text.Syntax.Declaration;
import dev.qsim.text.Syntax.Expression;
import dev.qsim.text.Syntax.FunctionCall;
import dev.qsim.text.Syntax.GateCall;
import dev.qsim.text.Syntax.GateDefinition;
import dev.qsim.text.Syntax.If;
import dev.qsim.text.Syntax.Include;
import dev.qsim.text.Syntax.Measure;
import dev.qsim.text.Syntax.ModifierKind;
import dev.qsim.text.Syntax.Negation;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.Program;
import dev.qsim.text.Syntax.Reset;
import dev.qsim.text.Syntax.Statement;
import dev.qsim.text.Syntax.Variable;

/**
 * The syntax tree the parser builds: its shape, the positions on its nodes, and the order in
 * which statements are handed on. Grammar and precedence follow the OpenQASM 3 specification
 * (Cross et al. 2022, ACM Trans. Quantum Comput. 3(3), 12, doi:10.1145/3505636); positions are
 * counted by hand from the test's text, 1-based (common practice for parsers).
 */
class ParserTest {

    private final List<Statement> handedOn = new ArrayList<>();

    /** Parses with the reader's own listener (which declares names), recording the order. */
    private Program parse(String text) {
        Scope scope = new Scope();
        Expander expander = new Expander(scope);
        return new Parser(Lexer.tokens(text), scope, s -> {
            handedOn.add(s);
            expander.ended(s);
        }).program();
    }

    private static Position at(int line, int column) {
        return new Position(line, column);
    }

    /** The expression in prefix form, such as {@code (+ 1 (neg x))}. */
    private static String show(Expression e) {
        if (e instanceof Constant c) {
            return c.text();
        }
        if (e instanceof Variable v) {
            return v.name();
        }
        if (e instanceof Negation n) {
            return "(neg " + show(n.operand()) + ")";
        }
        if (e instanceof FunctionCall f) {
            return "(" + f.function().name().toLowerCase(java.util.Locale.ROOT) + " "
                    + show(f.argument()) + ")";
        }
        Binary b = (Binary) e;
        String op = switch (b.operator()) {
            case ADD -> "+";
            case SUBTRACT -> "-";
            case MULTIPLY -> "*";
            case DIVIDE -> "/";
            case POWER -> "^";
        };
        return "(" + op + " " + show(b.left()) + " " + show(b.right()) + ")";
    }

    @Test
    void everyNodeCarriesWhereItStarts() {
        Program p = parse("OPENQASM 3;\ninclude \"stdgates.inc\";\nqubit[2] q;\nbit c;\n"
                + "inv @ ctrl @ rz(pi / 2) q[0], q[1];\nc = measure q[1];\n");
        assertEquals("3", p.version());
        assertEquals(at(7, 1), p.end());
        List<Statement> s = p.statements();
        assertEquals(5, s.size());
        Include include = assertInstanceOf(Include.class, s.get(0));
        assertEquals(at(2, 1), include.at());
        assertEquals("stdgates.inc", include.file());
        Declaration q = assertInstanceOf(Declaration.class, s.get(1));
        assertEquals(List.of(at(3, 1), at(3, 10), true, 2L, "q"),
                List.of(q.at(), q.nameAt(), q.quantum(), q.size(), q.name()));
        Declaration c = assertInstanceOf(Declaration.class, s.get(2));
        assertEquals(List.of(at(4, 1), at(4, 5), false, 1L, "c"),
                List.of(c.at(), c.nameAt(), c.quantum(), c.size(), c.name()));

        GateCall call = assertInstanceOf(GateCall.class, s.get(3));
        assertEquals(at(5, 1), call.at());
        assertEquals("rz", call.name());
        assertEquals(at(5, 14), call.nameAt());
        assertEquals(List.of(at(5, 1), at(5, 7)),
                call.modifiers().stream().map(m -> m.at()).collect(Collectors.toList()));
        Binary angle = assertInstanceOf(Binary.class, call.parameters().get(0));
        assertEquals(at(5, 20), angle.at());
        assertEquals(at(5, 17), angle.left().at());
        assertEquals(at(5, 22), angle.right().at());
        assertEquals(List.of(at(5, 25), at(5, 31)),
                call.operands().stream().map(o -> o.at()).collect(Collectors.toList()));
        assertEquals(List.of(0L, 1L),
                call.operands().stream().map(o -> o.index()).collect(Collectors.toList()));

        Measure m = assertInstanceOf(Measure.class, s.get(4));
        assertEquals(at(6, 1), m.at());
        assertEquals(at(6, 1), m.bits().at());
        assertTrue(m.bits().whole());
        assertEquals(at(6, 13), m.qubits().at());
        assertEquals(1, m.qubits().index());
    }

    @Test
    void expressionsFollowTheOpenQasmPrecedence() {
        // The power binds tighter than unary minus and groups to the right; + - * / group to
        // the left (the specification's table of operator precedence).
        Program p = parse("include \"stdgates.inc\";\ngate g(x) a {\n"
                + "  rx(-2^3 * (1 - .5) + sin(x) / tau) a;\n  rx(2 ^ 3 ** -+1) a;\n"
                + "  rx(1 - 2 - 3 / 4 / x) a;\n}\n");
        GateDefinition g = assertInstanceOf(GateDefinition.class, p.statements().get(1));
        assertEquals(List.of("(+ (* (neg (^ 2 3)) (- 1 .5)) (/ (sin x) tau))",
                "(^ 2 (^ 3 (neg 1)))", "(- (- 1 2) (/ (/ 3 4) x))"),
                g.body().stream().map(c -> show(c.parameters().get(0)))
                        .collect(Collectors.toList()));
        FunctionCall sin = (FunctionCall) ((Binary) ((Binary) g.body().get(0).parameters()
                .get(0)).right()).left();
        assertEquals(at(3, 24), sin.at());
        assertEquals(at(3, 28), sin.argument().at());
    }

    @Test
    void gateDefinitionsKeepTheirNamesAndCallsAndDropBarriers() {
        Program p = parse("include \"stdgates.inc\";\n"
                + "gate g(a, b) x, y { rz(a) x; barrier x, y; cx x, y; U(a, b, 0) y; }\n");
        GateDefinition g = assertInstanceOf(GateDefinition.class, p.statements().get(1));
        assertEquals(List.of(at(2, 1), "g", at(2, 6), List.of("a", "b"), List.of("x", "y")),
                List.of(g.at(), g.name(), g.nameAt(), g.parameters(), g.qubits()));
        assertEquals(List.of("rz", "cx", "U"),
                g.body().stream().map(GateCall::name).collect(Collectors.toList()));
        assertEquals(new Variable(at(2, 24), "a"), g.body().get(0).parameters().get(0));
        assertTrue(g.body().get(1).operands().stream().allMatch(o -> o.whole()));
    }

    @Test
    void modifiersAreKeptInTheOrderWritten() {
        Program p = parse("include \"stdgates.inc\";\nqubit[3] q;\n"
                + "inv @ ctrl(2) @ inv @ x q[0], q[1], q[2];\ninv @ s q[0];\nh q;\n");
        GateCall twice = (GateCall) p.statements().get(2);
        assertEquals(List.of(ModifierKind.INVERSE, ModifierKind.CONTROL, ModifierKind.INVERSE),
                twice.modifiers().stream().map(m -> m.kind()).collect(Collectors.toList()));
        assertEquals(2, twice.modifiers().get(1).count());
        assertFalse(twice.inverse());
        assertEquals(2, twice.controls());
        GateCall once = (GateCall) p.statements().get(3);
        assertTrue(once.inverse());
        assertEquals(0, once.controls());
        GateCall plain = (GateCall) p.statements().get(4);
        assertEquals(List.of(), plain.modifiers());
        assertTrue(plain.operands().get(0).whole());
    }

    @Test
    void statementsAreHandedOnAsTheyEndInnerOnesFirst() {
        Program p = parse("include \"stdgates.inc\";\nqubit[2] q;\nbit[2] c;\n"
                + "if (c[0] == 1) { x q[0]; if (c[1] == false) reset q[1]; }\nbarrier q;\n");
        If outer = assertInstanceOf(If.class, p.statements().get(3));
        assertEquals(1, outer.value());
        assertEquals(at(4, 5), outer.bit().at());
        If inner = assertInstanceOf(If.class, outer.body().get(1));
        assertEquals(0, inner.value());
        Reset reset = assertInstanceOf(Reset.class, inner.body().get(0));
        Barrier barrier = assertInstanceOf(Barrier.class, p.statements().get(4));
        assertEquals(List.of(p.statements().get(0), p.statements().get(1),
                p.statements().get(2), outer.body().get(0), reset, inner, outer, barrier),
                handedOn);
    }
}
