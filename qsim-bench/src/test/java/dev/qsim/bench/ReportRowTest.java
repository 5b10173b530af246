package dev.qsim.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

import dev.qsim.Precision;

/** Bytes and bandwidth of a row, and its CSV line. */
class ReportRowTest {
    @Test
    void bandwidthArithmetic() {
        // Bytes moved = read + write of every 16-byte amplitude (common practice for a streaming
        // kernel): 2 * 16 * 2^20 = 33554432 bytes; in 1 ms that is 33554432 / 1e6 GB/s exactly.
        assertEquals(33_554_432L, ReportRow.bytesMoved(20));
        assertEquals(16L << 26, ReportRow.stateBytes(26));
        assertEquals(33.554432, ReportRow.gigabytesPerSecond(20, 1_000_000.0), 0.0);
        // The probe over 2^(n+1) doubles copies exactly the bytes a gate moves (McCalpin 1995:
        // copy counts 2 * 8 bytes per element).
        assertEquals(ReportRow.bytesMoved(20), BandwidthProbe.copyBytes(2L << 20));
        // Single precision: a float is 4 bytes and a double 8 (IEEE 754-2019, sec. 3.6, binary32
        // and binary64), so a complex amplitude is 8 bytes instead of 16 and a gate moves
        // 2 * 8 * 2^20 = 16777216 bytes, half the double count (common practice, as above).
        assertEquals(16_777_216L, ReportRow.bytesMoved(20, Precision.SINGLE));
        assertEquals(ReportRow.bytesMoved(20), ReportRow.bytesMoved(20, Precision.DOUBLE));
        assertEquals(8L << 31, ReportRow.stateBytes(31, Precision.SINGLE.bytesPerAmplitude()));
        assertEquals(16.777216, ReportRow.gigabytesPerSecond(20, Precision.SINGLE,
            1_000_000.0), 0.0);
    }

    @Test
    void rowFormat() {
        // 1e6 ns / 2^20 = 0.95367431640625 ns per amplitude; 33.554432 GB/s (see above);
        // 33.554432 / 40 = 0.8388608 of copy.
        assertEquals("20,dense,mid,2,1000000.0,0.95367,33.554,40.000,30.000,0.839,double,"
            + "1000000.0",
            CsvOutput.line(new ReportRow(20, "dense", "mid", 2, 1_000_000.0, 40.0, 30.0)));
        // 512 B / 80 ns = 6.4 GB/s; 6.4 / 3.2 = 2.
        assertEquals("4,circuit-fused,all,1,80.0,5.00000,6.400,3.200,1.000,2.000,double,80.0",
            CsvOutput.line(new ReportRow(4, "circuit-fused", "all", 1, 80.0, 3.2, 1.0)));
        // A frame gate of 0.5 ns whose settling read took 1e6 ns: the bandwidth is the read's,
        // 2 * 16 * 2^20 B / 1e6 ns = 33.554432 GB/s as above, not 2e6 times that.
        assertEquals("20,diagonal,mid,2,0.5,0.00000,33.554,40.000,30.000,0.839,double,"
            + "1000000.0", CsvOutput.line(new ReportRow(20, "diagonal", "mid", 2, 0.5, 40.0,
            30.0).withPass(1_000_000.0)));
        // Single precision, 8 bytes per amplitude (IEEE 754-2019, sec. 3.6: two 4-byte floats):
        // 2 * 8 * 2^20 B / 1e6 ns = 16.777216 GB/s, half the double figure above; 16.777216 / 40
        // = 0.4194304 of copy. Time per gate and per amplitude are as measured.
        assertEquals("20,dense,mid,2,1000000.0,0.95367,16.777,40.000,30.000,0.419,single,"
            + "1000000.0",
            CsvOutput.line(new ReportRow(20, "dense", "mid", 2, 1_000_000.0, 40.0, 30.0,
                Precision.SINGLE)));
    }
}
