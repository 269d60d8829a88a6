package dev.tallyvane.summary;

import org.springframework.boot.context.properties.EnableConfigurationProperties;
import org.springframework.context.annotation.Configuration;

@Configuration(proxyBeanMethods = false)
@EnableConfigurationProperties(SummaryProperties.class)
class SummaryConfiguration {
}
