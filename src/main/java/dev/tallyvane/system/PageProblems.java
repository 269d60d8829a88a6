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

    /**
     * A failure caused by the database being away or busy (see {@link DatabaseOutage}; it may come
     * wrapped, e.g. as a failed rollback): say so, and that nothing was saved. Anything else goes on
     * to the error page.
     */
    @ExceptionHandler(org.springframework.core.NestedRuntimeException.class)
    ModelAndView databaseUnavailable(org.springframework.core.NestedRuntimeException e,
            jakarta.servlet.http.HttpServletResponse response) throws org.springframework.core.NestedRuntimeException {
        if (!DatabaseOutage.isOutage(e)) {
            throw e;
        }
        ModelAndView mv = new ModelAndView("error/problem");
        mv.setStatus(HttpStatusCode.valueOf(503));
        response.setHeader("Retry-After", "10");
        mv.addObject("title", "Temporarily unavailable");
        mv.addObject("message", "The database is busy or cannot be reached just now, so nothing was saved. Please try "
                + "again in a few seconds.");
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
