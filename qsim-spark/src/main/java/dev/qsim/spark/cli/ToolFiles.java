package dev.qsim.spark.cli;

import java.io.IOException;
import java.net.URI;
import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.InvalidPathException;
import java.nio.file.Path;
import java.util.regex.Pattern;

/** The tool's reading of outside text: files (size-checked, strict UTF-8) and numbers. */
final class ToolFiles {
    /** The largest circuit, profile or observable file the tool reads: {@value} bytes. */
    static final long MAX_FILE_BYTES = 8L << 20;

    /** A decimal number without sign: digits with an optional point, optional exponent. */
    static final String DECIMAL = "(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?";
    private static final Pattern SIGNED = Pattern.compile("[+-]?" + DECIMAL);

    private ToolFiles() {
    }

    /** Reads a whole file as strict UTF-8 after checking that it exists and its size. */
    static String read(Path file, String what) throws IOException {
        if (!Files.isRegularFile(file)) {
            throw new IllegalArgumentException(file + ": no such file (" + what + ")");
        }
        long size = Files.size(file);
        if (size > MAX_FILE_BYTES) {
            throw new IllegalArgumentException(file + ": " + what + " of " + size + " bytes is"
                    + " larger than the " + MAX_FILE_BYTES + " bytes allowed");
        }
        byte[] bytes = Files.readAllBytes(file);
        if (bytes.length > MAX_FILE_BYTES) {
            throw new IllegalArgumentException(file + ": " + what + " grew past the "
                    + MAX_FILE_BYTES + " bytes allowed while it was read");
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

    /** A finite signed decimal number, or a refusal naming {@code what}. */
    static double number(String text, String what) {
        String t = text.strip();
        if (t.length() > 100 || !SIGNED.matcher(t).matches()) {
            throw new IllegalArgumentException(what + " must be a decimal number (such as -0.5"
                    + " or 1e-3) but was '" + excerpt(t) + "'");
        }
        double v = Double.parseDouble(t);
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException(what + " must be a finite number but '"
                    + excerpt(t) + "' overflows a double");
        }
        return v;
    }

    /** At most 60 characters of user text, line breaks shown as \n. */
    static String excerpt(String text) {
        String t = text.replace("\n", "\\n").replace("\r", "\\r");
        return t.length() <= 60 ? t : t.substring(0, 40) + "... (" + text.length()
                + " characters)";
    }

    /**
     * Checks an output location before any work: a local path (no scheme, or {@code file:})
     * must not exist yet and its parent must be a folder; a location with another scheme
     * ({@code hdfs://}, {@code s3a://}) is left to Spark, which refuses an existing one.
     */
    static void requireNewOutput(String location) {
        Path local;
        try {
            URI uri = URI.create(location);
            if (uri.getScheme() != null && uri.getScheme().length() > 1
                    && !uri.getScheme().equals("file")) {
                return;
            }
            local = uri.getScheme() == null ? Path.of(location) : Path.of(uri);
        } catch (IllegalArgumentException e) {
            try {
                local = Path.of(location);
            } catch (InvalidPathException e2) {
                throw new IllegalArgumentException("--out: '" + excerpt(location) + "' is not a"
                        + " path", e2);
            }
        }
        if (Files.exists(local)) {
            throw new IllegalArgumentException("--out: " + local + " exists already; give a new"
                    + " folder (results are never written over)");
        }
        Path parent = local.toAbsolutePath().getParent();
        if (parent != null && !Files.isDirectory(parent)) {
            throw new IllegalArgumentException("--out: the folder " + parent + " does not"
                    + " exist");
        }
    }
}
