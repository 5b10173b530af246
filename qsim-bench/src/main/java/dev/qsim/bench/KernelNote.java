package dev.qsim.bench;

import java.util.concurrent.atomic.AtomicBoolean;

import dev.qsim.Simulator;

/**
 * Prints, once per JVM, which loops the core runs ({@link Simulator#kernels()}), so every JMH
 * fork's log says whether its figures are of the vector or the scalar kernels. The JMH forks
 * start with {@code --add-modules jdk.incubator.vector} ({@code @Fork(jvmArgsAppend)}), which
 * makes them vector kernels wherever the JDK and processor allow. Silent when the system property
 * {@code qsim.vector.quiet} is {@code true} (as in the tests, which never print).
 */
public final class KernelNote {
    private static final AtomicBoolean DONE = new AtomicBoolean();

    private KernelNote() {
    }

    /** Prints the kernels line on standard output, the first time only. */
    public static void once() {
        if (!Boolean.getBoolean("qsim.vector.quiet") && DONE.compareAndSet(false, true)) {
            System.out.println("# qsim kernels: " + Simulator.kernels());
        }
    }
}
