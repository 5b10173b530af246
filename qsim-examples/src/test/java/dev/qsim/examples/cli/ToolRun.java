package dev.qsim.examples.cli;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;

import dev.qsim.examples.Main;

/** One run of the launcher with captured streams, so tests read the output and never print. */
final class ToolRun {
    final int code;
    final String out;
    final String err;

    ToolRun(String... args) {
        ByteArrayOutputStream o = new ByteArrayOutputStream();
        ByteArrayOutputStream e = new ByteArrayOutputStream();
        code = Main.run(args, new PrintStream(o, true, StandardCharsets.UTF_8),
                new PrintStream(e, true, StandardCharsets.UTF_8));
        out = o.toString(StandardCharsets.UTF_8);
        err = e.toString(StandardCharsets.UTF_8);
    }

    @Override
    public String toString() {
        return "exit " + code + "\nout:\n" + out + "\nerr:\n" + err;
    }
}
