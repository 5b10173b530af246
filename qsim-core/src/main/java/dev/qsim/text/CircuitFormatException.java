package dev.qsim.text;

/**
 * Circuit text that cannot be read: a syntax error, a construct outside the supported part of
 * the language, a statement the circuit refuses (such as a gate on a qubit twice), or a program
 * that needs more work or instructions than the reader's settings allow. The message starts
 * with the line and column, as in {@code "line 4, column 1: ..."}; a problem inside the body of
 * a gate or subroutine is reported at the call in the user's text, with the definition's
 * position in the message. Messages quote user text only in short excerpts and are at most
 * {@value #MAX_MESSAGE} characters long.
 *
 * @since 0.1
 */
public final class CircuitFormatException extends IllegalArgumentException {
    /** The longest message: {@value} characters. */
    public static final int MAX_MESSAGE = 2000;

    private static final long serialVersionUID = 1L;

    /** The 1-based line. */
    private final int line;
    /** The 1-based column. */
    private final int column;
    /** The problem, without its position or the note of where it was inside a definition. */
    private final String problem;
    /** Where the problem is inside definitions (line, column), or the position itself. */
    private final int innerLine;
    private final int innerColumn;
    /** How many gate or subroutine bodies the problem is inside. */
    private final int depth;

    /**
     * Creates the exception.
     *
     * @param line the 1-based line of the problem
     * @param column the 1-based column of the problem
     * @param message what is wrong and what is allowed
     */
    public CircuitFormatException(int line, int column, String message) {
        this(line, column, message, null);
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
        super(text(line, column, message), cause);
        this.line = line;
        this.column = column;
        this.problem = bounded(message);
        this.innerLine = line;
        this.innerColumn = column;
        this.depth = 0;
    }

    /**
     * A problem inside the body of a gate or subroutine, reported at the call.
     *
     * @param inner the problem as found in the body (itself possibly inside deeper bodies)
     * @param owner the gate or subroutine called, such as "gate 'g'"
     * @param definition where it is defined
     */
    CircuitFormatException(int line, int column, CircuitFormatException inner, String owner,
            Syntax.Position definition) {
        super(text(line, column, inner.problem + " [inside " + owner + " defined at "
                + definition + "; the problem is at line " + inner.innerLine + ", column "
                + inner.innerColumn + (inner.depth > 0 ? ", " + (inner.depth + 1)
                + " definitions deep" : "") + "]"), inner);
        this.line = line;
        this.column = column;
        this.problem = inner.problem;
        this.innerLine = inner.innerLine;
        this.innerColumn = inner.innerColumn;
        this.depth = inner.depth + 1;
    }

    private static String text(int line, int column, String message) {
        return bounded("line " + line + ", column " + column + ": " + message);
    }

    private static String bounded(String message) {
        String m = String.valueOf(message);
        if (m.length() <= MAX_MESSAGE) {
            return m;
        }
        return m.substring(0, MAX_MESSAGE - 30) + "... (message cut)";
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

    /** The problem without its position. */
    String problem() {
        return problem;
    }
}
