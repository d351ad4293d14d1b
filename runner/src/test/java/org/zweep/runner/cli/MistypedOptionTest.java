package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.Arrays;
import java.util.Comparator;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/**
 * A mistyped option gets one line naming the option it is near, exit 2, on every subcommand:
 * picocli's own suggestion only lists options that begin with the same two letters, so
 * {@code zweep run --tmeout 3s} suggested nothing.
 */
class MistypedOptionTest {

    private record Ran(int code, String err) {
    }

    private static Ran zweep(String... args) {
        StringWriter err = new StringWriter();
        int code = Cli.run(args, new PrintWriter(new StringWriter()), new PrintWriter(err));
        return new Ran(code, err.toString());
    }

    @Test
    void tmeoutOnRunSuggestsTimeout() {
        String expected = "zweep: unknown option '--tmeout' (did you mean --timeout?); see 'zweep run --help'"
                + System.lineSeparator();
        Ran r = zweep("run", "--tmeout", "3s", "sequences/incoming-kp-c0805-104.yaml");
        assertEquals(ExitCode.USAGE, r.code());
        assertEquals(expected, r.err());
        Ran eq = zweep("run", "sequences/incoming-kp-c0805-104.yaml", "--tmeout=3s");
        assertEquals(ExitCode.USAGE, eq.code());
        assertEquals(expected, eq.err(), "the value after '=' is not part of the option's name");
    }

    @Test
    void everySubcommandSuggestsItsOptionForALetterDroppedOrTwoSwapped() {
        for (String name : Cli.SUBCOMMANDS.keySet()) {
            if (name.equals("help")) {
                continue;
            }
            CommandLine cl = new CommandLine(Cli.SUBCOMMANDS.get(name).get());
            // its longest visible long option: the typo is then nearer to it than to any other
            String option = cl.getCommandSpec().options().stream().filter(o -> !o.hidden())
                    .flatMap(o -> Arrays.stream(o.names())).filter(n -> n.startsWith("--"))
                    .filter(n -> !n.equals("--help") && !n.equals("--version"))
                    .max(Comparator.comparingInt(String::length)).orElseThrow(() -> new AssertionError(name));
            String dropped = option.substring(0, 3) + option.substring(4);
            String swapped = option.substring(0, 3) + option.charAt(4) + option.charAt(3) + option.substring(5);
            for (String typo : new String[] {dropped, swapped}) {
                Ran r = zweep(name, typo, "1");
                assertEquals(ExitCode.USAGE, r.code(), name + " " + typo + ": " + r.err());
                assertEquals("zweep: unknown option '" + typo + "' (did you mean " + option + "?); see 'zweep " + name
                        + " --help'" + System.lineSeparator(), r.err());
            }
        }
    }

    @Test
    void anOptionFarFromEveryNameGetsNoGuess() {
        Ran r = zweep("run", "--zzzzzz", "x.yaml");
        assertEquals(ExitCode.USAGE, r.code());
        assertEquals("zweep: unknown option '--zzzzzz'; see 'zweep run --help'" + System.lineSeparator(), r.err());
        assertTrue(r.err().lines().count() == 1);
    }
}
