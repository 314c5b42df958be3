package com.example.foldline.ingest;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;

import org.junit.jupiter.api.Test;

/**
 * Issue #8: the import reader's records, line numbers and byte offsets. CSV rules from RFC 4180 (Shafranovich, 2005,
 * "Common Format and MIME Type for Comma-Separated Values (CSV) Files", DOI 10.17487/RFC4180).
 */
class ImportInputTests {

    static ImportInput input(String text, int maxRecordBytes) {
        byte[] bytes = text.getBytes(StandardCharsets.UTF_8);
        return new ImportInput(new ByteArrayInputStream(bytes), 0, 0, maxRecordBytes);
    }

    static List<ImportInput.CsvRecord> csv(String text) throws IOException {
        ImportInput in = input(text, 1024);
        in.skipByteOrderMark();
        List<ImportInput.CsvRecord> records = new ArrayList<>();
        ImportInput.CsvRecord r;
        while ((r = in.nextCsv(',')) != null) {
            records.add(r);
        }
        return records;
    }

    @Test
    void csvFieldsFollowRfc4180() throws IOException {
        List<ImportInput.CsvRecord> r = csv("\uFEFFa,b,c\r\n\"x, y\",\"say \"\"hi\"\"\",\"two\nlines\"\r\n1,,3\nlast,é,\"\"");
        assertThat(r).hasSize(4);
        assertThat(r.get(0).fields()).containsExactly("a", "b", "c");
        assertThat(r.get(1).fields()).containsExactly("x, y", "say \"hi\"", "two\nlines");
        assertThat(r.get(2).fields()).containsExactly("1", "", "3");
        assertThat(r.get(3).fields()).containsExactly("last", "é", "");
        // a record starts on the physical line of its first character; a quoted line break moves the next one down
        assertThat(r.stream().map(ImportInput.CsvRecord::number)).containsExactly(1L, 2L, 4L, 5L);
        assertThat(r).allSatisfy(x -> assertThat(x.problem()).isNull());
    }

    @Test
    void malformedCsvIsReportedNotGuessed() throws IOException {
        assertThat(csv("a,b\"c\n").get(0).problem()).contains("quote inside an unquoted field");
        assertThat(csv("a,\"open\n").get(0).problem()).contains("not closed");
    }

    @Test
    void offsetsLetAReaderResumeAtARecordBoundary() throws IOException {
        String text = "{\"a\":1}\r\n\n{\"b\":2}\n{\"c\":3}";
        ImportInput in = input(text, 1024);
        assertThat(new String(in.nextLine().bytes(), 0, 7, StandardCharsets.UTF_8)).isEqualTo("{\"a\":1}");
        in.nextLine();
        ImportInput.Line b = in.nextLine();
        assertThat(b.number()).isEqualTo(3);
        assertThat(b.length()).isEqualTo(7);
        long offset = in.position();
        assertThat(offset).isEqualTo("{\"a\":1}\r\n\n{\"b\":2}\n".length());

        byte[] bytes = text.getBytes(StandardCharsets.UTF_8);
        ImportInput resumed = new ImportInput(new ByteArrayInputStream(bytes, (int) offset, bytes.length - (int) offset),
                offset, in.linesRead(), 1024);
        ImportInput.Line c = resumed.nextLine();
        assertThat(c.number()).isEqualTo(4);
        assertThat(new String(c.bytes(), 0, c.length(), StandardCharsets.UTF_8)).isEqualTo("{\"c\":3}");
        assertThat(resumed.nextLine()).isNull();
        assertThat(resumed.position()).isEqualTo(bytes.length);
    }

    @Test
    void aTooLongLineIsSkippedWithoutHoldingIt() throws IOException {
        ImportInput in = input("x".repeat(5000) + "\nok\n", 1024);
        ImportInput.Line first = in.nextLine();
        assertThat(first.tooLong()).isTrue();
        ImportInput.Line second = in.nextLine();
        assertThat(second.number()).isEqualTo(2);
        assertThat(new String(second.bytes(), 0, second.length(), StandardCharsets.UTF_8)).isEqualTo("ok");
    }
}
