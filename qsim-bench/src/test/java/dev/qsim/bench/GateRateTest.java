package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.Test;

/**
 * {@link GateRate} prints the C reference kernel's units: a dense gate counts 32 bytes per
 * amplitude (read and write 16, as {@code gate_bytes} in {@code shared/ceiling/ceiling.c}
 * counts them), GB are 10^9 bytes, and the summary takes the median over targets. Checked on
 * the printed lines themselves (common practice for a report: its numbers must follow from its
 * own raw figures); bad arguments exit with status 1 and say what is wrong.
 */
class GateRateTest {
    private static Map<String, String> fields(String line) {
        Map<String, String> m = new HashMap<>();
        for (String kv : line.split("\t")) {
            int eq = kv.indexOf('=');
            m.put(kv.substring(0, eq), kv.substring(eq + 1));
        }
        return m;
    }

    private static List<String> run(String... args) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int status = GateRate.run(args, new PrintStream(out, true, StandardCharsets.UTF_8),
                new PrintStream(err, true, StandardCharsets.UTF_8));
        assertEquals(0, status, err.toString(StandardCharsets.UTF_8));
        return out.toString(StandardCharsets.UTF_8).lines().toList();
    }

    @Test
    void gateLinesCountThirtyTwoBytesPerAmplitudeAndTheSummaryTakesTheMedian() {
        List<String> lines = run("gates", "6", "3", "1", "single");
        assertTrue(lines.get(0).startsWith("# kernels: "), lines.get(0));
        double[] gbs = new double[6];
        int seen = 0;
        for (String line : lines) {
            if (!line.startsWith("test=gate\t")) {
                continue;
            }
            Map<String, String> f = fields(line);
            assertEquals("single", f.get("precision"));
            double seconds = Double.parseDouble(f.get("median_s"));
            double rate = Double.parseDouble(f.get("gbs"));
            // Seconds printed to 1 ns, rates to 0.01: compare within those roundings.
            double expected = 32.0 * 64 / seconds / 1e9;
            assertEquals(expected, rate, 0.006 + expected * 0.6e-9 / seconds, line);
            gbs[Integer.parseInt(f.get("t"))] = rate;
            seen++;
        }
        assertEquals(6, seen);
        String summary = lines.stream().filter(l -> l.startsWith("test=gate_summary")).findFirst()
                .orElseThrow();
        java.util.Arrays.sort(gbs);
        assertEquals((gbs[2] + gbs[3]) / 2, Double.parseDouble(fields(summary)
                .get("median_over_t_gbs")), 0.011, summary);
    }

    @Test
    void theCircuitLineGivesTheTimePerGateOfTheLayeredCircuit() {
        List<String> lines = run("circuit", "5", "1", "1", "unfused");
        Map<String, String> f = fields(lines.stream().filter(l -> l.startsWith("test=circuit"))
                .findFirst().orElseThrow());
        // 20 layers of 5 rotations and a 4-gate ladder (Workloads.layeredCircuit).
        assertEquals("180", f.get("gates"));
        assertEquals("off", f.get("fusion"));
        assertEquals(Double.parseDouble(f.get("median_s")) / 180 * 1e9,
                Double.parseDouble(f.get("ns_per_gate")), 0.1 + 1e9 * 0.5e-4 / 180);
    }

    @Test
    void badArgumentsExitWithOneAndSayWhy() {
        String[][] cases = {{"gates", "3", "5"}, {"spin", "10", "5"}, {"gates", "10", "0"},
            {"gates", "10", "5", "seven"}, {"circuit", "10", "2", "1", "fast"}, {"gates"}};
        String[] says = {"N must be in [4, 30] but was 3", "mode must be gates or circuit",
            "REPS must be in [1, 100000] but was 0", "THREADS must be an integer but was 'seven'",
            "'fast'", "expected a mode"};
        for (int i = 0; i < cases.length; i++) {
            ByteArrayOutputStream err = new ByteArrayOutputStream();
            int status = GateRate.run(cases[i], new PrintStream(new ByteArrayOutputStream()),
                    new PrintStream(err, true, StandardCharsets.UTF_8));
            String text = err.toString(StandardCharsets.UTF_8);
            assertEquals(1, status, text);
            assertTrue(text.contains(says[i]), text);
        }
    }
}
