package dev.qsim.bench;

import java.io.IOException;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;

/**
 * Where the scaling report's CSV goes: standard output, or a file of {@code --csv}. Rows are
 * written as they are measured, a size at a time, so a long run that is stopped keeps what it
 * measured.
 */
final class CsvOutput implements AutoCloseable {
    /** The first columns of {@link #HEADER} (for a help text of limited width). */
    static final String HEADER_START = "n,kernel,target,threads,ns_per_gate,ns_per_amplitude,"
            + "gb_per_s,copy_gb_per_s,";
    /** The last columns of {@link #HEADER}. */
    static final String HEADER_END = "triad_gb_per_s,fraction_of_copy,precision,ns_per_pass";
    /** The CSV header, exactly; the columns of {@link #line(ReportRow)} in this order. */
    static final String HEADER = HEADER_START + HEADER_END;

    private final PrintStream stream;
    private final Path file;

    private CsvOutput(PrintStream stream, Path file) {
        this.stream = stream;
        this.file = file;
    }

    /**
     * Opens the CSV: {@code out} when {@code file} is null (it is not closed at the end), else
     * the file, created or emptied, UTF-8.
     *
     * @throws IOException if the file cannot be opened for writing
     */
    static CsvOutput open(Path file, PrintStream out) throws IOException {
        if (file == null) {
            return new CsvOutput(out, null);
        }
        return new CsvOutput(new PrintStream(Files.newOutputStream(file), false,
                StandardCharsets.UTF_8), file);
    }

    /** Writes {@link #HEADER} and flushes. */
    void header() {
        stream.println(HEADER);
        stream.flush();
    }

    /** Writes one row; see {@link #flush()}. */
    void write(ReportRow row) {
        stream.println(line(row));
    }

    /** Pushes the rows written so far out to the stream or file. */
    void flush() {
        stream.flush();
    }

    /** Whether any write failed (a full disk, a closed pipe). */
    boolean failed() {
        return stream.checkError();
    }

    /** Where the CSV goes, for messages: {@code standard output} or the quoted file name. */
    String where() {
        return file == null ? "standard output" : "'" + file + "'";
    }

    /** Closes the file; standard output is left open (and flushed). */
    @Override
    public void close() {
        if (file == null) {
            stream.flush();
        } else {
            stream.close();
        }
    }

    /**
     * Formats a row in the order of {@link #HEADER}: {@code ns_per_gate} and
     * {@code ns_per_pass} with one decimal, {@code ns_per_amplitude} with five, the bandwidths
     * and {@code fraction_of_copy} with three, {@code Locale.ROOT} (a point for decimals).
     */
    static String line(ReportRow r) {
        final double gbps = r.gbps();
        return String.format(Locale.ROOT, "%d,%s,%s,%d,%.1f,%.5f,%.3f,%.3f,%.3f,%.3f,%s,%.1f",
                r.n(), r.kernel(), r.target(), r.threads(), r.nanosPerGate(),
                r.nanosPerAmplitude(), gbps, r.copyGbps(), r.triadGbps(), gbps / r.copyGbps(),
                Workloads.precisionName(r.precision()), r.passNanos());
    }
}
