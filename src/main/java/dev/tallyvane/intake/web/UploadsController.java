package dev.tallyvane.intake.web;

import dev.tallyvane.intake.IntakeResult;
import dev.tallyvane.intake.upload.UploadOptions;
import dev.tallyvane.intake.upload.UploadRejected;
import dev.tallyvane.intake.upload.UploadService;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.Messages;
import java.io.IOException;
import java.security.Principal;
import org.springframework.http.ContentDisposition;
import org.springframework.http.HttpHeaders;
import org.springframework.http.MediaType;
import org.springframework.http.ResponseEntity;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.multipart.MultipartFile;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/** The bookkeeper's upload pages: form and history, preview, commit. */
@Controller
class UploadsController {

    private final UploadService uploads;
    private final long maxBytes;
    private final Messages messages;

    UploadsController(UploadService uploads, Messages messages,
            @org.springframework.beans.factory.annotation.Value("${spring.servlet.multipart.max-file-size:20MB}")
            org.springframework.util.unit.DataSize maxFileSize) {
        this.uploads = uploads;
        this.messages = messages;
        this.maxBytes = maxFileSize.toBytes();
    }

    @GetMapping("/uploads")
    String page(Model model) {
        model.addAttribute("history", uploads.history(50));
        model.addAttribute("columns", dev.tallyvane.intake.upload.UploadColumn.values());
        model.addAttribute("maxBytes", maxBytes);
        return "intake/uploads";
    }

    @PostMapping("/uploads")
    String upload(@RequestParam(name = "file", required = false) MultipartFile file, Principal user, Model model,
            jakarta.servlet.http.HttpServletResponse response) throws IOException {
        if (file == null) {
            // a plain form post, or a multipart one without the file field: nothing to read
            response.setStatus(400);
            model.addAttribute("error", messages.say("flash.noFile"));
            return page(model);
        }
        try {
            long id = uploads.stage(file.getOriginalFilename(), file.getContentType(), file.getBytes(), user.getName());
            return "redirect:/uploads/" + id;
        } catch (UploadRejected e) {
            model.addAttribute("error", e.getMessage());
            model.addAttribute("fileName", file.getOriginalFilename());
            return page(model);
        }
    }

    @GetMapping("/uploads/{id}")
    String preview(@PathVariable long id, Model model) {
        model.addAttribute("preview", uploads.preview(id));
        return "intake/preview";
    }

    @PostMapping("/uploads/{id}/options")
    String options(@PathVariable long id, @RequestParam UploadOptions.DateOrder dateOrder,
            @RequestParam UploadOptions.NumberStyle numberStyle) {
        uploads.changeOptions(id, new UploadOptions(dateOrder, numberStyle));
        return "redirect:/uploads/" + id;
    }

    @PostMapping("/uploads/{id}/commit")
    String commit(@PathVariable long id, @RequestParam(defaultValue = "false") boolean createLocations,
            Principal user, Model model, RedirectAttributes redirect) {
        try {
            java.util.Set<String> created = createLocations ? uploads.preview(id).unknownLocations() : java.util.Set.of();
            IntakeResult result = uploads.commit(id, createLocations, user.getName());
            redirect.addFlashAttribute("committed", result);
            redirect.addFlashAttribute("createdLocations", created);
            return "redirect:/uploads/" + id;
        } catch (InvalidRequest e) {
            model.addAttribute("problems", e.problems());
            model.addAttribute("problemTitle", e.getMessage());
            return preview(id, model);
        }
    }

    @PostMapping("/uploads/{id}/discard")
    String discard(@PathVariable long id, Principal user) {
        uploads.discard(id, user.getName());
        return "redirect:/uploads";
    }

    @GetMapping("/uploads/template.csv")
    ResponseEntity<byte[]> templateCsv() {
        return download(UploadTemplates.csv(), "tallyvane-figures-template.csv", "text/csv;charset=UTF-8");
    }

    @GetMapping("/uploads/template.xlsx")
    ResponseEntity<byte[]> templateXlsx() {
        return download(UploadTemplates.xlsx(), "tallyvane-figures-template.xlsx",
                "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet");
    }

    private static ResponseEntity<byte[]> download(byte[] body, String name, String type) {
        return ResponseEntity.ok().contentType(MediaType.parseMediaType(type))
                .header(HttpHeaders.CONTENT_DISPOSITION, ContentDisposition.attachment().filename(name).build().toString())
                .body(body);
    }
}
