package dev.qsim.internal;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The strict JSON reader against RFC 8259 (Bray 2017, doi:10.17487/RFC8259): each case names
 * the section whose grammar or text decides it.
 */
class JsonTest {
    private static final int BIG = 1 << 20;
    private static final Pattern PLACE = Pattern.compile("^JSON line (\\d+), column (\\d+): ");

    private static Json.Value parse(String text) {
        return Json.parse(text, BIG, BIG);
    }

    private static IllegalArgumentException refused(String text) {
        return assertThrows(IllegalArgumentException.class, () -> parse(text),
                () -> TextFiles.shown(text));
    }

    // ------------------------------------------------------------------ valid texts

    @Test
    void theObjectExampleOfSection13IsRead() {
        // RFC 8259 §13, first example, verbatim.
        String text = "{\n"
                + "  \"Image\": {\n"
                + "      \"Width\":  800,\n"
                + "      \"Height\": 600,\n"
                + "      \"Title\":  \"View from 15th Floor\",\n"
                + "      \"Thumbnail\": {\n"
                + "          \"Url\":    \"http://www.example.com/image/481989943\",\n"
                + "          \"Height\": 125,\n"
                + "          \"Width\":  100\n"
                + "      },\n"
                + "      \"Animated\" : false,\n"
                + "      \"IDs\": [116, 943, 234, 38793]\n"
                + "    }\n"
                + "}";
        Json.ObjectValue image = parse(text).asObject("root").require("Image", "Image")
                .asObject("Image");
        assertEquals(List.of("Width", "Height", "Title", "Thumbnail", "Animated", "IDs"),
                List.copyOf(image.members().keySet()), "RFC 8259 §4: names in text order");
        assertEquals(800, image.get("Width").asLong("Width"));
        assertEquals("View from 15th Floor", image.get("Title").asString("Title"));
        assertEquals(new Json.BooleanValue(false, 11, 20), image.get("Animated"));
        List<Json.Value> ids = image.get("IDs").asArray("IDs").items();
        assertEquals(38793, ids.get(3).asLong("IDs[3]"));
        assertEquals("http://www.example.com/image/481989943", image.get("Thumbnail")
                .asObject("Thumbnail").get("Url").asString("Url"));
        assertEquals("line 2, column 12", image.at(), "the object starts at its brace");
        assertEquals("line 3, column 7", image.nameAt("Width"));
    }

    @Test
    void theArrayExampleOfSection13IsRead() {
        // RFC 8259 §13, second example, verbatim.
        String text = "[\n"
                + "  {\n"
                + "     \"precision\": \"zip\",\n"
                + "     \"Latitude\":  37.7668,\n"
                + "     \"Longitude\": -122.3959,\n"
                + "     \"Address\":   \"\",\n"
                + "     \"City\":      \"SAN FRANCISCO\",\n"
                + "     \"State\":     \"CA\",\n"
                + "     \"Zip\":       \"94107\",\n"
                + "     \"Country\":   \"US\"\n"
                + "  },\n"
                + "  {\n"
                + "     \"precision\": \"zip\",\n"
                + "     \"Latitude\":  37.371991,\n"
                + "     \"Longitude\": -122.026020,\n"
                + "     \"Address\":   \"\",\n"
                + "     \"City\":      \"SUNNYVALE\",\n"
                + "     \"State\":     \"CA\",\n"
                + "     \"Zip\":       \"94085\",\n"
                + "     \"Country\":   \"US\"\n"
                + "  }\n"
                + "]";
        List<Json.Value> items = parse(text).asArray("root").items();
        assertEquals(2, items.size());
        Json.ObjectValue second = items.get(1).asObject("[1]");
        assertEquals(-122.026020, second.get("Longitude").asDouble("Longitude"));
        assertEquals("-122.026020", ((Json.NumberValue) second.get("Longitude")).text(),
                "RFC 8259 §6: the number is kept as written");
        assertEquals("", second.get("Address").asString("Address"));
    }

    @ParameterizedTest
    @ValueSource(strings = {"\"Hello world!\"", "42", "true", "false", "null"})
    void anyValueMayStandAlone(String text) {
        // RFC 8259 §2 (JSON-text = ws value ws) and the three small texts of §13.
        Json.Value v = parse(text);
        assertEquals(1, v.column());
        assertEquals(text.startsWith("\"") ? "the string \"Hello world!\"" : text.equals("42")
                ? "the number 42" : text, v.describe());
    }

    @Test
    void theFourWhitespaceCharactersAreAllowedAroundEveryToken() {
        // RFC 8259 §2: ws = space, horizontal tab, line feed, carriage return.
        Json.ObjectValue o = parse(" \t\r\n{ \t\r\n\"a\" \t\r\n: \t\r\n[ 1 \t,\r\n2 ] \n} \r\n")
                .asObject("root");
        assertEquals(2, o.get("a").asArray("a").items().size());
    }

    @Test
    void linesCountLineFeedsCarriageReturnsAndTheirPairsOnce() {
        // Positions as documented in Json (common practice: CR, LF and CRLF each end a line).
        Json.Value v = parse("[\r\n1,\r2,\n\n  3]").asArray("root").items().get(2);
        assertEquals(5, v.line());
        assertEquals(3, v.column());
    }

    @ParameterizedTest
    @ValueSource(strings = {"0", "-0", "7", "-7", "10", "1.5", "-0.25", "1e5", "1E5", "1e+5",
        "1e-5", "1.25E-3", "0.0", "123456789012345678901234567890"})
    void numbersOfTheGrammarAreRead(String text) {
        // RFC 8259 §6 grammar: [ minus ] int [ frac ] [ exp ].
        Json.Value v = parse(text);
        assertEquals(text, ((Json.NumberValue) v).text());
        assertEquals(Double.parseDouble(text), v.asDouble("n"),
                "Java's decimal conversion (from memory: Double.parseDouble is correctly rounded)");
    }

    @Test
    void wholeNumbersAreWholeWhateverTheirSpelling() {
        // RFC 8259 §6: one number type, so 12, 12.0 and 1.2e1 are the same value.
        assertEquals(12, parse("12").asLong("n"));
        assertEquals(12, parse("12.0").asLong("n"));
        assertEquals(12, parse("1.2e1").asLong("n"));
        assertEquals(-3000, parse("-3e3").asLong("n"));
        assertEquals(0, parse("-0.0e-7").asLong("n"));
        assertEquals(0, parse("0e99999999999").asLong("n"));
        assertEquals(Long.MAX_VALUE, parse("9223372036854775807").asLong("n"));
        assertEquals(Long.MIN_VALUE, parse("-9223372036854775808").asLong("n"));
        assertEquals(5, parse("5").asLong("n", 0, 5));
    }

    @ParameterizedTest
    @ValueSource(strings = {"1.5", "9223372036854775808", "-9223372036854775809", "1e19",
        "1e99999999999", "1e-99999999999", "\"3\"", "true", "null", "[]"})
    void numbersThatAreNotLongsAreRefusedByName(String text) {
        // Range of a long (JLS §4.2.1); RFC 8259 §9 lets a reader limit range and precision.
        Json.Value v = parse(text);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> v.asLong("the count"));
        assertTrue(e.getMessage().startsWith("line 1, column 1: the count "), e.getMessage());
        IllegalArgumentException r = assertThrows(IllegalArgumentException.class,
                () -> v.asLong("the count", 0, 10));
        assertTrue(r.getMessage().contains("from 0 to 10"), r.getMessage());
    }

    @Test
    void doublesBeyondRangeAreRefused() {
        // IEEE 754 binary64 overflows past about 1.8e308 (from memory); RFC 8259 §6 warns.
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> parse("-1e400").asDouble("x"));
        assertTrue(e.getMessage().contains("-1e400"), e.getMessage());
        assertEquals(0.0, parse("1e-400").asDouble("x"), "underflow is the nearest double, 0");
    }

    @Test
    void escapesOfSection7AreResolved() {
        // RFC 8259 §7: the two-character escapes, \\uXXXX, and the G clef as a surrogate pair.
        assertEquals("\"\\/\b\f\n\r\t", parse("\"\\\"\\\\\\/\\b\\f\\n\\r\\t\"").asString("s"));
        assertEquals("é\u0000\uABCD", parse("\"\\u00e9\\u0000\\uabcd\"").asString("s"));
        assertEquals("\uD834\uDD1E", parse("\"\\uD834\\uDD1E\"").asString("s"));
        assertEquals("a\uD834\uDD1Eb", parse("\"a\uD834\uDD1Eb\"").asString("s"),
                "a raw pair is one character");
        assertEquals("\u007f é", parse("\"\u007f é\"").asString("s"),
                "§7: only U+0000 to U+001F must be escaped");
    }

    @Test
    void aByteOrderMarkAtTheStartIsIgnored() {
        // RFC 8259 §8.1: a parser MAY ignore a byte order mark.
        assertEquals(3, parse("\uFEFF[1, 2, 3]").asArray("a").items().size());
        IllegalArgumentException e = refused("[1,\uFEFF2]");
        assertTrue(e.getMessage().contains("U+FEFF"), e.getMessage());
    }

    @Test
    void emptyContainersAndDepthUpToTheLimitAreRead() {
        // RFC 8259 §4-§5 (empty object and array); §9 lets a reader limit nesting.
        assertTrue(parse("{}").asObject("o").members().isEmpty());
        assertTrue(parse("[]").asArray("a").items().isEmpty());
        String deep = "[".repeat(Json.MAX_DEPTH) + "]".repeat(Json.MAX_DEPTH);
        Json.Value v = parse(deep);
        for (int i = 1; i < Json.MAX_DEPTH; i++) {
            v = v.asArray("a").items().get(0);
        }
        assertTrue(v.asArray("a").items().isEmpty());
    }

    // ------------------------------------------------------------------ invalid texts

    @ParameterizedTest
    @ValueSource(strings = {
        "", " ", "\uFEFF",                 // §2: a text holds one value
        "1 2", "{} {}", "[] x", "nullx",   // §2: exactly one value
        "True", "NULL", "nul", "f",        // §3: three lowercase literals
        "NaN", "Infinity", "-Infinity",    // §6: not numbers
        "01", "-01", "00", "+1", ".5", "1.", "1.e2", "1e", "1e+", "-", "- 1", "0x10", "1_000",
        "{a: 1}", "{'a': 1}", "{\"a\" 1}", "{\"a\": 1,}", "{,}", "{\"a\": 1 \"b\": 2}",
        "{\"a\"}", "{1: 2}", "{\"a\": }",  // §4
        "[1,]", "[,1]", "[1 2]", "[", "]", "[1}", "{\"a\": 1]", // §5
        "'a'", "\"a", "\"\\x41\"", "\"\\u12\"", "\"\\uZZZZ\"", "\"\\u+123\"", "\"\\\"",
        "\"a\tb\"", "\"a\nb\"", "\"\u0000\"", // §7: escapes, raw control characters
        "\"\\uDEAD\"", "\"\\uD834\"", "\"\\uD834\\u0041\"", "\"\uD834\"", "\"\uDD1E\"", // §8.2
        "[1] // c", "/* c */ 1", "# c\n1",  // no comments in §2's grammar
        "\u000B1", "\u00A01", "\u20281",   // §2: only four whitespace characters
    })
    void textsOutsideTheGrammarAreRefusedWithLineAndColumn(String text) {
        IllegalArgumentException e = refused(text);
        Matcher m = PLACE.matcher(e.getMessage());
        assertTrue(m.find(), e.getMessage());
        int col = Integer.parseInt(m.group(2));
        assertTrue(col >= 1 && col <= text.length() + 1, e.getMessage());
        assertTrue(e.getMessage().length() < 400, e.getMessage());
    }

    @Test
    void refusalsPointAtTheFault() {
        // Positions as documented in Json; the grammar of RFC 8259 §4-§7 decides the fault.
        assertEquals("JSON line 3, column 3: a member name in double quotes was expected but"
                + " found '}' (no comma may come before '}')", refused("{\n\"a\": 1,\n  }")
                .getMessage());
        assertEquals("JSON line 1, column 4: a value was expected but found ']' (no comma may"
                + " come before ']')", refused("[1,]").getMessage());
        assertEquals("JSON line 1, column 2: a number may not have a leading zero",
                refused("01").getMessage());
        assertTrue(refused("[1, NaN]").getMessage().startsWith("JSON line 1, column 5: unknown"
                + " word 'NaN'"));
        assertTrue(refused("\"ab\\q\"").getMessage().startsWith("JSON line 1, column 5:"
                + " unknown escape: a backslash followed by 'q'"));
        assertTrue(refused("\"\\u12G4\"").getMessage().startsWith("JSON line 1, column 6:"
                + " \\u takes four hex digits but found 'G'"));
        assertTrue(refused("[\"x\\uDEADy\"]").getMessage().startsWith("JSON line 1, column 4:"
                + " the escape \\uDEAD is half of a surrogate pair"));
        assertTrue(refused("\"abc").getMessage().startsWith("JSON line 1, column 5: the string"
                + " does not end"));
        assertTrue(refused("\"a\tb\"").getMessage().contains("U+0009"));
    }

    @Test
    void repeatedMemberNamesAreRefused() {
        // RFC 8259 §4: names SHOULD be unique; behaviour with repeats is unpredictable, so refuse.
        IllegalArgumentException e = refused("{\"a\": 1,\n \"b\": {\"a\": 2},\n \"a\": 3}");
        assertEquals("JSON line 3, column 2: member \"a\" appears twice in one object (its first"
                + " value is at line 1, column 7)", e.getMessage());
        assertEquals(2, parse("{\"a\": {\"a\": 1}, \"b\": [{\"a\": 2}, {\"a\": 3}]}")
                .asObject("o").members().size(), "the same name in different objects is fine");
    }

    @Test
    void limitsAreCheckedAndNamed() {
        // RFC 8259 §9: a reader may limit text size, nesting depth and number length.
        IllegalArgumentException size = assertThrows(IllegalArgumentException.class,
                () -> Json.parse("[1, 2, 3]", 8, 100));
        assertEquals("the JSON text has 9 characters, more than the 8 allowed", size.getMessage());
        IllegalArgumentException count = assertThrows(IllegalArgumentException.class,
                () -> Json.parse("[1, 2, 3]", 100, 3));
        assertTrue(count.getMessage().contains("more than 3 values"), count.getMessage());
        assertEquals(3, Json.parse("[1, 2, 3]", 9, 4).asArray("a").items().size(),
                "exactly at both limits");
        String tooDeep = "[".repeat(Json.MAX_DEPTH + 1) + "]".repeat(Json.MAX_DEPTH + 1);
        assertTrue(refused(tooDeep).getMessage().startsWith("JSON line 1, column "
                + (Json.MAX_DEPTH + 1) + ": arrays and objects nest deeper than "));
        String longNumber = "1".repeat(Json.MAX_NUMBER_CHARS + 1);
        assertTrue(refused(longNumber).getMessage().contains("more than "
                + Json.MAX_NUMBER_CHARS + " characters"));
        assertEquals(Json.MAX_NUMBER_CHARS, ((Json.NumberValue) parse("1".repeat(
                Json.MAX_NUMBER_CHARS))).text().length());
    }

    @Test
    void aMillionOpeningBracketsGiveTheDepthErrorNotAStackOverflow() {
        // Robustness (common practice for parsers of untrusted text).
        IllegalArgumentException e = refused("[".repeat(1_000_000));
        assertTrue(e.getMessage().contains("nest deeper"), e.getMessage());
        String flat = "[" + "[],".repeat(200_000) + "[]]";
        assertEquals(200_001, parse(flat).asArray("a").items().size());
    }

    @Test
    void quotedTextInMessagesIsBounded() {
        // DEVELOPERS.md: user text only through Checks.excerpt.
        String name = "n".repeat(10_000);
        IllegalArgumentException e = refused("{\"" + name + "\": 1, \"" + name + "\": 2}");
        assertTrue(e.getMessage().length() < 200, e.getMessage());
        IllegalArgumentException w = refused("[" + "x".repeat(10_000) + "]");
        assertTrue(w.getMessage().length() < 200, w.getMessage());
    }

    @Test
    void requireOnlyNamesTheUnknownMemberAndTheAllowedOnes() {
        // Behaviour documented in Json.ObjectValue.requireOnly.
        Json.ObjectValue o = parse("{\"name\": 1,\n  \"nmae\": 2}").asObject("o");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> o.requireOnly(Set.of("name", "qubits"), "the profile"));
        assertEquals("line 2, column 3: unknown field \"nmae\" in the profile; allowed: name,"
                + " qubits", e.getMessage());
        IllegalArgumentException missing = assertThrows(IllegalArgumentException.class,
                () -> o.require("qubits", "qubits"));
        assertEquals("line 1, column 1: qubits is missing; it is required", missing.getMessage());
        IllegalArgumentException kind = assertThrows(IllegalArgumentException.class,
                () -> o.get("name").asString("name"));
        assertEquals("line 1, column 10: name must be a string but is the number 1",
                kind.getMessage());
    }

    // ------------------------------------------------------------------ generated texts

    /** Builds a random value as plain Java objects (Map, List, String, Long, Boolean, null). */
    private static Object randomTree(UniformRandomProvider rng, int depth) {
        int kind = rng.nextInt(depth > 4 ? 4 : 6);
        switch (kind) {
            case 0:
                return (long) rng.nextInt() * (rng.nextBoolean() ? 1 : 12345);
            case 1:
                return randomString(rng);
            case 2:
                return rng.nextBoolean();
            case 3:
                return null;
            case 4: {
                List<Object> list = new ArrayList<>();
                int n = rng.nextInt(5);
                for (int i = 0; i < n; i++) {
                    list.add(randomTree(rng, depth + 1));
                }
                return list;
            }
            default: {
                Map<String, Object> map = new LinkedHashMap<>();
                int n = rng.nextInt(5);
                for (int i = 0; i < n; i++) {
                    map.put(randomString(rng), randomTree(rng, depth + 1));
                }
                return map;
            }
        }
    }

    private static String randomString(UniformRandomProvider rng) {
        String alphabet = "ab \"\\/\b\f\n\r\t\u0001\u001f\u007fé\u2028\uFEFF";
        StringBuilder sb = new StringBuilder();
        int n = rng.nextInt(6);
        for (int i = 0; i < n; i++) {
            if (rng.nextInt(8) == 0) {
                sb.append("\uD834\uDD1E");
            } else {
                sb.append(alphabet.charAt(rng.nextInt(alphabet.length())));
            }
        }
        return sb.toString();
    }

    /** Writes a tree as JSON text by RFC 8259's grammar, with random whitespace and escapes. */
    private static void write(Object v, StringBuilder sb, UniformRandomProvider rng) {
        String[] ws = {"", " ", "\t", "\n", "\r\n", "  "};
        sb.append(ws[rng.nextInt(ws.length)]);
        if (v == null) {
            sb.append("null");
        } else if (v instanceof Boolean || v instanceof Long) {
            sb.append(v);
        } else if (v instanceof String s) {
            sb.append('"');
            for (int i = 0; i < s.length(); i++) {
                char c = s.charAt(i);
                if (Character.isHighSurrogate(c)) {
                    // A pair is escaped whole or not at all (RFC 8259 §7).
                    char low = s.charAt(++i);
                    sb.append(rng.nextBoolean() ? String.format("\\u%04x\\u%04x", (int) c,
                            (int) low) : "" + c + low);
                } else if (c == '"' || c == '\\') {
                    sb.append('\\').append(c);
                } else if (c < 0x20 || rng.nextInt(6) == 0) {
                    sb.append(String.format("\\u%04x", (int) c));
                } else {
                    sb.append(c);
                }
            }
            sb.append('"');
        } else if (v instanceof List<?> list) {
            sb.append('[');
            for (int i = 0; i < list.size(); i++) {
                sb.append(i == 0 ? "" : ",");
                write(list.get(i), sb, rng);
            }
            sb.append(ws[rng.nextInt(ws.length)]).append(']');
        } else {
            sb.append('{');
            int i = 0;
            for (Map.Entry<?, ?> e : ((Map<?, ?>) v).entrySet()) {
                sb.append(i++ == 0 ? "" : ",");
                write(e.getKey(), sb, rng);
                sb.append(ws[rng.nextInt(ws.length)]).append(':');
                write(e.getValue(), sb, rng);
            }
            sb.append(ws[rng.nextInt(ws.length)]).append('}');
        }
        sb.append(ws[rng.nextInt(ws.length)]);
    }

    /** Turns the reader's tree back into plain Java objects. */
    private static Object plain(Json.Value v) {
        if (v instanceof Json.ObjectValue o) {
            Map<String, Object> map = new LinkedHashMap<>();
            o.members().forEach((k, x) -> map.put(k, plain(x)));
            return map;
        }
        if (v instanceof Json.ArrayValue a) {
            List<Object> list = new ArrayList<>();
            a.items().forEach(x -> list.add(plain(x)));
            return list;
        }
        if (v instanceof Json.StringValue s) {
            return s.text();
        }
        if (v instanceof Json.NumberValue) {
            return v.asLong("n");
        }
        if (v instanceof Json.BooleanValue b) {
            return b.value();
        }
        return null;
    }

    @Test
    void generatedTextsReadBackAsTheTreesTheyWereWrittenFrom() {
        // A writer that follows RFC 8259 §2-§7 (written here, independently of the reader);
        // duplicate names cannot occur as the trees are maps.
        long seed = 8259;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        for (int trial = 0; trial < 1000; trial++) {
            Object tree = randomTree(rng, 0);
            StringBuilder sb = new StringBuilder();
            write(tree, sb, rng);
            String text = sb.toString();
            int t = trial;
            assertEquals(tree, plain(parse(text)), () -> "seed " + seed + " trial " + t + ": "
                    + text);
        }
    }

    private static final String[] PIECES = {
        "{", "}", "[", "]", ",", ":", "\"", "\\", "\\u", "\\uD834", "0", "-", "1", ".", "e",
        "+", "true", "fals", "null", " ", "\n", "\r", "\t", "\u0000", "\uFEFF", "\uD834",
        "\uDD1E", "é", "/", "*", "NaN", "1e999999", "9".repeat(300), "[".repeat(70),
        "\"a\":", "{\"a\":1,\"a\":2}",
    };

    @Test
    void fuzzedTextsGiveOnlyIllegalArgumentExceptionAndAreReadFast() {
        // Robustness of a reader of untrusted text (common practice): mutated valid texts and
        // random pieces; any outcome but a tree or IllegalArgumentException fails. The time
        // bound is a generous guard against super-linear behaviour, not a speed target.
        long seed = 4627;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int refusedCount = 0;
        for (int trial = 0; trial < 4000; trial++) {
            String text;
            if (trial % 4 == 3) {
                StringBuilder sb = new StringBuilder();
                int n = rng.nextInt(40);
                for (int i = 0; i < n; i++) {
                    sb.append(PIECES[rng.nextInt(PIECES.length)]);
                }
                text = sb.toString();
            } else {
                StringBuilder sb = new StringBuilder();
                write(randomTree(rng, 0), sb, rng);
                int edits = 1 + rng.nextInt(4);
                for (int i = 0; i < edits; i++) {
                    int at = rng.nextInt(sb.length() + 1);
                    switch (rng.nextInt(4)) {
                        case 0:
                            sb.insert(at, PIECES[rng.nextInt(PIECES.length)]);
                            break;
                        case 1:
                            if (at < sb.length()) {
                                sb.deleteCharAt(at);
                            }
                            break;
                        case 2:
                            if (at < sb.length()) {
                                sb.setCharAt(at, (char) rng.nextInt(0x80));
                            }
                            break;
                        default:
                            sb.setLength(at);
                            break;
                    }
                }
                text = sb.toString();
            }
            long start = System.nanoTime();
            try {
                Objects.requireNonNull(parse(text));
            } catch (IllegalArgumentException e) {
                refusedCount++;
                assertTrue(PLACE.matcher(e.getMessage()).find(), e.getMessage());
            } catch (RuntimeException | StackOverflowError | OutOfMemoryError e) {
                fail("seed " + seed + " trial " + trial + ": " + e + " for text: "
                        + TextFiles.shown(text), e);
            }
            long micros = (System.nanoTime() - start) / 1000;
            int t = trial;
            assertTrue(micros < 1_000_000, () -> "seed " + seed + " trial " + t + " took "
                    + micros + " µs");
        }
        assertTrue(refusedCount > 1000 && refusedCount < 4000, "the fuzz reaches both outcomes: "
                + refusedCount + " refused");
    }

    @Test
    void adversarialTextsTakeLinearTime() {
        // Inputs that make naive readers quadratic (common practice): many escapes, long
        // strings, many members, long numbers. Each is about 1 MB; the bound is generous.
        StringBuilder members = new StringBuilder("{");
        for (int i = 0; i < 100_000; i++) {
            members.append("\"k").append(i).append("\":1,");
        }
        String[] texts = {
            "\"" + "\\u0041".repeat(170_000) + "\"",
            "\"" + "a".repeat(1_000_000) + "\"",
            members.append("\"z\":0}").toString(),
            "[" + "1.5e-3,".repeat(150_000) + "0]",
            "[".repeat(Json.MAX_DEPTH) + "1" + "]".repeat(Json.MAX_DEPTH) + " ".repeat(1_000_000),
        };
        for (String text : texts) {
            long start = System.nanoTime();
            assertFalse(Json.parse(text, 1 << 22, 1 << 22).describe().isEmpty());
            long millis = (System.nanoTime() - start) / 1_000_000;
            assertTrue(millis < 2_000, () -> millis + " ms for " + TextFiles.shown(text));
        }
        assertInstanceOf(Json.ObjectValue.class, parse("{\"k\":1}"));
    }
}
