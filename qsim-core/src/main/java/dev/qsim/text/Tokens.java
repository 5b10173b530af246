package dev.qsim.text;

import java.util.List;

import dev.qsim.Circuit;
import dev.qsim.text.Lexer.Token;
import dev.qsim.text.Lexer.Type;

/** A cursor over the lexer's tokens, shared by the statement and expression parsers. */
final class Tokens {
    private final List<Token> list;
    private int pos;

    /**
     * Creates a cursor at the first token.
     *
     * @param list the tokens, ending with one of type {@link Type#END}
     */
    Tokens(List<Token> list) {
        this.list = list;
    }

    /** The next token, not consumed. */
    Token peek() {
        return list.get(pos);
    }

    /** The token {@code ahead} places after the next one (the end token past the end). */
    Token peek(int ahead) {
        return list.get(Math.min(pos + ahead, list.size() - 1));
    }

    /** Consumes the next token; the end token is never consumed. */
    Token next() {
        Token t = list.get(pos);
        if (t.type != Type.END) {
            pos++;
        }
        return t;
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

    /** The value of a token that must be a whole number, such as a size or an index. */
    static long whole(Token n, String what) {
        if (n.type != Type.NUMBER) {
            throw error(n, "expected a whole number for the " + what + " but found " + n.show());
        }
        try {
            return Long.parseLong(n.text);
        } catch (NumberFormatException e) {
            throw error(n, "the " + what + " must be a whole number up to " + Circuit.MAX_QUBITS
                    + " but was '" + Lexer.clip(n.text) + "'");
        }
    }
}
