package org.zweep.driver.transport.serial;

import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class SerialTransportTest {

    @Test
    void permissionDeniedPointsAtTheDialoutGroup() {
        // Linux errno 13 is EACCES (asm-generic/errno-base.h); serial devices belong to group dialout on Debian
        assertTrue(SerialTransport.openFailure(13, 0).contains("'dialout' group"));
    }

    @Test
    void busyAndMissingDevicesAreNamed() {
        assertTrue(SerialTransport.openFailure(16, 0).contains("in use")); // errno 16 EBUSY, errno-base.h
        assertTrue(SerialTransport.openFailure(2, 0).contains("no such device")); // errno 2 ENOENT, errno-base.h
        assertTrue(SerialTransport.openFailure(5, 1234).contains("error 5 (jSerialComm location 1234)"));
    }
}
