package org.zweep.driver.dialect;

import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import org.zweep.driver.MeterException;
import org.zweep.driver.scpi.ScpiError;
import org.zweep.driver.scpi.ScpiSession;

/**
 * A fake meter that answers from a script of exchanges and fails the test on any message it was
 * not told to expect. Each exchange is one message the meter must receive, with its reply (text,
 * a block's payload, none for a plain write) or a link failure to raise instead.
 */
final class ScriptedSession implements ScpiSession {

    /** One scripted exchange; {@code line} is where it is written in the script, for messages. */
    record Exchange(int line, String message, String reply, byte[] block, String failure, List<String> lines,
            ScpiSession.BlocksReply blocks) {
        Exchange(int line, String message, String reply, byte[] block, String failure) {
            this(line, message, reply, block, failure, reply == null ? List.of() : List.of(reply), null);
        }

        Exchange(int line, String message, String reply, byte[] block, String failure, List<String> lines) {
            this(line, message, reply, block, failure, lines, null);
        }
    }

    private final String address;
    private final List<Exchange> script = new ArrayList<>();
    private final List<String> received = new ArrayList<>();
    private int next;
    private boolean closed;

    ScriptedSession(String address) {
        this.address = address;
    }

    void expectWrite(int line, String message) {
        script.add(new Exchange(line, message, null, null, null));
    }

    void expectQuery(int line, String message, String reply) {
        script.add(new Exchange(line, message, reply, null, null));
    }

    /** A query answered with {@code replies}, one line each (one line: a plain query too). */
    void expectQuery(int line, String message, List<String> replies) {
        script.add(new Exchange(line, message, replies.size() == 1 ? replies.get(0) : null, null, null,
                List.copyOf(replies)));
    }

    void expectBlockQuery(int line, String message, String hex) {
        script.add(new Exchange(line, message, null, HexFormat.of().parseHex(hex.replace(" ", "")), null));
    }

    /** A query answered with blocks then a text unit, {@code units} "HEX ; HEX ; TEXT" (the last is the text). */
    void expectBlocksQuery(int line, String message, String units) {
        String[] u = units.split(" ; ", -1);
        List<byte[]> blocks = new ArrayList<>();
        for (int i = 0; i < u.length - 1; i++) {
            blocks.add(HexFormat.of().parseHex(u[i].replace(" ", "")));
        }
        script.add(new Exchange(line, message, null, null, null, List.of(),
                new ScpiSession.BlocksReply(blocks, u[u.length - 1].strip())));
    }

    void expectFailure(int line, String message, String failure) {
        script.add(new Exchange(line, message, null, null, failure));
    }

    /** Exchanges consumed so far. */
    int position() {
        return next;
    }

    /** Every message the meter received, in order. */
    List<String> received() {
        return received;
    }

    boolean closed() {
        return closed;
    }

    @Override
    public String address() {
        return address;
    }

    @Override
    public void write(String message) {
        Exchange e = take(message, "write");
        if (e.reply != null || e.block != null || !e.lines.isEmpty()) {
            throw new AssertionError("script line " + e.line + " expects a query with a reply, but '" + message
                    + "' was written without waiting for one");
        }
    }

    @Override
    public String query(String message) {
        Exchange e = take(message, "query");
        if (e.reply == null) {
            throw new AssertionError("script line " + e.line + ": '" + message + "' was sent as a query of one reply"
                    + " line but the script gives it " + (e.lines.isEmpty() ? "no text reply" : e.lines.size() + " lines"));
        }
        return e.reply;
    }

    @Override
    public List<String> queryLines(String message, int queries, java.time.Duration expectedWork) {
        Exchange e = take(message, "query of " + queries + " reply lines");
        if (e.lines.size() != queries) {
            throw new AssertionError("script line " + e.line + ": '" + message + "' was sent awaiting " + queries
                    + " reply lines but the script gives " + e.lines.size());
        }
        return e.lines;
    }

    @Override
    public byte[] queryBlock(String message) {
        Exchange e = take(message, "block query");
        if (e.block == null) {
            throw new AssertionError("script line " + e.line + ": '" + message + "' was sent as a block query but "
                    + "the script gives it no block reply");
        }
        return e.block.clone();
    }

    @Override
    public BlocksReply queryBlocksThenText(String message, int blocks, java.time.Duration expectedWork) {
        Exchange e = take(message, "query of " + blocks + " blocks and a text");
        if (e.blocks == null) {
            throw new AssertionError("script line " + e.line + ": '" + message + "' was sent awaiting blocks and a"
                    + " text but the script gives it none");
        }
        return e.blocks;
    }

    @Override
    public List<ScpiError> drainErrors() {
        throw new AssertionError("DialectMeter reads errors with its dialect's error query, not drainErrors()");
    }

    @Override
    public void close() {
        closed = true;
    }

    private Exchange take(String message, String kind) {
        received.add(message);
        if (closed) {
            throw new AssertionError(kind + " '" + message + "' after close");
        }
        if (next >= script.size()) {
            throw new AssertionError("unexpected " + kind + " '" + message + "' after the end of the script");
        }
        Exchange e = script.get(next++);
        if (!e.message.equals(message)) {
            throw new AssertionError("script line " + e.line + " expects\n  > " + e.message + "\nbut the meter got\n  > "
                    + message);
        }
        if (e.failure != null) {
            throw new MeterException(address + ": " + e.failure);
        }
        return e;
    }
}
