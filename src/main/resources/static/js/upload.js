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
        // the words come from the page (its message bundle): {0} stands for a number
        function say(name, n) {
            return (form.getAttribute('data-' + name) || '').replace('{0}', n == null ? '' : String(n));
        }
        if (limit && input.files.length && input.files[0].size > limit) {
            status.textContent = say('too-large', Math.round(limit / 1048576));
            return;
        }
        var xhr = new XMLHttpRequest();
        bar.hidden = false;
        button.disabled = true;
        xhr.upload.addEventListener('progress', function (e) {
            if (e.lengthComputable) {
                bar.value = Math.round(100 * e.loaded / e.total);
                status.textContent = say('sending', bar.value);
            }
        });
        xhr.upload.addEventListener('load', function () {
            status.textContent = say('reading');
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
            status.textContent = say('failed');
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
