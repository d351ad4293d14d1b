/**
 * Serial ports through jSerialComm, the only place zweep touches that library: it reports failures
 * as {@code false} plus an OS error code, which are turned into typed exceptions here.
 */
package org.zweep.driver.transport.serial;
