package dev.qsim.text;

import java.util.List;

import org.apache.commons.numbers.complex.Complex;

import dev.qsim.Circuit;
import dev.qsim.Expression;
import dev.qsim.Gate;
import dev.qsim.Operator;

/**
 * The instructions an expanded program records, held until the program ends: a circuit's
 * qubit and clbit counts are known only then. Each records its position (line and column
 * packed into a long) so that a refusal by the circuit builder, which the expander's own
 * checks should leave none of, still names the user's statement. {@link #record} replays them
 * on a {@link Circuit.Builder}.
 */
final class Ops {
    /** The clbit index that stands for the extra bit of discarded measurement results. */
    static final int DISCARD = -1;

    private Ops() {
    }

    /** One recorded instruction. */
    sealed interface Step permits GateOp, PhaseOp, MeasureOp, ResetOp, DelayOp, AssignOp,
            AssignBitsOp, IfBitOp, IfOp, WhileOp {
        /** The line and column, packed by {@link #where(Syntax.Position)}. */
        long where();
    }

    static long where(Syntax.Position at) {
        return ((long) at.line() << 32) | (at.column() & 0xffffffffL);
    }

    static Syntax.Position position(long where) {
        return new Syntax.Position((int) (where >>> 32), (int) where);
    }

    /**
     * A catalogue gate with added controls.
     *
     * @param angles the angles, or null when {@code dynamic} holds them
     * @param dynamic angles known only during the shot, or null
     */
    record GateOp(Gate gate, double[] angles, Expression[] dynamic, int[] controls,
            int[] targets, long where) implements Step {
    }

    /** The global phase {@code e^{iγ} I}, applied on qubit 0. */
    record PhaseOp(double gamma, long where) implements Step {
    }

    /** A measurement; {@code clbit} may be {@link #DISCARD}. */
    record MeasureOp(int qubit, int clbit, long where) implements Step {
    }

    /** A reset. */
    record ResetOp(int qubit, long where) implements Step {
    }

    /**
     * A delay in seconds.
     *
     * @param qubits the qubits, or null for every qubit of the circuit
     */
    record DelayOp(double seconds, int[] qubits, long where) implements Step {
    }

    /** An assignment to a variable, by its circuit name. */
    record AssignOp(String variable, Expression value, long where) implements Step {
    }

    /** An assignment to classical bits. */
    record AssignBitsOp(int[] clbits, Expression value, long where) implements Step {
    }

    /** A block run when one bit has a value. */
    record IfBitOp(int clbit, int value, List<Step> body, long where) implements Step {
    }

    /** A choice between two blocks on a condition. */
    record IfOp(Expression condition, List<Step> then, List<Step> otherwise, long where)
            implements Step {
    }

    /** A bounded loop. */
    record WhileOp(Expression condition, int bound, List<Step> body, long where) implements Step {
    }

    /** The operator {@code e^{iγ} I} on one qubit (the reader's form of {@code gphase(γ)}). */
    static Operator globalPhase(double gamma) {
        Complex z = Complex.ofCis(gamma);
        return Operator.of(new Complex[][] {{z, Complex.ZERO}, {Complex.ZERO, z}});
    }

    /**
     * Records instructions on a builder, emptying the list (each step is recorded once).
     *
     * @param discard the clbit that receives discarded measurement results
     * @throws CircuitFormatException if the builder refuses one, at its statement
     */
    static void record(List<Step> ops, Circuit.Builder b, int discard) {
        for (int i = 0; i < ops.size(); i++) {
            Step op = ops.get(i);
            // Each step is recorded once: let it go, so that the steps and the circuit are not
            // both held whole (a million-gate file needs half the heap then).
            ops.set(i, null);
            try {
                recordOne(op, b, discard);
            } catch (CircuitFormatException e) {
                throw e;
            } catch (IllegalArgumentException | IndexOutOfBoundsException
                    | IllegalStateException e) {
                Syntax.Position at = position(op.where());
                throw new CircuitFormatException(at.line(), at.column(), e.getMessage(), e);
            }
        }
    }

    private static void recordOne(Step op, Circuit.Builder b, int discard) {
        if (op instanceof GateOp g) {
            if (g.dynamic() != null) {
                b.controlled(g.gate(), g.dynamic(), g.controls(), g.targets());
            } else {
                b.controlled(g.gate(), g.angles(), g.controls(), g.targets());
            }
        } else if (op instanceof PhaseOp p) {
            b.apply(globalPhase(p.gamma()), 0);
        } else if (op instanceof MeasureOp m) {
            b.measure(m.qubit(), m.clbit() == DISCARD ? discard : m.clbit());
        } else if (op instanceof ResetOp r) {
            b.reset(r.qubit());
        } else if (op instanceof DelayOp d) {
            if (d.qubits() == null) {
                b.delay(d.seconds());
            } else {
                b.delay(d.seconds(), d.qubits());
            }
        } else if (op instanceof AssignOp a) {
            b.assign(a.variable(), a.value());
        } else if (op instanceof AssignBitsOp a) {
            b.assignClbits(a.clbits(), a.value());
        } else if (op instanceof IfBitOp i) {
            b.ifBit(i.clbit(), i.value(), inner -> record(i.body(), inner, discard));
        } else if (op instanceof IfOp i) {
            b.ifThenElse(i.condition(), inner -> record(i.then(), inner, discard),
                    inner -> record(i.otherwise(), inner, discard));
        } else {
            WhileOp w = (WhileOp) op;
            b.whileLoop(w.condition(), w.bound(), inner -> record(w.body(), inner, discard));
        }
    }
}
