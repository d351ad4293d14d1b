/**
 * Fixture compensation as a run does it: meter-side (prompt, acquire each standard, switch the
 * meter's correction on) or host-side (measure the standards at every sweep frequency, store
 * them with time and settings, reuse them while young enough, and correct each reading with the
 * impedance domain's open/short or open/short/load formula, interpolating between stored
 * frequencies but never extrapolating).
 */
package org.zweep.runner.compensation;
