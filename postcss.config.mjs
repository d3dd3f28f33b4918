// PostCSS pipeline for Tailwind CSS 3.4: Tailwind generates the utilities, autoprefixer
// adds vendor prefixes for the browsers the shop floor may still run.
const config = {
  plugins: {
    tailwindcss: {},
    autoprefixer: {},
  },
};

export default config;
