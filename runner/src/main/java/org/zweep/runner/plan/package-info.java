/**
 * A sequence expanded into the ordered points the run engine measures: what the sequence loader
 * produces and the engine consumes.
 */
package org.zweep.runner.plan;
