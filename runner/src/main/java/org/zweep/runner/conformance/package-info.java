/**
 * Decision rules for statements of conformity that account for measurement uncertainty
 * (JCGM 106:2012, ILAC-G8:09/2019): simple acceptance, guarded acceptance with a guard band of
 * U, and a minimum probability of conformance. Pure functions of a value, its standard
 * uncertainty and the limits.
 */
package org.zweep.runner.conformance;
