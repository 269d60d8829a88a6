package dev.tallyvane.location;

import java.util.Collection;
import java.util.List;
import java.util.Optional;
import org.springframework.data.jpa.repository.JpaRepository;

interface LocationRepository extends JpaRepository<Location, Long> {

    Optional<Location> findByCode(String code);

    List<Location> findByCodeIn(Collection<String> codes);

    List<Location> findAllByOrderByCodeAsc();
}
