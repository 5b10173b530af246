package dev.qsim;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.function.Function;

/**
 * The Clifford decompositions of the catalogue ({@link Gate#cliffordSteps(double...)}): each
 * gate as a sequence of the tableau's primitive gates, equal to it up to a global phase
 * (Aaronson and Gottesman 2004, Phys. Rev. A 70, 052328; the identities are matrix products
 * checked against the dense matrices in {@code GateCatalogueTest}).
 */
final class CliffordSteps {
    static final int H = 0;
    static final int S = 1;
    static final int S_DAGGER = 2;
    static final int X = 3;
    static final int Y = 4;
    static final int Z = 5;
    static final int CNOT = 6;
    static final int CZ = 7;
    static final int SWAP = 8;

    static final Function<double[], List<Gate.Step>> NONE = a -> List.of();

    private CliffordSteps() {
    }

    private static Gate primitive(int code) {
        switch (code) {
            case H:
                return Gate.H;
            case S:
                return Gate.S;
            case S_DAGGER:
                return Gate.S_DAGGER;
            case X:
                return Gate.X;
            case Y:
                return Gate.Y;
            case Z:
                return Gate.Z;
            case CNOT:
                return Gate.CNOT;
            case CZ:
                return Gate.CZ;
            default:
                return Gate.SWAP;
        }
    }

    static Function<double[], List<Gate.Step>> one(int code) {
        return fixed(code, 0);
    }

    /** Codes each followed by one position (single-qubit) or two (CNOT, CZ, SWAP). */
    static Function<double[], List<Gate.Step>> fixed(int... program) {
        return a -> decode(program);
    }

    static List<Gate.Step> decode(int... program) {
        List<Gate.Step> out = new ArrayList<>();
        int i = 0;
        while (i < program.length) {
            int code = program[i++];
            if (code >= CNOT) {
                out.add(new Gate.Step(primitive(code), program[i], program[i + 1]));
                i += 2;
            } else {
                out.add(new Gate.Step(primitive(code), program[i++], -1));
            }
        }
        return Collections.unmodifiableList(out);
    }

    /** The multiple of {@code unit} that {@code angle} is (mod 4), or -1. */
    static int quarter(double angle, double unit) {
        double r = angle / unit;
        if (!(Math.abs(r) < 1e15)) {
            return -1;
        }
        long k = Math.round(r);
        if (Math.abs(r - k) > 1e-12 * Math.max(1, Math.abs(r))) {
            return -1;
        }
        return (int) Math.floorMod(k, 4L);
    }

    static List<Gate.Step> rz(double[] a) {
        switch (quarter(a[0], Math.PI / 2)) {
            case 0:
                return List.of();
            case 1:
                return decode(S, 0);
            case 2:
                return decode(Z, 0);
            case 3:
                return decode(S_DAGGER, 0);
            default:
                return null;
        }
    }

    static List<Gate.Step> rx(double[] a) {
        switch (quarter(a[0], Math.PI / 2)) {
            case 0:
                return List.of();
            case 1:
                return decode(H, 0, S, 0, H, 0);
            case 2:
                return decode(X, 0);
            case 3:
                return decode(H, 0, S_DAGGER, 0, H, 0);
            default:
                return null;
        }
    }

    static List<Gate.Step> ry(double[] a) {
        // ry(pi/2) = H Z, ry(pi) is Y up to phase, ry(3pi/2) = H X (matrix products, the
        // rightmost applied first).
        switch (quarter(a[0], Math.PI / 2)) {
            case 0:
                return List.of();
            case 1:
                return decode(Z, 0, H, 0);
            case 2:
                return decode(Y, 0);
            case 3:
                return decode(X, 0, H, 0);
            default:
                return null;
        }
    }

    static List<Gate.Step> u(double[] a) {
        // u(θ, φ, λ) = phase(φ) ry(θ) phase(λ) up to global phase: λ first.
        List<Gate.Step> lambda = rz(new double[] {a[2]});
        List<Gate.Step> theta = ry(new double[] {a[0]});
        List<Gate.Step> phi = rz(new double[] {a[1]});
        if (lambda == null || theta == null || phi == null) {
            return null;
        }
        List<Gate.Step> out = new ArrayList<>(lambda);
        out.addAll(theta);
        out.addAll(phi);
        return Collections.unmodifiableList(out);
    }

    static List<Gate.Step> cphase(double[] a) {
        switch (quarter(a[0], Math.PI)) {
            case 0:
            case 2:
                return List.of();
            case 1:
            case 3:
                return decode(CZ, 0, 1);
            default:
                return null;
        }
    }

    static List<Gate.Step> crx(double[] a) {
        return controlledRotation(a, CNOT, 0, 1);
    }

    static List<Gate.Step> cry(double[] a) {
        return controlledRotation(a, S_DAGGER, 1, CNOT, 0, 1, S, 1);
    }

    static List<Gate.Step> crz(double[] a) {
        return controlledRotation(a, CZ, 0, 1);
    }

    /**
     * A controlled rotation by kπ about axis P: the identity (k = 0), controlled(-iP) = S† on
     * the control times controlled-P (k = 1), controlled(-I) = Z on the control (k = 2),
     * controlled(iP) = S on the control times controlled-P (k = 3).
     */
    private static List<Gate.Step> controlledRotation(double[] a, int... controlledPauli) {
        switch (quarter(a[0], Math.PI)) {
            case 0:
                return List.of();
            case 1:
                return concat(decode(controlledPauli), decode(S_DAGGER, 0));
            case 2:
                return decode(Z, 0);
            case 3:
                return concat(decode(controlledPauli), decode(S, 0));
            default:
                return null;
        }
    }

    private static List<Gate.Step> concat(List<Gate.Step> a, List<Gate.Step> b) {
        List<Gate.Step> out = new ArrayList<>(a);
        out.addAll(b);
        return Collections.unmodifiableList(out);
    }

    static List<Gate.Step> rzz(double[] a) {
        // rzz(π/2) = e^{-iπ/4} diag(1, i, i, 1) = CZ (S ⊗ S) up to phase.
        switch (quarter(a[0], Math.PI / 2)) {
            case 0:
                return List.of();
            case 1:
                return decode(S, 0, S, 1, CZ, 0, 1);
            case 2:
                return decode(Z, 0, Z, 1);
            case 3:
                return decode(S_DAGGER, 0, S_DAGGER, 1, CZ, 0, 1);
            default:
                return null;
        }
    }
}
