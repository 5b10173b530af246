package dev.qsim.kernel;

/**
 * Index arithmetic shared by the kernels of every shape: how a gate's amplitudes are cut into
 * independent work units. Internal.
 *
 * <p>The single-qubit plans without controls use the static methods: a unit is a block of
 * {@code 2^(q+1)} amplitudes, or for a high target inside a chunk a piece of
 * {@code 2^PIECE_LOG} pairs of a block, or for a target at or above the chunk log one pair. The
 * single-qubit loops on float storage cut high targets into the same pieces.
 *
 * <p>Any other gate uses an instance: the shape of the gate's index set. The state is cut into
 * blocks of {@code 2^blockLog} amplitudes inside one chunk. Gate positions below
 * {@code blockLog} ("low") are handled by a table of the in-block offsets where they are 0 (and
 * low controls are 1); positions at or above it ("high") are handled per block by bit deposit.
 * With no low position, a block is one contiguous run and needs no table.
 */
final class Layout {
    /** Log2 of the block size used when some gate qubit is low. */
    static final int TABLE_LOG = 10;

    /**
     * Log2 of the pairs in one work unit of a single-qubit gate on a high target inside a
     * chunk: a block's half is cut into pieces of this size, so even the highest target splits
     * over threads.
     */
    static final int PIECE_LOG = 12;

    /** Work units of a single-qubit gate: blocks, or pieces of blocks for high targets. */
    static long singleUnits(Amplitudes a, int q) {
        final long pairs = 1L << (a.n - 1);
        return q < a.chunkLog ? pairs >>> Math.min(q, PIECE_LOG) : pairs;
    }

    /** First amplitude index of piece {@code u} of a single-qubit gate with q > PIECE_LOG. */
    static long pieceBase(int q, long u) {
        final long b = u >>> (q - PIECE_LOG);
        final long piece = u & ((1L << (q - PIECE_LOG)) - 1);
        return (b << (q + 1)) + (piece << PIECE_LOG);
    }

    static long singleUnitsPerBlock(int q, int blockLog) {
        return q < blockLog ? 1L << (blockLog - 1 - Math.min(q, PIECE_LOG)) : -1;
    }

    final int d;            // 2^k target combinations
    final long[] highOff;   // high part of the offset of combination j
    final int[] lowOff;     // low part of the offset of combination j
    final int[] starts;     // in-block offsets where runs of visited amplitudes start
    final int run;          // amplitudes per run (2^lowest position, or the whole block)
    final int blockLog;
    final int[] highPos;    // ascending positions at or above blockLog
    final long highCtrl;    // controls at or above blockLog
    final long outer;       // number of blocks visited

    Layout(Amplitudes a, int[] targets, int[] controls) {
        int k = targets.length;
        d = 1 << k;
        int[] positions = new int[k + controls.length];
        long ctrl = 0;
        for (int t = 0; t < k; t++) {
            positions[t] = targets[t];
        }
        for (int c = 0; c < controls.length; c++) {
            positions[k + c] = controls[c];
            ctrl |= 1L << controls[c];
        }
        java.util.Arrays.sort(positions);
        int tLog = Math.min(a.chunkLog, TABLE_LOG);
        // Run mode keeps at least 2^6 blocks where it can, so the work splits over threads.
        blockLog = positions[0] >= tLog
                ? Math.min(Math.min(positions[0], a.chunkLog),
                        Math.max(tLog, a.n - positions.length - 6))
                : tLog;
        long lowMask = (1L << blockLog) - 1;
        int lowCount = 0;
        for (int p : positions) {
            if (p < blockLog) {
                lowCount++;
            }
        }
        highPos = java.util.Arrays.copyOfRange(positions, lowCount, positions.length);
        highCtrl = ctrl & ~lowMask;
        highOff = new long[d];
        lowOff = new int[d];
        for (int j = 0; j < d; j++) {
            long o = 0;
            for (int t = 0; t < k; t++) {
                if ((j >>> t & 1) != 0) {
                    o |= 1L << targets[t];
                }
            }
            highOff[j] = o & ~lowMask;
            lowOff[j] = (int) (o & lowMask);
        }
        if (lowCount == 0) {
            starts = new int[] {0};
            run = 1 << blockLog;
        } else {
            // Runs of 2^p0 amplitudes below the lowest gate qubit p0 are contiguous.
            int p0 = positions[0];
            run = 1 << p0;
            starts = new int[1 << (blockLog - lowCount - p0)];
            long lowPosMask = 0;
            for (int i = 0; i < lowCount; i++) {
                lowPosMask |= 1L << positions[i];
            }
            int lowCtrl = (int) (ctrl & lowMask);
            int w = 0;
            for (int e = 0; e < (1 << blockLog); e += run) {
                if ((e & lowPosMask) == 0) {
                    starts[w++] = e | lowCtrl;
                }
            }
        }
        outer = 1L << (a.n - highPos.length - blockLog);
    }

    /** Index of the first amplitude of block {@code o} (low bits zero). */
    long base(long o) {
        long x = o << blockLog;
        for (int p : highPos) {
            x = ((x >>> p) << (p + 1)) | (x & ((1L << p) - 1));
        }
        return x | highCtrl;
    }

    /** Fills the chunk and in-chunk amplitude offset of each combination for block o. */
    void locate(Amplitudes a, long o, double[][] arr, int[] off) {
        long base = base(o);
        for (int j = 0; j < d; j++) {
            long idx = base | highOff[j];
            arr[j] = a.chunks[(int) (idx >>> a.chunkLog)];
            off[j] = (int) (idx & a.chunkMask) + lowOff[j];
        }
    }
}
