package dev.qsim.examples;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;

/** A print stream that keeps what is written, so tests read the output and never print. */
final class Capture {
    private final ByteArrayOutputStream bytes = new ByteArrayOutputStream();
    private final PrintStream stream = new PrintStream(bytes, true, StandardCharsets.UTF_8);

    /** The stream to hand to the code under test. */
    PrintStream stream() {
        return stream;
    }

    /** Everything written so far. */
    String text() {
        stream.flush();
        return bytes.toString(StandardCharsets.UTF_8);
    }
}
