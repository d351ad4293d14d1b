package org.zweep.runner.cli;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.Properties;

/**
 * The zweep version Maven wrote into the jar's manifest, or into {@code version.properties}, at
 * build time. Free of picocli, so that {@code zweep --version} loads no library.
 */
final class ZweepVersion {
    private ZweepVersion() {
    }

    /** The zweep version, e.g. {@code 0.1.0-SNAPSHOT}. */
    static String current() {
        // in the jar, its manifest says it (already read: no second opening of the jar at start-up)
        String inManifest = ZweepVersion.class.getPackage().getImplementationVersion();
        if (inManifest != null) {
            return inManifest;
        }
        try (InputStream in = ZweepVersion.class.getResourceAsStream("/org/zweep/runner/version.properties")) {
            if (in == null) {
                return "unknown";
            }
            Properties p = new Properties();
            p.load(in);
            return p.getProperty("version", "unknown");
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
