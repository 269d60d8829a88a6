package dev.tallyvane.system;

import java.time.Clock;
import org.springframework.boot.context.properties.EnableConfigurationProperties;
import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;

/** Shared infrastructure beans. */
@Configuration(proxyBeanMethods = false)
@EnableConfigurationProperties({TallyvaneProperties.class, JobsProperties.class})
class SystemConfiguration {

    /** The clock everything that depends on "now" reads; tests replace it. */
    @Bean
    Clock clock() {
        return Clock.systemUTC();
    }
}
