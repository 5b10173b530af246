package dev.qsim.internal;

import java.util.Arrays;
import java.util.BitSet;
import java.util.Objects;

import dev.qsim.kernel.Parallel;

/**
 * The one set of argument checks of every qsim package. Each check throws the JDK exception the
 * public API documents ({@link IllegalArgumentException}, or {@link IndexOutOfBoundsException}
 * for an index) with a message that names the quantity, the value and what is allowed, and
 * quotes user text only through {@link #excerpt(String)}, so a message stays short whatever
 * the input. Internal: this package is not exported.
 */
public final class Checks {
    /** The most characters of user text a message quotes. */
    public static final int EXCERPT = 60;

    private Checks() {
    }

    /**
     * Checks a qubit index against a register size.
     *
     * @param qubit the index
     * @param qubits the register size
     * @throws IndexOutOfBoundsException if the index is outside {@code [0, qubits)}
     */
    public static void requireQubit(int qubit, int qubits) {
        if (qubit < 0 || qubit >= qubits) {
            throw new IndexOutOfBoundsException("qubit " + qubit + " is out of range [0, "
                    + (qubits - 1) + "] for a " + qubits + "-qubit register");
        }
    }

    /**
     * Checks a classical bit index against a register size.
     *
     * @param clbit the index
     * @param clbits the register size
     * @throws IndexOutOfBoundsException if the index is outside {@code [0, clbits)}
     */
    public static void requireClbit(int clbit, int clbits) {
        if (clbit < 0 || clbit >= clbits) {
            throw new IndexOutOfBoundsException(clbits == 0
                    ? "clbit " + clbit + " is out of range: the circuit has no classical bits"
                    : "clbit " + clbit + " is out of range [0, " + (clbits - 1) + "] for "
                            + clbits + " classical bit(s)");
        }
    }

    /**
     * Checks that each qubit is in range and none appears twice, in time linear in the count.
     *
     * @param qubits the indices
     * @param register the register size
     * @param what what the qubits are, for the message ("the qubits of cnot")
     * @throws NullPointerException if {@code qubits} is null
     * @throws IndexOutOfBoundsException if an index is out of range
     * @throws IllegalArgumentException if an index repeats
     */
    public static void requireDistinctQubits(int[] qubits, int register, String what) {
        Objects.requireNonNull(qubits, what);
        BitSet seen = qubits.length > 8 ? new BitSet() : null;
        for (int i = 0; i < qubits.length; i++) {
            int q = qubits[i];
            requireQubit(q, register);
            boolean twice = false;
            if (seen != null) {
                twice = seen.get(q);
                seen.set(q);
            } else {
                for (int j = 0; j < i && !twice; j++) {
                    twice = qubits[j] == q;
                }
            }
            if (twice) {
                throw new IllegalArgumentException("qubit " + q + " appears twice in " + what
                        + " " + excerpt(Arrays.toString(qubits)) + "; each qubit may appear once");
            }
        }
    }

    /**
     * Checks that a count lies in a closed range.
     *
     * @param value the value
     * @param min the smallest allowed
     * @param max the largest allowed
     * @param name what the value is ("qubit count")
     * @return the value
     * @throws IllegalArgumentException if the value is outside {@code [min, max]}
     */
    public static int requireInRange(int value, int min, int max, String name) {
        if (value < min || value > max) {
            throw new IllegalArgumentException(name + " must be in [" + min + ", " + max
                    + "] but was " + value);
        }
        return value;
    }

    /**
     * Checks that a number is at least a bound.
     *
     * @param value the value
     * @param min the smallest allowed
     * @param name what the value is
     * @return the value
     * @throws IllegalArgumentException if {@code value < min}
     */
    public static long requireAtLeast(long value, long min, String name) {
        if (value < min) {
            throw new IllegalArgumentException(name + " must be at least " + min + " but was "
                    + value);
        }
        return value;
    }

    /**
     * Checks a shot count.
     *
     * @param shots the count
     * @throws IllegalArgumentException if {@code shots < 1}
     */
    public static void requireShots(long shots) {
        if (shots < 1) {
            throw new IllegalArgumentException("shots must be at least 1 but was " + shots);
        }
    }

    /**
     * Checks a thread count.
     *
     * @param threads the count
     * @return the count
     * @throws IllegalArgumentException if it is outside {@code [1, }{@link Parallel#MAX_THREADS}]
     */
    public static int requireThreads(int threads) {
        return requireInRange(threads, 1, Parallel.MAX_THREADS, "thread count");
    }

    /**
     * Checks that a number is finite.
     *
     * @param x the number
     * @param name what it is ("angle")
     * @return the number
     * @throws IllegalArgumentException if it is NaN or infinite
     */
    public static double requireFinite(double x, String name) {
        if (!Double.isFinite(x)) {
            throw new IllegalArgumentException(name + " must be finite but was " + x);
        }
        return x;
    }

    /**
     * Checks a probability.
     *
     * @param p the probability
     * @param name what it is
     * @return the probability
     * @throws IllegalArgumentException if it is outside {@code [0, 1]} or NaN
     */
    public static double requireProbability(double p, String name) {
        if (!(p >= 0 && p <= 1)) {
            throw new IllegalArgumentException(name + " must be in [0, 1] but was " + p);
        }
        return p;
    }

    /**
     * Checks a number strictly between 0 and 1 (a confidence level, a significance level).
     *
     * @param value the value
     * @param name what it is
     * @return the value
     * @throws IllegalArgumentException if it is outside {@code (0, 1)} or NaN
     */
    public static double requireOpenUnit(double value, String name) {
        if (!(value > 0 && value < 1)) {
            throw new IllegalArgumentException(name + " must be in (0, 1) but was " + value);
        }
        return value;
    }

    /**
     * Checks a duration that may be infinite but must be positive (a relaxation time).
     *
     * @param t the duration
     * @param name what it is
     * @return the duration
     * @throws IllegalArgumentException if it is not positive or is NaN
     */
    public static double requirePositiveTime(double t, String name) {
        if (!(t > 0)) {
            throw new IllegalArgumentException(name + " must be positive (infinity is allowed)"
                    + " but was " + t);
        }
        return t;
    }

    /**
     * Checks a finite, non-negative duration (a gate time).
     *
     * @param t the duration
     * @param name what it is
     * @return the duration
     * @throws IllegalArgumentException if it is negative, infinite or NaN
     */
    public static double requireFiniteTime(double t, String name) {
        if (!(t >= 0) || Double.isInfinite(t)) {
            throw new IllegalArgumentException(name + " must be finite and at least 0 but was "
                    + t);
        }
        return t;
    }

    /**
     * Checks a bit value.
     *
     * @param value the value
     * @param name what it is
     * @return the value
     * @throws IllegalArgumentException if it is neither 0 nor 1
     */
    public static int requireBit(int value, String name) {
        if (value != 0 && value != 1) {
            throw new IllegalArgumentException(name + " must be 0 or 1 but was " + value);
        }
        return value;
    }

    /**
     * Checks a name given by a user (a parameter name): not blank, no whitespace.
     *
     * @param name the name
     * @param what what it names ("a parameter name")
     * @return the name
     * @throws NullPointerException if it is null
     * @throws IllegalArgumentException if it is blank or holds whitespace
     */
    public static String requireName(String name, String what) {
        Objects.requireNonNull(name, what);
        if (name.isBlank()) {
            throw new IllegalArgumentException(what + " must not be blank but was '"
                    + excerpt(name) + "'");
        }
        for (int i = 0; i < name.length(); i++) {
            if (Character.isWhitespace(name.charAt(i))) {
                throw new IllegalArgumentException(what + " must not contain whitespace but was '"
                        + excerpt(name) + "'");
            }
        }
        return name;
    }

    /**
     * Returns user text short enough to quote in a message: the text itself up to
     * {@value #EXCERPT} characters, otherwise its start, an ellipsis and its length.
     *
     * @param text the text (null gives "null")
     * @return the excerpt
     */
    public static String excerpt(String text) {
        if (text == null) {
            return "null";
        }
        if (text.length() <= EXCERPT) {
            return text;
        }
        return text.substring(0, EXCERPT - 20) + "... (" + text.length() + " characters)";
    }
}
