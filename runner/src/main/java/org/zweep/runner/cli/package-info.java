/**
 * The {@code zweep} command line: one picocli command class per subcommand, each returning an
 * exit code; only {@link org.zweep.runner.cli.Main} calls {@code System.exit}.
 */
package org.zweep.runner.cli;
