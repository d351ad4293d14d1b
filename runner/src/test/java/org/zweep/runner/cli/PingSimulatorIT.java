package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/** {@code zweep ping} against the simulator over loopback TCP (the serial path: driver's SerialSimulatorIT). */
class PingSimulatorIT {

    @Test
    void pingOfTheSimulatorOverTcpTimesEveryQuery() throws Exception {
        BenchSpec bench = BenchSpec.ofNetlist("R1 hi lo 100", "test").ideal();
        try (SimulatorServer server = SimulatorServer.start(new SimulatedBench(bench),
                ServerOptions.defaults().withPort(0))) {
            StringWriter out = new StringWriter();
            StringWriter err = new StringWriter();
            int code = Cli.run(new String[] {"ping", "tcp://127.0.0.1:" + server.port(), "--count", "30", "--json",
                "--query", "SYST:ERR?"}, new PrintWriter(out), new PrintWriter(err));
            assertEquals(ExitCode.OK, code, err.toString());
            JsonNode j = new ObjectMapper().readTree(out.toString());
            assertEquals(30, j.get("count").asInt());
            assertTrue(j.get("min_us").asDouble() > 0 && j.get("min_us").asDouble() <= j.get("max_us").asDouble(),
                    j.toString());
        }
    }
}
