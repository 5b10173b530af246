package dev.qsim.noise;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;

import dev.qsim.Circuit;
import dev.qsim.Gates;

/** Random circuits, noise models and matrix checks shared by the noise tests. */
final class NoiseFixtures {
    private NoiseFixtures() {
    }

    /** Appends {@code gates} random gates (1, 2 and 3 qubits, controlled ones included). */
    static Circuit.Builder randomGates(Circuit.Builder b, int n, int gates,
            UniformRandomProvider rng) {
        for (int g = 0; g < gates; g++) {
            int q = rng.nextInt(n);
            int r = (q + 1 + rng.nextInt(n - 1)) % n;
            double angle = rng.nextDouble() * 2 * Math.PI;
            switch (rng.nextInt(14)) {
                case 0:
                    b.h(q);
                    break;
                case 1:
                    b.x(q);
                    break;
                case 2:
                    b.y(q);
                    break;
                case 3:
                    b.s(q);
                    break;
                case 4:
                    b.t(q);
                    break;
                case 5:
                    b.rx(q, angle);
                    break;
                case 6:
                    b.ry(q, angle);
                    break;
                case 7:
                    b.rz(q, angle);
                    break;
                case 8:
                    b.cnot(q, r);
                    break;
                case 9:
                    b.cz(q, r);
                    break;
                case 10:
                    b.swap(q, r);
                    break;
                case 11:
                    b.cphase(q, r, angle);
                    break;
                case 12:
                    b.sqrtX(q);
                    break;
                default:
                    if (n >= 3) {
                        int s = (r + 1 + rng.nextInt(n - 2)) % n;
                        if (s == q) {
                            s = (s + 1) % n;
                        }
                        if (s == r) {
                            s = (s + 1) % n;
                        }
                        if (s != q && s != r) {
                            b.controlled(Gates.ry(angle), new int[] {q, r}, s);
                            break;
                        }
                    }
                    b.rzz(q, r, angle);
                    break;
            }
        }
        return b;
    }

    /** A model with every kind of rule and channel of this package. */
    static NoiseModel richModel() {
        return NoiseModel.builder()
                .afterOneQubitGates(Channel.depolarizing(0.03).then(Channel.amplitudeDamping(0.04)))
                .afterTwoQubitGates(Channel.twoQubitDepolarizing(0.06))
                .afterGate("h", Channel.decay(3, 50, 60))
                .afterGate("t", Channel.phaseDamping(0.2))
                .afterGate("swap", Channel.bitFlip(0.05))
                .afterGate("unitary", Channel.bitPhaseFlip(0.04))
                .afterGateOn("cnot", Channel.phaseFlip(0.1).tensor(Channel.bitFlip(0.07)), 0, 1)
                .afterOneQubitGatesOn(2, Channel.amplitudeDamping(0.15))
                .readoutError(0.02, 0.05)
                .readoutError(1, 0.1, 0.03)
                .build();
    }

    /** The smallest eigenvalue of a Hermitian matrix, from EJML (reference library). */
    static double smallestEigenvalue(Complex[][] h) {
        // A + iB Hermitian has the same spectrum (each value twice) as [[A, -B], [B, A]].
        int d = h.length;
        DMatrixRMaj m = new DMatrixRMaj(2 * d, 2 * d);
        for (int r = 0; r < d; r++) {
            for (int c = 0; c < d; c++) {
                double a = (h[r][c].getReal() + h[c][r].getReal()) / 2;
                double bi = (h[r][c].getImaginary() - h[c][r].getImaginary()) / 2;
                m.set(r, c, a);
                m.set(r + d, c + d, a);
                m.set(r, c + d, -bi);
                m.set(r + d, c, bi);
            }
        }
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(2 * d, false, true);
        if (!eig.decompose(m)) {
            throw new AssertionError("EJML failed to decompose");
        }
        double min = Double.POSITIVE_INFINITY;
        for (int i = 0; i < 2 * d; i++) {
            min = Math.min(min, eig.getEigenvalue(i).getReal());
        }
        return min;
    }

    /** The Bloch vector (x, y, z) of a one-qubit density matrix: rho = (I + xX + yY + zZ)/2. */
    static double[] bloch(DensityMatrix rho) {
        Complex r01 = rho.get(0, 1);
        return new double[] {2 * r01.getReal(), -2 * r01.getImaginary(),
            rho.get(0, 0).getReal() - rho.get(1, 1).getReal()};
    }
}
