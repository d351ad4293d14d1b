package org.zweep.runner.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.PrintWriter;
import java.io.StringReader;
import java.io.StringWriter;
import java.util.ArrayList;
import java.util.EnumSet;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.meter.FixtureControl;
import org.zweep.driver.meter.FixtureState;

class FixturePortTest {
    final StringWriter written = new StringWriter();

    FixturePort lines(String answers) {
        return FixturePort.lines("stdin", new BufferedReader(new StringReader(answers)), new PrintWriter(written));
    }

    @Test
    void aLineChannelWritesTheRequestAndReturnsOnOk() {
        lines("ok\n").hold(FixtureState.OPEN, "OPEN standard: leave the terminals open");
        assertEquals("fixture OPEN OPEN standard: leave the terminals open" + System.lineSeparator(), written.toString());
    }

    @Test
    void aLineChannelAsksAgainAfterAnAnswerItDoesNotKnow() {
        lines("yes\n OK \n").hold(FixtureState.PART, "");
        assertEquals(List.of("fixture PART", "fixture? ok or abort"), written.toString().lines().toList());
    }

    @Test
    void abortOrTheEndOfInputStopsTheRun() {
        RunInterruptedException a = assertThrows(RunInterruptedException.class,
                () -> lines("abort\n").hold(FixtureState.SHORT, "insert the bar"));
        assertTrue(a.getMessage().contains("abort answered on stdin at the request for SHORT"), a.getMessage());
        RunInterruptedException e = assertThrows(RunInterruptedException.class,
                () -> lines("").hold(FixtureState.LOAD, "insert the load"));
        assertTrue(e.getMessage().contains("input ended on stdin"), e.getMessage());
    }

    @Test
    void yesConfirmsThePartButNeverAStandardOrTheSecondWinding() {
        PrintWriter out = new PrintWriter(written);
        FixturePort yes = FixturePort.confirmingPart(out, "use a channel");
        yes.hold(FixtureState.PART, "Insert the part.");
        assertTrue(written.toString().contains(">> Insert the part. (--yes: going on)"), written.toString());
        for (FixtureState s : List.of(FixtureState.OPEN, FixtureState.SHORT, FixtureState.LOAD,
                FixtureState.SECONDARY_OPEN, FixtureState.SECONDARY_SHORTED)) {
            InvalidInputException e = assertThrows(InvalidInputException.class, () -> yes.hold(s, ""));
            assertTrue(e.getMessage().contains("use a channel"), e.getMessage());
        }
    }

    @Test
    void withoutAnyoneAtTheFixtureTheRefusalNamesTheChannelsNotYes() {
        FixturePort none = FixturePort.refusing("answer with --fixture stdin");
        none.hold(FixtureState.PART, ""); // nothing to change: the part stays in
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> none.hold(FixtureState.OPEN, "OPEN standard"));
        assertTrue(e.getMessage().contains("--fixture stdin"), e.getMessage());
        assertTrue(!e.getMessage().contains("--yes"), e.getMessage());
    }

    @Test
    void theMetersOwnFixtureHoldsWhatItCanAndPassesTheRestOn() {
        List<String> held = new ArrayList<>();
        FixtureControl own = new FixtureControl() {
            @Override
            public Set<FixtureState> states() {
                return EnumSet.of(FixtureState.PART, FixtureState.OPEN, FixtureState.SHORT);
            }

            @Override
            public void hold(FixtureState s) {
                held.add("meter " + s);
            }
        };
        FakeBench bench = new FakeBench();
        FakeBench.Link fake = bench.new Link();
        MeterLink link = new MeterLink() {
            @Override
            public String address() {
                return "test";
            }

            @Override
            public org.zweep.driver.meter.Meter meter() {
                return fake.meter();
            }

            @Override
            public org.zweep.driver.meter.Meter reconnect() {
                return meter();
            }

            @Override
            public boolean isLinkFailure(org.zweep.driver.MeterException e) {
                return false;
            }

            @Override
            public java.util.Optional<FixtureControl> fixtureControl() {
                return java.util.Optional.of(own);
            }

            @Override
            public void close() {
            }
        };
        List<String> notes = new ArrayList<>();
        FixturePort port = FixturePort.meter(link, (s, text) -> held.add("operator " + s + " " + text), notes::add);
        port.hold(FixtureState.OPEN, "OPEN standard");
        port.hold(FixtureState.LOAD, "insert the load");
        assertEquals(List.of("meter OPEN", "operator LOAD insert the load"), held);
        assertEquals(List.of(">> OPEN standard (the meter's fixture holds open)"), notes);
    }
}
