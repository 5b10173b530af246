package dev.qsim;

import dev.qsim.internal.Checks;

/**
 * The standard gates as {@link Operator}s, with their textbook matrices.
 *
 * <p>Matrices follow M. A. Nielsen and I. L. Chuang, <i>Quantum Computation and Quantum
 * Information</i> (2010), §1.3 and §4.2 (single-qubit gates and rotations) and §4.3 (controlled
 * gates), with the global phases fixed by the {@linkplain dev.qsim package conventions}. For
 * multi-qubit gates, bit {@code j} of the matrix index is the {@code j}-th qubit the gate is
 * applied to: {@link #CNOT} on {@code (control, target)}, {@link #TOFFOLI} on
 * {@code (control1, control2, target)}, {@link #FREDKIN} on {@code (control, a, b)}.
 *
 * <p>All constants are exact where the entries are representable ({@code 1/√2} and
 * {@code e^{iπ/4}} are the nearest doubles). This class has no instances.
 *
 * @since 0.1
 */
public final class Gates {
    private static final double R = Math.sqrt(0.5);

    /** The single-qubit identity. */
    public static final Operator I = one(1, 0, 0, 0, 0, 0, 1, 0);
    /** Pauli X (NOT): {@code [[0, 1], [1, 0]]}. */
    public static final Operator X = one(0, 0, 1, 0, 1, 0, 0, 0);
    /** Pauli Y: {@code [[0, -i], [i, 0]]}. */
    public static final Operator Y = one(0, 0, 0, -1, 0, 1, 0, 0);
    /** Pauli Z: {@code diag(1, -1)}. */
    public static final Operator Z = one(1, 0, 0, 0, 0, 0, -1, 0);
    /** Hadamard: {@code [[1, 1], [1, -1]] / √2}. */
    public static final Operator H = one(R, 0, R, 0, R, 0, -R, 0);
    /** Phase gate {@code S = diag(1, i)}, the square root of Z. */
    public static final Operator S = one(1, 0, 0, 0, 0, 0, 0, 1);
    /** {@code S† = diag(1, -i)}. */
    public static final Operator S_DAGGER = one(1, 0, 0, 0, 0, 0, 0, -1);
    /** {@code T = diag(1, e^{iπ/4})}, the square root of S. */
    public static final Operator T = one(1, 0, 0, 0, 0, 0, R, R);
    /** {@code T† = diag(1, e^{-iπ/4})}. */
    public static final Operator T_DAGGER = one(1, 0, 0, 0, 0, 0, R, -R);
    /** Square root of X: {@code ½[[1+i, 1−i], [1−i, 1+i]]}, so {@code SQRT_X² = X}. */
    public static final Operator SQRT_X = one(0.5, 0.5, 0.5, -0.5, 0.5, -0.5, 0.5, 0.5);
    /** Inverse of {@link #SQRT_X}: {@code ½[[1−i, 1+i], [1+i, 1−i]]}. */
    public static final Operator SQRT_X_DAGGER = one(0.5, -0.5, 0.5, 0.5, 0.5, 0.5, 0.5, -0.5);
    /** Controlled NOT on (control, target): flips the target when the control is 1. */
    public static final Operator CNOT = permutation(2, 0, 3, 2, 1);
    /** Controlled Z: {@code diag(1, 1, 1, -1)}, symmetric in its two qubits. */
    public static final Operator CZ = diagonal(2, 1, 0, 1, 0, 1, 0, -1, 0);
    /** Swaps two qubits. */
    public static final Operator SWAP = permutation(2, 0, 2, 1, 3);
    /** Toffoli (controlled-controlled NOT) on (control1, control2, target). */
    public static final Operator TOFFOLI = permutation(3, 0, 1, 2, 7, 4, 5, 6, 3);
    /** Fredkin (controlled SWAP) on (control, a, b): swaps a and b when the control is 1. */
    public static final Operator FREDKIN = permutation(3, 0, 1, 2, 5, 4, 3, 6, 7);

    private Gates() {
    }

    /**
     * Rotation about the X axis, {@code rx(θ) = exp(-iθX/2) = [[cos θ/2, -i sin θ/2],
     * [-i sin θ/2, cos θ/2]]} (Nielsen and Chuang 2010, eq. 4.4).
     *
     * @param theta the angle in radians, finite
     * @return the rotation
     * @throws IllegalArgumentException if {@code theta} is not finite
     */
    public static Operator rx(double theta) {
        Checks.requireFinite(theta, "angle");
        double c = Math.cos(theta / 2);
        double s = Math.sin(theta / 2);
        return one(c, 0, 0, -s, 0, -s, c, 0);
    }

    /**
     * Rotation about the Y axis, {@code ry(θ) = exp(-iθY/2) = [[cos θ/2, -sin θ/2],
     * [sin θ/2, cos θ/2]]} (Nielsen and Chuang 2010, eq. 4.5).
     *
     * @param theta the angle in radians, finite
     * @return the rotation
     * @throws IllegalArgumentException if {@code theta} is not finite
     */
    public static Operator ry(double theta) {
        Checks.requireFinite(theta, "angle");
        double c = Math.cos(theta / 2);
        double s = Math.sin(theta / 2);
        return one(c, 0, -s, 0, s, 0, c, 0);
    }

    /**
     * Rotation about the Z axis, {@code rz(θ) = exp(-iθZ/2) = diag(e^{-iθ/2}, e^{iθ/2})}
     * (Nielsen and Chuang 2010, eq. 4.6).
     *
     * @param theta the angle in radians, finite
     * @return the rotation
     * @throws IllegalArgumentException if {@code theta} is not finite
     */
    public static Operator rz(double theta) {
        Checks.requireFinite(theta, "angle");
        double c = Math.cos(theta / 2);
        double s = Math.sin(theta / 2);
        return one(c, -s, 0, 0, 0, 0, c, s);
    }

    /**
     * Phase shift {@code phase(λ) = diag(1, e^{iλ})}.
     *
     * @param lambda the phase in radians, finite
     * @return the gate
     * @throws IllegalArgumentException if {@code lambda} is not finite
     */
    public static Operator phase(double lambda) {
        Checks.requireFinite(lambda, "angle");
        return one(1, 0, 0, 0, 0, 0, Math.cos(lambda), Math.sin(lambda));
    }

    /**
     * Controlled phase {@code cphase(λ) = diag(1, 1, 1, e^{iλ})}, symmetric in its two qubits.
     *
     * @param lambda the phase in radians, finite
     * @return the two-qubit gate
     * @throws IllegalArgumentException if {@code lambda} is not finite
     */
    public static Operator cphase(double lambda) {
        Checks.requireFinite(lambda, "angle");
        return diagonal(2, 1, 0, 1, 0, 1, 0, Math.cos(lambda), Math.sin(lambda));
    }

    /**
     * Ising ZZ coupling {@code rzz(θ) = exp(-iθ Z⊗Z/2) = diag(e^{-iθ/2}, e^{iθ/2}, e^{iθ/2},
     * e^{-iθ/2})}.
     *
     * @param theta the angle in radians, finite
     * @return the two-qubit gate
     * @throws IllegalArgumentException if {@code theta} is not finite
     */
    public static Operator rzz(double theta) {
        Checks.requireFinite(theta, "angle");
        double c = Math.cos(theta / 2);
        double s = Math.sin(theta / 2);
        return diagonal(2, c, -s, c, s, c, s, c, -s);
    }

    /**
     * The general single-qubit gate {@code u(θ, φ, λ) = [[cos θ/2, -e^{iλ} sin θ/2],
     * [e^{iφ} sin θ/2, e^{i(φ+λ)} cos θ/2]]}, which equals {@code phase(φ) ry(θ) phase(λ)}
     * (Nielsen and Chuang 2010, Theorem 4.1, up to global phase). The phase {@code e^{i(φ+λ)}}
     * is computed as the product {@code e^{iφ} e^{iλ}}, not from the rounded sum {@code φ+λ},
     * so the matrix is unitary to rounding for any finite angles, however large.
     *
     * @param theta the polar angle in radians, finite
     * @param phi the first phase in radians, finite
     * @param lambda the second phase in radians, finite
     * @return the gate
     * @throws IllegalArgumentException if an angle is not finite
     */
    public static Operator u(double theta, double phi, double lambda) {
        Checks.requireFinite(theta, "theta");
        Checks.requireFinite(phi, "phi");
        Checks.requireFinite(lambda, "lambda");
        double c = Math.cos(theta / 2);
        double s = Math.sin(theta / 2);
        double cp = Math.cos(phi);
        double sp = Math.sin(phi);
        double cl = Math.cos(lambda);
        double sl = Math.sin(lambda);
        return one(c, 0,
                -cl * s, -sl * s,
                cp * s, sp * s,
                (cp * cl - sp * sl) * c, (sp * cl + cp * sl) * c);
    }

    private static Operator one(double... reim) {
        return Operator.ofRaw(1, reim.clone());
    }

    private static Operator diagonal(int qubits, double... reim) {
        int d = 1 << qubits;
        double[] m = new double[2 * d * d];
        for (int i = 0; i < d; i++) {
            m[2 * (i * d + i)] = reim[2 * i];
            m[2 * (i * d + i) + 1] = reim[2 * i + 1];
        }
        return Operator.ofRaw(qubits, m);
    }

    /** Column j maps to row target[j]: the gate sends basis state j to basis state target[j]. */
    private static Operator permutation(int qubits, int... target) {
        int d = 1 << qubits;
        double[] m = new double[2 * d * d];
        for (int j = 0; j < d; j++) {
            m[2 * (target[j] * d + j)] = 1;
        }
        return Operator.ofRaw(qubits, m);
    }
}
