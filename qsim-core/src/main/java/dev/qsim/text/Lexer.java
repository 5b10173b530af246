package dev.qsim.text;

import java.util.ArrayList;
import java.util.List;

/** Splits OpenQASM 3 text into tokens, skipping white space and comments. */
final class Lexer {
    enum Type { IDENT, NUMBER, STRING, SYMBOL, END }

    /** A token and where it starts. */
    static final class Token {
        final Type type;
        final String text;
        final int line;
        final int column;

        Token(Type type, String text, int line, int column) {
            this.type = type;
            this.text = text;
            this.line = line;
            this.column = column;
        }

        boolean is(String s) {
            return (type == Type.SYMBOL || type == Type.IDENT) && text.equals(s);
        }

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

    private static final String[] SYMBOLS = {
        "**", "==", "->", ";", ",", "(", ")", "[", "]", "{", "}", "=", "+", "-", "*", "/", "^",
        "@", ":", "<", ">", "!", "&", "|", "%", "~", ".",
    };

    private final String s;
    private int pos;
    private int line = 1;
    private int col = 1;

    private Lexer(String s) {
        this.s = s;
    }

    static List<Token> tokens(String text) {
        return new Lexer(text).all();
    }

    static String clip(String t) {
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < t.length() && i < 40; i++) {
            char c = t.charAt(i);
            sb.append(c < 0x20 || c == 0x7f ? '?' : c);
        }
        return t.length() > 40 ? sb + "..." : sb.toString();
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

    private List<Token> all() {
        List<Token> out = new ArrayList<>();
        while (true) {
            skipSpaceAndComments();
            if (pos >= s.length()) {
                out.add(new Token(Type.END, "", line, col));
                return out;
            }
            int l = line;
            int c = col;
            char ch = s.charAt(pos);
            if (Character.isLetter(ch) || ch == '_') {
                int start = pos;
                while (pos < s.length() && (Character.isLetterOrDigit(s.charAt(pos))
                        || s.charAt(pos) == '_')) {
                    advance();
                }
                out.add(new Token(Type.IDENT, s.substring(start, pos), l, c));
            } else if (isDigit(ch) || (ch == '.' && pos + 1 < s.length()
                    && isDigit(s.charAt(pos + 1)))) {
                out.add(new Token(Type.NUMBER, number(l, c), l, c));
            } else if (ch == '"') {
                advance();
                int start = pos;
                while (pos < s.length() && s.charAt(pos) != '"' && s.charAt(pos) != '\n') {
                    advance();
                }
                if (pos >= s.length() || s.charAt(pos) != '"') {
                    throw new CircuitFormatException(l, c, "unterminated string");
                }
                String text = s.substring(start, pos);
                advance();
                out.add(new Token(Type.STRING, text, l, c));
            } else {
                String sym = null;
                for (String k : SYMBOLS) {
                    if (s.startsWith(k, pos)) {
                        sym = k;
                        break;
                    }
                }
                if (sym == null) {
                    throw new CircuitFormatException(l, c, "unexpected character '"
                            + clip(String.valueOf(ch)) + "' (code " + (int) ch + ")");
                }
                for (int i = 0; i < sym.length(); i++) {
                    advance();
                }
                out.add(new Token(Type.SYMBOL, sym, l, c));
            }
        }
    }

    private static boolean isDigit(char ch) {
        return ch >= '0' && ch <= '9';
    }

    private String number(int l, int c) {
        int start = pos;
        while (pos < s.length() && isDigit(s.charAt(pos))) {
            advance();
        }
        if (pos < s.length() && s.charAt(pos) == '.') {
            advance();
            while (pos < s.length() && isDigit(s.charAt(pos))) {
                advance();
            }
        }
        if (pos < s.length() && (s.charAt(pos) == 'e' || s.charAt(pos) == 'E')) {
            int save = pos;
            int saveCol = col;
            advance();
            if (pos < s.length() && (s.charAt(pos) == '+' || s.charAt(pos) == '-')) {
                advance();
            }
            if (pos < s.length() && isDigit(s.charAt(pos))) {
                while (pos < s.length() && isDigit(s.charAt(pos))) {
                    advance();
                }
            } else {
                pos = save;
                col = saveCol;
            }
        }
        if (pos < s.length() && (Character.isLetter(s.charAt(pos)) || s.charAt(pos) == '_')) {
            throw new CircuitFormatException(line, col, "unexpected '" + s.charAt(pos)
                    + "' after the number '" + clip(s.substring(start, pos))
                    + "' (units such as ns or dt are outside the supported subset)");
        }
        return s.substring(start, pos);
    }

    private void skipSpaceAndComments() {
        while (pos < s.length()) {
            char ch = s.charAt(pos);
            if (ch == ' ' || ch == '\t' || ch == '\n' || ch == '\r' || ch == '\f') {
                advance();
            } else if (s.startsWith("//", pos)) {
                while (pos < s.length() && s.charAt(pos) != '\n') {
                    advance();
                }
            } else if (s.startsWith("/*", pos)) {
                int l = line;
                int c = col;
                advance();
                advance();
                while (pos < s.length() && !s.startsWith("*/", pos)) {
                    advance();
                }
                if (pos >= s.length()) {
                    throw new CircuitFormatException(l, c, "unterminated comment '/*'");
                }
                advance();
                advance();
            } else {
                return;
            }
        }
    }
}
