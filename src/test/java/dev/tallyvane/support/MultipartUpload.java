package dev.tallyvane.support;

import java.io.ByteArrayOutputStream;
import java.net.URI;
import java.net.http.HttpRequest;
import java.nio.charset.StandardCharsets;

/** A POST of one CSV file as the upload form sends it (multipart, field "file"), for tests on a real server. */
public final class MultipartUpload {

    private MultipartUpload() {
    }

    /** The request to {@code uri} with the page's CSRF token in the header the upload script uses. */
    public static HttpRequest of(URI uri, String csrf, String fileName, byte[] content) {
        String boundary = "----tallyvane" + System.nanoTime();
        ByteArrayOutputStream body = new ByteArrayOutputStream();
        body.writeBytes(("--" + boundary + "\r\nContent-Disposition: form-data; name=\"file\"; filename=\"" + fileName
                + "\"\r\nContent-Type: text/csv\r\n\r\n").getBytes(StandardCharsets.UTF_8));
        body.writeBytes(content);
        body.writeBytes(("\r\n--" + boundary + "--\r\n").getBytes(StandardCharsets.UTF_8));
        return HttpRequest.newBuilder(uri).header("X-CSRF-TOKEN", csrf)
                .header("Content-Type", "multipart/form-data; boundary=" + boundary)
                .POST(HttpRequest.BodyPublishers.ofByteArray(body.toByteArray())).build();
    }
}
