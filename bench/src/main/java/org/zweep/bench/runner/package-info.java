/**
 * Figures of the run engine: its overhead per point beyond the meter's own time, a 100 000-point
 * run in a 256 MB heap, and wall time against simulated meter time with real timing.
 */
package org.zweep.bench.runner;
