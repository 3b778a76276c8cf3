/* global document */
// Confirms the sign-out once the page has loaded: the person has just chosen "Sign out" in
// Ebbline. Without JavaScript the page's buttons do the same.
const confirmButton = document.querySelector('form[data-auto-submit]')
  ? document.querySelector('button[name="logout"][value="yes"]')
  : null;
if (confirmButton) confirmButton.click();
