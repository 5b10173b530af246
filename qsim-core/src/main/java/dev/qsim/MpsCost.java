package dev.qsim;

import java.util.List;

import dev.qsim.internal.EngineWork;
import dev.qsim.internal.HeapLayout;

/**
 * The matrix-product-state engine's counter for {@link CostModel}: follows the bond dimensions
 * a circuit can reach and counts the work of each block update in units of
 * {@code m · n · min(m, n)} for the {@code m x n} matrix each split decomposes (the SVD's
 * operation count up to a constant, Golub and Van Loan 2013, <i>Matrix Computations</i>, 4th
 * ed., §8.6.3), which {@link Calibration} prices per unit.
 *
 * <p>The bond dimensions are upper bounds: across bond {@code b} at most
 * {@code 2^min(b + 1, n - b - 1)} and the bond limit; a two-site update at most multiplies the
 * bond by the operator Schmidt rank of its gate (2 for a gate with one control and one target,
 * such as CNOT or CZ; 4 for any other two-qubit gate and the routing swaps; Nielsen and Chuang
 * 2010, sec. 2.5 for the Schmidt decomposition), and never exceeds twice an outer bond. So the
 * forecast is the cost of a circuit whose entanglement grows as fast as its gates allow; a
 * truncation threshold or a weakly entangling circuit ends below it.
 */
final class MpsCost {
    private MpsCost() {
    }

    /** The bond dimensions of a chain, bond {@code b} between qubits {@code b} and b + 1. */
    private static final class Bonds {
        final double[] chi;
        final double[] cap;
        double units;
        double largest = 1;
        long updates;

        Bonds(int n, int bondLimit) {
            chi = new double[Math.max(0, n - 1)];
            cap = new double[chi.length];
            for (int b = 0; b < chi.length; b++) {
                chi[b] = 1;
                int side = Math.min(b + 1, n - b - 1);
                cap[b] = side >= 31 ? bondLimit : Math.min(bondLimit, 1L << side);
            }
        }

        double outer(int b) {
            return b < 0 || b >= chi.length ? 1 : chi[b];
        }

        /** A two-site update on bond b by a gate of operator Schmidt rank {@code rank}. */
        void update(int b, double rank) {
            double l = outer(b - 1);
            double r = outer(b + 1);
            double m = 2 * l;
            double n = 2 * r;
            units += m * n * Math.min(m, n);
            chi[b] = Math.min(Math.min(chi[b] * rank, cap[b]), Math.min(m, n));
            largest = Math.max(largest, chi[b]);
            updates++;
        }

        /**
         * A one-qubit gate on site q: a 2x2 matrix times the site's {@code 2 l r} entries, about
         * {@code 2 l r} units (a unit is some 20 floating-point operations of an SVD).
         */
        void one(int q) {
            units += 2 * outer(q - 1) * outer(q);
        }

        /** Bytes of the tensors: {@code 2 l r} complex numbers per site. */
        double tensorBytes() {
            double bytes = 0;
            for (int q = 0; q <= chi.length; q++) {
                bytes += HeapLayout.arrayBytes((long) (32 * outer(q - 1) * outer(q)));
            }
            return bytes;
        }
    }

    static EngineWork work(Circuit c, int shots, int bondLimit) {
        int n = c.qubits();
        Bonds bonds = new Bonds(n, bondLimit);
        boolean atEnd = c.measuresAtEnd();
        List<Instruction> list = atEnd ? c.withoutMeasurements().instructions()
                : c.instructions();
        int first = atEnd ? list.size() : firstClassical(list);
        for (int i = 0; i < first; i++) {
            gate(list.get(i), bonds);
        }
        double once = bonds.units;
        EngineWork e = new EngineWork();
        boolean sampled = false;
        for (int q : c.clbitSources()) {
            sampled |= q >= 0;
        }
        if (atEnd && sampled) {
            // Sampling: per shot, one pass along the chain, a vector of l entries times the
            // site's 2 l r (about l r units per site).
            double perShot = 0;
            for (int q = 0; q <= bonds.chi.length; q++) {
                perShot += bonds.outer(q - 1) * bonds.outer(q);
            }
            bonds.units += perShot * shots;
        } else if (!atEnd) {
            // Shot by shot: a copy of the chain, then the rest of the circuit, per shot (its
            // bond dimensions followed once: later shots start from the same state).
            double before = bonds.units;
            for (int i = first; i < list.size(); i++) {
                walk(list.get(i), bonds);
            }
            double rest = bonds.units - before;
            bonds.units = once + shots * rest;
        }
        e.mps(bonds.units, bonds.updates, bonds.largest);
        double tensors = bonds.tensorBytes();
        double largest = bonds.largest;
        double workspace = HeapLayout.arrayBytes((long) (16 * 4 * largest * largest)) * 4.0;
        e.hold((long) tensors, "the tensors (bond dimension up to " + (long) largest + ")");
        e.hold((long) workspace, "the decomposition of the largest block");
        if (!atEnd) {
            e.hold((long) tensors, "a copy of the tensors for each shot");
        }
        e.draw(shots, c.clbits());
        return e;
    }

    private static int firstClassical(List<Instruction> list) {
        int i = 0;
        while (i < list.size() && list.get(i).kind() == Instruction.Kind.GATE
                && !list.get(i).isDynamic()) {
            i++;
        }
        return i;
    }

    /** Follows an instruction of a shot: gates, and the bodies of blocks (loops to bound). */
    private static void walk(Instruction in, Bonds bonds) {
        switch (in.kind()) {
            case GATE:
                gate(in, bonds);
                break;
            case MEASURE:
            case RESET:
                bonds.units += 2 * bonds.outer(in.targetsRaw()[0] - 1)
                        * bonds.outer(in.targetsRaw()[0]);
                break;
            case IF_BIT:
            case IF:
                for (Instruction b : in.body()) {
                    walk(b, bonds);
                }
                for (Instruction b : in.otherwise()) {
                    walk(b, bonds);
                }
                break;
            case WHILE:
                for (int k = 0; k < in.maxIterations(); k++) {
                    for (Instruction b : in.body()) {
                        walk(b, bonds);
                    }
                }
                break;
            default:
                break;
        }
    }

    /** A gate: routing swaps to the lowest qubit, the block's splits, the swaps undone. */
    private static void gate(Instruction in, Bonds bonds) {
        int[] q = in.qubits();
        if (q.length == 1) {
            bonds.one(q[0]);
            return;
        }
        int[] sorted = q.clone();
        java.util.Arrays.sort(sorted);
        int base = sorted[0];
        int k = sorted.length;
        for (int j = 1; j < k; j++) {
            for (int p = sorted[j] - 1; p >= base + j; p--) {
                bonds.update(p, 4);
            }
        }
        double rank = k == 2 && in.controlsRaw().length == 1 ? 2 : 4;
        for (int j = 0; j < k - 1; j++) {
            bonds.update(base + j, rank);
        }
        // The swaps are undone: as many updates again.
        for (int j = k - 1; j >= 1; j--) {
            for (int p = base + j; p <= sorted[j] - 1; p++) {
                bonds.update(p, 4);
            }
        }
    }
}
