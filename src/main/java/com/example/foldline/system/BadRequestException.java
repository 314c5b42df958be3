package com.example.foldline.system;

import java.util.List;

/** Thrown by controllers and services when request input is invalid; rendered as a 400 problem detail. */
public class BadRequestException extends RuntimeException {

    private final List<FieldError> errors;

    public BadRequestException(String field, String message) {
        this(List.of(new FieldError(field, message)));
    }

    public BadRequestException(List<FieldError> errors) {
        super(errors.isEmpty() ? "invalid request" : errors.get(0).field() + ": " + errors.get(0).message());
        this.errors = List.copyOf(errors);
    }

    public List<FieldError> errors() {
        return errors;
    }
}
