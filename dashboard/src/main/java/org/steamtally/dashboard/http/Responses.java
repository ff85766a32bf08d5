package org.steamtally.dashboard.http;

import io.vertx.core.json.JsonArray;
import io.vertx.core.json.JsonObject;
import io.vertx.ext.web.RoutingContext;

/** JSON responses: one encoding, one set of headers, one error shape. */
public final class Responses {

    static final String JSON = "application/json; charset=utf-8";

    private Responses() {
    }

    /**
     * JSON text with {@code <}, {@code >} and {@code &} written as {@code \u003c}, {@code \u003e} and
     * {@code \u0026}. In valid JSON these characters occur only inside strings, where the escapes
     * mean the same, so a tag named {@code <script>} reads back unchanged but can never be taken for
     * markup by a browser that sniffs or a page that pastes the text.
     */
    public static String safe(String json) {
        StringBuilder out = null;
        for (int i = 0; i < json.length(); i++) {
            char c = json.charAt(i);
            String esc = switch (c) {
                case '<' -> "\\u003c";
                case '>' -> "\\u003e";
                case '&' -> "\\u0026";
                default -> null;
            };
            if (esc != null) {
                if (out == null) {
                    out = new StringBuilder(json.length() + 16).append(json, 0, i);
                }
                out.append(esc);
            } else if (out != null) {
                out.append(c);
            }
        }
        return out == null ? json : out.toString();
    }

    static void json(RoutingContext ctx, int status, String encodedJson) {
        ctx.response().setStatusCode(status).putHeader("Content-Type", JSON).end(safe(encodedJson));
    }

    static void json(RoutingContext ctx, JsonObject body) {
        json(ctx, 200, body.encode());
    }

    static void json(RoutingContext ctx, JsonArray body) {
        json(ctx, 200, body.encode());
    }

    /** The error body: {@code {"status": 404, "error": "Not Found", "message": "..."}}. */
    static void error(RoutingContext ctx, int status, String message) {
        if (ctx.response().headWritten()) {
            ctx.response().reset();
            return;
        }
        json(ctx, status, new JsonObject().put("status", status).put("error", reason(status))
                .put("message", message).encode());
    }

    private static String reason(int status) {
        return switch (status) {
            case 400 -> "Bad Request";
            case 401 -> "Unauthorized";
            case 403 -> "Forbidden";
            case 404 -> "Not Found";
            case 405 -> "Method Not Allowed";
            case 409 -> "Conflict";
            case 413 -> "Payload Too Large";
            case 415 -> "Unsupported Media Type";
            case 429 -> "Too Many Requests";
            case 501 -> "Not Implemented";
            case 503 -> "Service Unavailable";
            default -> status >= 500 ? "Internal Server Error" : "Error";
        };
    }
}
