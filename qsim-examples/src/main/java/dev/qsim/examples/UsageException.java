package dev.qsim.examples;

/**
 * A bad command-line argument of an example (an unparsable seed, a shot count out of range, an
 * extra argument). {@link Main} reports it on standard error with exit code 2; any other
 * exception is a fault and keeps its stack trace.
 */
final class UsageException extends IllegalArgumentException {

    private static final long serialVersionUID = 1L;

    /** Creates the exception with a message naming the bad value and what is allowed. */
    UsageException(String message) {
        super(message);
    }

    /** Creates the exception with a message and the parse failure behind it. */
    UsageException(String message, Throwable cause) {
        super(message, cause);
    }
}
