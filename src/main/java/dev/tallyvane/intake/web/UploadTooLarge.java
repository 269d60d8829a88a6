package dev.tallyvane.intake.web;

import jakarta.servlet.http.HttpServletRequest;
import org.springframework.http.HttpStatus;
import org.springframework.util.unit.DataSize;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.web.bind.annotation.ControllerAdvice;
import org.springframework.web.bind.annotation.ExceptionHandler;
import org.springframework.web.bind.annotation.ResponseStatus;
import org.springframework.web.multipart.MaxUploadSizeExceededException;
import org.springframework.web.servlet.ModelAndView;

/**
 * A file over the size limit is refused before any controller runs; this shows the upload page
 * with a plain message instead of an error page.
 */
@ControllerAdvice
class UploadTooLarge {

    private final DataSize limit;

    UploadTooLarge(@Value("${spring.servlet.multipart.max-file-size:20MB}") DataSize limit) {
        this.limit = limit;
    }

    @ExceptionHandler(MaxUploadSizeExceededException.class)
    @ResponseStatus(HttpStatus.CONTENT_TOO_LARGE)
    ModelAndView tooLarge(HttpServletRequest request) {
        ModelAndView mv = new ModelAndView("intake/too-large");
        mv.addObject("limitMb", limit.toMegabytes());
        return mv;
    }
}
