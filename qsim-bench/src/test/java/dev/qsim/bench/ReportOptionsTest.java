package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.Precision;

/** The report's command line (picocli): defaults, both forms, one-line errors, help. */
class ReportOptionsTest {
    private static final List<String> KERNELS = List.of("dense", "diagonal", "permutation",
        "controlled");
    private static final List<String> THREE = List.of("low", "mid", "high");

    /** Reads options that must be accepted. */
    static ReportSettings parse(int defaultThreads, String... args) {
        return ReportOptions.parse(args, defaultThreads).orElseThrow();
    }

    @Test
    void defaultsWhenNoOptions() {
        assertEquals(new ReportSettings(10, 26, 3, KERNELS, THREE, 300,
            List.of(20, 21, 22, 23, 24, 25, 26), null, null, false, List.of(Precision.DOUBLE),
            false, null),
            parse(3));
        // The fusion comparison starts at n = 20 by default, so a small range has none.
        assertEquals(List.of(), parse(1, "--max", "19").circuitQubits());
        // The default thread count is capped at the core's limit.
        assertEquals(256, parse(1000).threads());
    }

    @Test
    void everyOptionInBothForms() {
        ReportSettings o = parse(1, "--min", "4", "--max=7", "--threads", "2",
            "--kernels=diagonal,dense", "--targets", "all,low", "--millis", "15", "--circuit",
            "on", "--circuit-qubits=7,5", "--csv", "a.csv", "--svg=b.svg", "--noise", "on",
            "--precision=both", "--mps=on", "--reference", "c.txt");
        assertEquals(new ReportSettings(4, 7, 2, List.of("diagonal", "dense"),
            List.of("all", "low"), 15, List.of(5, 7), Path.of("a.csv"), Path.of("b.svg"), true,
            List.of(Precision.DOUBLE, Precision.SINGLE), true, Path.of("c.txt")), o);
        // --help asks for the usage instead of settings.
        assertEquals(Optional.empty(), ReportOptions.parse(new String[] {"--help"}, 1));
        assertEquals(List.of(), parse(1, "--max", "22", "--circuit", "off").circuitQubits());
        assertEquals(KERNELS, parse(1, "--kernels", "all").kernels());
        // A single size needs no controlled CNOT below 2 qubits if controlled is left out.
        assertEquals(1, parse(1, "--min", "1", "--kernels", "dense").min());
        // A value starting with @ is a file name, not a file of more arguments.
        assertEquals(Path.of("@x.csv"), parse(1, "--csv", "@x.csv").csv());
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        // arguments (space separated) | text the message must hold
        "--size 3                  | unknown option '--size'; allowed: --min, --max, --threads",
        "fast                      | unknown option 'fast'",
        "--min                     | Missing required parameter for option '--min' (N)",
        "--min --max 4             | Expected parameter for option '--min' but found '--max'",
        "--min abc                 | --min must be a whole number in [1, 40] but was 'abc'",
        "--max 41                  | --max must be in [1, 40] but was 41",
        "--min 0                   | --min must be in [1, 40] but was 0",
        "--threads 0               | --threads must be in [1, 256] but was 0",
        "--threads 257             | --threads must be in [1, 256] but was 257",
        "--millis 0                | --millis must be in [1, 600000] but was 0",
        "--min 12 --max 10         | --min 12 is greater than --max 10",
        "--kernels dense,cz        | --kernels 'cz' is not known; allowed: dense, diagonal,"
            + " permutation, controlled",
        "--kernels dense,,x        | --kernels '' is not known",
        "--kernels dense,dense     | --kernels lists 'dense' twice in 'dense,dense'",
        "--targets top             | --targets 'top' is not known; allowed: low, mid, high, all",
        "--min 1                   | --min 1 is too small for the controlled kernel",
        "--circuit yes             | --circuit must be on or off but was 'yes'",
        "--noise maybe             | --noise must be on or off but was 'maybe'",
        "--circuit-qubits 5,x      | --circuit-qubits must be a whole number in [1, 40] but was"
            + " 'x'",
        "--circuit-qubits 9        | --circuit-qubits 9 is outside --min..--max = [10, 26]",
        "--circuit-qubits 12,12    | --circuit-qubits lists 12 twice in '12,12'",
        "--circuit off --circuit-qubits 12 | --circuit-qubits 12 contradicts --circuit off",
        "--csv x --svg x           | --csv and --svg name the same file 'x'",
        "--min 4 --min 5           | option '--min' (N) should be specified only once",
        "--help=yes                | Invalid value for option '--help': 'yes'",
        "--precision float         | --precision must be double, single or both but was 'float'",
        "--precision Single        | --precision must be double, single or both but was 'Single'",
        "--precision=              | --precision must be double, single or both but was ''",
        "--precision double,single | --precision must be double, single or both but was"
            + " 'double,single'",
        "--precision               | Missing required parameter for option '--precision' (P)",
        "--precision single --precision both | option '--precision' (P) should be specified"
            + " only once",
        "--min 4 --max 6 extra     | unknown option 'extra'; allowed: --min, --max, --threads,"
            + " --kernels, --targets, --millis, --circuit, --circuit-qubits, --noise, --mps,"
            + " --precision, --csv, --svg, --reference, --help",
        "--csv r --reference r     | --reference names the file 'r' that --csv would overwrite",
        "--svg r --reference r     | --reference names the file 'r' that --svg would overwrite",
        "--reference=              | --reference needs a file name but was empty",
    })
    void badOptionsAreNamed(String args, String expected) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
            () -> ReportOptions.parse(args.trim().split(" +"), 1));
        assertTrue(e.getMessage().contains(expected), e.getMessage());
        assertFalse(e.getMessage().contains("\n") || e.getMessage().contains("\r"),
            e.getMessage());
    }

    @Test
    void settingsCountStepsAndTheWidestPrecision() {
        // Probe (2) and the two kernel rows: precision counts once.
        assertEquals(4, parse(1, "--min", "5", "--max", "5", "--precision", "single",
            "--kernels", "dense", "--targets", "low,high").steps());
        // Both precisions: probe (2), two kernel rows and two circuit rows in each.
        assertEquals(2 + 2 * 2 + 2 * 2, parse(1, "--min", "5", "--max", "5", "--precision",
            "both", "--kernels", "dense", "--targets", "low,high", "--circuit-qubits", "5")
            .steps());
        // Two sizes of probe (2) and one kernel row, then the noise rows: density matrices of
        // 6..min(14, max) = 6..14 qubits (9) and trajectories of max(20, min)..max (2).
        assertEquals(2 * (2 + 1) + 9 + 2, parse(1, "--min", "20", "--max", "21", "--kernels",
            "dense", "--targets", "low", "--circuit", "off", "--noise", "on").steps());
        // The check takes the widest precision measured: both needs the double state.
        assertEquals(8, parse(1, "--max", "31", "--precision", "single")
            .widestBytesPerAmplitude());
        assertEquals(16, parse(1, "--max", "31", "--precision", "both")
            .widestBytesPerAmplitude());
        assertEquals(16, parse(1, "--max", "31").widestBytesPerAmplitude());
    }

    @Test
    void badOptionsExitOneWithOneLineAndNoCsv() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        assertEquals(1, run(out, err, "--threads", "many"));
        assertEquals("", out.toString(StandardCharsets.UTF_8));
        // One line: what is wrong and where to look, not the whole usage.
        assertEquals(List.of("error: --threads must be a whole number in [1, 256] but was 'many';"
            + " see --help"), err.toString(StandardCharsets.UTF_8).lines().toList());
        err.reset();
        assertEquals(1, run(out, err, "--min", "3", "--max", "3", "--size", "4"));
        List<String> lines = err.toString(StandardCharsets.UTF_8).lines().toList();
        assertEquals(1, lines.size(), lines.toString());
        assertTrue(lines.get(0).startsWith("error: unknown option '--size'; allowed: --min,"),
            lines.get(0));
        assertTrue(lines.get(0).endsWith("; see --help"), lines.get(0));
        assertEquals("", out.toString(StandardCharsets.UTF_8));
    }

    @Test
    void helpGoesToStandardOutputAndExitsZero() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        assertEquals(0, run(out, err, "--help"));
        String help = out.toString(StandardCharsets.UTF_8);
        assertTrue(help.startsWith("usage: java -Xmx8g -cp qsim-bench.jar"
            + " dev.qsim.bench.ScalingReport [options]"), help);
        assertTrue(help.contains(CsvOutput.HEADER_START) && help.contains(CsvOutput.HEADER_END),
                help);
        assertEquals(CsvOutput.HEADER, CsvOutput.HEADER_START + CsvOutput.HEADER_END);
        // Every option with its default and range, and the exit status.
        for (String text : List.of("--min=N", "(default 10; 1..40)", "--max=N",
                "(default 26; 1..40)", "--threads=T", "(default: available processors; 1..256)",
                "--kernels=K,K,...", "of dense, diagonal, permutation, controlled (default all)",
                "--targets=W,W,...", "(default low,mid,high)", "--millis=M",
                "(default 300; 1..600000)", "--circuit=on|off",
                "time a 20-layer circuit with fusion on and off (default on, at n >= 20)",
                "--circuit-qubits=N,N,...", "--noise=on|off", "density matrix of 6..14 qubits",
                "--precision=P", "double, single or both (default double)", "--csv=FILE",
                "--svg=FILE", "--reference=FILE", "fraction_of_reference", "not a ceiling",
                "--help", "--name value or --name=value",
                "Exit status: 0 done, 1 bad options, reference or unwritable file, 2 not enough"
                    + " heap.")) {
            assertTrue(help.contains(text), text + " in\n" + help);
        }
        assertEquals(ReportOptions.usage(), help);
        assertFalse(err.size() > 0, () -> err.toString(StandardCharsets.UTF_8));
    }

    private static int run(ByteArrayOutputStream out, ByteArrayOutputStream err, String... args) {
        try (PrintStream o = new PrintStream(out, true, StandardCharsets.UTF_8);
             PrintStream e = new PrintStream(err, true, StandardCharsets.UTF_8)) {
            return ScalingReport.run(args, o, e);
        }
    }
}
