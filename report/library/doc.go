// Package library lists what the program knows before any survey is read:
// the built-in materials and substances, the limits with their sources and
// the Site sheet items that override them, and the references the sources
// cite, as plain text in the Site sheet's practical units (WriteText) or as
// JSON in SI with each limit also in its Site item's unit (WriteJSON).
// Screening values: defer to local codes, the site's hazardous-area
// classification and a competent person.
package library
