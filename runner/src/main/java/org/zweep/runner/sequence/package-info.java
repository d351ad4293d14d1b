/**
 * Sequence files: reading a YAML sequence with the position of every node, validating it before
 * any instrument is touched, and expanding it into the {@link org.zweep.runner.plan.Plan} the run
 * engine measures. The entry point is {@link org.zweep.runner.sequence.SequenceLoader}.
 */
package org.zweep.runner.sequence;
