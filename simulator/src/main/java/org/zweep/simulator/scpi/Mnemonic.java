package org.zweep.simulator.scpi;

/**
 * One mnemonic of a header as typed, split into its name and numeric suffix (SCPI-1999 Vol 1
 * §6.2.5).
 *
 * @param name the letters in upper case, e.g. {@code SOUR}
 * @param suffix the numeric suffix, 1 when omitted
 */
public record Mnemonic(String name, int suffix) {
}
