package dev.qsim.bench;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.regex.Pattern;

/**
 * The C reference kernel's measurements ({@code ../shared/ceiling/ceiling.c}), read from its
 * output: the bandwidth floor of {@link ScalingReport}'s {@code --reference}. Immutable.
 *
 * <p>The input is what {@code ceiling gates N REPS} and {@code ceiling stream MIB REPS} print,
 * any number of runs one after another: lines of tab-separated {@code key=value} fields whose
 * first field is {@code test=} one of {@link #TESTS}, comment lines starting with {@code #}, and
 * blank lines. Two kinds of line are used:
 *
 * <ul>
 *   <li>{@code test=gate_summary gate=u ... n=N threads=T ... median_over_t_gbs=G}: the general
 *       dense 2x2 gate on an {@code N}-qubit state of split real and imaginary {@code double}
 *       arrays on {@code T} threads, {@code G} GB/s the median over every target qubit of the
 *       median of its repetitions, counting 32 bytes per amplitude (16 read, 16 written; the
 *       kernel's README), so {@code 32 * 2^N / G} is its time per gate in nanoseconds;</li>
 *   <li>{@code test=stream op=copy|triad threads=T ... best_gbs=G}: STREAM copy and triad over
 *       arrays far beyond the caches, best of the repetitions, counting 16 and 24 bytes per
 *       element (McCalpin 1995, "Memory Bandwidth and Machine Balance in Current High
 *       Performance Computers", IEEE TCCA Newsletter, Dec. 1995, table 1).</li>
 * </ul>
 *
 * <p>The file is outside data and is read as hostile: at most {@link #MAX_BYTES} bytes of UTF-8
 * text, lines of at most {@link #MAX_LINE} characters; every field is checked ({@code n} in
 * [1, {@link ReportOptions#MAX_QUBITS}], {@code threads} in [1,
 * {@link ReportOptions#MAX_THREADS}], rates plain positive decimals). A line that is not of this
 * form, names an unknown test, repeats a key, repeats a measurement (the same gate summary or
 * stream operation at the same size and thread count), or reports a failed check of the kernel's
 * own ({@code result=} other than {@code pass}, or the comment {@code # CHECK FAILED}) is an
 * {@link IllegalArgumentException} naming the source, the line number and the line.
 */
final class CeilingReference {
    /** Largest file read, in bytes: a run of every size from 4 to 34 qubits is far below. */
    static final int MAX_BYTES = 16 << 20;

    /** Longest line, in characters: the kernel's longest line has under 400. */
    static final int MAX_LINE = 4096;

    /** The tests the C kernel prints, the values of the first field {@code test=}. */
    static final List<String> TESTS = List.of("check", "sweep", "gate", "gate_summary",
            "stream", "fma");

    private static final Pattern KEY = Pattern.compile("[a-z][a-z0-9_]*");
    private static final Pattern VALUE = Pattern.compile("[!-~]+");
    private static final Pattern DECIMAL = Pattern.compile(
            "[0-9]{1,15}(\\.[0-9]{1,15})?([eE][-+]?[0-9]{1,3})?");
    private static final Pattern WHOLE = Pattern.compile("[0-9]{1,9}");
    /** Longest excerpt of a bad line quoted in a message. */
    private static final int EXCERPT = 100;

    private final String source;
    /** Dense-gate GB/s by thread count, then qubit count. */
    private final Map<Integer, TreeMap<Integer, Double>> dense;
    /** STREAM copy and triad GB/s by thread count. */
    private final Map<Integer, Double> copy;
    private final Map<Integer, Double> triad;

    private CeilingReference(String source, Map<Integer, TreeMap<Integer, Double>> dense,
            Map<Integer, Double> copy, Map<Integer, Double> triad) {
        this.source = source;
        this.dense = dense;
        this.copy = copy;
        this.triad = triad;
    }

    /**
     * Reads the C kernel's output from a file.
     *
     * @param file the file of the kernel's output lines
     * @return the measurements
     * @throws IOException if the file cannot be read
     * @throws IllegalArgumentException if it is larger than {@link #MAX_BYTES}, not UTF-8, or a
     *     line is malformed (the message names the file, the line number and the line)
     */
    static CeilingReference read(Path file) throws IOException {
        final String name = "--reference file '" + file + "'";
        final byte[] bytes;
        try (InputStream in = Files.newInputStream(file)) {
            bytes = in.readNBytes(MAX_BYTES + 1);
        }
        if (bytes.length > MAX_BYTES) {
            throw new IllegalArgumentException(name + " is larger than " + MAX_BYTES
                    + " bytes, the most read; the C kernel's output of every size is far"
                    + " smaller");
        }
        final String text;
        try {
            text = StandardCharsets.UTF_8.newDecoder()
                    .onMalformedInput(CodingErrorAction.REPORT)
                    .onUnmappableCharacter(CodingErrorAction.REPORT)
                    .decode(ByteBuffer.wrap(bytes)).toString();
        } catch (CharacterCodingException e) {
            throw new IllegalArgumentException(name + " is not UTF-8 text (" + e + "); it"
                    + " should hold the C kernel's output lines", e);
        }
        return parse(text, name);
    }

    /**
     * Reads the C kernel's output from text.
     *
     * @param text the kernel's output lines, separated by {@code \n} or {@code \r\n}
     * @param source names the text in messages, e.g. {@code --reference file 'ref.txt'}
     * @return the measurements
     * @throws IllegalArgumentException if the text is longer than {@link #MAX_BYTES}
     *     characters, a line is malformed (the message names {@code source}, the line number
     *     and the line), or no line gives the dense gate's rate
     */
    static CeilingReference parse(String text, String source) {
        if (text.length() > MAX_BYTES) {
            throw new IllegalArgumentException(source + " is longer than " + MAX_BYTES
                    + " characters, the most read");
        }
        final Map<Integer, TreeMap<Integer, Double>> dense = new TreeMap<>();
        final Map<String, Integer> seen = new HashMap<>();
        final Map<Integer, Double> copy = new TreeMap<>();
        final Map<Integer, Double> triad = new TreeMap<>();
        final String[] lines = text.split("\n", -1);
        for (int i = 0; i < lines.length; i++) {
            String line = lines[i];
            if (line.endsWith("\r")) {
                line = line.substring(0, line.length() - 1);
            }
            final Line at = new Line(source, i + 1, line);
            if (line.length() > MAX_LINE) {
                throw at.bad("is longer than " + MAX_LINE + " characters");
            }
            if (line.isBlank()) {
                continue;
            }
            if (line.startsWith("#")) {
                if (line.contains("CHECK FAILED")) {
                    throw at.bad("reports that the C kernel's own check failed; its figures"
                            + " are no reference");
                }
                continue;
            }
            final Map<String, String> fields = at.fields();
            final String test = fields.get("test");
            switch (test) {
                case "check":
                    if (!"pass".equals(fields.get("result"))) {
                        throw at.bad("reports that the C kernel's own check failed (result="
                                + fields.get("result") + "); its figures are no reference");
                    }
                    break;
                case "gate_summary":
                    if ("u".equals(at.require(fields, "gate"))) {
                        final String variant = fields.getOrDefault("variant", "fast");
                        if (!variant.equals("fast")) {
                            throw at.bad("has variant=" + variant + "; the summary is of the"
                                    + " fast variant");
                        }
                        final int n = at.whole(fields, "n", 1, ReportOptions.MAX_QUBITS);
                        final int threads = at.whole(fields, "threads", 1,
                                ReportOptions.MAX_THREADS);
                        final double gbps = at.rate(fields, "median_over_t_gbs");
                        at.once(seen, "gate u n=" + n + " threads=" + threads);
                        dense.computeIfAbsent(threads, t -> new TreeMap<>()).put(n, gbps);
                    }
                    break;
                case "stream": {
                    final String op = at.require(fields, "op");
                    final int threads = at.whole(fields, "threads", 1, ReportOptions.MAX_THREADS);
                    final double gbps = at.rate(fields, "best_gbs");
                    if (op.equals("copy") || op.equals("triad")) {
                        at.once(seen, "stream op=" + op + " threads=" + threads);
                        (op.equals("copy") ? copy : triad).put(threads, gbps);
                    } else if (!op.equals("scale_inplace")) {
                        throw at.bad("has op=" + op + "; known: copy, triad, scale_inplace");
                    }
                    break;
                }
                default:
                    // sweep, gate, fma: the form is checked, the figures are not used.
                    break;
            }
        }
        if (dense.isEmpty()) {
            throw new IllegalArgumentException(source + " has no line 'test=gate_summary"
                    + " gate=u' (the dense gate's rate); run the C kernel as 'ceiling gates N"
                    + " REPS' for each size");
        }
        return new CeilingReference(source, dense, copy, triad);
    }

    /**
     * The dense gate's rate in GB/s at {@code n} qubits on {@code threads} threads (32 bytes an
     * amplitude), or empty if the input has no such line.
     */
    OptionalDouble dense(int n, int threads) {
        final TreeMap<Integer, Double> sizes = dense.get(threads);
        final Double gbps = sizes == null ? null : sizes.get(n);
        return gbps == null ? OptionalDouble.empty() : OptionalDouble.of(gbps);
    }

    /** The STREAM copy rate in GB/s on {@code threads} threads, or empty. */
    OptionalDouble copy(int threads) {
        final Double gbps = copy.get(threads);
        return gbps == null ? OptionalDouble.empty() : OptionalDouble.of(gbps);
    }

    /** The STREAM triad rate in GB/s on {@code threads} threads, or empty. */
    OptionalDouble triad(int threads) {
        final Double gbps = triad.get(threads);
        return gbps == null ? OptionalDouble.empty() : OptionalDouble.of(gbps);
    }

    /**
     * Checks that the dense gate's rate is there for every {@code n} in {@code [min, max]} on
     * {@code threads} threads, the rows a report of those sizes needs.
     *
     * @throws IllegalArgumentException naming the sizes missing, the sizes and thread counts
     *     present, and the command that would measure them
     */
    void requireSizes(int min, int max, int threads) {
        final TreeSet<Integer> missing = new TreeSet<>();
        final TreeMap<Integer, Double> sizes = dense.getOrDefault(threads, new TreeMap<>());
        for (int n = min; n <= max; n++) {
            if (!sizes.containsKey(n)) {
                missing.add(n);
            }
        }
        if (!missing.isEmpty()) {
            final StringBuilder have = new StringBuilder();
            for (Map.Entry<Integer, TreeMap<Integer, Double>> e : dense.entrySet()) {
                have.append(have.length() == 0 ? "" : "; ").append("threads=").append(e.getKey())
                        .append(": n = ").append(e.getValue().keySet());
            }
            throw new IllegalArgumentException(source + " has no dense-gate rate"
                    + " ('test=gate_summary gate=u') for n = " + missing + " at threads="
                    + threads + " (it has " + have + "); run 'CEILING_THREADS=" + threads
                    + " ceiling gates N REPS' for those n, or choose --min, --max and --threads"
                    + " to match");
        }
    }

    /** What the input holds at {@code threads} threads, for the report's comment lines. */
    String describe(int threads) {
        final StringBuilder sb = new StringBuilder(source).append(": C dense gate at threads=")
                .append(threads).append(", n = ")
                .append(dense.getOrDefault(threads, new TreeMap<>()).keySet());
        final OptionalDouble c = copy(threads);
        final OptionalDouble t = triad(threads);
        sb.append(c.isPresent() || t.isPresent() ? String.format(Locale.ROOT,
                "; STREAM copy %s GB/s, triad %s GB/s (best of its repetitions)",
                c.isPresent() ? String.format(Locale.ROOT, "%.2f", c.getAsDouble())
                        : "not measured",
                t.isPresent() ? String.format(Locale.ROOT, "%.2f", t.getAsDouble())
                        : "not measured")
                : "; no STREAM lines at that thread count (reference_copy_gb_per_s stays"
                        + " empty)");
        return sb.toString();
    }

    /** One line of the input, for checking its fields and naming it in messages. */
    private static final class Line {
        private final String source;
        private final int number;
        private final String text;

        Line(String source, int number, String text) {
            this.source = source;
            this.number = number;
            this.text = text;
        }

        IllegalArgumentException bad(String problem) {
            return new IllegalArgumentException(source + " line " + number + " " + problem
                    + ": '" + shown(text, EXCERPT) + "'");
        }

        /**
         * At most {@code max} characters of {@code s} with {@code ...} after a cut, a tab as a
         * space and other control characters as {@code ?}, so a message stays one line.
         */
        static String shown(String s, int max) {
            final StringBuilder sb = new StringBuilder();
            for (int i = 0; i < s.length() && i < max; i++) {
                final char ch = s.charAt(i);
                sb.append(ch == '\t' ? ' ' : ch < 0x20 || ch == 0x7f ? '?' : ch);
            }
            return s.length() > max ? sb + "..." : sb.toString();
        }

        /** The line's fields, checked: tab-separated key=value, keys once, test= first. */
        Map<String, String> fields() {
            final Map<String, String> fields = new HashMap<>();
            final String[] parts = text.split("\t", -1);
            for (int i = 0; i < parts.length; i++) {
                final String part = parts[i];
                final int eq = part.indexOf('=');
                if (eq < 0 || !KEY.matcher(part.substring(0, eq)).matches()
                        || !VALUE.matcher(part.substring(eq + 1)).matches()) {
                    throw bad("is not a line of the C kernel's output (tab-separated key=value"
                            + " fields, or # for a comment): field " + (i + 1) + " is '"
                            + shown(part, 40) + "'");
                }
                final String key = part.substring(0, eq);
                if (i == 0 && !key.equals("test")) {
                    throw bad("does not start with test=; the C kernel's measurement lines do");
                }
                if (fields.put(key, part.substring(eq + 1)) != null) {
                    throw bad("gives " + key + "= twice");
                }
            }
            final String test = fields.get("test");
            if (!TESTS.contains(test)) {
                throw bad("names an unknown test '" + test + "'; known: "
                        + String.join(", ", TESTS));
            }
            return fields;
        }

        String require(Map<String, String> fields, String key) {
            final String value = fields.get(key);
            if (value == null) {
                throw bad("has no " + key + "=");
            }
            return value;
        }

        int whole(Map<String, String> fields, String key, int low, int high) {
            final String value = require(fields, key);
            if (!WHOLE.matcher(value).matches()) {
                throw bad("has " + key + "=" + value + "; a whole number in [" + low + ", "
                        + high + "] is allowed");
            }
            final int parsed = Integer.parseInt(value);
            if (parsed < low || parsed > high) {
                throw bad("has " + key + "=" + value + ", outside [" + low + ", " + high + "]");
            }
            return parsed;
        }

        double rate(Map<String, String> fields, String key) {
            final String value = require(fields, key);
            final double parsed = DECIMAL.matcher(value).matches() ? Double.parseDouble(value)
                    : Double.NaN;
            if (!(parsed > 0) || Double.isInfinite(parsed)) {
                throw bad("has " + key + "=" + value + "; a positive decimal number of GB/s is"
                        + " allowed");
            }
            return parsed;
        }

        void once(Map<String, Integer> seen, String what) {
            final Integer first = seen.putIfAbsent(what, number);
            if (first != null) {
                throw bad("repeats the measurement of line " + first + " (" + what
                        + "); keep one run of each size and thread count");
            }
        }
    }
}
