package org.zweep.simulator.hislip;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.DataInputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.net.InetAddress;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TestBench;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/**
 * The simulator's HiSLIP server against messages written byte by byte here from IVI-6.1 (the
 * 16-byte header, the initialize sequence, Data/DataEnd with MessageIDs, fatal errors).
 */
class HislipServerIT {
    private SimulatorServer meter;
    private HislipServer server;

    @BeforeEach
    void start() throws IOException {
        meter = SimulatorServer.start(TestBench.resistor(), ServerOptions.defaults().withPort(0)
                .withInstrument(InstrumentOptions.defaults().withTiming(TimingModel.NONE)));
        server = HislipServer.start(meter, HislipOptions.defaults().withOverlapped(true).withMaxMessageBytes(4096));
    }

    @AfterEach
    void stop() {
        server.close();
        meter.close();
    }

    /** Header: "HS", type, control code, parameter (u32), payload length (u64), all big-endian. */
    private static void send(DataOutputStream out, int type, int control, int parameter, byte[] payload)
            throws IOException {
        out.writeByte('H');
        out.writeByte('S');
        out.writeByte(type);
        out.writeByte(control);
        out.writeInt(parameter);
        out.writeLong(payload.length);
        out.write(payload);
        out.flush();
    }

    private record Message(int type, int control, int parameter, byte[] payload) {
    }

    private static Message receive(DataInputStream in) throws IOException {
        assertEquals('H', in.readUnsignedByte());
        assertEquals('S', in.readUnsignedByte());
        int type = in.readUnsignedByte();
        int control = in.readUnsignedByte();
        int parameter = in.readInt();
        byte[] payload = new byte[(int) in.readLong()];
        in.readFully(payload);
        return new Message(type, control, parameter, payload);
    }

    private Socket connect() throws IOException {
        return new Socket(InetAddress.getLoopbackAddress(), server.port());
    }

    @Test
    void initializeThenAQueryAnsweredWithItsMessageId() throws IOException {
        try (Socket sync = connect(); Socket async = connect()) {
            DataInputStream sin = new DataInputStream(sync.getInputStream());
            DataOutputStream sout = new DataOutputStream(sync.getOutputStream());
            DataInputStream ain = new DataInputStream(async.getInputStream());
            DataOutputStream aout = new DataOutputStream(async.getOutputStream());
            // IVI-6.1: Initialize (0), parameter = version 1.0 (upper 16 bits) and vendor "XY", payload the sub-address
            send(sout, 0, 0, 0x0100_0000 | ('X' << 8) | 'Y', "hislip0".getBytes(StandardCharsets.US_ASCII));
            Message init = receive(sin);
            assertEquals(1, init.type(), "InitializeResponse");
            assertEquals(1, init.control() & 1, "overlapped mode, as configured");
            assertEquals(0x0100, init.parameter() >>> 16, "server protocol version 1.0");
            int session = init.parameter() & 0xffff;
            send(aout, 17, 0, session, new byte[0]); // AsyncInitialize with the session id
            assertEquals(18, receive(ain).type(), "AsyncInitializeResponse");
            send(aout, 15, 0, 0, new byte[] {0, 0, 0, 0, 0, 0, 1, 0}); // AsyncMaxMsgSize: the client takes 256
            Message max = receive(ain);
            assertEquals(16, max.type(), "AsyncMaxMsgSizeResponse");
            assertEquals(8, max.payload().length);
            assertEquals(4096, java.nio.ByteBuffer.wrap(max.payload()).getLong());
            // DataEnd (7) with MessageID 0xFFFFFF00, the first of a session
            send(sout, 7, 0, 0xFFFFFF00, "*IDN?".getBytes(StandardCharsets.US_ASCII));
            Message reply = receive(sin);
            assertEquals(7, reply.type(), "DataEnd");
            assertEquals(0xFFFFFF00, reply.parameter(), "the MessageID of the query it answers");
            String text = new String(reply.payload(), StandardCharsets.US_ASCII);
            assertTrue(text.startsWith("Korvane Bench Instruments,") && text.endsWith("\n"), text);
            send(aout, 21, 1, 0xFFFFFF00, new byte[0]); // AsyncStatusQuery, RMT delivered
            Message stb = receive(ain);
            assertEquals(22, stb.type(), "AsyncStatusResponse");
            assertEquals(0, stb.control() & 0x10, "IEEE 488.2 §11.2: MAV clear, the response was read");
        }
    }

    @Test
    void aBadPrologueIsAFatalErrorAndAnUnknownSubAddressIsRefused() throws IOException {
        try (Socket s = connect()) {
            DataInputStream in = new DataInputStream(s.getInputStream());
            DataOutputStream out = new DataOutputStream(s.getOutputStream());
            send(out, 0, 0, 0x0100_0000, "inst0".getBytes(StandardCharsets.US_ASCII));
            Message m = receive(in);
            assertEquals(2, m.type(), "FatalError");
            assertEquals(3, m.control(), "IVI-6.1 fatal error 3: invalid initialization sequence");
        }
        try (Socket s = connect()) {
            DataInputStream in = new DataInputStream(s.getInputStream());
            DataOutputStream out = new DataOutputStream(s.getOutputStream());
            send(out, 0, 0, 0x0100_0000, "hislip0".getBytes(StandardCharsets.US_ASCII));
            assertEquals(1, receive(in).type());
            out.write("XX".getBytes(StandardCharsets.US_ASCII)); // a header without the HS prologue
            out.write(new byte[14]);
            out.flush();
            Message m = receive(in);
            assertEquals(2, m.type(), "FatalError");
            assertEquals(1, m.control(), "IVI-6.1 fatal error 1: poorly formed message header");
        }
    }
}
