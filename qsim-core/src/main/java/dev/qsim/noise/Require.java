package dev.qsim.noise;

/** Argument checks of this package; messages give the quantity, the value and what is allowed. */
final class Require {

    private Require() {
    }

    static double probability(double p, String what) {
        if (!(p >= 0 && p <= 1)) {
            throw new IllegalArgumentException(what + " " + p + " is outside [0, 1]");
        }
        return p;
    }

    static double positiveTime(double t, String what) {
        if (!(t > 0)) {
            throw new IllegalArgumentException(what + " " + t
                    + " is not allowed; it must be positive (infinity is allowed)");
        }
        return t;
    }

    static double nonNegativeFiniteTime(double t, String what) {
        if (!(t >= 0) || Double.isInfinite(t)) {
            throw new IllegalArgumentException(what + " " + t
                    + " is not allowed; it must be finite and at least 0");
        }
        return t;
    }

}
