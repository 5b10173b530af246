package dev.qsim.internal;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Objects;

/**
 * Reading the text files qsim's readers take (tallies, device profiles): bounded in size before
 * reading, strictly UTF-8, and an optional byte-order mark at the start. Also the one way those
 * readers quote user text whose characters may not show ({@link #shown(String)}). Internal:
 * this package is not exported.
 */
public final class TextFiles {
    /** The byte-order mark U+FEFF, which some editors and spreadsheets put at the start. */
    public static final char BYTE_ORDER_MARK = '\uFEFF';

    private TextFiles() {
    }

    /**
     * Reads a UTF-8 text file of at most {@code maxBytes} bytes. The size is checked before
     * reading, and the read itself stops after {@code maxBytes + 1} bytes, so a file that grows
     * meanwhile is refused too. A leading byte-order mark is kept (see {@link #withoutBom}).
     *
     * @param file the file
     * @param maxBytes the largest allowed size in bytes, at least 0
     * @param what what the file holds, for messages ("a tally file")
     * @return the text
     * @throws IOException if the file cannot be read
     * @throws IllegalArgumentException if the file is larger than {@code maxBytes} or is not
     *     valid UTF-8 (the message gives the byte offset)
     */
    public static String readUtf8(Path file, long maxBytes, String what) throws IOException {
        Objects.requireNonNull(file, "file");
        Checks.requireAtLeast(maxBytes, 0, "maxBytes");
        long size = Files.size(file);
        if (size > maxBytes) {
            throw tooLarge(what, size, maxBytes);
        }
        byte[] bytes;
        try (InputStream in = Files.newInputStream(file)) {
            bytes = in.readNBytes((int) Math.min(Integer.MAX_VALUE - 8, maxBytes + 1));
        }
        if (bytes.length > maxBytes) {
            throw tooLarge(what, bytes.length, maxBytes);
        }
        return decodeUtf8(bytes, what);
    }

    private static IllegalArgumentException tooLarge(String what, long size, long max) {
        return new IllegalArgumentException(what + " of " + size + " bytes is larger than the "
                + max + " bytes allowed");
    }

    /**
     * Decodes UTF-8 strictly: malformed or truncated sequences are refused, not replaced.
     *
     * @param bytes the bytes
     * @param what what they hold, for messages
     * @return the text
     * @throws IllegalArgumentException if the bytes are not valid UTF-8; the message gives the
     *     byte offset of the first bad sequence
     */
    public static String decodeUtf8(byte[] bytes, String what) {
        CharsetDecoder decoder = StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT)
                .onUnmappableCharacter(CodingErrorAction.REPORT);
        ByteBuffer in = ByteBuffer.wrap(bytes);
        // UTF-8 never gives more UTF-16 units than bytes.
        CharBuffer out = CharBuffer.allocate(bytes.length);
        CoderResult r = decoder.decode(in, out, true);
        if (!r.isError()) {
            r = decoder.flush(out);
        }
        if (r.isError()) {
            throw new IllegalArgumentException(what + " is not valid UTF-8: bad byte sequence at"
                    + " byte offset " + in.position() + "; save the file as UTF-8");
        }
        return out.flip().toString();
    }

    /**
     * Returns the text without a byte-order mark at its start (RFC 8259 §8.1 lets a JSON reader
     * ignore one; spreadsheets save CSV with one).
     *
     * @param text the text
     * @return the text from its second character if it starts with U+FEFF, else the text
     */
    public static String withoutBom(String text) {
        return !text.isEmpty() && text.charAt(0) == BYTE_ORDER_MARK ? text.substring(1) : text;
    }

    /**
     * Returns user text fit to quote in a message: {@link Checks#excerpt(String)} with every
     * character that does not show written as {@code \}{@code uXXXX} (controls, format
     * characters such as U+FEFF and U+200B, spaces other than U+0020, line and paragraph
     * separators, lone surrogates, unassigned code points), so that two strings that differ
     * only in such characters look different.
     *
     * @param text the text (null gives "null")
     * @return the excerpt, at most six times {@link Checks#EXCERPT} characters
     */
    public static String shown(String text) {
        String cut = Checks.excerpt(text);
        StringBuilder sb = null;
        for (int i = 0; i < cut.length(); i++) {
            char c = cut.charAt(i);
            boolean hidden = hides(cut, i);
            if (hidden && sb == null) {
                sb = new StringBuilder(cut.length() + 16).append(cut, 0, i);
            }
            if (hidden) {
                sb.append(String.format("\\u%04X", (int) c));
            } else if (sb != null) {
                sb.append(c);
            }
        }
        return sb == null ? cut : sb.toString();
    }

    /**
     * Describes one character for a message: {@code 'x'} if it shows, otherwise its code point,
     * such as {@code U+00A0}.
     *
     * @param text the text
     * @param index the index of the character
     * @return the description
     */
    public static String character(String text, int index) {
        if (hides(text, index)) {
            return String.format("U+%04X", (int) text.charAt(index));
        }
        char c = text.charAt(index);
        if (Character.isHighSurrogate(c)) {
            return "'" + text.substring(index, index + 2) + "'";
        }
        return "'" + c + "'";
    }

    private static boolean hides(String s, int i) {
        char c = s.charAt(i);
        if (c == ' ') {
            return false;
        }
        if (Character.isHighSurrogate(c)) {
            return i + 1 >= s.length() || !Character.isLowSurrogate(s.charAt(i + 1));
        }
        if (Character.isLowSurrogate(c)) {
            return i == 0 || !Character.isHighSurrogate(s.charAt(i - 1));
        }
        switch (Character.getType(c)) {
            case Character.CONTROL:
            case Character.FORMAT:
            case Character.SPACE_SEPARATOR:
            case Character.LINE_SEPARATOR:
            case Character.PARAGRAPH_SEPARATOR:
            case Character.UNASSIGNED:
            case Character.PRIVATE_USE:
                return true;
            default:
                return false;
        }
    }
}
