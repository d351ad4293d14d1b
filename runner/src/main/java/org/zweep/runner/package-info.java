/**
 * zweep's main job: stored sequences, the sweep engine, compensation, crash-safe results,
 * analysis, reports and the {@code zweep} command line.
 */
package org.zweep.runner;
