/**
 * Safety of the part and the person: every setting is checked against the sequence's limits
 * before any command is sent, and DC bias is turned off on every way out of a run (normal end,
 * failure, lost link, Ctrl-C, JVM shutdown).
 */
package org.zweep.runner.safety;
