package dev.qsim.text;

import java.util.ArrayDeque;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

import dev.qsim.text.Syntax.Call;
import dev.qsim.text.Syntax.Expr;
import dev.qsim.text.Syntax.GateCall;
import dev.qsim.text.Syntax.Measure;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.Return;
import dev.qsim.text.Syntax.SubroutineDefinition;

/**
 * Expands calls of {@code def} subroutines for the {@link Expander} (Cross et al. 2022,
 * §"Subroutines", from memory): the arguments are evaluated where the call is (qubits and bits
 * by reference, classical values converted to their declared types), the body runs in a frame
 * that sees only its arguments and the global constants, and {@code return} gives the call's
 * value ({@code return measure q;} into bits of its own). Calls nest at most
 * {@link #MAX_CALLS} deep and never recursively; {@code return} and a loop's {@code break} or
 * {@code continue} inside the body apply only where their flow is known when read.
 */
final class Subroutines {
    /** The deepest nesting of subroutine calls. */
    static final int MAX_CALLS = 64;

    /** A subroutine being expanded. */
    private static final class Frame {
        final SubroutineDefinition definition;
        final int dynamic;
        Value returned;

        Frame(SubroutineDefinition definition, int dynamic) {
            this.definition = definition;
            this.dynamic = dynamic;
        }
    }

    private final Expander ex;
    private final Scope scope;
    private final Evaluator eval;
    private final Budget budget;
    private final Declarations declarations;
    private final ArrayDeque<Frame> calls = new ArrayDeque<>();
    private final Set<String> active = new HashSet<>();
    /** The number of loops open when each subroutine being expanded was called. */
    private final ArrayDeque<Integer> loopDepthAtCall = new ArrayDeque<>();

    Subroutines(Expander ex, Scope scope, Evaluator eval, Budget budget,
            Declarations declarations) {
        this.ex = ex;
        this.scope = scope;
        this.eval = eval;
        this.budget = budget;
        this.declarations = declarations;
    }

    /** Whether a subroutine is being expanded. */
    boolean active() {
        return !calls.isEmpty();
    }

    /**
     * Whether the innermost of {@code loops} open loops lies outside the subroutine being
     * expanded (so a {@code break} in the body has no loop of its own).
     */
    boolean loopOutside(int loops) {
        return !loopDepthAtCall.isEmpty() && loops <= loopDepthAtCall.peek();
    }

    /** Runs {@code return}: the subroutine's value, and the end of its body. */
    Expander.Flow giveBack(Return r) {
        Frame f = calls.peek();
        if (f == null) {
            throw ex.at().error("'return' outside a subroutine");
        }
        if (ex.dynamic() > f.dynamic) {
            throw ex.at().error("'return' inside an if on a value known only during the shot is"
                    + " unsupported");
        }
        if (r.value() == null) {
            f.returned = null;
        } else if (r.value() instanceof Measure m) {
            int[] bits = declarations.newBits(eval.qubits(m.operand()).indices().length);
            ex.measure(m.operand(), bits);
            f.returned = Value.of(Evaluator.register(bits, r.at()));
        } else {
            f.returned = eval.value(r.value());
        }
        return Expander.Flow.RETURN;
    }

    /** Expands a subroutine called as a statement. */
    void statement(GateCall c) {
        if (!c.modifiers().isEmpty()) {
            throw c.at().error("'" + Lexer.clip(c.name()) + "' is a subroutine; modifiers apply"
                    + " only to gates");
        }
        if (!c.operands().isEmpty()) {
            throw c.operands().get(0).at().error("a subroutine takes all its arguments in"
                    + " parentheses, as in " + Lexer.clip(c.name()) + "(q[0], 0.5);");
        }
        invoke(scope.subroutine(c.name()), c.arguments(), c.at(), false);
    }

    /** Expands a subroutine called in an expression and gives its value. */
    Value value(Call c) {
        return invoke(scope.subroutine(c.name()), c.arguments(), c.at(), true);
    }

    private Value invoke(SubroutineDefinition d, List<Expr> args, Position callAt,
            boolean needValue) {
        String owner = "subroutine '" + Lexer.clip(d.name()) + "'";
        if (args.size() != d.arguments().size()) {
            throw callAt.error(owner + " takes " + d.arguments().size() + " argument(s) but "
                    + args.size() + " were given");
        }
        if (needValue && d.returns() == null) {
            throw callAt.error(owner + " returns no value");
        }
        if (active.contains(d.name()) || calls.size() >= MAX_CALLS) {
            throw callAt.error(owner + " is called inside itself; recursion is unsupported (a"
                    + " circuit is expanded when it is read)");
        }
        budget.spend(1, ex.at());
        Scope.Symbol[] bound = new Scope.Symbol[args.size()];
        Set<Integer> passedQubits = new HashSet<>();
        for (int i = 0; i < bound.length; i++) {
            Syntax.Argument a = d.arguments().get(i);
            Expr e = args.get(i);
            Syntax.Kind kind = a.type().kind();
            if (kind == Syntax.Kind.QUBIT || kind == Syntax.Kind.BIT) {
                boolean quantum = kind == Syntax.Kind.QUBIT;
                Evaluator.Resolved r = quantum ? eval.qubits(e) : eval.bits(e);
                int want = a.type().width() == null ? 1 : declarations.size(a.type().width(),
                        "qubit");
                if (r.indices().length != want) {
                    throw e.at().error("argument '" + Lexer.clip(a.name().name()) + "' of "
                            + owner + " takes " + want + (quantum ? " qubit(s)" : " bit(s)")
                            + " but " + r.indices().length + " were given");
                }
                if (quantum) {
                    for (int q : r.indices()) {
                        if (!passedQubits.add(q)) {
                            throw e.at().error("qubit " + q + " is passed to " + owner
                                    + " twice");
                        }
                    }
                    bound[i] = new Scope.Qubits(r.indices(), a.type().width() == null);
                } else {
                    bound[i] = new Scope.Bits(r.indices(), a.type().width() == null, true);
                }
            } else {
                Value v = ex.convert(eval.value(e), kind, ex.width(a.type()), e.at());
                bound[i] = new Scope.Constant(v, "an argument of the subroutine");
            }
        }
        Frame frame = new Frame(d, ex.dynamic());
        Position saved = ex.at();
        scope.open(true, owner, ex.at());
        calls.push(frame);
        active.add(d.name());
        loopDepthAtCall.push(ex.loops());
        try {
            for (int i = 0; i < bound.length; i++) {
                Syntax.Declared name = d.arguments().get(i).name();
                scope.declare(name.name(), bound[i], name.at());
            }
            ex.run(d.body());
            if (d.returns() != null && frame.returned == null) {
                throw d.at().error(owner + " ended without returning a value");
            }
            if (d.returns() == null && frame.returned != null) {
                throw d.at().error(owner + " returns a value but declares no return type");
            }
            if (frame.returned == null) {
                return null;
            }
            if (d.returns().kind() == Syntax.Kind.BIT && !frame.returned.isConstant()) {
                return frame.returned;
            }
            return ex.convert(frame.returned, d.returns().kind(), ex.width(d.returns()),
                    d.returns().at());
        } catch (CircuitFormatException e) {
            throw ex.inside(e, callAt, owner, d.at());
        } finally {
            loopDepthAtCall.pop();
            active.remove(d.name());
            calls.pop();
            scope.close();
            ex.setAt(saved);
        }
    }
}
