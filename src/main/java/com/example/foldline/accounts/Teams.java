package com.example.foldline.accounts;

import java.util.List;

import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.NotFoundException;

/** Teams of users; a team can hold roles on sites. Managed by global administrators. */
@Service
public class Teams {

    /** A team and its members' user names. */
    public record Team(long id, String name, List<String> members) {
    }

    private final AccessRepository repository;
    private final UserRepository users;

    Teams(AccessRepository repository, UserRepository users) {
        this.repository = repository;
        this.users = users;
    }

    @Transactional
    public Team create(String name) {
        if (name == null || name.isBlank() || name.length() > 100) {
            throw new BadRequestException("name", "must be 1 to 100 characters");
        }
        if (repository.teamId(name.strip()).isPresent()) {
            throw new BadRequestException("name", "a team '" + name.strip() + "' exists already");
        }
        long id = repository.createTeam(name.strip());
        return new Team(id, name.strip(), List.of());
    }

    public List<Team> all() {
        return repository.teams();
    }

    @Transactional
    public void addMember(long teamId, String username) {
        requireTeam(teamId);
        UserAccount user = users.findByUsername(username)
                .orElseThrow(() -> new BadRequestException("username", "no user '" + username + "'"));
        repository.addMember(teamId, user.id());
    }

    @Transactional
    public void removeMember(long teamId, String username) {
        requireTeam(teamId);
        UserAccount user = users.findByUsername(username)
                .orElseThrow(() -> new NotFoundException("no user '" + username + "'"));
        if (!repository.removeMember(teamId, user.id())) {
            throw new NotFoundException("'" + username + "' is not in team " + teamId);
        }
    }

    private void requireTeam(long teamId) {
        if (!repository.teamExists(teamId)) {
            throw new NotFoundException("no team " + teamId);
        }
    }
}
