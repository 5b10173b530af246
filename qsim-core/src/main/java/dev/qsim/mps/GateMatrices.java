package dev.qsim.mps;

import org.apache.commons.numbers.complex.Complex;

import dev.qsim.Instruction;
import dev.qsim.Operator;

/**
 * The dense matrix of a gate instruction on all its qubits, controls included: index bit
 * {@code x} belongs to {@code Instruction.qubits()[x]} (controls first, then targets), and the
 * target operator acts only where every control bit is 1 (Barenco et al. 1995, "Elementary gates
 * for quantum computation", Phys. Rev. A 52, 3457, doi:10.1103/PhysRevA.52.3457).
 */
final class GateMatrices {
    private GateMatrices() {
    }

    /**
     * Returns the matrix of a gate, row-major, re/im interleaved.
     *
     * @param in a gate instruction
     * @param angles the angles of a dynamic gate, or null to use the instruction's operator
     * @return {@code 2 · 4^k} doubles for k qubits
     */
    static double[] of(Instruction in, double[] angles) {
        Operator op = angles == null ? in.operator() : in.gate().operator(angles);
        int c = in.controls().length;
        int t = op.qubits();
        int k = c + t;
        int dim = 1 << k;
        int td = 1 << t;
        int all = (1 << c) - 1;
        double[] m = new double[2 * dim * dim];
        for (int i = 0; i < dim; i++) {
            if ((i & all) != all) {
                m[2 * (i * dim + i)] = 1;
                continue;
            }
            int row = i >>> c;
            for (int col = 0; col < td; col++) {
                Complex z = op.get(row, col);
                int j = (col << c) | all;
                m[2 * (i * dim + j)] = z.getReal();
                m[2 * (i * dim + j) + 1] = z.getImaginary();
            }
        }
        return m;
    }
}
