package dev.tallyvane.forecasting;

import dev.tallyvane.engine.SettledStructures;
import org.springframework.boot.context.properties.EnableConfigurationProperties;
import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;

@Configuration(proxyBeanMethods = false)
@EnableConfigurationProperties(RefitProperties.class)
class ForecastingConfiguration {

    /** Structures settled by earlier re-fits, kept in memory (lost on restart: the next re-fit searches again). */
    @Bean
    SettledStructures settledStructures(RefitProperties properties) {
        return new SettledStructures(properties.settledStructures());
    }
}
