package org.zweep.runner.results;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Instant;
import org.junit.jupiter.api.Test;
import org.zweep.driver.impedance.Impedance;

class PointsCsvTest {

    static PointRow row(int point, String step, double r, double x) {
        Impedance z = new Impedance(1000.0, r, x);
        return PointRow.of(new PointRow.Key(point, step, 0, 0), new PointRow.Conditions("impedance", "none",
                z.frequencyHz(), new PointRow.Source("V", 1.0), new PointRow.Source("V", 0.0)), true, r, x, "",
                Instant.parse("2024-05-01T10:00:00.123456Z"));
    }

    @Test
    void headerListsTheRunFolderContractColumnsInOrder() {
        // README "formats-runner" column table (the contract with the analysis reader)
        assertEquals("point,step,step_index,repeat,quantity,wiring,frequency_hz,drive_mode,level,bias_mode,bias,r_ohm,x_ohm,"
                + "z_ohm,theta_deg,cs_f,cp_f,ls_h,lp_h,rs_ohm,rp_ohm,d,q,ratio,status,check,time,"
                + "u_r_ohm,u_x_ohm,r_rx,u_z_ohm,u_theta_deg,u_cs_f,u_cp_f,u_ls_h,u_lp_h,u_rs_ohm,u_rp_ohm,u_d,u_q",
                PointsCsv.HEADER);
    }

    @Test
    void uncertaintiesRoundTripAndTheDerivedOnesAreRecomputed() {
        org.zweep.driver.impedance.Impedance z = new org.zweep.driver.impedance.Impedance(50, 127.732, 219.847);
        PointRow r = PointRow.of(new PointRow.Key(1, "s", 0, 0), new PointRow.Conditions("impedance", "none", 50,
                new PointRow.Source("V", 1.0), new PointRow.Source("V", 0.0)), true, z.resistanceOhm(),
                z.reactanceOhm(), new org.zweep.driver.uncertainty.UncertainImpedance(z, 0.071, 0.295, -0.588), "",
                Instant.parse("2024-05-01T10:00:00Z"));
        PointRow back = PointsCsv.parse(PointsCsv.format(r));
        assertEquals(r, back);
        assertEquals(0.236, back.uncertainty().of("z_ohm"), 0.0005); // JCGM 100:2008, H.2, Table H.3: u(|Z|)
        // a row without a stated accuracy has empty uncertainty cells
        PointRow none = row(2, "s", 1, -1);
        assertEquals(RowUncertainty.NONE, PointsCsv.parse(PointsCsv.format(none)).uncertainty());
        assertEquals(true, PointsCsv.format(none).endsWith(",,,,,,,,,,,,,"));
    }

    @Test
    void rowRoundTripsEveryDoubleExactly() {
        // 100 nF at 1 kHz: X_C = −1/(2πfC) = -1591.5494 ohm, computed
        PointRow r = row(7, "sweep", 0.1234567890123, -1591.5494309189535);
        PointRow back = PointsCsv.parse(PointsCsv.format(r));
        assertEquals(r, back);
        assertEquals(Double.doubleToLongBits(r.xOhm()), Double.doubleToLongBits(back.xOhm()));
    }

    @Test
    void notApplicableValuesAreEmptyCells() {
        PointRow r = row(0, "s", 1.0, -1.0);
        String line = PointsCsv.format(r);
        // the ratio cell sits between q and status: "...,<q>,,ok,,<time>"
        assertTrue(line.contains(",,ok,,2024-05-01T10:00:00.123456Z"), line);
        assertTrue(Double.isNaN(PointsCsv.parse(line).ratio()));
    }

    @Test
    void stepNamesWithCommasAndQuotesAreQuotedAndReadBack() {
        PointRow r = row(3, "bias, \"hot\" sweep", 1.0, -2.0);
        String line = PointsCsv.format(r);
        assertTrue(line.startsWith("3,\"bias, \"\"hot\"\" sweep\",0,"), line); // RFC 4180 §2 rules 6-7
        assertEquals(r.step(), PointsCsv.parse(line).step());
    }

    @Test
    void folderHeaderBeforeTheDriveModeColumnWasRenamedIsStillAHeader() {
        assertTrue(PointsCsv.isHeader(PointsCsv.HEADER));
        assertTrue(PointsCsv.isHeader(PointsCsv.HEADER.replace(",drive_mode,", ",drive,")));
        assertEquals(false, PointsCsv.isHeader(PointsCsv.HEADER.replace(",drive_mode,", ",drive_level,")));
    }

    @Test
    void lineWithTooFewCellsIsRejected() {
        assertThrows(IllegalArgumentException.class, () -> PointsCsv.parse("1,step,0,0,impedance"));
    }

    @Test
    void derivedParametersOfACapacitorFollowTheTextbookFormulas() {
        // 1 uF + 1 ohm ESR at 1 kHz: |Z| = 159.158 ohm, theta = -89.6400 deg, D = 6.28319e-3, computed
        Derived d = Derived.of(new Impedance(1000.0, 1.0, -159.15494309189535));
        assertEquals(159.158, d.zOhm(), 5e-4);
        assertEquals(-89.6400, d.thetaDeg(), 5e-5);
        assertEquals(6.28319e-3, d.d(), 5e-9);
        assertEquals(1e-6, d.csF(), 1e-15);
        // Cs = 1 uF, Rs = 1 ohm -> Rp = Rs(1 + Q²) = 25331.296 ohm, Cp = Cs/(1 + D²) = 0.9999605231 uF, computed
        assertEquals(25331.296, d.rpOhm(), 1e-3);
        assertEquals(0.9999605231e-6, d.cpF(), 1e-16);
    }
}
