package org.zweep.config;

/**
 * A configuration file (or text) that cannot be accepted: unreadable, too large, not YAML, or a
 * value that does not fit its schema. The message is one line fit to show a user as it is and
 * says where: {@code file:line:column: what}.
 */
public class ConfigException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    /** @param message what was wrong and where, one line */
    public ConfigException(String message) {
        super(message);
    }

    /** @param message what was wrong and where, one line; @param cause the underlying failure */
    public ConfigException(String message, Throwable cause) {
        super(message, cause);
    }
}
