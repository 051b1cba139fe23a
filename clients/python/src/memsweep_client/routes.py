"""Which client method calls each operation of the API (tests/test_routes.py checks this map
against the server's OpenAPI document, so a route without a method fails the tests)."""

from typing import Dict

ROUTES: Dict[str, str] = {
    "GET /healthz": "health",
    "GET /readyz": "ready",
    "GET /metrics": "metrics",
    "GET /openapi.json": "openapi",
    "POST /v1/sweeps": "submit",
    "GET /v1/sweeps": "list_page",
    "POST /v1/sweeps/validate": "validate",
    "GET /v1/sweeps/{id}": "get",
    "DELETE /v1/sweeps/{id}": "cancel",
    "PATCH /v1/sweeps/{id}": "annotate",
    "POST /v1/sweeps/{id}/extend": "extend",
    "POST /v1/sweeps/{id}/resume": "resume",
    "GET /v1/sweeps/{id}/results": "results",
    "GET /v1/sweeps/{id}/events": "events",
    "GET /v1/sweeps/{id}/figure.svg": "figure",
    "GET /v1/sweeps/{id}/figure.png": "figure",
    "GET /v1/sweeps/{id}/figure.pdf": "figure",
    "GET /v1/sweeps/{id}/bundle.zip": "bundle",
    "GET /v1/figures/overlay.svg": "overlay_figure",
    "GET /v1/figures/overlay.png": "overlay_figure",
    "GET /v1/figures/overlay.pdf": "overlay_figure",
    "POST /v1/theory": "theory",
}
