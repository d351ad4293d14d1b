/**
 * Meters described by plain-text dialect files: the {@link org.zweep.driver.dialect.Dialect}
 * loader (built-ins by name, others by path) and {@link org.zweep.driver.dialect.DialectMeter},
 * the {@link org.zweep.driver.meter.Meter} that turns each operation into the dialect's SCPI
 * command templates over a {@link org.zweep.driver.scpi.ScpiSession}.
 */
package org.zweep.driver.dialect;
