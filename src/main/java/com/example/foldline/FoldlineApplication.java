package com.example.foldline;

import java.util.Arrays;

import org.springframework.boot.SpringApplication;
import org.springframework.boot.WebApplicationType;
import org.springframework.boot.autoconfigure.SpringBootApplication;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.boot.context.properties.ConfigurationPropertiesScan;
import org.springframework.context.ConfigurableApplicationContext;
import org.springframework.scheduling.annotation.EnableScheduling;

import com.example.foldline.demo.DemoCommand;
import com.example.foldline.metrics.FitCommand;

/**
 * Foldline: ad density against reader experience, for publishers' editorial and revenue teams.
 * Without arguments it serves the dashboard; {@code fit …} runs a segmented fit on a CSV file and {@code demo …}
 * re-creates the demo publisher at any scale (README.md, docs/operations.md).
 */
@SpringBootApplication
@ConfigurationPropertiesScan
@EnableScheduling
public class FoldlineApplication {

    public static void main(String[] args) {
        if (args.length > 0 && args[0].equals("fit")) {
            System.exit(FitCommand.run(Arrays.copyOfRange(args, 1, args.length), System.out, System.err));
        }
        if (args.length > 0 && args[0].equals("demo")) {
            String[] rest = Arrays.copyOfRange(args, 1, args.length);
            int status;
            try (ConfigurableApplicationContext context = new SpringApplicationBuilder(FoldlineApplication.class)
                    .web(WebApplicationType.NONE)
                    .run("--foldline.demo.enabled=false", "--foldline.sessions.enabled=false")) {
                status = context.getBean(DemoCommand.class).run(rest, System.out, System.err);
            }
            System.exit(status);
        }
        SpringApplication.run(FoldlineApplication.class, args);
    }
}
