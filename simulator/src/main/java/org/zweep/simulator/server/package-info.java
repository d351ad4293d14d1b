/**
 * The simulator's transports and fault injection: a raw TCP SCPI server ({@link
 * org.zweep.simulator.server.SimulatorServer}), an in-memory stream pair for in-process use, and
 * faults as values attached to a phase of one exchange ({@link org.zweep.simulator.server.FaultPlan}).
 */
package org.zweep.simulator.server;
