package dev.tallyvane.system;

import io.swagger.v3.oas.models.Components;
import io.swagger.v3.oas.models.OpenAPI;
import io.swagger.v3.oas.models.info.Info;
import io.swagger.v3.oas.models.security.SecurityRequirement;
import io.swagger.v3.oas.models.security.SecurityScheme;
import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;

/** The title, description and bearer-token scheme of the OpenAPI document at /v3/api-docs. */
@Configuration(proxyBeanMethods = false)
class OpenApiConfiguration {

    @Bean
    OpenAPI tallyvaneOpenApi() {
        return new OpenAPI()
                .info(new Info().title("Tallyvane API").version("v1").description("""
                        Post figures from a point-of-sale system and read series back. Every call needs an API \
                        token created by the owner (Authorization: Bearer tv_…). Errors are \
                        application/problem+json (RFC 9457). Forecasts are estimates with intervals, not \
                        guarantees."""))
                .components(new Components().addSecuritySchemes("token",
                        new SecurityScheme().type(SecurityScheme.Type.HTTP).scheme("bearer").bearerFormat("tv_…")))
                .addSecurityItem(new SecurityRequirement().addList("token"));
    }
}
