package org.zweep.runner.cli;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.Properties;
import picocli.CommandLine;

/** Reads the version Maven wrote into the jar's manifest, or into {@code version.properties}, at build time. */
final class VersionProvider implements CommandLine.IVersionProvider {

    /** The zweep version, e.g. {@code 0.1.0-SNAPSHOT}. */
    static String version() {
        // in the jar, its manifest says it (already read: no second opening of the jar at start-up)
        String inManifest = VersionProvider.class.getPackage().getImplementationVersion();
        if (inManifest != null) {
            return inManifest;
        }
        try (InputStream in = VersionProvider.class.getResourceAsStream("/org/zweep/runner/version.properties")) {
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

    @Override
    public String[] getVersion() {
        return new String[] {"zweep " + version()};
    }
}
