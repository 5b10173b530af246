package dev.qsim.observable;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;

import dev.qsim.Gates;
import dev.qsim.Operator;

class ObservableTest {

    private static double maxDiff(Operator a, Operator b) {
        double m = 0;
        for (int r = 0; r < a.dimension(); r++) {
            for (int c = 0; c < a.dimension(); c++) {
                m = Math.max(m, a.get(r, c).subtract(b.get(r, c)).abs());
            }
        }
        return m;
    }

    private static Operator scaled(Operator a, double w) {
        Complex[][] rows = new Complex[a.dimension()][a.dimension()];
        for (int r = 0; r < rows.length; r++) {
            for (int c = 0; c < rows.length; c++) {
                rows[r][c] = a.get(r, c).multiply(w);
            }
        }
        return Operator.of(rows);
    }

    private static Operator sum(Operator a, Operator b) {
        Complex[][] rows = new Complex[a.dimension()][a.dimension()];
        for (int r = 0; r < rows.length; r++) {
            for (int c = 0; c < rows.length; c++) {
                rows[r][c] = a.get(r, c).add(b.get(r, c));
            }
        }
        return Operator.of(rows);
    }

    @Test
    void toOperatorIsTheWeightedSumOfKroneckerProducts() {
        // Reference: Σ w_k P_k built from Gates' textbook 2x2 matrices with Operator.tensor
        // (a.tensor(b): b on the low qubits, package conventions).
        Observable h = Observable.of(0.5, "Z0 Z1").plus(-0.25, "Y1").plus(1.5, "X0 Y2")
                .plus(0.125, "I");
        Operator expected = scaled(Gates.I.tensor(Gates.Z).tensor(Gates.Z), 0.5);
        expected = sum(expected, scaled(Gates.I.tensor(Gates.Y).tensor(Gates.I), -0.25));
        expected = sum(expected, scaled(Gates.Y.tensor(Gates.I).tensor(Gates.X), 1.5));
        expected = sum(expected, scaled(Operator.identity(3), 0.125));
        assertEquals(0, maxDiff(expected, h.toOperator()), 1e-15);
        assertEquals(3, h.span());
        assertTrue(h.toOperator().isHermitian(1e-15));
    }

    @Test
    void simplificationMergesEqualProductsAndDropsZeros() {
        Observable h = Observable.builder().add(1.0, "Z0 Z1").add(2.0, "X0").add(-1.0, "ZZ")
                .add(0.5, "-X0").add(0.0, "Y3").build();
        Observable s = h.simplified();
        // 1 - 1 = 0 for Z0 Z1 (dropped), 2 - 0.5 = 1.5 for X0, Y3 had weight 0.
        assertEquals(Observable.of(1.5, "X0"), s);
        assertEquals(5, h.size());
        assertEquals(0, maxDiff(h.toOperator(4), s.toOperator(4)), 1e-15);
        Observable t = Observable.of(1e-12, "Z0").plus(1, "X1").simplified(1e-9);
        assertEquals(Observable.of(1, "X1"), t);
    }

    @Test
    void squareMatchesTheMatrixSquare() {
        // Reference: dense matrix product H·H.
        Observable h = Observable.of(0.7, "X0 X1").plus(-0.3, "Z0").plus(0.4, "Y0 Y1")
                .plus(0.2, "Z1 X2").plus(1.1, "I");
        Operator dense = h.toOperator(3);
        assertEquals(0, maxDiff(dense.times(dense), h.squared().toOperator(3)), 1e-14);
    }

    @Test
    void badWeightsAndTermsAreRefused() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Observable.of(Double.NaN, "Z0"));
        assertTrue(e.getMessage().contains("NaN") && e.getMessage().contains("Z0"), e::getMessage);
        Observable.Builder b = Observable.builder().add(1, "X0");
        e = assertThrows(IllegalArgumentException.class,
                () -> b.add(Double.POSITIVE_INFINITY, "X1"));
        assertTrue(e.getMessage().contains("Infinity"), e::getMessage);
        assertEquals(1, b.build().size());
        e = assertThrows(IllegalArgumentException.class, () -> Observable.of(1, "iZ0"));
        assertTrue(e.getMessage().contains("iZ0") && e.getMessage().contains("Hermitian"),
                e::getMessage);
        e = assertThrows(IllegalArgumentException.class,
                () -> Observable.of(1, "Z0").times(Double.NaN));
        assertTrue(e.getMessage().contains("NaN"), e::getMessage);
        e = assertThrows(IllegalArgumentException.class, () -> Observable.of(1,
                "Z5").toOperator(3));
        assertTrue(e.getMessage().contains("3"), e::getMessage);
    }
}
