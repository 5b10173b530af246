package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.stream.Collectors;

import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

import dev.qsim.Operator;

class MatrixProductReportTest {

    private static String[] run(String... args) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int status = MatrixProductReport.run(args, new PrintStream(out, true,
                StandardCharsets.UTF_8), new PrintStream(err, true, StandardCharsets.UTF_8));
        return new String[] {Integer.toString(status), out.toString(StandardCharsets.UTF_8),
            err.toString(StandardCharsets.UTF_8)};
    }

    @Test
    void theSlopeOfAnExactPowerLawIsItsExponent() {
        // log y = log c + k log x exactly, so least squares returns k (common practice).
        double[] x = {8, 16, 32, 64};
        double[] y = new double[x.length];
        for (int i = 0; i < x.length; i++) {
            y[i] = 0.25 * Math.pow(x[i], 3);
        }
        assertEquals(3, MatrixProductReport.slope(x, y), 1e-12);
    }

    @Test
    void randomGatesAreUnitary() {
        // Mezzadri 2007: Gram-Schmidt on Gaussian columns gives orthonormal columns.
        Operator u = MatrixProductReport.randomUnitary(RandomSource.XO_RO_SHI_RO_128_PP
                .create(3));
        assertTrue(u.isUnitary(1e-12));
    }

    @Test
    void aSmallRunPrintsOneRowPerBondDimensionTheFitAndTheBrickwork() {
        String[] r = run("--chis", "2,4,8", "--fit-from", "2", "--chain-qubits", "8",
                "--millis", "10", "--qubits", "12", "--depth", "4", "--bond-limit", "2",
                "--runs", "1");
        assertEquals("0", r[0], r[2]);
        List<String> rows = r[1].lines().filter(l -> !l.startsWith("#")).skip(1)
                .collect(Collectors.toList());
        assertEquals(3, rows.size(), r[1]);
        for (int k = 0; k < 3; k++) {
            String[] f = rows.get(k).split(",");
            assertEquals(2 << k, Integer.parseInt(f[0]));
            assertTrue(Double.parseDouble(f[1]) > 0, rows.get(k));
        }
        assertTrue(r[1].contains("grows as chi^"), r[1]);
        // 12 qubits, 4 layers: 6 + 5 + 6 + 5 gates; bond limit 2 truncates.
        assertTrue(r[1].contains("depth 4, 22 two-qubit gates, bond limit 2"), r[1]);
        assertTrue(r[1].contains("largest bond 2,"), r[1]);
    }

    @Test
    void badOptionsAreRefusedWithTheirValues() {
        String[] r = run("--chis", "4,x");
        assertEquals("1", r[0]);
        assertTrue(r[2].contains("'x'"), r[2]);
        r = run("--chis", "64", "--chain-qubits", "8");
        assertEquals("1", r[0]);
        assertTrue(r[2].contains("bond dimension 64 needs at least 14 chain qubits"), r[2]);
        r = run("--depth", "0");
        assertTrue(r[2].contains("[1, 10000] but was 0"), r[2]);
        r = run("--speed", "3");
        assertTrue(r[2].contains("unknown option '--speed'"), r[2]);
    }
}
