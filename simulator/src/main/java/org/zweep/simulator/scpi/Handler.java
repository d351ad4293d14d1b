package org.zweep.simulator.scpi;

/** Executes one resolved command or query of the {@link CommandTree}. */
@FunctionalInterface
public interface Handler {
    /**
     * Runs the unit; may block (e.g. {@code *OPC?} waiting for an overlapped operation).
     *
     * @return the response unit, or {@code null} for a command with no response
     * @throws ScpiException to report an error (the unit then has no response)
     */
    Response handle(Call call);
}
