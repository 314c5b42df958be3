package com.example.foldline.accounts;

import java.time.Instant;

/** A local user account; the password is kept only as an adaptive hash (bcrypt by default). */
public record UserAccount(long id, String username, String passwordHash, boolean globalAdmin, boolean enabled,
                          Instant createdAt) {
}
