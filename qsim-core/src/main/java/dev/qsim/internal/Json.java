package dev.qsim.internal;

import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;

/**
 * The one JSON reader of qsim: strict RFC 8259 (Bray 2017, "The JavaScript Object Notation
 * (JSON) Data Interchange Format", doi:10.17487/RFC8259), giving a small tree of
 * {@link Value}s. Every file format of qsim that is JSON reads through it. Internal: this
 * package is not exported.
 *
 * <p>Accepted is exactly the grammar of RFC 8259 §2-§7: whitespace is space, tab, line feed
 * and carriage return; literals are {@code true}, {@code false}, {@code null}; numbers are
 * {@code -? (0 | [1-9][0-9]*) (. [0-9]+)? ([eE] [+-]? [0-9]+)?} (no leading zeros, no plus
 * sign, no {@code NaN} or {@code Infinity}); strings are in double quotes with the escapes
 * {@code \" \\ \/ \b \f \n \r \t \}{@code uXXXX} and no raw control characters; no trailing
 * commas, no comments. Refused as well, within the limits RFC 8259 §9 allows a reader: object
 * members whose names repeat (§4 leaves their meaning open), unpaired surrogates, raw or
 * escaped (§8.2 calls them unpredictable; RFC 7493 §2.1 forbids them), numbers longer than
 * {@value #MAX_NUMBER_CHARS} characters, texts longer than the caller's limit, nesting deeper
 * than {@value #MAX_DEPTH} and more values than the caller's limit. A byte-order mark at the
 * start is ignored (§8.1 allows it).
 *
 * <p>Hostile text cannot break the reader: the size is checked before reading, the parse is
 * one iterative pass (no recursion, so no {@link StackOverflowError}) in time linear in the
 * length, memory is bounded by the value limit, and every failure is an
 * {@link IllegalArgumentException} whose message starts with {@code JSON line L, column C:}
 * (lines counted from 1 at line feeds, carriage returns and their pairs; columns in UTF-16
 * units from 1) and quotes the text only through {@link TextFiles#shown(String)}.
 */
public final class Json {
    /** The deepest nesting of arrays and objects accepted. */
    public static final int MAX_DEPTH = 64;

    /** The longest number accepted, in characters. */
    public static final int MAX_NUMBER_CHARS = 256;

    private final String s;
    private final int end;
    private final long maxValues;
    private int pos;
    private int line = 1;
    private int lineStart;
    private long values;

    private Json(String s, int start, long maxValues) {
        this.s = s;
        this.end = s.length();
        this.pos = start;
        this.lineStart = start;
        this.maxValues = maxValues;
    }

    /**
     * Reads one JSON text.
     *
     * @param text the text; a byte-order mark at its start is ignored
     * @param maxChars the longest text accepted, checked before reading
     * @param maxValues the most values (objects, arrays, strings, numbers, literals, member
     *     names not counted) accepted
     * @return the value the text holds
     * @throws IllegalArgumentException if the text is longer than {@code maxChars}, holds more
     *     than {@code maxValues} values, or is not JSON as described above
     */
    public static Value parse(String text, int maxChars, long maxValues) {
        Objects.requireNonNull(text, "text");
        if (text.length() > maxChars) {
            throw new IllegalArgumentException("the JSON text has " + text.length()
                    + " characters, more than the " + maxChars + " allowed");
        }
        int start = !text.isEmpty() && text.charAt(0) == TextFiles.BYTE_ORDER_MARK ? 1 : 0;
        return new Json(text, start, maxValues).document();
    }

    // ---------------------------------------------------------------- the tree

    /**
     * A JSON value with the line and column where it starts. The typed accessors refuse a
     * value of another kind with a message naming its place, its path and what was expected.
     */
    public sealed interface Value permits ObjectValue, ArrayValue, StringValue, NumberValue,
            BooleanValue, NullValue {
        /**
         * Returns the line of the value's first character, from 1.
         *
         * @return the line
         */
        int line();

        /**
         * Returns the column of the value's first character, from 1.
         *
         * @return the column
         */
        int column();

        /**
         * Describes the value for a message: "an object", "an array", "the string "..."",
         * "the number 1.5", "true", "false" or "null".
         *
         * @return the description
         */
        String describe();

        /**
         * Returns the place of the value for a message, "line L, column C".
         *
         * @return the place
         */
        default String at() {
            return "line " + line() + ", column " + column();
        }

        /**
         * Returns an exception for this value: its place, then the message.
         *
         * @param message what is wrong
         * @return the exception, to throw
         */
        default IllegalArgumentException error(String message) {
            return new IllegalArgumentException(at() + ": " + message);
        }

        /**
         * Returns the value as an object.
         *
         * @param path the value's name in the format, for the message ("qubits[2]")
         * @return the object
         * @throws IllegalArgumentException if it is not an object
         */
        default ObjectValue asObject(String path) {
            if (this instanceof ObjectValue o) {
                return o;
            }
            throw error(path + " must be an object but is " + describe());
        }

        /**
         * Returns the value as an array.
         *
         * @param path the value's name in the format
         * @return the array
         * @throws IllegalArgumentException if it is not an array
         */
        default ArrayValue asArray(String path) {
            if (this instanceof ArrayValue a) {
                return a;
            }
            throw error(path + " must be an array but is " + describe());
        }

        /**
         * Returns the value as a string.
         *
         * @param path the value's name in the format
         * @return the string
         * @throws IllegalArgumentException if it is not a string
         */
        default String asString(String path) {
            if (this instanceof StringValue t) {
                return t.text();
            }
            throw error(path + " must be a string but is " + describe());
        }

        /**
         * Returns the value as a finite double (the nearest one to the number written).
         *
         * @param path the value's name in the format
         * @return the number
         * @throws IllegalArgumentException if it is not a number or is too large for a double
         */
        default double asDouble(String path) {
            if (this instanceof NumberValue n) {
                double d = Double.parseDouble(n.text());
                if (Double.isInfinite(d)) {
                    throw error(path + " is " + describe() + ", beyond the range of a double"
                            + " (about 1.8e308)");
                }
                return d;
            }
            throw error(path + " must be a number but is " + describe());
        }

        /**
         * Returns the value as a whole number. JSON has one number type (RFC 8259 §6), so
         * {@code 12}, {@code 12.0} and {@code 1.2e1} are the same number and all accepted.
         *
         * @param path the value's name in the format
         * @return the number
         * @throws IllegalArgumentException if it is not a number, not whole, or outside the
         *     range of a {@code long}
         */
        default long asLong(String path) {
            if (!(this instanceof NumberValue n)) {
                throw error(path + " must be a whole number but is " + describe());
            }
            BigDecimal d;
            try {
                d = new BigDecimal(n.text());
            } catch (NumberFormatException e) {
                // Only an exponent beyond the int range gets here (the grammar was checked).
                return hugeExponent(n.text(), path);
            }
            if (d.signum() == 0) {
                return 0;
            }
            d = d.stripTrailingZeros();
            if (d.scale() > 0) {
                throw error(path + " must be a whole number but is " + describe());
            }
            // precision - scale is the number of integer digits; check it before any
            // arithmetic so that 1e999999999 costs nothing.
            if ((long) d.precision() - d.scale() > 19) {
                throw error(path + " is " + describe() + ", beyond the range " + Long.MIN_VALUE
                        + " to " + Long.MAX_VALUE);
            }
            try {
                return d.longValueExact();
            } catch (ArithmeticException e) {
                throw error(path + " is " + describe() + ", beyond the range " + Long.MIN_VALUE
                        + " to " + Long.MAX_VALUE);
            }
        }

        private long hugeExponent(String text, String path) {
            int e = Math.max(text.indexOf('e'), text.indexOf('E'));
            boolean zero = true;
            for (int i = 0; i < e; i++) {
                char c = text.charAt(i);
                zero &= c == '0' || c == '.' || c == '-';
            }
            if (zero) {
                return 0;
            }
            if (text.charAt(e + 1) == '-') {
                throw error(path + " must be a whole number but is " + describe());
            }
            throw error(path + " is " + describe() + ", beyond the range " + Long.MIN_VALUE
                    + " to " + Long.MAX_VALUE);
        }

        /**
         * Returns the value as a whole number in a closed range.
         *
         * @param path the value's name in the format
         * @param min the smallest allowed
         * @param max the largest allowed
         * @return the number
         * @throws IllegalArgumentException if it is not a whole number in {@code [min, max]}
         */
        default long asLong(String path, long min, long max) {
            if (this instanceof NumberValue n) {
                long v;
                try {
                    v = asLong(path);
                } catch (IllegalArgumentException e) {
                    throw error(path + " must be a whole number from " + min + " to " + max
                            + " but is " + describe());
                }
                if (v < min || v > max) {
                    throw error(path + " must be a whole number from " + min + " to " + max
                            + " but is " + v);
                }
                return v;
            }
            throw error(path + " must be a whole number from " + min + " to " + max
                    + " but is " + describe());
        }
    }

    /**
     * An object: members in the order of the text; names are unique (repeats are refused).
     */
    public static final class ObjectValue implements Value {
        private final Map<String, Value> members;
        /** Line and column of each member's name, in member order. */
        private final int[] names;
        private final int line;
        private final int column;

        ObjectValue(Map<String, Value> members, int[] names, int line, int column) {
            this.members = Collections.unmodifiableMap(members);
            this.names = names;
            this.line = line;
            this.column = column;
        }

        /**
         * Returns the members by name, in text order.
         *
         * @return an unmodifiable map
         */
        public Map<String, Value> members() {
            return members;
        }

        @Override
        public int line() {
            return line;
        }

        @Override
        public int column() {
            return column;
        }

        @Override
        public String describe() {
            return "an object";
        }

        /**
         * Returns the place of the name of the member at an index (in text order), "line L,
         * column C".
         *
         * @param index the member's index, from 0
         * @return the place
         * @throws IndexOutOfBoundsException if there is no such member
         */
        public String nameAt(int index) {
            Objects.checkIndex(index, members.size());
            return "line " + names[2 * index] + ", column " + names[2 * index + 1];
        }

        /**
         * Returns the place of a member's name, "line L, column C", or the object's own place
         * if it has no such member. Takes time linear in the member count: for messages.
         *
         * @param name the member name
         * @return the place
         */
        public String nameAt(String name) {
            int i = 0;
            for (String n : members.keySet()) {
                if (n.equals(name)) {
                    return nameAt(i);
                }
                i++;
            }
            return at();
        }

        /**
         * Returns a member, or null if there is none of that name.
         *
         * @param name the member name
         * @return the member's value or null
         */
        public Value get(String name) {
            return members.get(name);
        }

        /**
         * Returns a member that must be present.
         *
         * @param name the member name
         * @param path the member's name in the format, for the message
         *     ("durationsNs.measurement")
         * @return the member's value
         * @throws IllegalArgumentException if it is missing
         */
        public Value require(String name, String path) {
            Value v = members.get(name);
            if (v == null) {
                throw error(path + " is missing; it is required");
            }
            return v;
        }

        /**
         * Refuses members with other names, so that a misspelt name is caught.
         *
         * @param allowed the allowed names
         * @param path the object's name in the format, for the message ("the profile")
         * @throws IllegalArgumentException at the first member whose name is not allowed; the
         *     message names it and lists the allowed names
         */
        public void requireOnly(Set<String> allowed, String path) {
            int i = 0;
            for (String name : members.keySet()) {
                if (!allowed.contains(name)) {
                    List<String> sorted = new ArrayList<>(allowed);
                    Collections.sort(sorted);
                    throw new IllegalArgumentException("line " + names[2 * i] + ", column "
                            + names[2 * i + 1] + ": unknown field \"" + TextFiles.shown(name)
                            + "\" in " + path + "; allowed: " + String.join(", ", sorted));
                }
                i++;
            }
        }
    }

    /**
     * An array.
     *
     * @param items the items in order; unmodifiable
     * @param line the line of the opening bracket
     * @param column the column of the opening bracket
     */
    public record ArrayValue(List<Value> items, int line, int column) implements Value {
        @Override
        public String describe() {
            return "an array";
        }
    }

    /**
     * A string, its escapes resolved.
     *
     * @param text the text
     * @param line the line of the opening quote
     * @param column the column of the opening quote
     */
    public record StringValue(String text, int line, int column) implements Value {
        @Override
        public String describe() {
            return "the string \"" + TextFiles.shown(text) + "\"";
        }
    }

    /**
     * A number, kept as it was written (RFC 8259 §6 leaves range and precision to the
     * reader); {@link Value#asDouble(String)} and {@link Value#asLong(String)} convert it.
     *
     * @param text the number as written, such as {@code -1.5e3}
     * @param line the line of its first character
     * @param column the column of its first character
     */
    public record NumberValue(String text, int line, int column) implements Value {
        @Override
        public String describe() {
            return "the number " + text;
        }
    }

    /**
     * {@code true} or {@code false}.
     *
     * @param value the truth value
     * @param line the line of its first character
     * @param column the column of its first character
     */
    public record BooleanValue(boolean value, int line, int column) implements Value {
        @Override
        public String describe() {
            return Boolean.toString(value);
        }
    }

    /**
     * {@code null}.
     *
     * @param line the line of its first character
     * @param column the column of its first character
     */
    public record NullValue(int line, int column) implements Value {
        @Override
        public String describe() {
            return "null";
        }
    }

    // ---------------------------------------------------------------- the parser

    /** An array or object being read. */
    private static final class Open {
        final Open parent;
        final boolean object;
        final int line;
        final int column;
        final List<Value> items;
        final Map<String, Value> members;
        int[] names;
        String key;

        Open(Open parent, boolean object, int line, int column) {
            this.parent = parent;
            this.object = object;
            this.line = line;
            this.column = column;
            this.items = object ? null : new ArrayList<>();
            this.members = object ? new LinkedHashMap<>() : null;
            this.names = object ? new int[8] : null;
        }

        Value close() {
            return object
                    ? new ObjectValue(members, Arrays.copyOf(names, 2 * members.size()), line,
                            column)
                    : new ArrayValue(Collections.unmodifiableList(items), line, column);
        }
    }

    private Value document() {
        Open top = null;
        int depth = 0;
        boolean afterComma = false;
        while (true) {
            // A value is expected here.
            skipWhitespace();
            count();
            Value v;
            char c = peek();
            if (c == '{' || c == '[') {
                if (depth == MAX_DEPTH) {
                    throw error("arrays and objects nest deeper than " + MAX_DEPTH
                            + " levels, the most allowed");
                }
                Open open = new Open(top, c == '{', line, column());
                pos++;
                skipWhitespace();
                if (peek() == (open.object ? '}' : ']')) {
                    pos++;
                    v = open.close();
                } else {
                    top = open;
                    depth++;
                    if (open.object) {
                        memberName(open);
                    }
                    continue;
                }
            } else {
                v = scalar(afterComma);
            }
            afterComma = false;
            // v is complete: add it to the open containers, closing those that end.
            while (true) {
                if (top == null) {
                    skipWhitespace();
                    if (pos < end) {
                        throw error("the JSON value ended before this " + found()
                                + "; a text holds one value");
                    }
                    return v;
                }
                if (top.object) {
                    top.members.put(top.key, v);
                } else {
                    top.items.add(v);
                }
                skipWhitespace();
                char next = peek();
                if (next == ',') {
                    pos++;
                    if (top.object) {
                        memberName(top);
                    } else {
                        afterComma = true;
                    }
                    break;
                }
                if (next == (top.object ? '}' : ']')) {
                    pos++;
                    v = top.close();
                    top = top.parent;
                    depth--;
                    continue;
                }
                throw error(top.object ? "',' or '}' was expected after a member but found "
                        + found() : "',' or ']' was expected after an item but found " + found());
            }
        }
    }

    private void count() {
        if (++values > maxValues) {
            throw error("the text holds more than " + maxValues + " values, the most allowed");
        }
    }

    /** Reads a member name and its colon, refusing a repeated name. */
    private void memberName(Open open) {
        skipWhitespace();
        if (peek() != '"') {
            throw error("a member name in double quotes was expected but found " + found()
                    + (peek() == '}' ? " (no comma may come before '}')" : ""));
        }
        int nameLine = line;
        int nameColumn = column();
        String key = string();
        Value earlier = open.members.get(key);
        if (earlier != null) {
            throw new IllegalArgumentException("JSON line " + nameLine + ", column " + nameColumn
                    + ": member \"" + TextFiles.shown(key) + "\" appears twice in one object"
                    + " (its first value is at " + earlier.at() + ")");
        }
        int i = 2 * open.members.size();
        if (i + 2 > open.names.length) {
            open.names = Arrays.copyOf(open.names, 2 * open.names.length);
        }
        open.names[i] = nameLine;
        open.names[i + 1] = nameColumn;
        open.key = key;
        skipWhitespace();
        if (peek() != ':') {
            throw error("':' was expected after the member name but found " + found());
        }
        pos++;
    }

    private Value scalar(boolean afterComma) {
        int l = line;
        int col = column();
        char c = peek();
        if (c == '"') {
            return new StringValue(string(), l, col);
        }
        if (c == '-' || (c >= '0' && c <= '9')) {
            return new NumberValue(number(), l, col);
        }
        if (s.startsWith("true", pos)) {
            pos += 4;
            return new BooleanValue(true, l, col);
        }
        if (s.startsWith("false", pos)) {
            pos += 5;
            return new BooleanValue(false, l, col);
        }
        if (s.startsWith("null", pos)) {
            pos += 4;
            return new NullValue(l, col);
        }
        if (isLetter(c)) {
            int e = pos;
            while (e < end && e - pos < 40 && isLetter(s.charAt(e))) {
                e++;
            }
            throw error("unknown word '" + TextFiles.shown(s.substring(pos, e)) + "'; the words"
                    + " of JSON are true, false and null (no NaN or Infinity)");
        }
        String hint = "";
        if (c == '/') {
            hint = " (JSON has no comments)";
        } else if (c == '\'') {
            hint = " (strings take double quotes)";
        } else if (c == '+') {
            hint = " (a number takes no plus sign)";
        } else if (c == '.') {
            hint = " (a number starts with a digit)";
        } else if (afterComma && c == ']') {
            hint = " (no comma may come before ']')";
        }
        throw error("a value was expected but found " + found() + hint);
    }

    private static boolean isLetter(char c) {
        return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z');
    }

    private String number() {
        int start = pos;
        if (peek() == '-') {
            pos++;
        }
        char first = peek();
        if (first == '0') {
            pos++;
            if (isDigit(peek())) {
                throw error("a number may not have a leading zero");
            }
        } else if (first >= '1' && first <= '9') {
            digits();
        } else {
            throw error("a digit was expected after '-' but found " + found());
        }
        if (peek() == '.') {
            pos++;
            if (!isDigit(peek())) {
                throw error("a digit was expected after '.' but found " + found());
            }
            digits();
        }
        if (peek() == 'e' || peek() == 'E') {
            pos++;
            if (peek() == '+' || peek() == '-') {
                pos++;
            }
            if (!isDigit(peek())) {
                throw error("a digit was expected in the exponent but found " + found());
            }
            digits();
        }
        if (pos - start > MAX_NUMBER_CHARS) {
            pos = start;
            throw error("a number of more than " + MAX_NUMBER_CHARS + " characters");
        }
        return s.substring(start, pos);
    }

    private void digits() {
        while (pos < end && isDigit(s.charAt(pos))) {
            pos++;
        }
    }

    private static boolean isDigit(char c) {
        return c >= '0' && c <= '9';
    }

    private String string() {
        pos++; // the opening quote
        StringBuilder sb = null;
        int run = pos;
        while (true) {
            if (pos >= end) {
                throw error("the string does not end: a closing '\"' was expected before the"
                        + " end of the text");
            }
            char c = s.charAt(pos);
            if (c == '"') {
                String out = sb == null ? s.substring(run, pos)
                        : sb.append(s, run, pos).toString();
                pos++;
                return out;
            }
            if (c < 0x20) {
                throw error("a control character (" + TextFiles.character(s, pos) + ") in a"
                        + " string; write it as an escape such as \\n or \\u0009");
            }
            if (Character.isHighSurrogate(c)) {
                if (pos + 1 < end && Character.isLowSurrogate(s.charAt(pos + 1))) {
                    pos += 2;
                    continue;
                }
                throw error("an unpaired surrogate (" + TextFiles.character(s, pos) + ") in a"
                        + " string");
            }
            if (Character.isLowSurrogate(c)) {
                throw error("an unpaired surrogate (" + TextFiles.character(s, pos) + ") in a"
                        + " string");
            }
            if (c != '\\') {
                pos++;
                continue;
            }
            if (sb == null) {
                sb = new StringBuilder();
            }
            sb.append(s, run, pos);
            pos++;
            if (pos >= end) {
                throw error("the string does not end: an escape was cut off by the end of the"
                        + " text");
            }
            char e = s.charAt(pos);
            switch (e) {
                case '"':
                case '\\':
                case '/':
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
                    int backslash = pos - 1;
                    char u = hex4(pos + 1);
                    if (Character.isHighSurrogate(u) && s.startsWith("\\u", pos + 5)) {
                        char low = hex4(pos + 7);
                        if (Character.isLowSurrogate(low)) {
                            sb.append(u).append(low);
                            pos += 10; // the last hex digit of the second escape
                            break;
                        }
                    }
                    if (Character.isSurrogate(u)) {
                        pos = backslash;
                        throw error("the escape \\u" + s.substring(pos + 2, pos + 6)
                                + " is half of a surrogate pair without its other half");
                    }
                    sb.append(u);
                    pos += 4; // the last hex digit
                    break;
                default:
                    throw error("unknown escape: a backslash followed by " + found()
                            + "; the escapes are \\\" \\\\ \\/ \\b \\f \\n \\r \\t and"
                            + " \\uXXXX");
            }
            pos++;
            run = pos;
        }
    }

    /** Reads the four hex digits from index {@code at}; pos is unchanged unless they fail. */
    private char hex4(int at) {
        int v = 0;
        for (int i = at; i < at + 4; i++) {
            char c = i < end ? s.charAt(i) : '\0';
            int d;
            if (c >= '0' && c <= '9') {
                d = c - '0';
            } else if (c >= 'a' && c <= 'f') {
                d = c - 'a' + 10;
            } else if (c >= 'A' && c <= 'F') {
                d = c - 'A' + 10;
            } else {
                pos = Math.min(i, end);
                throw error("\\u takes four hex digits but found " + found());
            }
            v = 16 * v + d;
        }
        return (char) v;
    }

    private char peek() {
        return pos < end ? s.charAt(pos) : '\0';
    }

    private String found() {
        return pos < end ? TextFiles.character(s, pos) : "the end of the text";
    }

    private int column() {
        return pos - lineStart + 1;
    }

    private void skipWhitespace() {
        while (pos < end) {
            char c = s.charAt(pos);
            if (c == ' ' || c == '\t') {
                pos++;
            } else if (c == '\n') {
                pos++;
                line++;
                lineStart = pos;
            } else if (c == '\r') {
                pos++;
                if (pos < end && s.charAt(pos) == '\n') {
                    pos++;
                }
                line++;
                lineStart = pos;
            } else {
                return;
            }
        }
    }

    private IllegalArgumentException error(String what) {
        return new IllegalArgumentException("JSON line " + line + ", column " + column() + ": "
                + what);
    }
}
