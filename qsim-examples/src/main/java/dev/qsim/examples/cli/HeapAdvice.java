package dev.qsim.examples.cli;

import java.lang.management.ManagementFactory;
import java.lang.management.OperatingSystemMXBean;
import java.util.Locale;

import dev.qsim.Circuit;
import dev.qsim.Precision;
import dev.qsim.Simulator;
import dev.qsim.StateVector;

/**
 * What the tool says when the core refuses a state the heap cannot hold: how many qubits this
 * heap does hold (in both precisions), why the simulator needs a state vector for this circuit
 * (the core's own reason, which names the first non-Clifford gate and its position when that is
 * what rules out the stabilizer engine), and the core's {@code -Xmx} advice only when the
 * machine has the memory to follow it.
 */
final class HeapAdvice {
    private static final long GIB = 1L << 30;

    private HeapAdvice() {
    }

    /**
     * Returns the message for a refused run.
     *
     * @param c the circuit
     * @param sim the simulator that refused it
     * @param shots the shots of the run
     * @param refusal the core's refusal (its message names the bytes and an {@code -Xmx})
     * @return the message
     */
    static String message(Circuit c, Simulator sim, int shots, IllegalStateException refusal) {
        int n = c.qubits();
        Precision precision = sim.precision();
        long need = (long) precision.bytesPerAmplitude() << n;
        long machine = machineMemory();
        Runtime rt = Runtime.getRuntime();
        long room = rt.maxMemory() - (rt.totalMemory() - rt.freeMemory());
        StringBuilder sb = new StringBuilder();
        if (machine > 0 && need > machine) {
            sb.append("a state vector of ").append(n).append(" qubits needs ").append(size(need))
                    .append(" (").append(precision.bytesPerAmplitude())
                    .append(" bytes an amplitude), more than this machine's ")
                    .append(size(machine)).append(" of memory");
        } else {
            sb.append(refusal.getMessage());
        }
        sb.append("; this heap (at most ").append(size(rt.maxMemory()))
                .append(") holds a state vector of up to ").append(fits(room, precision))
                .append(" qubits");
        if (precision == Precision.DOUBLE) {
            sb.append(" (").append(fits(room, Precision.SINGLE))
                    .append(" with --precision single)");
        }
        Simulator.Choice choice = sim.explain(c, shots);
        if (choice.engine() == Simulator.Engine.AMPLITUDES && !c.isClifford()) {
            sb.append("; the stabilizer engine, which runs Clifford circuits of any width, is"
                    + " ruled out: ").append(choice.reason());
        } else {
            sb.append("; the simulator chose ").append(choice.engine()).append(": ")
                    .append(choice.reason());
        }
        return sb.toString();
    }

    /** The most qubits whose state fits in {@code room} bytes, at most the core's limit. */
    static int fits(long room, Precision precision) {
        long amplitudes = Math.max(1, room / precision.bytesPerAmplitude());
        return Math.min(StateVector.MAX_QUBITS, 63 - Long.numberOfLeadingZeros(amplitudes));
    }

    /** The machine's physical memory in bytes, or -1 if the JVM does not say. */
    static long machineMemory() {
        OperatingSystemMXBean os = ManagementFactory.getOperatingSystemMXBean();
        if (os instanceof com.sun.management.OperatingSystemMXBean) {
            return ((com.sun.management.OperatingSystemMXBean) os).getTotalMemorySize();
        }
        return -1;
    }

    /** Bytes in GiB with one decimal, or TiB from 1 TiB. */
    static String size(long bytes) {
        if (bytes >= 1024 * GIB) {
            return String.format(Locale.ROOT, "%.1f TiB", bytes / (1024.0 * GIB));
        }
        return String.format(Locale.ROOT, "%.1f GiB", bytes / (double) GIB);
    }
}
