package dev.qsim.stats;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;

import dev.qsim.Tally;

/**
 * Reads and writes tallies as text, for example the counts a device reported.
 *
 * <p>CSV: the format of {@link Tally#toCsv()}: a header line {@code bits,count}, then one line
 * {@code BITS,COUNT} per outcome. Blank lines and lines starting with {@code #} are skipped;
 * spaces around fields are ignored.
 *
 * <p>JSON (RFC 8259, Bray 2017, doi:10.17487/RFC8259): one object with a number
 * {@code "width"} and an object {@code "counts"} from bitstring to count, as in
 * <pre>{"width": 3, "counts": {"000": 12, "111": 9}}</pre>
 * Other members (such as a device name) are allowed and ignored.
 *
 * <p>Bad text throws {@link IllegalArgumentException} naming the line, the bad value and what is
 * allowed. Stateless and thread-safe.
 *
 * @since 0.1
 */
public final class TallyFiles {
    private TallyFiles() {
    }

    /**
     * Reads a tally from CSV or JSON text, telling them apart by the first non-blank character
     * (an opening brace or bracket for JSON).
     *
     * @param text the text
     * @return the tally
     * @throws IllegalArgumentException if the text is not a valid tally in either format
     */
    public static Tally read(String text) {
        Objects.requireNonNull(text, "text");
        String t = text.strip();
        return t.startsWith("{") || t.startsWith("[") ? readJson(text) : readCsv(text);
    }

    /**
     * Reads a tally from a UTF-8 file of CSV or JSON, as {@link #read(String)}.
     *
     * @param file the file
     * @return the tally
     * @throws IOException if the file cannot be read
     * @throws IllegalArgumentException if the text is not a valid tally; the message starts with
     *     the file name
     */
    public static Tally read(Path file) throws IOException {
        Objects.requireNonNull(file, "file");
        String text = Files.readString(file, StandardCharsets.UTF_8);
        try {
            return read(text);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(file + ": " + e.getMessage(), e);
        }
    }

    /**
     * Reads a tally from CSV text with the header {@code bits,count}.
     *
     * @param text the CSV text
     * @return the tally
     * @throws IllegalArgumentException if the header is missing, a line does not have two
     *     fields, a bitstring repeats or has another width than the first, a count is not a
     *     non-negative whole number, or the counts sum to zero
     */
    public static Tally readCsv(String text) {
        Objects.requireNonNull(text, "text");
        String[] lines = text.split("\r?\n|\r", -1);
        Map<String, Long> counts = new TreeMap<>();
        int width = -1;
        boolean header = false;
        for (int i = 0; i < lines.length; i++) {
            String line = lines[i].strip();
            int no = i + 1;
            if (line.isEmpty() || line.startsWith("#")) {
                continue;
            }
            if (!header) {
                if (!line.replace(" ", "").equalsIgnoreCase("bits,count")) {
                    throw new IllegalArgumentException("line " + no + ": expected the header"
                            + " 'bits,count' but found '" + clip(line) + "'");
                }
                header = true;
                continue;
            }
            String[] fields = line.split(",", -1);
            if (fields.length != 2) {
                throw new IllegalArgumentException("line " + no + ": expected 'bits,count' but"
                        + " found " + fields.length + " field(s) in '" + clip(line) + "'");
            }
            String bits = fields[0].strip();
            checkBits(bits, "line " + no);
            if (width < 0) {
                width = bits.length();
            } else if (bits.length() != width) {
                throw new IllegalArgumentException("line " + no + ": bitstring '" + clip(bits)
                        + "' has " + bits.length() + " bits but earlier lines have " + width);
            }
            long count = parseCount(fields[1].strip(), "line " + no);
            if (counts.put(bits, count) != null) {
                throw new IllegalArgumentException("line " + no + ": bitstring '" + bits
                        + "' appears twice");
            }
        }
        if (!header) {
            throw new IllegalArgumentException("no header 'bits,count' found: the text is empty");
        }
        if (width < 0) {
            throw new IllegalArgumentException("the CSV has a header but no outcome lines");
        }
        return Tally.of(width, counts);
    }

    /**
     * Reads a tally from JSON text of the form <code>{"width": 3, "counts": {"000": 12}}</code>.
     *
     * @param text the JSON text
     * @return the tally
     * @throws IllegalArgumentException if the text is not JSON, lacks {@code width} or
     *     {@code counts}, or holds a bad bitstring or count
     */
    public static Tally readJson(String text) {
        Objects.requireNonNull(text, "text");
        Object value = new Json(text).document();
        if (!(value instanceof Map)) {
            throw new IllegalArgumentException("a JSON tally must be an object with \"width\" and"
                    + " \"counts\", but the text holds " + Json.describe(value));
        }
        Map<?, ?> root = (Map<?, ?>) value;
        Object w = root.get("width");
        if (!(w instanceof Double) || !isWhole((Double) w) || (Double) w < 0
                || (Double) w > 4096) {
            throw new IllegalArgumentException("\"width\" must be a whole number from 0 to 4096"
                    + " but was " + (w == null ? "missing" : Json.describe(w)));
        }
        int width = (int) (double) (Double) w;
        Object c = root.get("counts");
        if (!(c instanceof Map)) {
            throw new IllegalArgumentException("\"counts\" must be an object from bitstring to"
                    + " count but was " + (c == null ? "missing" : Json.describe(c)));
        }
        Map<String, Long> counts = new TreeMap<>();
        for (Map.Entry<?, ?> e : ((Map<?, ?>) c).entrySet()) {
            String bits = (String) e.getKey();
            checkBits(bits, "counts");
            if (bits.length() != width) {
                throw new IllegalArgumentException("counts: bitstring '" + clip(bits) + "' has "
                        + bits.length() + " bits but \"width\" is " + width);
            }
            Object v = e.getValue();
            if (!(v instanceof Double) || !isWhole((Double) v) || (Double) v < 0
                    || (Double) v > 9.007199254740992E15) {
                throw new IllegalArgumentException("counts: the count of '" + bits + "' must be"
                        + " a whole number from 0 to 2^53 but was " + Json.describe(v));
            }
            counts.put(bits, (long) (double) (Double) v);
        }
        return Tally.of(width, counts);
    }

    /**
     * Writes a tally as JSON: {@code width}, {@code shots} (informative; ignored when read) and
     * {@code counts} by bitstring, two-space indented, ending in {@code '\n'}.
     *
     * @param tally the tally
     * @return the JSON text
     */
    public static String toJson(Tally tally) {
        Objects.requireNonNull(tally, "tally");
        StringBuilder sb = new StringBuilder("{\n  \"width\": ").append(tally.width())
                .append(",\n  \"shots\": ").append(tally.shots()).append(",\n  \"counts\": {");
        boolean first = true;
        for (Map.Entry<String, Long> e : tally.outcomes().entrySet()) {
            sb.append(first ? "\n" : ",\n").append("    \"").append(e.getKey()).append("\": ")
                    .append(e.getValue());
            first = false;
        }
        return sb.append(first ? "}\n}\n" : "\n  }\n}\n").toString();
    }

    /**
     * Writes a tally as CSV, the same text as {@link Tally#toCsv()}.
     *
     * @param tally the tally
     * @return the CSV text
     */
    public static String toCsv(Tally tally) {
        return Objects.requireNonNull(tally, "tally").toCsv();
    }

    private static boolean isWhole(double v) {
        return v == Math.rint(v) && !Double.isInfinite(v);
    }

    private static void checkBits(String bits, String where) {
        for (int i = 0; i < bits.length(); i++) {
            char ch = bits.charAt(i);
            if (ch != '0' && ch != '1') {
                throw new IllegalArgumentException(where + ": bitstring '" + clip(bits)
                        + "' has '" + ch + "' at position " + i + "; only '0' and '1' are allowed");
            }
        }
    }

    private static long parseCount(String s, String where) {
        try {
            long v = Long.parseLong(s);
            if (v >= 0) {
                return v;
            }
        } catch (NumberFormatException e) {
            // reported below
        }
        throw new IllegalArgumentException(where + ": count '" + clip(s) + "' must be a whole"
                + " number from 0 to " + Long.MAX_VALUE);
    }

    static String clip(String s) {
        return s.length() <= 60 ? s : s.substring(0, 57) + "...";
    }

    /** A minimal JSON reader (RFC 8259): objects, arrays, strings, numbers, literals. */
    static final class Json {
        private final String s;
        private int pos;

        Json(String s) {
            this.s = s;
        }

        Object document() {
            skip();
            Object v = value(0);
            skip();
            if (pos < s.length()) {
                throw error("unexpected '" + s.charAt(pos) + "' after the JSON value");
            }
            return v;
        }

        static String describe(Object v) {
            if (v instanceof Map) {
                return "an object";
            }
            if (v instanceof java.util.List) {
                return "an array";
            }
            if (v instanceof String) {
                return "the string \"" + clip((String) v) + "\"";
            }
            if (v instanceof Double) {
                double d = (Double) v;
                return d == Math.rint(d) && Math.abs(d) < 1e15 ? Long.toString((long) d)
                        : Double.toString(d);
            }
            return String.valueOf(v);
        }

        private IllegalArgumentException error(String what) {
            int line = 1;
            int col = 1;
            for (int i = 0; i < pos && i < s.length(); i++) {
                if (s.charAt(i) == '\n') {
                    line++;
                    col = 1;
                } else {
                    col++;
                }
            }
            return new IllegalArgumentException("JSON line " + line + ", column " + col + ": "
                    + what);
        }

        private void skip() {
            while (pos < s.length()) {
                char c = s.charAt(pos);
                if (c == ' ' || c == '\t' || c == '\n' || c == '\r') {
                    pos++;
                } else {
                    break;
                }
            }
        }

        private Object value(int depth) {
            if (depth > 64) {
                throw error("nesting deeper than 64 levels");
            }
            if (pos >= s.length()) {
                throw error("unexpected end of text; a value was expected");
            }
            char c = s.charAt(pos);
            switch (c) {
                case '{':
                    return object(depth);
                case '[':
                    return array(depth);
                case '"':
                    return string();
                case 't':
                    return literal("true", Boolean.TRUE);
                case 'f':
                    return literal("false", Boolean.FALSE);
                case 'n':
                    return literal("null", null);
                default:
                    if (c == '-' || (c >= '0' && c <= '9')) {
                        return number();
                    }
                    throw error("unexpected '" + c + "'; a value was expected");
            }
        }

        private Object literal(String word, Object v) {
            if (!s.startsWith(word, pos)) {
                throw error("unknown word; only true, false and null are allowed");
            }
            pos += word.length();
            return v;
        }

        private Map<String, Object> object(int depth) {
            Map<String, Object> map = new LinkedHashMap<>();
            pos++;
            skip();
            if (pos < s.length() && s.charAt(pos) == '}') {
                pos++;
                return map;
            }
            while (true) {
                skip();
                if (pos >= s.length() || s.charAt(pos) != '"') {
                    throw error("a member name in double quotes was expected");
                }
                int at = pos;
                String key = string();
                skip();
                expect(':');
                skip();
                Object v = value(depth + 1);
                if (map.containsKey(key)) {
                    pos = at;
                    throw error("member \"" + clip(key) + "\" appears twice");
                }
                map.put(key, v);
                skip();
                if (pos < s.length() && s.charAt(pos) == ',') {
                    pos++;
                    continue;
                }
                expect('}');
                return map;
            }
        }

        private java.util.List<Object> array(int depth) {
            java.util.List<Object> list = new java.util.ArrayList<>();
            pos++;
            skip();
            if (pos < s.length() && s.charAt(pos) == ']') {
                pos++;
                return list;
            }
            while (true) {
                skip();
                list.add(value(depth + 1));
                skip();
                if (pos < s.length() && s.charAt(pos) == ',') {
                    pos++;
                    continue;
                }
                expect(']');
                return list;
            }
        }

        private void expect(char c) {
            if (pos >= s.length() || s.charAt(pos) != c) {
                throw error("'" + c + "' was expected");
            }
            pos++;
        }

        private String string() {
            StringBuilder sb = new StringBuilder();
            pos++;
            while (true) {
                if (pos >= s.length()) {
                    throw error("unterminated string");
                }
                char c = s.charAt(pos++);
                if (c == '"') {
                    return sb.toString();
                }
                if (c < 0x20) {
                    pos--;
                    throw error("control character in a string");
                }
                if (c != '\\') {
                    sb.append(c);
                    continue;
                }
                if (pos >= s.length()) {
                    throw error("unterminated string");
                }
                char e = s.charAt(pos++);
                switch (e) {
                    case '"': case '\\': case '/':
                        sb.append(e);
                        break;
                    case 'b':
                        sb.append('\b');
                        break;
                    case 'f':
                        sb.append('\f');
                        break;
                    case 'n':
                        sb.append('\n');
                        break;
                    case 'r':
                        sb.append('\r');
                        break;
                    case 't':
                        sb.append('\t');
                        break;
                    case 'u':
                        if (pos + 4 > s.length()) {
                            throw error("incomplete \\u escape");
                        }
                        try {
                            sb.append((char) Integer.parseInt(s.substring(pos, pos + 4), 16));
                        } catch (NumberFormatException x) {
                            throw error("bad \\u escape");
                        }
                        pos += 4;
                        break;
                    default:
                        pos--;
                        throw error("unknown escape '\\" + e + "'");
                }
            }
        }

        private static boolean isAsciiDigit(char c) {
            return c >= '0' && c <= '9';
        }

        private Double number() {
            int start = pos;
            if (s.charAt(pos) == '-') {
                pos++;
            }
            int digits = pos;
            while (pos < s.length() && isAsciiDigit(s.charAt(pos))) {
                pos++;
            }
            if (pos == digits) {
                throw error("a digit was expected");
            }
            if (pos < s.length() && s.charAt(pos) == '.') {
                pos++;
                int frac = pos;
                while (pos < s.length() && isAsciiDigit(s.charAt(pos))) {
                    pos++;
                }
                if (pos == frac) {
                    throw error("a digit was expected after '.'");
                }
            }
            if (pos < s.length() && (s.charAt(pos) == 'e' || s.charAt(pos) == 'E')) {
                pos++;
                if (pos < s.length() && (s.charAt(pos) == '+' || s.charAt(pos) == '-')) {
                    pos++;
                }
                int exp = pos;
                while (pos < s.length() && isAsciiDigit(s.charAt(pos))) {
                    pos++;
                }
                if (pos == exp) {
                    throw error("a digit was expected in the exponent");
                }
            }
            return Double.valueOf(s.substring(start, pos));
        }
    }
}
