package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.List;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

class CliSubcommandsTest {

    @Test
    void eachSubcommandIsRegisteredUnderItsOwnAnnotatedName() {
        for (var e : Cli.SUBCOMMANDS.entrySet()) {
            CommandLine c = new CommandLine(e.getValue().get());
            assertEquals(e.getKey(), c.getCommandName(), "table name of " + c.getCommand().getClass());
        }
    }

    @Test
    void aSubcommandRunBuildsOnlyThatSubcommandAndVersionBuildsNone() {
        assertEquals(List.of("run"), Cli.needed(new String[] {"run", "x.yaml", "--help"}));
        assertEquals(List.of(), Cli.needed(new String[] {"--version"}));
        assertEquals(List.copyOf(Cli.SUBCOMMANDS.keySet()), Cli.needed(new String[] {"--help"}));
        assertEquals(List.copyOf(Cli.SUBCOMMANDS.keySet()), Cli.needed(new String[] {"rnu"}));
        assertEquals(List.copyOf(Cli.SUBCOMMANDS.keySet()), Cli.needed(new String[] {"help", "run"}));
    }

    @Test
    void topLevelHelpStillListsEverySubcommandAndATypoStillGetsASuggestion() {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        Cli.run(new String[] {"--help"}, new PrintWriter(out), new PrintWriter(err));
        for (String name : Cli.SUBCOMMANDS.keySet()) {
            assertTrue(out.toString().contains("  " + name), name + " missing from:\n" + out);
        }
        StringWriter err2 = new StringWriter();
        int code = Cli.run(new String[] {"rum"}, new PrintWriter(new StringWriter()), new PrintWriter(err2));
        assertEquals(ExitCode.USAGE, code);
        assertTrue(err2.toString().contains("did you mean run"), err2.toString());
    }
}
