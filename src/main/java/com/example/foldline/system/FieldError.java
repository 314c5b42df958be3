package com.example.foldline.system;

/** One problem with one input field: which field, and why it was refused. */
public record FieldError(String field, String message) {
}
