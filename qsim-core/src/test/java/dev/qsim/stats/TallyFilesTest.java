package dev.qsim.stats;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.RandomAccessFile;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import java.util.TreeMap;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
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
                + "  \"outcomes\": {\"00\": 12, \"11\": 9.0, \"01\": 0},"
                + " \"tags\": [1, true, null] }";
        assertEquals(Tally.of(2, Map.of("00", 12L, "11", 9L)), TallyFiles.readJson(json));
    }

    @Test
    void csvSkipsCommentsBlankLinesAndCarriageReturns() {
        String csv = "# chip: example\r\nbits,count\r\n\r\n01 , 7\r\n10,3\r\n";
        assertEquals(Tally.of(2, Map.of("01", 7L, "10", 3L)), TallyFiles.read(csv));
    }

    @Test
    void jsonWithoutWidthTakesTheLengthOfItsBitstrings() {
        // Format of our own (TallyFiles javadoc): the width may be left out.
        assertEquals(Tally.of(3, Map.of("000", 5L, "101", 2L)),
                TallyFiles.read("{\"outcomes\": {\"000\": 5, \"101\": 2}}"));
        assertEquals(Tally.of(0, Map.of("", 4L)), TallyFiles.read("{\"outcomes\": {\"\": 4}}"));
    }

    @Test
    void countsUpToTheLongRangeAreReadExactly() {
        // JSON numbers are kept as text (RFC 8259 §6), so counts beyond 2^53 stay exact.
        long big = Long.MAX_VALUE - 1;
        Tally t = TallyFiles.read("{\"outcomes\": {\"1\": " + big + ", \"0\": 1}}");
        assertEquals(big, t.count("1"));
        assertEquals(Long.MAX_VALUE, t.shots());
        assertEquals(t, TallyFiles.read(t.toCsv()));
        assertEquals(t, TallyFiles.read(TallyFiles.toJson(t)));
    }

    @Test
    void aByteOrderMarkAtTheStartIsIgnored(@TempDir Path dir) throws IOException {
        // RFC 8259 §8.1 lets a JSON reader ignore a byte-order mark; spreadsheets write one
        // before CSV (common practice). U+FEFF in UTF-8 is EF BB BF (Unicode §23.8).
        Tally t = Tally.of(2, Map.of("01", 7L, "10", 3L));
        assertEquals(t, TallyFiles.read("\uFEFF" + t.toCsv()));
        assertEquals(t, TallyFiles.readCsv("\uFEFF" + t.toCsv()));
        assertEquals(t, TallyFiles.read("\uFEFF" + TallyFiles.toJson(t)));
        assertEquals(t, TallyFiles.readJson("\uFEFF" + TallyFiles.toJson(t)));
        Path csv = dir.resolve("t.csv");
        byte[] body = t.toCsv().getBytes(StandardCharsets.UTF_8);
        byte[] withMark = new byte[body.length + 3];
        withMark[0] = (byte) 0xEF;
        withMark[1] = (byte) 0xBB;
        withMark[2] = (byte) 0xBF;
        System.arraycopy(body, 0, withMark, 3, body.length);
        Files.write(csv, withMark);
        assertEquals(t, TallyFiles.read(csv));
    }

    @Test
    void aHeaderWithAnInvisibleCharacterIsShownWithIt() {
        // Messages must let two different strings look different (DEVELOPERS.md: name the
        // bad value); U+200B is a zero-width space (Unicode).
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> TallyFiles.read("\u200Bbits,count\n0,1\n"));
        assertEquals("line 1: expected the header 'bits,count' but found '\\u200Bbits,count'",
                e.getMessage());
    }

    @Test
    void filesThatAreTooLargeOrNotUtf8AreRefusedByName(@TempDir Path dir) throws IOException {
        // Limits documented in TallyFiles; the size is checked before reading, so a sparse
        // file of 32 MiB + 1 byte costs nothing. UTF-8 validity per RFC 3629 §3.
        Path big = dir.resolve("big.csv");
        try (RandomAccessFile f = new RandomAccessFile(big.toFile(), "rw")) {
            f.setLength(TallyFiles.MAX_CHARS + 1L);
        }
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> TallyFiles.read(big));
        assertEquals(big + ": the tally file of " + (TallyFiles.MAX_CHARS + 1L) + " bytes is"
                + " larger than the " + TallyFiles.MAX_CHARS + " bytes allowed", e.getMessage());
        Path bad = dir.resolve("bad.csv");
        Files.write(bad, new byte[] {'b', 'i', 't', 's', ',', 'c', 'o', 'u', 'n', 't', '\n',
            '0', ',', (byte) 0xC3, '\n'});
        IllegalArgumentException u = assertThrows(IllegalArgumentException.class,
                () -> TallyFiles.read(bad));
        assertTrue(u.getMessage().contains("not valid UTF-8: bad byte sequence at byte offset"
                + " 13"), u.getMessage());
    }

    @Test
    void limitsAreTheSameForCsvAndJson() {
        // One set of limits for both formats (TallyFiles javadoc).
        String wide = "0".repeat(TallyFiles.MAX_WIDTH + 1);
        IllegalArgumentException csv = assertThrows(IllegalArgumentException.class,
                () -> TallyFiles.read("bits,count\n" + wide + ",1\n"));
        IllegalArgumentException json = assertThrows(IllegalArgumentException.class,
                () -> TallyFiles.read("{\"outcomes\": {\"" + wide + "\": 1}}"));
        String rule = "has " + (TallyFiles.MAX_WIDTH + 1) + " bits; at most "
                + TallyFiles.MAX_WIDTH + " are allowed";
        assertTrue(csv.getMessage().contains(rule), csv.getMessage());
        assertTrue(json.getMessage().contains(rule), json.getMessage());
        String max = "0".repeat(TallyFiles.MAX_WIDTH);
        assertEquals(TallyFiles.MAX_WIDTH, TallyFiles.read("bits,count\n" + max + ",1\n")
                .width());

        String tooLong = " ".repeat(TallyFiles.MAX_CHARS + 1);
        for (String text : new String[] {tooLong, "{" + tooLong.substring(1)}) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> TallyFiles.read(text));
            assertTrue(e.getMessage().contains("more than the " + TallyFiles.MAX_CHARS
                    + " allowed"), e.getMessage());
        }

        int n = TallyFiles.MAX_OUTCOMES + 1;
        StringBuilder c = new StringBuilder("bits,count\n");
        StringBuilder j = new StringBuilder("{\"outcomes\": {");
        for (int i = 0; i < n; i++) {
            String bits = Tally.bitString(i, 21);
            c.append(bits).append(",1\n");
            j.append(i == 0 ? "\"" : ",\"").append(bits).append("\":1");
        }
        j.append("}}");
        String many = "more than " + TallyFiles.MAX_OUTCOMES + " outcomes";
        IllegalArgumentException manyCsv = assertThrows(IllegalArgumentException.class,
                () -> TallyFiles.read(c.toString()));
        assertTrue(manyCsv.getMessage().startsWith("line " + (n + 1) + ": " + many),
                manyCsv.getMessage());
        IllegalArgumentException manyJson = assertThrows(IllegalArgumentException.class,
                () -> TallyFiles.read(j.toString()));
        assertTrue(manyJson.getMessage().contains(many), manyJson.getMessage());
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
        "bits,count\\n0,007|'007'",
        "bits,count\\n0,+7|'+7'",
        "bits,count\\n0,7.0|'7.0'",
        "bits,count\\n0,\u0667|'\u0667'",
        "bits,count\\n0,9223372036854775808|'9223372036854775808'",
        "bits,count\\n0,9223372036854775807\\n1,1|line 3: the counts sum to more than",
        "{\"width\": 2}|\"outcomes\"",
        "{\"width\": 2, \"counts\": {\"00\": 1}}|\"counts\" is not read",
        "{\"width\": 1.5, \"outcomes\": {}}|1.5",
        "{\"width\": 4097, \"outcomes\": {}}|from 0 to 4096",
        "{\"width\": 2, \"outcomes\": {\"0\": 1}}|'0'",
        "{\"outcomes\": {\"0\": 1, \"01\": 1}}|'01' has 2 bits but '0' has 1",
        "{\"outcomes\": {}}|\"outcomes\" is empty and no \"width\"",
        "{\"outcomes\": {\"0\": 01}}|leading zero",
        "{\"outcomes\": {\"0\": 1.5}}|the count of '0' must be a whole number",
        "{\"outcomes\": {\"0\": 9223372036854775807, \"1\": 1}}|column 46: the counts sum",
        "{\"width\": 1, \"outcomes\": {\"0\": -1}}|-1",
        "{\"width\": 1, \"outcomes\": {\"0\": 1,}}|column 34",
        "{\"width\": 1, \"outcomes\": {\"0\": 1}} x|before this 'x'",
        "[1, 2]|an array",
        "{\"width\": 1, \"width\": 1}|appears twice",
        "{\"width\": 1, \"outcomes\": {\"0\": 0}}|sum to 0",
        "{\"outcomes\": {\"2\": 1}}|'2' at position 0",
    })
    void badTextIsRefusedWithWhereAndWhat(String text, String shown) {
        // Rules of our own format (TallyFiles javadoc); JSON syntax per RFC 8259 §4-§6.
        String t = text.replace("\\n", "\n");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> TallyFiles.read(t));
        assertTrue(e.getMessage().contains(shown), e.getMessage());
    }

    @Test
    void jsonWriterMatchesItsDocumentedLayout() {
        // Layout of our own format, as documented in TallyFiles.toJson.
        Tally t = Tally.of(2, Map.of("00", 3L, "11", 4L));
        assertEquals("{\n  \"width\": 2,\n  \"shots\": 7,\n  \"outcomes\": {\n    \"00\": 3,\n"
                + "    \"11\": 4\n  }\n}\n", TallyFiles.toJson(t));
    }
}
