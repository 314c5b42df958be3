package com.example.foldline.accounts;

import java.util.List;
import java.util.Optional;

import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.stereotype.Repository;

/** Site roles of users and teams, and team membership. */
@Repository
class AccessRepository {

    private final JdbcClient jdbc;

    AccessRepository(JdbcClient jdbc) {
        this.jdbc = jdbc;
    }

    /** Roles a user holds on a site, directly or through teams. */
    List<String> rolesOf(long userId, long siteId) {
        return jdbc.sql("""
                        SELECT site_role FROM site_role WHERE site_id = :site AND principal_type = 'user'
                           AND principal_id = :user
                        UNION ALL
                        SELECT r.site_role FROM site_role r JOIN team_member m ON m.team_id = r.principal_id
                         WHERE r.site_id = :site AND r.principal_type = 'team' AND m.user_id = :user""")
                .param("site", siteId).param("user", userId).query(String.class).list();
    }

    /** (site, role) pairs of a user, direct and through teams. */
    List<SiteAccess.Grant> grantsOf(long userId) {
        return jdbc.sql("""
                        SELECT site_id, site_role FROM site_role WHERE principal_type = 'user' AND principal_id = :user
                        UNION ALL
                        SELECT r.site_id, r.site_role FROM site_role r JOIN team_member m ON m.team_id = r.principal_id
                         WHERE r.principal_type = 'team' AND m.user_id = :user""")
                .param("user", userId)
                .query((rs, i) -> new SiteAccess.Grant(rs.getLong(1), SiteRole.parse(rs.getString(2)).orElseThrow()))
                .list();
    }

    void grant(long siteId, String type, long principalId, SiteRole role) {
        jdbc.sql("DELETE FROM site_role WHERE site_id = :site AND principal_type = :type AND principal_id = :id")
                .param("site", siteId).param("type", type).param("id", principalId).update();
        jdbc.sql("""
                        INSERT INTO site_role (site_id, principal_type, principal_id, site_role)
                        VALUES (:site, :type, :id, :role)""")
                .param("site", siteId).param("type", type).param("id", principalId).param("role", role.apiName())
                .update();
    }

    boolean revoke(long siteId, String type, long principalId) {
        return jdbc.sql("DELETE FROM site_role WHERE site_id = :site AND principal_type = :type AND principal_id = :id")
                .param("site", siteId).param("type", type).param("id", principalId).update() > 0;
    }

    List<SiteAccess.Member> members(long siteId) {
        return jdbc.sql("""
                        SELECT r.principal_type, r.principal_id, COALESCE(u.username, t.name) AS name, r.site_role
                        FROM site_role r
                        LEFT JOIN app_user u ON r.principal_type = 'user' AND u.id = r.principal_id
                        LEFT JOIN team t ON r.principal_type = 'team' AND t.id = r.principal_id
                        WHERE r.site_id = :site ORDER BY r.principal_type, name""")
                .param("site", siteId)
                .query((rs, i) -> new SiteAccess.Member(rs.getString(1), rs.getLong(2), rs.getString(3),
                        rs.getString(4)))
                .list();
    }

    Optional<Long> teamId(String name) {
        return jdbc.sql("SELECT id FROM team WHERE name = :name").param("name", name).query(Long.class).optional();
    }

    long createTeam(String name) {
        jdbc.sql("INSERT INTO team (name) VALUES (:name)").param("name", name).update();
        return teamId(name).orElseThrow();
    }

    List<Teams.Team> teams() {
        return jdbc.sql("SELECT id, name FROM team ORDER BY name")
                .query((rs, i) -> new Teams.Team(rs.getLong(1), rs.getString(2), teamMembers(rs.getLong(1)))).list();
    }

    private List<String> teamMembers(long teamId) {
        return jdbc.sql("""
                        SELECT u.username FROM team_member m JOIN app_user u ON u.id = m.user_id
                        WHERE m.team_id = :team ORDER BY u.username""")
                .param("team", teamId).query(String.class).list();
    }

    void addMember(long teamId, long userId) {
        jdbc.sql("DELETE FROM team_member WHERE team_id = :team AND user_id = :user")
                .param("team", teamId).param("user", userId).update();
        jdbc.sql("INSERT INTO team_member (team_id, user_id) VALUES (:team, :user)")
                .param("team", teamId).param("user", userId).update();
    }

    boolean removeMember(long teamId, long userId) {
        return jdbc.sql("DELETE FROM team_member WHERE team_id = :team AND user_id = :user")
                .param("team", teamId).param("user", userId).update() > 0;
    }

    boolean teamExists(long teamId) {
        return jdbc.sql("SELECT count(*) FROM team WHERE id = :id").param("id", teamId).query(Long.class).single() > 0;
    }
}
