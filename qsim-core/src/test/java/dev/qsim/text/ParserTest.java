package dev.qsim.text;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.stream.Collectors;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.Expression;
import dev.qsim.text.Syntax.Binary;
import dev.qsim.text.Syntax.Call;
import dev.qsim.text.Syntax.Expr;
import dev.qsim.text.Syntax.For;
import dev.qsim.text.Syntax.GateCall;
import dev.qsim.text.Syntax.GateDefinition;
import dev.qsim.text.Syntax.If;
import dev.qsim.text.Syntax.IndexSet;
import dev.qsim.text.Syntax.Indexed;
import dev.qsim.text.Syntax.Literal;
import dev.qsim.text.Syntax.ModifierKind;
import dev.qsim.text.Syntax.Name;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.QubitDeclaration;
import dev.qsim.text.Syntax.Range;
import dev.qsim.text.Syntax.Statement;
import dev.qsim.text.Syntax.Unary;
import dev.qsim.text.Syntax.While;

/**
 * The syntax tree the parser builds: its shape, the positions on its nodes, the OpenQASM 3
 * precedence of operators, and long or deep input. Grammar and precedence follow the OpenQASM
 * 3 specification (Cross et al. 2022, ACM Trans. Quantum Comput. 3(3), 12,
 * doi:10.1145/3505636, and the live specification at openqasm.com, section "Classical types
 * and computation", table of operator precedence; from memory); positions are counted by hand
 * from the test's text, 1-based (common practice for parsers).
 */
class ParserTest {

    private static List<Statement> parse(String text) {
        Parser p = new Parser(new Tokens(new Lexer(text)));
        p.header();
        List<Statement> out = new ArrayList<>();
        while (!p.atEnd()) {
            Statement s = p.next();
            if (s != null) {
                out.add(s);
            }
        }
        return out;
    }

    private static Expr expression(String text) {
        return new ExpressionParser(new Tokens(new Lexer(text))).parse();
    }

    private static Position at(int line, int column) {
        return new Position(line, column);
    }

    /** The expression in prefix form, such as {@code (+ 1 (- x))}; literals by value. */
    private static String show(Expr e) {
        if (e instanceof Literal l) {
            return l.type() == Expression.Type.FLOAT ? Double.toString(l.real())
                    : Long.toString(l.integer());
        }
        if (e instanceof Name n) {
            return n.name();
        }
        if (e instanceof Unary u) {
            return "(" + u.op().symbol() + " " + show(u.operand()) + ")";
        }
        if (e instanceof Call c) {
            return "(" + c.name() + " " + c.arguments().stream().map(ParserTest::show)
                    .collect(Collectors.joining(" ")) + ")";
        }
        if (e instanceof Indexed i) {
            return show(i.base()) + "[...]";
        }
        Binary b = (Binary) e;
        return "(" + b.op().symbol() + " " + show(b.left()) + " " + show(b.right()) + ")";
    }

    @ParameterizedTest
    @CsvSource(delimiter = '#', value = {
        // expression # tree: the specification's precedence, highest first: ** (right to
        // left), unary ! - ~, * / %, + -, << >>, < <= > >=, == !=, &, ^, |, &&, ||.
        "-a ** b # (- (** a b))",
        "a ** -b # (** a (- b))",
        "a ** b ** c # (** a (** b c))",
        "a - b - c # (- (- a b) c)",
        "a - b * c % d # (- a (% (* b c) d))",
        "a + b << c # (<< (+ a b) c)",
        "a << b < c # (< (<< a b) c)",
        "a < b == c > d # (== (< a b) (> c d))",
        "a == b & c # (& (== a b) c)",
        "a & b ^ c & d # (^ (& a b) (& c d))",
        "a ^ b | c ^ d # (| (^ a b) (^ c d))",
        "a | b && c | d # (&& (| a b) (| c d))",
        "a && b || c && d # (|| (&& a b) (&& c d))",
        "!a && ~b # (&& (! a) (~ b))",
        "-a * -b # (* (- a) (- b))",
        "sin(a) ** 2 / tau # (/ (** (sin a) 2) 6.283185307179586)",
        "(a + b) * c # (* (+ a b) c)",
    })
    void operatorsBindByTheSpecificationsPrecedence(String text, String tree) {
        assertEquals(tree, show(expression(text)));
    }

    @Test
    void constantPartsAreFoldedAsTheyAreRead() {
        // 2 ** 3 is 8.0 (a float, as Expression's POW), 2 ^ 3 is 1 (exclusive or), 7 / 2 is 3
        // (integer division), 7.0 / 2 is 3.5: the types of OpenQASM 3 as Expression applies them.
        assertEquals("8.0", show(expression("2 ** 3")));
        assertEquals("1", show(expression("2 ^ 3")));
        assertEquals("3", show(expression("7 / 2")));
        assertEquals("3.5", show(expression("7.0 / 2")));
        assertEquals("(+ x 3)", show(expression("x + (1 + 2)")));
        assertEquals("0.7853981633974483", show(expression("pi / 4")));
        // An integer division by zero is not folded: the expander refuses it at the statement.
        assertInstanceOf(Binary.class, expression("1 / 0"));
    }

    @Test
    void aFlatExpressionOfAnyLengthUsesConstantStack() {
        // 20 000 terms: a recursive parser overflows its stack long before (the issue's
        // report: 8 000 terms). The folded value is the exact sum.
        StringBuilder sum = new StringBuilder("1");
        StringBuilder product = new StringBuilder("1.0");
        StringBuilder minus = new StringBuilder();
        for (int i = 0; i < 20_000; i++) {
            sum.append("+1");
            product.append("*1.0");
            minus.append('-');
        }
        assertEquals("20001", show(expression(sum.toString())));
        assertEquals("1.0", show(expression(product.toString())));
        assertEquals("1", show(expression(minus + "1")));
        assertEquals("1.0", show(expression("1.0" + "**1.0".repeat(20_000))));
    }

    @Test
    void expressionsThatCannotBeFoldedAreBoundedInDepth() {
        // x + 1 + 1 ... keeps x, so it nests one level per term; past Expression.MAX_DEPTH it is
        // refused at the operator that goes too deep.
        String fits = "x" + "+1".repeat(Expression.MAX_DEPTH - 1);
        assertEquals(Expression.MAX_DEPTH, expression(fits).depth());
        String deep = "x" + "+1".repeat(Expression.MAX_DEPTH);
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> expression(deep));
        assertEquals(1, e.line());
        assertEquals(2 * Expression.MAX_DEPTH, e.column());
        assertTrue(e.getMessage().contains("more than " + Expression.MAX_DEPTH), e.getMessage());
        String parens = "(".repeat(ExpressionParser.MAX_NESTING + 1) + "1"
                + ")".repeat(ExpressionParser.MAX_NESTING + 1);
        e = assertThrows(CircuitFormatException.class, () -> expression(parens));
        assertTrue(e.getMessage().contains("nested deeper than"), e.getMessage());
        String fitsParens = "(".repeat(ExpressionParser.MAX_NESTING) + "1"
                + ")".repeat(ExpressionParser.MAX_NESTING);
        assertEquals("1", show(expression(fitsParens)));
    }

    @Test
    void nodesCarryWhereTheyStart() {
        List<Statement> s = parse("OPENQASM 3;\ninclude \"stdgates.inc\";\nqubit[2] q;\n"
                + "inv @ ctrl @ rz(pi / 2) q[0], q[1];\n"
                + "for int i in [0:2:4] { h q[{0, 1}]; }\n");
        QubitDeclaration q = assertInstanceOf(QubitDeclaration.class, s.get(1));
        assertEquals(List.of(at(3, 1), at(3, 10), "q"), List.of(q.at(), q.nameAt(), q.name()));
        GateCall call = assertInstanceOf(GateCall.class, s.get(2));
        assertEquals(at(4, 1), call.at());
        assertEquals(at(4, 14), call.nameAt());
        assertEquals(List.of(at(4, 1), at(4, 7)),
                call.modifiers().stream().map(m -> m.at()).collect(Collectors.toList()));
        assertEquals(List.of(ModifierKind.INVERSE, ModifierKind.CONTROL),
                call.modifiers().stream().map(m -> m.kind()).collect(Collectors.toList()));
        // pi / 2 is folded into one literal at the position of its first operand.
        Literal angle = assertInstanceOf(Literal.class, call.arguments().get(0));
        assertEquals(at(4, 17), angle.at());
        assertEquals(Math.PI / 2, angle.real());
        assertEquals(List.of(at(4, 25), at(4, 31)), call.operands().stream()
                .map(o -> ((Indexed) o).base().at()).collect(Collectors.toList()));
        For f = assertInstanceOf(For.class, s.get(3));
        assertEquals(at(5, 1), f.at());
        assertEquals(at(5, 9), f.nameAt());
        Range r = f.over().range();
        assertEquals(List.of("0", "2", "4"), List.of(show(r.start()), show(r.step()),
                show(r.end())));
        GateCall h = assertInstanceOf(GateCall.class, f.body().get(0));
        IndexSet set = assertInstanceOf(IndexSet.class,
                ((Indexed) h.operands().get(0)).index());
        assertEquals(at(5, 28), set.at());
        assertEquals(2, set.values().size());
    }

    @Test
    void gateDefinitionsKeepBarriersAndCalls() {
        List<Statement> s = parse("include \"stdgates.inc\";\n"
                + "gate g(a, b) x, y { rz(a) x; barrier x, y; ctrl @ x x, y; U(a, b, 0) y; }\n");
        GateDefinition g = assertInstanceOf(GateDefinition.class, s.get(1));
        assertEquals(List.of("a", "b"), g.parameters().stream().map(d -> d.name())
                .collect(Collectors.toList()));
        assertEquals(List.of("x", "y"), g.qubits().stream().map(d -> d.name())
                .collect(Collectors.toList()));
        assertEquals(4, g.body().size());
        assertInstanceOf(Syntax.Barrier.class, g.body().get(1));
        assertEquals("x", ((GateCall) g.body().get(2)).name());
    }

    @Test
    void aConditionInParenthesesOfItsOwnIsMarked() {
        // if ((c[0] == 1)) is an expression condition, if (c[0] == 1) the one-bit form: the
        // writer and reader agree on this (QasmWriter javadoc).
        If bare = (If) parse("if (c[0] == 1) x q;").get(0);
        If grouped = (If) parse("if ((c[0] == 1)) x q;").get(0);
        If indexed = (If) parse("if ((c)[0] == 1) x q; else y q;").get(0);
        assertFalse(bare.grouped());
        assertTrue(grouped.grouped());
        assertFalse(indexed.grouped());
        assertNull(bare.otherwise());
        assertEquals(1, indexed.otherwise().size());
    }

    @Test
    void anAnnotationBoundsTheWhileLoopAfterIt() {
        While w = (While) parse("@max_iterations 25\nwhile (c[0] == 0) { x q; }\n").get(0);
        assertEquals(25, w.bound());
        While plain = (While) parse("@unknown.annotation any text\nwhile (true) x q;").get(0);
        assertEquals(0, plain.bound());
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> parse("@max_iterations 3\nx q;"));
        assertTrue(e.getMessage().contains("bounds the while loop"), e.getMessage());
        e = assertThrows(CircuitFormatException.class,
                () -> parse("@max_iterations 0\nwhile (true) x q;"));
        assertTrue(e.getMessage().contains("from 1 to"), e.getMessage());
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        // text | line | column | part of the message
        "qubit[2] q;\\nbox { x q; }|2|1|'box' is unsupported",
        "defcal x $0 { }|1|1|'defcal' is unsupported",
        "extern f(int) -> int;|1|1|'extern' is unsupported",
        "array[int[8], 4] a;|1|1|'array' is unsupported",
        "switch (x) { }|1|1|'switch' is unsupported",
        "stretch s;|1|1|'stretch' is unsupported",
        "x $0;|1|3|physical qubits",
        "rx(1im) q;|1|4|complex numbers",
        "rx(2pi) q;|1|4|unexpected 'pi' after the number",
        "qubit[2] q; if (true) { qubit r; }|1|25|only at the top level",
        "qubit q; x q[0, 1];|1|15|arrays, which are unsupported",
        "else x q;|1|1|'else' without an 'if'",
        "int[8] gate;|1|8|cannot be declared",
        "gate g(a, a) q { }|1|11|declared twice",
        "gate g q { measure q; }|1|12|not allowed in a gate definition",
        "gate g q { h q[0]; }|1|15|indexing is not allowed",
        "for int i in c { }|1|14|loops over registers",
        "const int n;|1|12|needs a value",
        "rx(\"01x\") q;|1|4|bit string",
    })
    void refusesWhatItDoesNotReadWithLineAndColumn(String text, int line, int column,
            String part) {
        String t = text.replace("\\n", "\n");
        CircuitFormatException e = assertThrows(CircuitFormatException.class, () -> parse(t));
        assertTrue(e.getMessage().contains(part), e.getMessage());
        assertEquals(line, e.line(), e.getMessage());
        assertEquals(column, e.column(), e.getMessage());
    }

    @Test
    void numbersInEveryNotation() {
        // Integer literals in decimal, hex, octal and binary with '_' between digits; floats
        // with a point or exponent (the specification's literals, from memory).
        assertEquals("255", show(expression("0xF_F")));
        assertEquals("8", show(expression("0o10")));
        assertEquals("5", show(expression("0b101")));
        assertEquals("1000000", show(expression("1_000_000")));
        assertEquals("0.5", show(expression(".5")));
        assertEquals("150.0", show(expression("1.5e2")));
        assertEquals("5", show(expression("\"0101\"")));
        assertEquals(String.valueOf(Long.MAX_VALUE), show(expression("9223372036854775807")));
        CircuitFormatException e = assertThrows(CircuitFormatException.class,
                () -> expression("9223372036854775808"));
        assertTrue(e.getMessage().contains("larger than"), e.getMessage());
        e = assertThrows(CircuitFormatException.class, () -> expression("1e400"));
        assertTrue(e.getMessage().contains("beyond the largest double"), e.getMessage());
    }
}
