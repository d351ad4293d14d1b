package org.zweep.runner.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.zweep.driver.scpi.ScpiError;
import org.zweep.driver.scpi.ScpiSession;

/** The simulator's noise key joins the next message instead of being written on its own. */
class JoiningSessionTest {
    private static final class Recorder implements ScpiSession {
        final List<String> sent = new ArrayList<>();

        @Override
        public String address() {
            return "rec:";
        }

        @Override
        public void write(String message) {
            sent.add(message);
        }

        @Override
        public String query(String message) {
            sent.add(message);
            return "0";
        }

        @Override
        public byte[] queryBlock(String message) {
            sent.add(message);
            return new byte[0];
        }

        @Override
        public List<ScpiError> drainErrors() {
            return List.of();
        }

        @Override
        public void close() {
        }
    }

    private final Recorder rec = new Recorder();
    private final JoiningSession s = new JoiningSession(rec);

    @Test
    void theJoinedCommandGoesInFrontOfTheNextMessageOnlyOnce() {
        s.joinNext(":SIM:NOIS:KEY 7");
        s.query(":READ?;:SYST:ERR?");
        s.query(":READ?;:SYST:ERR?");
        assertEquals(List.of(":SIM:NOIS:KEY 7;:READ?;:SYST:ERR?", ":READ?;:SYST:ERR?"), rec.sent);
    }

    @Test
    void aMessageWithoutALeadingColonIsRootedSoItsHeadersDoNotFollowTheJoinedPath() {
        // SCPI-1999 Vol 1 §6.2.4: after ';' a header without ':' continues the previous path
        s.joinNext(":SIM:NOIS:KEY 7");
        s.query("READ?");
        s.joinNext(":SIM:NOIS:KEY 8");
        s.write("*TRG");
        assertEquals(List.of(":SIM:NOIS:KEY 7;:READ?", ":SIM:NOIS:KEY 8;*TRG"), rec.sent);
    }

    @Test
    void aLaterKeyReplacesOneNotYetSent() {
        s.joinNext(":SIM:NOIS:KEY 1");
        s.joinNext(":SIM:NOIS:KEY 2");
        s.queryBlock(":READ?");
        assertEquals(List.of(":SIM:NOIS:KEY 2;:READ?"), rec.sent);
    }
}
