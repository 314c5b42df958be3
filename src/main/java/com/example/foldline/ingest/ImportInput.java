package com.example.foldline.ingest;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Reads an import file record by record (NDJSON lines or RFC 4180 CSV records) while knowing the exact byte offset
 * after the last record and the physical line it started on, so a job can commit and later resume at a record
 * boundary. Holds one buffer and one record, never the file; a record longer than {@code maxRecordBytes} is skipped
 * and reported as too long.
 */
final class ImportInput {

    /** One NDJSON line or CSV record: its first physical line, and its text or fields (null when too long). */
    record Line(long number, byte[] bytes, int length, boolean tooLong) {
    }

    /** One CSV record: its first physical line and its fields; {@code problem} is set for a malformed record. */
    record CsvRecord(long number, List<String> fields, String problem) {
    }

    /** More fields than this in one CSV record make it malformed (and the rest are not kept). */
    static final int MAX_FIELDS = 1000;

    private final InputStream in;
    private final int maxRecordBytes;
    private final byte[] buffer = new byte[64 * 1024];
    private int bufferLength;
    private int bufferPos;
    private long position;
    private long line;
    private byte[] record = new byte[4096];

    /**
     * @param in        the file, already positioned at {@code position}
     * @param position  byte offset of {@code in} in the file
     * @param linesRead physical lines before {@code position}
     */
    ImportInput(InputStream in, long position, long linesRead, int maxRecordBytes) {
        this.in = in;
        this.position = position;
        this.line = linesRead;
        this.maxRecordBytes = maxRecordBytes;
    }

    /** Byte offset just after the last record returned. */
    long position() {
        return position;
    }

    /** Physical lines consumed so far. */
    long linesRead() {
        return line;
    }

    /** Skips a UTF-8 byte-order mark at the very start of the file (spreadsheet exports write one). */
    void skipByteOrderMark() throws IOException {
        if (position != 0 || !fill()) {
            return;
        }
        if (bufferLength - bufferPos >= 3 && (buffer[bufferPos] & 0xFF) == 0xEF && (buffer[bufferPos + 1] & 0xFF) == 0xBB
                && (buffer[bufferPos + 2] & 0xFF) == 0xBF) {
            bufferPos += 3;
            position += 3;
        }
    }

    /** The next line without its line break (a trailing CR is dropped), or null at the end of the file. */
    Line nextLine() throws IOException {
        int length = 0;
        boolean tooLong = false;
        boolean any = false;
        while (true) {
            int b = read();
            if (b < 0) {
                if (!any) {
                    return null;
                }
                break;
            }
            any = true;
            if (b == '\n') {
                break;
            }
            if (length < maxRecordBytes) {
                append(length++, (byte) b);
            } else {
                tooLong = true;
            }
        }
        line++;
        if (length > 0 && record[length - 1] == '\r') {
            length--;
        }
        return new Line(line, tooLong ? null : record, tooLong ? 0 : length, tooLong);
    }

    /**
     * The next CSV record (RFC 4180: fields separated by {@code delimiter}, optionally in double quotes, where a
     * doubled quote stands for one and line breaks may occur), or null at the end of the file.
     */
    CsvRecord nextCsv(char delimiter) throws IOException {
        long first = line + 1;
        List<String> fields = new ArrayList<>();
        int length = 0;
        boolean quoted = false;
        boolean fieldWasQuoted = false;
        boolean any = false;
        boolean tooLong = false;
        String problem = null;
        while (true) {
            int b = read();
            if (b < 0) {
                if (!any) {
                    return null;
                }
                if (quoted) {
                    problem = "a quoted field is not closed before the end of the file";
                }
                break;
            }
            any = true;
            if (quoted) {
                if (b == '"') {
                    int next = peek();
                    if (next == '"') {
                        read();
                    } else {
                        quoted = false;
                        continue;
                    }
                } else if (b == '\n') {
                    line++;
                }
            } else if (b == '"') {
                if (length == 0 && !fieldWasQuoted) {
                    quoted = true;
                    fieldWasQuoted = true;
                    continue;
                }
                if (problem == null) {
                    problem = "a quote inside an unquoted field (quote the whole field and double the quote)";
                }
            } else if (b == delimiter) {
                if (fields.size() < MAX_FIELDS) {
                    fields.add(tooLong ? "" : new String(record, 0, length, StandardCharsets.UTF_8));
                } else if (problem == null) {
                    problem = "more than " + MAX_FIELDS + " fields";
                }
                length = 0;
                fieldWasQuoted = false;
                continue;
            } else if (b == '\n') {
                break;
            } else if (b == '\r' && peek() == '\n') {
                continue;
            }
            if (length < maxRecordBytes) {
                append(length++, (byte) b);
            } else {
                tooLong = true;
            }
        }
        line++;
        fields.add(tooLong ? "" : new String(record, 0, length, StandardCharsets.UTF_8));
        if (tooLong && problem == null) {
            problem = "a field is longer than " + maxRecordBytes + " bytes";
        }
        return new CsvRecord(first, fields, problem);
    }

    private void append(int at, byte b) {
        if (at == record.length) {
            record = Arrays.copyOf(record, Math.min(Math.max(record.length * 2, 16), maxRecordBytes + 1));
        }
        record[at] = b;
    }

    private int read() throws IOException {
        if (!fill()) {
            return -1;
        }
        position++;
        return buffer[bufferPos++] & 0xFF;
    }

    private int peek() throws IOException {
        return fill() ? buffer[bufferPos] & 0xFF : -1;
    }

    private boolean fill() throws IOException {
        while (bufferPos == bufferLength) {
            int n = in.read(buffer, 0, buffer.length);
            if (n < 0) {
                return false;
            }
            bufferPos = 0;
            bufferLength = n;
        }
        return true;
    }
}
