package org.zweep.runner.cli;

import picocli.CommandLine;

/** {@code zweep --version} for picocli: {@code zweep} and {@link ZweepVersion#current()}. */
final class VersionProvider implements CommandLine.IVersionProvider {

    @Override
    public String[] getVersion() {
        return new String[] {"zweep " + ZweepVersion.current()};
    }
}
