package org.zweep.driver.transport.usbtmc;

import java.io.IOException;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.zweep.driver.address.UsbtmcAddress.UsbId;
import org.zweep.driver.transport.ConnectFailedException;

/**
 * Finds the {@code /dev/usbtmcN} node of a USB instrument from its identity: each node of the
 * kernel's {@code usbmisc} class ({@code /sys/class/usbmisc/usbtmcN}) links to its USB interface
 * (with {@code bInterfaceNumber}), whose parent is the USB device (with {@code idVendor},
 * {@code idProduct} and {@code serial}).
 */
final class UsbtmcNodes {
    private UsbtmcNodes() {
    }

    /** A node and the identity found for it. */
    record Node(String name, UsbId id) {
    }

    /**
     * The device node of {@code id}, under {@code dev} (normally {@code /dev}).
     *
     * @param sys the sysfs root, normally {@code /sys}
     * @throws ConnectFailedException naming what was looked for and what was found
     */
    static Path resolve(String address, UsbId id, Path sys, Path dev) {
        List<Node> found = list(sys);
        for (Node n : found) {
            UsbId f = n.id();
            if (f.vendorId() == id.vendorId() && f.productId() == id.productId() && f.serial().equals(id.serial())
                    && f.interfaceNumber() == id.interfaceNumber()) {
                return dev.resolve(n.name());
            }
        }
        StringBuilder sb = new StringBuilder();
        for (Node n : found) {
            sb.append(sb.length() == 0 ? "" : ", ").append(n.name()).append(" is USB::").append(n.id());
        }
        throw new ConnectFailedException(address + ": no USBTMC device USB::" + id + " under "
                + sys.resolve("class/usbmisc") + (found.isEmpty()
                        ? " (none at all: is the instrument plugged in and switched to USBTMC, and the usbtmc kernel"
                                + " module loaded?)"
                        : " (found: " + sb + ")"));
    }

    /** Every usbtmc node with its identity; nodes whose attributes cannot be read are left out. */
    static List<Node> list(Path sys) {
        List<Node> out = new ArrayList<>();
        Path cls = sys.resolve("class/usbmisc");
        if (!Files.isDirectory(cls)) {
            return out;
        }
        try (DirectoryStream<Path> entries = Files.newDirectoryStream(cls, "usbtmc*")) {
            for (Path e : entries) {
                try {
                    Path iface = e.resolve("device").toRealPath();
                    Path usb = iface.getParent();
                    Path serialFile = usb.resolve("serial");
                    UsbId id = new UsbId(hex(usb.resolve("idVendor")), hex(usb.resolve("idProduct")),
                            Files.isRegularFile(serialFile) ? Files.readString(serialFile).strip() : "",
                            hex(iface.resolve("bInterfaceNumber")));
                    out.add(new Node(e.getFileName().toString(), id));
                } catch (IOException | NumberFormatException ex) {
                    // not a USB interface we can read: skip it
                }
            }
        } catch (IOException e) {
            return out;
        }
        out.sort((a, b) -> a.name().compareTo(b.name()));
        return out;
    }

    private static int hex(Path file) throws IOException {
        return Integer.parseInt(Files.readString(file).strip().toLowerCase(Locale.ROOT), 16);
    }
}
