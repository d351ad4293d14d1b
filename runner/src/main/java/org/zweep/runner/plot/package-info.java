/**
 * Plots of a run's sweeps (JFreeChart), written as PNG and SVG (JFreeSVG): impedance and phase,
 * R and X, the main value with the fitted model, loss (D or Q), and DC-bias derating. Works
 * headless.
 */
package org.zweep.runner.plot;
