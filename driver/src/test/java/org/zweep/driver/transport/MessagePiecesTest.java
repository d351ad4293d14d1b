package org.zweep.driver.transport;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

class MessagePiecesTest {

    /** What the sender was offered: from, length, last. */
    record Offer(int from, int length, boolean last) {
    }

    @Test
    void aMessageGoesInPiecesOfTheMaximumWithOnlyTheLastFlagged() {
        List<Offer> offers = new ArrayList<>();
        MessagePieces.send(10, 4, (from, length, last) -> {
            offers.add(new Offer(from, length, last));
            return length;
        });
        assertEquals(List.of(new Offer(0, 4, false), new Offer(4, 4, false), new Offer(8, 2, true)), offers);
    }

    @Test
    void whatThePeerDidNotTakeIsOfferedAgain() {
        List<Offer> offers = new ArrayList<>();
        MessagePieces.send(6, 100, (from, length, last) -> {
            offers.add(new Offer(from, length, last));
            return Math.min(length, 4);
        });
        assertEquals(List.of(new Offer(0, 6, true), new Offer(4, 2, true)), offers);
    }

    @Test
    void anEmptyMessageIsOneEmptyLastPiece() {
        List<Offer> offers = new ArrayList<>();
        MessagePieces.send(0, 4, (from, length, last) -> {
            offers.add(new Offer(from, length, last));
            return 0;
        });
        assertEquals(List.of(new Offer(0, 0, true)), offers);
    }

    @Test
    void aSenderThatTakesNothingOrTooMuchIsABug() {
        assertThrows(IllegalStateException.class, () -> MessagePieces.send(5, 4, (from, length, last) -> 0));
        assertThrows(IllegalStateException.class, () -> MessagePieces.send(5, 4, (from, length, last) -> length + 1));
    }

    @Test
    void whatTheSenderThrowsComesThrough() {
        java.io.IOException broke = new java.io.IOException("reset");
        java.io.IOException thrown = assertThrows(java.io.IOException.class,
                () -> MessagePieces.send(5, 4, (from, length, last) -> {
                    throw broke;
                }));
        assertEquals(broke, thrown);
    }
}
