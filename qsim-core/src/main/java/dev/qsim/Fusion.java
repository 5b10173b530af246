package dev.qsim;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

import dev.qsim.kernel.GateOp;
import dev.qsim.kernel.Lanes;

/**
 * Gate fusion: merges runs of gates on overlapping small qubit sets into one dense operator on
 * their union, so the state is streamed once for the run instead of once per gate. Greedy, in
 * circuit order: each gate joins the open blocks it touches when the union stays within the
 * size limit and the estimated cost of the merged block is no more than that of its parts.
 * Open blocks are pairwise disjoint, so they commute and may be emitted in any order relative
 * to each other. Method: the greedy fusion of T. Häner and D. S. Steiger, "0.5 petabyte
 * simulation of a 45-qubit quantum circuit", SC'17, doi:10.1145/3126908.3126947, §3.2.
 */
final class Fusion {
    /** Simulator fuses circuits from this many qubits on (measured: slower below, faster at 20). */
    static final int MIN_STATE_QUBITS = 16;

    /** The largest fused block, in qubits. */
    static final int MAX_QUBITS = 4;

    /**
     * Estimated cost of one pass of a dense k-qubit gate with the scalar loops, in units of a
     * dense 1-qubit pass: CPU time per amplitude of the scalar kernels, measured on one thread at
     * 20 qubits (about 3, 8, 25 and 35 ns for k = 1 to 4 on a 2-core AMD EPYC, JDK 17; k = 2
     * re-measured at 16 qubits on 2 threads: 3.4 times k = 1). The dense kernels are compute
     * bound from k = 2 on, so fusion pays mainly for runs on one or two qubits.
     */
    private static final double[] SCALAR_DENSE_COST = {0, 1.0, 3.4, 8.0, 12.0};
    /**
     * The same with the vector loops, every target at or above a vector's amplitudes. Above the
     * cache block every gate now runs inside a window or block in cache (the planner pulls gates
     * on disjoint qubits together), so these are in-cache costs: time per amplitude at 16 qubits,
     * one thread, 0.41-0.54 ns for a dense 1-qubit gate and 1.2-1.3 ns for a dense 2-qubit one
     * (JDK 17 and 25), k = 3 and 4 about 5 and 15 times k = 1 (the decisions record has the
     * runs). Merging only pays where it merges gates on the same qubits.
     */
    private static final double[] VECTOR_DENSE_COST = {0, 1.0, 2.6, 5.0, 15.0};
    /**
     * With the vector loops, a block of two or more targets with one inside a vector (qubit 0
     * or 1 with 512-bit vectors) runs on the scalar loops, which are faster there than lane
     * permutations: 3.9, 11.8 and 18 ns an amplitude for k = 2 to 4 at 24 qubits, so such
     * blocks are formed only from gates on the same qubits (cache blocking saves their passes).
     */
    private static final double[] VECTOR_LOW_DENSE_COST = {0, 1.0, 5.5, 17, 26};
    /**
     * Estimated cost of a diagonal or permutation pass with controls or several targets (CZ,
     * CNOT, SWAP ...), same units: they touch a half or a quarter of the amplitudes with little
     * arithmetic (scalar: 0.3 to 0.45 of a dense 1-qubit gate at 16 qubits, 2 threads; vector:
     * 0.25 for CZ and 0.5 for CNOT at 24 qubits, one thread).
     */
    private static final double CHEAP_COST = 0.4;

    /** The loops' amplitudes per vector (log2), 0 for scalar loops; read once. */
    private static final int VECTOR_LOG = Lanes.amplitudeLog();

    /** Estimated cost of a dense block on the qubits of {@code mask}. */
    private static double denseCost(long mask) {
        int k = Long.bitCount(mask);
        if (k >= SCALAR_DENSE_COST.length) {
            return Double.MAX_VALUE / 4;
        }
        if (VECTOR_LOG == 0) {
            return SCALAR_DENSE_COST[k];
        }
        boolean inside = (mask & ((1L << VECTOR_LOG) - 1)) != 0;
        return inside ? VECTOR_LOW_DENSE_COST[k] : VECTOR_DENSE_COST[k];
    }

    private Fusion() {
    }

    private static final class Block {
        final List<Instruction> gates = new ArrayList<>();
        long mask;      // qubits, as bits (circuits here have at most 40 qubits)
        double cost;    // cost if emitted as is

        int size() {
            return Long.bitCount(mask);
        }
    }

    private static long qubitMask(Instruction in) {
        long m = 0;
        for (int q : in.targetsRaw()) {
            m |= 1L << q;
        }
        for (int q : in.controlsRaw()) {
            m |= 1L << q;
        }
        return m;
    }

    private static double cost(Instruction in) {
        if (in.plan().shape() != GateOp.DENSE) {
            // X and single-qubit phases without controls go to the engine's lazy frame: free.
            boolean frame = in.targetsRaw().length == 1 && in.controlsRaw().length == 0;
            return frame ? 0 : CHEAP_COST;
        }
        long targets = 0;
        for (int q : in.targetsRaw()) {
            targets |= 1L << q;
        }
        return denseCost(targets);
    }

    /**
     * Returns an equivalent list of gates with runs fused.
     *
     * @param gates instructions of kind GATE only, on at most 40 qubits
     * @return the fused list (single gates that joined nothing are kept as they were)
     */
    static List<Instruction> fuse(List<Instruction> gates) {
        List<Instruction> out = new ArrayList<>();
        group(gates, new Emitter() {
            @Override
            public void single(Instruction g) {
                out.add(g);
            }

            @Override
            public void block(List<Instruction> members, int[] qs) {
                Operator m = Operator.identity(qs.length);
                for (Instruction g : members) {
                    m = expand(g, qs).times(m);
                }
                out.add(Instruction.gate(Gate.UNITARY, new double[0], m, qs, new int[0]));
            }
        });
        return out;
    }

    /**
     * Returns the kernel forms of {@link #fuse(List)}'s result without computing the fused
     * matrices: the same blocks, each a dense gate on its qubits with a stand-in matrix (a
     * product of Hadamards). Enough to plan and count the passes a run makes.
     *
     * @param gates instructions of kind GATE only, on at most 40 qubits
     * @return the kernel forms, in order
     */
    static List<GateOp> shapes(List<Instruction> gates) {
        List<GateOp> out = new ArrayList<>();
        group(gates, new Emitter() {
            @Override
            public void single(Instruction g) {
                out.add(g.plan());
            }

            @Override
            public void block(List<Instruction> members, int[] qs) {
                out.add(new GateOp(GateOp.DENSE, qs, new int[0], STAND_IN[qs.length], null));
            }
        });
        return out;
    }

    /**
     * Dense Hadamard products on 1 to MAX_QUBITS qubits with complex column phases: stand-ins
     * for fused matrices.
     */
    private static final double[][] STAND_IN = new double[MAX_QUBITS + 1][];

    static {
        for (int k = 1; k <= MAX_QUBITS; k++) {
            int d = 1 << k;
            double s = Math.pow(0.5, k / 2.0);
            STAND_IN[k] = new double[2 * d * d];
            for (int r = 0; r < d; r++) {
                for (int c = 0; c < d; c++) {
                    // Column phases make the stand-in complex, as fused products are: the
                    // counter then prices a fused 1-qubit block with the complex loops.
                    double v = (Integer.bitCount(r & c) & 1) == 0 ? s : -s;
                    STAND_IN[k][2 * (r * d + c)] = v * Math.cos(0.7 * c);
                    STAND_IN[k][2 * (r * d + c) + 1] = v * Math.sin(0.7 * c);
                }
            }
        }
    }

    /** Receives the greedy grouping's output: gates kept alone and fused blocks. */
    private interface Emitter {
        void single(Instruction g);

        void block(List<Instruction> members, int[] qs);
    }

    /** The greedy grouping of {@link #fuse(List)}, reported to an emitter in order. */
    private static void group(List<Instruction> gates, Emitter out) {
        List<Block> open = new ArrayList<>();
        for (Instruction g : gates) {
            long gm = qubitMask(g);
            long union = gm;
            double parts = cost(g);
            List<Block> hit = new ArrayList<>();
            for (Block b : open) {
                if ((b.mask & gm) != 0) {
                    hit.add(b);
                    union |= b.mask;
                    parts += b.cost;
                }
            }
            // Flush the costliest touched blocks until the rest can merge with g.
            hit.sort((x, y) -> Double.compare(y.cost, x.cost));
            int first = 0;
            while (true) {
                int k = Long.bitCount(union);
                if (k <= MAX_QUBITS && denseCost(union) <= parts) {
                    break;
                }
                if (first == hit.size()) {
                    union = -1;
                    break;
                }
                Block b = hit.get(first++);
                emit(b, out);
                open.remove(b);
                parts -= b.cost;
                union = gm;
                for (int i = first; i < hit.size(); i++) {
                    union |= hit.get(i).mask;
                }
            }
            if (union == -1) {
                if (Long.bitCount(gm) <= MAX_QUBITS) {
                    Block b = new Block();
                    b.gates.add(g);
                    b.mask = gm;
                    b.cost = cost(g);
                    open.add(b);
                } else {
                    out.single(g);
                }
                continue;
            }
            Block merged = new Block();
            for (int i = first; i < hit.size(); i++) {
                merged.gates.addAll(hit.get(i).gates);
                open.remove(hit.get(i));
            }
            merged.gates.add(g);
            merged.mask = union;
            merged.cost = merged.gates.size() == 1 ? cost(g) : denseCost(union);
            open.add(merged);
        }
        for (Block b : open) {
            emit(b, out);
        }
    }

    private static void emit(Block b, Emitter out) {
        if (b.gates.size() == 1) {
            out.single(b.gates.get(0));
            return;
        }
        int[] qs = new int[b.size()];
        int w = 0;
        for (int q = 0; q < 64; q++) {
            if ((b.mask >>> q & 1) != 0) {
                qs[w++] = q;
            }
        }
        out.block(b.gates, qs);
    }

    /** The matrix of gate g (with its controls) on the block's qubits qs (bit j = qs[j]). */
    static Operator expand(Instruction g, int[] qs) {
        int k = qs.length;
        int d = 1 << k;
        int[] t = g.targetsRaw();
        int[] c = g.controlsRaw();
        int[] tPos = new int[t.length];
        int ctrlMask = 0;
        for (int i = 0; i < t.length; i++) {
            tPos[i] = Arrays.binarySearch(qs, t[i]);
        }
        for (int q : c) {
            ctrlMask |= 1 << Arrays.binarySearch(qs, q);
        }
        int tMask = 0;
        for (int p : tPos) {
            tMask |= 1 << p;
        }
        double[] gm = g.operator().raw();
        int gd = 1 << t.length;
        double[] r = new double[2 * d * d];
        for (int col = 0; col < d; col++) {
            if ((col & ctrlMask) != ctrlMask) {
                r[2 * (col * d + col)] = 1;
                continue;
            }
            int gcol = 0;
            for (int j = 0; j < t.length; j++) {
                gcol |= ((col >>> tPos[j]) & 1) << j;
            }
            int rest = col & ~tMask;
            for (int grow = 0; grow < gd; grow++) {
                int row = rest;
                for (int j = 0; j < t.length; j++) {
                    row |= ((grow >>> j) & 1) << tPos[j];
                }
                r[2 * (row * d + col)] = gm[2 * (grow * gd + gcol)];
                r[2 * (row * d + col) + 1] = gm[2 * (grow * gd + gcol) + 1];
            }
        }
        return Operator.ofRaw(k, r);
    }
}
