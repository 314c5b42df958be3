package com.example.foldline.system;

/** Thrown when a named resource does not exist (or is not visible to the caller); rendered as 404. */
public class NotFoundException extends RuntimeException {

    public NotFoundException(String message) {
        super(message);
    }
}
