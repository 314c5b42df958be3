package com.example.foldline.system;

import java.util.List;

import org.springframework.http.HttpStatus;
import org.springframework.http.ProblemDetail;
import org.springframework.web.bind.MethodArgumentNotValidException;
import org.springframework.web.bind.annotation.ExceptionHandler;
import org.springframework.web.bind.annotation.RestControllerAdvice;
import org.springframework.web.method.annotation.MethodArgumentTypeMismatchException;

/**
 * Turns input errors into RFC 9457 problem details whose {@code errors} list names each field and the reason.
 */
@RestControllerAdvice
class ProblemHandler {

    @ExceptionHandler(BadRequestException.class)
    ProblemDetail badRequest(BadRequestException e) {
        return problem(HttpStatus.BAD_REQUEST, e.getMessage(), e.errors());
    }

    @ExceptionHandler(NotFoundException.class)
    ProblemDetail notFound(NotFoundException e) {
        return problem(HttpStatus.NOT_FOUND, e.getMessage(), List.of());
    }

    @ExceptionHandler(MethodArgumentNotValidException.class)
    ProblemDetail invalidBody(MethodArgumentNotValidException e) {
        List<FieldError> errors = e.getBindingResult().getFieldErrors().stream()
                .map(f -> new FieldError(f.getField(), f.getDefaultMessage()))
                .toList();
        return problem(HttpStatus.BAD_REQUEST, errors.isEmpty() ? "invalid request body"
                : errors.get(0).field() + ": " + errors.get(0).message(), errors);
    }

    @ExceptionHandler(MethodArgumentTypeMismatchException.class)
    ProblemDetail typeMismatch(MethodArgumentTypeMismatchException e) {
        String message = "malformed value '" + e.getValue() + "'";
        return problem(HttpStatus.BAD_REQUEST, e.getName() + ": " + message,
                List.of(new FieldError(e.getName(), message)));
    }

    static ProblemDetail problem(HttpStatus status, String detail, List<FieldError> errors) {
        ProblemDetail p = ProblemDetail.forStatusAndDetail(status, detail);
        if (!errors.isEmpty()) {
            p.setProperty("errors", errors);
        }
        return p;
    }
}
