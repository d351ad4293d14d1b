package org.zweep.runner.cli;

import java.net.URISyntaxException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.zweep.driver.InvalidInputException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Spec;

/** {@code zweep demo}: runs the shipped capacitor sequence on the built-in simulator. */
@Command(
        name = "demo",
        mixinStandardHelpOptions = true,
        description = {
            "Runs the shipped incoming inspection of a 100 nF capacitor on the built-in simulator.",
            "The sequence is sequences/" + DemoCommand.SEQUENCE + "; the results go into a fresh folder "
                + "under results/, and the command prints where they are and a short summary.",
            "The simulated meter takes as long as a real one would (tens of seconds)."
        },
        footer = ExitCode.HELP_LIST + "  130 stopped by Ctrl-C, a signal or at the fixture (resumable)%n")
public final class DemoCommand implements Callable<Integer> {
    /** The demo's sequence, inside the shipped {@code sequences/} folder. */
    static final String SEQUENCE = "incoming-kp-c0805-104.yaml";

    @Spec
    CommandSpec spec;

    @Mixin
    RunOptions run;

    @Override
    public Integer call() {
        Path sequence = locate();
        RunLauncher.Options o = run.builder().build();
        RunLauncher launcher = new RunLauncher(spec.commandLine().getOut(), spec.commandLine().getErr());
        int code = launcher.start(sequence, o);
        Path dir = launcher.finishedFolder();
        if (dir != null && (code == ExitCode.OK || code == ExitCode.CHECK_FAILED)) {
            var out = spec.commandLine().getOut();
            out.println();
            out.println("next:");
            out.println("  zweep analyze " + dir + "   # fitted circuit, checks and bins (analysis.json)");
            out.println("  zweep report " + dir + "    # report.html with the plots");
            out.flush();
        }
        return code;
    }

    /**
     * The shipped sequence: under {@code zweep.home} when that system property is set, else next to
     * the jar or classes folder this class came from ({@code runner/target/zweep.jar} or
     * {@code runner/target/classes} → {@code ../../sequences}), else under the current folder or
     * one of its parents.
     */
    static Path locate() {
        List<Path> tried = new ArrayList<>();
        String home = System.getProperty("zweep.home");
        if (home != null) {
            tried.add(Path.of(home, "sequences", SEQUENCE));
        }
        try {
            Path code = Path.of(DemoCommand.class.getProtectionDomain().getCodeSource().getLocation().toURI());
            Path target = code.getParent();
            if (target != null && target.getParent() != null && target.getParent().getParent() != null) {
                tried.add(target.getParent().getParent().resolve("sequences").resolve(SEQUENCE));
            }
        } catch (URISyntaxException | RuntimeException e) {
            // no usable code location: fall back to the current folder
        }
        for (Path d = Path.of("").toAbsolutePath(); d != null; d = d.getParent()) {
            tried.add(d.resolve("sequences").resolve(SEQUENCE));
        }
        for (Path p : tried) {
            if (Files.isRegularFile(p)) {
                return p.normalize();
            }
        }
        throw new InvalidInputException("cannot find sequences/" + SEQUENCE + " (looked in " + tried.get(0)
                + " and " + (tried.size() - 1) + " other places); set -Dzweep.home=REPO");
    }
}
