package org.zweep.runner.plan;

/**
 * Which meter a run uses.
 *
 * @param address an address the driver accepts ({@code tcp://…}, {@code serial:…}, {@code sim:BENCH}, VISA strings)
 * @param dialect a built-in dialect name or a path to a dialect file
 */
public record MeterChoice(String address, String dialect) {
}
