package dev.qsim.text;

import dev.qsim.text.Lexer.Token;
import dev.qsim.text.Lexer.Type;

/**
 * A cursor over the lexer's tokens with a small look-ahead, shared by the statement and
 * expression parsers. Tokens are made as the parser asks for them.
 */
final class Tokens {
    private static final int LOOK_AHEAD = 4;
    private static final int MASK = LOOK_AHEAD - 1;

    private final Lexer lexer;
    private final Token[] ring = new Token[LOOK_AHEAD];
    private int head;
    private int count;

    Tokens(Lexer lexer) {
        this.lexer = lexer;
    }

    /** The next token, not consumed. */
    Token peek() {
        return count > 0 ? ring[head] : peek(0);
    }

    /** The token {@code ahead} places after the next one (at most 3), not consumed. */
    Token peek(int ahead) {
        while (count <= ahead) {
            Token last = count == 0 ? null : ring[(head + count - 1) & MASK];
            ring[(head + count) & MASK] = last != null && last.type == Type.END ? last
                    : lexer.next();
            count++;
        }
        return ring[(head + ahead) & MASK];
    }

    /** Consumes the next token; the end token is never consumed. */
    Token next() {
        Token t = peek();
        if (t.type != Type.END) {
            head = (head + 1) & MASK;
            count--;
        }
        return t;
    }

    /** Whether the next token is the symbol or word {@code s}. */
    boolean at(String s) {
        return peek().is(s);
    }

    /** Consumes the next token if it is {@code s}. */
    boolean accept(String s) {
        if (peek().is(s)) {
            next();
            return true;
        }
        return false;
    }

    static CircuitFormatException error(Token t, String message) {
        return new CircuitFormatException(t.line, t.column, message);
    }

    /** Consumes the symbol or word {@code symbol}, or refuses what is there instead. */
    Token expect(String symbol) {
        Token t = next();
        if (!t.is(symbol)) {
            throw error(t, "expected '" + symbol + "' but found " + t.show());
        }
        return t;
    }

    /** Consumes an identifier, or refuses what is there instead. */
    Token ident(String what) {
        Token t = next();
        if (t.type != Type.IDENT) {
            throw error(t, "expected " + what + " but found " + t.show());
        }
        return t;
    }

    /**
     * Reads an annotation after its {@code @}, which must be the one token consumed since the
     * last look.
     */
    String[] annotation(Token at) {
        requireNothingAhead(at);
        return lexer.annotation(at.line, at.column);
    }

    /** Reads the rest of the line after the token {@code at}, just consumed. */
    String restOfLine(Token at) {
        requireNothingAhead(at);
        return lexer.restOfLine();
    }

    private void requireNothingAhead(Token at) {
        if (count != 0) {
            throw error(at, "'" + at.text + "' must be followed by its text on the same line");
        }
    }
}
