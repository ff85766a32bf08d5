package org.steamtally.dashboard;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;

import java.util.List;
import java.util.UUID;
import java.util.concurrent.TimeUnit;
import org.influxdb.InfluxDB;
import org.influxdb.InfluxDBFactory;
import org.influxdb.dto.Query;
import org.influxdb.dto.QueryResult;
import org.junit.jupiter.api.Test;

/**
 * Checks that the InfluxDB server of the test run stores a point written in line protocol and gives
 * it back. This tests the service and the client library, not the dashboard's store itself.
 */
class InfluxDbSmokeTest {

  // Every database created by 1.x CREATE DATABASE gets this default retention policy.
  private static final String DEFAULT_RETENTION_POLICY = "autogen";

  private static final long TIMESTAMP_MS = 1_700_000_000_000L;
  private static final double PRESSURE_PA = 1.6e7;
  private static final double TEMPERATURE_K = 813.15;

  @Test
  void pointWrittenInLineProtocolIsReadBackWithTheSameFieldsAndTime() {
    String url = TestServices.influxUrl();
    // A database of its own keeps parallel or earlier runs on a shared server apart.
    String database = "steamtally_smoke_" + UUID.randomUUID().toString().replace('-', '_');

    try (InfluxDB influx = InfluxDBFactory.connect(url)) {
      assertNoError(influx.query(new Query("CREATE DATABASE \"" + database + "\"")));
      try {
        influx.write(
            database,
            DEFAULT_RETENTION_POLICY,
            InfluxDB.ConsistencyLevel.ONE,
            TimeUnit.MILLISECONDS,
            "turbine_inlet,unit=U1 pressure=" + PRESSURE_PA + ",temperature=" + TEMPERATURE_K
                + " " + TIMESTAMP_MS);

        QueryResult result =
            influx.query(
                new Query(
                    "SELECT \"pressure\", \"temperature\" FROM \"turbine_inlet\" WHERE \"unit\" = 'U1'",
                    database),
                TimeUnit.MILLISECONDS);

        assertNoError(result);
        List<QueryResult.Series> series = result.getResults().get(0).getSeries();
        assertEquals(1, series.size(), "series returned");
        assertEquals(List.of("time", "pressure", "temperature"), series.get(0).getColumns());
        assertEquals(1, series.get(0).getValues().size(), "points returned");
        List<Object> row = series.get(0).getValues().get(0);
        assertEquals(TIMESTAMP_MS, ((Number) row.get(0)).longValue(), "time in ms since the epoch");
        // Exact: the values travel as shortest decimal text both ways, which a double survives.
        assertEquals(PRESSURE_PA, ((Number) row.get(1)).doubleValue(), 0.0, "pressure in Pa");
        assertEquals(TEMPERATURE_K, ((Number) row.get(2)).doubleValue(), 0.0, "temperature in K");
      } finally {
        influx.query(new Query("DROP DATABASE \"" + database + "\""));
      }
    }
  }

  private static void assertNoError(QueryResult result) {
    assertNull(result.getError(), "query error");
    assertFalse(result.getResults().isEmpty(), "query returned no result");
    assertNull(result.getResults().get(0).getError(), "statement error");
  }
}
