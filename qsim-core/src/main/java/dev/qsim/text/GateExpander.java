package dev.qsim.text;

import java.util.Arrays;
import java.util.List;

import dev.qsim.Circuit;
import dev.qsim.Expression;
import dev.qsim.Expression.Op;
import dev.qsim.Gate;
import dev.qsim.text.Syntax.Barrier;
import dev.qsim.text.Syntax.Expr;
import dev.qsim.text.Syntax.GateCall;
import dev.qsim.text.Syntax.GateDefinition;
import dev.qsim.text.Syntax.Literal;
import dev.qsim.text.Syntax.Modifier;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.Statement;

/**
 * Expands gate calls: modifiers, broadcasting over registers, catalogue gates, {@code gphase},
 * and gates defined by a body (the program's and those of {@code stdgates.inc} defined through
 * others). The modifiers of OpenQASM 3 (Cross et al. 2022, §"Quantum gate modifiers", from
 * memory) combine into one power and a list of controls:
 * <ul>
 *   <li>{@code inv @} negates the power and {@code pow(k) @} multiplies it by k (the two
 *       commute with control, and with each other for the powers read here); a negative power
 *       is the inverse's power;</li>
 *   <li>{@code ctrl(n) @} and {@code negctrl(n) @} add n controls, in the order written, before
 *       the gate's own qubits; a negative control is a control between two X gates (Barenco et
 *       al. 1995, Phys. Rev. A 52, 3457, §3).</li>
 * </ul>
 * A power that is a whole number repeats the gate (its inverse when negative), or multiplies
 * the angle of a gate with an angle form ({@code rx(θ)^k = rx(kθ)}); any other power is read
 * only for those gates, as the principal power, when the angle lies where {@code g(kθ)} is that
 * power ({@link QasmGates#principalRange}). A defined gate's body is expanded with its
 * parameters bound, each call in it taking the outer controls before its own and, for a
 * negative power, the body in reverse with each call inverted. {@code gphase(γ)} is
 * {@code e^{iγ}I} on qubit 0; with controls it is {@code phase(γ)} on the last control,
 * controlled by the others.
 */
final class GateExpander {
    /** A called gate: a catalogue entry or built-in, or a gate defined by a body. */
    private record Target(String name, QasmGates.Entry entry, GateDefinition definition,
            boolean standard) {
        int parameters() {
            return entry != null ? entry.parameters() : definition.parameters().size();
        }

        int qubits() {
            return entry != null ? entry.qubits() : definition.qubits().size();
        }
    }

    /**
     * The modifiers of a call combined.
     *
     * @param power the power
     * @param positive one entry per added control, true for {@code ctrl}, false for
     *     {@code negctrl}, in the order written
     */
    private record Modifiers(double power, boolean[] positive) {
    }

    private static final boolean[] NO_CONTROLS = new boolean[0];
    private static final int[] NONE = new int[0];

    private final Expander ex;
    private final Scope scope;
    private final Evaluator eval;
    private final Budget budget;

    GateExpander(Expander ex, Scope scope, Evaluator eval, Budget budget) {
        this.ex = ex;
        this.scope = scope;
        this.eval = eval;
        this.budget = budget;
    }

    private Target target(String name, Position at, boolean standard) {
        QasmGates.Entry e = standard ? QasmGates.find(name) : scope.knownGate(name);
        if (e != null) {
            return e.definition() != null ? new Target(name, null, e.definition(), true)
                    : new Target(name, e, null, false);
        }
        GateDefinition d = standard ? null : scope.gate(name);
        if (d != null) {
            return new Target(name, null, d, false);
        }
        String hint = QasmGates.find(name) != null ? "; standard gates need include"
                + " \"stdgates.inc\"" : scope.subroutine(name) != null ? "; '" + name
                + "' is a subroutine, called with its arguments in parentheses and no"
                + " modifiers" : "";
        throw at.error("unknown gate '" + Lexer.clip(name) + "'" + hint);
    }

    /**
     * Checks a gate definition's body when the definition is read: every call names a gate
     * known by then (so no gate calls itself) with the right counts.
     */
    void checkDefinition(GateDefinition d) {
        for (Statement s : d.body()) {
            budget.spend(1, d.at());
            if (!(s instanceof GateCall c)) {
                continue;
            }
            if (c.name().equals(d.name())) {
                throw c.nameAt().error("gate '" + Lexer.clip(d.name()) + "' calls itself; a"
                        + " gate may call only gates defined before it");
            }
            Target t = target(c.name(), c.nameAt(), false);
            int controls = 0;
            boolean known = true;
            for (Modifier m : c.modifiers()) {
                if (m.kind() == Syntax.ModifierKind.CONTROL
                        || m.kind() == Syntax.ModifierKind.NEGATIVE_CONTROL) {
                    if (m.argument() == null) {
                        controls++;
                    } else if (m.argument() instanceof Literal l
                            && l.type() == Expression.Type.INT) {
                        controls += (int) Math.min(l.integer(), Circuit.MAX_QUBITS);
                    } else {
                        known = false;
                    }
                }
            }
            requireCounts(t, c, c.arguments().size(), known ? controls : -1);
        }
    }

    private static void requireCounts(Target t, GateCall c, int arguments, int controls) {
        if (arguments != t.parameters()) {
            throw c.nameAt().error("gate '" + Lexer.clip(t.name()) + "' takes "
                    + t.parameters() + " parameter(s) but " + arguments + " were given");
        }
        if (controls >= 0 && c.operands().size() != controls + t.qubits()) {
            throw c.nameAt().error((controls > 0 ? "with " + controls + " control(s) " : "")
                    + "gate '" + Lexer.clip(t.name()) + "' takes " + (controls + t.qubits())
                    + " qubit(s) but " + c.operands().size() + " were given");
        }
    }

    private Modifiers modifiers(List<Modifier> list) {
        if (list.isEmpty()) {
            return new Modifiers(1, NO_CONTROLS);
        }
        double power = 1;
        int count = 0;
        boolean[] positive = new boolean[4];
        for (Modifier m : list) {
            switch (m.kind()) {
                case INVERSE:
                    power = -power;
                    break;
                case POWER: {
                    Value v = eval.value(m.argument());
                    if (!v.isConstant() || !Double.isFinite(v.asDouble())) {
                        throw m.at().error("the power of pow(k) @ must be a finite number known"
                                + " when the file is read, but was " + v.show());
                    }
                    power *= v.asDouble();
                    break;
                }
                default: {
                    long n = m.argument() == null ? 1
                            : eval.constantInteger(m.argument(), "control count");
                    if (n < 1 || n > Circuit.MAX_QUBITS - count) {
                        throw m.at().error("the control count must be from 1 to "
                                + Circuit.MAX_QUBITS + " but was " + n);
                    }
                    boolean sign = m.kind() == Syntax.ModifierKind.CONTROL;
                    if (count + n > positive.length) {
                        positive = Arrays.copyOf(positive, (int) Math.max(count + n,
                                2L * positive.length));
                    }
                    Arrays.fill(positive, count, count + (int) n, sign);
                    count += (int) n;
                }
            }
        }
        return new Modifiers(power, Arrays.copyOf(positive, count));
    }

    /** Expands a gate call statement, broadcasting whole registers over their elements. */
    void call(GateCall c) {
        Target t = target(c.name(), c.nameAt(), false);
        requireCounts(t, c, c.arguments().size(), -1);
        Modifiers m = modifiers(c.modifiers());
        Value[] args = arguments(c.arguments());
        List<Expr> operands = c.operands();
        int want = m.positive().length + t.qubits();
        if (operands.size() != want) {
            throw c.nameAt().error((m.positive().length > 0 ? "with " + m.positive().length
                    + " control(s) " : "") + "gate '" + Lexer.clip(t.name()) + "' takes " + want
                    + " qubit(s) but " + operands.size() + " were given");
        }
        int[][] lists = new int[operands.size()][];
        boolean[] single = new boolean[operands.size()];
        int n = -1;
        for (int i = 0; i < lists.length; i++) {
            Evaluator.Resolved r = eval.qubits(operands.get(i));
            lists[i] = r.indices();
            single[i] = r.single();
            if (!r.single()) {
                if (n >= 0 && r.indices().length != n) {
                    throw operands.get(i).at().error("registers of one call must have equal"
                            + " sizes, but this one has " + r.indices().length + " qubits and an"
                            + " earlier one " + n);
                }
                n = r.indices().length;
            }
        }
        int reps = Math.max(n, 1);
        for (int r = 0; r < reps; r++) {
            budget.spend(1, c.at());
            int[] q = new int[lists.length];
            for (int i = 0; i < q.length; i++) {
                q[i] = single[i] ? lists[i][0] : lists[i][r];
            }
            apply(t, args, m.power(), m.positive(), q, c.at());
        }
    }

    private Value[] arguments(List<Expr> list) {
        Value[] out = new Value[list.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = eval.value(list.get(i));
        }
        return out;
    }

    /** Applies one instance of a gate: its added controls first, then its own qubits. */
    private void apply(Target t, Value[] args, double power, boolean[] positive, int[] q,
            Position at) {
        requireDistinct(q, t.name(), at);
        int nc = positive.length;
        for (int i = 0; i < nc; i++) {
            if (!positive[i]) {
                ex.emitGate(Gate.X, new Value[0], NONE, new int[] {q[i]});
            }
        }
        int[] controls = nc == 0 ? NONE : Arrays.copyOf(q, nc);
        int[] targets = Arrays.copyOfRange(q, nc, q.length);
        if (t.entry() == null) {
            body(t, args, power, controls, targets, at);
        } else if (t.entry().globalPhase()) {
            globalPhase(args[0], power, controls, at);
        } else {
            catalogue(t.entry().gate(), t.name(), args, power, controls, targets, at);
        }
        for (int i = nc - 1; i >= 0; i--) {
            if (!positive[i]) {
                ex.emitGate(Gate.X, new Value[0], NONE, new int[] {q[i]});
            }
        }
    }

    private static void requireDistinct(int[] q, String name, Position at) {
        int repeated = -1;
        if (q.length <= 16) {
            for (int i = 0; i < q.length && repeated < 0; i++) {
                for (int j = 0; j < i; j++) {
                    if (q[i] == q[j]) {
                        repeated = q[i];
                        break;
                    }
                }
            }
        } else {
            java.util.BitSet seen = new java.util.BitSet();
            for (int x : q) {
                if (seen.get(x)) {
                    repeated = x;
                    break;
                }
                seen.set(x);
            }
        }
        if (repeated >= 0) {
            throw at.error("qubit " + repeated + " appears twice in the qubits of "
                    + Lexer.clip(name) + " " + Lexer.clip(Arrays.toString(q))
                    + "; each qubit may appear once");
        }
    }

    private static boolean whole(double p) {
        return p == Math.rint(p) && Math.abs(p) < 0x1p53;
    }

    private void catalogue(Gate g, String name, Value[] args, double power, int[] controls,
            int[] targets, Position at) {
        if (power == 0) {
            return;
        }
        if (whole(power)) {
            long n = (long) Math.abs(power);
            Gate use = power < 0 ? g.inverse() : g;
            Value[] a = power < 0 ? inverseAngles(g, args, name) : args;
            if (n > 1 && QasmGates.hasAnglePower(g)) {
                a = new Value[] {ex.apply(Op.MUL, a[0], Value.ofInt(n))};
                n = 1;
            }
            for (long i = 0; i < n; i++) {
                budget.spend(1, at);
                ex.emitGate(use, a, controls, targets);
            }
            return;
        }
        if (!QasmGates.hasAnglePower(g)) {
            throw at.error("pow(" + power + ") @ " + Lexer.clip(name) + ": a power that is not"
                    + " a whole number is supported only for the gates with an angle form (rx,"
                    + " ry, rz, p, phase, u1, crx, cry, crz, cp, cphase) and gphase");
        }
        Value theta = args[0];
        if (!theta.isConstant() || !QasmGates.principalRange(g, theta.asDouble())) {
            throw at.error("pow(" + power + ") @ " + Lexer.clip(name) + "(" + theta.show()
                    + "): a power that is not a whole number is read as the principal power,"
                    + " which is " + Lexer.clip(name) + "(k·θ) only for angles known when the"
                    + " file is read with " + (g == Gate.PHASE || g == Gate.CPHASE
                    ? "-π < θ ≤ π" : "|θ| < 2π"));
        }
        ex.emitGate(g, new Value[] {Value.ofReal(theta.asDouble() * power)}, controls, targets);
    }

    /** The angles of a gate's inverse ({@link Gate#inverseAngles(double...)}). */
    private Value[] inverseAngles(Gate g, Value[] a, String name) {
        boolean constant = true;
        for (Value v : a) {
            constant &= v.isConstant() && Double.isFinite(v.asDouble());
        }
        Value[] out = new Value[a.length];
        if (constant) {
            double[] d = new double[a.length];
            for (int i = 0; i < d.length; i++) {
                d[i] = a[i].asDouble();
            }
            double[] inv = g.inverseAngles(d);
            for (int i = 0; i < d.length; i++) {
                out[i] = Value.ofReal(inv[i]);
            }
            return out;
        }
        for (int i = 0; i < a.length; i++) {
            out[i] = ex.apply(Op.NEG, a[i]);
        }
        if (g == Gate.U) {
            Value phi = out[1];
            out[1] = out[2];
            out[2] = phi;
        }
        return out;
    }

    private void globalPhase(Value gamma, double power, int[] controls, Position at) {
        if (power == 0) {
            return;
        }
        Value g;
        if (power == 1) {
            g = gamma;
        } else if (power == -1) {
            g = ex.apply(Op.NEG, gamma);
        } else if (whole(power)) {
            g = ex.apply(Op.MUL, gamma, Value.ofInt((long) power));
        } else {
            if (!gamma.isConstant() || !(gamma.asDouble() > -Math.PI
                    && gamma.asDouble() <= Math.PI)) {
                throw at.error("pow(" + power + ") @ gphase(" + gamma.show() + "): a power"
                        + " that is not a whole number is read as the principal power, which"
                        + " is gphase(k·γ) only for angles known when the file is read with"
                        + " -π < γ ≤ π");
            }
            g = Value.ofReal(gamma.asDouble() * power);
        }
        if (controls.length > 0) {
            ex.emitGate(Gate.PHASE, new Value[] {g}, Arrays.copyOf(controls, controls.length - 1),
                    new int[] {controls[controls.length - 1]});
            return;
        }
        if (g.isConstant()) {
            ex.emitPhase(g);
            return;
        }
        // e^{iγ} I = p(γ) X p(γ) X: diag(1, e^{iγ}) diag(e^{iγ}, 1), exact.
        int[] zero = {0};
        ex.emitGate(Gate.PHASE, new Value[] {g}, NONE, zero);
        ex.emitGate(Gate.X, new Value[0], NONE, zero);
        ex.emitGate(Gate.PHASE, new Value[] {g}, NONE, zero);
        ex.emitGate(Gate.X, new Value[0], NONE, zero);
    }

    /** Expands a gate defined by a body, with its parameters and qubits bound. */
    private void body(Target t, Value[] args, double power, int[] controls, int[] targets,
            Position at) {
        GateDefinition d = t.definition();
        budget.spend(1, at);
        if (!whole(power)) {
            throw at.error("pow(" + power + ") @ " + Lexer.clip(t.name()) + ": a power that is"
                    + " not a whole number is unsupported for a gate defined by a body");
        }
        long n = (long) Math.abs(power);
        boolean inverse = power < 0;
        String owner = t.standard() ? "gate '" + t.name() + "' of stdgates.inc"
                : "gate '" + Lexer.clip(t.name()) + "'";
        Position saved = ex.at();
        scope.open(true, owner, at);
        try {
            for (int i = 0; i < args.length; i++) {
                // Gate parameters are angles, not integers: t / 2 in a body divides a float.
                Value angle;
                try {
                    angle = args[i].convert(Syntax.Kind.FLOAT, 64);
                } catch (IllegalArgumentException e) {
                    throw at.error(e.getMessage());
                }
                scope.declare(d.parameters().get(i).name(), new Scope.Constant(angle,
                        "the parameter"), d.parameters().get(i).at());
            }
            for (int i = 0; i < targets.length; i++) {
                scope.declare(d.qubits().get(i).name(), new Scope.Qubits(new int[] {targets[i]},
                        true), d.qubits().get(i).at());
            }
            List<Statement> body = d.body();
            for (long rep = 0; rep < n; rep++) {
                budget.spend(1, at);
                for (int k = 0; k < body.size(); k++) {
                    Statement s = body.get(inverse ? body.size() - 1 - k : k);
                    ex.setAt(s.at());
                    budget.spend(1, at);
                    if (s instanceof Barrier b) {
                        for (Expr o : b.operands()) {
                            eval.qubits(o);
                        }
                        continue;
                    }
                    bodyCall((GateCall) s, inverse, controls, t.standard());
                }
            }
        } catch (CircuitFormatException e) {
            throw ex.inside(e, at, owner, d.at());
        } finally {
            scope.close();
            ex.setAt(saved);
        }
    }

    private void bodyCall(GateCall c, boolean inverse, int[] outer, boolean standard) {
        Target t = target(c.name(), c.nameAt(), standard);
        Modifiers m = modifiers(c.modifiers());
        requireCounts(t, c, c.arguments().size(), m.positive().length);
        Value[] args = arguments(c.arguments());
        int[] q = new int[outer.length + c.operands().size()];
        System.arraycopy(outer, 0, q, 0, outer.length);
        for (int i = 0; i < c.operands().size(); i++) {
            q[outer.length + i] = eval.qubits(c.operands().get(i)).indices()[0];
        }
        boolean[] positive = new boolean[outer.length + m.positive().length];
        Arrays.fill(positive, 0, outer.length, true);
        System.arraycopy(m.positive(), 0, positive, outer.length, m.positive().length);
        apply(t, args, inverse ? -m.power() : m.power(), positive, q, c.at());
    }
}
