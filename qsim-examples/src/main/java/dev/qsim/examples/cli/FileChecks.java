package dev.qsim.examples.cli;

import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Checks of the tool's files, made before any work so that a run never computes a result and
 * then fails to write it: an input must be a readable file (not a folder), an output must name a
 * file (not a folder) in a folder that exists and can be written.
 */
final class FileChecks {
    private FileChecks() {
    }

    /**
     * Refuses an input that is missing, a folder or unreadable.
     *
     * @param file the file
     * @param kind what it should be, for the message ("a circuit file (.qasm)")
     * @throws IllegalArgumentException naming the path and what is wrong
     */
    static void requireInput(Path file, String kind) {
        if (Files.isDirectory(file)) {
            throw new IllegalArgumentException(file + " is a directory; give " + kind);
        }
        if (!Files.exists(file)) {
            throw new IllegalArgumentException("file not found: " + file);
        }
        if (!Files.isReadable(file)) {
            throw new IllegalArgumentException(file + " cannot be read (no permission)");
        }
    }

    /**
     * Refuses an output path that names a folder, or whose folder is missing, not a folder or
     * not writable, or that names a read-only file.
     *
     * @param file the file to write
     * @param option the option that named it, for the message ("--svg")
     * @throws IllegalArgumentException naming the option, the path and what is wrong
     */
    static void requireOutput(Path file, String option) {
        if (Files.isDirectory(file)) {
            throw new IllegalArgumentException(option + ": " + file + " is a directory; give the"
                    + " name of a file to write in it, such as " + file.resolve("out.svg"));
        }
        Path parent = file.toAbsolutePath().normalize().getParent();
        String cannot = option + ": cannot write " + file + ": ";
        if (parent == null || !Files.exists(parent)) {
            throw new IllegalArgumentException(cannot + "the directory " + parent
                    + " does not exist");
        }
        if (!Files.isDirectory(parent)) {
            throw new IllegalArgumentException(cannot + parent + " is not a directory");
        }
        if (!Files.isWritable(parent)) {
            throw new IllegalArgumentException(cannot + "the directory " + parent
                    + " is not writable");
        }
        if (Files.exists(file) && !Files.isWritable(file)) {
            throw new IllegalArgumentException(cannot + "the file is read-only");
        }
    }
}
