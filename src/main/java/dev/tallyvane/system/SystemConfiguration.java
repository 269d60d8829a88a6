package dev.tallyvane.system;

import java.time.Clock;
import org.springframework.boot.context.properties.EnableConfigurationProperties;
import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;

/**
 * Shared infrastructure beans. Module events ({@code @ApplicationModuleListener}) are handled
 * asynchronously, each in a transaction of its own after the publishing one committed, and are kept
 * in the event publication registry ({@code event_publication}) until their listener succeeds.
 */
@Configuration(proxyBeanMethods = false)
@org.springframework.scheduling.annotation.EnableAsync
@EnableConfigurationProperties({TallyvaneProperties.class, JobsProperties.class})
class SystemConfiguration {

    /** The clock everything that depends on "now" reads; tests replace it. */
    @Bean
    Clock clock() {
        return Clock.systemUTC();
    }
}
