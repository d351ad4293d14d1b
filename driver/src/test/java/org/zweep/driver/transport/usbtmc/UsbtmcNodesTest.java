package org.zweep.driver.transport.usbtmc;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.address.Address;
import org.zweep.driver.address.UsbtmcAddress;
import org.zweep.driver.transport.ConnectFailedException;

/** VISA USB identities resolved to device nodes through a sysfs tree laid out as Linux lays it out. */
class UsbtmcNodesTest {
    @TempDir
    Path sys;

    /** /sys/class/usbmisc/NODE/device links to the interface; its parent is the USB device. */
    private void node(String node, String usbDevice, String vendor, String product, String serial, String intf)
            throws IOException {
        Path dev = Files.createDirectories(sys.resolve("devices/pci0000:00/usb1").resolve(usbDevice));
        Files.writeString(dev.resolve("idVendor"), vendor + "\n");
        Files.writeString(dev.resolve("idProduct"), product + "\n");
        if (serial != null) {
            Files.writeString(dev.resolve("serial"), serial + "\n");
        }
        Path iface = Files.createDirectories(dev.resolve(usbDevice + ":1." + Integer.parseInt(intf, 16)));
        Files.writeString(iface.resolve("bInterfaceNumber"), intf + "\n");
        Path cls = Files.createDirectories(sys.resolve("class/usbmisc").resolve(node));
        Files.createSymbolicLink(cls.resolve("device"), iface);
    }

    private Path resolve(String visa) {
        UsbtmcAddress a = (UsbtmcAddress) Address.parse(visa);
        return UsbtmcNodes.resolve(a.text(), a.usb(), sys, Path.of("/dev"));
    }

    @Test
    void vendorProductSerialAndInterfaceSelectTheNode() throws IOException {
        node("usbtmc0", "1-1", "1234", "5678", "SN0001", "00");
        node("usbtmc1", "1-2", "1234", "5678", "SN0002", "00");
        node("usbtmc2", "1-3", "abcd", "0001", "X", "02");
        assertEquals(Path.of("/dev/usbtmc1"), resolve("USB0::0x1234::0x5678::SN0002::INSTR"));
        assertEquals(Path.of("/dev/usbtmc0"), resolve("USB::4660::22136::SN0001")); // the same ids in decimal
        assertEquals(Path.of("/dev/usbtmc2"), resolve("USB::0xABCD::0x0001::X::2::INSTR"));
    }

    @Test
    void noMatchNamesWhatWasFound() throws IOException {
        node("usbtmc0", "1-1", "1234", "5678", "SN0001", "00");
        node("usbtmc3", "1-4", "1234", "5678", null, "00");
        ConnectFailedException e = assertThrows(ConnectFailedException.class,
                () -> resolve("USB::0x1234::0x5678::SN0009::INSTR"));
        assertTrue(e.getMessage().contains("no USBTMC device USB::0x1234::0x5678::SN0009::0")
                && e.getMessage().contains("usbtmc0 is USB::0x1234::0x5678::SN0001::0")
                && e.getMessage().contains("usbtmc3 is USB::0x1234::0x5678::::0"), e.getMessage());
    }

    @Test
    void noNodesAtAllSuggestsTheKernelModule() {
        ConnectFailedException e = assertThrows(ConnectFailedException.class,
                () -> resolve("USB::0x1234::0x5678::SN1::INSTR"));
        assertTrue(e.getMessage().contains("usbtmc kernel module loaded?"), e.getMessage());
        assertEquals(1, e.getMessage().lines().count());
    }

    @Test
    void permissionDeniedIsOneLineNamingTheUdevRule() {
        String m = UsbtmcTransport.openFailure("usbtmc:/dev/usbtmc0", "/dev/usbtmc0", LinuxNode.EACCES, "x");
        assertEquals(1, m.lines().count());
        assertTrue(m.startsWith("usbtmc:/dev/usbtmc0: permission denied on /dev/usbtmc0: allow your user with a udev"
                + " rule, e.g. SUBSYSTEM==\"usbmisc\", KERNEL==\"usbtmc*\", GROUP=\"plugdev\", MODE=\"0660\""), m);
    }
}
