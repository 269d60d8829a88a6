package dev.tallyvane.account.internal;

import dev.tallyvane.account.ApiToken;
import java.util.List;
import java.util.Optional;
import org.springframework.data.jpa.repository.JpaRepository;

public interface ApiTokenRepository extends JpaRepository<ApiToken, Long> {

    Optional<ApiToken> findBySecretHash(String secretHash);

    List<ApiToken> findAllByOrderByCreatedAtDesc();
}
