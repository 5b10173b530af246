package dev.qsim.text;

import dev.qsim.text.Syntax.Position;

/**
 * The work one read may do, counted in steps: every statement run, gate definition or
 * subroutine entered (empty bodies too), loop iteration, register element an operand stands
 * for (barrier operands included), repetition of a powered gate and operation of an expression
 * evaluated. Each step costs the reader a small constant time, so a read ends in time
 * proportional to the budget whatever the file.
 */
final class Budget {
    private final long total;
    private long left;

    Budget(long total) {
        this.total = total;
        this.left = total;
    }

    /**
     * Spends steps.
     *
     * @param steps the steps, at least 0
     * @param at the statement being expanded
     * @throws CircuitFormatException if the budget is spent
     */
    void spend(long steps, Position at) {
        left -= steps;
        if (left < 0) {
            left = -1;
            throw at.error("reading the program takes more than " + total + " steps of work"
                    + " (the work budget: statements run, gate definitions entered, loop"
                    + " iterations, register elements, barrier operands, expression operations);"
                    + " if the program is meant to be this large, raise the budget with"
                    + " QasmReader.Settings.withWorkBudget(long)");
        }
    }

    /** The steps spent so far. */
    long spent() {
        return total - Math.max(left, 0);
    }
}
