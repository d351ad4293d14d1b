package org.zweep.config;

/**
 * Text that is not YAML. The message reads {@code file:line:column: YAML syntax: problem
 * (context)}; {@link #where()} and {@link #problem()} let a reader word it its own way.
 */
public final class YamlSyntaxException extends ConfigException {
    private static final long serialVersionUID = 1L;
    private final String where;
    private final String problem;

    YamlSyntaxException(String where, String problem, String context, Throwable cause) {
        super(BoundedYaml.oneLine(where + ": YAML syntax: " + problem + context), cause);
        this.where = where;
        this.problem = problem;
    }

    /** {@code file:line:column} of the problem (or just the file when the parser gave no place). */
    public String where() {
        return where;
    }

    /** The parser's words for the problem, as it gave them (may hold line ends). */
    public String problem() {
        return problem;
    }
}
