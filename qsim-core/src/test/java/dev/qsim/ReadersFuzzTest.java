package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.function.Function;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

import dev.qsim.noise.DeviceProfile;
import dev.qsim.observable.PauliProduct;
import dev.qsim.stats.TallyFiles;

/**
 * Every reader of outside text against hostile input: grammar-aware inputs and mutations of
 * valid ones (truncation, byte flips, duplication, deep nesting, huge numbers, long names), a
 * few thousand per reader per run. A reader may accept an input or refuse it with its
 * documented exception; any other throwable, or a read slower than a bound, fails the test.
 * The method is fuzz testing (Miller, Fredriksen and So 1990, "An empirical study of the
 * reliability of UNIX utilities", Communications of the ACM 33(12), 32); the oracle is each
 * reader's documented contract.
 */
class ReadersFuzzTest {
    private static final int INPUTS = 2500;
    private static final long SLOW_NANOS = 2_000_000_000L;

    private static final String[] TALLY_SEEDS = {
        "bits,count\n00,5000\n11,4999\n01,1\n",
        "# a comment\nbits,count\n0000,3\n1111,4\n",
        "{\"width\": 2, \"outcomes\": {\"00\": 10, \"11\": 12}}",
        "{\"outcomes\": {\"101\": 1, \"010\": 9223372036854775806}}",
        "\uFEFFbits,count\r\n0,1\r\n1,2\r\n",
    };

    private static final String[] PAULI_SEEDS = {"XZIY", "X0 Z3", "-iX1 Y2", "Z", "+Y7 X0"};

    @Test
    void tallyFilesReadOrRefuseEveryInput() {
        fuzz("TallyFiles.read", TALLY_SEEDS, TallyFiles::read, 1);
        fuzz("TallyFiles.readCsv", TALLY_SEEDS, TallyFiles::readCsv, 2);
        fuzz("TallyFiles.readJson", TALLY_SEEDS, TallyFiles::readJson, 3);
    }

    @Test
    void pauliTextIsReadOrRefused() {
        fuzz("PauliProduct.parse", PAULI_SEEDS, PauliProduct::parse, 4);
    }

    @Test
    void deviceProfilesAreReadOrRefused() throws IOException {
        String[] seeds = {
            Files.readString(Path.of("../qsim-examples/demo/longstone-pair.json"),
                    StandardCharsets.UTF_8),
            Files.readString(Path.of("../qsim-examples/demo/pallet5.json"),
                    StandardCharsets.UTF_8),
        };
        fuzz("DeviceProfile.read", seeds, DeviceProfile::read, 5);
    }

    @Test
    void tallyOverflowAndHugeValuesAreRefusedNotWrapped() {
        // Two counts whose sum passes Long.MAX_VALUE: refused, never a negative total.
        for (String text : new String[] {"bits,count\n0,9223372036854775807\n1,1\n",
            "{\"outcomes\": {\"0\": 9223372036854775807, \"1\": 1}}"}) {
            try {
                Tally t = TallyFiles.read(text);
                fail("accepted an overflowing total: shots " + t.shots());
            } catch (IllegalArgumentException expected) {
                assertTrue(expected.getMessage().length() < 1000, expected.getMessage());
            }
        }
        // A stated shot total that differs from the counts' sum is refused (a cut file).
        try {
            TallyFiles.read("{\"shots\": 30, \"outcomes\": {\"0\": 10, \"1\": 12}}");
            fail("accepted shots 30 for counts summing to 22");
        } catch (IllegalArgumentException expected) {
            assertTrue(expected.getMessage().contains("sum to 22"), expected.getMessage());
        }
        // A written tally reads back equal in both formats.
        Tally t = Tally.ofCounts(3, new long[] {0, 5, 7}, new long[] {1, 2, Long.MAX_VALUE - 3});
        assertEquals(t, TallyFiles.read(TallyFiles.toJson(t)));
        assertEquals(t, TallyFiles.read(t.toCsv()));
    }

    /** Feeds the seeds, generated variants and mutations to a reader. */
    private static void fuzz(String name, String[] seeds, Function<String, ?> reader,
            long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        List<String> inputs = new ArrayList<>(List.of(seeds));
        inputs.add("");
        inputs.add("[".repeat(100_000));
        inputs.add("{\"outcomes\": " + "[".repeat(50_000) + "}");
        inputs.add("9".repeat(100_000));
        inputs.add("X".repeat(200_000));
        inputs.add("bits,count\n" + "0".repeat(100_000) + ",1\n");
        while (inputs.size() < INPUTS) {
            inputs.add(mutate(seeds[rng.nextInt(seeds.length)], rng));
        }
        int accepted = 0;
        for (String input : inputs) {
            long start = System.nanoTime();
            try {
                reader.apply(input);
                accepted++;
            } catch (IllegalArgumentException | IndexOutOfBoundsException refused) {
                String m = refused.getMessage();
                if (m == null || m.length() > 2000) {
                    fail(name + ": a refusal without a bounded message ("
                            + (m == null ? "none" : m.length() + " characters") + ") for "
                            + excerpt(input));
                }
            } catch (Throwable t) {
                fail(name + " threw " + t + " for " + excerpt(input), t);
            }
            long took = System.nanoTime() - start;
            if (took > SLOW_NANOS) {
                fail(name + " took " + took / 1_000_000 + " ms for " + excerpt(input));
            }
        }
        // The seeds are valid, so at least they are accepted: the reader is exercised, not
        // refusing everything.
        assertTrue(accepted >= seeds.length, name + " accepted only " + accepted);
    }

    private static String mutate(String s, UniformRandomProvider rng) {
        StringBuilder sb = new StringBuilder(s);
        int rounds = 1 + rng.nextInt(4);
        for (int r = 0; r < rounds && sb.length() > 0; r++) {
            int at = rng.nextInt(sb.length());
            switch (rng.nextInt(9)) {
                case 0:
                    sb.setLength(at); // truncation
                    break;
                case 1:
                    sb.setCharAt(at, (char) rng.nextInt(128)); // a flipped byte
                    break;
                case 2: {
                    int end = Math.min(sb.length(), at + 1 + rng.nextInt(40));
                    String part = sb.substring(at, end);
                    sb.insert(at, part.repeat(1 + rng.nextInt(200))); // duplication
                    break;
                }
                case 3:
                    sb.insert(at, "9".repeat(1 + rng.nextInt(400))); // a huge number
                    break;
                case 4:
                    sb.insert(at, "[{".repeat(1 + rng.nextInt(3000))); // deep nesting
                    break;
                case 5:
                    sb.deleteCharAt(at);
                    break;
                case 6:
                    sb.insert(at, new String[] {"-", "\u0000", "\uFEFF", "\"", ",", "\n", "1e999",
                        "-0", "0x1F", "NaN", "\\u00", "\ud800"}[rng.nextInt(12)]);
                    break;
                case 7:
                    sb.insert(at, "q".repeat(1 + rng.nextInt(5000))); // a long name
                    break;
                default:
                    sb.insert(at, sb.substring(0, at)); // the start again
                    break;
            }
        }
        return sb.toString();
    }

    private static String excerpt(String s) {
        return s.length() <= 80 ? "'" + s + "'" : "'" + s.substring(0, 80) + "...' (" + s.length()
                + " characters)";
    }
}
