package dev.tallyvane.dashboard.web;

import dev.tallyvane.dashboard.Overview;
import dev.tallyvane.forecasting.RefitQueue;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.ResponseBody;

/** The home page: every location at a glance. */
@Controller
class OverviewController {

    private final Overview overview;
    private final RefitQueue queue;

    OverviewController(Overview overview, RefitQueue queue) {
        this.overview = overview;
        this.queue = queue;
    }

    @GetMapping({"/", "/locations"})
    String overview(@RequestParam(required = false) String q, @RequestParam(required = false) String show,
            @RequestParam(required = false) String sort, @RequestParam(required = false) String dir,
            @RequestParam(required = false) String page, Model model) {
        Integer pageNumber = null;
        if (page != null && page.matches("\\d{1,6}")) {
            pageNumber = Integer.parseInt(page);
        }
        model.addAttribute("view", overview.page(Overview.Query.of(q, show, sort, dir, pageNumber)));
        model.addAttribute("shows", Overview.Show.values());
        model.addAttribute("sorts", Overview.Sort.values());
        model.addAttribute("refitStatus", queue.status());
        return "dashboard/overview";
    }

    /** The chain's re-fit progress, which the overview's counter reads every few seconds while re-fits are under way. */
    @GetMapping(value = "/progress.json", produces = "application/json")
    @ResponseBody
    RefitQueue.Status progress() {
        return queue.status();
    }
}
