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
        xhr.send(new FormData(form));
    });
})();
