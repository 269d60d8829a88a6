package dev.tallyvane.location.internal;

import dev.tallyvane.location.Location;
import java.util.Collection;
import java.util.List;
import java.util.Optional;
import org.springframework.data.jpa.repository.JpaRepository;

public interface LocationRepository extends JpaRepository<Location, Long> {

    Optional<Location> findByCode(String code);

    List<Location> findByCodeIn(Collection<String> codes);

    List<Location> findAllByOrderByCodeAsc();
}
