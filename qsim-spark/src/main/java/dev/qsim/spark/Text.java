package dev.qsim.spark;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Pattern;

/** Reading outside text: size-checked strict UTF-8 files, numbers, quotes of user text. */
final class Text {
    /** The largest points file: {@value} bytes. */
    static final long MAX_POINTS_FILE_BYTES = 64L << 20;
    /** The largest circuit, observable or program file: {@value} bytes. */
    static final long MAX_PROGRAM_BYTES = 8L << 20;
    /** The longest quote of user text in a message. */
    static final int EXCERPT = 60;

    /** A decimal number: sign, digits with an optional point, optional exponent. */
    private static final Pattern DECIMAL = Pattern.compile(
            "[+-]?(\\d+\\.?\\d*|\\.\\d+)([eE][+-]?\\d+)?");

    private Text() {
    }

    /** Quotes user text: itself up to {@value #EXCERPT} characters, else its start. */
    static String excerpt(String text) {
        if (text == null) {
            return "null";
        }
        String t = text.replace("\n", "\\n").replace("\r", "\\r");
        if (t.length() <= EXCERPT) {
            return t;
        }
        return t.substring(0, EXCERPT - 20) + "... (" + text.length() + " characters)";
    }

    /**
     * Reads a finite decimal number (no hexadecimal, no {@code NaN} or {@code Infinity}, no
     * type suffix); spaces around it are ignored.
     */
    static double number(String text, String what) {
        String t = text.strip();
        if (t.length() > 100 || !DECIMAL.matcher(t).matches()) {
            throw new IllegalArgumentException(what + " must be a decimal number (such as"
                    + " -0.5 or 1e-3) but was '" + excerpt(t) + "'");
        }
        double v = Double.parseDouble(t);
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException(what + " must be a finite number but '"
                    + excerpt(t) + "' overflows a double");
        }
        return v;
    }

    /** Reads a whole file as strict UTF-8, its size checked first. */
    static String read(Path file, long maxBytes, String what) throws IOException {
        long size = Files.size(file);
        if (size > maxBytes) {
            throw new IllegalArgumentException(file + ": " + what + " of " + size + " bytes is"
                    + " larger than the " + maxBytes + " bytes allowed");
        }
        byte[] bytes = Files.readAllBytes(file);
        if (bytes.length > maxBytes) {
            throw new IllegalArgumentException(file + ": " + what + " grew past the " + maxBytes
                    + " bytes allowed while it was read");
        }
        try {
            String s = StandardCharsets.UTF_8.newDecoder()
                    .onMalformedInput(CodingErrorAction.REPORT)
                    .onUnmappableCharacter(CodingErrorAction.REPORT)
                    .decode(ByteBuffer.wrap(bytes)).toString();
            return s.startsWith("\uFEFF") ? s.substring(1) : s;
        } catch (CharacterCodingException e) {
            throw new IllegalArgumentException(file + ": " + what + " is not UTF-8 text", e);
        }
    }

    /** Reads a file's lines as strict UTF-8, its size checked first. */
    static List<String> readLines(Path file, long maxBytes, String what) throws IOException {
        return read(file, maxBytes, what).lines().toList();
    }
}
