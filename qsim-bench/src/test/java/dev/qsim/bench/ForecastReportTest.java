package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.junit.jupiter.api.Test;

/** Tests of the forecast report's result lines and summary. */
class ForecastReportTest {

    @Test
    void aRowCrossesBetweenJvmsExactly() {
        // Double.toString prints as many digits as are needed to tell the value from every
        // other double, so Double.parseDouble gives back the same double (Java SE API
        // specification, Double.toString(double)); 0.1 and 1/3 have no finite binary form.
        ForecastReport.Row r = new ForecastReport.Row("rotations single n=18", "AMPLITUDES", 18,
                0.1, 1.0 / 3, 3_686_248L, Long.MAX_VALUE);
        String line = ForecastReport.rowLine(r);
        assertEquals(r, ForecastReport.parseRow(line));
        assertEquals(8, line.split("\t").length, line);
    }

    @Test
    void aLineThatIsNoRowIsNamed() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> ForecastReport.parseRow("WARNING: Using incubator modules"));
        assertTrue(e.getMessage().contains("WARNING: Using incubator modules"), e.getMessage());
        assertThrows(NumberFormatException.class, () -> ForecastReport.parseRow(
                "row\tx\tAMPLITUDES\tsixteen\t1\t1\t1\t1"));
    }

    @Test
    void summaryCountsTheBandAndTheLargestRatioEitherWay() {
        // Worked by hand: ratios (predicted / measured) 1.0, 1.25 and 0.5; the band is
        // [0.7, 1.3], so two of three are in it, and 0.5 is a factor of 2 the other way.
        List<ForecastReport.Row> rows = List.of(
                new ForecastReport.Row("a", "AMPLITUDES", 16, 1.0, 1.0, 32L << 20, 32L << 20),
                new ForecastReport.Row("b", "AMPLITUDES", 16, 1.25, 1.0, 40L << 20, 50L << 20),
                new ForecastReport.Row("c", "TABLEAU", 20, 0.5, 1.0, 1L << 10, 0));
        String s = ForecastReport.summary(rows);
        assertTrue(s.startsWith("2 of 3 runs (67 %) within ±30 % in time"), s);
        assertTrue(s.contains("largest ratio either way 2.00 (c)"), s);
        // Memory over the runs predicted at 16 MiB or more: |40 - 50| / 50 = 20 %.
        assertTrue(s.contains("largest error 20.0 % over the 2 runs"), s);
    }
}
