// Shows upload progress for large files, then opens the preview page the server answers with.
(function () {
    var form = document.getElementById('upload-form');
    if (!form || !window.XMLHttpRequest || !window.FormData) {
        return;
    }
    form.addEventListener('submit', function (event) {
        event.preventDefault();
        var bar = document.getElementById('upload-progress');
        var status = document.getElementById('upload-status');
        var button = form.querySelector('button[type=submit]');
        var input = document.getElementById('file');
        var limit = Number(form.getAttribute('data-max-bytes') || 0);
        if (limit && input.files.length && input.files[0].size > limit) {
            status.textContent = 'The file is larger than ' + Math.round(limit / 1048576)
                + ' MB. Split it into smaller files (for example one per month).';
            return;
        }
        var xhr = new XMLHttpRequest();
        bar.hidden = false;
        button.disabled = true;
        xhr.upload.addEventListener('progress', function (e) {
            if (e.lengthComputable) {
                bar.value = Math.round(100 * e.loaded / e.total);
                status.textContent = 'Sending… ' + bar.value + '%';
            }
        });
        xhr.upload.addEventListener('load', function () {
            status.textContent = 'Reading the file…';
        });
        xhr.addEventListener('load', function () {
            if (xhr.responseURL && xhr.responseURL.indexOf('/uploads/') > 0 && xhr.status === 200) {
                window.location.assign(xhr.responseURL);
            } else {
                document.open();
                document.write(xhr.responseText);
                document.close();
            }
        });
        xhr.addEventListener('error', function () {
            status.textContent = 'The upload failed: check the connection and try again.';
            button.disabled = false;
        });
        xhr.open('POST', form.action);
        // the CSRF token goes in a header too, so an oversized body is refused with a message, not a 403
        var token = form.querySelector('input[name=_csrf]');
        if (token) {
            xhr.setRequestHeader('X-CSRF-TOKEN', token.value);
        }
        xhr.send(new FormData(form));
    });
})();
