package org.zweep.driver.scpi;

import java.nio.ByteOrder;

/** The byte order of binary block data, as {@code FORMat:BORDer} sets it (SCPI-1999 Vol 2 §9). */
public enum BlockByteOrder {
    /** {@code NORMal}: most significant byte first (big-endian), the *RST default. */
    NORMAL(ByteOrder.BIG_ENDIAN),
    /** {@code SWAPped}: least significant byte first (little-endian). */
    SWAPPED(ByteOrder.LITTLE_ENDIAN);

    private final ByteOrder order;

    BlockByteOrder(ByteOrder order) {
        this.order = order;
    }

    /** The matching NIO byte order. */
    public ByteOrder byteOrder() {
        return order;
    }
}
