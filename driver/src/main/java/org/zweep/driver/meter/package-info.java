/**
 * What an impedance meter does, in the trade's words: the {@link org.zweep.driver.meter.Meter}
 * interface, the settings it applies and the readings it returns.
 */
package org.zweep.driver.meter;
