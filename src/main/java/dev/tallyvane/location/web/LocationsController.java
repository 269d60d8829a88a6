package dev.tallyvane.location.web;

import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationCodeTaken;
import dev.tallyvane.location.LocationForm;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.InvalidRequest;
import java.util.List;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PostMapping;

/** Adding a location (its page lives in the dashboard). */
@Controller
class LocationsController {

    private final LocationService locations;
    private final dev.tallyvane.system.TallyvaneProperties properties;

    LocationsController(LocationService locations, dev.tallyvane.system.TallyvaneProperties properties) {
        this.locations = locations;
        this.properties = properties;
    }

    @GetMapping("/locations/new")
    String newForm(Model model) {
        // defaults from configuration (tallyvane.defaults.time-zone and .currency)
        model.addAttribute("form", new LocationForm("", "", properties.defaults().timeZone(),
                properties.defaults().currency(), null, "ACTIVE"));
        return "location/form";
    }

    @PostMapping("/locations")
    String create(LocationForm form, java.security.Principal user, Model model) {
        try {
            Location l = locations.create(form.details(), user.getName());
            return "redirect:/locations/" + l.getCode();
        } catch (InvalidRequest e) {
            model.addAttribute("problems", e.problems());
        } catch (LocationCodeTaken e) {
            model.addAttribute("problems", List.of(new InvalidRequest.FieldProblem(null, "code", e.getMessage())));
        }
        model.addAttribute("form", form);
        return "location/form";
    }
}
