// Line now: replaces the tiles whenever the server sends new ones (server-sent events from this program).
(function () {
  "use strict";
  var tiles = document.getElementById("tiles");
  var status = document.getElementById("live-status");
  if (!tiles || !status || !window.EventSource) {
    return;
  }
  var source = new EventSource("/line/events");
  source.addEventListener("tiles", function (event) {
    var data = JSON.parse(event.data);
    tiles.innerHTML = data.html;
    status.textContent = "live, updated " + data.at;
    status.className = "live ok";
  });
  source.onerror = function () {
    status.textContent = "connection lost, trying again";
    status.className = "live lost";
  };
})();
