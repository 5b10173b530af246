package dev.qsim.stats;

import java.io.IOException;
import java.nio.file.Path;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;

import dev.qsim.Tally;
import dev.qsim.internal.Json;
import dev.qsim.internal.TextFiles;

/**
 * Reads and writes tallies as text, for example the counts a device reported.
 *
 * <p>CSV: the format of {@link Tally#toCsv()}: a header line {@code bits,count}, then one line
 * {@code BITS,COUNT} per outcome. Blank lines and lines starting with {@code #} are skipped;
 * spaces around fields are ignored.
 *
 * <p>JSON (RFC 8259, Bray 2017, doi:10.17487/RFC8259): one object with an object
 * {@code "outcomes"} from bitstring to count (the word of {@link Tally#outcomes()}) and, if
 * wanted, a whole number {@code "width"}, as in
 * <pre>{"width": 3, "outcomes": {"000": 12, "111": 9}}</pre>
 * Without {@code "width"} the width is the length of the bitstrings, which must then all have
 * one length. A {@code "shots"} member (as {@link #toJson(Tally)} writes) must equal the sum
 * of the counts; other members (such as a device name) are allowed and ignored. The JSON is
 * read by qsim's strict reader: RFC 8259 exactly, so no comments, trailing commas or leading
 * zeros.
 *
 * <p>In both formats a bitstring has only {@code 0} and {@code 1} and at most
 * {@value #MAX_WIDTH} of them; a count is a whole number from 0 to {@link Long#MAX_VALUE}
 * written without sign or leading zeros, and the counts may not sum to more than
 * {@link Long#MAX_VALUE}; a text holds at most {@value #MAX_OUTCOMES} outcomes and
 * {@value #MAX_CHARS} characters (a file at most as many bytes, checked before reading). A
 * byte-order mark at the start of a text or file is ignored (spreadsheets save one).
 *
 * <p>Bad text throws {@link IllegalArgumentException} naming the line (and for JSON the
 * column), the bad value and what is allowed. Stateless and thread-safe.
 *
 * @since 0.1
 */
public final class TallyFiles {
    /** The widest bitstring read, in bits. */
    public static final int MAX_WIDTH = 4096;

    /** The most outcomes (distinct bitstrings) one text may hold. */
    public static final int MAX_OUTCOMES = 1 << 20;

    /**
     * The longest text read, in characters; files are limited to as many bytes, which is enough
     * for {@value #MAX_OUTCOMES} outcomes of 20 bits in either format.
     */
    public static final int MAX_CHARS = 1 << 25;

    private TallyFiles() {
    }

    /**
     * Reads a tally from CSV or JSON text, telling them apart by the first non-blank character
     * (an opening brace or bracket for JSON).
     *
     * @param text the text
     * @return the tally
     * @throws IllegalArgumentException if the text is longer than {@value #MAX_CHARS} characters
     *     (checked first) or is not a valid tally in either format
     */
    public static Tally read(String text) {
        Objects.requireNonNull(text, "text");
        requireLength(text);
        String t = TextFiles.withoutBom(text);
        int i = 0;
        while (i < t.length() && Character.isWhitespace(t.charAt(i))) {
            i++;
        }
        boolean json = i < t.length() && (t.charAt(i) == '{' || t.charAt(i) == '[');
        return json ? readJson(text) : readCsv(text);
    }

    /**
     * Reads a tally from a UTF-8 file of CSV or JSON, as {@link #read(String)}.
     *
     * @param file the file
     * @return the tally
     * @throws IOException if the file cannot be read
     * @throws IllegalArgumentException if the file is larger than {@value #MAX_CHARS} bytes
     *     (checked before reading), is not UTF-8, or is not a valid tally; the message starts
     *     with the file name
     */
    public static Tally read(Path file) throws IOException {
        Objects.requireNonNull(file, "file");
        try {
            return read(TextFiles.readUtf8(file, MAX_CHARS, "the tally file"));
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(file + ": " + e.getMessage(), e);
        }
    }

    /**
     * Reads a tally from CSV text with the header {@code bits,count}.
     *
     * @param text the CSV text
     * @return the tally
     * @throws IllegalArgumentException if the text is too long, the header is missing, a line
     *     does not have two fields, a bitstring repeats or has another width than the first or
     *     too many bits, a count is not a whole number from 0 to {@link Long#MAX_VALUE} without
     *     sign or leading zeros, there are too many outcomes, or the counts sum to zero or to
     *     more than {@link Long#MAX_VALUE}
     */
    public static Tally readCsv(String text) {
        Objects.requireNonNull(text, "text");
        requireLength(text);
        String[] lines = TextFiles.withoutBom(text).split("\r?\n|\r", -1);
        Map<String, Long> counts = new TreeMap<>();
        int width = -1;
        long total = 0;
        boolean header = false;
        for (int i = 0; i < lines.length; i++) {
            String line = lines[i].strip();
            String where = "line " + (i + 1);
            if (line.isEmpty() || line.startsWith("#")) {
                continue;
            }
            if (!header) {
                if (!line.replace(" ", "").equalsIgnoreCase("bits,count")) {
                    throw new IllegalArgumentException(where + ": expected the header"
                            + " 'bits,count' but found '" + TextFiles.shown(line) + "'");
                }
                header = true;
                continue;
            }
            String[] fields = line.split(",", -1);
            if (fields.length != 2) {
                throw new IllegalArgumentException(where + ": expected 'bits,count' but found "
                        + fields.length + " field(s) in '" + TextFiles.shown(line) + "'");
            }
            String bits = fields[0].strip();
            checkBits(bits, where);
            if (width < 0) {
                width = bits.length();
            } else if (bits.length() != width) {
                throw new IllegalArgumentException(where + ": bitstring '"
                        + TextFiles.shown(bits) + "' has " + bits.length()
                        + " bits but earlier lines have " + width);
            }
            long count = parseCount(fields[1].strip(), where);
            if (counts.put(bits, count) != null) {
                throw new IllegalArgumentException(where + ": bitstring '"
                        + TextFiles.shown(bits) + "' appears twice");
            }
            requireOutcomes(counts.size(), where);
            total = addCount(total, count, where);
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
     * Reads a tally from JSON text of the form
     * <code>{"width": 3, "outcomes": {"000": 12}}</code>, {@code "width"} optional.
     *
     * @param text the JSON text
     * @return the tally
     * @throws IllegalArgumentException if the text is too long or not JSON (RFC 8259), is not
     *     an object, lacks {@code "outcomes"}, has a bad {@code "width"}, holds a bad bitstring
     *     or count or too many outcomes, the counts sum to zero or to more than
     *     {@link Long#MAX_VALUE}, or a {@code "shots"} differs from their sum; the message gives
     *     the line and column
     */
    public static Tally readJson(String text) {
        Objects.requireNonNull(text, "text");
        requireLength(text);
        Json.ObjectValue root = Json.parse(text, MAX_CHARS, 2L * MAX_OUTCOMES)
                .asObject("a JSON tally");
        Json.Value o = root.get("outcomes");
        if (o == null) {
            throw root.error("a JSON tally needs \"outcomes\", an object from bitstring to count"
                    + (root.get("counts") != null ? "; \"counts\" is not read: the map is named"
                    + " \"outcomes\"" : ""));
        }
        Json.ObjectValue outcomes = o.asObject("\"outcomes\"");
        Json.Value w = root.get("width");
        int width = w == null ? -1 : (int) w.asLong("\"width\"", 0, MAX_WIDTH);
        String first = null;
        Map<String, Long> counts = new TreeMap<>();
        long total = 0;
        int index = 0;
        for (Map.Entry<String, Json.Value> e : outcomes.members().entrySet()) {
            String bits = e.getKey();
            int i = index++;
            if (bitsProblem(bits) != null) {
                checkBits(bits, outcomes.nameAt(i));
            }
            if (width < 0) {
                width = bits.length();
                first = bits;
            } else if (bits.length() != width) {
                throw new IllegalArgumentException(outcomes.nameAt(i) + ": bitstring '"
                        + TextFiles.shown(bits) + "' has " + bits.length() + " bits but "
                        + (first == null ? "\"width\" is " + width : "'"
                        + TextFiles.shown(first) + "' has " + width
                        + "; give bitstrings of one length"));
            }
            Json.Value v = e.getValue();
            long count = v.asLong("the count of '" + TextFiles.shown(bits) + "'", 0,
                    Long.MAX_VALUE);
            counts.put(bits, count);
            if (counts.size() > MAX_OUTCOMES) {
                requireOutcomes(counts.size(), outcomes.nameAt(i));
            }
            if (total > Long.MAX_VALUE - count) {
                addCount(total, count, v.at());
            }
            total += count;
        }
        if (width < 0) {
            throw outcomes.error("\"outcomes\" is empty and no \"width\" is given; a tally needs"
                    + " at least one outcome with a count above 0");
        }
        Json.Value shots = root.get("shots");
        if (shots != null) {
            long stated = shots.asLong("\"shots\"", 0, Long.MAX_VALUE);
            if (stated != total) {
                throw shots.error("\"shots\" is " + stated + " but the counts of \"outcomes\""
                        + " sum to " + total + "; the file may be cut short or edited");
            }
        }
        return Tally.of(width, counts);
    }

    /**
     * Writes a tally as JSON: {@code width}, {@code shots} (checked against the counts when read)
     * and {@code outcomes} by bitstring, two-space indented, ending in {@code '\n'}.
     *
     * @param tally the tally
     * @return the JSON text
     */
    public static String toJson(Tally tally) {
        Objects.requireNonNull(tally, "tally");
        StringBuilder sb = new StringBuilder("{\n  \"width\": ").append(tally.width())
                .append(",\n  \"shots\": ").append(tally.shots()).append(",\n  \"outcomes\": {");
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

    private static void requireLength(String text) {
        if (text.length() > MAX_CHARS) {
            throw new IllegalArgumentException("the tally text has " + text.length()
                    + " characters, more than the " + MAX_CHARS + " allowed");
        }
    }

    private static void requireOutcomes(int outcomes, String where) {
        if (outcomes > MAX_OUTCOMES) {
            throw new IllegalArgumentException(where + ": more than " + MAX_OUTCOMES
                    + " outcomes, the most a tally text may hold");
        }
    }

    private static long addCount(long total, long count, String where) {
        try {
            return Math.addExact(total, count);
        } catch (ArithmeticException e) {
            throw new IllegalArgumentException(where + ": the counts sum to more than "
                    + Long.MAX_VALUE + " shots, the most a tally can hold");
        }
    }

    private static void checkBits(String bits, String where) {
        String problem = bitsProblem(bits);
        if (problem != null) {
            throw new IllegalArgumentException(where + ": bitstring '" + TextFiles.shown(bits)
                    + "' " + problem);
        }
    }

    /** What is wrong with a bitstring, or null if nothing. */
    private static String bitsProblem(String bits) {
        if (bits.length() > MAX_WIDTH) {
            return "has " + bits.length() + " bits; at most " + MAX_WIDTH + " are allowed";
        }
        for (int i = 0; i < bits.length(); i++) {
            char ch = bits.charAt(i);
            if (ch != '0' && ch != '1') {
                return "has " + TextFiles.character(bits, i) + " at position " + i
                        + "; only '0' and '1' are allowed";
            }
        }
        return null;
    }

    /** A count: ASCII digits without sign or leading zeros, at most Long.MAX_VALUE. */
    private static long parseCount(String s, String where) {
        boolean digits = !s.isEmpty() && s.length() <= 19
                && (s.length() == 1 || s.charAt(0) != '0');
        for (int i = 0; digits && i < s.length(); i++) {
            digits = s.charAt(i) >= '0' && s.charAt(i) <= '9';
        }
        if (digits) {
            try {
                return Long.parseLong(s);
            } catch (NumberFormatException e) {
                // beyond Long.MAX_VALUE: reported below
            }
        }
        throw new IllegalArgumentException(where + ": count '" + TextFiles.shown(s) + "' must be"
                + " a whole number from 0 to " + Long.MAX_VALUE + ", written with digits 0-9"
                + " only, without sign or leading zeros");
    }
}
