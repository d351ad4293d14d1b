/**
 * Analysis of a run folder: equivalent-circuit fitting of impedance sweeps, DC-bias derating,
 * transformer parameters, repeat statistics, limits and bins (IEC 60062 letters, IEC 60063
 * preferred values), and the {@code analysis.json} they are written to. {@link
 * org.zweep.runner.analysis.Analysis} is the entry point; {@link org.zweep.runner.analysis.RunFolder}
 * reads a folder written by the run engine.
 */
package org.zweep.runner.analysis;
