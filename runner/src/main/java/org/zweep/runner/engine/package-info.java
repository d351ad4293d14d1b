/**
 * The run engine: measures a {@link org.zweep.runner.plan.Plan}'s points in order through a
 * {@link org.zweep.runner.engine.Station} (the meter, its fixture and the operator), ramping and
 * settling bias, reconnecting after a lost link (through {@link
 * org.zweep.runner.engine.ReconnectingMeter}), writing each point as it arrives, reporting
 * progress and stopping cleanly when interrupted.
 */
package org.zweep.runner.engine;
