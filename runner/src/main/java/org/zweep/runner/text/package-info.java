/**
 * Figures for people: the one table of parameter names (label and unit of {@code cs_f}, {@code esr_ohm},
 * {@code srf_hz}, ...) and the one formatter of values with SI prefixes used by the terminal, the
 * report, the plots and the messages.
 */
package org.zweep.runner.text;
