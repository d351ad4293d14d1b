package org.zweep.simulator.lan;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/** Where END goes in the simulator's reply bytes. */
class ResponseEndTest {

    private static List<Integer> ends(String bytes) {
        ResponseEnd r = new ResponseEnd();
        List<Integer> out = new ArrayList<>();
        byte[] b = bytes.getBytes(StandardCharsets.ISO_8859_1);
        for (int i = 0; i < b.length; i++) {
            if (r.endsAt(b[i])) {
                out.add(i);
            }
        }
        return out;
    }

    @Test
    void eachNewlineEndsAMessage() {
        assertEquals(List.of(6, 10), ends("+1.0E3\n1;2\n"));
    }

    @Test
    void aNewlineInsideADefiniteLengthBlockDoesNotEndTheMessage() {
        // IEEE 488.2 §8.7.9: #<n><length><bytes>; the payload may hold any byte, a newline too
        assertEquals(List.of(6), ends("#13a\nb\n"));
        assertEquals(List.of(9), ends("1,#14\n\n\n\n\n"), "a block after a comma");
    }

    @Test
    void aHashThatStartsNoWellFormedBlockIsText() {
        assertEquals(List.of(4), ends("a#1x\n"), "a '#' inside an element is no block header");
        assertEquals(List.of(3), ends("#1x\n"), "a length digit that is no digit");
        assertEquals(List.of(3), ends("#0a\n"), "the indefinite form ends at the newline");
    }
}
