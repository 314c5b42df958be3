package com.example.foldline.alerts;

import java.io.IOException;
import java.net.ServerSocket;

import com.icegreen.greenmail.util.GreenMail;
import com.icegreen.greenmail.util.ServerSetup;

/** One in-process SMTP server (GreenMail) on a free loopback port for the alert tests of this JVM. */
final class AlertMailServer {

    private static GreenMail server;

    private AlertMailServer() {
    }

    static synchronized GreenMail get() {
        if (server == null) {
            int port;
            try (ServerSocket s = new ServerSocket(0)) {
                port = s.getLocalPort();
            } catch (IOException e) {
                throw new IllegalStateException("no free port for the test SMTP server", e);
            }
            server = new GreenMail(new ServerSetup(port, "127.0.0.1", ServerSetup.PROTOCOL_SMTP));
            server.start();
            Runtime.getRuntime().addShutdownHook(new Thread(server::stop));
        }
        return server;
    }
}
