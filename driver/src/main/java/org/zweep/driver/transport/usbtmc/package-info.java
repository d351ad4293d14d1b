/**
 * USBTMC instruments on Linux through the kernel's {@code usbtmc} driver: {@code usbtmc:/dev/usbtmcN}
 * and VISA {@code USB[board]::VID::PID::SERIAL[::INTFC]::INSTR}, resolved under {@code /sys}. The C
 * calls and ioctls go through JNA in one wrapper ({@code LinuxNode}). A libusb client for other
 * operating systems is not written yet.
 */
package org.zweep.driver.transport.usbtmc;
