package dev.tallyvane.system;

import org.springframework.http.HttpStatusCode;
import org.springframework.stereotype.Controller;
import org.springframework.web.bind.annotation.ControllerAdvice;
import org.springframework.web.bind.annotation.ExceptionHandler;
import org.springframework.web.servlet.ModelAndView;

/**
 * Shows a {@link DomainProblem} raised by a page (unknown location, upload already committed…) as a
 * page with its status and plain message. REST controllers are answered by {@link ProblemResponses},
 * which takes precedence.
 */
@ControllerAdvice(annotations = Controller.class)
class PageProblems {

    @ExceptionHandler(DomainProblem.class)
    ModelAndView problem(DomainProblem e) {
        ModelAndView mv = new ModelAndView("error/problem");
        mv.setStatus(HttpStatusCode.valueOf(e.status()));
        mv.addObject("title", e.title());
        mv.addObject("message", e.getMessage());
        return mv;
    }

    @ExceptionHandler(InvalidRequest.class)
    ModelAndView invalid(InvalidRequest e) {
        ModelAndView mv = new ModelAndView("error/problem");
        mv.setStatus(HttpStatusCode.valueOf(400));
        mv.addObject("title", "Not understood");
        mv.addObject("message", e.getMessage() + " " + e.problems().stream()
                .map(p -> p.field() + ": " + p.reason()).reduce((a, b) -> a + "; " + b).orElse(""));
        return mv;
    }
}
