// Renders the service's own document. A separate file rather than an inline script, so that a
// content security policy can allow scripts from this origin only.
window.addEventListener("load", function () {
  window.ui = SwaggerUIBundle({
    url: "/openapi.json",
    dom_id: "#docs",
    deepLinking: true,
    layout: "BaseLayout",
    // no outside validator: the page talks to this server only
    validatorUrl: null,
    // With a reader token set, the document itself needs it: send the token the console keeps for this tab, if any.
    requestInterceptor: function (request) {
      var token = sessionStorage.getItem("pressmark.reader-token") || sessionStorage.getItem("pressmark.admin-token");
      if (token && !request.headers.Authorization) {
        request.headers.Authorization = "Bearer " + token;
      }
      return request;
    }
  });
});
