package dev.qsim.kernel;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.util.Optional;

import org.junit.jupiter.api.Test;

/**
 * The choice between vector and scalar loops ({@link Lanes}). The build runs the suite twice,
 * with the system property {@code qsim.test.lanes} saying which loops that run must find
 * ({@code scalar}: the JVM does not resolve {@code jdk.incubator.vector}; {@code vector}: it
 * does), so a run meant for the vector loops cannot pass on the scalar ones unnoticed. The
 * failure paths (module absent, a class that does not link, a check that fails) are exercised
 * directly. Expected values are the loader's documented behaviour (common practice for a
 * plug-in loader: every failure falls back and says why, once).
 */
class LanesTest {
    @Test
    void theRunFindsTheLoopsItWasStartedFor() {
        String expected = System.getProperty("qsim.test.lanes");
        assumeTrue(expected != null, "run outside the build: no expectation given");
        if (expected.equals("vector")) {
            assertNotNull(Lanes.kernels(), Lanes.describe());
            assertTrue(Lanes.describe().startsWith("vector ("), Lanes.describe());
            assertNotNull(Amplitudes.allocate(3).lanes);
        } else {
            assertEquals("scalar", expected);
            assertNull(Lanes.kernels(), Lanes.describe());
            assertTrue(Lanes.describe().startsWith("scalar ("), Lanes.describe());
            assertNull(Amplitudes.allocate(3).lanes);
        }
        // The public description is the loader's.
        assertEquals(Lanes.describe(), dev.qsim.Simulator.kernels());
    }

    @Test
    void withoutTheModuleTheNoticeSaysHowToEnableTheVectorLoops() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        Lanes.Choice c = Lanes.choose(Optional.empty(), Lanes.IMPLEMENTATION, print(out));
        assertNull(c.kernels);
        String notice = out.toString(StandardCharsets.UTF_8);
        assertEquals(1, notice.lines().count(), notice);
        assertTrue(notice.contains("--add-modules jdk.incubator.vector"), notice);
        assertTrue(notice.contains("-Dqsim.vector.quiet=true"), notice);
        assertTrue(c.description.contains("not present"), c.description);

        // Silent when asked to be.
        Lanes.Choice quiet = Lanes.choose(Optional.empty(), Lanes.IMPLEMENTATION, null);
        assertNull(quiet.kernels);
    }

    @Test
    void aClassThatIsMissingFallsBackAndNamesTheProblem() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        // A module that is present (java.base stands in: the loader only adds a read edge).
        Lanes.Choice c = Lanes.choose(Optional.of(Object.class.getModule()),
                "dev.qsim.kernel.NoSuchVectorKernels", print(out));
        assertNull(c.kernels);
        String notice = out.toString(StandardCharsets.UTF_8);
        assertEquals(1, notice.lines().count(), notice);
        assertTrue(notice.contains("ClassNotFoundException"), notice);
    }

    /**
     * What a JDK whose incubating API lacks a method does: the first call of that method throws
     * {@link NoSuchMethodError}. The loader's check calls every loop, so the error comes at load
     * time, and the library falls back.
     */
    static final class Mismatched extends ScalarLoops {
        @Override
        void pairs(double[] u, int uo, double[] v, int vo, int count, double[] m, int kind) {
            throw new NoSuchMethodError("'jdk.incubator.vector.DoubleVector"
                    + " jdk.incubator.vector.DoubleVector.mul(double)'");
        }
    }

    /** Loops that compute one element wrong: the check must refuse them. */
    static final class Wrong extends ScalarLoops {
        @Override
        void scale(double[] psi, int from, int to, double dr, double di) {
            super.scale(psi, from, to, dr, di);
            psi[from] += 1e-9;
        }
    }

    @Test
    void aLinkageErrorOrAFailedCheckFallsBackToScalarLoops() {
        for (Class<?> type : new Class<?>[] {Mismatched.class, Wrong.class}) {
            ByteArrayOutputStream out = new ByteArrayOutputStream();
            Lanes.Choice c = Lanes.choose(Optional.of(Object.class.getModule()), type.getName(),
                    print(out));
            assertNull(c.kernels, type.getName());
            String notice = out.toString(StandardCharsets.UTF_8);
            assertEquals(1, notice.lines().count(), notice);
            String expected = type == Mismatched.class ? "NoSuchMethodError"
                    : "IllegalStateException: the vector loop for";
            assertTrue(notice.contains(expected), notice);
            assertTrue(c.description.startsWith("scalar ("), c.description);
        }
    }

    @Test
    void correctLoopsPassTheCheck() {
        // The scalar formulas themselves, through the interface: the check must accept them.
        Lanes.Choice c = Lanes.choose(Optional.of(Object.class.getModule()),
                ScalarLoops.class.getName(), null);
        assertNotNull(c.kernels, c.description);
    }

    @Test
    void thePropertyTakesAutoOrOffAndRefusesAnythingElse() {
        assertTrue(Lanes.vectorAllowed(null));
        assertTrue(Lanes.vectorAllowed("auto"));
        assertTrue(Lanes.vectorAllowed(" auto "));
        assertFalse(Lanes.vectorAllowed("off"));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Lanes.vectorAllowed("of"));
        assertTrue(e.getMessage().contains("qsim.vector") && e.getMessage().contains("'of'"),
                e.getMessage());
    }

    private static PrintStream print(ByteArrayOutputStream out) {
        return new PrintStream(out, true, StandardCharsets.UTF_8);
    }
}
