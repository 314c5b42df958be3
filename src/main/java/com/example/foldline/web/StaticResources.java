package com.example.foldline.web;

import java.io.IOException;
import java.nio.charset.StandardCharsets;

import org.springframework.context.annotation.Configuration;
import org.springframework.core.io.Resource;
import org.springframework.http.CacheControl;
import org.springframework.web.servlet.config.annotation.ResourceHandlerRegistry;
import org.springframework.web.servlet.config.annotation.WebMvcConfigurer;
import org.springframework.web.servlet.resource.ResourceTransformer;
import org.springframework.web.servlet.resource.ResourceTransformerChain;
import org.springframework.web.servlet.resource.TransformedResource;

import jakarta.servlet.http.HttpServletRequest;

/**
 * Serves the browser UI's modules and style sheets and the site tag through {@link Minifier}, once per file (the
 * resource chain caches the result), so the browser downloads them without comments and indentation. The files in
 * {@code frontend/} stay as written. Browsers revalidate on every load ({@code no-cache} with the resource's
 * last-modified time), so a new release is picked up at once.
 */
@Configuration(proxyBeanMethods = false)
class StaticResources implements WebMvcConfigurer {

    @Override
    public void addResourceHandlers(ResourceHandlerRegistry registry) {
        minified(registry, "/js/**", "classpath:/static/js/");
        minified(registry, "/css/**", "classpath:/static/css/");
        minified(registry, "/tag.js", "classpath:/static/");
    }

    private static void minified(ResourceHandlerRegistry registry, String pattern, String location) {
        registry.addResourceHandler(pattern)
                .addResourceLocations(location)
                .setCacheControl(CacheControl.noCache())
                .resourceChain(true)
                .addTransformer(new Minifying());
    }

    /** The transformer: JavaScript and CSS are minified, anything else passes unchanged. */
    static final class Minifying implements ResourceTransformer {
        @Override
        public Resource transform(HttpServletRequest request, Resource resource, ResourceTransformerChain chain)
                throws IOException {
            Resource resolved = chain.transform(request, resource);
            String name = resolved.getFilename();
            if (name == null || !(name.endsWith(".js") || name.endsWith(".css"))) {
                return resolved;
            }
            String text = resolved.getContentAsString(StandardCharsets.UTF_8);
            String small = name.endsWith(".js") ? Minifier.js(text) : Minifier.css(text);
            return new TransformedResource(resolved, small.getBytes(StandardCharsets.UTF_8));
        }
    }
}
