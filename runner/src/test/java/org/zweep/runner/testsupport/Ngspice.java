package org.zweep.runner.testsupport;

import static org.junit.jupiter.api.Assertions.fail;

import java.io.File;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Assumptions;

/** Finds ngspice, the circuit reference the ITs compare with. */
public final class Ngspice {
    private Ngspice() {
    }

    /**
     * The ngspice executable on the PATH. Fails when it is missing under CI (which must run the
     * reference), skips the test with its reason elsewhere.
     */
    public static String executable() {
        for (String d : System.getenv().getOrDefault("PATH", "").split(File.pathSeparator)) {
            if (Files.isExecutable(Path.of(d, "ngspice"))) {
                return Path.of(d, "ngspice").toString();
            }
        }
        if ("true".equals(System.getenv("CI"))) {
            fail("ngspice is not installed (apt-get install -y ngspice); CI must run the circuit reference");
        }
        Assumptions.abort("ngspice not installed");
        return null;
    }
}
