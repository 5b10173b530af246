package dev.qsim.text;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

import org.apache.commons.numbers.complex.Complex;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Operator;
import dev.qsim.text.Syntax.Barrier;
import dev.qsim.text.Syntax.Binary;
import dev.qsim.text.Syntax.Constant;
import dev.qsim.text.Syntax.Declaration;
import dev.qsim.text.Syntax.Expression;
import dev.qsim.text.Syntax.FunctionCall;
import dev.qsim.text.Syntax.GateCall;
import dev.qsim.text.Syntax.GateDefinition;
import dev.qsim.text.Syntax.If;
import dev.qsim.text.Syntax.Include;
import dev.qsim.text.Syntax.Measure;
import dev.qsim.text.Syntax.Negation;
import dev.qsim.text.Syntax.Operand;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.Program;
import dev.qsim.text.Syntax.Reset;
import dev.qsim.text.Syntax.Statement;
import dev.qsim.text.Syntax.Variable;

/**
 * Turns the statements of a {@link Syntax} tree into circuit instructions. The parser hands it
 * each statement as soon as the statement ends ({@link #ended(Statement)}): declarations go into
 * the {@link Scope}; gate calls are resolved to qubit indices (a whole register broadcasts the
 * call over its indices), their parameters evaluated, and user gates expanded with their
 * parameters bound, each instruction counted against {@link QasmReader#MAX_INSTRUCTIONS}.
 *
 * <p>Expanding each statement as it ends, rather than the finished tree, keeps the reader's
 * problems in text order: a call on an unknown register is reported before a syntax error
 * further on. The instructions are held as pending operations until the program ends, since
 * the circuit's size is known only then; {@link #build(Program)} records them on a
 * {@link Circuit.Builder}.
 * Every problem the builder or the catalogue finds becomes a {@link CircuitFormatException} at
 * the position of the call it came from.
 */
final class Expander {
    /** Records one instruction (or block) once the circuit's size is known. */
    @FunctionalInterface
    interface Op {
        void apply(Circuit.Builder b, int qubits, int clbits);
    }

    private final Scope scope;
    /**
     * The pending instructions of each ended statement not yet gathered into an enclosing
     * block, in text order. An {@code if} ends after the statements of its block, so it
     * gathers the last ones; at the end only the top-level statements' remain.
     */
    private final List<List<Op>> pending = new ArrayList<>();
    private long emitted;

    /**
     * Creates an expander for one read.
     *
     * @param scope where declarations go; the parser looks names up in it
     */
    Expander(Scope scope) {
        this.scope = scope;
    }

    /** Expands a statement that has just ended. */
    void ended(Statement s) {
        List<Op> ops = new ArrayList<>();
        if (s instanceof Include) {
            scope.include();
        } else if (s instanceof Declaration d) {
            scope.declare(d);
        } else if (s instanceof GateDefinition d) {
            scope.define(d);
        } else if (s instanceof GateCall c) {
            topCall(c, ops);
        } else if (s instanceof Measure m) {
            measure(m, ops);
        } else if (s instanceof Reset r) {
            for (int q : scope.resolve(r.operand(), true)) {
                count(r.at());
                ops.add(at(r.at(), (b, nq, nc) -> b.reset(q)));
            }
        } else if (s instanceof If i) {
            conditional(i, ops);
        } else if (!(s instanceof Barrier)) {
            throw new IllegalStateException("no expansion for " + s);
        }
        pending.add(ops);
    }

    /**
     * Builds the circuit once the whole program has been parsed.
     *
     * @param program the program, each of whose statements this expander was handed
     * @throws CircuitFormatException if the program declares no qubit or the circuit refuses
     *     an instruction
     */
    Circuit build(Program program) {
        if (pending.size() != program.statements().size()) {
            throw new IllegalStateException("the expander was handed " + pending.size()
                    + " top-level statements but the program has "
                    + program.statements().size());
        }
        int qubits = scope.qubits();
        int clbits = scope.clbits();
        if (qubits == 0) {
            throw program.end().error("the program declares no qubit; declare one with"
                    + " 'qubit[n] q;'");
        }
        Circuit.Builder b = Circuit.builder(qubits, clbits);
        for (List<Op> ops : pending) {
            for (Op op : ops) {
                op.apply(b, qubits, clbits);
            }
        }
        return b.build();
    }

    private void count(Position t) {
        if (++emitted > QasmReader.MAX_INSTRUCTIONS) {
            throw t.error("the program expands to more than " + QasmReader.MAX_INSTRUCTIONS
                    + " instructions");
        }
    }

    private void measure(Measure m, List<Op> ops) {
        int[] q = scope.resolve(m.qubits(), true);
        int[] c = scope.resolve(m.bits(), false);
        if (q.length != c.length) {
            throw m.at().error("measure needs as many bits as qubits but got " + q.length
                    + " qubit(s) and " + c.length + " bit(s)");
        }
        for (int i = 0; i < q.length; i++) {
            int qi = q[i];
            int ci = c[i];
            count(m.at());
            ops.add(at(m.at(), (b, nq, nc) -> b.measure(qi, ci)));
        }
    }

    /** Gathers the pending instructions of an {@code if}'s block into one conditioned block. */
    private void conditional(If s, List<Op> ops) {
        List<List<Op>> parts = pending.subList(pending.size() - s.body().size(),
                pending.size());
        List<Op> block = new ArrayList<>();
        for (List<Op> part : parts) {
            block.addAll(part);
        }
        parts.clear();
        int clbit = scope.resolve(s.bit(), false)[0];
        int value = s.value();
        List<Op> body = List.copyOf(block);
        ops.add(at(s.at(), (b, nq, nc) -> b.ifBit(clbit, value, inner -> {
            for (Op op : body) {
                op.apply(inner, nq, nc);
            }
        })));
    }

    /** Expands a call outside gate definitions, broadcasting whole registers. */
    private void topCall(GateCall call, List<Op> ops) {
        List<int[]> lists = new ArrayList<>();
        int n = -1;
        for (Operand a : call.operands()) {
            int[] q = scope.resolve(a, true);
            if (a.whole()) {
                if (n >= 0 && q.length != n) {
                    throw a.at().error("registers of one call must have equal sizes, but '"
                            + a.name() + "' has " + q.length + " qubits and an earlier one "
                            + n);
                }
                n = q.length;
            }
            lists.add(q);
        }
        double[] p = evaluate(call, Map.of());
        int reps = Math.max(n, 1);
        for (int r = 0; r < reps; r++) {
            int[] q = new int[lists.size()];
            for (int i = 0; i < q.length; i++) {
                int[] l = lists.get(i);
                q[i] = l.length == 1 && !call.operands().get(i).whole() ? l[0] : l[r];
            }
            expand(call, p, q, ops, 0);
        }
    }

    /** Appends the instructions of one call with evaluated parameters and qubits. */
    private void expand(GateCall call, double[] p, int[] q, List<Op> ops, int depth) {
        Position t = call.at();
        if (depth > QasmReader.MAX_NESTING) {
            throw t.error("gate definitions nested deeper than " + QasmReader.MAX_NESTING
                    + " levels");
        }
        GateDefinition def = scope.definition(call.name());
        if (def != null) {
            boolean inverse = call.inverse();
            List<Op> inner = inverse ? new ArrayList<>() : ops;
            Map<String, Double> env = new HashMap<>();
            for (int i = 0; i < p.length; i++) {
                env.put(def.parameters().get(i), p[i]);
            }
            Map<String, Integer> qs = new HashMap<>();
            for (int i = 0; i < q.length; i++) {
                qs.put(def.qubits().get(i), q[i]);
            }
            for (GateCall c : def.body()) {
                double[] cp = evaluate(c, env);
                int[] cq = new int[c.operands().size()];
                for (int i = 0; i < cq.length; i++) {
                    cq[i] = qs.get(c.operands().get(i).name());
                }
                expand(c, cp, cq, inner, depth + 1);
            }
            if (inverse) {
                List<Op> block = List.copyOf(inner);
                ops.add(at(t, (b, nq, nc) -> b.append(replay(block, nq, nc).inverse())));
            }
            return;
        }
        count(t);
        int k = call.controls();
        boolean inverse = call.inverse();
        QasmGates.Entry known = QasmGates.find(call.name());
        if (known.globalPhase()) {
            // ctrl(k) @ gphase(γ) is phase(γ) on the last control, controlled by the rest.
            ops.add(at(t, (b, nq, nc) -> {
                double gamma = inverse ? -p[0] : p[0];
                if (k == 0) {
                    b.apply(globalPhase(gamma), 0);
                } else {
                    b.controlled(Gate.PHASE, new double[] {gamma}, Arrays.copyOf(q, k - 1),
                            q[k - 1]);
                }
            }));
            return;
        }
        Gate gate = known.gate();
        int[] controls = Arrays.copyOf(q, k);
        int[] own = Arrays.copyOfRange(q, k, q.length);
        ops.add(at(t, (b, nq, nc) -> {
            Gate use = inverse ? gate.inverse() : gate;
            double[] angles = inverse ? gate.inverseAngles(p) : p;
            b.controlled(use, angles, controls, own);
        }));
    }

    private static Circuit replay(List<Op> ops, int nq, int nc) {
        Circuit.Builder tmp = Circuit.builder(nq, nc);
        for (Op op : ops) {
            op.apply(tmp, nq, nc);
        }
        return tmp.build();
    }

    /** The operator {@code e^{iγ} I} on one qubit. */
    private static Operator globalPhase(double gamma) {
        if (!Double.isFinite(gamma)) {
            throw new IllegalArgumentException("gphase angle must be finite but was " + gamma);
        }
        Complex z = Complex.ofCis(gamma);
        return Operator.of(new Complex[][] {{z, Complex.ZERO}, {Complex.ZERO, z}});
    }

    /**
     * Wraps an instruction so that the builder's and the catalogue's refusals become the
     * reader's exception at {@code t}, the position of the call in the text.
     */
    private static Op at(Position t, Op op) {
        return (b, nq, nc) -> {
            try {
                op.apply(b, nq, nc);
            } catch (CircuitFormatException e) {
                throw e;
            } catch (IllegalArgumentException | IndexOutOfBoundsException e) {
                throw new CircuitFormatException(t.line(), t.column(), e.getMessage(), e);
            }
        };
    }

    /** The values of a call's parameters, with a definition's parameters bound by {@code env}. */
    private static double[] evaluate(GateCall call, Map<String, Double> env) {
        double[] out = new double[call.parameters().size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = evaluate(call.parameters().get(i), env);
        }
        return out;
    }

    /** The value of an expression, with the operations in the order they are written. */
    private static double evaluate(Expression e, Map<String, Double> env) {
        if (e instanceof Constant c) {
            return c.value();
        }
        if (e instanceof Variable v) {
            return env.get(v.name());
        }
        if (e instanceof Negation n) {
            return -evaluate(n.operand(), env);
        }
        if (e instanceof FunctionCall f) {
            return f.function().apply(evaluate(f.argument(), env));
        }
        Binary b = (Binary) e;
        double left = evaluate(b.left(), env);
        double right = evaluate(b.right(), env);
        return switch (b.operator()) {
            case ADD -> left + right;
            case SUBTRACT -> left - right;
            case MULTIPLY -> left * right;
            case DIVIDE -> left / right;
            case POWER -> Math.pow(left, right);
        };
    }
}
