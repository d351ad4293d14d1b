package org.zweep.driver.scpi;

/**
 * One entry of a meter's error queue, as {@code SYSTem:ERRor?} returns it (SCPI-1999 Vol 2 §21.8).
 *
 * @param code the error number; negative numbers are SCPI's, positive ones the maker's, 0 is "No error"
 * @param message the error's text, without quotes
 */
public record ScpiError(int code, String message) {
    @Override
    public String toString() {
        return code + ",\"" + message + "\"";
    }
}
