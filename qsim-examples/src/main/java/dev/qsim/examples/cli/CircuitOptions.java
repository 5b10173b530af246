package dev.qsim.examples.cli;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

import picocli.CommandLine.Option;

import dev.qsim.Circuit;
import dev.qsim.text.QasmReader;

/**
 * How the commands read a circuit file: the values of its {@code input} declarations, the
 * default bound of its {@code while} loops and the length of {@code dt}.
 */
final class CircuitOptions {
    @Option(names = "--input", paramLabel = "NAME=VALUE", converter = OptionValues.Input.class,
            description = "the value of an 'input' declaration of the circuit (a number;"
                    + " repeat the option for several)")
    List<OptionValues.InputValue> inputs = new ArrayList<>();
    @Option(names = "--loop-bound", paramLabel = "N", converter = OptionValues.LoopBound.class,
            description = "the most passes of a 'while' loop without its own"
                    + " @max_iterations, 1 to 1,048,576 (default 1,000)")
    Integer loopBound;
    @Option(names = "--work-budget", paramLabel = "STEPS",
            converter = OptionValues.WorkBudget.class,
            description = "the most steps of work reading the file may take (statements run,"
                    + " loop passes, register elements ...), 1 to 10^11 (default 10^7)")
    Long workBudget;
    @Option(names = "--dt", paramLabel = "SECONDS", converter = OptionValues.TimeStep.class,
            description = "the length of the time unit dt in delays, in seconds (above 0, at"
                    + " most 1)")
    Double timeStep;

    /** The reader's settings for these options. */
    QasmReader.Settings settings() {
        QasmReader.Settings s = QasmReader.Settings.defaults();
        Set<String> seen = new HashSet<>();
        for (OptionValues.InputValue in : inputs) {
            if (!seen.add(in.name())) {
                throw new IllegalArgumentException("--input: '" + in.name()
                        + "' is given twice; give each input once");
            }
            s = in.integer() ? s.withInput(in.name(), (long) in.value())
                    : s.withInput(in.name(), in.value());
        }
        if (loopBound != null) {
            s = s.withLoopBound(loopBound);
        }
        if (workBudget != null) {
            s = s.withWorkBudget(workBudget);
        }
        if (timeStep != null) {
            s = s.withTimeStep(timeStep);
        }
        return s;
    }

    /** Reads a circuit file; problems name the file and, for inputs, the option to use. */
    Circuit read(Path file) throws IOException {
        QasmReader.Settings settings = settings();
        FileChecks.requireInput(file, "a circuit file (OpenQASM 3, .qasm)");
        try {
            return QasmReader.read(file, settings);
        } catch (IllegalArgumentException e) {
            String m = e.getMessage().replaceAll(
                    "give it with QasmReader\\.Settings\\.withInput\\(\"([^\"]*)\", value\\)",
                    "give it with --input $1=VALUE").replace("give it in seconds with"
                    + " QasmReader.Settings.withTimeStep(double)", "give it in seconds with --dt")
                    .replace("QasmReader.Settings.withWorkBudget(long)", "--work-budget STEPS")
                    .replace("; raise the limit with QasmReader.Settings.withMaxFileBytes(long)",
                            " (the tool's limit)")
                    .replace("; if it is meant to be this large, raise the limit with"
                            + " QasmReader.Settings.withMaxInstructions(int)",
                            " (the tool's limit)");
            throw new IllegalArgumentException(file + ": " + m, e);
        }
    }
}
