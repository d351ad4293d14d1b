/**
 * Exports of a run folder for other tools: Touchstone one-port Z-parameter files (v2.0 with Z in
 * ohms, or v1.1 with Z normalised to R), and the measured points as CSV or JSON.
 */
package org.zweep.runner.export;
