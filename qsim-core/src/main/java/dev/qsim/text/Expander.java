package dev.qsim.text;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;

import dev.qsim.Circuit;
import dev.qsim.Expression;
import dev.qsim.Expression.Op;
import dev.qsim.Gate;
import dev.qsim.text.Ops.Step;
import dev.qsim.text.Syntax.Assignment;
import dev.qsim.text.Syntax.Barrier;
import dev.qsim.text.Syntax.Block;
import dev.qsim.text.Syntax.Call;
import dev.qsim.text.Syntax.Delay;
import dev.qsim.text.Syntax.Duration;
import dev.qsim.text.Syntax.Expr;
import dev.qsim.text.Syntax.For;
import dev.qsim.text.Syntax.GateCall;
import dev.qsim.text.Syntax.GateDefinition;
import dev.qsim.text.Syntax.If;
import dev.qsim.text.Syntax.Include;
import dev.qsim.text.Syntax.Indexed;
import dev.qsim.text.Syntax.Jump;
import dev.qsim.text.Syntax.Measure;
import dev.qsim.text.Syntax.MeasureArrow;
import dev.qsim.text.Syntax.Name;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.Reset;
import dev.qsim.text.Syntax.Return;
import dev.qsim.text.Syntax.Statement;
import dev.qsim.text.Syntax.SubroutineDefinition;
import dev.qsim.text.Syntax.While;

/**
 * Runs a program's statements as they are read and records the instructions they expand to
 * ({@link Ops}). Declarations go into the {@link Scope}; values known when the file is read
 * are computed ({@link Evaluator}), so constants, loop variables and the conditions on them
 * decide what is recorded; values known only during the shot become {@link Expression}s, and
 * blocks on them become the circuit's conditions and loops. Gate calls go to the
 * {@link GateExpander}, declarations to {@link Declarations}, subroutine calls to
 * {@link Subroutines}. Every step is paid for from the {@link Budget}; every instruction
 * counts against the settings' limit. Every problem becomes a {@link CircuitFormatException}
 * at the user's statement (for a problem inside a gate or subroutine, at the call, with the
 * definition's position in the message).
 */
final class Expander {
    /** How a statement ends. */
    enum Flow {
        /** On to the next statement. */
        NORMAL,
        /** {@code break}: out of the loop. */
        BREAK,
        /** {@code continue}: on to the next iteration. */
        CONTINUE,
        /** {@code return}: out of the subroutine. */
        RETURN
    }

    /** A loop being unrolled (or a while loop, which is not). */
    private record Loop(boolean unrolled, int dynamic) {
    }

    private final QasmReader.Settings settings;
    private final Budget budget;
    private final Scope scope = new Scope();
    private final Evaluator eval;
    private final GateExpander gates;
    private final Declarations declarations;
    private final Subroutines subroutines;
    private final ArrayDeque<Loop> loops = new ArrayDeque<>();
    private boolean discards;
    private List<Step> out = new ArrayList<>();
    private long instructions;
    /** How many blocks on values known only during the shot enclose the statement. */
    private int dynamic;
    /** The statement being expanded. */
    private Position at = new Position(1, 1);

    Expander(QasmReader.Settings settings) {
        this.settings = settings;
        this.budget = new Budget(settings.workBudget());
        this.eval = new Evaluator(this, scope, budget);
        this.gates = new GateExpander(this, scope, eval, budget);
        this.declarations = new Declarations(this, scope, eval, budget, settings);
        this.subroutines = new Subroutines(this, scope, eval, budget, declarations);
    }

    // ------------------------------------------------------------------ shared helpers

    Position at() {
        return at;
    }

    void setAt(Position p) {
        at = p;
    }

    /** A problem in a computation, reported at the statement with the operator's position. */
    CircuitFormatException problem(Position where, String message) {
        String note = where.equals(at) ? "" : " (at " + where + ")";
        return at.error(message + note);
    }

    /**
     * A problem inside a gate's or subroutine's body, reported at the call.
     *
     * @param owner "gate 'g'" or "subroutine 'f'"
     */
    CircuitFormatException inside(CircuitFormatException e, Position call, String owner,
            Position definition) {
        return new CircuitFormatException(call.line(), call.column(), e, owner, definition);
    }

    Value apply(Op op, Value a) {
        try {
            return Value.apply(op, a);
        } catch (IllegalArgumentException e) {
            throw at.error(e.getMessage());
        }
    }

    Value apply(Op op, Value a, Value b) {
        try {
            return Value.apply(op, a, b);
        } catch (IllegalArgumentException e) {
            throw at.error(e.getMessage());
        }
    }

    Expression expression(Value v, String what) {
        try {
            return v.toExpression();
        } catch (IllegalArgumentException e) {
            throw at.error(what + ": " + e.getMessage());
        }
    }

    void emit(Step op) {
        if (++instructions > settings.maxInstructions()) {
            throw at.error("the program expands to more than " + settings.maxInstructions()
                    + " instructions; if it is meant to be this large, raise the limit with"
                    + " QasmReader.Settings.withMaxInstructions(int)");
        }
        out.add(op);
    }

    /** Records a catalogue gate (angles checked finite). */
    void emitGate(Gate g, Value[] angles, int[] controls, int[] targets) {
        boolean constant = true;
        for (Value v : angles) {
            constant &= v.isConstant();
        }
        if (constant) {
            double[] a = new double[angles.length];
            for (int i = 0; i < a.length; i++) {
                a[i] = angles[i].asDouble();
                if (!Double.isFinite(a[i])) {
                    throw at.error("angle " + (i + 1) + " of " + g.id() + " is " + a[i]
                            + "; angles must be finite");
                }
            }
            emit(new Ops.GateOp(g, a, null, controls, targets, Ops.where(at)));
            return;
        }
        Expression[] e = new Expression[angles.length];
        for (int i = 0; i < e.length; i++) {
            e[i] = expression(angles[i], "angle " + (i + 1) + " of " + g.id());
        }
        emit(new Ops.GateOp(g, null, e, controls, targets, Ops.where(at)));
    }

    /** Records {@code gphase(γ)} with a constant γ, reduced to [-π, π] when outside. */
    void emitPhase(Value gamma) {
        double g = gamma.asDouble();
        if (!Double.isFinite(g)) {
            throw at.error("the angle of gphase is " + g + "; angles must be finite");
        }
        if (Math.abs(g) > Math.PI) {
            g = Math.IEEEremainder(g, 2 * Math.PI);
        }
        emit(new Ops.PhaseOp(g, Ops.where(at)));
    }

    /** The width of a declared type: the value in brackets, or the default (64, 1 for bool). */
    int width(Syntax.Type t) {
        Syntax.Kind k = t.kind();
        if (t.width() == null) {
            return k == Syntax.Kind.BOOL || k == Syntax.Kind.BIT ? 1 : 64;
        }
        long w = eval.constantInteger(t.width(), "width of the type");
        if (k == Syntax.Kind.FLOAT && w != 64) {
            throw t.width().at().error("only 64-bit floats are supported (float or float[64]),"
                    + " not float[" + w + "]");
        }
        if (k == Syntax.Kind.BOOL) {
            throw t.width().at().error("bool takes no width");
        }
        if (w < 1 || w > 64) {
            throw t.width().at().error("the width of the type must be from 1 to 64 but was "
                    + w);
        }
        return (int) w;
    }

    // ------------------------------------------------------------------ frames

    /** Opens the frame of a block (also a loop's pass, a branch). */
    private void openBlock() {
        scope.open(false, null, at);
        declarations.openBlock();
    }

    private void closeBlock() {
        scope.close();
        declarations.closeBlock();
    }

    /** Whether a subroutine is being expanded. */
    boolean inSubroutine() {
        return subroutines.active();
    }

    /** How many blocks on values known only during the shot enclose the statement. */
    int dynamic() {
        return dynamic;
    }

    /** How many loops are open. */
    int loops() {
        return loops.size();
    }

    // ------------------------------------------------------------------ statements

    /** Expands a subroutine called in an expression and gives its value. */
    Value subroutineValue(Call c) {
        return subroutines.value(c);
    }

    /** Expands a top-level statement. */
    void top(Statement s) {
        exec(s);
    }

    Flow run(List<Statement> body) {
        for (Statement s : body) {
            Flow f = exec(s);
            if (f != Flow.NORMAL) {
                return f;
            }
        }
        return Flow.NORMAL;
    }

    private Flow exec(Statement s) {
        Position saved = at;
        at = s.at();
        try {
            budget.spend(1, at);
            return statement(s);
        } finally {
            at = saved;
        }
    }

    private Flow statement(Statement s) {
        if (s instanceof GateCall c) {
            if (scope.subroutine(c.name()) != null && scope.gate(c.name()) == null) {
                subroutines.statement(c);
            } else {
                gates.call(c);
            }
        } else if (s instanceof MeasureArrow m) {
            measure(m.qubits(), m.bits() == null ? null : eval.bits(m.bits()).indices());
        } else if (s instanceof Assignment a) {
            assignment(a);
        } else if (s instanceof Reset r) {
            for (Expr o : r.operands()) {
                for (int q : eval.qubits(o).indices()) {
                    emit(new Ops.ResetOp(q, Ops.where(at)));
                }
            }
        } else if (s instanceof Barrier b) {
            for (Expr o : b.operands()) {
                eval.qubits(o);
            }
        } else if (s instanceof If i) {
            return conditional(i);
        } else if (s instanceof For f) {
            return loop(f);
        } else if (s instanceof While w) {
            whileLoop(w);
        } else if (s instanceof Jump j) {
            return jump(j);
        } else if (s instanceof Return r) {
            return subroutines.giveBack(r);
        } else if (s instanceof Block b) {
            openBlock();
            try {
                return run(b.statements());
            } finally {
                closeBlock();
            }
        } else if (s instanceof Delay d) {
            delay(d);
        } else if (s instanceof Include) {
            scope.include();
        } else if (s instanceof GateDefinition d) {
            scope.requireFreeGlobal(d.name(), d.nameAt());
            gates.checkDefinition(d);
            scope.define(d);
        } else if (s instanceof SubroutineDefinition d) {
            scope.define(d);
        } else {
            declarations.declare(s);
        }
        return Flow.NORMAL;
    }

    Scope.Symbol symbolOf(Expr e) {
        Expr x = e;
        while (x instanceof Indexed i) {
            x = i.base();
        }
        if (x instanceof Name n) {
            Scope.Symbol s = scope.find(n.name(), n.at());
            if (s == null) {
                throw n.at().error("unknown name '" + Lexer.clip(n.name()) + "'");
            }
            return s;
        }
        throw e.at().error("expected a name");
    }

    static String nameOf(Expr e) {
        Expr x = e;
        while (x instanceof Indexed i) {
            x = i.base();
        }
        return x instanceof Name n ? n.name() : "?";
    }

    void measure(Expr qubitOperand, int[] bits) {
        int[] q = eval.qubits(qubitOperand).indices();
        if (bits != null && bits.length != q.length) {
            throw at.error("measure needs as many bits as qubits but got " + q.length
                    + " qubit(s) and " + bits.length + " bit(s)");
        }
        for (int i = 0; i < q.length; i++) {
            if (bits == null) {
                discards = true;
            }
            emit(new Ops.MeasureOp(q[i], bits == null ? Ops.DISCARD : bits[i], Ops.where(at)));
        }
    }

    private void assignment(Assignment a) {
        Scope.Symbol target = symbolOf(a.target());
        if (target instanceof Scope.Bits b) {
            if (b.readOnly()) {
                throw a.target().at().error("'" + Lexer.clip(nameOf(a.target())) + "' is an"
                        + " argument of the subroutine, a value that cannot be assigned");
            }
            int[] bits = eval.bits(a.target()).indices();
            if (a.value() instanceof Measure m) {
                if (a.compound() != null) {
                    throw m.at().error("a measurement can only be assigned with '='");
                }
                measure(m.operand(), bits);
                return;
            }
            Value v = eval.value(a.value());
            if (a.compound() != null) {
                v = apply(a.compound(), Value.of(Evaluator.register(bits, a.target().at())), v);
            }
            assignBits(bits, v, a.value().at());
            return;
        }
        if (target instanceof Scope.Variable var) {
            if (a.target() instanceof Indexed) {
                throw a.target().at().error("assigning to bits of a variable is unsupported;"
                        + " assign the whole variable");
            }
            if (a.value() instanceof Measure m) {
                throw m.at().error("a measurement gives bits; measure into a bit or bit"
                        + " register");
            }
            Value v = eval.value(a.value());
            if (a.compound() != null) {
                v = apply(a.compound(), Value.of(var.value()), v);
            }
            emit(new Ops.AssignOp(var.circuitName(), expression(v, "the assigned value"),
                    Ops.where(at)));
            return;
        }
        if (target instanceof Scope.Constant c) {
            throw a.target().at().error("'" + Lexer.clip(nameOf(a.target())) + "' is "
                    + c.what() + ", which cannot be assigned");
        }
        throw a.target().at().error("'" + Lexer.clip(nameOf(a.target())) + "' names qubits,"
                + " which cannot be assigned; use gates, measure or reset");
    }

    void assignBits(int[] bits, Value v, Position valueAt) {
        if (v.isFloat()) {
            throw valueAt.error("bits take an integer or bool value, but " + v.show()
                    + " is a float");
        }
        if (bits.length > 63) {
            throw at.error("an assignment writes at most 63 bits, but the register has "
                    + bits.length);
        }
        Evaluator.requireDistinct(bits, at, "the assigned bits");
        emit(new Ops.AssignBitsOp(bits, expression(v, "the assigned value"), Ops.where(at)));
    }

    private void delay(Delay d) {
        if (!(d.duration() instanceof Duration t)) {
            throw d.duration().at().error("delay takes a duration literal such as 100ns; other"
                    + " duration expressions are unsupported");
        }
        Double perSecond = Lexer.PER_SECOND.get(t.unit());
        double seconds;
        if (perSecond != null) {
            // Divided, so that 100ns is the double nearest 1e-7 (one rounding).
            seconds = t.value() / perSecond;
        } else {
            if (Double.isNaN(settings.timeStep())) {
                throw t.at().error("the length of dt is not known; give it in seconds with"
                        + " QasmReader.Settings.withTimeStep(double), or write the delay in ns,"
                        + " us, ms or s");
            }
            seconds = t.value() * settings.timeStep();
        }
        if (!Double.isFinite(seconds)) {
            throw t.at().error("the delay " + t.value() + t.unit() + " is too long");
        }
        int[] q = null;
        if (!d.operands().isEmpty()) {
            List<int[]> lists = new ArrayList<>();
            int total = 0;
            for (Expr o : d.operands()) {
                int[] x = eval.qubits(o).indices();
                lists.add(x);
                total += x.length;
            }
            q = new int[total];
            int k = 0;
            for (int[] x : lists) {
                System.arraycopy(x, 0, q, k, x.length);
                k += x.length;
            }
            Evaluator.requireDistinct(q, at, "the qubits of the delay");
        }
        emit(new Ops.DelayOp(seconds, q, Ops.where(at)));
    }

    // ------------------------------------------------------------------ control flow

    /** A block run on a value known only during the shot: its instructions, recorded apart. */
    private List<Step> dynamicBlock(List<Statement> body) {
        List<Step> saved = out;
        out = new ArrayList<>();
        dynamic++;
        openBlock();
        try {
            run(body);
            return out;
        } finally {
            closeBlock();
            dynamic--;
            out = saved;
        }
    }

    private Flow conditional(If i) {
        if (!i.grouped() && i.otherwise() == null && i.condition() instanceof Syntax.Binary b
                && b.op() == Op.EQ && b.right() instanceof Syntax.Literal v
                && v.type() != Expression.Type.FLOAT && (v.integer() == 0 || v.integer() == 1)
                && (b.left() instanceof Name || b.left() instanceof Indexed)
                && symbolOf(b.left()) instanceof Scope.Bits) {
            int[] bit = eval.bits(b.left()).indices();
            if (bit.length == 1) {
                // if (c[0] == 1): the circuit's condition on one bit.
                List<Step> body = dynamicBlock(i.then());
                emit(new Ops.IfBitOp(bit[0], (int) v.integer(), body, Ops.where(at)));
                return Flow.NORMAL;
            }
        }
        Value c = eval.value(i.condition());
        if (c.isConstant()) {
            List<Statement> chosen = c.truth() ? i.then() : i.otherwise();
            if (chosen == null) {
                return Flow.NORMAL;
            }
            openBlock();
            try {
                return run(chosen);
            } finally {
                closeBlock();
            }
        }
        requireCondition(c, i.condition().at());
        List<Step> then = dynamicBlock(i.then());
        List<Step> otherwise = i.otherwise() == null ? List.of() : dynamicBlock(i.otherwise());
        emit(new Ops.IfOp(c.toExpression(), then, otherwise, Ops.where(at)));
        return Flow.NORMAL;
    }

    private static void requireCondition(Value c, Position where) {
        if (c.isFloat()) {
            throw where.error("a float is not a condition: " + c.show() + "; compare it, as in"
                    + " x > 0.5");
        }
    }

    private Flow loop(For f) {
        Syntax.Kind kind = f.type() == null ? Syntax.Kind.INT : f.type().kind();
        int width = f.type() == null ? 64 : width(f.type());
        loops.push(new Loop(true, dynamic));
        try {
            if (f.over().set() != null) {
                for (Expr e : f.over().set().values()) {
                    Value v = eval.value(e);
                    if (!v.isConstant()) {
                        throw e.at().error("the values of a for loop must be known when the file"
                                + " is read, but " + v.show() + " is computed during the shot;"
                                + " use a while loop");
                    }
                    Flow flow = iteration(f, convert(v, kind, width, e.at()));
                    if (flow == Flow.BREAK) {
                        break;
                    }
                    if (flow == Flow.RETURN) {
                        return flow;
                    }
                }
                return Flow.NORMAL;
            }
            Syntax.Range r = f.over().range();
            if (r.start() == null || r.end() == null) {
                throw r.at().error("the range of a for loop needs its start and its end, as in"
                        + " [0:3]");
            }
            long start = rangeBound(r.start());
            long end = rangeBound(r.end());
            long step = r.step() == null ? 1 : rangeBound(r.step());
            if (step == 0) {
                throw r.at().error("the step of a range must not be 0");
            }
            for (long i = start; step > 0 ? i <= end : i >= end; ) {
                Flow flow = iteration(f, convert(Value.ofInt(i), kind, width, r.at()));
                if (flow == Flow.BREAK) {
                    break;
                }
                if (flow == Flow.RETURN) {
                    return flow;
                }
                long next = i + step;
                if ((step > 0) != (next > i)) {
                    break; // the next value would overflow
                }
                i = next;
            }
            return Flow.NORMAL;
        } finally {
            loops.pop();
        }
    }

    Value convert(Value v, Syntax.Kind kind, int width, Position where) {
        try {
            return v.convert(kind, width);
        } catch (IllegalArgumentException e) {
            throw where.error(e.getMessage());
        }
    }

    private long rangeBound(Expr e) {
        try {
            return eval.constantInteger(e, "bound of the loop's range");
        } catch (CircuitFormatException x) {
            if (x.problem().contains("computed during the shot")) {
                throw e.at().error(x.problem() + " (a for loop's range is made of numbers,"
                        + " const, input and loop variables); use a while loop for a bound known"
                        + " only during the shot");
            }
            throw x;
        }
    }

    private Flow iteration(For f, Value v) {
        budget.spend(1, at);
        openBlock();
        try {
            scope.declare(f.name(), new Scope.Constant(v, "the loop variable"), f.nameAt());
            Flow flow = run(f.body());
            return flow == Flow.CONTINUE ? Flow.NORMAL : flow;
        } finally {
            closeBlock();
        }
    }

    private void whileLoop(While w) {
        int before = out.size();
        Value c = eval.value(w.condition());
        if (out.size() != before) {
            throw w.condition().at().error("the condition of a while loop cannot call a"
                    + " subroutine that records instructions (it would run once, not before"
                    + " each iteration)");
        }
        if (c.isConstant() && !c.truth()) {
            return;
        }
        requireCondition(c, w.condition().at());
        loops.push(new Loop(false, dynamic));
        List<Step> body;
        try {
            body = dynamicBlock(w.body());
        } finally {
            loops.pop();
        }
        int bound = w.bound() > 0 ? w.bound() : settings.loopBound();
        emit(new Ops.WhileOp(c.toExpression(), bound, body, Ops.where(at)));
    }

    private Flow jump(Jump j) {
        String word = j.breaks() ? "break" : "continue";
        Loop l = loops.peek();
        if (l == null || subroutines.loopOutside(loops.size())) {
            throw at.error("'" + word + "' outside a loop");
        }
        if (!l.unrolled()) {
            throw at.error("'" + word + "' in a while loop is unsupported: the circuit's loops"
                    + " end only when their condition fails or their bound is reached");
        }
        if (dynamic > l.dynamic()) {
            throw at.error("'" + word + "' inside an if on a value known only during the shot"
                    + " is unsupported; only a for loop's own flow (known when the file is"
                    + " read) can be cut short");
        }
        return j.breaks() ? Flow.BREAK : Flow.CONTINUE;
    }


    // ------------------------------------------------------------------ the end

    /**
     * Builds the circuit once the whole program has been read.
     *
     * @param end where the text ends
     * @throws CircuitFormatException if the program declares no qubit, an input given in the
     *     settings is not declared, or the circuit refuses an instruction
     */
    Circuit finish(Position end) {
        at = end;
        List<String> unused = new ArrayList<>(settings.inputs().keySet());
        unused.removeAll(declarations.inputsUsed());
        if (!unused.isEmpty()) {
            Collections.sort(unused);
            throw end.error("the settings give a value for input '" + Lexer.clip(unused.get(0))
                    + "' but the program declares no such input");
        }
        int qubits = declarations.qubits();
        int clbits = declarations.clbits();
        if (qubits == 0) {
            throw end.error("the program declares no qubit; declare one with 'qubit[n] q;'");
        }
        int nc = clbits + (discards ? 1 : 0);
        if (nc > Circuit.MAX_QUBITS) {
            throw end.error("the program needs " + nc + " classical bits but at most "
                    + Circuit.MAX_QUBITS + " are allowed");
        }
        Circuit.Builder b = Circuit.builder(qubits, nc);
        for (Circuit.Variable v : declarations.variables()) {
            b.declare(v.name(), v.type(), v.width(), null);
        }
        Ops.record(out, b, clbits);
        return b.build();
    }
}
