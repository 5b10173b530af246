package dev.qsim.text;

import java.util.Map;

import dev.qsim.internal.Checks;

/**
 * Splits OpenQASM 3 text into tokens on demand, skipping white space and comments. One pass,
 * constant work per character, no recursion; a token is made only when the parser asks for
 * it, so a long file is never held as a list of tokens.
 *
 * <p>Literals follow the specification's lexical grammar (Cross et al. 2022, §"Types and
 * casting", from memory): decimal, {@code 0x} hexadecimal, {@code 0o} octal and {@code 0b}
 * binary integers with {@code _} between digits; floats with a point and/or an exponent;
 * durations, a number followed at once by {@code ns}, {@code us}, {@code µs}, {@code ms},
 * {@code s} or {@code dt}; strings in double or single quotes.
 */
final class Lexer {
    /** The kinds of token. */
    enum Type {
        /** A name or keyword. */
        IDENT,
        /** An integer literal ({@link Token#integer}). */
        INT,
        /** A float literal ({@link Token#real}). */
        FLOAT,
        /** A duration literal: {@link Token#real} in its unit, {@link Token#unit}. */
        DURATION,
        /** A quoted string, without its quotes. */
        STRING,
        /** An operator or punctuation. */
        SYMBOL,
        /** The end of the text. */
        END
    }

    /** A token and where it starts. */
    static final class Token {
        final Type type;
        /** The text: the name, the symbol, the string's contents, or the literal as written. */
        final String text;
        final int line;
        final int column;
        final long integer;
        final double real;
        /** The unit of a duration, or null. */
        final String unit;

        Token(Type type, String text, int line, int column, long integer, double real,
                String unit) {
            this.type = type;
            this.text = text;
            this.line = line;
            this.column = column;
            this.integer = integer;
            this.real = real;
            this.unit = unit;
        }

        /** Whether this is the symbol or name {@code s}. */
        boolean is(String s) {
            return (type == Type.SYMBOL || type == Type.IDENT) && text.equals(s);
        }

        /** The token for a message, quoted and clipped. */
        String show() {
            switch (type) {
                case END:
                    return "the end of the text";
                case STRING:
                    return "string \"" + clip(text) + "\"";
                default:
                    return "'" + clip(text) + "'";
            }
        }
    }

    /** The time units of durations and how many of each make a second ({@code dt} apart). */
    static final Map<String, Double> PER_SECOND = Map.of("ns", 1e9, "us", 1e6, "µs", 1e6,
            "μs", 1e6, "ms", 1e3, "s", 1.0);

    private final String s;
    private final int length;
    /** Names read recently, by a hash of their characters ({@link #name}). */
    private final String[] names = new String[1024];
    private int pos;
    private int line = 1;
    private int col = 1;

    Lexer(String text) {
        this.s = text;
        this.length = text.length();
        if (length > 0 && s.charAt(0) == '\uFEFF') {
            pos = 1; // a byte order mark is not text
        }
    }

    /** User text to quote in a message: control characters shown as '?', long text clipped. */
    static String clip(String t) {
        String e = Checks.excerpt(t);
        StringBuilder sb = new StringBuilder(e.length());
        for (int i = 0; i < e.length(); i++) {
            char c = e.charAt(i);
            sb.append(c < 0x20 || c == 0x7f ? '?' : c);
        }
        return sb.toString();
    }

    private CircuitFormatException error(int l, int c, String message) {
        return new CircuitFormatException(l, c, message);
    }

    private void advance() {
        if (s.charAt(pos) == '\n') {
            line++;
            col = 1;
        } else {
            col++;
        }
        pos++;
    }

    private void advance(int n) {
        for (int i = 0; i < n; i++) {
            advance();
        }
    }

    private boolean at(String t) {
        return s.startsWith(t, pos);
    }

    private char peekChar(int ahead) {
        int p = pos + ahead;
        return p < length ? s.charAt(p) : '\0';
    }

    /** The next token. */
    Token next() {
        skipSpaceAndComments();
        if (pos >= length) {
            return new Token(Type.END, "", line, col, 0, 0, null);
        }
        int l = line;
        int c = col;
        char ch = s.charAt(pos);
        if (isIdentStart(ch)) {
            int start = pos;
            int h = 0;
            while (pos < length && isIdentPart(s.charAt(pos))) {
                h = 31 * h + s.charAt(pos);
                advance();
            }
            return new Token(Type.IDENT, name(start, pos - start, h), l, c, 0, 0, null);
        }
        if (isDigit(ch) || (ch == '.' && isDigit(peekChar(1)))) {
            return number(l, c);
        }
        if (ch == '"' || ch == '\'') {
            advance();
            int start = pos;
            while (pos < length && s.charAt(pos) != ch && s.charAt(pos) != '\n') {
                advance();
            }
            if (pos >= length || s.charAt(pos) != ch) {
                throw error(l, c, "unterminated string: a string ends with " + ch
                        + " on its line");
            }
            String text = s.substring(start, pos);
            advance();
            return new Token(Type.STRING, text, l, c, 0, 0, null);
        }
        if (ch == '$') {
            throw error(l, c, "physical qubits ('$' followed by a number) are unsupported;"
                    + " declare qubits with 'qubit[n] name;'");
        }
        String sym = symbol(ch);
        if (sym == null) {
            throw error(l, c, "unexpected character '" + clip(String.valueOf(ch)) + "' (code "
                    + (int) ch + ")");
        }
        advance(sym.length());
        return new Token(Type.SYMBOL, sym, l, c, 0, 0, null);
    }

    /**
     * The name at {@code [start, start + n)}: the same string as the last time these
     * characters were read where possible, so that a file's repeated names (q, h, cx ...) are
     * not copied again and keep their cached hash for the many table lookups they go through.
     */
    private String name(int start, int n, int hash) {
        int slot = (hash ^ (hash >>> 16)) & (names.length - 1);
        String known = names[slot];
        if (known != null && known.length() == n && s.regionMatches(start, known, 0, n)) {
            return known;
        }
        String fresh = s.substring(start, start + n);
        names[slot] = fresh;
        return fresh;
    }

    /** The operator or punctuation at the current position, longest first, or null. */
    private String symbol(char ch) {
        char n = peekChar(1);
        switch (ch) {
            case ';':
                return ";";
            case ',':
                return ",";
            case '(':
                return "(";
            case ')':
                return ")";
            case '[':
                return "[";
            case ']':
                return "]";
            case '{':
                return "{";
            case '}':
                return "}";
            case ':':
                return ":";
            case '@':
                return "@";
            case '~':
                return "~";
            case '*':
                if (n == '*') {
                    return peekChar(2) == '=' ? "**=" : "**";
                }
                return n == '=' ? "*=" : "*";
            case '<':
                if (n == '<') {
                    return peekChar(2) == '=' ? "<<=" : "<<";
                }
                return n == '=' ? "<=" : "<";
            case '>':
                if (n == '>') {
                    return peekChar(2) == '=' ? ">>=" : ">>";
                }
                return n == '=' ? ">=" : ">";
            case '=':
                return n == '=' ? "==" : "=";
            case '!':
                return n == '=' ? "!=" : "!";
            case '&':
                return n == '&' ? "&&" : n == '=' ? "&=" : "&";
            case '|':
                return n == '|' ? "||" : n == '=' ? "|=" : "|";
            case '+':
                return n == '+' ? "++" : n == '=' ? "+=" : "+";
            case '-':
                return n == '>' ? "->" : n == '=' ? "-=" : "-";
            case '/':
                return n == '=' ? "/=" : "/";
            case '%':
                return n == '=' ? "%=" : "%";
            case '^':
                return n == '=' ? "^=" : "^";
            default:
                return null;
        }
    }

    static boolean isIdentStart(char ch) {
        if (ch < 0x80) {
            return (ch >= 'a' && ch <= 'z') || (ch >= 'A' && ch <= 'Z') || ch == '_';
        }
        return Character.isLetter(ch);
    }

    static boolean isIdentPart(char ch) {
        if (ch < 0x80) {
            return (ch >= 'a' && ch <= 'z') || (ch >= 'A' && ch <= 'Z') || ch == '_'
                    || (ch >= '0' && ch <= '9');
        }
        return Character.isLetterOrDigit(ch);
    }

    private static boolean isDigit(char ch) {
        return ch >= '0' && ch <= '9';
    }

    private static int digit(char ch, int radix) {
        int d = Character.digit(ch, radix);
        return ch < 0x80 ? d : -1;
    }

    /** Reads digits of a radix with single underscores between them; returns them. */
    private String digits(int radix) {
        StringBuilder sb = new StringBuilder();
        while (pos < length) {
            char ch = s.charAt(pos);
            if (digit(ch, radix) >= 0) {
                sb.append(ch);
                advance();
            } else if (ch == '_' && sb.length() > 0 && digit(peekChar(1), radix) >= 0) {
                advance();
            } else {
                break;
            }
        }
        return sb.toString();
    }

    private Token number(int l, int c) {
        int start = pos;
        char ch = s.charAt(pos);
        char n = peekChar(1);
        if (ch == '0' && (n == 'x' || n == 'X' || n == 'o' || n == 'b' || n == 'B')) {
            int radix = n == 'x' || n == 'X' ? 16 : n == 'o' ? 8 : 2;
            advance(2);
            String d = digits(radix);
            if (d.isEmpty()) {
                throw error(l, c, "the number '" + clip(s.substring(start, pos)) + "' has no"
                        + " digits");
            }
            long v;
            try {
                v = Long.parseLong(d, radix);
            } catch (NumberFormatException e) {
                throw error(l, c, "the integer '" + clip(s.substring(start, pos)) + "' is"
                        + " larger than " + Long.MAX_VALUE);
            }
            return suffix(new Token(Type.INT, s.substring(start, pos), l, c, v, v, null), l, c);
        }
        // The common case, a short decimal integer: its value straight from the characters.
        int end = pos;
        long quick = 0;
        while (end < length && end - pos < 18 && isDigit(s.charAt(end))) {
            quick = quick * 10 + (s.charAt(end) - '0');
            end++;
        }
        char after = end < length ? s.charAt(end) : ' ';
        if (end - pos < 18 && !isDigit(after) && after != '.' && after != 'e' && after != 'E'
                && after != '_') {
            advance(end - pos);
            return suffix(new Token(Type.INT, s.substring(start, pos), l, c, quick, quick, null),
                    l, c);
        }
        StringBuilder text = new StringBuilder(digits(10));
        boolean real = false;
        if (pos < length && s.charAt(pos) == '.') {
            real = true;
            advance();
            text.append('.').append(digits(10));
        }
        if (pos < length && (s.charAt(pos) == 'e' || s.charAt(pos) == 'E')) {
            char sign = peekChar(1);
            int skip = sign == '+' || sign == '-' ? 2 : 1;
            if (isDigit(peekChar(skip))) {
                real = true;
                text.append('e');
                if (skip == 2) {
                    text.append(sign);
                }
                advance(skip);
                text.append(digits(10));
            }
        }
        String written = s.substring(start, pos);
        Token t;
        if (real) {
            double v = Double.parseDouble(text.toString());
            if (Double.isInfinite(v)) {
                throw error(l, c, "the number '" + clip(written) + "' is beyond the largest"
                        + " double, " + Double.MAX_VALUE);
            }
            t = new Token(Type.FLOAT, written, l, c, 0, v, null);
        } else {
            long v;
            try {
                v = Long.parseLong(text.toString());
            } catch (NumberFormatException e) {
                throw error(l, c, "the integer '" + clip(written) + "' is larger than "
                        + Long.MAX_VALUE);
            }
            t = new Token(Type.INT, written, l, c, v, v, null);
        }
        return suffix(t, l, c);
    }

    /** A unit straight after a number makes a duration; any other letter is refused. */
    private Token suffix(Token number, int l, int c) {
        if (pos >= length || !isIdentPart(s.charAt(pos))) {
            return number;
        }
        int start = pos;
        while (pos < length && isIdentPart(s.charAt(pos))) {
            advance();
        }
        String unit = s.substring(start, pos);
        if (PER_SECOND.containsKey(unit) || unit.equals("dt")) {
            double v = number.type == Type.INT ? (double) number.integer : number.real;
            return new Token(Type.DURATION, number.text + unit, l, c, 0, v, unit);
        }
        if (unit.equals("im")) {
            throw error(l, c, "complex numbers ('" + clip(number.text + unit) + "') are"
                    + " unsupported; gate angles and classical values are real");
        }
        throw error(l, c, "unexpected '" + clip(unit) + "' after the number '"
                + clip(number.text) + "'; a number may be followed only by a time unit (ns, us,"
                + " µs, ms, s, dt) in a delay");
    }

    /**
     * Reads an annotation's keyword and the rest of its line, just after its {@code @} (the
     * parser has consumed the {@code @} and looked at nothing after it).
     *
     * @return {keyword, rest of the line trimmed}
     */
    String[] annotation(int l, int c) {
        int start = pos;
        while (pos < length && (isIdentPart(s.charAt(pos)) || s.charAt(pos) == '.')) {
            advance();
        }
        if (pos == start) {
            throw error(l, c, "expected an annotation's name straight after '@'");
        }
        String keyword = s.substring(start, pos);
        return new String[] {keyword, restOfLine()};
    }

    /** The rest of the current line, trimmed; the newline is left. */
    String restOfLine() {
        int start = pos;
        while (pos < length && s.charAt(pos) != '\n') {
            advance();
        }
        return s.substring(start, pos).trim();
    }

    private void skipSpaceAndComments() {
        while (pos < length) {
            char ch = s.charAt(pos);
            if (ch == ' ' || ch == '\t' || ch == '\n' || ch == '\r' || ch == '\f') {
                advance();
            } else if (ch == '/' && peekChar(1) == '/') {
                while (pos < length && s.charAt(pos) != '\n') {
                    advance();
                }
            } else if (ch == '/' && peekChar(1) == '*') {
                int l = line;
                int c = col;
                advance(2);
                while (pos < length && !at("*/")) {
                    advance();
                }
                if (pos >= length) {
                    throw error(l, c, "unterminated comment '/*'");
                }
                advance(2);
            } else {
                return;
            }
        }
    }
}
