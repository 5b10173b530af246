package dev.qsim.bench;

import java.io.IOException;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.OptionalDouble;

/**
 * Where the scaling report's CSV goes: standard output, or a file of {@code --csv}. Rows are
 * written as they are measured, a size at a time, so a long run that is stopped keeps what it
 * measured. With a {@link CeilingReference} (the report's {@code --reference}) every line ends
 * with the {@link #REFERENCE_COLUMNS}; without one the lines are {@link #HEADER}'s alone.
 */
final class CsvOutput implements AutoCloseable {
    /** The first columns of {@link #HEADER} (for a help text of limited width). */
    static final String HEADER_START = "n,kernel,target,threads,ns_per_gate,ns_per_amplitude,"
            + "gb_per_s,copy_gb_per_s,";
    /** The last columns of {@link #HEADER}. */
    static final String HEADER_END = "triad_gb_per_s,fraction_of_copy,precision,ns_per_pass";
    /** The CSV header, exactly; the columns of {@link #line(ReportRow)} in this order. */
    static final String HEADER = HEADER_START + HEADER_END;
    /** The columns after {@link #HEADER} when there is a C reference, with their comma. */
    static final String REFERENCE_COLUMNS = ",reference_gb_per_s,fraction_of_reference,"
            + "reference_copy_gb_per_s";

    private final PrintStream stream;
    private final Path file;
    private final CeilingReference reference;

    private CsvOutput(PrintStream stream, Path file, CeilingReference reference) {
        this.stream = stream;
        this.file = file;
        this.reference = reference;
    }

    /**
     * Opens the CSV: {@code out} when {@code file} is null (it is not closed at the end), else
     * the file, created or emptied, UTF-8.
     *
     * @throws IOException if the file cannot be opened for writing
     */
    static CsvOutput open(Path file, PrintStream out) throws IOException {
        return open(file, out, null);
    }

    /**
     * Opens the CSV as {@link #open(Path, PrintStream)} does, with the
     * {@link #REFERENCE_COLUMNS} of {@code reference} at the end of every line when it is not
     * null.
     *
     * @throws IOException if the file cannot be opened for writing
     */
    static CsvOutput open(Path file, PrintStream out, CeilingReference reference)
            throws IOException {
        if (file == null) {
            return new CsvOutput(out, null, reference);
        }
        return new CsvOutput(new PrintStream(Files.newOutputStream(file), false,
                StandardCharsets.UTF_8), file, reference);
    }

    /** Writes {@link #HEADER} (and the {@link #REFERENCE_COLUMNS}) and flushes. */
    void header() {
        stream.println(reference == null ? HEADER : HEADER + REFERENCE_COLUMNS);
        stream.flush();
    }

    /** Writes one row; see {@link #flush()}. */
    void write(ReportRow row) {
        stream.println(reference == null ? line(row) : line(row, reference));
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

    /**
     * Formats a row as {@link #line(ReportRow)} does, followed by the
     * {@link #REFERENCE_COLUMNS}: {@code reference_gb_per_s}, the C kernel's dense gate at the
     * row's thread count on a state of the row's vector size ({@code n} for a state-vector row,
     * {@code 2n} for a density matrix); {@code fraction_of_reference} = {@code gb_per_s /
     * reference_gb_per_s}; {@code reference_copy_gb_per_s}, its STREAM copy at that thread
     * count. Each with three decimals, or empty where the reference has no such figure.
     */
    static String line(ReportRow r, CeilingReference reference) {
        final OptionalDouble dense = reference.dense(r.vectorQubits(), r.threads());
        final OptionalDouble copy = reference.copy(r.threads());
        return line(r) + "," + cell(dense) + "," + (dense.isPresent()
                ? String.format(Locale.ROOT, "%.3f", r.gbps() / dense.getAsDouble()) : "")
                + "," + cell(copy);
    }

    private static String cell(OptionalDouble value) {
        return value.isPresent() ? String.format(Locale.ROOT, "%.3f", value.getAsDouble()) : "";
    }
}
