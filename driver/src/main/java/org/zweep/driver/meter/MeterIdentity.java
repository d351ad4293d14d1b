package org.zweep.driver.meter;

/**
 * The four fields of an IEEE 488.2 {@code *IDN?} reply (IEEE 488.2 §10.14).
 *
 * @param manufacturer maker's name
 * @param model model name
 * @param serial serial number, {@code 0} when the meter has none
 * @param firmware firmware or software revision
 */
public record MeterIdentity(String manufacturer, String model, String serial, String firmware) {
    /** The reply as the meter would send it: the four fields joined by commas. */
    @Override
    public String toString() {
        return manufacturer + "," + model + "," + serial + "," + firmware;
    }
}
