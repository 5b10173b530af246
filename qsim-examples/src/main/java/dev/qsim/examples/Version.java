package dev.qsim.examples;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.Properties;

/**
 * The version of qsim, set in one place: the project version of the Maven build, which resource
 * filtering writes into {@code dev/qsim/examples/version.properties}. The launcher's
 * {@code --version} and every tool command's {@code --version} print {@link #text()}.
 */
public final class Version {
    private static final String RESOURCE = "version.properties";

    private Version() {
    }

    /**
     * Returns the project version, such as {@code 0.1.0-SNAPSHOT}.
     *
     * @return the version
     * @throws IllegalStateException if the build did not write the version (the resource is
     *     missing or unfiltered, as when the classes are compiled outside Maven)
     */
    public static String number() {
        Properties p = new Properties();
        try (InputStream in = Version.class.getResourceAsStream(RESOURCE)) {
            if (in == null) {
                throw new IllegalStateException("the resource " + RESOURCE + " is missing;"
                        + " build with Maven");
            }
            p.load(in);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        String v = p.getProperty("version", "");
        if (v.isEmpty() || v.contains("${")) {
            throw new IllegalStateException("the resource " + RESOURCE + " holds no version ('"
                    + v + "'); build with Maven, whose resource filtering writes it");
        }
        return v;
    }

    /**
     * Returns the line {@code --version} prints: {@code "qsim " + }{@link #number()}.
     *
     * @return the line
     */
    public static String text() {
        return "qsim " + number();
    }
}
