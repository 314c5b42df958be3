package com.example.foldline.accounts;

import java.time.Clock;
import java.util.List;
import java.util.Optional;

import org.springframework.security.crypto.password.PasswordEncoder;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

import com.example.foldline.system.BadRequestException;

/** The accounts module's API: creating and finding users. */
@Service
public class Accounts {

    private final UserRepository users;
    private final PasswordEncoder encoder;
    private final Clock clock;

    Accounts(UserRepository users, PasswordEncoder encoder, Clock clock) {
        this.users = users;
        this.encoder = encoder;
        this.clock = clock;
    }

    @Transactional
    public UserAccount create(String username, String password, boolean globalAdmin) {
        if (username == null || !username.matches("[A-Za-z0-9._@-]{2,100}")) {
            throw new BadRequestException("username", "must be 2 to 100 letters, digits or . _ @ -");
        }
        if (password == null || password.length() < 10) {
            throw new BadRequestException("password", "must have at least 10 characters");
        }
        if (users.findByUsername(username).isPresent()) {
            throw new BadRequestException("username", "'" + username + "' is already taken");
        }
        users.insert(username, encoder.encode(password), globalAdmin, clock.instant());
        return users.findByUsername(username).orElseThrow();
    }

    public Optional<UserAccount> find(String username) {
        return users.findByUsername(username);
    }

    public List<UserAccount> all() {
        return users.findAll();
    }

    /** Disables the account: it can no longer log in, and its API tokens stop working. */
    @Transactional
    public void disable(String username) {
        UserAccount user = users.findByUsername(username)
                .orElseThrow(() -> new com.example.foldline.system.NotFoundException("no user '" + username + "'"));
        users.setEnabled(user.id(), false);
    }

    @Transactional
    public void changePassword(String username, String current, String replacement) {
        UserAccount user = users.findByUsername(username).orElseThrow();
        if (current == null || !encoder.matches(current, user.passwordHash())) {
            throw new BadRequestException("currentPassword", "does not match");
        }
        if (replacement == null || replacement.length() < 10) {
            throw new BadRequestException("newPassword", "must have at least 10 characters");
        }
        users.updatePassword(user.id(), encoder.encode(replacement));
    }

    public boolean isEmpty() {
        return users.count() == 0;
    }
}
