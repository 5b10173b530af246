package dev.qsim.stats;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;
import java.util.TreeMap;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.Tally;

class TallyFilesTest {

    @Test
    void csvAndJsonRoundTripRandomTallies() {
        long seed = 2024;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        for (int trial = 0; trial < 200; trial++) {
            int width = 1 + rng.nextInt(8);
            Map<String, Long> counts = new TreeMap<>();
            int k = 1 + rng.nextInt(1 << Math.min(width, 5));
            for (int i = 0; i < k; i++) {
                StringBuilder b = new StringBuilder();
                for (int j = 0; j < width; j++) {
                    b.append(rng.nextBoolean() ? '1' : '0');
                }
                counts.put(b.toString(), 1 + rng.nextLong(1_000_000_000L));
            }
            Tally t = Tally.of(width, counts);
            int trialNo = trial;
            assertEquals(t, TallyFiles.readCsv(t.toCsv()), () -> "seed " + seed + " trial "
                    + trialNo);
            assertEquals(t, TallyFiles.read(TallyFiles.toJson(t)), () -> "seed " + seed
                    + " trial " + trialNo);
            assertEquals(t, TallyFiles.read(TallyFiles.toCsv(t)));
        }
    }

    @Test
    void jsonWithMetadataAndSpacingIsRead() {
        // Format of our own (see TallyFiles javadoc); JSON syntax per RFC 8259.
        String json = "{ \"device\": \"bench chip \\u00e9\", \"width\" : 2,\n"
                + "  \"counts\": {\"00\": 12, \"11\": 9.0, \"01\": 0}, \"tags\": [1, true, null] }";
        assertEquals(Tally.of(2, Map.of("00", 12L, "11", 9L)), TallyFiles.readJson(json));
    }

    @Test
    void csvSkipsCommentsBlankLinesAndCarriageReturns() {
        String csv = "# chip: example\r\nbits,count\r\n\r\n01 , 7\r\n10,3\r\n";
        assertEquals(Tally.of(2, Map.of("01", 7L, "10", 3L)), TallyFiles.read(csv));
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        "bits;count\\n0,1|'bits;count'",
        "bits,count\\n0,1\\n11,2|line 3",
        "bits,count\\n0,1\\n0,2|appears twice",
        "bits,count\\n0,x|'x'",
        "bits,count\\n0,-4|'-4'",
        "bits,count\\n2,4|'2'",
        "bits,count\\n0,1,2|3 field(s)",
        "bits,count|no outcome lines",
        "''|empty",
        "{\"width\": 2}|\"counts\"",
        "{\"width\": 1.5, \"counts\": {}}|1.5",
        "{\"width\": 2, \"counts\": {\"0\": 1}}|'0'",
        "{\"width\": 1, \"counts\": {\"0\": -1}}|-1",
        "{\"width\": 1, \"counts\": {\"0\": 1,}}|column 32",
        "{\"width\": 1, \"counts\": {\"0\": 1}} x|unexpected 'x'",
        "[1, 2]|an array",
        "{\"width\": 1, \"width\": 1}|appears twice",
        "{\"width\": 1, \"counts\": {\"0\": 0}}|sum to 0",
    })
    void badTextIsRefusedWithWhereAndWhat(String text, String shown) {
        String t = text.replace("\\n", "\n");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> TallyFiles.read(t));
        assertTrue(e.getMessage().contains(shown), e.getMessage());
    }

    @Test
    void jsonWriterMatchesItsDocumentedLayout() {
        // Layout of our own format, as documented in TallyFiles.toJson.
        Tally t = Tally.of(2, Map.of("00", 3L, "11", 4L));
        assertEquals("{\n  \"width\": 2,\n  \"shots\": 7,\n  \"counts\": {\n    \"00\": 3,\n"
                + "    \"11\": 4\n  }\n}\n", TallyFiles.toJson(t));
    }
}
