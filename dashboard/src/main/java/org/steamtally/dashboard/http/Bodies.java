package org.steamtally.dashboard.http;

import io.vertx.core.json.DecodeException;
import io.vertx.core.json.JsonObject;
import io.vertx.ext.web.RoutingContext;

/** Reading request bodies with errors that name the field and what was expected. */
final class Bodies {

    private Bodies() {
    }

    static JsonObject object(RoutingContext ctx) {
        try {
            JsonObject o = ctx.body().asJsonObject();
            if (o == null) {
                throw ApiException.badRequest("the request needs a JSON object body");
            }
            return o;
        } catch (DecodeException | ClassCastException e) {
            throw ApiException.badRequest("the request body is not a JSON object");
        }
    }

    static String requiredString(JsonObject body, String field, int maxLength) {
        Object v = body.getValue(field);
        if (!(v instanceof String s) || s.isBlank()) {
            throw ApiException.badRequest("field '" + field + "' must be a non-empty string");
        }
        if (s.length() > maxLength) {
            throw ApiException.badRequest("field '" + field + "' must be at most " + maxLength + " characters, was "
                    + s.length());
        }
        return s;
    }

    static double requiredNumber(JsonObject body, String field) {
        Object v = body.getValue(field);
        if (!(v instanceof Number n) || !Double.isFinite(n.doubleValue())) {
            throw ApiException.badRequest("field '" + field + "' must be a number, was "
                    + (v == null ? "missing" : "'" + v + "'"));
        }
        return n.doubleValue();
    }
}
