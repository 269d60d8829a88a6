package dev.tallyvane.forecasting;

import org.springframework.boot.context.properties.EnableConfigurationProperties;
import org.springframework.context.annotation.Configuration;

@Configuration(proxyBeanMethods = false)
@EnableConfigurationProperties(RefitProperties.class)
class ForecastingConfiguration {
}
