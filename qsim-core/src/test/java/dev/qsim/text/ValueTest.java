package dev.qsim.text;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.Expression;
import dev.qsim.Expression.Op;

/**
 * Values folded when a file is read agree with the circuit's expressions evaluated during a
 * shot (a differential check: the same operator on the same constants, folded by
 * {@link Value} and evaluated by {@link Expression}, gives the same type and the same bits),
 * and a few cases by hand: integer arithmetic as in Java (JLS 17, §15.17: division truncates
 * toward zero, the remainder takes the dividend's sign), IEEE 754 for floats, the conversions
 * of OpenQASM 3's types (Cross et al. 2022, "Casting", from memory).
 */
class ValueTest {

    private static Value random(UniformRandomProvider rng) {
        switch (rng.nextInt(4)) {
            case 0:
                return Value.ofBool(rng.nextBoolean());
            case 1:
                return Value.ofInt(rng.nextInt(21) - 10);
            case 2:
                return Value.ofInt(rng.nextLong());
            default:
                return Value.ofReal(rng.nextBoolean() ? (rng.nextDouble() - 0.5) * 20
                        : rng.nextInt(7) - 3);
        }
    }

    @Test
    void foldingAgreesWithTheCircuitsExpressions() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(2024);
        int compared = 0;
        for (int i = 0; i < 20_000; i++) {
            Op op = Op.values()[rng.nextInt(Op.values().length)];
            Value a = random(rng);
            Value b = random(rng);
            Value folded;
            Expression e;
            try {
                folded = op.arity() == 1 ? Value.apply(op, a) : Value.apply(op, a, b);
                e = op.arity() == 1 ? Expression.of(op, a.toExpression())
                        : Expression.of(op, a.toExpression(), b.toExpression());
            } catch (IllegalArgumentException x) {
                continue; // a type refused by both, or an integer division by zero
            }
            if (folded.isFloat() && !Double.isFinite(folded.asDouble())) {
                continue; // the circuit's constants are finite; folding may go further
            }
            compared++;
            String what = op + " " + a.show() + " " + b.show();
            assertEquals(e.type(), folded.type(), what);
            if (folded.isFloat()) {
                assertEquals(Double.doubleToLongBits(e.evaluateReal(null)),
                        Double.doubleToLongBits(folded.asDouble()), what);
            } else {
                assertEquals(e.evaluateInteger(null), folded.asLong(), what);
            }
        }
        assertTrue(compared > 10_000, compared + " compared");
    }

    @ParameterizedTest
    @CsvSource({
        // a, op, b, result: integers as in Java (JLS §15.17), exclusive or, shifts.
        "7, DIV, 2, 3",
        "-7, DIV, 2, -3",
        "7, MOD, -3, 1",
        "-7, MOD, 3, -1",
        "6, BIT_XOR, 3, 5",
        "1, SHIFT_LEFT, 62, 4611686018427387904",
        "-8, SHIFT_RIGHT, 1, -4",
    })
    void integerArithmetic(long a, Op op, long b, long result) {
        assertEquals(result, Value.apply(op, Value.ofInt(a), Value.ofInt(b)).asLong());
    }

    @Test
    void integerDivisionByAConstantZeroIsRefused() {
        // A shot evaluates it to 0 (Expression); known when read, it is a mistake to report.
        assertThrows(IllegalArgumentException.class,
                () -> Value.apply(Op.DIV, Value.ofInt(1), Value.ofInt(0)));
        assertThrows(IllegalArgumentException.class,
                () -> Value.apply(Op.MOD, Value.of(Expression.clbit(0)), Value.ofInt(0)));
        assertTrue(Double.isNaN(Value.apply(Op.DIV, Value.ofReal(0), Value.ofInt(0))
                .asDouble()));
    }

    @ParameterizedTest
    @CsvSource({
        // value, kind, width, result: int[8] wraps two's complement, uint[3] modulo 8, float
        // to int truncates toward zero, bool is non-zero.
        "260, INT, 8, 4",
        "200, INT, 8, -56",
        "9, UINT, 3, 1",
        "-1, UINT, 4, 15",
        "2.9, INT, 64, 2",
        "-2.9, INT, 64, -2",
        "0.5, BOOL, 1, 1",
    })
    void conversions(double value, Syntax.Kind kind, int width, long result) {
        Value v = value == Math.rint(value) ? Value.ofInt((long) value) : Value.ofReal(value);
        assertEquals(result, v.convert(kind, width).asLong());
    }

    @Test
    void anglesReduceToOneTurn() {
        // 7 - 2π, and -1 + 2π: the reduction of Circuit.Variable.convert.
        assertEquals(7 - 2 * Math.PI, Value.ofReal(7).convert(Syntax.Kind.ANGLE, 64)
                .asDouble(), 1e-15);
        assertEquals(2 * Math.PI - 1, Value.ofReal(-1).convert(Syntax.Kind.ANGLE, 64)
                .asDouble(), 1e-15);
    }
}
