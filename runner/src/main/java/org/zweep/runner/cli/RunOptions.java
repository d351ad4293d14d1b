package org.zweep.runner.cli;

import java.nio.file.Path;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/**
 * The options {@code run} and {@code demo} share: {@code --out}, {@code --seed}, {@code --quiet}
 * and who changes the fixture ({@link FixtureOptions}). Everything else about a run takes its
 * default from {@link RunLauncher.Options#builder()}.
 */
final class RunOptions {
    @Option(names = "--out", paramLabel = "DIR", description = "the run folder to create (default: results/NAME-yyyyMMdd-HHmmss)")
    Path out;

    @Option(names = "--seed", paramLabel = "N", description = "the noise seed of a sim: meter's bench, as"
            + " sim:...?seed=N (default: the bench's; on resume: the run's)")
    Long seed;

    @Option(names = "--quiet", description = "no progress output")
    boolean quiet;

    @Mixin
    FixtureOptions fixture;

    /** A run's options with these set and the rest at their defaults. */
    RunLauncher.Options.Builder builder() {
        return RunLauncher.Options.builder().out(out).seed(seed).quiet(quiet).fixture(fixture);
    }
}
