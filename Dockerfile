# syntax=docker/dockerfile:1
# Multi-stage build: compile with the Maven wrapper on a JDK, run on a JRE as a non-root user.

FROM eclipse-temurin:17-jdk AS build
WORKDIR /src
COPY .mvn/ .mvn/
COPY mvnw pom.xml ./
RUN ./mvnw -B -q dependency:go-offline
COPY src/ src/
COPY db/ db/
RUN ./mvnw -B -q package -DskipTests && cp target/tallyvane.jar /tallyvane.jar

FROM eclipse-temurin:17-jre
RUN groupadd --system tallyvane && useradd --system --gid tallyvane --home-dir /app --shell /usr/sbin/nologin tallyvane \
    && mkdir -p /app/data && chown -R tallyvane:tallyvane /app \
    && apt-get update && apt-get install -y --no-install-recommends curl && rm -rf /var/lib/apt/lists/*
WORKDIR /app
COPY --from=build /tallyvane.jar /app/tallyvane.jar
USER tallyvane
ENV TALLYVANE_DATA_DIR=/app/data \
    JAVA_TOOL_OPTIONS="-XX:MaxRAMPercentage=75"
EXPOSE 8080
HEALTHCHECK --interval=30s --timeout=5s --start-period=60s --retries=3 \
    CMD curl -fsS http://localhost:8080/actuator/health/liveness || exit 1
ENTRYPOINT ["java", "-jar", "/app/tallyvane.jar"]
