package dev.qsim.kernel;

/** A plan on a {@link Layout}: one unit is one block of the layout. */
abstract class LayoutPlan extends Plan {
    final Layout l;
    final int maxPosition;

    LayoutPlan(Amplitudes a, int[] targets, int[] controls) {
        super(a);
        this.l = new Layout(a, targets, controls);
        int max = -1;
        for (int t : targets) {
            max = Math.max(max, t);
        }
        for (int c : controls) {
            max = Math.max(max, c);
        }
        this.maxPosition = max;
    }

    @Override
    long units() {
        return l.outer;
    }

    @Override
    long unitsPerBlock(int blockLog) {
        if (maxPosition >= blockLog || l.blockLog + l.highPos.length > blockLog) {
            return -1;
        }
        return 1L << (blockLog - l.highPos.length - l.blockLog);
    }
}
