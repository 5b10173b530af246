package dev.qsim.internal;

import java.util.Arrays;

import dev.qsim.Expression;

/**
 * The classical part of one shot: the classical bits and the circuit's classical variables
 * (each held in 64 bits: an integer or bool as itself, a float as its IEEE 754 bits). Mutable,
 * not thread-safe; {@link #copy()} and value equality let the branch engines key and merge
 * branches by their classical state. Internal: this package is not exported.
 */
public final class ClassicalState implements Expression.Values {
    private final long[] bits;
    private final int clbits;
    private final long[] variables;

    /**
     * Returns a state with every bit 0 and every variable 0.
     *
     * @param clbits the number of classical bits
     * @param variables the number of variables
     */
    public ClassicalState(int clbits, int variables) {
        this.clbits = clbits;
        this.bits = new long[(clbits + 63) >>> 6];
        this.variables = new long[variables];
    }

    private ClassicalState(ClassicalState other) {
        this.clbits = other.clbits;
        this.bits = other.bits.clone();
        this.variables = other.variables.clone();
    }

    /**
     * Returns an independent copy.
     *
     * @return the copy
     */
    public ClassicalState copy() {
        return new ClassicalState(this);
    }

    /**
     * Returns a classical bit.
     *
     * @param i the bit; unchecked
     * @return its value
     */
    @Override
    public boolean bit(int i) {
        return ((bits[i >>> 6] >>> (i & 63)) & 1L) != 0;
    }

    /**
     * Sets a classical bit.
     *
     * @param i the bit; unchecked
     * @param value its value
     */
    public void setBit(int i, boolean value) {
        if (value) {
            bits[i >>> 6] |= 1L << (i & 63);
        } else {
            bits[i >>> 6] &= ~(1L << (i & 63));
        }
    }

    /**
     * Returns the number of classical bits.
     *
     * @return the count
     */
    public int clbits() {
        return clbits;
    }

    /**
     * Returns the bits as a register value, bit {@code j} the classical bit {@code j} (at most 63
     * bits).
     *
     * @return the value
     */
    public long register() {
        return bits.length == 0 ? 0 : bits[0];
    }

    /**
     * Returns the bits as booleans.
     *
     * @param out {@code clbits()} booleans. Modified.
     */
    public void copyBits(boolean[] out) {
        for (int i = 0; i < clbits; i++) {
            out[i] = bit(i);
        }
    }

    /**
     * Returns a variable's 64 bits.
     *
     * @param slot the variable; unchecked
     * @return its bits
     */
    @Override
    public long variable(int slot) {
        return variables[slot];
    }

    /**
     * Sets a variable's 64 bits.
     *
     * @param slot the variable; unchecked
     * @param value its bits
     */
    public void setVariable(int slot, long value) {
        variables[slot] = value;
    }

    /**
     * Resets every bit and variable to 0.
     */
    public void clear() {
        Arrays.fill(bits, 0L);
        Arrays.fill(variables, 0L);
    }

    /**
     * Compares bits and variables.
     *
     * @param o another object
     * @return whether both hold the same values
     */
    @Override
    public boolean equals(Object o) {
        if (!(o instanceof ClassicalState)) {
            return false;
        }
        ClassicalState s = (ClassicalState) o;
        return clbits == s.clbits && Arrays.equals(bits, s.bits)
                && Arrays.equals(variables, s.variables);
    }

    /**
     * Returns a hash code consistent with {@link #equals(Object)}.
     *
     * @return the hash code
     */
    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(bits) + Arrays.hashCode(variables);
    }
}
