package com.example.foldline.accounts;

import java.util.List;

import org.springframework.http.HttpStatus;
import org.springframework.http.ResponseEntity;
import org.springframework.web.bind.annotation.DeleteMapping;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RequestMapping;
import org.springframework.web.bind.annotation.RestController;

import io.swagger.v3.oas.annotations.tags.Tag;

/** Users and teams, for global administrators. */
@RestController
@RequestMapping("/api/v1/admin")
@Tag(name = "Administration")
class AdminController {

    record NewUser(String username, String password, Boolean globalAdmin) {
    }

    record UserView(long id, String username, boolean globalAdmin, boolean enabled) {
    }

    record NewTeam(String name) {
    }

    record MemberRequest(String username) {
    }

    private final Accounts accounts;
    private final Teams teams;

    AdminController(Accounts accounts, Teams teams) {
        this.accounts = accounts;
        this.teams = teams;
    }

    @GetMapping("/users")
    List<UserView> users() {
        return accounts.all().stream().map(u -> new UserView(u.id(), u.username(), u.globalAdmin(), u.enabled()))
                .toList();
    }

    @PostMapping("/users")
    ResponseEntity<UserView> createUser(@RequestBody NewUser body) {
        UserAccount u = accounts.create(body.username(), body.password(), Boolean.TRUE.equals(body.globalAdmin()));
        return ResponseEntity.status(HttpStatus.CREATED)
                .body(new UserView(u.id(), u.username(), u.globalAdmin(), u.enabled()));
    }

    @DeleteMapping("/users/{username}")
    ResponseEntity<Void> disableUser(@PathVariable String username) {
        accounts.disable(username);
        return ResponseEntity.noContent().build();
    }

    @GetMapping("/teams")
    List<Teams.Team> teams() {
        return teams.all();
    }

    @PostMapping("/teams")
    ResponseEntity<Teams.Team> createTeam(@RequestBody NewTeam body) {
        return ResponseEntity.status(HttpStatus.CREATED).body(teams.create(body.name()));
    }

    @PostMapping("/teams/{teamId}/members")
    ResponseEntity<Void> addMember(@PathVariable long teamId, @RequestBody MemberRequest body) {
        teams.addMember(teamId, body.username());
        return ResponseEntity.noContent().build();
    }

    @DeleteMapping("/teams/{teamId}/members/{username}")
    ResponseEntity<Void> removeMember(@PathVariable long teamId, @PathVariable String username) {
        teams.removeMember(teamId, username);
        return ResponseEntity.noContent().build();
    }
}
