package dev.pressmark.server;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import jakarta.servlet.http.HttpServletRequest;
import jakarta.servlet.http.HttpServletResponse;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import org.eclipse.jetty.http.HttpFields;
import org.eclipse.jetty.http.HttpHeader;
import org.eclipse.jetty.http.HttpStatus;
import org.eclipse.jetty.server.Request;
import org.eclipse.jetty.server.handler.ErrorHandler;

/**
 * Requests that Jetty refuses before they reach a route (a path with an encoded separator or
 * NUL, a malformed request line, headers too large) are answered as problem details too,
 * instead of Jetty's HTML error page. Only the status and Jetty's one-line reason go out.
 */
final class JettyProblems extends ErrorHandler {

    private final ObjectMapper json;

    JettyProblems(ObjectMapper json) {
        this.json = json;
        setShowStacks(false);
        setShowServlet(false);
    }

    /** Called for a request the parser could not read; there is no request to take a path from. */
    @Override
    public ByteBuffer badMessageError(int status, String reason, HttpFields.Mutable fields) {
        fields.put(HttpHeader.CONTENT_TYPE, Problems.CONTENT_TYPE);
        return ByteBuffer.wrap(body(status, reason, null));
    }

    @Override
    protected void generateAcceptableResponse(Request baseRequest, HttpServletRequest request, HttpServletResponse response, int code,
            String message) throws IOException {
        baseRequest.setHandled(true);
        response.setContentType(Problems.CONTENT_TYPE);
        response.getOutputStream().write(body(code, message, request.getRequestURI()));
    }

    private byte[] body(int status, String reason, String instance) {
        String title = HttpStatus.getMessage(status);
        ObjectNode body = json.createObjectNode()
                .put("type", Problems.TYPE_PREFIX + (status == 400 ? "bad-request" : "http-" + status))
                .put("title", title)
                .put("status", status)
                .put("detail", reason == null || reason.isBlank() ? title : "the request was refused: " + reason);
        if (instance != null) {
            body.put("instance", instance);
        }
        return body.toString().getBytes(StandardCharsets.UTF_8);
    }
}
