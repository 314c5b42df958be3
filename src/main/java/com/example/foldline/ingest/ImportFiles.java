package com.example.foldline.ingest;

import java.io.IOException;
import java.io.InputStream;
import java.nio.channels.Channels;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.UUID;

import org.springframework.stereotype.Component;

import com.example.foldline.system.BadRequestException;

/**
 * Where import files live: uploaded files are spooled under {@code foldline.imports.spool-dir} (next to the rejection
 * files), and a server path is accepted only inside {@code foldline.imports.allowed-dir}, after normalising it and
 * resolving symbolic links, so neither {@code ../} nor a link can reach outside it.
 */
@Component
class ImportFiles {

    private final ImportProperties properties;

    ImportFiles(ImportProperties properties) {
        this.properties = properties;
    }

    /** A new file in the spool directory for an upload. */
    Path newSpoolFile(String extension) throws IOException {
        Path dir = spoolDir();
        return dir.resolve("upload-" + UUID.randomUUID() + extension);
    }

    /** The job's rejection file (it may not exist yet). */
    Path rejectionFile(long jobId) throws IOException {
        return spoolDir().resolve("job-" + jobId + "-rejections.ndjson");
    }

    private Path spoolDir() throws IOException {
        Path dir = properties.spoolDir().toAbsolutePath().normalize();
        Files.createDirectories(dir);
        return dir;
    }

    /**
     * The file a client named, if it lies inside the allowed directory. A relative path is read against that
     * directory. Refused (400, field {@code path}) when the option is off, the path leaves the directory, or it is
     * not a readable regular file.
     */
    Path allowedFile(String requested) {
        if (properties.allowedDir().isEmpty()) {
            throw new BadRequestException("path", "reading files on the server is switched off; an administrator "
                    + "can allow one directory with foldline.imports.allowed-dir, or upload the file instead");
        }
        if (requested == null || requested.isBlank()) {
            throw new BadRequestException("path", "is required");
        }
        if (requested.indexOf('\0') >= 0) {
            throw new BadRequestException("path", "must not contain NUL characters");
        }
        Path allowed = Path.of(properties.allowedDir()).toAbsolutePath().normalize();
        Path file;
        try {
            file = allowed.resolve(requested).normalize();
        } catch (RuntimeException e) {
            throw new BadRequestException("path", "is not a valid path");
        }
        if (!file.startsWith(allowed) || file.equals(allowed)) {
            throw new BadRequestException("path", "must name a file inside the directory allowed for imports");
        }
        Path real;
        Path realAllowed;
        try {
            realAllowed = allowed.toRealPath();
            real = file.toRealPath();
        } catch (IOException e) {
            throw new BadRequestException("path", "no such file in the directory allowed for imports");
        }
        if (!real.startsWith(realAllowed)) {
            throw new BadRequestException("path", "must name a file inside the directory allowed for imports");
        }
        if (!Files.isRegularFile(real, LinkOption.NOFOLLOW_LINKS) || !Files.isReadable(real)) {
            throw new BadRequestException("path", "is not a readable regular file");
        }
        return real;
    }

    /** Opens a file for reading from {@code offset} (a seek, not a read). */
    InputStream open(Path file, long offset) throws IOException {
        FileChannel channel = FileChannel.open(file, StandardOpenOption.READ);
        try {
            channel.position(offset);
        } catch (IOException | RuntimeException e) {
            channel.close();
            throw e;
        }
        return Channels.newInputStream(channel);
    }
}
