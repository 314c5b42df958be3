package com.example.foldline.ingest;

/** The request body passed the configured maximum while it was being read. */
class BodyTooLargeException extends RuntimeException {

    BodyTooLargeException(long limit) {
        super("request body is larger than the maximum of " + limit + " bytes", null, false, false);
    }
}
