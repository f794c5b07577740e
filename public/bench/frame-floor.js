// The bare floors of `npm run bench` (scripts/bench/): no framework, no app.
// #tap: a pointerdown handler that changes one number (frame_floor, with the same in-page paint probe as
//       the capture screen).
// #put: a pointerdown handler that puts one record into IndexedDB with durability 'strict' and reports
//       pointerdown → transaction complete (idb_floor), the same span tap_durable measures in the app.
// window.benchRttConnect() then benchRttPing(): a bare socket.io emit-with-ack of the clock ping (raw_rtt).
'use strict';
(function () {
  var count = document.getElementById('count');
  var puts = document.getElementById('puts');
  var n = 0;
  document.getElementById('tap').addEventListener('pointerdown', function () {
    n += 1;
    count.textContent = String(n);
  });

  var dbPromise = new Promise(function (resolve, reject) {
    var req = indexedDB.open('bench-floor', 1);
    req.onupgradeneeded = function () { req.result.createObjectStore('outbox', { keyPath: 'id' }); };
    req.onsuccess = function () { resolve(req.result); };
    req.onerror = function () { reject(req.error); };
  });
  window.benchIdbSamples = [];
  var k = 0;
  document.getElementById('put').addEventListener('pointerdown', function (e) {
    var t0 = e.timeStamp;
    dbPromise.then(function (db) {
      k += 1;
      var tx = db.transaction('outbox', 'readwrite', { durability: 'strict' });
      // A record of the size of one tap event.
      tx.objectStore('outbox').put({ id: 'floor-' + k, kind: 'clip_fired', payload: { outcome: 'deployed' }, deviceTime: new Date().toISOString(), status: 'pending' });
      tx.oncomplete = function () {
        window.benchIdbSamples.push(performance.now() - t0);
        puts.textContent = String(k);
      };
    });
  });

  // raw_rtt: one socket of its own (the page's session cookie), and one bare emit-with-ack per call.
  var socket = null;
  window.benchRttConnect = function () {
    return new Promise(function (resolve, reject) {
      /* global io */
      socket = io({ transports: ['websocket'] });
      socket.on('connect_error', function (err) { reject(new Error('socket: ' + err.message)); });
      socket.on('connect', function () { resolve(true); });
    });
  };
  window.benchRttPing = function () {
    return new Promise(function (resolve) {
      var t0 = performance.now();
      socket.emit('clock.ping', { t1: Date.now() }, function () { resolve(performance.now() - t0); });
    });
  };
})();
