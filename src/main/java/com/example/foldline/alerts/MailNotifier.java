package com.example.foldline.alerts;

import org.springframework.beans.factory.ObjectProvider;
import org.springframework.mail.MailException;
import org.springframework.mail.SimpleMailMessage;
import org.springframework.mail.javamail.JavaMailSender;
import org.springframework.stereotype.Component;

/**
 * Sends alert e-mails through Spring's mail support. Spring Boot creates the sender only when spring.mail.host is
 * set; without it no e-mail deliveries are created at all.
 */
@Component
class MailNotifier {

    private final ObjectProvider<JavaMailSender> sender;
    private final String from;

    MailNotifier(ObjectProvider<JavaMailSender> sender, AlertProperties properties) {
        this.sender = sender;
        this.from = properties.mail().from();
    }

    boolean available() {
        return sender.getIfAvailable() != null;
    }

    DeliveryAttempt send(String to, String subject, String text) {
        long started = System.nanoTime();
        JavaMailSender mail = sender.getIfAvailable();
        if (mail == null) {
            return new DeliveryAttempt(DeliveryAttempt.REFUSED, null, "e-mail is not configured (spring.mail.host)", 0);
        }
        SimpleMailMessage message = new SimpleMailMessage();
        message.setFrom(from);
        message.setTo(to);
        message.setSubject(subject);
        message.setText(text);
        try {
            mail.send(message);
            return new DeliveryAttempt(DeliveryAttempt.OK, null, null, (System.nanoTime() - started) / 1_000_000);
        } catch (MailException e) {
            return new DeliveryAttempt(DeliveryAttempt.ERROR, null, e.getClass().getSimpleName() + ": "
                    + e.getMessage(), (System.nanoTime() - started) / 1_000_000);
        }
    }
}
