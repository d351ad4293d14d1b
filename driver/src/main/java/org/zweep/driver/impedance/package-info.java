/**
 * The impedance domain: complex impedance at a frequency, every parameter derived from it,
 * series/parallel equivalents, compensation math and quantities with SI units.
 */
package org.zweep.driver.impedance;
