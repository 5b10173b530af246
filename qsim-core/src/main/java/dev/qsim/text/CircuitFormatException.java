package dev.qsim.text;

/**
 * Circuit text that cannot be read: a syntax error, a construct outside the supported subset, or
 * a statement the circuit refuses (such as a gate on a qubit twice). The message starts with the
 * line and column, as in {@code "line 4, column 1: ..."}.
 *
 * @since 0.1
 */
public final class CircuitFormatException extends IllegalArgumentException {
    private static final long serialVersionUID = 1L;

    /** The 1-based line. */
    private final int line;
    /** The 1-based column. */
    private final int column;

    /**
     * Creates the exception.
     *
     * @param line the 1-based line of the problem
     * @param column the 1-based column of the problem
     * @param message what is wrong and what is allowed
     */
    public CircuitFormatException(int line, int column, String message) {
        super("line " + line + ", column " + column + ": " + message);
        this.line = line;
        this.column = column;
    }

    /**
     * Creates the exception with the failure behind it.
     *
     * @param line the 1-based line of the problem
     * @param column the 1-based column of the problem
     * @param message what is wrong and what is allowed
     * @param cause the exception of the circuit builder
     */
    public CircuitFormatException(int line, int column, String message, Throwable cause) {
        super("line " + line + ", column " + column + ": " + message, cause);
        this.line = line;
        this.column = column;
    }

    /**
     * Returns the 1-based line of the problem.
     *
     * @return the line
     */
    public int line() {
        return line;
    }

    /**
     * Returns the 1-based column of the problem.
     *
     * @return the column
     */
    public int column() {
        return column;
    }
}
