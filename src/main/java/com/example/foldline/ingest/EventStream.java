package com.example.foldline.ingest;

import java.io.IOException;
import java.io.InputStream;
import java.util.Arrays;

import tools.jackson.core.JacksonException;
import tools.jackson.core.JsonParser;
import tools.jackson.core.JsonToken;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;

/**
 * Reads events one at a time from a request body, never holding the whole body: NDJSON line by line, or the
 * elements of a JSON array through a streaming parser.
 */
final class EventStream {

    /** Receives each event (or a parse failure) with its line or element number. */
    interface Sink {
        void event(long line, JsonNode node);

        void malformed(long line, String message);
    }

    private EventStream() {
    }

    static void ndjson(InputStream in, ObjectMapper mapper, Sink sink) throws IOException {
        byte[] buffer = new byte[64 * 1024];
        byte[] line = new byte[4096];
        int lineLength = 0;
        long lineNumber = 1;
        int n;
        while ((n = in.read(buffer)) > 0) {
            for (int i = 0; i < n; i++) {
                byte b = buffer[i];
                if (b == '\n') {
                    emit(line, lineLength, lineNumber++, mapper, sink);
                    lineLength = 0;
                } else {
                    if (lineLength == line.length) {
                        line = Arrays.copyOf(line, line.length * 2);
                    }
                    line[lineLength++] = b;
                }
            }
        }
        emit(line, lineLength, lineNumber, mapper, sink);
    }

    private static void emit(byte[] line, int length, long number, ObjectMapper mapper, Sink sink) {
        int start = 0;
        int end = length;
        while (start < end && isSpace(line[start])) {
            start++;
        }
        while (end > start && isSpace(line[end - 1])) {
            end--;
        }
        if (start == end) {
            return;
        }
        JsonNode node;
        try {
            node = mapper.readTree(line, start, end - start);
        } catch (JacksonException e) {
            sink.malformed(number, "malformed JSON: " + e.getOriginalMessage());
            return;
        }
        sink.event(number, node);
    }

    private static boolean isSpace(byte b) {
        return b == ' ' || b == '\t' || b == '\r';
    }

    static void jsonArray(InputStream in, ObjectMapper mapper, Sink sink) {
        long element = 0;
        try (JsonParser parser = mapper.createParser(in)) {
            JsonToken first = parser.nextToken();
            if (first != JsonToken.START_ARRAY) {
                sink.malformed(1, "a JSON body must be an array of events");
                return;
            }
            while (parser.nextToken() != JsonToken.END_ARRAY) {
                element++;
                JsonNode node = parser.readValueAsTree();
                sink.event(element, node);
            }
        } catch (JacksonException e) {
            sink.malformed(element + 1, "malformed JSON (the rest of the array was not read): "
                    + e.getOriginalMessage());
        }
    }
}
