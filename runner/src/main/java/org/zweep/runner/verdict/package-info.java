/**
 * The one check evaluator: which points a check selects, how a point is judged, how rows without
 * a value count, and the verdict; used alike by {@code zweep run}, {@code zweep analyze} and
 * {@code zweep report}.
 */
package org.zweep.runner.verdict;
