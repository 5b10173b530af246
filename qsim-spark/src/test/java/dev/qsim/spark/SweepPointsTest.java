package dev.qsim.spark;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.RandomAccessFile;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Grids and lists of sweep points, and the points file reader against hostile input. */
class SweepPointsTest {
    @TempDir
    Path dir;

    private static void assertRefused(String expectedPart, Runnable r) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, r::run);
        assertTrue(e.getMessage().contains(expectedPart), e.getMessage());
    }

    private Path file(String text) throws IOException {
        Path f = Files.createTempFile(dir, "points", ".csv");
        Files.writeString(f, text, StandardCharsets.UTF_8);
        return f;
    }

    @Test
    void gridPointsAreEvenlySpacedInRowMajorOrder() {
        // Evenly spaced values with both ends included (common practice: MATLAB's and NumPy's
        // linspace), the last axis fastest (row-major order, common practice).
        SweepPoints g = SweepPoints.grid(List.of(SweepPoints.Axis.parse("a=-1:1:5"),
                SweepPoints.Axis.parse("b = 0.1"), SweepPoints.Axis.parse("c=0:3.3:4")));
        assertEquals(20, g.size());
        assertEquals(List.of("a", "b", "c"), g.names());
        assertTrue(g.isGrid());
        for (long i = 0; i < 20; i++) {
            double[] p = g.point(i);
            assertEquals(-1 + 0.5 * (i / 4), p[0], 1e-15);
            assertEquals(0.1, p[1], 0.0);
            assertEquals(1.1 * (i % 4), p[2], 1e-15);
        }
        assertEquals(3.3, g.point(3)[2], 0.0);
        assertEquals(1.0, g.point(19)[0], 0.0);
        assertEquals("grid 5 x 1 x 4 of [a, b, c]", g.toString());
        assertThrows(IndexOutOfBoundsException.class, () -> g.point(20));
    }

    @Test
    void badAxesAndGridsAreRefusedByValue() {
        assertRefused("name=from:to:count", () -> SweepPoints.Axis.parse("theta"));
        assertRefused("4 parts", () -> SweepPoints.Axis.parse("t=0:1:2:3"));
        assertRefused("'x'", () -> SweepPoints.Axis.parse("t=x:1:3"));
        assertRefused("'NaN'", () -> SweepPoints.Axis.parse("t=NaN:1:3"));
        assertRefused("'0x1p3'", () -> SweepPoints.Axis.parse("t=0x1p3:1:3"));
        assertRefused("'1d'", () -> SweepPoints.Axis.parse("t=1d:2:3"));
        assertRefused("overflows", () -> SweepPoints.Axis.parse("t=1e400:2:3"));
        assertRefused("'2.5'", () -> SweepPoints.Axis.parse("t=0:1:2.5"));
        assertRefused("was 0", () -> SweepPoints.Axis.parse("t=0:1:0"));
        assertRefused("overflows a double", () -> SweepPoints.Axis.parse("t=-1e308:1e308:3"));
        assertRefused("1 value", () -> new SweepPoints.Axis("t", 0, 1, 1));
        assertRefused("'2t'", () -> SweepPoints.Axis.parse("2t=0:1:3"));
        assertRefused("taken by the results", () -> SweepPoints.Axis.parse("Value=0:1:3"));
        assertRefused("taken by the results", () -> SweepPoints.Axis.parse("gradient_x=0"));
        assertRefused("given twice", () -> SweepPoints.grid(List.of(
                SweepPoints.Axis.parse("t=0:1:3"), SweepPoints.Axis.parse("T=0:1:3"))));
        assertRefused("more than 2147483648 points", () -> SweepPoints.grid(List.of(
                SweepPoints.Axis.parse("a=0:1:65536"), SweepPoints.Axis.parse("b=0:1:65536"))));
        assertRefused("1 to 1024 axes", () -> SweepPoints.grid(List.of()));
    }

    @Test
    void listsAreCopiedAndChecked() {
        double[][] values = {{1, 2}, {3, 4}};
        SweepPoints l = SweepPoints.list(List.of("x", "y"), values);
        values[0][0] = 99;
        assertArrayEquals(new double[] {1, 2}, l.point(0));
        assertEquals(2, l.size());
        assertRefused("point 1 has 1 value(s)", () -> SweepPoints.list(List.of("x", "y"),
                new double[][] {{1, 2}, {3}}));
        assertRefused("must be finite but was NaN", () -> SweepPoints.list(List.of("x"),
                new double[][] {{Double.NaN}}));
        assertRefused("at least one point", () -> SweepPoints.list(List.of("x"),
                new double[0][]));
    }

    @Test
    void aPointsFileIsReadInOrder() throws IOException {
        Path f = file("# landscape points\ntheta, phi\n0.5,-1\n\n 1e-3 , 2\n.25,+3.\n");
        SweepPoints p = SweepPoints.read(f);
        assertEquals(List.of("theta", "phi"), p.names());
        assertEquals(3, p.size());
        assertArrayEquals(new double[] {0.5, -1}, p.point(0));
        assertArrayEquals(new double[] {1e-3, 2}, p.point(1));
        assertArrayEquals(new double[] {0.25, 3}, p.point(2));
        // A byte-order mark is allowed.
        assertEquals(1, SweepPoints.read(file("\uFEFFa\n1\n")).size());
    }

    @Test
    void hostilePointsFilesAreRefusedWithTheLine() throws IOException {
        Path f1 = file("theta,phi\n0.5,1\n0.7\n");
        assertRefused("line 3: 1 field(s)", () -> read(f1));
        Path f2 = file("theta,phi\n0.5,abc\n");
        assertRefused("line 2, column 2 (phi)", () -> read(f2));
        Path f3 = file("theta,theta\n1,2\n");
        assertRefused("given twice", () -> read(f3));
        Path f4 = file("");
        assertRefused("no header", () -> read(f4));
        Path f5 = file("theta\n# nothing\n");
        assertRefused("no points", () -> read(f5));
        Path f6 = file("theta,point\n1,2\n");
        assertRefused("taken by the results", () -> read(f6));
        Path f7 = file("theta\nInfinity\n");
        assertRefused("'Infinity'", () -> read(f7));
        Path bad = dir.resolve("latin1.csv");
        Files.write(bad, new byte[] {'t', '\n', (byte) 0xE9, '\n'});
        assertRefused("not UTF-8", () -> read(bad));
        Path huge = dir.resolve("huge.csv");
        try (RandomAccessFile r = new RandomAccessFile(huge.toFile(), "rw")) {
            r.setLength(Text.MAX_POINTS_FILE_BYTES + 1); // sparse: nothing is written
        }
        assertRefused("larger than the 67108864 bytes allowed", () -> read(huge));
    }

    private static void read(Path f) {
        try {
            SweepPoints.read(f);
        } catch (IOException e) {
            throw new AssertionError(e);
        }
    }
}
