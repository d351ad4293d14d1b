package org.zweep.runner.engine;

/** Thrown inside the engine when a wait is cut short because the run was asked to stop. */
public final class RunInterruptedException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    /** @param reason why the run was stopped */
    public RunInterruptedException(String reason) {
        super(reason);
    }
}
