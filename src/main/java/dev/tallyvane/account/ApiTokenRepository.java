package dev.tallyvane.account;

import java.util.List;
import java.util.Optional;
import org.springframework.data.jpa.repository.JpaRepository;

interface ApiTokenRepository extends JpaRepository<ApiToken, Long> {

    Optional<ApiToken> findBySecretHash(String secretHash);

    List<ApiToken> findAllByOrderByCreatedAtDesc();
}
