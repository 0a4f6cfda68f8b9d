package api

import (
	"net/http"

	"github.com/gin-gonic/gin"
	swaggerFiles "github.com/swaggo/files"
	ginSwagger "github.com/swaggo/gin-swagger"
	"golang.org/x/net/webdav"
)

// docsPath is the interactive API reference.
const docsPath = "/docs"

// docsFiles are the files of the reference under /docs/: the page, its
// initializer and style (templates of gin-swagger), and the Swagger UI
// bundle embedded in github.com/swaggo/files. gin-swagger's doc.json is
// left out: the page reads the served /openapi.json.
var docsFiles = map[string]bool{
	"index.html": true, "index.css": true, "swagger-initializer.js": true, "oauth2-redirect.html": true,
	"swagger-ui.css": true, "swagger-ui-bundle.js": true, "swagger-ui-standalone-preset.js": true,
	"favicon-16x16.png": true, "favicon-32x32.png": true,
}

// docs serves the interactive API reference's page (GET
// /docs/index.html; GET /docs and /docs/ redirect here).
//
//	@Summary		Interactive API reference
//	@Description	Swagger UI (from the swaggo/gin-swagger Go module) over the served /openapi.json, with "try it out" against this service (same origin). GET /docs redirects here. Open without a token; the /v1 operations it calls need one when the service has tokens (Authorize).
//	@Tags			operations
//	@Produce		html
//	@Success		200	{string}	string	"the Swagger UI page"
//	@ID				docs
//	@Router			/docs/index.html [get]
func docs(ui gin.HandlerFunc) gin.HandlerFunc {
	return func(c *gin.Context) {
		c.Request.RequestURI = docsPath + "/index.html" // gin-swagger picks the file by its name in the URI
		ui(c)
	}
}

// docsRoutes serves GET /docs and the files of the reference. Each router
// has its own file handler: gin-swagger sets the handler's path prefix on
// first use.
func docsRoutes(r *gin.Engine) {
	ui := ginSwagger.CustomWrapHandler(&ginSwagger.Config{
		URL: "/openapi.json", Title: "stagewright API reference", DocExpansion: "list", DeepLinking: true,
		DefaultModelsExpandDepth: 1,
	}, &webdav.Handler{FileSystem: swaggerFiles.FS, LockSystem: webdav.NewMemLS()})
	page := docs(ui)
	toPage := func(c *gin.Context) { c.Redirect(http.StatusMovedPermanently, docsPath+"/index.html") }
	r.GET(docsPath, toPage)
	r.GET(docsPath+"/*file", func(c *gin.Context) {
		name := c.Param("file")
		switch {
		case name == "/":
			toPage(c)
		case name == "/index.html":
			page(c)
		case docsFiles[name[1:]]:
			ui(c)
		default:
			writeProblem(c, Problem{Type: problemBase + "not-found", Title: "No such endpoint", Status: http.StatusNotFound,
				Detail: "the API reference is at " + docsPath + "/"})
		}
	})
}
