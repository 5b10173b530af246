package dev.qsim.kernel;

import java.io.PrintStream;
import java.util.Optional;

/**
 * Chooses, once per JVM, between the vector kernels and the scalar ones. The vector kernels use
 * the incubating Vector API (module {@code jdk.incubator.vector}), which the JVM resolves only
 * when asked: {@code java --add-modules jdk.incubator.vector ...}. They are used when that module
 * is present, the system property {@value #PROPERTY} is not {@code off}, the processor has
 * vectors of at least two doubles, and the implementation links and passes {@link LaneCheck} on
 * this JDK (the incubating API changes between releases). Otherwise every loop runs scalar, with
 * the same results, and one line on standard error says so and how to enable the fast path,
 * once, unless {@value #QUIET} is {@code true}; forcing scalar kernels prints nothing.
 *
 * <p>On the module path the library's module does not declare the dependency (a
 * {@code requires static} would make every build of the library see the incubating module):
 * the loader adds the read edge at run time ({@link Module#addReads}) before it loads the
 * implementation class reflectively. Thread-safe. Internal.
 */
public final class Lanes {
    /** System property: {@code auto} (the default) or {@code off} (scalar kernels only). */
    public static final String PROPERTY = "qsim.vector";
    /** System property: {@code true} hides the one-line notice about scalar kernels. */
    public static final String QUIET = "qsim.vector.quiet";
    /** The incubating module the vector kernels need. */
    static final String MODULE = "jdk.incubator.vector";
    /** The implementation, compiled from {@code src/vector/java}. */
    static final String IMPLEMENTATION = "dev.qsim.kernel.VectorLaneKernels";

    private static LaneKernels chosen;
    private static String description;
    private static boolean done;
    /** Set while the check runs: its own storages use the scalar loops until it is decided. */
    private static boolean deciding;

    private Lanes() {
    }

    /**
     * Returns the vector kernels, or null when the scalar loops run; decides on the first call.
     *
     * @return the kernels, or null
     * @throws IllegalArgumentException if {@value #PROPERTY} is neither {@code auto} nor
     *     {@code off}
     */
    static synchronized LaneKernels kernels() {
        if (!done && !deciding) {
            deciding = true;
            try {
                decide();
            } finally {
                deciding = false;
            }
        }
        return chosen;
    }

    private static void decide() {
        if (!vectorAllowed(System.getProperty(PROPERTY))) {
            chosen = null;
            description = "scalar (" + PROPERTY + "=off)";
        } else {
            Choice c = choose(ModuleLayer.boot().findModule(MODULE), IMPLEMENTATION,
                    Boolean.getBoolean(QUIET) ? null : System.err);
            chosen = c.kernels;
            description = c.description;
        }
        done = true;
    }

    /**
     * Reads the value of {@value #PROPERTY}.
     *
     * @param value the property's value, or null when unset
     * @return whether vector kernels may be used ({@code auto}, the default), or not
     *     ({@code off})
     * @throws IllegalArgumentException for any other value
     */
    static boolean vectorAllowed(String value) {
        String mode = value == null ? "auto" : value.trim();
        if (!mode.equals("auto") && !mode.equals("off")) {
            throw new IllegalArgumentException("system property " + PROPERTY
                    + " must be auto or off but was '" + value + "'");
        }
        return mode.equals("auto");
    }

    /**
     * Returns log2 of the amplitudes one vector of the vector loops holds (qubits below it are
     * worked inside a vector, which multi-target gates pay for with lane permutations), or 0
     * when the loops are scalar.
     *
     * @return the amplitude log of a vector, or 0
     */
    public static synchronized int amplitudeLog() {
        LaneKernels k = kernels();
        return k == null ? 0 : k.amplitudeLog();
    }

    /**
     * Returns which kernels run, in one line: the vector shape and lanes, or why the loops are
     * scalar.
     *
     * @return the description
     */
    public static synchronized String describe() {
        kernels();
        return description;
    }

    /** The outcome of loading: kernels (or null) and a description. */
    static final class Choice {
        final LaneKernels kernels;
        final String description;

        Choice(LaneKernels kernels, String description) {
            this.kernels = kernels;
            this.description = description;
        }
    }

    /**
     * Loads and checks an implementation when the vector module is present; on any failure
     * returns a scalar choice and prints the notice to {@code notice} (null: silent).
     *
     * @param vector the module {@value #MODULE} in the boot layer, if present
     * @param className the implementation class
     * @param notice where the one-line notice goes, or null
     * @return the choice
     */
    static Choice choose(Optional<Module> vector, String className, PrintStream notice) {
        if (vector.isEmpty()) {
            say(notice, notice("scalar kernels in use; for the vector kernels (several times"
                    + " faster in cache) start java with --add-modules " + MODULE));
            return new Choice(null, "scalar (module " + MODULE + " not present)");
        }
        String why;
        try {
            Lanes.class.getModule().addReads(vector.get());
            LaneKernels k = (LaneKernels) Class.forName(className).getDeclaredConstructor()
                    .newInstance();
            LaneCheck.verify(k);
            return new Choice(k, "vector (" + k.describe() + ")");
        } catch (ReflectiveOperationException | LinkageError | RuntimeException e) {
            why = e.getClass().getSimpleName() + (e.getMessage() == null ? ""
                    : ": " + firstLine(e.getMessage()));
        }
        say(notice, notice("scalar kernels in use; the vector kernels cannot run on this JDK or"
                + " processor (" + why + ")"));
        return new Choice(null, "scalar (the vector kernels failed to load: " + why + ")");
    }

    /**
     * The notice line: the message, then how to hide it.
     *
     * @param message what happened and what to do
     * @return the line
     */
    static String notice(String message) {
        return "qsim: " + message + "; -D" + QUIET + "=true hides this line";
    }

    private static void say(PrintStream out, String line) {
        if (out != null) {
            out.println(line);
        }
    }

    private static String firstLine(String s) {
        int nl = s.indexOf('\n');
        String line = nl < 0 ? s : s.substring(0, nl);
        return line.length() > 160 ? line.substring(0, 160) + "..." : line;
    }
}
