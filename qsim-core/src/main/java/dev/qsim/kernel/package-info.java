/**
 * Internal: amplitude storage and the hot loops that act on it. Not exported by the module;
 * nothing here checks its arguments (preconditions are stated on each method).
 */
package dev.qsim.kernel;
